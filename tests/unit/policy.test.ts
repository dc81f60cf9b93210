// The one policy table: what each side may do with a request, and why not. The cases are the
// lifecycle as the README describes it (common practice for contract firing:
// the studio decides and handles the ware, the potter pays and answers price changes).
import { describe, expect, it } from 'vitest'
import {
  allowedActions,
  canBeRated,
  owesMoney,
  refusalOf,
  REQUEST_ACTIONS,
  sideMayEver,
  type RequestFacts,
} from '../../shared/workflow/policy'
import { REQUEST_STATES } from '../../shared/workflow/request-states'

const facts = (over: Partial<RequestFacts> = {}): RequestFacts => ({
  state: 'sent',
  firingStatus: 'open',
  depositOwedCents: 0,
  balanceOwedCents: 0,
  pricePending: false,
  proposedMove: false,
  resultsPosted: false,
  ratedBy: { potter: false, studio: false },
  reviewWindowOpen: true,
  counterRefundDueCents: 0,
  ...over,
})

describe('the policy table', () => {
  it('gives admins no request action in any state: they settle at the desk', () => {
    for (const state of REQUEST_STATES) expect(allowedActions(facts({ state }), 'admin')).toEqual([])
  })

  it('never offers the same action to both sides, except the thread, rating and disputes', () => {
    const shared = new Set(['message', 'rate', 'dispute'])
    for (const action of REQUEST_ACTIONS) {
      if (shared.has(action)) continue
      expect(sideMayEver(action, 'potter') && sideMayEver(action, 'studio'), action).toBe(false)
    }
  })

  it('offers taking a request on only while its firing takes ware', () => {
    expect(allowedActions(facts({ state: 'sent', firingStatus: 'open' }), 'studio')).toContain('accept')
    for (const firingStatus of ['full', 'closed', 'loading', 'firing', 'cooling', 'unloaded', 'cancelled'] as const) {
      expect(allowedActions(facts({ state: 'sent', firingStatus }), 'studio')).not.toContain('accept')
      expect(refusalOf('accept', facts({ state: 'sent', firingStatus }), 'studio')).toMatchObject({ status: 409, code: 'firing-not-open' })
    }
  })

  it('answers the wrong side with 403 and the wrong moment with 409', () => {
    expect(refusalOf('accept', facts(), 'potter')).toMatchObject({ status: 403, code: 'not-the-studio' })
    expect(refusalOf('withdraw', facts(), 'studio')).toMatchObject({ status: 403, code: 'not-the-potter' })
    expect(refusalOf('accept', facts(), 'admin')).toMatchObject({ status: 403 })
    expect(refusalOf('withdraw', facts({ state: 'fired' }), 'potter')).toMatchObject({ status: 409, code: 'bad-state-change' })
    expect(refusalOf('check-in', facts({ state: 'accepted', depositOwedCents: 100 }), 'studio')).toMatchObject({ code: 'deposit-unpaid' })
    expect(refusalOf('ready', facts({ state: 'fired' }), 'studio')).toMatchObject({ code: 'results-missing' })
    expect(refusalOf('collected', facts({ state: 'ready', balanceOwedCents: 1250 }), 'studio')).toMatchObject({
      code: 'balance-owed',
      message: expect.stringMatching(/^12\.50 is still owed/),
    })
  })

  it('follows the money: pay and take at the counter only what is owed, collect only when nothing is', () => {
    expect(allowedActions(facts({ state: 'accepted', depositOwedCents: 300 }), 'potter')).toContain('pay-deposit')
    expect(allowedActions(facts({ state: 'accepted', depositOwedCents: 0 }), 'potter')).not.toContain('pay-deposit')
    expect(allowedActions(facts({ state: 'ready', balanceOwedCents: 500 }), 'studio')).toEqual(expect.arrayContaining(['counter-payment']))
    expect(allowedActions(facts({ state: 'ready', balanceOwedCents: 500 }), 'studio')).not.toContain('collected')
    expect(allowedActions(facts({ state: 'ready', balanceOwedCents: 0 }), 'studio')).toContain('collected')
    expect(owesMoney(facts({ state: 'ready', balanceOwedCents: 1 }))).toBe(true)
    expect(owesMoney(facts({ state: 'received', balanceOwedCents: 1 }))).toBe(false)
  })

  it('lets the potter answer a raised price only while one waits', () => {
    expect(allowedActions(facts({ state: 'received', pricePending: true }), 'potter')).toEqual(
      expect.arrayContaining(['confirm-price', 'decline-price']),
    )
    expect(allowedActions(facts({ state: 'received' }), 'potter')).not.toContain('decline-price')
  })

  it('asks each side for its answers once, after pickup, while the window is open', () => {
    expect(canBeRated(facts({ state: 'collected' }), 'potter')).toBe(true)
    expect(canBeRated(facts({ state: 'collected', ratedBy: { potter: true, studio: false } }), 'potter')).toBe(false)
    expect(canBeRated(facts({ state: 'collected', ratedBy: { potter: true, studio: false } }), 'studio')).toBe(true)
    expect(canBeRated(facts({ state: 'ready' }), 'potter')).toBe(false)
    expect(canBeRated(facts({ state: 'collected', reviewWindowOpen: false }), 'studio')).toBe(false)
    expect(refusalOf('rate', facts({ state: 'collected', ratedBy: { potter: true, studio: false } }), 'potter')).toMatchObject({
      status: 409,
      code: 'already-answered',
    })
    expect(refusalOf('rate', facts({ state: 'collected', reviewWindowOpen: false }), 'potter')).toMatchObject({
      status: 409,
      code: 'review-window-closed',
    })
    expect(refusalOf('rate', facts({ state: 'ready' }), 'potter')).toMatchObject({ status: 409, code: 'bad-state-change' })
  })

  it('has no public reply: neither side answers the other', () => {
    expect(REQUEST_ACTIONS as readonly string[]).not.toContain('reply')
    for (const state of REQUEST_STATES)
      for (const side of ['potter', 'studio'] as const)
        expect(allowedActions(facts({ state, ratedBy: { potter: true, studio: true } }), side)).not.toContain('rate')
  })

  it('refuses in the words people read, not the stored state names', () => {
    expect(refusalOf('withdraw', facts({ state: 'fired' }), 'potter')?.message).toBe(
      'You cannot withdraw the ask while this stands at “Fired”.',
    )
    expect(refusalOf('accept', facts(), 'potter')?.message).toBe('Only the studio can take this ware on.')
    for (const state of REQUEST_STATES)
      expect(refusalOf('send', facts({ state }), 'potter')?.message ?? '').not.toMatch(/deposit_paid|host/)
  })

  it('keeps a request that ended open only for the thread, and for handing back counter money', () => {
    for (const state of ['declined', 'withdrawn', 'cancelled', 'lapsed'] as const) {
      expect(allowedActions(facts({ state }), 'studio')).toEqual(['message'])
      expect(allowedActions(facts({ state, counterRefundDueCents: 100 }), 'studio')).toEqual(['message', 'hand-back'])
      expect(allowedActions(facts({ state, counterRefundDueCents: 100 }), 'potter')).toEqual(['message'])
    }
  })

  it('lets the studio hand back counter money owed after pickup (a credit for hurt ware)', () => {
    for (const state of ['collected'] as const) {
      expect(allowedActions(facts({ state }), 'studio')).not.toContain('hand-back')
      expect(allowedActions(facts({ state, counterRefundDueCents: 100 }), 'studio')).toContain('hand-back')
      expect(allowedActions(facts({ state, counterRefundDueCents: 100 }), 'potter')).not.toContain('hand-back')
    }
  })
})
