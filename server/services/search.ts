import {
  distanceKm,
  ensureFiringsIndex,
  engineFilter,
  engineSort,
  FIRING_FACETS,
  firingsIndex,
  firingsIndexCreatedAt,
  forgetFiringsIndex,
  searchPostgres,
  searchStudiosPostgres,
  type FiringDocument,
  type FiringSearch,
} from '../../search/public'
import type { BoardResponse } from '../../shared/api/board'
import type { Atmosphere, Piece } from '../../shared/firing/check'
import { quoteRequest } from '../../shared/firing/quote'
import { DEFAULT_RADIUS_KM, type SearchHit, type SearchQuery, type SearchResponse } from '../../shared/schemas/search'
import { FIRINGS_PER_STUDIO, groupByStudio, pieceOfSearch, type BoardHit } from '../../shared/search/board'
import { outageLog, type AppContext } from '../context'
import { badRequest, isDatabaseUnavailable } from '../http/errors'
import { lookupPlace } from './gazetteer'
import { runWaitingJobsNow } from '../jobs/queue'
import { poolOf } from '../jobs/worker'
import { enqueueReindex, REINDEX_TASK, SYNC_STUDIO_TASK } from './search-sync'

/**
 * What this process knows of the engine. Searches go to it only while `up`; `down` (unreachable, or
 * refusing our writes) and `rebuilding` (its copy is being rebuilt from PostgreSQL) answer from
 * PostgreSQL, marked degraded. Only the monitor below moves the state back to `up`.
 */
type EngineState = 'up' | 'down' | 'rebuilding'
let engine: EngineState = 'up'
/** When the engine's index was created, as last seen: a different value means it was made anew. */
let knownIndexCreatedAt: string | null = null
let outage: ReturnType<typeof outageLog> | null = null
const outageOf = (ctx: AppContext) => (outage ??= outageLog(ctx.log, 'the search engine'))

/** Called by a process that queues the full rebuild (on start); the monitor sees it through. */
export function engineRebuildStarted() {
  engine = 'rebuilding'
}

/** The full rebuild has run in this process: searches go to the engine again. */
export function engineRebuilt() {
  engine = 'up'
}

export function engineIsUp() {
  return engine === 'up'
}

/** The engine failed a search or a write: answer from PostgreSQL until the monitor finds it well. */
export function engineFailed(ctx: AppContext, error: unknown) {
  if (engine !== 'rebuilding') engine = 'down'
  outageOf(ctx).failed(error)
}

async function rebuildPending(ctx: AppContext) {
  const rows: unknown[] = await ctx.db.query(`SELECT 1 FROM graphile_worker.jobs WHERE task_identifier = $1 LIMIT 1`, [REINDEX_TASK])
  return rows.length > 0
}

/**
 * One look at the engine: is it there, and is its index the one we filled? An engine back with its
 * data gets the updates it missed (the waiting sync jobs run now); one back empty, or with an index
 * made anew, gets the index and its settings re-created and a full rebuild from PostgreSQL.
 */
export async function checkSearchEngine(ctx: AppContext): Promise<EngineState> {
  let createdAt: string | null
  try {
    createdAt = await firingsIndexCreatedAt(ctx.config)
  } catch (error) {
    engineFailed(ctx, error)
    return engine
  }
  if (createdAt === null || (knownIndexCreatedAt !== null && createdAt !== knownIndexCreatedAt)) {
    const hadIndex = knownIndexCreatedAt !== null
    forgetFiringsIndex(ctx.config)
    await ensureFiringsIndex(ctx.config)
    knownIndexCreatedAt = await firingsIndexCreatedAt(ctx.config)
    await ctx.db.transaction((manager) => enqueueReindex(manager))
    // The first index this process sees may be one it just created; only a lost one is news.
    if (engine === 'down' || hadIndex) {
      outageOf(ctx).failed(new Error('its index is missing or new'))
      outageOf(ctx).recovered('index and settings re-created; rebuilding from PostgreSQL')
    }
    engine = 'rebuilding'
    return engine
  }
  knownIndexCreatedAt = createdAt
  if (engine === 'down') {
    const replayed = (await runWaitingJobsNow(ctx.db, SYNC_STUDIO_TASK)) + (await runWaitingJobsNow(ctx.db, REINDEX_TASK))
    engine = (await rebuildPending(ctx)) ? 'rebuilding' : 'up'
    outageOf(ctx).recovered(`its data is there; ${replayed} waiting update(s) replayed`)
  } else if (engine === 'rebuilding' && !(await rebuildPending(ctx))) {
    engine = 'up'
  }
  return engine
}

/** Looks at the engine every `intervalMs` (within 30 s of it coming back). Returns the stop. */
export function monitorSearchEngine(ctx: AppContext, intervalMs = 10_000): () => void {
  let running = false
  const timer = setInterval(() => {
    if (running) return
    running = true
    checkSearchEngine(ctx)
      // The database being away is logged where requests meet it; anything else is worth a line.
      .catch((error) => isDatabaseUnavailable(error) || ctx.log.warn(`search engine check failed: ${(error as Error).message}`))
      .finally(() => (running = false))
  }, intervalMs)
  timer.unref()
  return () => clearInterval(timer)
}

export function toHit(doc: FiringDocument, origin: { lat: number; lng: number } | null): SearchHit {
  return {
    firingId: doc.id,
    studio: {
      id: doc.studioId,
      name: doc.studioName,
      lat: doc._geo.lat,
      lng: doc._geo.lng,
      city: doc.studioCity,
      region: doc.studioRegion,
      verified: doc.verified,
    },
    kiln: {
      id: doc.kilnId,
      name: doc.kilnName,
      kind: doc.kilnKind,
      minCone: doc.kilnMinCone,
      maxCone: doc.kilnMaxCone,
      atmospheres: doc.kilnAtmospheres,
      usableHeightMm: doc.usableHeightMm,
      shelf: { shape: doc.shelfShape, diameterMm: doc.shelfDiameterMm, widthMm: doc.shelfWidthMm, depthMm: doc.shelfDepthMm },
    },
    cone: doc.cone,
    atmosphere: doc.atmosphere,
    kind: doc.kind,
    dropOffBy: doc.dropOffBy,
    firingDate: doc.firingDate,
    readyBy: doc.readyBy,
    space: { shelvesLeft: doc.spaceLeftShelves, shelvesTotal: doc.shelvesTotal, tallestMm: doc.roomTallestMm },
    distanceKm: origin ? Math.round(distanceKm(origin, doc._geo) * 10) / 10 : null,
    priceExample:
      doc.priceExampleCents !== null ? { label: doc.priceExampleLabel!, totalCents: doc.priceExampleCents, currency: doc.currency } : null,
    reviews: doc.reviewCount > 0 ? { fireAgain: doc.reviewFireAgain, count: doc.reviewCount } : null,
  }
}

function resolveOrigin(query: SearchQuery): SearchResponse['origin'] {
  if (query.near) return { lat: query.near[0], lng: query.near[1], label: `${query.near[0]}, ${query.near[1]}` }
  if (query.place) {
    const place = lookupPlace(query.place)
    if (!place)
      throw badRequest(
        'We could not find that place.',
        { place: `We do not know “${query.place}”. Try a town and state, or a ZIP code.` },
        'unknown-place',
      )
    return { lat: place.lat, lng: place.lng, label: place.label }
  }
  return null
}

export function toFiringSearch(query: SearchQuery, origin: SearchResponse['origin'], now = new Date()): FiringSearch {
  const seconds = (d: Date) => Math.floor(d.getTime() / 1000)
  return {
    origin: origin ? { lat: origin.lat, lng: origin.lng } : null,
    radiusKm: origin ? (query.radiusKm ?? DEFAULT_RADIUS_KM) : null,
    cone: query.cone ?? null,
    atmosphere: query.atmosphere ?? null,
    kind: query.kind ?? null,
    dropOffFrom: query.from ? seconds(query.from) : null,
    // A date without a time means the whole of that day.
    dropOffTo: query.to ? seconds(query.to) + (query.to.getUTCHours() === 0 && query.to.getUTCMinutes() === 0 ? 86_399 : 0) : null,
    now: seconds(now),
    fits: { heightMm: query.fitsHeightMm ?? null, widthMm: query.fitsWidthMm ?? null, depthMm: query.fitsDepthMm ?? null },
    q: query.q || null,
    sort: query.sort ?? (origin ? 'distance' : 'soonest'),
    page: query.page,
    perPage: query.perPage,
  }
}

async function searchEngine(ctx: AppContext, search: FiringSearch) {
  const result = await firingsIndex(ctx.config).search(search.q ?? '', {
    filter: engineFilter(search),
    sort: engineSort(search),
    page: search.page,
    hitsPerPage: search.perPage,
    facets: [...FIRING_FACETS],
  })
  return {
    documents: result.hits as FiringDocument[],
    total: result.totalHits ?? 0,
    facets: (result.facetDistribution ?? {}) as Record<string, Record<string, number>>,
  }
}

/**
 * Asks the engine; when it cannot be reached (or errs), answers from PostgreSQL and says so with
 * `degraded: true`.
 */
async function engineOrPostgres<T>(ctx: AppContext, askEngine: () => Promise<T>, postgres: () => Promise<T>) {
  let degraded = engine !== 'up'
  if (!degraded) {
    try {
      return { found: await askEngine(), degraded }
    } catch (error) {
      degraded = true
      engineFailed(ctx, error)
    }
  }
  return { found: await postgres(), degraded }
}

/** Open upcoming firings matching the potter's needs, one hit per firing. */
export async function searchFirings(ctx: AppContext, query: SearchQuery): Promise<SearchResponse> {
  const origin = resolveOrigin(query)
  const search = toFiringSearch(query, origin)
  const { found, degraded } = await engineOrPostgres(
    ctx,
    () => searchEngine(ctx, search),
    () => searchPostgres(poolOf(ctx), search),
  )
  const facets = Object.fromEntries(FIRING_FACETS.map((f) => [f, found.facets[f] ?? {}]))
  return {
    hits: found.documents.map((doc) => toHit(doc, search.origin)),
    total: found.total,
    page: search.page,
    perPage: search.perPage,
    degraded,
    origin,
    facets,
  }
}

/** Enough for a page of 50 studios with a few months of firings each; `counts` says what lies beyond. */
const BOARD_FIRINGS_FETCHED = 1000

/**
 * The board through the engine: a page of studios by `distinct` on the studio (each stands where its
 * best firing ranks, and the total counts studios), beside the facets and firing count of the whole
 * search; then the firings of those studios, with their counts as a facet.
 */
async function boardEngine(ctx: AppContext, search: FiringSearch) {
  const index = firingsIndex(ctx.config)
  const filter = engineFilter(search)
  const sort = engineSort(search)
  const q = search.q ?? ''
  const [studioPage, whole] = await Promise.all([
    index.search(q, {
      filter,
      sort,
      page: search.page,
      hitsPerPage: search.perPage,
      distinct: 'studioId',
      attributesToRetrieve: ['studioId'],
    }),
    index.search(q, { filter, page: 1, hitsPerPage: 0, facets: [...FIRING_FACETS] }),
  ])
  const studioIds = studioPage.hits.map((hit) => hit.studioId)
  const firings = studioIds.length
    ? await index.search(q, {
        filter: [...filter, `studioId IN [${studioIds.map((id) => JSON.stringify(id)).join(', ')}]`],
        sort,
        page: 1,
        hitsPerPage: BOARD_FIRINGS_FETCHED,
        facets: ['studioId'],
      })
    : null
  return {
    studioIds,
    counts: new Map(Object.entries(firings?.facetDistribution?.studioId ?? {})),
    documents: (firings?.hits ?? []) as FiringDocument[],
    total: studioPage.totalHits ?? 0,
    firingTotal: whole.totalHits ?? 0,
    facets: (whole.facetDistribution ?? {}) as Record<string, Record<string, number>>,
  }
}

/** The shared quote for the potter's piece at this firing; null without a price list or a piece. */
export function piecePriceAt(doc: FiringDocument, piece: Piece | null): BoardHit['piecePrice'] {
  if (!piece || !doc.priceList || !doc.quoteKiln) return null
  try {
    const quote = quoteRequest(doc.priceList, { atmosphere: doc.atmosphere as Atmosphere, slowCool: doc.slowCool }, [piece], doc.quoteKiln)
    return { totalCents: quote.totalCents, currency: quote.currency }
  } catch (error) {
    // A price list the quote cannot read (a shelf price without a shelf) prices nothing rather than fail the page.
    if (error instanceof RangeError) return null
    throw error
  }
}

/** The firing board: studios that have a matching firing, a page of them, each with its firings. */
export async function searchBoard(ctx: AppContext, query: SearchQuery): Promise<BoardResponse> {
  const origin = resolveOrigin(query)
  const search = toFiringSearch(query, origin)
  const { found, degraded } = await engineOrPostgres(
    ctx,
    () => boardEngine(ctx, search),
    () => searchStudiosPostgres(poolOf(ctx), search, FIRINGS_PER_STUDIO),
  )
  const piece = pieceOfSearch(search.fits)
  const hits = found.documents.map((doc) => ({ ...toHit(doc, search.origin), piecePrice: piecePriceAt(doc, piece) }))
  return {
    studios: groupByStudio(found.studioIds, hits, found.counts),
    total: found.total,
    firingTotal: found.firingTotal,
    page: search.page,
    perPage: search.perPage,
    degraded,
    origin,
    facets: Object.fromEntries(FIRING_FACETS.map((f) => [f, found.facets[f] ?? {}])),
    piece: piece ? { heightMm: piece.heightMm, widthMm: piece.widthMm, depthMm: search.fits.depthMm } : null,
  }
}
