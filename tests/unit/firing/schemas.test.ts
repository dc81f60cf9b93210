import { describe, expect, it } from 'vitest'
import { z } from 'zod'
import type { Firing, Kiln, Piece } from '../../../shared/firing/check'
import type { PriceList } from '../../../shared/firing/quote'
import { coneSchema, firingSpecSchema, kilnSchema, pieceSchema, priceListSchema, wareCheckBodySchema } from '../../../shared/schemas/firing'
import { electricKiln, glazeFiring, mug } from './fixtures'

function messages(result: { success: boolean; error?: z.ZodError }): Record<string, string[]> {
  if (result.success || !result.error) return {}
  const byPath: Record<string, string[]> = {}
  for (const issue of result.error.issues) {
    const key = issue.path.join('.')
    ;(byPath[key] ??= []).push(issue.message)
  }
  return byPath
}

describe('coneSchema', () => {
  it('reads the forms potters write into the canonical cone', () => {
    expect(coneSchema.parse('Cone 04')).toBe('04')
    expect(coneSchema.parse('^6')).toBe('6')
  })

  it('rejects other text with parseCone’s reason', () => {
    const result = coneSchema.safeParse('cone 15')
    expect(result.success).toBe(false)
    expect(result.error?.issues[0].message).toMatch(/hotter than cone 14/)
    expect(coneSchema.safeParse(6).error?.issues[0].message).toMatch(/cone number/)
  })
})

describe('kilnSchema', () => {
  it('accepts a kiln and gives back the type the check takes', () => {
    const kiln: Kiln = kilnSchema.parse({ ...electricKiln(), minCone: 'cone 022', maxCone: '^10' })
    expect(kiln.minCone).toBe('022')
    expect(kiln.maxCone).toBe('10')
  })

  it('says what is wrong in the potter’s words', () => {
    const result = kilnSchema.safeParse({ ...electricKiln(), maxRampCPerHour: 0, minCone: '10', maxCone: '06', atmospheres: [] })
    const byPath = messages(result)
    expect(byPath.maxRampCPerHour?.[0]).toMatch(/at least 1 °C per hour/)
    expect(byPath.atmospheres?.[0]).toMatch(/at least one atmosphere/)
  })

  it('keeps the cone range in order and the usable height inside the kiln', () => {
    expect(messages(kilnSchema.safeParse({ ...electricKiln(), minCone: '10', maxCone: '06' })).maxCone?.[0]).toMatch(/coolest cone/)
    expect(messages(kilnSchema.safeParse({ ...electricKiln(), usableHeightMm: 700 })).usableHeightMm?.[0]).toMatch(/inside height/)
  })

  it('rejects a shape it does not know', () => {
    expect(kilnSchema.safeParse({ ...electricKiln(), interior: { shape: 'oval', heightMm: 500 } }).success).toBe(false)
  })
})

describe('pieceSchema', () => {
  it('accepts a piece and gives back the type the check takes', () => {
    const piece: Piece = pieceSchema.parse(mug({ label: '  Mug  ' }))
    expect(piece.label).toBe('Mug')
  })

  it('bounds sizes and quantities', () => {
    expect(messages(pieceSchema.safeParse(mug({ heightMm: 0 }))).heightMm?.[0]).toMatch(/more than 0 mm/)
    expect(messages(pieceSchema.safeParse(mug({ quantity: 0 }))).quantity?.[0]).toMatch(/at least one/)
    expect(messages(pieceSchema.safeParse(mug({ quantity: 501 }))).quantity?.[0]).toMatch(/At most 500/)
    expect(messages(pieceSchema.safeParse(mug({ quantity: 1.5 }))).quantity?.[0]).toMatch(/whole number/)
    expect(pieceSchema.safeParse(mug({ quantity: 500 })).success).toBe(true)
    expect(messages(pieceSchema.safeParse(mug({ wallThicknessMm: 200 }))).wallThicknessMm?.[0]).toMatch(/thicker than the piece/)
  })

  it('checks the clay and glaze ranges', () => {
    const result = pieceSchema.safeParse(mug({ clay: { body: 'stoneware', minCone: '7', maxCone: '5' } }))
    expect(messages(result)['clay.maxCone']?.[0]).toMatch(/clay’s coolest cone/)
  })
})

describe('firingSpecSchema', () => {
  it('accepts a firing and gives back the type the check takes', () => {
    const firing: Firing = firingSpecSchema.parse({ ...glazeFiring(), cone: 'cone 6' })
    expect(firing.cone).toBe('6')
  })
})

describe('priceListSchema', () => {
  it('accepts a price list and upper-cases the currency', () => {
    const prices: PriceList = priceListSchema.parse({ currency: 'usd', model: 'volume', centsPerLitre: 40, deposit: { percent: 25 } })
    expect(prices.currency).toBe('USD')
  })

  it('asks for the price the model needs', () => {
    expect(
      messages(priceListSchema.safeParse({ currency: 'USD', model: 'volume', deposit: { percent: 25 } })).centsPerCubicInch?.[0],
    ).toMatch(/one price/)
    expect(messages(priceListSchema.safeParse({ currency: 'USD', model: 'shelf', deposit: { percent: 25 } })).shelfCents?.[0]).toMatch(
      /whole shelf/,
    )
    expect(messages(priceListSchema.safeParse({ currency: 'USD', model: 'kiln', deposit: { percent: 25 } })).kilnCents?.[0]).toMatch(
      /price of the kiln/,
    )
  })

  it('keeps money in whole cents and deposits within 100 %', () => {
    expect(
      messages(priceListSchema.safeParse({ currency: 'USD', model: 'kiln', kilnCents: 10.5, deposit: { percent: 25 } })).kilnCents?.[0],
    ).toMatch(/whole cents/)
    expect(
      messages(priceListSchema.safeParse({ currency: 'USD', model: 'kiln', kilnCents: 1000, deposit: { percent: 120 } }))[
        'deposit.percent'
      ]?.[0],
    ).toMatch(/at most 100/)
  })
})

describe('wareCheckBodySchema', () => {
  const inline = { kiln: electricKiln(), firing: glazeFiring(), pieces: [mug()] }

  it('accepts {kiln, firing, pieces, priceList?}', () => {
    const body = wareCheckBodySchema.parse({
      ...inline,
      priceList: { currency: 'USD', model: 'kiln', kilnCents: 100, deposit: { fixedCents: 0 } },
    })
    expect('kiln' in body && body.priceList?.model).toBe('kiln')
  })

  it('accepts {firingId, pieces}', () => {
    const body = wareCheckBodySchema.parse({ firingId: 'f-123', pieces: [mug()] })
    expect('firingId' in body && body.firingId).toBe('f-123')
  })

  it('names the fields of the shape meant', () => {
    const byPath = messages(wareCheckBodySchema.safeParse({ ...inline, kiln: { ...electricKiln(), maxTempC: 'hot' } }))
    expect(Object.keys(byPath)).toEqual(['kiln.maxTempC'])
    expect(byPath['kiln.maxTempC'][0]).toMatch(/top temperature/)
    expect(Object.keys(messages(wareCheckBodySchema.safeParse({ firingId: '', pieces: [mug()] })))).toEqual(['firingId'])
  })

  it('bounds the number of pieces', () => {
    expect(messages(wareCheckBodySchema.safeParse({ ...inline, pieces: [] })).pieces?.[0]).toMatch(/at least one piece/)
    expect(messages(wareCheckBodySchema.safeParse({ ...inline, pieces: Array.from({ length: 201 }, () => mug()) })).pieces?.[0]).toMatch(
      /At most 200/,
    )
    expect(wareCheckBodySchema.safeParse({ ...inline, pieces: Array.from({ length: 200 }, () => mug()) }).success).toBe(true)
  })

  it('rejects a body that is not an object, or mixes both shapes', () => {
    expect(wareCheckBodySchema.safeParse(null).success).toBe(false)
    expect(wareCheckBodySchema.safeParse('kiln').success).toBe(false)
    expect(messages(wareCheckBodySchema.safeParse({ ...inline, firingId: 'f-1' }))['']?.[0]).toMatch(/Unexpected field/)
  })
})
