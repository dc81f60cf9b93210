// The shapes the requests API answers with (server/services/request-views.ts), declared once for the
// routes and the client.
import type { Finding, Piece, Verdict } from '../firing/check'
import type { Quote } from '../firing/quote'
import type { PieceOutcome } from '../schemas/pickup'
import type { PieceJson } from './load'
import type { ChecklistItem } from '../schemas/pieces'
import type { Answer, AnswerTally, PotterQuestion } from '../reviews'
import type { StudioPolicies } from '../schemas/studios'
import type { RequestAction } from '../workflow/policy'
import type { RequestState } from '../workflow/request-states'
import type { FiringLogJson } from './firing-log'
import type { PhotoJson } from './photos'
import type { FiringJson, KilnJson } from './studios'

export interface MeasuredSize {
  heightMm: number
  widthMm: number
  depthMm: number
}

/** What the studio recorded when the ware came in (or was turned away). */
export interface CheckInJson {
  refused: boolean
  refusedReason: string | null
  receivedPieces: { pieceIndex: number; declared: number; received: number; held?: number; measured?: MeasuredSize }[]
  conditionNotes: string
  quoteBefore: Quote | null
  quoteAfter: Quote | null
  /** Null while a higher price waits for the potter. */
  priceConfirmedAt: string | null
  at: string
}

export type { PieceOutcome }

/** The request's results, once every piece in the load has its outcome: each piece, and the counts. */
export interface ResultsJson {
  outcomes: { pieceId: string; tag: string; pieceIndex: number; copy: number; outcome: PieceOutcome; notes: string }[]
  counts: Partial<Record<PieceOutcome, number>>
  notes: string
  at: string
}

/** One side's answers after pickup: the potter's fill the studio questions, the studio's the potter questions. */
export interface ReviewJson {
  loading: Answer | null
  resultsAsLogged: Answer | null
  turnaround: Answer | null
  communication: Answer | null
  fireAgain: boolean | null
  asDeclared: Answer | null
  cleanAndDry: Answer | null
  onTime: Answer | null
  note: string
  at: string
  /** Null while hidden from the other side: until both have answered or the window closes. */
  publishedAt: string | null
}

export interface RequestReviewsJson {
  /** The potter's answers about the studio: the potter's own always, the studio's view once published. */
  ofStudio: ReviewJson | null
  /** The studio's answers about the potter, likewise. */
  ofPotter: ReviewJson | null
  /** Whether each side has answered, told even while the answers are hidden. */
  answered: { potter: boolean; studio: boolean }
  /** When the window closes and whatever was answered is published; null before pickup. */
  closesAt: string | null
}

/** What studios said of the potter after pickup, published answers only: the tally of each question. */
export type PotterReviewsJson = { count: number } & Record<PotterQuestion, AnswerTally>

export interface PotterRecordJson {
  requests: number
  collected: number
  noShows: number
  reviews: PotterReviewsJson | null
}

export interface TimelineEntryJson {
  at: string
  from: RequestState | null
  to: RequestState
  by: string
  reason: string
}

export interface LedgerEntryJson {
  at: string
  direction: 'in' | 'out'
  kind: 'deposit' | 'balance' | 'refund' | 'counter' | 'counter-refund' | 'claim'
  amountCents: number
  currency: string
  stripeSessionId: string | null
  stripePaymentIntentId: string | null
  stripeRefundId: string | null
  note: string
}

export interface PaymentJson {
  purpose: 'deposit' | 'balance'
  status: 'open' | 'paid' | 'expired' | 'failed'
  amountCents: number
  currency: string
  checkoutUrl: string | null
  failureMessage: string | null
  expiresAt: string
}

/** Money taken at the counter that the studio owes back. */
export interface CounterRefundJson {
  id: string
  amountCents: number
  currency: string
  reason: string
  paidAt: string | null
}

/**
 * The request's money in one place, the same on every screen and in every mail: the price that stands,
 * the deposit as asked (never recomputed), what was paid and what is owed now.
 */
export interface PriceJson {
  currency: string
  /** The quote the potter sent the request with. */
  asked: Quote | null
  /** The price that stands now (the sent quote, or the measured one once it stands). */
  standing: Quote | null
  /** A higher price from the measured ware, waiting for the potter's answer. */
  pending: Quote | null
  totalCents: number
  /** The deposit asked when the studio took the request on; before that, what the quote would ask. */
  depositCents: number
  depositAsked: boolean
  paidInCents: number
  refundedCents: number
  /** Paid and not had back: what the potter has in now. */
  netPaidCents: number
  depositOwedCents: number
  balanceOwedCents: number
  counterRefundDueCents: number
  /** The smallest amount a card can be charged; less is paid at the counter. */
  minimumOnlineCents: number
}

/** A card the potter kept at the deposit to pay damage claims they accept (the potter's view only). */
export interface KeptCardJson {
  label: string
  keptAt: string
}

export interface RequestView {
  id: string
  state: RequestState
  nextStates: readonly RequestState[]
  actions: RequestAction[]
  viewer: 'potter' | 'studio' | 'admin'
  pieces: Piece[]
  notes: string
  volumeL: number
  verdict: Verdict
  findings: Finding[]
  acknowledgedWarnings: string[]
  /** The quote that stands, with its lines. */
  quote: Quote | null
  price: PriceJson
  policiesVersion: number | null
  depositDueAt: string | null
  sentAt: string | null
  createdAt: string
  firing: FiringJson
  proposedFiring: FiringJson | null
  kiln: KilnJson
  studio: {
    id: string
    name: string
    city: string
    region: string
    timezone: string
    dropOffHours: string
    /** What crew check on each piece at drop-off (the studio's own list). */
    dropOffChecklist: ChecklistItem[]
    policies: StudioPolicies
    policiesVersion: number
    address: string | null
  }
  potter: { id: string; displayName: string; email?: string; record?: PotterRecordJson }
  timeline: TimelineEntryJson[]
  ledger: LedgerEntryJson[]
  counterRefunds: CounterRefundJson[]
  payments: PaymentJson[]
  /** Shown to the potter only; null for everyone else. */
  keptCard: KeptCardJson | null
  checkIn: CheckInJson | null
  /** Every piece received, tagged, in line and copy order. */
  pieceRecords: PieceJson[]
  /** The shelves the ware takes, planned alone on the kiln's shelves. */
  shelvesNeeded: number
  results: ResultsJson | null
  /** The log of the firing the ware is in, once the studio has written one. */
  firingLog: FiringLogJson | null
  photos: PhotoJson[]
  reviews: RequestReviewsJson
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

/** One line of a request list, with what the reader may do next. */
export interface RequestRow {
  id: string
  state: RequestState
  /** Whose list row this is: the reader's own request, or one to their studio. */
  side: 'potter' | 'studio'
  actions: RequestAction[]
  verdict: Verdict
  /** How many findings the server's check made. */
  findings: number
  volumeL: number
  pieceCount: number
  /** For a request waiting for an answer: the shelves its ware takes. */
  shelvesNeeded: number | null
  price: {
    totalCents: number
    depositCents: number
    netPaidCents: number
    owedCents: number
    pricePending: boolean
    currency: string
  } | null
  depositDueAt: string | null
  proposedFiringId: string | null
  updatedAt: string
  potterName: string
  firing: {
    id: string
    firingDate: string
    dropOffBy: string
    cone: string
    atmosphere: FiringJson['atmosphere']
    kind: FiringJson['kind']
    kilnName: string
    status: FiringJson['status']
  }
  studio: { id: string; name: string; timezone: string }
}

export interface RequestMessageJson {
  id: string
  side: 'potter' | 'studio'
  author: string
  body: string
  at: string
  mine: boolean
}
