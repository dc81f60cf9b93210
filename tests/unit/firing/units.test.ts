import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  cToF,
  cubicInchesToLitres,
  fToC,
  gToLb,
  inToMm,
  lbToG,
  litresToCubicInches,
  mmToIn,
  rateCToF,
  rateFToC,
} from '../../../shared/firing/units'

// Source for every check value here: NIST Special Publication 811 (Guide for the Use of the SI),
// which defines 1 in = 2.54 cm exactly, 1 lb (avoirdupois) = 0.45359237 kg exactly and
// t/°F = 1.8 · t/°C + 32; a temperature interval of 1 °F is exactly 5/9 K.

describe('temperatures (NIST SP 811: t/°F = 1.8·t/°C + 32)', () => {
  it('maps the fixed points of the definition', () => {
    expect(cToF(0)).toBe(32)
    expect(cToF(100)).toBe(212)
    // −40 is the same on both scales: 1.8·(−40) + 32 = −40.
    expect(cToF(-40)).toBe(-40)
    expect(fToC(212)).toBe(100)
    expect(fToC(32)).toBe(0)
  })

  it('reads the handling temperature: 50 °C is 122 °F', () => {
    expect(cToF(50)).toBe(122)
  })

  it('round-trips', () => {
    fc.assert(
      fc.property(fc.double({ min: -300, max: 3000, noNaN: true }), (celsius) => {
        expect(fToC(cToF(celsius))).toBeCloseTo(celsius, 9)
      }),
    )
  })
})

describe('rates (an interval converts by 9/5 alone)', () => {
  it('turns the cone chart’s 15 / 60 / 150 °C/h into 27 / 108 / 270 °F/h', () => {
    expect(rateCToF(15)).toBe(27)
    expect(rateCToF(60)).toBe(108)
    expect(rateCToF(150)).toBe(270)
    expect(rateFToC(108)).toBe(60)
  })

  it('has no 32° offset', () => {
    expect(rateCToF(0)).toBe(0)
    fc.assert(
      fc.property(fc.double({ min: 0, max: 2000, noNaN: true }), fc.double({ min: 0, max: 2000, noNaN: true }), (a, b) => {
        // A rate is a difference of two temperatures, so it converts like one.
        expect(rateCToF(a - b)).toBeCloseTo(cToF(a) - cToF(b), 9)
      }),
    )
  })
})

describe('lengths and volumes (NIST SP 811: 1 in = 25.4 mm exactly)', () => {
  it('converts inches and millimetres exactly', () => {
    expect(inToMm(1)).toBe(25.4)
    expect(mmToIn(25.4)).toBe(1)
    expect(inToMm(12)).toBeCloseTo(304.8, 12)
  })

  it('converts cubic inches and litres: 1 in³ = 16.387064 cm³ exactly', () => {
    expect(cubicInchesToLitres(1)).toBeCloseTo(0.016387064, 15)
    // 1 ft³ = 1728 in³ = 28.316846592 L exactly.
    expect(cubicInchesToLitres(1728)).toBeCloseTo(28.316846592, 9)
    // 1 L = 1000 cm³ / 16.387064 cm³ = 61.023744… in³.
    expect(litresToCubicInches(1)).toBeCloseTo(61.023744, 6)
  })

  it('round-trips', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e6, noNaN: true }), (value) => {
        expect(inToMm(mmToIn(value))).toBeCloseTo(value, 6)
        expect(cubicInchesToLitres(litresToCubicInches(value))).toBeCloseTo(value, 6)
      }),
    )
  })
})

describe('masses (NIST SP 811: 1 lb = 453.59237 g exactly)', () => {
  it('converts pounds and grams exactly', () => {
    expect(lbToG(1)).toBe(453.59237)
    expect(gToLb(453.59237)).toBe(1)
    // 1 oz = 1/16 lb = 28.349523125 g.
    expect(lbToG(1 / 16)).toBeCloseTo(28.349523125, 12)
  })

  it('round-trips', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e7, noNaN: true }), (grams) => {
        expect(lbToG(gToLb(grams))).toBeCloseTo(grams, 6)
      }),
    )
  })
})
