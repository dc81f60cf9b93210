// The rules of a credit for ware hurt in an incident (shared/remedies.ts): when one may be given, how
// much, and how it goes back (card or counter).
import { describe, expect, it } from 'vitest'
import { creditRefusal, creditSplit } from '../../shared/remedies'

const dollars = (cents: number) => `$${(cents / 100).toFixed(2)}`

describe('a credit', () => {
  it('waits until the ware is picked up: before, the balance would ask for it again', () => {
    for (const state of ['fired', 'ready', 'disputed'] as const)
      expect(creditRefusal({ state, creditableCents: 5000 }, 1000, dollars)).toMatchObject({ status: 409, code: 'not-picked-up' })
    expect(creditRefusal({ state: 'collected', creditableCents: 5000 }, 1000, dollars)).toBeNull()
  })

  it('is at most what was paid and not had back, and more than nothing', () => {
    const room = { state: 'collected' as const, creditableCents: 2500 }
    expect(creditRefusal(room, 2500, dollars)).toBeNull()
    expect(creditRefusal(room, 2501, dollars)).toMatchObject({ status: 400, code: 'over-paid', message: expect.stringContaining('$25.00') })
    expect(creditRefusal(room, 0, dollars)).toMatchObject({ status: 400 })
    expect(creditRefusal(room, 12.5, dollars)).toMatchObject({ status: 400 })
    expect(creditRefusal({ state: 'collected', creditableCents: 0 }, undefined, dollars)).toMatchObject({
      status: 409,
      code: 'nothing-paid',
    })
    // Asked without an amount, it says only whether the ask can take a credit.
    expect(creditRefusal(room, undefined, dollars)).toBeNull()
  })

  it('goes back to the card as far as was paid online, the rest at the counter', () => {
    expect(creditSplit(1000, 4000)).toEqual({ onlineCents: 1000, counterCents: 0 })
    expect(creditSplit(1000, 600)).toEqual({ onlineCents: 600, counterCents: 400 })
    expect(creditSplit(1000, 0)).toEqual({ onlineCents: 0, counterCents: 1000 })
    expect(creditSplit(1000, -200)).toEqual({ onlineCents: 0, counterCents: 1000 })
  })
})
