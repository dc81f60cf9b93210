import type { EntityManager } from 'typeorm'
import type { PublicUser, RegisterBody, UserRole } from '../../shared/schemas/auth'
import { hashPassword, passwordProblem, verifyPassword } from '../auth/password'
import type { AppContext } from '../context'
import { User } from '../entities/User'
import { badRequest, conflict, HttpError } from '../http/errors'
import { passwordResetMail, signInLinkMail, verifyEmailMail } from '../mail/templates/account'
import { queueMail } from './mail'
import { takeMailAllowance } from './mail-limits'
import { consumeToken, issueToken, revokeTokens } from './tokens'

export function toPublicUser(user: User): PublicUser {
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    role: user.role,
    emailVerified: user.emailVerifiedAt !== null,
    unitSystem: user.unitSystem,
  }
}

/** The user with the studios they belong to, so the client can offer each studio's board. */
export async function publicUserWithStudios(ctx: AppContext, user: User): Promise<PublicUser> {
  const rows: { id: string; name: string; role: 'owner' | 'crew' }[] = await ctx.db.query(
    `SELECT s.id, s.name, m.role FROM studio_members m JOIN studios s ON s.id = m.studio_id WHERE m.user_id = $1 ORDER BY m.created_at`,
    [user.id],
  )
  return { ...toPublicUser(user), studios: rows }
}

function assertStrongPassword(password: string, inputs: string[]) {
  const problem = passwordProblem(password, inputs)
  if (problem) throw badRequest('Choose a stronger password.', { password: problem }, 'weak-password')
}

export async function sendVerificationMail(ctx: AppContext, manager: EntityManager, user: User) {
  const token = await issueToken(manager, 'verify-email', user.id)
  const url = `${ctx.config.publicUrl}/verify-email?token=${token}`
  await queueMail(manager, user.email, 'verify-email', verifyEmailMail(user.displayName, url))
}

/**
 * Creates an account and queues its verification mail in one transaction. `hook` lets a caller do
 * more in the same transaction (joining a studio from an invitation, say); when it answers
 * `{ addressProven: true }` the address counts as confirmed and no confirmation mail is sent.
 */
export async function registerUser(
  ctx: AppContext,
  input: Omit<RegisterBody, 'role' | 'inviteToken'> & { role: UserRole },
  hook?: (manager: EntityManager, user: User) => Promise<{ addressProven: boolean } | void>,
): Promise<User> {
  assertStrongPassword(input.password, [input.email, input.displayName, 'conewright'])
  const passwordHash = await hashPassword(input.password)
  return ctx.db.transaction(async (manager) => {
    const taken = await manager.getRepository(User).exist({ where: { email: input.email } })
    if (taken) {
      throw conflict('An account with this address already exists. Sign in, or reset the password.', 'email-taken')
    }
    const user = await manager.getRepository(User).save(
      manager.getRepository(User).create({
        email: input.email,
        passwordHash,
        displayName: input.displayName,
        role: input.role,
        emailVerifiedAt: null,
        suspendedAt: null,
      }),
    )
    const outcome = await hook?.(manager, user)
    if (outcome?.addressProven) {
      user.emailVerifiedAt = new Date()
      await manager.update(User, user.id, { emailVerifiedAt: user.emailVerifiedAt })
    } else {
      await sendVerificationMail(ctx, manager, user)
    }
    return user
  })
}

/** The user for an address and password, or null; a miss takes as long as a hit. */
export async function authenticate(ctx: AppContext, email: string, password: string): Promise<User | null> {
  const user = await ctx.db.getRepository(User).findOne({ where: { email: email.trim().toLowerCase() } })
  const ok = await verifyPassword(password, user?.passwordHash ?? null)
  return ok ? user : null
}

export async function verifyEmail(ctx: AppContext, token: string) {
  await ctx.db.transaction(async (manager) => {
    const used = await consumeToken(manager, 'verify-email', token)
    if (!used?.userId) throw badRequest('This confirmation link is not valid any more. Ask for a new one.', undefined, 'bad-token')
    await manager.update(User, { id: used.userId }, { emailVerifiedAt: () => 'coalesce(email_verified_at, now())' })
  })
}

/**
 * Queues a reset link when the address has an account; says nothing either way. `sender` is where
 * the request came from: the allowance is counted for every address, known or not, so it tells nothing.
 */
export async function requestPasswordReset(ctx: AppContext, email: string, sender: string) {
  await ctx.db.transaction(async (manager) => {
    await takeMailAllowance(manager, 'password-reset', sender, email)
    const user = await manager.getRepository(User).findOne({ where: { email } })
    if (!user || user.suspendedAt) return
    await revokeTokens(manager, 'password-reset', user.id)
    const token = await issueToken(manager, 'password-reset', user.id)
    const url = `${ctx.config.publicUrl}/reset-password?token=${token}`
    await queueMail(manager, user.email, 'password-reset', passwordResetMail(user.displayName, url))
  })
}

/** Sets the new password, spends the token and signs the account out everywhere. */
export async function confirmPasswordReset(ctx: AppContext, token: string, password: string) {
  await ctx.db.transaction(async (manager) => {
    const used = await consumeToken(manager, 'password-reset', token)
    if (!used?.userId) {
      throw badRequest('This reset link is not valid any more. Ask for a new one.', { token: 'Expired or already used.' }, 'bad-token')
    }
    const user = await manager.getRepository(User).findOneByOrFail({ id: used.userId })
    assertStrongPassword(password, [user.email, user.displayName, 'conewright'])
    await manager.update(User, user.id, { passwordHash: await hashPassword(password), emailVerifiedAt: user.emailVerifiedAt ?? new Date() })
    await manager.query(`DELETE FROM session WHERE sess -> 'passport' ->> 'user' = $1`, [user.id])
  })
}

export async function resendVerification(ctx: AppContext, user: User) {
  if (user.emailVerifiedAt) throw new HttpError(409, 'already-verified', 'This address is already confirmed.')
  await ctx.db.transaction(async (manager) => {
    await takeMailAllowance(manager, 'verify-email', user.id, user.email)
    await revokeTokens(manager, 'verify-email', user.id)
    await sendVerificationMail(ctx, manager, user)
  })
}

/** The account's own settings: display name and unit system. */
export async function updatePreferences(ctx: AppContext, user: User, patch: { unitSystem?: 'imperial' | 'metric'; displayName?: string }) {
  Object.assign(user, patch)
  await ctx.db.getRepository(User).update(user.id, patch)
  return user
}

/** Mails a one-time sign-in link when the address has an account; says nothing either way. */
export async function requestSignInLink(ctx: AppContext, email: string, sender: string) {
  await ctx.db.transaction(async (manager) => {
    await takeMailAllowance(manager, 'sign-in-link', sender, email)
    const user = await manager.getRepository(User).findOne({ where: { email } })
    if (!user || user.suspendedAt) return
    await revokeTokens(manager, 'sign-in-link', user.id)
    const token = await issueToken(manager, 'sign-in-link', user.id)
    const url = `${ctx.config.publicUrl}/sign-in?link=${token}`
    await queueMail(manager, user.email, 'sign-in-link', signInLinkMail(user.displayName, url))
  })
}

/** The account a sign-in link opens, spending the link; a 400 when it is unknown, spent or expired. */
export async function spendSignInLink(ctx: AppContext, token: string): Promise<User> {
  return ctx.db.transaction(async (manager) => {
    const used = await consumeToken(manager, 'sign-in-link', token)
    const user = used?.userId ? await manager.getRepository(User).findOne({ where: { id: used.userId } }) : null
    if (!user || user.suspendedAt)
      throw badRequest('This sign-in link is not valid any more. Ask for a new one.', { token: 'Expired or already used.' }, 'bad-token')
    return user
  })
}
