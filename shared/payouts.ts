// Paying studios, as arithmetic both sides can read: the marketplace's fee, where every cent of a
// request's money is (the ledger's balance), when a studio's share is earned, and a payout account's
// state in plain words. The server moves the money by these rules; the money page shows the same
// figures. Amounts are integer cents.
import type { RequestState } from './workflow/request-states'

/** The marketplace's fee: a percentage (in basis points, 1 % = 100) with a minimum per request. */
export interface FeeRule {
  percentBp: number
  minimumCents: number
}

/**
 * The fee on what a request brought in through the marketplace and kept (paid online, less online
 * refunds): the percentage rounded half up to the cent, at least the minimum, never more than what
 * there is. Money taken at a studio's own counter never passes through the marketplace and carries no fee.
 */
export function marketplaceFee(keptOnlineCents: number, rule: FeeRule): number {
  if (keptOnlineCents <= 0) return 0
  const share = Math.floor((keptOnlineCents * rule.percentBp + 5_000) / 10_000)
  return Math.min(keptOnlineCents, Math.max(rule.minimumCents, share))
}

export function feeRuleOf(percent: number, minimumCents: number): FeeRule {
  return { percentBp: Math.round(percent * 100), minimumCents }
}

export function feeRuleInWords(rule: FeeRule, formatCents: (cents: number) => string): string {
  return `${rule.percentBp / 100} % of what potters pay online, at least ${formatCents(rule.minimumCents)} a request`
}

/**
 * Every kind of money movement on a request and what it does to the ledger. A new kind (a claim paid
 * out, say) is one more row: which way the money went (`paid` in by the potter, `refunded` to the
 * potter, `transferred` or `reversed` between the marketplace and the studio) and through which
 * channel (`online` through the marketplace's Stripe account, `counter` by hand at the studio).
 */
export const MONEY_KINDS = {
  deposit: { channel: 'online', role: 'paid' },
  balance: { channel: 'online', role: 'paid' },
  counter: { channel: 'counter', role: 'paid' },
  refund: { channel: 'online', role: 'refunded' },
  'counter-refund': { channel: 'counter', role: 'refunded' },
  /** Owed back at the counter and not yet handed back: the potter's money all the same. */
  'counter-refund-due': { channel: 'counter', role: 'refunded' },
  transfer: { channel: 'online', role: 'transferred' },
  'transfer-reversal': { channel: 'online', role: 'reversed' },
  /** A damage claim the potter paid online: the studio's share of it follows the same rules. */
  claim: { channel: 'online', role: 'paid' },
} as const satisfies Record<string, { channel: 'online' | 'counter'; role: 'paid' | 'refunded' | 'transferred' | 'reversed' }>

export type MoneyKind = keyof typeof MONEY_KINDS

export interface Movement {
  kind: MoneyKind
  amountCents: number
}

/** Where a request's money is, and what the studio is still owed. */
export interface RequestLedger {
  /** Everything the potter paid, online and at the counter. */
  paidInCents: number
  /** Everything given back (or owed back at the counter). */
  refundedCents: number
  /** Kept by the studio at its own counter. */
  atCounterCents: number
  /** The marketplace's fee, once the studio's share is earned. */
  feeCents: number
  /** Sent to the studio's payout account, less reversals. */
  transferredCents: number
  /** Still with the marketplace: not yet earned, held, or waiting for the studio's payout account. */
  heldCents: number
  /** Paid online and kept: what the fee is taken from and transfers are made from. */
  keptOnlineCents: number
  /** What the studio's transfers should add up to now. */
  targetCents: number
  /** To transfer (positive) or reverse (negative) to reach the target. */
  dueCents: number
}

/**
 * Tallies a request's movements. `earned`: the studio's share may be paid (the ware is collected, or
 * the request ended with money the studio keeps under its terms). Until then nothing is transferred;
 * a request that stops being earned after a transfer (a dispute) is never sent more, but a refund can
 * still take back the studio's part of it.
 */
export function tally(movements: Movement[], rule: FeeRule, earned: boolean): RequestLedger {
  const sum = { online: { paid: 0, refunded: 0 }, counter: { paid: 0, refunded: 0 } }
  let transferred = 0
  for (const movement of movements) {
    const { channel, role } = MONEY_KINDS[movement.kind]
    if (role === 'transferred') transferred += movement.amountCents
    else if (role === 'reversed') transferred -= movement.amountCents
    else sum[channel][role] += movement.amountCents
  }
  const keptOnline = sum.online.paid - sum.online.refunded
  const fee = earned || transferred > 0 ? marketplaceFee(keptOnline, rule) : 0
  const share = Math.max(0, keptOnline - fee)
  const target = earned ? share : Math.min(transferred, share)
  return {
    paidInCents: sum.online.paid + sum.counter.paid,
    refundedCents: sum.online.refunded + sum.counter.refunded,
    atCounterCents: sum.counter.paid - sum.counter.refunded,
    feeCents: fee,
    transferredCents: transferred,
    heldCents: keptOnline - fee - transferred,
    keptOnlineCents: keptOnline,
    targetCents: target,
    dueCents: target - transferred,
  }
}

export type LedgerBucket = 'transferredCents' | 'feeCents' | 'refundedCents' | 'atCounterCents' | 'heldCents'
export const LEDGER_BUCKETS: readonly LedgerBucket[] = ['transferredCents', 'feeCents', 'refundedCents', 'atCounterCents', 'heldCents']

/**
 * What is wrong with a ledger, if anything: every cent paid in must be transferred, kept as the fee,
 * refunded, kept at the counter or held, and no bucket may be negative (a studio sent more than the
 * marketplace holds for it, a refund larger than what was paid).
 */
export function ledgerProblems(ledger: RequestLedger): string[] {
  const problems: string[] = []
  const accounted = LEDGER_BUCKETS.reduce((n, bucket) => n + ledger[bucket], 0)
  if (accounted !== ledger.paidInCents) problems.push(`${ledger.paidInCents} paid in but ${accounted} accounted for`)
  for (const bucket of LEDGER_BUCKETS) if (ledger[bucket] < 0) problems.push(`${bucket} is negative (${ledger[bucket]})`)
  if (ledger.keptOnlineCents < 0) problems.push(`more refunded online than paid online (${ledger.keptOnlineCents})`)
  if (ledger.feeCents > Math.max(0, ledger.keptOnlineCents)) problems.push('the fee is more than was kept online')
  return problems
}

/** Adds ledgers up, bucket by bucket: a studio's month, or the whole marketplace. */
export function sumLedgers(ledgers: RequestLedger[]): RequestLedger {
  const total: RequestLedger = {
    paidInCents: 0,
    refundedCents: 0,
    atCounterCents: 0,
    feeCents: 0,
    transferredCents: 0,
    heldCents: 0,
    keptOnlineCents: 0,
    targetCents: 0,
    dueCents: 0,
  }
  for (const ledger of ledgers) for (const key of Object.keys(total) as (keyof RequestLedger)[]) total[key] += ledger[key]
  return total
}

/** Request states in which the studio's share is earned: the ware went home, or the request ended. */
const EARNING_STATES: readonly RequestState[] = ['collected', 'withdrawn', 'cancelled', 'lapsed', 'declined']

/** Where a request's payout stands. */
export type PayoutStage =
  /** The ware is still on its way through the studio: the money waits with the marketplace. */
  | 'in-hand'
  /** Earned, in the hold after collection (the potter may still raise a problem). */
  | 'hold'
  /** A dispute holds the studio's share until the desk settles it. */
  | 'dispute'
  /** Earned: transferred, or sent as soon as the studio's payout account can take it. */
  | 'earned'

export function payoutStage(
  state: RequestState,
  facts: { releaseAt: Date | null; disputeSettled: boolean },
  now = new Date(),
): PayoutStage {
  if (state === 'disputed') return facts.disputeSettled ? 'earned' : 'dispute'
  if (!EARNING_STATES.includes(state)) return 'in-hand'
  if (facts.releaseAt && facts.releaseAt.getTime() > now.getTime()) return 'hold'
  return 'earned'
}

export function earnsPayout(state: RequestState): boolean {
  return EARNING_STATES.includes(state)
}

/** What Stripe says of a connected account, as far as paying the studio goes. */
export interface PayoutAccountFacts {
  detailsSubmitted: boolean
  transfers: string | null
  payoutsEnabled: boolean
  currentlyDue: string[]
  pendingVerification: string[]
  disabledReason: string | null
  bankLast4: string | null
}

export type PayoutAccountState = 'none' | 'incomplete' | 'needs-info' | 'checking' | 'rejected' | 'ready'

export function payoutAccountState(facts: PayoutAccountFacts | null): PayoutAccountState {
  if (!facts) return 'none'
  if (facts.disabledReason?.startsWith('rejected.')) return 'rejected'
  if (facts.transfers === 'active' && facts.currentlyDue.length === 0) return 'ready'
  if (!facts.detailsSubmitted) return 'incomplete'
  if (facts.currentlyDue.length > 0) return 'needs-info'
  if (facts.transfers === 'active') return 'ready'
  return 'checking'
}

// Requirement fields by their prefix, in words an owner knows (Stripe's field names, common practice).
const DUE_WORDS: [string, string][] = [
  ['external_account', 'a bank account for payouts'],
  ['individual.verification', 'a photo of an identity document'],
  ['representative.verification', 'a photo of an identity document'],
  ['individual.dob', 'your date of birth'],
  ['individual.ssn_last_4', 'the last 4 digits of your Social Security number'],
  ['individual.id_number', 'your Social Security number'],
  ['individual.address', 'your home address'],
  ['individual.first_name', 'your legal name'],
  ['individual.last_name', 'your legal name'],
  ['individual.email', 'your e-mail address'],
  ['individual.phone', 'your phone number'],
  ['business_type', 'whether you work as an individual or a company'],
  ['business_profile', 'a short description of the studio'],
  ['company', 'the company’s details'],
  ['tos_acceptance', 'your agreement to Stripe’s services agreement'],
]

/** The fields Stripe still needs, as a short list of things to have at hand. */
export function dueInWords(fields: string[]): string[] {
  const words: string[] = []
  for (const field of fields) {
    const found = DUE_WORDS.find(([prefix]) => field === prefix || field.startsWith(`${prefix}.`))?.[1] ?? 'other details Stripe asks for'
    if (!words.includes(found)) words.push(found)
  }
  return words
}

/** Title and one line for the money page and the owner's mail. */
export function payoutAccountWords(state: PayoutAccountState, facts: PayoutAccountFacts | null): { title: string; detail: string } {
  const due = dueInWords(facts?.currentlyDue ?? [])
  switch (state) {
    case 'none':
      return {
        title: 'Payouts are not set up',
        detail:
          'Connect a payout account through Stripe to be paid for your firings. Until then Conewright keeps what you are owed and sends it once you are set up.',
      }
    case 'incomplete':
      return {
        title: 'Setup not finished',
        detail: `Stripe still needs ${listInWords(due)}. What you are owed waits with Conewright until then.`,
      }
    case 'needs-info':
      return {
        title: 'Stripe needs more information',
        detail: `Stripe needs ${listInWords(due)} before it can send you money. What you are owed waits with Conewright until then.`,
      }
    case 'checking':
      return { title: 'Stripe is checking your details', detail: 'This usually takes a few minutes. Nothing is needed from you now.' }
    case 'rejected':
      return {
        title: 'Stripe could not accept this payout account',
        detail: 'Write to the Conewright desk: what you are owed stays with us and is not lost.',
      }
    case 'ready':
      return {
        title: 'Payouts are on',
        detail: facts?.payoutsEnabled
          ? `Your share of each firing is transferred when the ware is collected, and Stripe sends it on to the bank account${facts.bankLast4 ? ` ending ${facts.bankLast4}` : ''}.`
          : `Transfers reach your Stripe account, but Stripe is not sending them to a bank: it needs ${listInWords(due.length ? due : ['a bank account for payouts'])}.`,
      }
  }
}

function listInWords(items: string[]): string {
  if (items.length === 0) return 'a few more details'
  if (items.length === 1) return items[0]
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`
}
