import { describe, expect, it } from 'vitest'
import { canMoveRequest, holdsSpace, nextRequestStates, REQUEST_STATES, type RequestState } from '../../shared/workflow/request-states'
import { canMoveFiring, FIRING_STATUSES, type FiringStatus } from '../../shared/workflow/firing-status'

// The request lifecycle as the product design states it: draft → sent → accepted | declined |
// withdrawn → deposit paid → received → fired → ready → collected, with cancelled reachable until
// received and disputed after fired. Withdrawal stays open to the potter until drop-off, and after it
// only to turn down a price the measured ware raised. A request still waiting for an answer or for
// its deposit lapses when its firing stops taking ware or its time runs out.
const ALLOWED: [RequestState, RequestState][] = [
  ['draft', 'sent'],
  ['draft', 'cancelled'],
  ['sent', 'accepted'],
  ['sent', 'declined'],
  ['sent', 'withdrawn'],
  ['sent', 'cancelled'],
  ['sent', 'lapsed'],
  ['accepted', 'deposit_paid'],
  ['accepted', 'withdrawn'],
  ['accepted', 'cancelled'],
  ['accepted', 'lapsed'],
  ['deposit_paid', 'received'],
  ['deposit_paid', 'withdrawn'],
  ['deposit_paid', 'cancelled'],
  ['received', 'fired'],
  ['received', 'withdrawn'],
  ['fired', 'ready'],
  ['fired', 'disputed'],
  ['ready', 'collected'],
  ['ready', 'disputed'],
  ['collected', 'disputed'],
]

describe('the request state machine', () => {
  const pairs = REQUEST_STATES.flatMap((from) => REQUEST_STATES.map((to) => [from, to] as [RequestState, RequestState]))

  it.each(pairs)('%s → %s is allowed exactly when the lifecycle says so', (from, to) => {
    const expected = ALLOWED.some(([a, b]) => a === from && b === to)
    expect(canMoveRequest(from, to)).toBe(expected)
    expect(nextRequestStates(from).includes(to)).toBe(expected)
  })

  it('lets nothing be cancelled once the ware is received', () => {
    for (const state of ['received', 'fired', 'ready', 'collected', 'disputed'] as RequestState[])
      expect(canMoveRequest(state, 'cancelled')).toBe(false)
  })

  it('ends declined, withdrawn, cancelled, lapsed and disputed requests for good', () => {
    for (const state of ['declined', 'withdrawn', 'cancelled', 'lapsed', 'disputed'] as RequestState[])
      expect(nextRequestStates(state)).toEqual([])
  })

  it('holds space from acceptance on, and not before or after an ending that frees it', () => {
    expect(REQUEST_STATES.filter(holdsSpace)).toEqual(['accepted', 'deposit_paid', 'received', 'fired', 'ready', 'collected', 'disputed'])
  })
})

describe('the firing status machine', () => {
  // Taking ware (open), full or closed to new requests in any order; then only forward through the
  // kiln: loading → firing → cooling → unloaded. Cancelling is possible only before loading.
  const ALLOWED_FIRING: [FiringStatus, FiringStatus][] = [
    ['open', 'full'],
    ['open', 'closed'],
    ['open', 'loading'],
    ['open', 'cancelled'],
    ['full', 'open'],
    ['full', 'closed'],
    ['full', 'loading'],
    ['full', 'cancelled'],
    ['closed', 'open'],
    ['closed', 'full'],
    ['closed', 'loading'],
    ['closed', 'cancelled'],
    ['loading', 'firing'],
    ['firing', 'cooling'],
    ['cooling', 'unloaded'],
  ]
  const pairs = FIRING_STATUSES.flatMap((from) => FIRING_STATUSES.map((to) => [from, to] as [FiringStatus, FiringStatus]))

  it.each(pairs)('%s → %s', (from, to) => {
    expect(canMoveFiring(from, to)).toBe(ALLOWED_FIRING.some(([a, b]) => a === from && b === to))
  })
})
