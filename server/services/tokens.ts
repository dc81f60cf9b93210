import { createHash, randomBytes } from 'node:crypto'
import { IsNull, MoreThan, type EntityManager } from 'typeorm'
import { AuthToken, type TokenPurpose } from '../entities/AuthToken'

const hash = (token: string) => createHash('sha256').update(token).digest('hex')

export const TOKEN_LIFETIME_MS: Record<TokenPurpose, number> = {
  'verify-email': 48 * 3600_000,
  'password-reset': 3600_000,
  'crew-invite': 7 * 24 * 3600_000,
  // Lets the owner in while password sign-in is throttled: short-lived, like a reset link.
  'sign-in-link': 15 * 60_000,
}

/** Issues a random single-use token; only its hash is stored. Returns the token for the link. */
export async function issueToken(
  manager: EntityManager,
  purpose: TokenPurpose,
  userId: string | null,
  data: Record<string, unknown> = {},
): Promise<string> {
  const token = randomBytes(32).toString('base64url')
  await manager.getRepository(AuthToken).save({
    tokenHash: hash(token),
    purpose,
    userId,
    data,
    expiresAt: new Date(Date.now() + TOKEN_LIFETIME_MS[purpose]),
  })
  return token
}

/** A live token of that purpose, locked for the caller's transaction, or null. Does not use it up. */
export async function findLiveToken(manager: EntityManager, purpose: TokenPurpose, token: string) {
  return manager.getRepository(AuthToken).findOne({
    where: { tokenHash: hash(token), purpose, usedAt: IsNull(), expiresAt: MoreThan(new Date()) },
    lock: { mode: 'pessimistic_write' },
  })
}

/** Uses a token up; null when it is unknown, spent, expired or of another purpose. */
export async function consumeToken(manager: EntityManager, purpose: TokenPurpose, token: string) {
  const found = await findLiveToken(manager, purpose, token)
  if (!found) return null
  await manager.update(AuthToken, found.id, { usedAt: new Date() })
  return found
}

/** Spends every open token of a purpose for a user, e.g. older reset links once a new one is sent. */
export async function revokeTokens(manager: EntityManager, purpose: TokenPurpose, userId: string) {
  await manager.update(AuthToken, { purpose, userId, usedAt: IsNull() }, { usedAt: new Date() })
}
