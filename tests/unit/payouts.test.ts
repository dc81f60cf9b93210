// The payout arithmetic: the marketplace's fee, the ledger's balance over any list of movements,
// when a studio's share is earned, and a payout account's state in plain words.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  dueInWords,
  feeRuleOf,
  ledgerProblems,
  LEDGER_BUCKETS,
  marketplaceFee,
  MONEY_KINDS,
  payoutAccountState,
  payoutAccountWords,
  payoutStage,
  sumLedgers,
  tally,
  type Movement,
} from '../../shared/payouts'

const tenPercentDollarMinimum = feeRuleOf(10, 100)

describe('the marketplace fee', () => {
  it.each([
    // 10 % of $52.00 is $5.20 (arithmetic).
    [5_200, 520],
    // 10 % of $7.00 is $0.70, under the $1.00 minimum.
    [700, 100],
    // Less kept than the minimum: the fee takes all of it, never more.
    [60, 60],
    // 10 % of $12.35 is $1.235: half up to the cent is $1.24 (rounding half up, common practice in invoicing).
    [1_235, 124],
    [1_234, 123],
    [0, 0],
    [-500, 0],
  ])('on %i cents kept is %i cents', (kept, fee) => {
    expect(marketplaceFee(kept, tenPercentDollarMinimum)).toBe(fee)
  })

  it('reads a fractional percentage in basis points: 8.5 % of $100.00 is $8.50', () => {
    expect(feeRuleOf(8.5, 0)).toEqual({ percentBp: 850, minimumCents: 0 })
    expect(marketplaceFee(10_000, feeRuleOf(8.5, 0))).toBe(850)
  })

  it('never exceeds what was kept and is never below the minimum when there is enough', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 10_000_000 }),
        fc.integer({ min: 0, max: 3_000 }),
        fc.integer({ min: 0, max: 5_000 }),
        (kept, bp, minimum) => {
          const fee = marketplaceFee(kept, { percentBp: bp, minimumCents: minimum })
          expect(fee).toBeLessThanOrEqual(kept)
          expect(fee).toBeGreaterThanOrEqual(Math.min(kept, minimum))
          expect(Number.isInteger(fee)).toBe(true)
        },
      ),
    )
  })
})

describe('the ledger of a request', () => {
  const at = (kind: Movement['kind'], amountCents: number): Movement => ({ kind, amountCents })

  it('sends the studio what was paid online less the fee once earned, and nothing before', () => {
    const paid = [at('deposit', 1_300), at('balance', 3_900)]
    expect(tally(paid, tenPercentDollarMinimum, false)).toMatchObject({ feeCents: 0, heldCents: 5_200, dueCents: 0 })
    expect(tally(paid, tenPercentDollarMinimum, true)).toMatchObject({
      feeCents: 520,
      heldCents: 4_680,
      targetCents: 4_680,
      dueCents: 4_680,
    })
    const sent = [...paid, at('transfer', 4_680)]
    expect(tally(sent, tenPercentDollarMinimum, true)).toMatchObject({ heldCents: 0, dueCents: 0, transferredCents: 4_680 })
  })

  it('takes no fee on money paid at the counter, which the studio already has', () => {
    const ledger = tally([at('counter', 1_300), at('balance', 3_900)], tenPercentDollarMinimum, true)
    expect(ledger).toMatchObject({ atCounterCents: 1_300, feeCents: 390, targetCents: 3_510 })
  })

  it('reverses the studio’s part of a refund after the transfer, the fee shrinking with what was kept', () => {
    const before = [at('deposit', 2_000), at('balance', 8_000), at('transfer', 9_000)]
    const after = tally([...before, at('refund', 5_000)], tenPercentDollarMinimum, true)
    // $50.00 kept: the fee is $5.00 and the studio's share $45.00, so $45.00 of the $90.00 comes back.
    expect(after).toMatchObject({ feeCents: 500, targetCents: 4_500, dueCents: -4_500, heldCents: -4_500 })
    expect(ledgerProblems(after)).toEqual(['heldCents is negative (-4500)'])
    expect(ledgerProblems(tally([...before, at('refund', 5_000), at('transfer-reversal', 4_500)], tenPercentDollarMinimum, true))).toEqual(
      [],
    )
  })

  it('holds a disputed share: nothing more is sent, but a refund still takes back the studio’s part', () => {
    expect(tally([at('deposit', 2_000), at('balance', 8_000)], tenPercentDollarMinimum, false).dueCents).toBe(0)
    const sent = [at('deposit', 2_000), at('balance', 8_000), at('transfer', 9_000)]
    expect(tally(sent, tenPercentDollarMinimum, false).dueCents).toBe(0)
    expect(tally([...sent, at('refund', 10_000)], tenPercentDollarMinimum, false).dueCents).toBe(-9_000)
  })

  it('accounts for every cent paid in, whatever the movements, and adds up across requests', () => {
    const kinds = Object.keys(MONEY_KINDS) as Movement['kind'][]
    const movements = fc.array(fc.record({ kind: fc.constantFrom(...kinds), amountCents: fc.integer({ min: 1, max: 200_000 }) }), {
      maxLength: 12,
    })
    fc.assert(
      fc.property(fc.array(movements, { minLength: 1, maxLength: 5 }), fc.boolean(), (requests, earned) => {
        const ledgers = requests.map((list) => tally(list, tenPercentDollarMinimum, earned))
        for (const ledger of ledgers) {
          const accounted = LEDGER_BUCKETS.reduce((n, bucket) => n + ledger[bucket], 0)
          expect(accounted).toBe(ledger.paidInCents)
        }
        const total = sumLedgers(ledgers)
        expect(LEDGER_BUCKETS.reduce((n, bucket) => n + total[bucket], 0)).toBe(total.paidInCents)
      }),
    )
  })

  it('after acting on what is due, nothing is left to send and nothing held is negative', () => {
    const flow = fc.record({
      deposit: fc.integer({ min: 0, max: 50_000 }),
      balance: fc.integer({ min: 0, max: 50_000 }),
      counter: fc.integer({ min: 0, max: 50_000 }),
      refundShare: fc.double({ min: 0, max: 1, noNaN: true }),
      earned: fc.boolean(),
    })
    fc.assert(
      fc.property(flow, ({ deposit, balance, counter, refundShare, earned }) => {
        const moves: Movement[] = [
          { kind: 'deposit', amountCents: deposit },
          { kind: 'balance', amountCents: balance },
          { kind: 'counter', amountCents: counter },
        ]
        const first = tally(moves, tenPercentDollarMinimum, earned)
        if (first.dueCents > 0) moves.push({ kind: 'transfer', amountCents: first.dueCents })
        moves.push({ kind: 'refund', amountCents: Math.floor((deposit + balance) * refundShare) })
        const second = tally(moves, tenPercentDollarMinimum, earned)
        if (second.dueCents < 0) moves.push({ kind: 'transfer-reversal', amountCents: -second.dueCents })
        const settled = tally(moves, tenPercentDollarMinimum, earned)
        expect(settled.dueCents).toBe(0)
        expect(ledgerProblems(settled)).toEqual([])
        if (earned) expect(settled.heldCents).toBe(0)
      }),
    )
  })
})

describe('when the studio’s share is earned', () => {
  const now = new Date('2026-05-04T12:00:00Z')
  it.each([
    ['received', null, false, 'in-hand'],
    ['ready', null, false, 'in-hand'],
    ['collected', null, false, 'earned'],
    ['collected', '2026-05-05T12:00:00Z', false, 'hold'],
    ['collected', '2026-05-03T12:00:00Z', false, 'earned'],
    ['withdrawn', null, false, 'earned'],
    ['lapsed', null, false, 'earned'],
    ['disputed', null, false, 'dispute'],
    ['disputed', null, true, 'earned'],
  ] as const)('a request %s (release %s, dispute settled %s) is %s', (state, releaseAt, disputeSettled, stage) => {
    expect(payoutStage(state, { releaseAt: releaseAt ? new Date(releaseAt) : null, disputeSettled }, now)).toBe(stage)
  })
})

describe('a payout account in plain words', () => {
  const base = {
    detailsSubmitted: true,
    transfers: 'active',
    payoutsEnabled: true,
    currentlyDue: [],
    pendingVerification: [],
    disabledReason: null,
    bankLast4: '6789',
  }

  it('says what state it is in', () => {
    expect(payoutAccountState(null)).toBe('none')
    expect(payoutAccountState(base)).toBe('ready')
    expect(payoutAccountState({ ...base, detailsSubmitted: false, transfers: 'inactive', currentlyDue: ['external_account'] })).toBe(
      'incomplete',
    )
    expect(payoutAccountState({ ...base, transfers: 'inactive', currentlyDue: ['individual.verification.document'] })).toBe('needs-info')
    expect(payoutAccountState({ ...base, transfers: 'pending', pendingVerification: ['individual.dob.day'] })).toBe('checking')
    expect(payoutAccountState({ ...base, transfers: 'inactive', disabledReason: 'rejected.listed' })).toBe('rejected')
  })

  it('names what Stripe still needs, each thing once', () => {
    expect(dueInWords(['individual.dob.day', 'individual.dob.month', 'external_account', 'individual.verification.document'])).toEqual([
      'your date of birth',
      'a bank account for payouts',
      'a photo of an identity document',
    ])
    expect(
      payoutAccountWords('needs-info', { ...base, transfers: 'inactive', currentlyDue: ['individual.verification.document'] }).detail,
    ).toContain('a photo of an identity document')
    expect(payoutAccountWords('ready', base).detail).toContain('ending 6789')
  })

  it('never calls the studio anything but a studio', () => {
    for (const state of ['none', 'incomplete', 'needs-info', 'checking', 'rejected', 'ready'] as const) {
      const words = payoutAccountWords(state, base)
      expect(`${words.title} ${words.detail}`).not.toMatch(/\bhost/i)
    }
  })
})
