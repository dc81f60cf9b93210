// Finding a firing: filter semantics, distances, both answering paths (engine and PostgreSQL), the
// degraded mode with the engine down, and the index catching up when it is back.
import fc from 'fast-check'
import { getDistance } from 'geolib'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startSearchEngine } from '../../standins/search-engine/server'
import { engineRebuilt } from '../../server/services/search'
import type { BoardResponse } from '../../shared/api/board'
import { pieceFitsFootprint, type Kiln } from '../../shared/firing/check'
import { HttpSession } from '../support/http-client'
import { createPerson, type Person } from '../support/people'
import { startTestApp, type TestApp } from '../support/test-app'
import { waitUntil } from '../support/wait'

let app: TestApp
let owner: Person
const anyone = () => new HttpSession(app.url)
const days = (n: number) => new Date(Date.now() + n * 86400_000)

// Kiln interiors as created below, by studio, for checking the fit filter against checkWare's rule.
const interiors = new Map<string, Kiln['interior']>()
const firingStudio = new Map<string, string>()
const studios: Record<string, string> = {}

async function studioWithKiln(
  name: string,
  postalCode: string,
  kiln: Record<string, unknown>,
  firings: Record<string, unknown>[],
  publish = true,
) {
  const studio = (await owner.session.post('/api/studios', { name, postalCode })).body
  studios[name] = studio.id
  const created = await owner.session.post(`/api/studios/${studio.id}/kilns`, { name: `${name} kiln`, shelfCount: 4, ...kiln })
  if (created.status !== 201) throw new Error(JSON.stringify(created.body))
  interiors.set(studio.id, kiln.interior as Kiln['interior'])
  await owner.session.put(`/api/kilns/${created.body.id}/price-list`, {
    currency: 'USD',
    model: 'volume',
    centsPerCubicInch: 4 + Object.keys(studios).length,
    deposit: { percent: 25 },
  })
  for (const firing of firings) {
    const drop = firing.dropInDays as number
    const reply = await owner.session.post(`/api/kilns/${created.body.id}/firings`, {
      kind: 'glaze',
      atmosphere: 'oxidation',
      ...firing,
      dropInDays: undefined,
      dropOffBy: days(drop).toISOString(),
      firingDate: days(drop + 2).toISOString(),
      readyBy: days(drop + 4).toISOString(),
    })
    if (reply.status !== 201) throw new Error(JSON.stringify(reply.body))
    firingStudio.set(reply.body.firings[0].id, studio.id)
  }
  if (publish) await owner.session.patch(`/api/studios/${studio.id}`, { published: true })
  return studio.id as string
}

const electric = (diameterMm: number, heightMm: number, maxCone = '10') => ({
  kind: 'electric',
  atmospheres: ['oxidation'],
  interior: { shape: 'round', diameterMm, heightMm },
  minCone: '022',
  maxCone,
  maxTempC: 1300,
  maxRampCPerHour: 300,
  preheatHold: true,
  controlledCooling: true,
})
const gas = (widthMm: number, depthMm: number, heightMm: number) => ({
  kind: 'gas',
  atmospheres: ['reduction', 'oxidation'],
  interior: { shape: 'box', widthMm, depthMm, heightMm },
  minCone: '010',
  maxCone: '12',
  maxTempC: 1340,
  maxRampCPerHour: 200,
  preheatHold: true,
  controlledCooling: false,
})

async function search(query: string) {
  const reply = await anyone().get(`/api/search?${query}`)
  expect(reply.status, JSON.stringify(reply.body)).toBe(200)
  return reply.body as {
    hits: {
      firingId: string
      studio: { id: string; lat: number; lng: number }
      distanceKm: number
      cone: string
      atmosphere: string
      priceExample: { totalCents: number }
      dropOffBy: string
    }[]
    total: number
    degraded: boolean
    facets: Record<string, Record<string, number>>
  }
}

const studioIdsOf = (r: Awaited<ReturnType<typeof search>>) => [...new Set(r.hits.map((h) => h.studio.id))]

beforeAll(async () => {
  app = await startTestApp({ search: true })
  owner = await createPerson(app, 'host', 'Search Owner')
  // Portland (97214), Hillsboro (97124, about 25 km west), Salem (97301, about 70 km south),
  // Seattle (98101, about 230 km north): distances from memory, checked exactly against geolib below.
  await studioWithKiln('Alder', '97214', electric(711, 686), [
    { cone: '6', dropInDays: 5 },
    { cone: '04', kind: 'bisque', dropInDays: 3 },
  ])
  await studioWithKiln('Fern', '97124', gas(1016, 914, 1067), [
    { cone: '10', atmosphere: 'reduction', dropInDays: 6 },
    { cone: '10', atmosphere: 'oxidation', dropInDays: 12 },
  ])
  await studioWithKiln('Salem', '97301', electric(457, 457, '6'), [{ cone: '6', dropInDays: 4 }])
  await studioWithKiln('Seattle', '98101', gas(800, 800, 900), [{ cone: '10', atmosphere: 'reduction', dropInDays: 8 }])
  await studioWithKiln('Draft', '97214', gas(900, 900, 900), [{ cone: '10', atmosphere: 'reduction', dropInDays: 6 }], false)
  // The index is a few seconds behind at most: wait for the worker to catch up.
  await waitUntil(async () => (await anyone().get('/api/search?perPage=50')).body.total === 6, {
    what: 'the index to hold the six published firings',
  })
})

afterAll(async () => {
  await app?.close()
})

describe('filters', () => {
  it('near a place for cone 10 reduction finds only matching firings within the radius', async () => {
    const result = await search('place=Portland,%20OR&radiusKm=60&cone=10&atmosphere=reduction')
    expect(result.degraded).toBe(false)
    expect(result.hits).toHaveLength(1)
    expect(result.hits[0]).toMatchObject({ cone: '10', atmosphere: 'reduction' })
    expect(result.hits[0].studio.id).toBe(studios.Fern)
  })

  it('never shows a draft studio’s firings', async () => {
    const result = await search('cone=10&perPage=50')
    expect(studioIdsOf(result)).not.toContain(studios.Draft)
  })

  it('takes a cone range, coolest first', async () => {
    const result = await search('cone=04..6&perPage=50')
    expect(result.hits.map((h) => h.cone).sort()).toEqual(['04', '6', '6'])
  })

  it('takes a drop-off window', async () => {
    const from = days(3.5).toISOString()
    const to = days(6.5).toISOString()
    const result = await search(`from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}&perPage=50`)
    for (const hit of result.hits) {
      expect(Date.parse(hit.dropOffBy)).toBeGreaterThanOrEqual(Date.parse(from) - 1000)
      expect(Date.parse(hit.dropOffBy)).toBeLessThanOrEqual(Date.parse(to))
    }
    // Drop-offs in 4 (Salem), 5 (Alder cone 6) and 6 days (Fern reduction); the draft studio’s never counts.
    expect(result.hits).toHaveLength(3)
  })

  it('fits a piece by height against the usable height checkWare uses', async () => {
    // Usable height = interior less about 65 mm for posts, a shelf and the lid: 621 mm for Alder, 392 for Salem.
    expect(studioIdsOf(await search('fitsHeightMm=600&perPage=50')).sort()).toEqual([studios.Alder, studios.Fern, studios.Seattle].sort())
    expect(studioIdsOf(await search('fitsHeightMm=650&perPage=50')).sort()).toEqual([studios.Fern, studios.Seattle].sort())
  })

  it('fits a footprint by exactly the rule of checkWare, for any piece', async () => {
    const everything = await search('perPage=50')
    await fc.assert(
      fc.asyncProperty(
        fc.integer({ min: 100, max: 1100 }),
        fc.option(fc.integer({ min: 50, max: 1100 }), { nil: null }),
        async (width, depth) => {
          const result = await search(`fitsWidthMm=${width}${depth === null ? '' : `&fitsDepthMm=${depth}`}&perPage=50`)
          const piece = depth === null ? { widthMm: width, depthMm: width, round: true } : { widthMm: width, depthMm: depth }
          const expected = everything.hits
            .filter((h) => pieceFitsFootprint({ interior: interiors.get(h.studio.id)! }, piece))
            .map((h) => h.firingId)
            .sort()
          expect(result.hits.map((h) => h.firingId).sort()).toEqual(expected)
        },
      ),
      { numRuns: 25 },
    )
  })
})

describe('distances and order', () => {
  it('gives each hit’s distance as geolib measures it on the engine’s sphere', async () => {
    const result = await search('near=45.5152,-122.6784&radiusKm=500&perPage=50')
    expect(result.hits.length).toBe(6)
    for (const hit of result.hits) {
      // geolib's sphere is 6,378,137 m; Meilisearch's (and ours) 6,371,000 m: same angle, scaled.
      const metres = getDistance({ lat: 45.5152, lng: -122.6784 }, hit.studio, 0.01) * (6_371_000 / 6_378_137)
      expect(Math.abs(hit.distanceKm - metres / 1000)).toBeLessThan(0.06)
    }
    const distances = result.hits.map((h) => h.distanceKm)
    expect([...distances].sort((a, b) => a - b)).toEqual(distances)
  })

  it('sorts by price and by soonest drop-off', async () => {
    const byPrice = (await search('sort=price&perPage=50')).hits.map((h) => h.priceExample.totalCents)
    expect([...byPrice].sort((a, b) => a - b)).toEqual(byPrice)
    const bySoonest = (await search('sort=soonest&perPage=50')).hits.map((h) => Date.parse(h.dropOffBy))
    expect([...bySoonest].sort((a, b) => a - b)).toEqual(bySoonest)
  })

  it('counts facets', async () => {
    const result = await search('perPage=1')
    expect(result.facets.atmosphere).toEqual({ oxidation: 4, reduction: 2 })
    expect(result.total).toBe(6)
  })
})

describe('bad parameters', () => {
  it.each([
    ['an unknown place', 'place=Nowheresville%20ZZ', 'place'],
    ['an unknown cone', 'cone=99', 'cone'],
    ['a reversed cone range', 'cone=10..04', 'cone'],
    ['a negative distance', 'place=97214&radiusKm=-5', 'radiusKm'],
    ['sorting by distance from nowhere', 'sort=distance', 'sort'],
    ['a point off the map', 'near=95,10', 'near'],
    ['a page of zero', 'page=0', 'page'],
  ])('%s is a 400 with a field message', async (_what, query, field) => {
    const reply = await anyone().get(`/api/search?${query}`)
    expect(reply.status).toBe(400)
    expect(reply.body.error.fields[field]).toBeTruthy()
  })
})

describe('the firing board', () => {
  async function board(query: string) {
    const reply = await anyone().get(`/api/search/board?${query}`)
    expect(reply.status, JSON.stringify(reply.body)).toBe(200)
    return reply.body as BoardResponse
  }
  const shape = (b: BoardResponse) => ({
    studios: b.studios.map((card) => ({ id: card.studio.id, firings: card.firings.map((f) => f.firingId), more: card.moreFirings })),
    total: b.total,
    firingTotal: b.firingTotal,
    facets: b.facets,
  })
  const BOARD_QUERIES = [
    'place=Portland, OR',
    'place=Portland, OR&perPage=2',
    'place=Portland, OR&perPage=2&page=2',
    'sort=soonest',
    'cone=10',
    'q=Fern',
  ]

  it('groups the same firings as the per-firing search, one entry per studio, pages counting studios', async () => {
    const firings = await search('place=Portland, OR&perPage=50')
    const whole = await board('place=Portland, OR')
    expect(whole.studios.map((card) => card.studio.id)).toEqual(studioIdsOf(firings))
    expect(whole.total).toBe(3)
    expect(whole.firingTotal).toBe(firings.total)
    for (const card of whole.studios)
      expect(card.firings.map((f) => f.firingId)).toEqual(firings.hits.filter((h) => h.studio.id === card.studio.id).map((h) => h.firingId))
    const first = await board('place=Portland, OR&perPage=2')
    const second = await board('place=Portland, OR&perPage=2&page=2')
    expect([...first.studios, ...second.studios].map((card) => card.studio.id)).toEqual(whole.studios.map((card) => card.studio.id))
    expect(first.total).toBe(3)
  })

  it('prices the potter’s own piece with the studio’s price list', async () => {
    // A 4 in cube is 101.6 mm a side (1 in = 25.4 mm, NIST SP 811): 64 cubic inches, at Alder's
    // 5 cents a cubic inch 320 cents.
    const priced = await board('place=Portland, OR&fitsHeightMm=101.6&fitsWidthMm=101.6&fitsDepthMm=101.6')
    const alder = priced.studios.find((card) => card.studio.id === studios.Alder)!
    expect(alder.firings.map((f) => f.piecePrice)).toEqual(alder.firings.map(() => ({ totalCents: 320, currency: 'USD' })))
    expect(priced.piece).toEqual({ heightMm: 101.6, widthMm: 101.6, depthMm: 101.6 })
    expect((await board('place=Portland, OR')).studios.every((card) => card.firings.every((f) => f.piecePrice === null))).toBe(true)
  })

  it('answers the same from PostgreSQL with the engine down', async () => {
    const up = await Promise.all(BOARD_QUERIES.map(board))
    expect(up.every((b) => !b.degraded)).toBe(true)
    const { state, port } = app.search!
    await app.search!.close()
    try {
      const down = await Promise.all(BOARD_QUERIES.map(board))
      expect(down.every((b) => b.degraded)).toBe(true)
      down.forEach((b, i) => expect(shape(b), BOARD_QUERIES[i]).toEqual(shape(up[i])))
    } finally {
      app.search = await startSearchEngine({ port, masterKey: 'test-search-key', state })
      // The next tests start with the engine trusted again, not after the retry pause.
      engineRebuilt()
    }
  })
})

describe('with the engine down', () => {
  const QUERIES = [
    'place=97214&radiusKm=60&sort=distance',
    'cone=04..10&sort=price&perPage=50',
    'fitsHeightMm=500&fitsWidthMm=400&fitsDepthMm=300',
    'q=Fern',
    'atmosphere=oxidation&sort=soonest',
  ]

  it('answers the same queries from PostgreSQL, marked degraded, in the same order', async () => {
    const up = await Promise.all(QUERIES.map(search))
    expect(up.every((r) => !r.degraded)).toBe(true)
    const { state, port } = app.search!
    await app.search!.close()
    try {
      const down = await Promise.all(QUERIES.map(search))
      expect(down.every((r) => r.degraded)).toBe(true)
      down.forEach((r, i) => {
        expect(
          r.hits.map((h) => h.firingId),
          QUERIES[i],
        ).toEqual(up[i].hits.map((h) => h.firingId))
        expect(r.total).toBe(up[i].total)
        expect(r.facets).toEqual(up[i].facets)
      })

      // A change made during the outage reaches PostgreSQL's copy at once and waits in the queue for the engine.
      const kiln = (await anyone().get(`/api/studios/${studios.Salem}/kilns`)).body.kilns[0]
      const created = await owner.session.post(`/api/kilns/${kiln.id}/firings`, {
        kind: 'glaze',
        cone: '5',
        atmosphere: 'oxidation',
        dropOffBy: days(9).toISOString(),
        firingDate: days(10).toISOString(),
        readyBy: days(12).toISOString(),
      })
      const newId = created.body.firings[0].id
      await expect.poll(async () => (await search('cone=5')).hits.map((h) => h.firingId), { timeout: 60_000 }).toEqual([newId])
      expect((await search('cone=5')).degraded).toBe(true)

      // The engine comes back with its data; the queued update is replayed and nothing is lost.
      app.search = await startSearchEngine({ port, masterKey: 'test-search-key', state })
      await app.ctx.db.query(`UPDATE graphile_worker._private_jobs SET run_at = now() WHERE key LIKE 'search-sync:%'`)
      await expect
        .poll(
          async () => {
            const r = await search('cone=5')
            return { degraded: r.degraded, ids: r.hits.map((h) => h.firingId) }
          },
          { timeout: 30_000, interval: 500 },
        )
        .toEqual({ degraded: false, ids: [newId] })
    } finally {
      if (!app.search || app.search.port !== port) app.search = await startSearchEngine({ port, masterKey: 'test-search-key', state })
    }
  }, 90_000)
})

describe('keeping the index true', () => {
  it('drops a cancelled firing and a studio that is unpublished', async () => {
    const salemFirings = (await search('perPage=50')).hits.filter((h) => h.studio.id === studios.Salem)
    expect(salemFirings.length).toBeGreaterThan(0)
    await owner.session.post(`/api/firings/${salemFirings[0].firingId}/cancel`, { reason: 'Kiln sitter broke' })
    await expect
      .poll(async () => (await search('perPage=50')).hits.some((h) => h.firingId === salemFirings[0].firingId), { timeout: 60_000 })
      .toBe(false)
    await owner.session.patch(`/api/studios/${studios.Seattle}`, { published: false })
    await expect.poll(async () => studioIdsOf(await search('perPage=50')).includes(studios.Seattle), { timeout: 60_000 }).toBe(false)
  })
})
