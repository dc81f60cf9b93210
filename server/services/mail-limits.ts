// Mail that someone can make us send to an address outside their own account (crew invitations,
// password resets, sign-in links, address confirmations) is allowed a few times per sender and per
// recipient, so no one can turn Conewright into a way of flooding an inbox.
import type { EntityManager } from 'typeorm'
import { HttpError } from '../http/errors'
import { countHit, secondsUntil } from './counters'

export type MailKind = 'crew-invite' | 'password-reset' | 'verify-email' | 'sign-in-link'

interface Allowance {
  limit: number
  windowMs: number
}

const HOUR = 3600_000

export const MAIL_LIMITS: Record<MailKind, { perSender: Allowance; perRecipient: Allowance }> = {
  // A studio inviting its crew: a handful of new people an hour; any one address at most three times a day.
  'crew-invite': { perSender: { limit: 20, windowMs: HOUR }, perRecipient: { limit: 3, windowMs: 24 * HOUR } },
  'password-reset': { perSender: { limit: 10, windowMs: HOUR }, perRecipient: { limit: 3, windowMs: HOUR } },
  'verify-email': { perSender: { limit: 5, windowMs: HOUR }, perRecipient: { limit: 5, windowMs: HOUR } },
  'sign-in-link': { perSender: { limit: 10, windowMs: HOUR }, perRecipient: { limit: 3, windowMs: HOUR / 4 } },
}

/**
 * Counts one mail of this kind from `sender` (a user id, or the address a visitor came from) to
 * `recipient`, in the caller's transaction; over either allowance it refuses with 429. A refused
 * attempt rolls back with its transaction, so it does not count.
 */
export async function takeMailAllowance(manager: EntityManager, kind: MailKind, sender: string, recipient: string) {
  const { perSender, perRecipient } = MAIL_LIMITS[kind]
  const bySender = await countHit(manager, `mail:${kind}:from:${sender}`, perSender.windowMs)
  const byRecipient = await countHit(manager, `mail:${kind}:to:${recipient.toLowerCase()}`, perRecipient.windowMs)
  const over = [
    bySender.hits > perSender.limit ? bySender.resetAt : null,
    byRecipient.hits > perRecipient.limit ? byRecipient.resetAt : null,
  ].filter((d): d is Date => d !== null)
  if (over.length) {
    const retryAfterSeconds = Math.max(...over.map(secondsUntil))
    throw new HttpError(
      429,
      'mail-limit',
      bySender.hits > perSender.limit
        ? 'You have sent as many of these mails as we allow for now. Try again later.'
        : 'That address has been sent as many of these mails as we allow for now. Try again later.',
      undefined,
      { retryAfterSeconds },
    )
  }
}
