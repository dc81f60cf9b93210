// What people read and type against what the server keeps. Conversion factors: NIST SP 811 (2008),
// Appendix B: 1 in = 25.4 mm exactly; t/°F = 1.8·t/°C + 32; 1 ft³ = 1728 in³ = 28.316 846 592 L.
import { describe, expect, it } from 'vitest'
import {
  CUBIC_FEET,
  FAHRENHEIT,
  FAHRENHEIT_PER_HOUR,
  formatDuration,
  formatLength,
  INCHES,
  moneyMeasure,
  parseShown,
  shownText,
} from '../../../src/lib/units'

describe('the client’s units', () => {
  it('turns typed inches into millimetres and back, 25.4 mm to the inch (NIST SP 811)', () => {
    expect(INCHES.fromShown(4)).toBeCloseTo(101.6, 10)
    expect(shownText(101.6, INCHES)).toBe('4')
    expect(shownText(88.9, INCHES)).toBe('3.5')
    expect(formatLength(254, 'imperial')).toMatch(/^10(\.0+)? in$/)
    expect(formatLength(254, 'metric')).toMatch(/^254 mm$/)
  })

  it('shows °F from °C and rates by 9/5 without the offset (NIST SP 811)', () => {
    expect(FAHRENHEIT.toShown(1222)).toBeCloseTo(2231.6, 6) // cone 6 at 60 °C/h on the self-supporting chart: 1222 °C
    expect(FAHRENHEIT.fromShown(212)).toBeCloseTo(100, 10)
    expect(FAHRENHEIT_PER_HOUR.toShown(100)).toBeCloseTo(180, 10)
  })

  it('shows kiln space in cubic feet, 28.316846592 L to the cubic foot (NIST SP 811)', () => {
    expect(CUBIC_FEET.toShown(28.316846592)).toBeCloseTo(1, 9)
    expect(CUBIC_FEET.fromShown(7)).toBeCloseTo(198.217926144, 6)
  })

  it('keeps money in cents, and fractions of a cent in rates', () => {
    expect(moneyMeasure('usd').fromShown(12.345)).toBe(1235)
    expect(moneyMeasure('USD', 4).fromShown(0.045)).toBe(4.5)
    expect(shownText(405, moneyMeasure('USD'))).toBe('4.05')
  })

  it('reads a field: empty is nothing, a comma is a decimal point, anything else is not a number', () => {
    expect(parseShown('')).toBeUndefined()
    expect(parseShown(' 3,5 ')).toBe(3.5)
    expect(parseShown('.5')).toBe(0.5)
    expect(parseShown('3 in')).toBeNaN()
  })

  it('says a duration in hours and minutes', () => {
    expect(formatDuration(90)).toMatch(/1 ?h.*30/)
  })
})
