import { MeilisearchApiError } from 'meilisearch'
import {
  distanceKm,
  engineFilter,
  engineSort,
  FIRING_FACETS,
  firingsIndex,
  searchPostgres,
  type FiringDocument,
  type FiringSearch,
} from '../../search/public'
import { DEFAULT_RADIUS_KM, type SearchHit, type SearchQuery, type SearchResponse } from '../../shared/schemas/search'
import type { AppContext } from '../context'
import { badRequest } from '../http/errors'
import { lookupPlace } from './gazetteer'
import { poolOf } from '../jobs/worker'

/** After the engine fails, searches go straight to PostgreSQL for this long before trying it again. */
const ENGINE_RETRY_MS = 5000
let engineDownUntil = 0
/**
 * While the engine's copy is rebuilt after a start, PostgreSQL answers. Bounded, because with several
 * worker processes the rebuild may run in another one.
 */
let rebuildingUntil = 0
const REBUILD_GRACE_MS = 5 * 60_000

/** Called by a process that queues the index rebuild; the rebuild's end calls engineRebuilt(). */
export function engineRebuildStarted() {
  rebuildingUntil = Date.now() + REBUILD_GRACE_MS
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
    rating: doc.ratingMean !== null ? { mean: Math.round(doc.ratingMean * 10) / 10, count: doc.ratingCount } : null,
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
 * Open upcoming firings matching the potter's needs. Asks the engine; when it cannot be reached
 * (or errs), answers from PostgreSQL and says so with `degraded: true`.
 */
export async function searchFirings(ctx: AppContext, query: SearchQuery): Promise<SearchResponse> {
  const origin = resolveOrigin(query)
  const search = toFiringSearch(query, origin)
  let degraded = Date.now() < Math.max(rebuildingUntil, engineDownUntil)
  let found: Awaited<ReturnType<typeof searchEngine>> | null = null
  if (!degraded) {
    try {
      found = await searchEngine(ctx, search)
    } catch (error) {
      degraded = true
      engineDownUntil = Date.now() + ENGINE_RETRY_MS
      if (error instanceof MeilisearchApiError && error.response.status < 500) ctx.log.error('search engine refused a query', error)
      else ctx.log.warn(`search engine unreachable, answering from PostgreSQL: ${(error as Error).message}`)
    }
  }
  if (!found) found = await searchPostgres(poolOf(ctx), search)
  const facets = Object.fromEntries(FIRING_FACETS.map((f) => [f, found!.facets[f] ?? {}]))
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

/** Forget a past engine failure (tests, and the sync worker when a write succeeds). */
export function engineIsBack() {
  engineDownUntil = 0
}

/** The start-up rebuild is done: searches go to the engine again. */
export function engineRebuilt() {
  rebuildingUntil = 0
  engineDownUntil = 0
}
