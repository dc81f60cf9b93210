// A studio's damage charges from the terms form to the words potters read: typed as dollars and cents,
// kept as whole cents, held by the shared schema to 0–1,000,000 cents, and read back as "up to $60.00".
import { describe, expect, it } from 'vitest'
import { DEFAULT_DAMAGE_CHARGES } from '../../../shared/claims'
import { DEFAULT_POLICIES, studioPoliciesSchema } from '../../../shared/schemas/studios'
import { damageChargesInWords } from '../../../src/lib/firingWords'
import { moneyMeasure, parseShown } from '../../../src/lib/units'

const charges = (overrides: Record<string, unknown>) => ({ ...DEFAULT_DAMAGE_CHARGES, ...overrides })
const problemsOf = (damageCharges: unknown) => {
  const result = studioPoliciesSchema.safeParse({ ...DEFAULT_POLICIES, damageCharges })
  return result.success ? [] : result.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`)
}

describe('damage charges in the terms form', () => {
  it('are typed in currency units and kept in whole cents', () => {
    const typed = (text: string) => moneyMeasure('USD').fromShown(parseShown(text)!)
    expect(typed('75.50')).toBe(7550)
    expect(typed('75,5')).toBe(7550)
    expect(typed('0')).toBe(0)
    // A third decimal rounds to the nearest cent.
    expect(typed('12.345')).toBe(1235)
  })

  it('are held by the shared schema to whole cents from 0 up to 1,000,000', () => {
    expect(problemsOf(charges({}))).toEqual([])
    expect(problemsOf(undefined)).toEqual([])
    expect(problemsOf(charges({ 'kiln-cleaning': 0, 'other-ware': 1_000_000 }))).toEqual([])
    expect(problemsOf(charges({ 'kiln-cleaning': -1 }))).toEqual(['damageCharges.kiln-cleaning: At least 0.'])
    expect(problemsOf(charges({ 'shelf-ground': 12.5 }))).toEqual(['damageCharges.shelf-ground: Enter whole cents.'])
    expect(problemsOf(charges({ 'other-ware': 1_000_001 }))).toEqual(['damageCharges.other-ware: At most 10,000.'])
    expect(problemsOf(charges({ 'shelf-replaced': Number.NaN }))).toEqual(['damageCharges.shelf-replaced: Enter an amount.'])
    expect(problemsOf({ 'kiln-cleaning': 6000 })).toHaveLength(3)
  })
})

describe('damage charges in a potter’s words', () => {
  // Amounts as Intl.NumberFormat('en-US', { style: 'currency' }) writes them (ECMA-402, CLDR data).
  it('name each charge with its cap, the defaults where the studio set none', () => {
    expect(damageChargesInWords(DEFAULT_POLICIES, 'USD')).toEqual([
      'Kiln cleaning after a blowout: up to $60.00',
      'Shelf ground clean: up to $25.00',
      'Shelf replaced: up to $90.00',
      'Other people’s ware: up to $150.00',
    ])
  })

  it('say a charge of 0 is not made, and use the studio’s currency', () => {
    const words = damageChargesInWords(
      { ...DEFAULT_POLICIES, damageCharges: charges({ 'shelf-replaced': 0, 'kiln-cleaning': 7550 }) },
      'CAD',
    )
    expect(words).toContain('Kiln cleaning after a blowout: up to CA$75.50')
    expect(words).toContain('Shelf replaced: no charge')
  })
})
