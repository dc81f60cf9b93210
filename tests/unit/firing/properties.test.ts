// Property-based checks (fast-check) over inputs generated loosely, then filtered through the same
// zod schema the route uses: whatever the schema lets through must be safe to check and to quote.

import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { checkWare, verdictRank, type Finding } from '../../../shared/firing/check'
import { CONES } from '../../../shared/firing/cones'
import { quoteRequest } from '../../../shared/firing/quote'
import { pieceSchema, wareCheckBodySchema, type WareCheckInlineBody } from '../../../shared/schemas/firing'

/** Mostly in range, now and then something a careless client might send. */
function loose<T>(arbitrary: fc.Arbitrary<T>): fc.Arbitrary<unknown> {
  return fc.oneof(
    { weight: 120, arbitrary },
    { weight: 1, arbitrary: fc.constantFrom<unknown>(Number.NaN, -1, 0, 1e12, '12', null, undefined, true) },
  )
}

const number = (min: number, max: number) => loose(fc.double({ min, max, noNaN: true }))
const integer = (min: number, max: number) => loose(fc.integer({ min, max }))

const coneText = fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom(...CONES) },
  { weight: 2, arbitrary: fc.constantFrom(...CONES).map((cone) => `cone ${cone}`) },
  { weight: 2, arbitrary: fc.constantFrom(...CONES).map((cone) => `^${cone}`) },
  { weight: 1, arbitrary: fc.string({ maxLength: 6 }) },
)

/** A cone range, coolest first most of the time. */
const coneRange = fc.oneof(
  {
    weight: 19,
    arbitrary: fc
      .tuple(fc.nat(CONES.length - 1), fc.nat(CONES.length - 1))
      .map(([a, b]) => ({ minCone: CONES[Math.min(a, b)], maxCone: CONES[Math.max(a, b)] })),
  },
  { weight: 1, arbitrary: fc.record({ minCone: coneText, maxCone: coneText }) },
)

const interior = fc.oneof(
  fc.record({ shape: fc.constant('round'), diameterMm: number(50, 2000), heightMm: number(50, 2000) }),
  fc.record({ shape: fc.constant('box'), widthMm: number(50, 2000), depthMm: number(50, 2000), heightMm: number(50, 2000) }),
)

const kilnRaw = fc
  .record(
    {
      kind: fc.constantFrom('electric', 'gas', 'wood', 'soda', 'salt', 'raku'),
      atmospheres: fc.subarray(['oxidation', 'reduction', 'neutral'], { minLength: 1 }),
      interior,
      usableHeightMm: number(10, 1000),
      range: coneRange,
      maxTempC: number(100, 2000),
      maxRampCPerHour: number(1, 2000),
      preheatHold: fc.boolean(),
      controlledCooling: fc.boolean(),
    },
    { requiredKeys: ['kind', 'atmospheres', 'interior', 'range', 'maxTempC', 'maxRampCPerHour', 'preheatHold', 'controlledCooling'] },
  )
  .map(({ range, ...kiln }) => ({ ...kiln, ...range }))

const firingRaw = fc.record(
  {
    kind: fc.constantFrom('bisque', 'glaze', 'single'),
    cone: coneText,
    atmosphere: fc.constantFrom('oxidation', 'reduction', 'neutral'),
    slowCool: fc.boolean(),
  },
  { requiredKeys: ['kind', 'cone', 'atmosphere'] },
)

const pieceRaw = fc
  .record(
    {
      label: fc.string({ maxLength: 20 }),
      quantity: integer(1, 500),
      heightMm: number(1, 3000),
      widthMm: number(1, 3000),
      depthMm: number(1, 3000),
      round: fc.boolean(),
      wallThicknessMm: number(0.5, 60),
      clay: fc.record({ body: fc.constantFrom('earthenware', 'stoneware', 'porcelain', 'other'), range: coneRange }),
      state: fc.constantFrom('greenware', 'bisque'),
      boneDry: fc.boolean(),
      glaze: fc.record(
        { range: coneRange, runny: fc.boolean(), onFoot: fc.boolean(), support: fc.constantFrom('none', 'cookie', 'tray', 'stilt') },
        { requiredKeys: ['range'] },
      ),
    },
    { requiredKeys: ['quantity', 'heightMm', 'widthMm', 'depthMm', 'wallThicknessMm', 'clay', 'state'] },
  )
  .map(({ clay, glaze, ...piece }) => ({
    ...piece,
    clay: { body: clay.body, ...clay.range },
    ...(glaze ? { glaze: { runny: glaze.runny, onFoot: glaze.onFoot, support: glaze.support, ...glaze.range } } : {}),
  }))

const priceListRaw = fc.oneof(
  fc.record({
    currency: fc.constantFrom('USD', 'eur', 'GBP'),
    model: fc.constant('volume'),
    centsPerCubicInch: number(0, 100),
    deposit: fc.record({ percent: number(0, 100) }),
  }),
  fc.record({
    currency: fc.constant('CAD'),
    model: fc.constant('volume'),
    centsPerLitre: number(0, 2000),
    minimumPerPieceCents: integer(0, 5000),
    deposit: fc.record({ fixedCents: integer(0, 20_000) }),
  }),
  fc.record({
    currency: fc.constant('USD'),
    model: fc.constant('shelf'),
    shelfCents: integer(0, 100_000),
    shelfStep: fc.constantFrom(0.125, 0.25, 0.5, 1, 1 / 3),
    surcharges: fc.record({ reduction: number(0, 100), slowCool: number(0, 100), preheat: number(0, 100) }, { requiredKeys: [] }),
    deposit: fc.record({ percent: number(0, 100) }),
  }),
  fc.record({
    currency: fc.constant('USD'),
    model: fc.constant('kiln'),
    kilnCents: integer(0, 1_000_000),
    deposit: fc.record({ fixedCents: integer(0, 100_000) }),
  }),
)

const bodyRaw = fc.record(
  { kiln: kilnRaw, firing: firingRaw, pieces: fc.array(pieceRaw, { minLength: 0, maxLength: 6 }), priceList: priceListRaw },
  { requiredKeys: ['kiln', 'firing', 'pieces'] },
)

function acceptedInline(raw: unknown): WareCheckInlineBody | null {
  const parsed = wareCheckBodySchema.safeParse(raw)
  if (!parsed.success || !('kiln' in parsed.data)) return null
  return parsed.data
}

function findingKey(finding: Finding): string {
  return `${finding.code}|${finding.severity}|${finding.pieceIndex ?? '-'}`
}

describe('checkWare on anything the schema accepts', () => {
  // A ceiling for a busy machine: every check plans its pieces on the shelves, and the schema allows
  // six lines of 500 tiny pieces.
  it('never throws, and returns a verdict, a schedule and a fit for every piece', () => {
    let accepted = 0
    fc.assert(
      fc.property(bodyRaw, (raw) => {
        const body = acceptedInline(raw)
        if (!body) return
        accepted++
        const check = checkWare(body.kiln, body.firing, body.pieces)
        expect(['ok', 'warn', 'block']).toContain(check.verdict)
        expect(check.schedule.segments.length).toBeGreaterThan(0)
        expect(Number.isFinite(check.schedule.totalMinutes)).toBe(true)
        expect(check.fit.pieces).toHaveLength(body.pieces.length)
        for (const finding of check.findings) expect(finding.message).not.toMatch(/undefined|NaN/)
      }),
      { numRuns: 400 },
    )
    // The property must have been exercised, not filtered away.
    expect(accepted).toBeGreaterThan(40)
  }, 180_000)

  it('quotes in whole cents: lines add up to the total, and the deposit is within it', () => {
    let quoted = 0
    fc.assert(
      fc.property(bodyRaw, (raw) => {
        const body = acceptedInline(raw)
        if (!body?.priceList) return
        quoted++
        const quote = quoteRequest(body.priceList, body.firing, body.pieces, body.kiln)
        let sum = 0
        for (const line of quote.lines) {
          expect(Number.isSafeInteger(line.amountCents)).toBe(true)
          expect(line.amountCents).toBeGreaterThanOrEqual(0)
          sum += line.amountCents
        }
        expect(quote.totalCents).toBe(sum)
        expect(Number.isSafeInteger(quote.depositCents)).toBe(true)
        expect(quote.depositCents).toBeGreaterThanOrEqual(0)
        expect(quote.depositCents).toBeLessThanOrEqual(quote.totalCents)
      }),
      { numRuns: 400 },
    )
    expect(quoted).toBeGreaterThan(20)
  })
})

describe('adding a piece', () => {
  it('never improves the verdict, and keeps every finding the smaller request had', () => {
    let compared = 0
    fc.assert(
      fc.property(bodyRaw, pieceRaw, fc.nat(8), (raw, extraRaw, at) => {
        const body = acceptedInline(raw)
        const extra = pieceSchema.safeParse(extraRaw)
        if (!body || !extra.success || body.pieces.length >= 200) return
        compared++
        const before = checkWare(body.kiln, body.firing, body.pieces)
        const after = checkWare(body.kiln, body.firing, [...body.pieces, extra.data])
        expect(verdictRank(after.verdict)).toBeGreaterThanOrEqual(verdictRank(before.verdict))
        const afterKeys = new Set(after.findings.map(findingKey))
        for (const finding of before.findings) expect(afterKeys).toContain(findingKey(finding))

        // Inserted anywhere, the verdict is still never better.
        const position = Math.min(at, body.pieces.length)
        const inserted = [...body.pieces.slice(0, position), extra.data, ...body.pieces.slice(position)]
        expect(verdictRank(checkWare(body.kiln, body.firing, inserted).verdict)).toBeGreaterThanOrEqual(verdictRank(before.verdict))
      }),
      { numRuns: 400 },
    )
    expect(compared).toBeGreaterThan(40)
  })
})
