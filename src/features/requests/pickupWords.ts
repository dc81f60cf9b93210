// From drop-off to pickup in the words each side reads: how a piece came out, what the studio does
// next once the ware is in its hands, and the price that stands after check-in.
import type { RequestState } from '../../../shared/workflow/request-states'
import type { RequestView } from './api/types'

export { OUTCOMES, outcomeLabel } from '../../lib/pieceWords'

/**
 * The studio's next step once the ware is in its hands; null where the general words fit. A list row
 * knows only the state, so without the request's details the words stay general.
 */
export function studioPickupStep(state: RequestState, view: Partial<Pick<RequestView, 'results' | 'price'>> = {}): string | null {
  const owed = view.price?.balanceOwedCents
  switch (state) {
    case 'received':
      return view.price?.pending
        ? 'Taken in; the potter has to confirm the new price before the firing'
        : 'Taken in; it goes in the kiln with this firing'
    case 'fired':
      return view.results
        ? 'Results posted; mark it ready for pickup'
        : view.results === null
          ? 'Out of the kiln: post the results'
          : 'Out of the kiln: post the results and mark it ready'
    case 'ready':
      return owed === undefined ? 'Ready for pickup' : owed > 0 ? 'Ready; the balance is still owed' : 'Ready and paid; hand it over'
    case 'collected':
      return view.price === undefined ? 'Picked up' : null
    default:
      return null
  }
}

/** The potter's next step once the ware is with the studio; null where the general words fit. */
export function potterPickupStep(state: RequestState, view: Pick<RequestView, 'price'>): string | null {
  if (state === 'received' && view.price.pending) return 'Answer the new price the studio measured: confirm it, or turn it down'
  if (state === 'ready')
    return view.price.balanceOwedCents > 0
      ? 'Ready for pickup: pay the balance online or at the counter'
      : 'Ready for pickup; everything is paid'
  return null
}

/** After pickup: the answers this side still owes, or that nothing more is to do. */
export function reviewStep(view: Pick<RequestView, 'actions' | 'viewer'>): string {
  if (view.actions.includes('rate'))
    return view.viewer === 'studio'
      ? 'Picked up: answer a few questions about the potter'
      : 'Picked up: answer a few questions about the firing'
  return 'Picked up: nothing more to do'
}

/** Whether the check-in changed the price, and which way. */
export function priceChange(
  view: Pick<RequestView, 'checkIn' | 'price' | 'state'>,
): { beforeCents: number; afterCents: number; waiting: boolean; declined: boolean } | null {
  const checkIn = view.checkIn
  if (!checkIn || checkIn.refused || !checkIn.quoteBefore || !checkIn.quoteAfter) return null
  if (checkIn.quoteBefore.totalCents === checkIn.quoteAfter.totalCents) return null
  return {
    beforeCents: checkIn.quoteBefore.totalCents,
    afterCents: checkIn.quoteAfter.totalCents,
    waiting: view.price.pending !== null,
    // A raised price that was neither confirmed nor is waiting any more was turned down.
    declined: view.price.pending === null && checkIn.priceConfirmedAt === null && view.state === 'withdrawn',
  }
}
