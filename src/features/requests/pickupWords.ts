// From drop-off to pickup in the words each side reads: how a piece came out, what the studio does
// next once the ware is in its hands, and the price that stands after check-in.
import type { Quote } from '../../../shared/firing/quote'
import type { RequestState } from '../../../shared/workflow/request-states'
import type { PieceOutcome, RequestView } from './api/types'

export const OUTCOMES: readonly { value: PieceOutcome; label: string }[] = [
  { value: 'fine', label: 'Fine' },
  { value: 'cracked', label: 'Cracked' },
  { value: 'blown-out', label: 'Blown out' },
  { value: 'glaze-ran', label: 'Glaze ran' },
  { value: 'stuck-to-shelf', label: 'Stuck to the shelf' },
  { value: 'other', label: 'Other' },
]

export const outcomeLabel = (outcome: PieceOutcome) => OUTCOMES.find((o) => o.value === outcome)?.label ?? outcome

/**
 * The studio's next step once the ware is in its hands; null where the general words fit. A list row
 * knows only the state, so without the request's details the words stay general.
 */
export function studioPickupStep(
  state: RequestState,
  view: Partial<Pick<RequestView, 'results' | 'owedCents' | 'checkIn'>> = {},
): string | null {
  switch (state) {
    case 'received':
      return view.checkIn && !view.checkIn.priceConfirmedAt
        ? 'Checked in; the potter has to confirm the new price before the firing'
        : 'Checked in; it goes in the kiln with this firing'
    case 'fired':
      return view.results
        ? 'Results posted; mark it ready for pickup'
        : view.results === null
          ? 'Out of the kiln: post the results'
          : 'Out of the kiln: post the results and mark it ready'
    case 'ready':
      return view.owedCents === undefined
        ? 'Ready for pickup'
        : view.owedCents > 0
          ? 'Ready; the balance is still owed'
          : 'Ready and paid; hand it over'
    case 'collected':
      return 'Collected: rate the potter'
    default:
      return null
  }
}

/** The potter's next step once the ware is with the studio; null where the general words fit. */
export function potterPickupStep(state: RequestState, view: Pick<RequestView, 'owedCents' | 'checkIn'>): string | null {
  if (state === 'received' && view.checkIn && !view.checkIn.priceConfirmedAt) return 'Confirm the new price the studio measured'
  if (state === 'ready')
    return view.owedCents > 0 ? 'Ready to collect: pay the balance online or at the counter' : 'Ready to collect; everything is paid'
  if (state === 'collected') return 'Collected: rate the studio'
  return null
}

/** The quote that stands: the measured one once the potter agreed to it (or when it went down). */
export function standingQuote(view: Pick<RequestView, 'quote' | 'checkIn'>): Quote | null {
  return view.checkIn?.quoteAfter && view.checkIn.priceConfirmedAt ? view.checkIn.quoteAfter : view.quote
}

/** Whether the check-in changed the price, and which way. */
export function priceChange(view: Pick<RequestView, 'checkIn'>): { beforeCents: number; afterCents: number; waiting: boolean } | null {
  const checkIn = view.checkIn
  if (!checkIn || checkIn.refused || !checkIn.quoteBefore || !checkIn.quoteAfter) return null
  if (checkIn.quoteBefore.totalCents === checkIn.quoteAfter.totalCents) return null
  return {
    beforeCents: checkIn.quoteBefore.totalCents,
    afterCents: checkIn.quoteAfter.totalCents,
    waiting: checkIn.priceConfirmedAt === null,
  }
}
