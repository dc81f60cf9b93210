// Making good to potters whose pieces an incident hurt: the studio gives money back on the hurt
// potter's own ask (a credit), or promises to refire named pieces free in a coming firing. One of each
// per hurt ask and incident. The rules of a credit are pure, so the form can say what the server will.
import type { RequestState } from './workflow/request-states'

export const REMEDY_KINDS = ['credit', 'refire'] as const
export type RemedyKind = (typeof REMEDY_KINDS)[number]

export const REMEDY_LABELS: Record<RemedyKind, string> = {
  credit: 'Credit',
  refire: 'Refire free',
}

/** What a credit is measured against: the hurt ask's state and its own money, as the ledger has it. */
export interface CreditRoom {
  state: RequestState
  /** Paid on the ask and not had back (nor owed back at the counter). */
  creditableCents: number
}

export type CreditRefusal = { status: 400 | 409; code: string; message: string }

/**
 * Why a credit cannot be given now, or null when it can (`amountCents` undefined asks only whether the
 * ask can take one). A credit is money given back, so it waits until the ware is picked up and the
 * price settled: before that, the ask's balance would only ask for it again.
 */
export function creditRefusal(room: CreditRoom, amountCents: number | undefined, format: (cents: number) => string): CreditRefusal | null {
  if (room.state !== 'collected')
    return {
      status: 409,
      code: 'not-picked-up',
      message:
        'A credit is given once the potter has picked up the ware and the price is settled. Promise a free refire now, or credit after pickup.',
    }
  if (room.creditableCents <= 0) return { status: 409, code: 'nothing-paid', message: 'Nothing paid on this ask is left to give back.' }
  if (amountCents === undefined) return null
  if (!Number.isInteger(amountCents) || amountCents <= 0)
    return { status: 400, code: 'invalid-input', message: 'Enter an amount above zero.' }
  if (amountCents > room.creditableCents)
    return {
      status: 400,
      code: 'over-paid',
      message: `At most ${format(room.creditableCents)}: what the potter paid on this ask and has not had back.`,
    }
  return null
}

/**
 * How a credit goes back: through Stripe on what was paid online, the rest owed at the studio's
 * counter (money taken by hand cannot go back to a card).
 */
export function creditSplit(amountCents: number, onlineNetCents: number): { onlineCents: number; counterCents: number } {
  const onlineCents = Math.max(0, Math.min(amountCents, onlineNetCents))
  return { onlineCents, counterCents: amountCents - onlineCents }
}
