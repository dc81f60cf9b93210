// A potter's ask in the words each side reads: the state's badge, what happens next, the refund a
// withdrawal would give, pieces in the reader's units, Stripe ids short enough to read.
import { formatDateTime } from '../../../shared/dates'
import { refundUnderTerms } from '../../../shared/refunds'
import type { Piece } from '../../../shared/firing/check'
import { formatCone } from '../../../shared/firing/cones'
import type { StudioPolicies } from '../../../shared/schemas/studios'
import { REQUEST_STATE_LABELS, type RequestState } from '../../../shared/workflow/request-states'
import type { BadgeTone } from '../../components/ui/Badge'
import { formatLength, type UnitSystem } from '../../lib/units'
import { formatMoney } from '../../../shared/dates'
import type { RequestRow } from './api/types'

export const STATE_TONES: Record<RequestState, BadgeTone> = {
  draft: 'neutral',
  sent: 'clay',
  accepted: 'ember',
  declined: 'danger',
  withdrawn: 'neutral',
  deposit_paid: 'celadon',
  received: 'celadon',
  fired: 'celadon',
  ready: 'celadon',
  collected: 'neutral',
  cancelled: 'danger',
  lapsed: 'neutral',
  disputed: 'danger',
}

export const stateLabel = (state: RequestState) => REQUEST_STATE_LABELS[state]

type NextStepFacts = Pick<RequestRow, 'state' | 'depositDueAt' | 'proposedFiringId'> & { dropOffBy: string; timezone: string }

/** What the potter does next, or waits for, in a line. */
export function potterNextStep(r: NextStepFacts): string {
  const when = (iso: string) => formatDateTime(iso, r.timezone)
  switch (r.state) {
    case 'draft':
      return 'Finish the pieces and send the ask'
    case 'sent':
      return r.proposedFiringId ? 'Answer the studio’s suggestion' : 'Waiting for the studio'
    case 'accepted':
      return r.depositDueAt ? `Pay the deposit by ${when(r.depositDueAt)}` : 'Pay the deposit to hold your space'
    case 'deposit_paid':
      return `Bring your ware by ${when(r.dropOffBy)}`
    case 'received':
      return 'The studio has your ware; it goes in the kiln next'
    case 'fired':
      return 'Fired and unloaded; results come next'
    case 'ready':
      return 'Ready for pickup'
    case 'collected':
      return 'Picked up'
    case 'declined':
      return 'The studio turned it down'
    case 'withdrawn':
      return 'You withdrew this ask'
    case 'cancelled':
      return 'Called off'
    case 'lapsed':
      return 'Lapsed before it was settled; nothing more is owed'
    case 'disputed':
      return 'Being settled with the studio'
  }
}

/** What the studio does next with an ask, in a line. */
export function studioNextStep(r: NextStepFacts): string {
  const when = (iso: string) => formatDateTime(iso, r.timezone)
  switch (r.state) {
    case 'sent':
      return r.proposedFiringId ? 'Waiting for the potter to answer your suggestion' : 'Take it on, turn it down or suggest another firing'
    case 'accepted':
      return r.depositDueAt ? `Space held; deposit due by ${when(r.depositDueAt)}` : 'Space held; waiting for the deposit'
    case 'deposit_paid':
      return `Paid; ware arrives by ${when(r.dropOffBy)}`
    default:
      return potterNextStep(r)
  }
}

export interface RefundPreview {
  refundCents: number
  /** Whether the full-refund window is still open. */
  full: boolean
  /** The last moment of the full-refund window. */
  fullUntil: Date
}

/** The refund a withdrawal gives now, by the same rule the server refunds with. */
export function refundIfWithdrawn(
  paidCents: number,
  firingDate: string,
  terms: StudioPolicies['cancellation'],
  now = new Date(),
): RefundPreview {
  return refundUnderTerms(paidCents, firingDate, terms, now)
}

/** "pi_3Nq…x7Yb": Stripe's prefix and the last characters, enough to find it in the dashboard. */
export function shortStripeId(id: string): string {
  const underscore = id.indexOf('_')
  const prefix = underscore > 0 && underscore < 6 ? id.slice(0, underscore + 1) : ''
  const rest = id.slice(prefix.length)
  return rest.length <= 10 ? id : `${prefix}${rest.slice(0, 4)}…${rest.slice(-4)}`
}

const CLAY_WORDS: Record<Piece['clay']['body'], string> = {
  earthenware: 'Earthenware',
  stoneware: 'Stoneware',
  porcelain: 'Porcelain',
  raku: 'Raku clay',
  other: 'Other clay',
}

export function pieceSizeInWords(piece: Piece, units: UnitSystem): string {
  const tall = `${formatLength(piece.heightMm, units)} tall`
  if (piece.round) return `${formatLength(piece.widthMm, units)} across × ${tall}`
  return `${formatLength(piece.widthMm, units)} × ${formatLength(piece.depthMm, units)} × ${tall}`
}

export function clayInWords(piece: Piece): string {
  return `${CLAY_WORDS[piece.clay.body]}, ${formatCone(piece.clay.minCone)} to ${piece.clay.maxCone}`
}

export function glazeInWords(piece: Piece): string {
  if (!piece.glaze) return 'Unglazed'
  const notes = [
    piece.glaze.runny && 'runny',
    piece.glaze.onFoot && 'glaze on the foot',
    piece.glaze.support && piece.glaze.support !== 'none' && `on a ${piece.glaze.support === 'tray' ? 'catch tray' : piece.glaze.support}`,
    piece.glaze.tested === false && 'not tested',
    piece.glaze.reductionOnly && 'reduction glaze',
    piece.glaze.colourants?.length && piece.glaze.colourants.map((c) => (c === 'chrome-tin' ? 'chrome–tin' : c)).join(' and '),
  ].filter(Boolean)
  return `Glaze ${formatCone(piece.glaze.minCone)} to ${piece.glaze.maxCone}${notes.length ? ` (${notes.join(', ')})` : ''}`
}

export function pieceStateInWords(piece: Piece): string {
  const form =
    piece.form === 'closed' ? (piece.ventHole ? ', closed (vented)' : ', closed, no vent') : piece.form === 'solid' ? ', solid' : ''
  const extras = piece.materials?.length ? `; with ${piece.materials.map((m) => m.replace('-', ' ')).join(', ')}` : ''
  const weight = piece.weightG !== undefined ? `, ${Math.round(piece.weightG)} g each` : ''
  if (piece.state === 'bisque') return `Bisque${form}${weight}${extras}`
  if (piece.state === 'glazed') return `Glaze fired${form}${weight}${extras}`
  return `${piece.boneDry ? 'Greenware, bone dry' : 'Greenware, not bone dry'}${form}${weight}${extras}`
}

/** Actions that are the reader's to take now (not merely available): a row with one of these wants them. */
const CALLS_FOR: RequestRow['actions'] = [
  'send',
  'pay-deposit',
  'answer-move',
  'accept',
  'check-in',
  'confirm-price',
  'results',
  'ready',
  'pay-balance',
  'collected',
  'rate',
  'hand-back',
]

/** Whether a list row is waiting on its reader. */
export const rowWantsMe = (row: Pick<RequestRow, 'actions'>) => row.actions.some((a) => CALLS_FOR.includes(a))

/** A list row's next step for its reader, from the actions the policy gives them. */
export function rowNextStep(row: RequestRow): string {
  const facts = { ...row, dropOffBy: row.firing.dropOffBy, timezone: row.studio.timezone }
  const studio = row.side === 'studio'
  const owed = row.price && row.price.owedCents > 0 ? formatMoney(row.price.owedCents, row.price.currency) : null
  if (row.actions.includes('hand-back')) return 'Money taken at the counter is owed back: hand it back and mark it'
  if (row.state === 'collected')
    return row.actions.includes('rate') ? `Picked up: answer a few questions about the ${studio ? 'potter' : 'firing'}` : 'Picked up'
  if (row.state === 'received' && row.price?.pricePending)
    return studio ? 'Taken in; waiting for the potter to answer the new price' : 'Answer the new price the studio measured'
  if (row.state === 'ready')
    return owed
      ? studio
        ? `Ready; ${owed} still owed`
        : `Ready for pickup: pay ${owed} online or at the counter`
      : studio
        ? 'Ready and paid; hand it over'
        : 'Ready for pickup; everything is paid'
  if (row.state === 'fired' && studio)
    return row.actions.includes('ready') ? 'Results posted; mark it ready for pickup' : 'Out of the kiln: post the results'
  return studio ? studioNextStep(facts) : potterNextStep(facts)
}

/** The row's money in a line: the price that stands, the deposit as asked, and what is owed now. */
export function rowMoneyLine(row: RequestRow): string | null {
  if (!row.price) return null
  const money = (cents: number) => formatMoney(cents, row.price!.currency)
  const parts = [money(row.price.totalCents), `deposit ${money(row.price.depositCents)}`]
  if (row.price.netPaidCents > 0) parts.push(`paid ${money(row.price.netPaidCents)}`)
  return parts.join(' · ')
}
