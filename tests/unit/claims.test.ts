// Damage claims as arithmetic and a small table: an amount is held to the studio's own terms, the
// steps each side may take follow the claim's status, and a paid claim enters the ledger as money
// paid online, so the fee and the studio's share follow the payout rules.
import { describe, expect, it } from 'vitest'
import { claimActions, claimAmountProblem, damageChargesOf, DEFAULT_DAMAGE_CHARGES } from '../../shared/claims'
import { feeRuleOf, ledgerProblems, tally } from '../../shared/payouts'

describe('a claim’s amount', () => {
  const terms = damageChargesOf({ damageCharges: { 'kiln-cleaning': 5000, 'shelf-replaced': 0 } })

  it('takes the studio’s own charges over the defaults', () => {
    expect(terms['kiln-cleaning']).toBe(5000)
    expect(terms['shelf-ground']).toBe(DEFAULT_DAMAGE_CHARGES['shelf-ground'])
  })

  it('is allowed up to the charge in the terms, not a cent more', () => {
    expect(claimAmountProblem(terms, 'kiln-cleaning', 5000)).toBeNull()
    expect(claimAmountProblem(terms, 'kiln-cleaning', 5001)).toMatch(/at most 50\.00/)
    expect(claimAmountProblem(terms, 'kiln-cleaning', 0)).toMatch(/above zero/)
    expect(claimAmountProblem(terms, 'kiln-cleaning', 12.5)).toMatch(/above zero/)
  })

  it('is refused for a charge the terms do not name', () => {
    expect(claimAmountProblem(terms, 'shelf-replaced', 100)).toMatch(/do not name/)
  })
})

describe('who does what with a claim', () => {
  it('lets the potter pay or contest a raised claim, and the desk alone decide a contested one', () => {
    expect(claimActions('raised', 'potter')).toEqual(['pay', 'contest'])
    expect(claimActions('raised', 'studio')).toEqual([])
    expect(claimActions('contested', 'potter')).toEqual([])
    expect(claimActions('contested', 'admin')).toEqual(['uphold', 'waive'])
    expect(claimActions('upheld', 'potter')).toEqual(['pay'])
    expect(claimActions('paid', 'potter')).toEqual([])
    expect(claimActions('waived', 'admin')).toEqual([])
  })
})

describe('a paid claim on the ledger', () => {
  it('is money paid online: the fee is taken from it and the rest is the studio’s share', () => {
    // 10 % with a 1.00 minimum: on 20.00 of firing and 45.00 of claim, the fee is 6.50 and the share 58.50.
    const ledger = tally(
      [
        { kind: 'deposit', amountCents: 2000 },
        { kind: 'claim', amountCents: 4500 },
      ],
      feeRuleOf(10, 100),
      true,
    )
    expect(ledger).toMatchObject({ paidInCents: 6500, keptOnlineCents: 6500, feeCents: 650, targetCents: 5850 })
    expect(ledgerProblems(ledger)).toEqual([])
  })
})
