// The shapes the requests API answers with (server/services/request-views.ts), and the firing,
// kiln and studio records the compose page reads (server/services/firings.ts, kilns.ts, studios.ts).
import type { Finding, Piece, Verdict } from '../../../../shared/firing/check'
import type { FiringLogRecord } from '../../../components/firing/FiringLog'
import type { PhotoRecord } from '../../../components/photos/photoTypes'
import type { PriceList, Quote } from '../../../../shared/firing/quote'
import type { StudioPolicies } from '../../../../shared/schemas/studios'
import type { RequestState } from '../../../../shared/workflow/request-states'

import type { FiringJson as FiringRecord, KilnJson as KilnRecord } from '../../../../shared/api/studios'

export type { FiringRecord, KilnRecord }

export interface PriceListAnswer {
  priceList: PriceList
}

/** The studio as a potter sees it before sending (the public side). */
export interface StudioRecord {
  id: string
  name: string
  city: string
  region: string
  timezone: string
  currency: string
  dropOffHours: string
  policies: StudioPolicies
  policiesVersion: number
  published: boolean
}

export type RequestAction =
  | 'message'
  | 'edit'
  | 'send'
  | 'withdraw'
  | 'pay-deposit'
  | 'answer-move'
  | 'accept'
  | 'decline'
  | 'move'
  | 'cancel'
  | 'check-in'
  | 'counter-payment'
  | 'results'
  | 'ready'
  | 'collected'
  | 'confirm-price'
  | 'pay-balance'
  | 'rate'
  | 'reply'
  | 'dispute'

export interface MeasuredSize {
  heightMm: number
  widthMm: number
  depthMm: number
}

/** What the studio recorded when the ware came in (or was turned away). */
export interface CheckInRecord {
  refused: boolean
  refusedReason: string | null
  receivedPieces: { pieceIndex: number; declared: number; received: number; measured?: MeasuredSize }[]
  conditionNotes: string
  quoteBefore: Quote | null
  quoteAfter: Quote | null
  /** Null while a higher price waits for the potter. */
  priceConfirmedAt: string | null
  at: string
}

export type PieceOutcome = 'fine' | 'cracked' | 'blown-out' | 'glaze-ran' | 'stuck-to-shelf' | 'other'

export interface ResultsRecord {
  outcomes: { pieceIndex: number; outcome: PieceOutcome; notes: string }[]
  notes: string
  at: string
}

export interface RatingRecord {
  stars: number
  care: number | null
  communication: number | null
  results: number | null
  asDeclared: number | null
  onTime: number | null
  text: string
  reply: string | null
  at: string
  editableUntil: string
}

export interface RequestRatings {
  /** The potter's rating of the studio. */
  ofStudio: RatingRecord | null
  /** The studio's rating of the potter. */
  ofPotter: RatingRecord | null
}

/** What the check-in answers besides the request: the server's check of the ware as it came in. */
export interface CheckInOutcome {
  refused: boolean
  findings: Finding[]
  verdict?: Verdict
  priceBeforeCents?: number
  priceAfterCents?: number
  needsConfirmation?: boolean
  request: RequestView
}

export interface PotterRecord {
  requests: number
  collected: number
  noShows: number
  rating: { mean: number; count: number } | null
}

export interface TimelineEntry {
  at: string
  from: RequestState | null
  to: RequestState
  by: string
  reason: string
}

export interface LedgerEntry {
  at: string
  direction: 'in' | 'out'
  kind: string
  amountCents: number
  currency: string
  stripeSessionId: string | null
  stripePaymentIntentId: string | null
  stripeRefundId: string | null
  note: string
}

export interface PaymentRecord {
  purpose: 'deposit' | 'balance'
  status: 'open' | 'paid' | 'expired' | 'failed'
  amountCents: number
  currency: string
  checkoutUrl: string | null
  failureMessage: string | null
  expiresAt: string
}

export interface RequestView {
  id: string
  state: RequestState
  nextStates: RequestState[]
  actions: RequestAction[]
  viewer: 'potter' | 'studio' | 'admin'
  pieces: Piece[]
  notes: string
  volumeL: number
  verdict: Verdict
  findings: Finding[]
  acknowledgedWarnings: string[]
  quote: Quote | null
  policiesVersion: number | null
  depositDueAt: string | null
  sentAt: string | null
  createdAt: string
  firing: FiringRecord
  proposedFiring: FiringRecord | null
  kiln: KilnRecord
  studio: {
    id: string
    name: string
    city: string
    region: string
    timezone: string
    dropOffHours: string
    policies: StudioPolicies
    policiesVersion: number
    address: string | null
  }
  potter: { id: string; displayName: string; email?: string; record?: PotterRecord }
  timeline: TimelineEntry[]
  ledger: LedgerEntry[]
  paid: { inCents: number; refundedCents: number; depositCents: number }
  payments: PaymentRecord[]
  checkIn: CheckInRecord | null
  results: ResultsRecord | null
  /** The log of the firing the ware is in, once the studio has written one. */
  firingLog: FiringLogRecord | null
  /** What the potter still owes: the standing total less what came in. */
  owedCents: number
  photos: PhotoRecord[]
  ratings: RequestRatings
}

/** One line of a request list. */
export interface RequestRow {
  id: string
  state: RequestState
  verdict: Verdict
  /** How many findings the server's check made. */
  findings: number
  volumeL: number
  pieceCount: number
  quote: { totalCents: number; depositCents: number; currency: string } | null
  depositDueAt: string | null
  proposedFiringId: string | null
  updatedAt: string
  potterName: string
  firing: {
    id: string
    firingDate: string
    dropOffBy: string
    cone: string
    atmosphere: FiringRecord['atmosphere']
    kind: FiringRecord['kind']
    kilnName: string
  }
  studio: { id: string; name: string; timezone: string }
}

export interface RequestMessage {
  id: string
  side: 'potter' | 'studio'
  author: string
  body: string
  at: string
  mine: boolean
}

export interface RequestFilter {
  as?: 'potter' | 'studio'
  studioId?: string
  firingId?: string
  state?: RequestState
}
