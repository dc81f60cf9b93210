// The life of a firing request. One table of allowed changes: the server enforces it (a forbidden
// change is a 409 naming the allowed next states) and the client offers only these.

export const REQUEST_STATES = [
  'draft',
  'sent',
  'accepted',
  'declined',
  'withdrawn',
  'deposit_paid',
  'received',
  'fired',
  'ready',
  'collected',
  'cancelled',
  'lapsed',
  'disputed',
] as const
export type RequestState = (typeof REQUEST_STATES)[number]

const NEXT: Record<RequestState, readonly RequestState[]> = {
  draft: ['sent', 'cancelled'],
  // Waiting for an answer, or for the deposit: lapses when the firing stops taking ware or time runs out.
  sent: ['accepted', 'declined', 'withdrawn', 'cancelled', 'lapsed'],
  accepted: ['deposit_paid', 'withdrawn', 'cancelled', 'lapsed'],
  declined: [],
  withdrawn: [],
  deposit_paid: ['received', 'withdrawn', 'cancelled'],
  // At the studio: the potter may still turn down a price raised at check-in, which withdraws the ware.
  received: ['fired', 'withdrawn'],
  fired: ['ready', 'disputed'],
  ready: ['collected', 'disputed'],
  collected: ['disputed'],
  cancelled: [],
  lapsed: [],
  disputed: [],
}

export function nextRequestStates(state: RequestState): readonly RequestState[] {
  return NEXT[state]
}

export function canMoveRequest(from: RequestState, to: RequestState): boolean {
  return NEXT[from].includes(to)
}

/** States in which a request holds space in its firing. */
export const HOLDING_STATES: readonly RequestState[] = ['accepted', 'deposit_paid', 'received', 'fired', 'ready', 'collected', 'disputed']

export function holdsSpace(state: RequestState): boolean {
  return HOLDING_STATES.includes(state)
}

/** States a request never leaves. */
export function isFinal(state: RequestState): boolean {
  return NEXT[state].length === 0
}

/**
 * The states as people read them, in the words of contract firing: a potter asks, the studio takes the
 * ware on (or turns it down), the deposit holds the space, the ware is dropped off, fired, ready for
 * pickup and picked up. The stored values stay as they are.
 */
export const REQUEST_STATE_LABELS: Record<RequestState, string> = {
  draft: 'Draft',
  sent: 'Asked',
  accepted: 'Taken on',
  declined: 'Turned down',
  withdrawn: 'Withdrawn',
  deposit_paid: 'Space held',
  received: 'Received',
  fired: 'Fired',
  ready: 'Ready for pickup',
  collected: 'Picked up',
  cancelled: 'Called off',
  lapsed: 'Lapsed',
  disputed: 'In dispute',
}
