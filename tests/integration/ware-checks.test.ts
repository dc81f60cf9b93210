// POST /api/ware-checks against the real server: open to visitors, the verdicts and finding codes of
// shared/firing/check.ts, a quote when a price list comes along, field messages for bad input (never
// a 500), and the per-IP rate limit.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { HttpSession } from '../support/http-client'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp

beforeAll(async () => {
  app = await startTestApp({ worker: false })
})
afterAll(async () => {
  await app?.close()
})

/** A 7 cu ft electric top-loader rated to cone 10, oxidation only (invented, plausible figures). */
const electricKiln = {
  kind: 'electric',
  atmospheres: ['oxidation'],
  interior: { shape: 'round', diameterMm: 597, heightMm: 686 },
  minCone: '022',
  maxCone: '10',
  maxTempC: 1305,
  maxRampCPerHour: 330,
  preheatHold: true,
  controlledCooling: true,
}

const glazeFiring = { kind: 'glaze', cone: '6', atmosphere: 'oxidation' }

/** A bisqued stoneware mug under a cone 5–6 glaze: what a cone 6 glaze load is made of. */
const mug = {
  label: 'Mug',
  quantity: 1,
  heightMm: 102,
  widthMm: 89,
  depthMm: 89,
  round: true,
  wallThicknessMm: 6,
  clay: { body: 'stoneware', minCone: '5', maxCone: '10' },
  state: 'bisque',
  glaze: { minCone: '5', maxCone: '6' },
}

const codes = (body: { findings: { code: string }[] }) => body.findings.map((finding) => finding.code).sort()

async function check(body: unknown) {
  return new HttpSession(app.url).post('/api/ware-checks', body)
}

describe('POST /api/ware-checks, verdicts', () => {
  it('passes a bisqued, glazed mug at cone 6 in a cone 10 electric kiln, without an account', async () => {
    const reply = await check({ kiln: electricKiln, firing: glazeFiring, pieces: [mug] })
    expect(reply.status).toBe(200)
    expect(reply.body.verdict).toBe('ok')
    expect(reply.body.findings).toEqual([])
    expect(reply.body.schedule.predictedCone).toBe('6')
    expect(reply.body.schedule.segments.length).toBeGreaterThan(0)
    expect(reply.body.fit.pieces).toEqual([expect.objectContaining({ pieceIndex: 0, fitsHeight: true, fitsFootprint: true })])
    expect(reply.body.quote).toBeUndefined()
  })

  it('reads cones the way people write them ("cone 6", "^6")', async () => {
    const reply = await check({ kiln: { ...electricKiln, maxCone: 'Cone 10' }, firing: { ...glazeFiring, cone: '^6' }, pieces: [mug] })
    expect(reply.status).toBe(200)
    expect(reply.body.verdict).toBe('ok')
    expect(reply.body.schedule.predictedCone).toBe('6')
  })

  it('warns, and only warns, for a runny glaze not set on a cookie', async () => {
    // Common practice: a runny glaze goes on a catch tray or cookie so drips do not reach the shelf.
    const reply = await check({ kiln: electricKiln, firing: glazeFiring, pieces: [{ ...mug, glaze: { ...mug.glaze, runny: true } }] })
    expect(reply.status).toBe(200)
    expect(reply.body.verdict).toBe('warn')
    expect(codes(reply.body)).toEqual(['runny-glaze-tray'])
    expect(reply.body.findings[0]).toMatchObject({ severity: 'warn', pieceIndex: 0 })
  })

  it('blocks greenware that is not bone dry, and names the piece', async () => {
    // Common practice: water left in the clay turns to steam past 100 °C and can burst the piece.
    const greenware = { ...mug, state: 'greenware', glaze: undefined, boneDry: false }
    const reply = await check({ kiln: electricKiln, firing: { kind: 'bisque', cone: '04', atmosphere: 'oxidation' }, pieces: [greenware] })
    expect(reply.status).toBe(200)
    expect(reply.body.verdict).toBe('block')
    expect(codes(reply.body)).toEqual(['wet-greenware'])
    expect(reply.body.findings[0].message).toContain('Mug')

    const dry = await check({
      kiln: electricKiln,
      firing: { kind: 'bisque', cone: '04', atmosphere: 'oxidation' },
      pieces: [{ ...greenware, boneDry: true }],
    })
    expect(dry.body.verdict).toBe('ok')
  })

  it('blocks a firing the kiln cannot reach: cone, top temperature and atmosphere', async () => {
    // Orton's temperature-equivalent chart, self-supporting cones: cone 6 bends at 1222 °C at 60 °C/h,
    // so a kiln topping out at 1200 °C cannot fire it.
    const weakKiln = { ...electricKiln, maxCone: '5', maxTempC: 1200 }
    const reply = await check({ kiln: weakKiln, firing: { ...glazeFiring, atmosphere: 'reduction' }, pieces: [mug] })
    expect(reply.status).toBe(200)
    expect(reply.body.verdict).toBe('block')
    // A reduction firing also carries its carbon monoxide caution (an info finding).
    expect(codes(reply.body)).toEqual(['atmosphere-unavailable', 'firing-safety', 'kiln-cone-range', 'kiln-max-temp'])
  })

  it('blocks a piece taller than the kiln and warns in the same answer: the verdict is the worst', async () => {
    const tall = { ...mug, label: 'Floor vase', heightMm: 900, glaze: { ...mug.glaze, runny: true } }
    const reply = await check({ kiln: electricKiln, firing: glazeFiring, pieces: [mug, tall] })
    expect(reply.body.verdict).toBe('block')
    expect(codes(reply.body)).toEqual(['piece-too-tall', 'runny-glaze-tray'])
    expect(reply.body.findings.every((finding: { pieceIndex?: number }) => finding.pieceIndex === 1)).toBe(true)
  })
})

describe('POST /api/ware-checks, quotes', () => {
  it('adds a quote in integer cents when a price list comes along', async () => {
    // A 4 in cube is 64 in³ exactly (1 in = 25.4 mm exactly, NIST SP 811); two of them at 4 ¢/in³ are
    // 512 ¢, and a 50 % deposit is 256 ¢.
    const cube = { ...mug, label: 'Box', heightMm: 101.6, widthMm: 101.6, depthMm: 101.6, round: false, quantity: 2 }
    const priceList = { currency: 'usd', model: 'volume', centsPerCubicInch: 4, deposit: { percent: 50 } }
    const reply = await check({ kiln: electricKiln, firing: glazeFiring, pieces: [cube], priceList })
    expect(reply.status).toBe(200)
    expect(reply.body.quote).toEqual({
      currency: 'USD',
      lines: [{ label: 'Box × 2', amountCents: 512 }],
      totalCents: 512,
      depositCents: 256,
    })
  })

  it('sizes shelf shares from the planned load: a shelf with no room left is sold whole, a part shelf by the quarter', async () => {
    // Box kiln 525 × 525 mm inside → 475 × 475 mm shelf (about 50 mm smaller than the chamber, common
    // practice). One 300 × 300 mm platter leaves no room for a second: the whole shelf, 2000 ¢. A 200 × 200 mm
    // dish leaves room for more; its footprint is 40000 / 225625 = 0.18 of the shelf, sold as a quarter: 500 ¢.
    const boxKiln = { ...electricKiln, interior: { shape: 'box', widthMm: 525, depthMm: 525, heightMm: 686 } }
    const platter = { ...mug, label: 'Platter', heightMm: 50, widthMm: 300, depthMm: 300, round: false }
    const dish = { ...platter, label: 'Dish', widthMm: 200, depthMm: 200 }
    const priceList = { currency: 'EUR', model: 'shelf', shelfCents: 2000, shelfStep: 0.25, deposit: { fixedCents: 300 } }
    const reply = await check({ kiln: boxKiln, firing: glazeFiring, pieces: [platter], priceList })
    expect(reply.status).toBe(200)
    expect(reply.body.quote.totalCents).toBe(2000)
    const small = await check({ kiln: boxKiln, firing: glazeFiring, pieces: [dish], priceList })
    expect(small.body.quote.totalCents).toBe(500)
    expect(reply.body.quote.depositCents).toBe(300)
  })
})

describe('POST /api/ware-checks, bad input', () => {
  const valid = { kiln: electricKiln, firing: glazeFiring, pieces: [mug] }

  async function expectFieldError(body: unknown, field: string, message: RegExp) {
    const reply = await check(body)
    expect(reply.status).toBe(400)
    expect(reply.body.error.code).toBe('invalid-input')
    expect(reply.body.error.fields[field]).toMatch(message)
    return reply
  }

  it('missing pieces', async () => {
    await expectFieldError({ kiln: electricKiln, firing: glazeFiring }, 'pieces', /List the pieces/)
    await expectFieldError({ ...valid, pieces: [] }, 'pieces', /at least one piece/)
  })

  it('an unknown cone', async () => {
    await expectFieldError({ ...valid, firing: { ...glazeFiring, cone: 'cone 99' } }, 'firing.cone', /hotter than cone 14/)
    await expectFieldError({ ...valid, firing: { ...glazeFiring, cone: 'hot' } }, 'firing.cone', /not a cone number/)
  })

  it('negative sizes', async () => {
    await expectFieldError({ ...valid, pieces: [{ ...mug, heightMm: -5 }] }, 'pieces.0.heightMm', /more than 0 mm/)
    await expectFieldError(
      { ...valid, kiln: { ...electricKiln, interior: { shape: 'round', diameterMm: -597, heightMm: 686 } } },
      'kiln.interior.diameterMm',
      /more than 0 mm/,
    )
  })

  it('a reversed cone range', async () => {
    await expectFieldError(
      { ...valid, kiln: { ...electricKiln, minCone: '10', maxCone: '04' } },
      'kiln.maxCone',
      /coolest cone must not be hotter/,
    )
    await expectFieldError(
      { ...valid, pieces: [{ ...mug, clay: { body: 'stoneware', minCone: '10', maxCone: '5' } }] },
      'pieces.0.clay.maxCone',
      /clay’s coolest cone/,
    )
  })

  it('wrong types', async () => {
    await expectFieldError({ ...valid, pieces: [{ ...mug, quantity: 'two' }] }, 'pieces.0.quantity', /how many/)
    await expectFieldError({ ...valid, kiln: { ...electricKiln, maxTempC: '1300' } }, 'kiln.maxTempC', /top temperature/)
    await expectFieldError({ ...valid, pieces: { 0: mug } }, 'pieces', /List the pieces/)
    const notAnObject = await check(['kiln'])
    expect(notAnObject.status).toBe(400)
    expect(notAnObject.body.error.fields._).toMatch(/Send \{kiln, firing, pieces\}/)
  })

  it('an unexpected field is named, not ignored', async () => {
    await expectFieldError({ ...valid, kilns: [] }, '_', /Unexpected field: kilns/)
  })

  it('malformed JSON', async () => {
    const reply = await new HttpSession(app.url).post('/api/ware-checks', undefined, {
      raw: '{"kiln": {"kind": "electric",',
      headers: { 'Content-Type': 'application/json' },
    })
    expect(reply.status).toBe(400)
    expect(reply.body.error.code).toBe('malformed-json')
  })

  it('prices shelf space in a tiny test chamber on a shelf cut to fit it', async () => {
    // A 20 mm round chamber: the clearance takes at most a quarter of it (check.ts), so a 15 mm shelf.
    const tiny = { ...electricKiln, interior: { shape: 'round', diameterMm: 20, heightMm: 686 } }
    const priceList = { currency: 'USD', model: 'shelf', shelfCents: 2000, deposit: { percent: 50 } }
    const reply = await check({ kiln: tiny, firing: glazeFiring, pieces: [mug], priceList })
    expect(reply.status).toBe(200)
    expect(reply.body.fit.shelf).toEqual({ shape: 'round', diameterMm: 15 })
    expect(codes(reply.body)).toContain('piece-too-wide')
    expect(Number.isInteger(reply.body.quote.totalCents)).toBe(true)
  })

  it('a firing id that names no firing is a 404', async () => {
    for (const firingId of ['0b9d6a4e-3c1f-4f59-9a8e-2d7f1c6b5a40', 'not-a-firing']) {
      const reply = await check({ firingId, pieces: [mug] })
      expect(reply.status).toBe(404)
      expect(reply.body.error.message).toBe('That firing was not found.')
    }
  })

  it('a change without the CSRF token is refused, as every change is', async () => {
    const reply = await new HttpSession(app.url).post('/api/ware-checks', valid, { csrf: false })
    expect(reply.status).toBe(403)
    expect(reply.body.error.code).toBe('csrf-invalid')
  })
})

describe('POST /api/ware-checks, rate limit', () => {
  let limited: TestApp
  beforeAll(async () => {
    limited = await startTestApp({
      worker: false,
      config: { rateLimits: { authPerIpPer15Min: 100, authPerAccountPer15Min: 10, openApiPerIpPerMin: 3 } },
    })
  })
  afterAll(async () => {
    await limited?.close()
  })

  it('answers 429 once one address has used its checks for the minute, whatever the session', async () => {
    const statuses: number[] = []
    for (let i = 0; i < 5; i++) {
      statuses.push(
        (await new HttpSession(limited.url).post('/api/ware-checks', { kiln: electricKiln, firing: glazeFiring, pieces: [mug] })).status,
      )
    }
    expect(statuses).toEqual([200, 200, 200, 429, 429])
    const reply = await new HttpSession(limited.url).post('/api/ware-checks', { kiln: electricKiln, firing: glazeFiring, pieces: [mug] })
    expect(reply.body.error.code).toBe('rate-limited')
  })
})
