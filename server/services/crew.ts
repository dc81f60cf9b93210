import { IsNull, MoreThan, type EntityManager } from 'typeorm'
import type { AppContext } from '../context'
import { AuthToken } from '../entities/AuthToken'
import { Studio } from '../entities/Studio'
import { StudioMember } from '../entities/StudioMember'
import type { User } from '../entities/User'
import { badRequest, conflict, forbidden, notFound } from '../http/errors'
import { crewInviteMail } from '../mail/templates/firings'
import { queueMail } from './mail'
import { takeMailAllowance } from './mail-limits'
import { consumeToken, findLiveToken, issueToken } from './tokens'

interface InviteData {
  studioId: string
  email: string
  invitedBy: string
}

export async function inviteCrew(ctx: AppContext, studioId: string, inviter: User, email: string) {
  return ctx.db.transaction(async (manager) => {
    const studio = await manager.getRepository(Studio).findOneByOrFail({ id: studioId })
    const already: unknown[] = await manager.query(
      `SELECT 1 FROM studio_members m JOIN users u ON u.id = m.user_id WHERE m.studio_id = $1 AND u.email = $2`,
      [studioId, email],
    )
    if (already.length) throw conflict(`${email} is already on this studio’s crew.`, 'already-member')
    await takeMailAllowance(manager, 'crew-invite', inviter.id, email)
    // A new invitation replaces an open one to the same address.
    await manager.query(
      `UPDATE auth_tokens SET used_at = now() WHERE purpose = 'crew-invite' AND used_at IS NULL AND data->>'studioId' = $1 AND data->>'email' = $2`,
      [studioId, email],
    )
    const token = await issueToken(manager, 'crew-invite', null, { studioId, email, invitedBy: inviter.id } satisfies InviteData)
    await queueMail(
      manager,
      email,
      'crew-invite',
      crewInviteMail(studio.name, inviter.displayName, `${ctx.config.publicUrl}/join-studio?token=${token}`),
    )
    return { email }
  })
}

export async function listCrew(ctx: AppContext, studioId: string) {
  const members = await ctx.db
    .getRepository(StudioMember)
    .find({ where: { studioId }, relations: { user: true }, order: { createdAt: 'ASC' } })
  const invites = await ctx.db.getRepository(AuthToken).find({
    where: { purpose: 'crew-invite', usedAt: IsNull(), expiresAt: MoreThan(new Date()) },
    order: { createdAt: 'ASC' },
  })
  return {
    members: members.map((m) => ({
      id: m.id,
      userId: m.userId,
      displayName: m.user.displayName,
      email: m.user.email,
      role: m.role,
      since: m.createdAt.toISOString(),
    })),
    invites: invites
      .filter((t) => (t.data as unknown as InviteData).studioId === studioId)
      .map((t) => ({ id: t.id, email: (t.data as unknown as InviteData).email, expiresAt: t.expiresAt.toISOString() })),
  }
}

export async function removeCrewMember(ctx: AppContext, studioId: string, memberId: string) {
  const member = await ctx.db.getRepository(StudioMember).findOne({ where: { id: memberId, studioId } })
  if (!member) throw notFound('That member')
  if (member.role === 'owner') throw conflict('The owner cannot be removed from the crew list.', 'owner')
  await ctx.db.getRepository(StudioMember).delete({ id: memberId })
}

export async function revokeInvite(ctx: AppContext, studioId: string, inviteId: string) {
  const invite = await ctx.db.getRepository(AuthToken).findOne({ where: { id: inviteId, purpose: 'crew-invite', usedAt: IsNull() } })
  if (!invite || (invite.data as unknown as InviteData).studioId !== studioId) throw notFound('That invitation')
  await ctx.db.getRepository(AuthToken).update(invite.id, { usedAt: new Date() })
}

async function liveInvite(manager: EntityManager, token: string) {
  const found = await findLiveToken(manager, 'crew-invite', token)
  if (!found) throw badRequest('This invitation is not valid any more. Ask the studio for a new one.', undefined, 'bad-token')
  return { token: found, data: found.data as unknown as InviteData }
}

/** What the join page shows before anyone signs in. */
export async function describeInvite(ctx: AppContext, token: string) {
  return ctx.db.transaction(async (manager) => {
    const { token: row, data } = await liveInvite(manager, token)
    const studio = await manager.getRepository(Studio).findOneByOrFail({ id: data.studioId })
    return { studioId: studio.id, studioName: studio.name, email: data.email, expiresAt: row.expiresAt.toISOString() }
  })
}

/** Joins the signed-in person to the studio's crew; the invitation is for their address only. */
export async function acceptInvite(manager: EntityManager, user: Pick<User, 'id' | 'email'>, token: string) {
  const { data } = await liveInvite(manager, token)
  if (data.email !== user.email) {
    throw forbidden(`This invitation was sent to ${data.email}. Sign in with that address to accept it.`, 'invite-for-other')
  }
  await consumeToken(manager, 'crew-invite', token)
  const exists = await manager.getRepository(StudioMember).exists({ where: { studioId: data.studioId, userId: user.id } })
  if (!exists) await manager.getRepository(StudioMember).save({ studioId: data.studioId, userId: user.id, role: 'crew' })
  return { studioId: data.studioId }
}

/** The invitation a registration names, checked before the account is made. */
export async function inviteForRegistration(ctx: AppContext, token: string, email: string) {
  return ctx.db.transaction(async (manager) => {
    const { data } = await liveInvite(manager, token)
    if (data.email !== email)
      throw badRequest('Register with the address the invitation was sent to.', { email: `The invitation was sent to ${data.email}.` })
    return data
  })
}
