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
  'disputed',
] as const
export type RequestState = (typeof REQUEST_STATES)[number]

const NEXT: Record<RequestState, readonly RequestState[]> = {
  draft: ['sent', 'cancelled'],
  sent: ['accepted', 'declined', 'withdrawn', 'cancelled'],
  accepted: ['deposit_paid', 'withdrawn', 'cancelled'],
  declined: [],
  withdrawn: [],
  deposit_paid: ['received', 'withdrawn', 'cancelled'],
  received: ['fired'],
  fired: ['ready', 'disputed'],
  ready: ['collected', 'disputed'],
  collected: ['disputed'],
  cancelled: [],
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

export const REQUEST_STATE_LABELS: Record<RequestState, string> = {
  draft: 'Draft',
  sent: 'Sent',
  accepted: 'Accepted',
  declined: 'Declined',
  withdrawn: 'Withdrawn',
  deposit_paid: 'Deposit paid',
  received: 'Received',
  fired: 'Fired',
  ready: 'Ready',
  collected: 'Collected',
  cancelled: 'Cancelled',
  disputed: 'Disputed',
}
