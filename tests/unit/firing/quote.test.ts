import { describe, expect, it } from 'vitest'
import type { Piece } from '../../../shared/firing/check'
import { quoteRequest, roundHalfUpCents, type PriceList } from '../../../shared/firing/quote'
import { inToMm } from '../../../shared/firing/units'
import { electricKiln, glazeFiring, greenBowl, mug } from './fixtures'

// Sizes are given in inches through inToMm (1 in = 25.4 mm exactly, NIST SP 811), so the expected
// cents follow from the price list by hand arithmetic.
function box(heightIn: number, widthIn: number, depthIn: number, overrides: Partial<Piece> = {}): Piece {
  return mug({ round: false, heightMm: inToMm(heightIn), widthMm: inToMm(widthIn), depthMm: inToMm(depthIn), ...overrides })
}

function volumePrices(overrides: Partial<PriceList> = {}): PriceList {
  return { currency: 'USD', model: 'volume', centsPerCubicInch: 3, deposit: { percent: 50 }, ...overrides }
}

describe('roundHalfUpCents', () => {
  it('rounds halves up, not to even', () => {
    expect(roundHalfUpCents(0.5)).toBe(1)
    expect(roundHalfUpCents(1.5)).toBe(2)
    expect(roundHalfUpCents(2.5)).toBe(3)
    expect(roundHalfUpCents(2.4999)).toBe(2)
  })

  it('is not pulled down by float noise: 1.005 × 100 is stored as 100.49999…', () => {
    expect(1.005 * 100).toBeLessThan(100.5)
    expect(roundHalfUpCents(1.005 * 100)).toBe(101)
  })
})

describe('volume pricing', () => {
  it('prices each line by its bounding box times its quantity', () => {
    // 4 × 4 × 4 in = 64 in³ at 3 ¢ = 192 ¢ a piece; three of them 576 ¢.
    const quote = quoteRequest(volumePrices(), glazeFiring(), [box(4, 4, 4, { label: 'Cup', quantity: 3 })])
    expect(quote.lines).toEqual([{ label: 'Cup × 3', amountCents: 576 }])
    expect(quote.totalCents).toBe(576)
    expect(quote.depositCents).toBe(288)
    expect(quote.currency).toBe('USD')
  })

  it('takes a round piece’s bounding box as diameter × diameter × height', () => {
    // 5 in across, 4 in tall: 100 in³ at 3 ¢ = 300 ¢ (depth ignored for a round piece).
    const quote = quoteRequest(volumePrices(), glazeFiring(), [mug({ round: true, heightMm: inToMm(4), widthMm: inToMm(5), depthMm: 1 })])
    expect(quote.totalCents).toBe(300)
  })

  it('prices per litre', () => {
    // 10 × 10 × 20 cm = 2 L at 45 ¢ = 90 ¢.
    const piece = mug({ round: false, heightMm: 200, widthMm: 100, depthMm: 100 })
    const quote = quoteRequest(volumePrices({ centsPerCubicInch: undefined, centsPerLitre: 45 }), glazeFiring(), [piece])
    expect(quote.totalCents).toBe(90)
  })

  it('rounds half-up once per piece line, not per piece', () => {
    // 1 in³ at 2.5 ¢: one piece 2.5 → 3 ¢; a line of three 7.5 → 8 ¢ (per piece it would be 9).
    const prices = volumePrices({ centsPerCubicInch: 2.5 })
    expect(quoteRequest(prices, glazeFiring(), [box(1, 1, 1)]).totalCents).toBe(3)
    expect(quoteRequest(prices, glazeFiring(), [box(1, 1, 1, { quantity: 3 })]).totalCents).toBe(8)
    // Two lines of one each round separately: 3 + 3.
    expect(quoteRequest(prices, glazeFiring(), [box(1, 1, 1), box(1, 1, 1)]).totalCents).toBe(6)
  })

  it('applies the minimum per piece', () => {
    // 2 × 2 × 2 in = 8 in³ at 3 ¢ = 24 ¢, under a 150 ¢ minimum: four pieces cost 600 ¢.
    const prices = volumePrices({ minimumPerPieceCents: 150 })
    const quote = quoteRequest(prices, glazeFiring(), [box(2, 2, 2, { label: 'Tile', quantity: 4 }), box(10, 10, 10, { label: 'Jar' })])
    expect(quote.lines).toEqual([
      { label: 'Tile × 4 (minimum per piece)', amountCents: 600 },
      // 1000 in³ at 3 ¢ = 3000 ¢, above the minimum.
      { label: 'Jar', amountCents: 3000 },
    ])
    expect(quote.totalCents).toBe(3600)
  })
})

describe('shelf pricing', () => {
  // A 40 × 25 cm shelf area (100 000 mm²) at 4000 ¢ a shelf, sold in quarters.
  const prices: PriceList = {
    currency: 'USD',
    model: 'shelf',
    shelfCents: 4000,
    shelfStep: 0.25,
    shelfAreaMm2: 100_000,
    deposit: { percent: 25 },
  }
  const footprint = (areaMm2: number, quantity = 1) => mug({ round: false, widthMm: 100, depthMm: areaMm2 / 100, quantity })

  it('rounds the shelf share up to the step', () => {
    // 0.3 shelf → a half shelf (two quarters) = 2000 ¢.
    const quote = quoteRequest(prices, glazeFiring(), [footprint(30_000)])
    expect(quote.lines).toEqual([{ label: 'Shelf space: 0.5 shelf', amountCents: 2000 }])
    expect(quote.depositCents).toBe(500)
  })

  it('does not round an exact share up a step', () => {
    // 5 × 10 000 mm² = exactly a half shelf.
    expect(quoteRequest(prices, glazeFiring(), [footprint(10_000, 5)]).totalCents).toBe(2000)
  })

  it('sizes the shelf from the kiln when given', () => {
    // Box kiln 450 × 450 mm inside; the shelf is about 50 mm smaller each way (from memory), 400 × 400 = 160 000 mm².
    const kiln = electricKiln({ interior: { shape: 'box', widthMm: 450, depthMm: 450, heightMm: 600 } })
    // 40 000 mm² is exactly a quarter of that shelf: 1000 ¢.
    expect(quoteRequest(prices, glazeFiring(), [footprint(40_000)], kiln).totalCents).toBe(1000)
  })

  it('applies the minimum per piece to the whole share', () => {
    // Ten tiny pieces on a quarter shelf (1000 ¢) under a 200 ¢ minimum each: 2000 ¢.
    const quote = quoteRequest({ ...prices, minimumPerPieceCents: 200 }, glazeFiring(), [footprint(100, 10)])
    expect(quote.totalCents).toBe(2000)
  })

  it('needs the shelf size', () => {
    expect(() => quoteRequest({ ...prices, shelfAreaMm2: undefined }, glazeFiring(), [footprint(100)])).toThrow(/shelf size/)
  })
})

describe('whole-kiln pricing', () => {
  it('charges the kiln price', () => {
    const quote = quoteRequest({ currency: 'EUR', model: 'kiln', kilnCents: 25_000, deposit: { fixedCents: 5000 } }, glazeFiring(), [mug()])
    expect(quote).toEqual({
      currency: 'EUR',
      lines: [{ label: 'Whole kiln', amountCents: 25_000 }],
      totalCents: 25_000,
      depositCents: 5000,
    })
  })
})

describe('surcharges and deposits', () => {
  // 10 × 10 × 10 in = 1000 in³ at 1 ¢ = 1000 ¢ base.
  const base = volumePrices({ centsPerCubicInch: 1, surcharges: { reduction: 20, slowCool: 15, preheat: 12.5 }, deposit: { percent: 30 } })
  const jar = box(10, 10, 10)

  it('adds a reduction surcharge as a percent of the base', () => {
    const quote = quoteRequest(base, glazeFiring({ atmosphere: 'reduction' }), [jar])
    expect(quote.lines.map((line) => line.amountCents)).toEqual([1000, 200])
    expect(quote.totalCents).toBe(1200)
    expect(quote.depositCents).toBe(360)
  })

  it('adds a slow-cool surcharge when the firing or the ware asks for it and the kiln can', () => {
    expect(quoteRequest(base, glazeFiring({ slowCool: true }), [jar]).totalCents).toBe(1150)
    expect(quoteRequest(base, glazeFiring(), [box(10, 10, 10, { wallThicknessMm: 20 })]).totalCents).toBe(1150)
    expect(quoteRequest(base, glazeFiring({ slowCool: true }), [jar], electricKiln({ controlledCooling: false })).totalCents).toBe(1000)
    expect(quoteRequest(base, glazeFiring(), [jar]).totalCents).toBe(1000)
  })

  it('adds a preheat surcharge for thick greenware, rounded half-up', () => {
    // 12.5 % of 1000 ¢ = 125 ¢; the thick bowl also asks for a slow cool (15 %, 150 ¢).
    const bowl = greenBowl({ round: false, heightMm: inToMm(10), widthMm: inToMm(10), depthMm: inToMm(10), wallThicknessMm: 20 })
    const quote = quoteRequest(base, { atmosphere: 'oxidation' }, [bowl])
    expect(quote.lines.map((line) => line.amountCents)).toEqual([1000, 150, 125])
    // 30 % of 1275 = 382.5 → 383 ¢.
    expect(quote.depositCents).toBe(383)
  })

  it('rounds a percent surcharge half-up', () => {
    // 2.5 % of 1000 in³ at 0.3 ¢ = 300 ¢ base → 7.5 → 8 ¢.
    const quote = quoteRequest(
      volumePrices({ centsPerCubicInch: 0.3, surcharges: { reduction: 2.5 } }),
      glazeFiring({ atmosphere: 'reduction' }),
      [jar],
    )
    expect(quote.lines.map((line) => line.amountCents)).toEqual([300, 8])
  })

  it('never asks a fixed deposit above the total', () => {
    expect(quoteRequest(volumePrices({ deposit: { fixedCents: 10_000 } }), glazeFiring(), [box(4, 4, 4)]).depositCents).toBe(192)
    expect(quoteRequest(volumePrices({ deposit: { fixedCents: 100 } }), glazeFiring(), [box(4, 4, 4)]).depositCents).toBe(100)
  })
})
