// What people read and type against what the server keeps. Conversion factors: NIST SP 811 (2008),
// Appendix B: 1 in = 25.4 mm exactly; t/°F = 1.8·t/°C + 32; 1 ft³ = 1728 in³ = 28.316 846 592 L.
import { describe, expect, it } from 'vitest'
import { zoneName } from '../../../shared/dates'
import { mmToTypedLength, typedLengthToMm } from '../../../src/features/search/units'
import {
  CELSIUS,
  CUBIC_FEET,
  FAHRENHEIT,
  FAHRENHEIT_PER_HOUR,
  formatDuration,
  formatLength,
  formatVolume,
  inchesText,
  INCHES,
  localiseMessage,
  MILLIMETRES,
  moneyMeasure,
  parseShown,
  shownText,
} from '../../../src/lib/units'

describe('the client’s units', () => {
  it('turns typed inches into millimetres and back, 25.4 mm to the inch (NIST SP 811)', () => {
    expect(INCHES.fromShown(4)).toBeCloseTo(101.6, 10)
    expect(shownText(101.6, INCHES)).toBe('4')
    expect(shownText(88.9, INCHES)).toBe('3 1/2')
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

  it('reads inches as a potter writes them: 3/8, 1 1/2, 1-1/2 and the ½-style glyphs', () => {
    const inches = (text: string) => parseShown(text, INCHES)
    expect(inches('3/8')).toBe(0.375)
    expect(inches('1 1/2')).toBe(1.5)
    expect(inches('1-1/2')).toBe(1.5)
    expect(inches(' 2  3/4 ')).toBe(2.75)
    expect(inches('1½')).toBe(1.5)
    expect(inches('1 ½')).toBe(1.5)
    expect(inches('⅜')).toBe(0.375)
    expect(inches('5/16')).toBe(0.3125)
    expect(inches('1.25')).toBe(1.25)
    expect(inches('-1/2')).toBe(-0.5)
    // A wall of 3/8 in is 9.525 mm: 0.375 × 25.4 mm (NIST SP 811, 1 in = 25.4 mm exactly).
    expect(INCHES.fromShown(inches('3/8')!)).toBeCloseTo(9.525, 10)
    // Not a ruler's reading: the schema says what is wrong.
    for (const text of ['3/0', '1/2/3', '3//8', '1 1 /', 'three eighths', '1 ½ ½']) expect(inches(text)).toBeNaN()
    // Only length fields take fractions: a temperature, a count or a price stays a plain number.
    expect(parseShown('3/8')).toBeNaN()
    expect(parseShown('1/2', CELSIUS)).toBeNaN()
  })

  it('shows inches to the nearest 1/16, as a ruler is marked', () => {
    expect(inchesText(0.375)).toBe('3/8')
    expect(inchesText(1.5)).toBe('1 1/2')
    expect(inchesText(4)).toBe('4')
    expect(inchesText(2.03)).toBe('2') // 2.03 in is nearer 2 than 2 1/16 (2.0625)
    expect(inchesText(0.97)).toBe('1') // rounds up into the next whole inch
    expect(inchesText(0.0625)).toBe('1/16')
    expect(inchesText(0.01)).toBe('0')
    // 9.525 mm is 3/8 in; 6 mm is 0.236 in, nearest 1/4 (4/16) (NIST SP 811: 1 in = 25.4 mm).
    expect(shownText(9.525, INCHES)).toBe('3/8')
    expect(shownText(6, INCHES)).toBe('1/4')
    expect(formatLength(38.1, 'imperial')).toBe('1 1/2 in')
    expect(formatLength(9.525, 'metric')).toBe('10 mm')
    // Millimetre fields keep their decimals: 9.5 mm stays 9.5.
    expect(shownText(9.5, MILLIMETRES)).toBe('9.5')
  })

  it('types a searched length as millimetres for the query, fractions included, and reads it back to the sixteenth', () => {
    expect(typedLengthToMm('3/8', 'imperial')).toBe('9.5') // 9.525 mm to a tenth (NIST SP 811)
    expect(typedLengthToMm('1 1/2', 'imperial')).toBe('38.1')
    expect(typedLengthToMm('24', 'imperial')).toBe('609.6')
    expect(typedLengthToMm('12', 'metric')).toBe('12')
    expect(typedLengthToMm('3/8', 'metric')).toBe('3/8') // passed on for the schema to refuse
    expect(typedLengthToMm('', 'imperial')).toBeUndefined()
    expect(mmToTypedLength('38.1', 'imperial')).toBe('1 1/2')
    expect(mmToTypedLength('609.6', 'imperial')).toBe('24')
  })

  it('says the schemas’ millimetre limits in inches on an imperial form, to the sixteenth', () => {
    expect(localiseMessage('The wall thickness can be at most 50 mm.', 'imperial')).toBe('The wall thickness can be at most 1 15/16 in.')
    expect(localiseMessage('Enter the wall thickness in millimetres.', 'imperial')).toBe(
      'Enter the wall thickness in inches, like 4.5 or 3/8.',
    )
    expect(localiseMessage('The wall thickness can be at most 50 mm.', 'metric')).toBe('The wall thickness can be at most 50 mm.')
  })

  it('writes every volume in one unit per system: litres, or cubic feet (28.316846592 L, NIST SP 811)', () => {
    expect(formatVolume(28.316846592 * 3, 'imperial')).toBe('3 cu ft')
    expect(formatVolume(28.316846592 * 42, 'imperial')).toBe('42 cu ft')
    expect(formatVolume(28.316846592 * 6.8, 'imperial')).toBe('6.8 cu ft')
    // One mug's box, 100 × 90 × 115 mm = 1.035 L = 0.0366 cu ft.
    expect(formatVolume(1.035, 'imperial')).toBe('0.04 cu ft')
    expect(formatVolume(84.95, 'metric')).toBe('85 L')
    expect(formatVolume(1.035, 'metric')).toBe('1 L')
    expect(formatVolume(84.95, 'imperial')).not.toMatch(/L/)
  })

  it('names a time zone as people say it, never by its database id', () => {
    // Unicode CLDR's generic names, as Node's full ICU and Chromium carry them.
    expect(zoneName('America/Los_Angeles')).toBe('Pacific Time')
    expect(zoneName('America/New_York')).toBe('Eastern Time')
    expect(zoneName('America/Los_Angeles')).not.toMatch(/[/_]/)
    // An unknown id falls back to its city, in words.
    expect(zoneName('Nowhere/Far_Away')).toBe('Far Away time')
  })

  it('says a duration in hours and minutes', () => {
    expect(formatDuration(90)).toMatch(/1 ?h.*30/)
  })
})
