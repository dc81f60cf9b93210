// Damage and who pays for it. A studio's terms name what it charges when one potter's ware damages the
// kiln, its shelves or other people's ware (each an upper limit, in cents); a claim raised on that potter
// may not ask more. The claim then moves through a few steps: the potter pays or contests it, and a
// contested claim goes to the front desk, which upholds it (the potter is asked to pay) or waives it.

export const DAMAGE_CHARGE_KINDS = ['kiln-cleaning', 'shelf-ground', 'shelf-replaced', 'other-ware'] as const
export type DamageChargeKind = (typeof DAMAGE_CHARGE_KINDS)[number]

/** The most a studio charges for each kind of damage, in cents of its currency. */
export type DamageCharges = Record<DamageChargeKind, number>

export const DAMAGE_CHARGE_LABELS: Record<DamageChargeKind, string> = {
  'kiln-cleaning': 'Kiln cleaning after a blowout',
  'shelf-ground': 'Shelf ground clean',
  'shelf-replaced': 'Shelf replaced',
  'other-ware': 'Other people’s ware',
}

/**
 * Charges a studio that has not set its own asks at most: a few hours of cleaning and elements
 * checked, an hour at the grinder, a new 16 in (40 cm) cordierite shelf, and a cap on other ware
 * (rough figures, from memory of common practice).
 */
export const DEFAULT_DAMAGE_CHARGES: DamageCharges = {
  'kiln-cleaning': 6000,
  'shelf-ground': 2500,
  'shelf-replaced': 9000,
  'other-ware': 15000,
}

/** The studio's charges as its terms say, or the defaults where the terms name none. */
export function damageChargesOf(policies: { damageCharges?: Partial<DamageCharges> }): DamageCharges {
  return { ...DEFAULT_DAMAGE_CHARGES, ...(policies.damageCharges ?? {}) }
}

/** Why an amount cannot be claimed under the terms, or null when it can. */
export function claimAmountProblem(charges: DamageCharges, kind: DamageChargeKind, amountCents: number): string | null {
  if (!Number.isInteger(amountCents) || amountCents <= 0) return 'Enter an amount above zero.'
  const cap = charges[kind]
  if (cap <= 0) return 'Your terms do not name a charge for this.'
  if (amountCents > cap) return `Your terms allow at most ${(cap / 100).toFixed(2)} for this.`
  return null
}

export const CLAIM_STATUSES = ['raised', 'contested', 'upheld', 'paid', 'waived'] as const
export type ClaimStatus = (typeof CLAIM_STATUSES)[number]

export const CLAIM_STATUS_LABELS: Record<ClaimStatus, string> = {
  raised: 'Waiting for the potter',
  contested: 'Contested: with the front desk',
  upheld: 'Upheld by the front desk: to pay',
  paid: 'Paid',
  waived: 'Waived by the front desk',
}

export type ClaimAction = 'pay' | 'contest' | 'uphold' | 'waive'

/** What each side may do with a claim in each status. */
const CLAIM_TABLE: Record<ClaimStatus, Record<'potter' | 'studio' | 'admin', readonly ClaimAction[]>> = {
  raised: { potter: ['pay', 'contest'], studio: [], admin: [] },
  contested: { potter: [], studio: [], admin: ['uphold', 'waive'] },
  upheld: { potter: ['pay'], studio: [], admin: [] },
  paid: { potter: [], studio: [], admin: [] },
  waived: { potter: [], studio: [], admin: [] },
}

export function claimActions(status: ClaimStatus, side: 'potter' | 'studio' | 'admin'): ClaimAction[] {
  return [...CLAIM_TABLE[status][side]]
}

/** Claims still open: money may yet be asked for. */
export const claimOpen = (status: ClaimStatus) => status === 'raised' || status === 'contested' || status === 'upheld'
