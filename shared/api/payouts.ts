// The shapes the studio money routes answer with (server/services/payouts.ts), declared once for the
// routes and the client. Amounts are integer cents in `currency`.
import type { PayoutAccountState, PayoutStage } from '../payouts'
import type { RequestState } from '../workflow/request-states'

export interface PayoutAccountJson {
  state: PayoutAccountState
  title: string
  detail: string
  /** What Stripe still needs, in words. */
  due: string[]
  bankLast4: string | null
  payoutsEnabled: boolean
}

/** What the studio is owed and has had, across all its requests. */
export interface StudioBalanceJson {
  currency: string
  /** Earned and still with Conewright: waiting for the payout account, a hold or a dispute. */
  owedCents: number
  /** Paid by potters whose ware is still with the studio: earned once it is collected. */
  waitingCents: number
  transferredCents: number
  feeCents: number
  atCounterCents: number
}

export interface TransferJson {
  id: string
  requestId: string
  potterName: string
  at: string
  amountCents: number
  reversedCents: number
  currency: string
  stripeTransferId: string
  reversals: { at: string; amountCents: number; stripeReversalId: string }[]
}

/** A payout from the studio's Stripe account to its bank, as Stripe reports it. */
export interface BankPayoutJson {
  id: string
  amountCents: number
  currency: string
  status: string
  arrivalDate: string
  createdAt: string
  failureMessage: string | null
}

/** One request's money, as the studio's statement lists it. */
export interface EarningJson {
  requestId: string
  potterName: string
  firingDate: string
  kilnName: string
  state: RequestState
  stage: PayoutStage
  /** Why the money is where it is, in words. */
  stageWords: string
  /** When the share was earned (its month on the statement); null while the ware is in hand. */
  earnedAt: string | null
  currency: string
  grossCents: number
  refundsCents: number
  feeCents: number
  netCents: number
  atCounterCents: number
  transferredCents: number
  pendingCents: number
}

/** A month of earnings: the requests earned in it, added up. */
export interface EarningMonthJson {
  /** YYYY-MM in the studio's time zone. */
  month: string
  requests: number
  grossCents: number
  refundsCents: number
  feeCents: number
  netCents: number
  atCounterCents: number
  transferredCents: number
  pendingCents: number
}

export interface StudioPayoutsJson {
  studioId: string
  timezone: string
  account: PayoutAccountJson
  balance: StudioBalanceJson
  fee: { percent: number; minimumCents: number; words: string }
  holdHours: number
  transfers: TransferJson[]
  payouts: BankPayoutJson[]
  firings: EarningJson[]
  months: EarningMonthJson[]
}
