// Contract tests for the search engine, spoken to only through the official `meilisearch` SDK.
// By default they run against the local stand-in (search/engine/server.ts); with MEILI_HOST set
// (and MEILI_API_KEY when that engine has a master key) they run unchanged against a real
// Meilisearch, so the stand-in is held to the real engine's behaviour. Index names carry a
// per-run suffix and every index made here is deleted afterwards.
//
// Expected results come from the Meilisearch documentation's definitions (filter expressions,
// sorting, facets, pagination, typo tolerance and geosearch pages), evaluated over the fixture
// by plain predicates, and from geolib for distances.

import { randomBytes } from 'node:crypto'

import { getDistance, isPointInPolygon } from 'geolib'
import { Meilisearch, MeilisearchApiError, type Index, type Settings, type Task } from 'meilisearch'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'

import { startSearchEngine, type RunningSearchEngine } from '../../standins/search-engine/server'

type FiringDocument = {
  id: string
  studioName: string
  title: string
  cone: string
  atmosphere: 'oxidation' | 'reduction'
  kind: 'bisque' | 'glaze'
  priceCents: number
  usableHeightMm?: number
  spaceLeftL: number
  tags: string[]
  crewNote?: string | null
  _geo: { lat: number; lng: number }
}

// Invented studios placed on real city centres (coordinates from memory, to about 0.01°).
// Bisque to cone 04 and glaze to cone 6 or 10 are common practice.
const FIRINGS: FiringDocument[] = [
  {
    id: 'f1',
    studioName: 'Ember Lane Studio',
    title: 'Stoneware reduction firing',
    cone: '10',
    atmosphere: 'reduction',
    kind: 'glaze',
    priceCents: 4500,
    usableHeightMm: 450,
    spaceLeftL: 12.5,
    tags: ['gas', 'soda'],
    crewNote: null,
    _geo: { lat: 53.0027, lng: -2.1794 },
  },
  {
    id: 'f2',
    studioName: 'Canal Street Kilns',
    title: 'Mid-fire stoneware glaze load',
    cone: '6',
    atmosphere: 'oxidation',
    kind: 'glaze',
    priceCents: 3200,
    usableHeightMm: 380,
    spaceLeftL: 40,
    tags: ['electric'],
    crewNote: 'Fresh kiln wash on every shelf',
    _geo: { lat: 53.4808, lng: -2.2426 },
  },
  {
    id: 'f3',
    studioName: 'Jewellery Quarter Clay',
    title: 'Bisque firing for greenware',
    cone: '04',
    atmosphere: 'oxidation',
    kind: 'bisque',
    priceCents: 1800,
    usableHeightMm: 500,
    spaceLeftL: 80,
    tags: [],
    crewNote: '',
    _geo: { lat: 52.4862, lng: -1.8904 },
  },
  {
    id: 'f4',
    studioName: 'Kirkgate Pottery',
    title: 'Porcelain reduction firing',
    cone: '10',
    atmosphere: 'reduction',
    kind: 'glaze',
    priceCents: 5200,
    usableHeightMm: 600,
    spaceLeftL: 5,
    tags: ['gas'],
    _geo: { lat: 53.8008, lng: -1.5491 },
  },
  {
    id: 'f5',
    studioName: 'Thames Side Ceramics',
    title: 'Electric glaze firing',
    cone: '6',
    atmosphere: 'oxidation',
    kind: 'glaze',
    priceCents: 3900,
    usableHeightMm: 300,
    spaceLeftL: 25,
    tags: ['electric', 'crystalline'],
    crewNote: 'Witness cones in every load',
    _geo: { lat: 51.5074, lng: -0.1278 },
  },
  {
    id: 'f6',
    studioName: 'Steel City Kiln Share',
    title: 'Slow bisque with long candling',
    cone: '04',
    atmosphere: 'oxidation',
    kind: 'bisque',
    priceCents: 1500,
    usableHeightMm: 420,
    spaceLeftL: 60,
    tags: ['electric'],
    crewNote: null,
    _geo: { lat: 53.3811, lng: -1.4701 },
  },
  {
    id: 'f7',
    studioName: 'Lace Market Fire',
    title: 'Mid-fire reduction',
    cone: '6',
    atmosphere: 'reduction',
    kind: 'glaze',
    priceCents: 4100,
    spaceLeftL: 18,
    tags: ['gas'],
    _geo: { lat: 52.9548, lng: -1.1581 },
  },
  {
    id: 'f8',
    studioName: 'Harbourside Kilnworks',
    title: 'Big electric stoneware firing',
    cone: '10',
    atmosphere: 'oxidation',
    kind: 'glaze',
    priceCents: 6000,
    usableHeightMm: 700,
    spaceLeftL: 30,
    tags: ['electric', 'large'],
    _geo: { lat: 51.4545, lng: -2.5879 },
  },
]

const FILTERABLE = ['atmosphere', 'cone', 'crewNote', 'kind', 'priceCents', 'spaceLeftL', 'studioName', 'tags', 'usableHeightMm', '_geo']
const SORTABLE = ['priceCents', 'spaceLeftL', 'usableHeightMm', '_geo']

const STOKE = { lat: 53.0027, lng: -2.1794 }

// geolib 3.3.14 measures on a sphere of 6,378,137 m (its `earthRadius`, the WGS-84 semi-major
// axis); Meilisearch uses the 6,371,000 m mean radius (geoutils haversine). Same central angle,
// so a Meilisearch distance is geolib's scaled by the ratio of the radii.
const MEAN_TO_GEOLIB_RADIUS = 6_371_000 / 6_378_137
const engineDistance = (from: { lat: number; lng: number }, to: { lat: number; lng: number }): number =>
  getDistance(from, to, 0.001) * MEAN_TO_GEOLIB_RADIUS

const externalHost = process.env.MEILI_HOST
const apiKey = externalHost ? process.env.MEILI_API_KEY : 'contract-test-master-key'
const runSuffix = `${Date.now().toString(36)}_${randomBytes(3).toString('hex')}`
const indexName = (name: string) => `conewright_contract_${runSuffix}_${name}`

let engine: RunningSearchEngine | null = null
let client: Meilisearch
const createdIndexes: string[] = []

async function freshIndex<T extends Record<string, unknown>>(name: string, settings: Settings | null): Promise<Index<T>> {
  const uid = indexName(name)
  createdIndexes.push(uid)
  const created = await client.createIndex(uid, { primaryKey: 'id' }).waitTask()
  expect(created.status).toBe('succeeded')
  const index = client.index<T>(uid)
  if (settings) expect((await index.updateSettings(settings).waitTask()).status).toBe('succeeded')
  return index
}

/** The error body of a rejected SDK call. */
async function apiError(call: Promise<unknown>): Promise<{ status: number; message: string; code: string; type: string; link: string }> {
  try {
    await call
  } catch (error) {
    if (error instanceof MeilisearchApiError && error.cause) return { status: error.response.status, ...error.cause }
    throw error
  }
  throw new Error('expected the engine to refuse the request')
}

const ids = (hits: Array<{ id: string }>): string[] => hits.map((hit) => hit.id).sort()
const expectedIds = (predicate: (firing: FiringDocument) => boolean): string[] =>
  FIRINGS.filter(predicate)
    .map((firing) => firing.id)
    .sort()

beforeAll(async () => {
  if (!externalHost) engine = await startSearchEngine({ port: 0, masterKey: apiKey })
  client = new Meilisearch({ host: externalHost ?? engine!.url, apiKey })
})

afterAll(async () => {
  for (const uid of createdIndexes) await client.deleteIndex(uid).waitTask()
  await engine?.close()
})

describe('engine basics', () => {
  it('reports itself available', async () => {
    expect(await client.health()).toEqual({ status: 'available' })
    expect(await client.isHealthy()).toBe(true)
  })

  it('answers a version object', async () => {
    const version = await client.getVersion()
    expect(typeof version.pkgVersion).toBe('string')
    expect(typeof version.commitSha).toBe('string')
  })
})

describe('tasks', () => {
  it('enqueues an index creation and reports it succeeded with the task timeline', async () => {
    const uid = indexName('tasks')
    createdIndexes.push(uid)
    const enqueued = await client.createIndex(uid, { primaryKey: 'id' })
    expect(enqueued).toMatchObject({ indexUid: uid, status: 'enqueued', type: 'indexCreation' })
    expect(typeof enqueued.taskUid).toBe('number')

    const task: Task = await client.tasks.waitForTask(enqueued.taskUid)
    expect(task).toMatchObject({ uid: enqueued.taskUid, indexUid: uid, status: 'succeeded', type: 'indexCreation', error: null })
    expect(task.details).toMatchObject({ primaryKey: 'id' })
    const enqueuedAt = Date.parse(task.enqueuedAt)
    const startedAt = Date.parse(task.startedAt!)
    const finishedAt = Date.parse(task.finishedAt!)
    expect(enqueuedAt).toBeLessThanOrEqual(startedAt)
    expect(startedAt).toBeLessThanOrEqual(finishedAt)
    expect(task.duration).toMatch(/^PT\d+(\.\d+)?S$/)

    const fetched = await client.tasks.getTask(enqueued.taskUid)
    expect(fetched.status).toBe('succeeded')
    const listed = await client.tasks.getTasks({ indexUids: [uid] })
    expect(listed.results.map((listedTask) => listedTask.uid)).toContain(enqueued.taskUid)
  })

  it('fails a second creation of the same index with index_already_exists', async () => {
    const uid = indexName('tasks')
    const task = await client.createIndex(uid).waitTask()
    expect(task.status).toBe('failed')
    expect(task.error).toMatchObject({ code: 'index_already_exists', type: 'invalid_request' })
    expect(task.error!.message).toContain(uid)
  })

  it('fails a document without its primary key with missing_document_id', async () => {
    const index = client.index(indexName('tasks'))
    const task = await index.addDocuments([{ title: 'no id here' }]).waitTask()
    expect(task.status).toBe('failed')
    expect(task.type).toBe('documentAdditionOrUpdate')
    expect(task.error?.code).toBe('missing_document_id')
  })

  it('fails a document whose id has a space with invalid_document_id', async () => {
    const index = client.index(indexName('tasks'))
    const task = await index.addDocuments([{ id: 'not valid', title: 'bad id' }]).waitTask()
    expect(task.status).toBe('failed')
    expect(task.error?.code).toBe('invalid_document_id')
  })

  it('infers a primary key ending in "id" from the first document', async () => {
    const uid = indexName('inferred')
    createdIndexes.push(uid)
    const task = await client
      .index(uid)
      .addDocuments([{ firingId: 'a1', title: 'Bisque' }])
      .waitTask()
    expect(task.status).toBe('succeeded')
    expect(await client.index(uid).fetchPrimaryKey()).toBe('firingId')
  })
})

describe('indexes and settings', () => {
  it('lists and reads indexes', async () => {
    const uid = indexName('tasks')
    const list = await client.getIndexes({ limit: 1000 })
    expect(list.results.map((listed) => listed.uid)).toContain(uid)
    const raw = await client.getRawIndex(uid)
    expect(raw).toMatchObject({ uid, primaryKey: 'id' })
    expect(Number.isNaN(Date.parse(raw.createdAt))).toBe(false)
  })

  it('updates and resets single settings through their own routes', async () => {
    const index = client.index(indexName('tasks'))
    expect((await index.updateFilterableAttributes(['kind', 'cone']).waitTask()).type).toBe('settingsUpdate')
    expect([...((await index.getFilterableAttributes()) as string[])].sort()).toEqual(['cone', 'kind'])
    await index.updateSortableAttributes(['priceCents']).waitTask()
    expect(await index.getSortableAttributes()).toEqual(['priceCents'])
    const rules = ['sort', 'words', 'typo', 'proximity', 'attribute', 'exactness']
    await index.updateRankingRules(rules).waitTask()
    expect(await index.getRankingRules()).toEqual(rules)
    await index.updateSearchableAttributes(['title']).waitTask()
    expect(await index.getSearchableAttributes()).toEqual(['title'])
    await index.resetFilterableAttributes().waitTask()
    expect(await index.getFilterableAttributes()).toEqual([])
  })

  it('shows only the displayed attributes in hits', async () => {
    const index = client.index(indexName('tasks'))
    await index.updateDisplayedAttributes(['id', 'title']).waitTask()
    await index.addDocuments([{ id: 'd1', title: 'Cone 6 glaze load', crewNote: 'internal only' }]).waitTask()
    const result = await index.search('glaze')
    expect(result.hits).toEqual([{ id: 'd1', title: 'Cone 6 glaze load' }])
  })

  it('refuses an unknown ranking rule at once with invalid_settings_ranking_rules', async () => {
    const error = await apiError(client.index(indexName('tasks')).updateRankingRules(['closest']))
    expect(error).toMatchObject({ status: 400, code: 'invalid_settings_ranking_rules' })
  })
})

describe('search over the firing fixture', () => {
  let index: Index<FiringDocument>

  beforeAll(async () => {
    index = await freshIndex<FiringDocument>('firings', {
      searchableAttributes: ['title', 'studioName'],
      filterableAttributes: FILTERABLE,
      sortableAttributes: SORTABLE,
    })
    const task = await index.addDocuments(FIRINGS).waitTask()
    expect(task).toMatchObject({ status: 'succeeded', details: { receivedDocuments: FIRINGS.length, indexedDocuments: FIRINGS.length } })
  })

  it('keeps the settings it was given', async () => {
    const settings = await index.getSettings()
    expect([...(settings.filterableAttributes as string[])].sort()).toEqual([...FILTERABLE].sort())
    expect([...settings.sortableAttributes!].sort()).toEqual([...SORTABLE].sort())
    expect(settings.searchableAttributes).toEqual(['title', 'studioName'])
    // Meilisearch settings reference: default ranking rules and typo sizes.
    expect(settings.rankingRules).toEqual(['words', 'typo', 'proximity', 'attribute', 'sort', 'exactness'])
    expect(settings.typoTolerance?.minWordSizeForTypos).toEqual({ oneTypo: 5, twoTypos: 9 })
  })

  it('returns every document for an empty query, with the engine pagination fields', async () => {
    const result = await index.search('')
    expect(ids(result.hits as FiringDocument[])).toEqual(expectedIds(() => true))
    expect(result).toMatchObject({ query: '', limit: 20, offset: 0, estimatedTotalHits: FIRINGS.length })
    expect(typeof result.processingTimeMs).toBe('number')
  })

  const filterCases: Array<[string, string | Array<string | string[]>, (firing: FiringDocument) => boolean]> = [
    ['= on a string, case-insensitive', 'atmosphere = REDUCTION', (f) => f.atmosphere === 'reduction'],
    ['= on a quoted value with spaces', 'studioName = "ember lane studio"', (f) => f.studioName === 'Ember Lane Studio'],
    ['= on a single-quoted value', "studioName = 'Kirkgate Pottery'", (f) => f.studioName === 'Kirkgate Pottery'],
    ['!=', 'cone != 10', (f) => f.cone !== '10'],
    ['>', 'priceCents > 4100', (f) => f.priceCents > 4100],
    ['>=', 'priceCents >= 4100', (f) => f.priceCents >= 4100],
    ['<', 'priceCents < 3200', (f) => f.priceCents < 3200],
    ['<=', 'priceCents <= 3200', (f) => f.priceCents <= 3200],
    ['>= on a decimal', 'spaceLeftL >= 12.5', (f) => f.spaceLeftL >= 12.5],
    [
      'TO (inclusive on both ends)',
      'usableHeightMm 420 TO 600',
      (f) => f.usableHeightMm !== undefined && f.usableHeightMm >= 420 && f.usableHeightMm <= 600,
    ],
    ['IN', 'cone IN [6, "04"]', (f) => f.cone === '6' || f.cone === '04'],
    ['NOT IN', 'cone NOT IN [10]', (f) => f.cone !== '10'],
    ['EXISTS (null and empty values exist)', 'crewNote EXISTS', (f) => 'crewNote' in f],
    ['NOT EXISTS', 'crewNote NOT EXISTS', (f) => !('crewNote' in f)],
    ['IS NULL', 'crewNote IS NULL', (f) => f.crewNote === null],
    ['IS NOT NULL (missing attribute included)', 'crewNote IS NOT NULL', (f) => f.crewNote !== null],
    ['IS EMPTY on an empty string', 'crewNote IS EMPTY', (f) => f.crewNote === ''],
    ['IS EMPTY on an empty array', 'tags IS EMPTY', (f) => f.tags.length === 0],
    ['= on an array attribute, element-wise', 'tags = gas', (f) => f.tags.includes('gas')],
    ['NOT with an array attribute', 'NOT tags = electric', (f) => !f.tags.includes('electric')],
    ['AND', 'atmosphere = oxidation AND kind = glaze', (f) => f.atmosphere === 'oxidation' && f.kind === 'glaze'],
    ['OR', 'cone = 04 OR tags = crystalline', (f) => f.cone === '04' || f.tags.includes('crystalline')],
    [
      'AND binds tighter than OR',
      'kind = bisque OR cone = 10 AND atmosphere = reduction',
      (f) => f.kind === 'bisque' || (f.cone === '10' && f.atmosphere === 'reduction'),
    ],
    [
      'parentheses',
      '(cone = 6 OR cone = 10) AND atmosphere = reduction',
      (f) => (f.cone === '6' || f.cone === '10') && f.atmosphere === 'reduction',
    ],
    [
      'NOT applies to the next condition only',
      'NOT cone = 10 AND atmosphere = oxidation',
      (f) => f.cone !== '10' && f.atmosphere === 'oxidation',
    ],
    [
      'array form: outer AND, inner OR',
      [['cone = 6', 'cone = 10'], 'atmosphere = oxidation'],
      (f) => (f.cone === '6' || f.cone === '10') && f.atmosphere === 'oxidation',
    ],
  ]

  it.each(filterCases)('filters with %s', async (_name, filter, predicate) => {
    const result = await index.search('', { filter, limit: 50 })
    expect(ids(result.hits as FiringDocument[])).toEqual(expectedIds(predicate))
    expect(result.estimatedTotalHits).toBe(expectedIds(predicate).length)
  })

  it('filters through GET search as well', async () => {
    const result = await index.searchGet('', { filter: 'kind = bisque', limit: 50 })
    expect(ids(result.hits as FiringDocument[])).toEqual(expectedIds((f) => f.kind === 'bisque'))
  })

  it('keeps firings inside _geoRadius, measured as geolib measures', async () => {
    const radius = 80_000
    const inside = expectedIds((f) => engineDistance(STOKE, f._geo) <= radius)
    // The fixture keeps every firing at least 10 km away from the circle, so rounding cannot flip one.
    for (const firing of FIRINGS) expect(Math.abs(engineDistance(STOKE, firing._geo) - radius)).toBeGreaterThan(10_000)
    const result = await index.search('', { filter: `_geoRadius(${STOKE.lat}, ${STOKE.lng}, ${radius})`, limit: 50 })
    expect(ids(result.hits as FiringDocument[])).toEqual(inside)
    expect(inside.length).toBeGreaterThan(1)
  })

  it('keeps firings inside _geoBoundingBox([top-right], [bottom-left])', async () => {
    const north = 53.6
    const east = -1.0
    const south = 52.8
    const west = -2.5
    const box = [
      { lat: north, lng: west },
      { lat: north, lng: east },
      { lat: south, lng: east },
      { lat: south, lng: west },
    ]
    const result = await index.search('', { filter: `_geoBoundingBox([${north}, ${east}], [${south}, ${west}])`, limit: 50 })
    const inside = expectedIds((f) => isPointInPolygon(f._geo, box))
    expect(ids(result.hits as FiringDocument[])).toEqual(inside)
    expect(inside.length).toBeGreaterThan(1)
  })

  it('sorts by _geoPoint and reports _geoDistance in metres', async () => {
    const result = await index.search('', { sort: [`_geoPoint(${STOKE.lat}, ${STOKE.lng}):asc`], limit: 50 })
    const hits = result.hits as Array<FiringDocument & { _geoDistance: number }>
    const nearestFirst = [...FIRINGS].sort((a, b) => engineDistance(STOKE, a._geo) - engineDistance(STOKE, b._geo)).map((f) => f.id)
    expect(hits.map((hit) => hit.id)).toEqual(nearestFirst)
    for (const hit of hits) {
      expect(Number.isInteger(hit._geoDistance)).toBe(true)
      expect(Math.abs(hit._geoDistance - engineDistance(STOKE, hit._geo))).toBeLessThanOrEqual(1)
    }
  })

  it('sorts farthest first with :desc', async () => {
    const result = await index.search('', { sort: [`_geoPoint(${STOKE.lat}, ${STOKE.lng}):desc`], limit: 1 })
    const farthest = [...FIRINGS].sort((a, b) => engineDistance(STOKE, b._geo) - engineDistance(STOKE, a._geo))[0]
    expect((result.hits[0] as FiringDocument).id).toBe(farthest.id)
  })

  it('combines a geo filter with a geo sort', async () => {
    const radius = 80_000
    const result = await index.search('', {
      filter: [`_geoRadius(${STOKE.lat}, ${STOKE.lng}, ${radius})`, 'kind = glaze'],
      sort: [`_geoPoint(${STOKE.lat}, ${STOKE.lng}):asc`],
    })
    const expected = FIRINGS.filter((f) => f.kind === 'glaze' && engineDistance(STOKE, f._geo) <= radius)
      .sort((a, b) => engineDistance(STOKE, a._geo) - engineDistance(STOKE, b._geo))
      .map((f) => f.id)
    expect((result.hits as FiringDocument[]).map((hit) => hit.id)).toEqual(expected)
  })

  it('sorts by an attribute, documents without it last', async () => {
    const ascending = await index.search('', { sort: ['usableHeightMm:asc'], limit: 50 })
    const withHeight = FIRINGS.filter((f) => f.usableHeightMm !== undefined).sort((a, b) => a.usableHeightMm! - b.usableHeightMm!)
    const withoutHeight = FIRINGS.filter((f) => f.usableHeightMm === undefined)
    expect((ascending.hits as FiringDocument[]).map((hit) => hit.id)).toEqual([...withHeight, ...withoutHeight].map((f) => f.id))

    const descending = await index.search('', { sort: ['priceCents:desc'], limit: 50 })
    expect((descending.hits as FiringDocument[]).map((hit) => hit.id)).toEqual(
      [...FIRINGS].sort((a, b) => b.priceCents - a.priceCents).map((f) => f.id),
    )
  })

  it('counts facet values and gives min/max for numbers', async () => {
    const result = await index.search('', { filter: 'atmosphere = oxidation', facets: ['cone', 'tags', 'priceCents'] })
    const oxidation = FIRINGS.filter((f) => f.atmosphere === 'oxidation')
    const count = (values: string[]) =>
      values.reduce<Record<string, number>>((counts, value) => ({ ...counts, [value]: (counts[value] ?? 0) + 1 }), {})
    expect(result.facetDistribution?.cone).toEqual(count(oxidation.map((f) => f.cone)))
    expect(result.facetDistribution?.tags).toEqual(count(oxidation.flatMap((f) => f.tags)))
    const prices = oxidation.map((f) => f.priceCents)
    expect(result.facetStats?.priceCents).toEqual({ min: Math.min(...prices), max: Math.max(...prices) })
    expect(result.facetStats?.cone).toBeUndefined()
  })

  it('pages with limit and offset', async () => {
    const byPrice = [...FIRINGS].sort((a, b) => a.priceCents - b.priceCents).map((f) => f.id)
    const result = await index.search('', { sort: ['priceCents:asc'], limit: 3, offset: 2 })
    expect((result.hits as FiringDocument[]).map((hit) => hit.id)).toEqual(byPrice.slice(2, 5))
    expect(result).toMatchObject({ limit: 3, offset: 2, estimatedTotalHits: FIRINGS.length })
  })

  it('pages with hitsPerPage and page, with exhaustive totals', async () => {
    const byPrice = [...FIRINGS].sort((a, b) => a.priceCents - b.priceCents).map((f) => f.id)
    const result = await index.search('', { sort: ['priceCents:asc'], hitsPerPage: 3, page: 3 })
    expect((result.hits as FiringDocument[]).map((hit) => hit.id)).toEqual(byPrice.slice(6, 9))
    expect(result).toMatchObject({ hitsPerPage: 3, page: 3, totalPages: Math.ceil(FIRINGS.length / 3), totalHits: FIRINGS.length })
  })

  it('returns only the attributes asked for', async () => {
    const result = await index.search('', { filter: 'cone = 04', attributesToRetrieve: ['id', 'cone'] })
    for (const hit of result.hits) expect(Object.keys(hit).sort()).toEqual(['cone', 'id'])
  })

  describe('text relevance and typo tolerance', () => {
    const withWord = (word: string) => expectedIds((f) => `${f.title} ${f.studioName}`.toLowerCase().split(/\W+/).includes(word))

    it('matches the exact word', async () => {
      const result = await index.search('porcelain')
      expect(ids(result.hits as FiringDocument[])).toEqual(withWord('porcelain'))
    })

    // Meilisearch typo tolerance docs: words of 5 to 8 letters accept one typo.
    it('finds "stoneware" when searching "stonware"', async () => {
      const result = await index.search('stonware')
      expect(ids(result.hits as FiringDocument[])).toEqual(withWord('stoneware'))
      expect(result.hits.length).toBeGreaterThan(0)
    })

    it('finds "porcelain" when searching "porcelian"', async () => {
      const result = await index.search('porcelian')
      expect(ids(result.hits as FiringDocument[])).toEqual(withWord('porcelain'))
    })

    // Same docs: words shorter than 5 letters accept no typo.
    it('does not correct a four-letter word', async () => {
      const result = await index.search('kiln')
      expect(result.hits.length).toBeGreaterThan(0)
      expect((await index.search('kilm')).hits).toEqual([])
    })

    // A four-letter prefix gets no typo, so only words starting with it match.
    it('matches a prefix of the last word', async () => {
      const result = await index.search('cand')
      expect(ids(result.hits as FiringDocument[])).toEqual(withWord('candling'))
    })

    it('ranks documents with every query word before documents with fewer', async () => {
      const result = await index.search('reduction porcelain')
      expect((result.hits[0] as FiringDocument).id).toBe('f4')
    })

    it('combines the query with a filter', async () => {
      const result = await index.search('stoneware', { filter: 'cone = 10' })
      expect(ids(result.hits as FiringDocument[])).toEqual(
        expectedIds((f) => f.cone === '10' && f.title.toLowerCase().includes('stoneware')),
      )
    })
  })

  describe('errors in the engine shape', () => {
    it('refuses a filter on an attribute that is not filterable, naming it and listing the filterable ones', async () => {
      const error = await apiError(index.search('', { filter: 'title = porcelain' }))
      expect(error).toMatchObject({ status: 400, code: 'invalid_search_filter', type: 'invalid_request' })
      expect(error.link).toContain('invalid_search_filter')
      expect(error.message).toContain('Attribute `title` is not filterable.')
      const available = error.message.slice(error.message.indexOf('Available'))
      for (const attribute of FILTERABLE) expect(available).toContain(attribute)
    })

    it('refuses a malformed filter with a positioned message', async () => {
      const error = await apiError(index.search('', { filter: 'cone = ' }))
      expect(error).toMatchObject({ status: 400, code: 'invalid_search_filter' })
      expect(error.message).toBe('Was expecting a value but instead got nothing.\n8:8 cone = ')
    })

    it('refuses a sort on an attribute that is not sortable', async () => {
      const error = await apiError(index.search('', { sort: ['title:asc'] }))
      expect(error).toMatchObject({ status: 400, code: 'invalid_search_sort' })
      expect(error.message).toContain('Attribute `title` is not sortable.')
    })

    it('refuses facets on an attribute that is not filterable', async () => {
      const error = await apiError(index.search('', { facets: ['title'] }))
      expect(error).toMatchObject({ status: 400, code: 'invalid_search_facets' })
      expect(error.message).toContain('`title`')
    })

    it('answers index_not_found for an unknown index', async () => {
      const uid = indexName('never_created')
      const error = await apiError(client.index(uid).search(''))
      expect(error).toMatchObject({ status: 404, code: 'index_not_found', type: 'invalid_request', message: `Index \`${uid}\` not found.` })
      // Deleting it is accepted as a task, which then fails.
      const deletion = await client.deleteIndex(uid).waitTask()
      expect(deletion).toMatchObject({ status: 'failed', type: 'indexDeletion' })
      expect(deletion.error?.code).toBe('index_not_found')
    })

    it('answers document_not_found for an unknown document', async () => {
      const error = await apiError(index.getDocument('no_such_firing'))
      expect(error).toMatchObject({ status: 404, code: 'document_not_found' })
    })

    it.skipIf(!apiKey)('refuses a wrong API key with invalid_api_key', async () => {
      const wrongKey = new Meilisearch({ host: externalHost ?? engine!.url, apiKey: 'not-the-key-0123456789' })
      expect(await apiError(wrongKey.getIndexes())).toMatchObject({ status: 403, code: 'invalid_api_key', type: 'auth' })
    })

    it.skipIf(!apiKey)('refuses a request without a key with missing_authorization_header', async () => {
      const noKey = new Meilisearch({ host: externalHost ?? engine!.url })
      expect(await apiError(noKey.getIndexes())).toMatchObject({ status: 401, code: 'missing_authorization_header', type: 'auth' })
      expect(await noKey.health()).toEqual({ status: 'available' })
    })
  })
})

describe('document lifecycle', () => {
  let index: Index<Record<string, unknown>>

  beforeAll(async () => {
    index = await freshIndex<Record<string, unknown>>('lifecycle', { filterableAttributes: ['cone', 'kind'] })
    expect((await index.addDocuments(FIRINGS).waitTask()).status).toBe('succeeded')
  })

  it('reads one document and lists them with a total', async () => {
    const firing = await index.getDocument('f2', { fields: ['id', 'title'] })
    expect(firing).toEqual({ id: 'f2', title: FIRINGS[1].title })
    const page = await index.getDocuments({ limit: 3 })
    expect(page.results).toHaveLength(3)
    expect(page.total).toBe(FIRINGS.length)
  })

  it('merges fields with updateDocuments and replaces with addDocuments', async () => {
    expect((await index.updateDocuments([{ id: 'f2', priceCents: 3300 }]).waitTask()).status).toBe('succeeded')
    expect(await index.getDocument('f2')).toMatchObject({ id: 'f2', priceCents: 3300, title: FIRINGS[1].title })
    expect((await index.addDocuments([{ id: 'f2', title: 'Replaced' }]).waitTask()).status).toBe('succeeded')
    expect(await index.getDocument('f2')).toEqual({ id: 'f2', title: 'Replaced' })
  })

  it('deletes one document', async () => {
    const task = await index.deleteDocument('f1').waitTask()
    expect(task).toMatchObject({ status: 'succeeded', type: 'documentDeletion', details: { providedIds: 1, deletedDocuments: 1 } })
    expect((await apiError(index.getDocument('f1'))).code).toBe('document_not_found')
  })

  it('deletes a batch of documents by id', async () => {
    const task = await index.deleteDocuments(['f3', 'f4', 'no_such_id']).waitTask()
    expect(task).toMatchObject({ status: 'succeeded', details: { providedIds: 3, deletedDocuments: 2 } })
    const remaining = await index.search('', { limit: 50 })
    expect(ids(remaining.hits as FiringDocument[])).toEqual(['f2', 'f5', 'f6', 'f7', 'f8'])
  })

  it('deletes the documents a filter selects', async () => {
    const task = await index.deleteDocuments({ filter: 'kind = bisque' }).waitTask()
    expect(task).toMatchObject({ status: 'succeeded', details: { deletedDocuments: 1 } })
    const remaining = await index.search('', { limit: 50 })
    expect(ids(remaining.hits as FiringDocument[])).toEqual(['f2', 'f5', 'f7', 'f8'])
  })

  it('deletes all documents', async () => {
    expect((await index.deleteAllDocuments().waitTask()).status).toBe('succeeded')
    expect((await index.search('')).hits).toEqual([])
    expect((await index.getStats()).numberOfDocuments).toBe(0)
  })
})
