// The search as it lives in the URL: every filter a query parameter, so a link is the search and
// the back button brings an earlier one back. The API query and the cache key both derive from it.

import { searchQuerySchema } from '../../../shared/schemas/search'
import type { FieldErrors } from '../../lib/api'

/** The filters, as the URL spells them (named as GET /api/search names them). */
export const SEARCH_PARAMS = [
  'place',
  'near',
  'radiusKm',
  'cone',
  'atmosphere',
  'kind',
  'from',
  'to',
  'fitsHeightMm',
  'fitsWidthMm',
  'fitsDepthMm',
  'q',
  'sort',
  'page',
  'perPage',
  'view',
] as const
export type SearchParam = (typeof SEARCH_PARAMS)[number]
export type SearchState = Partial<Record<SearchParam, string>>

export const DEFAULT_PER_PAGE = 20

/** How the page lays the answer out: cards by studio, a grid of weeks, or the map. Not sent to the API. */
export const SEARCH_VIEWS = ['board', 'weeks', 'map'] as const
export type SearchView = (typeof SEARCH_VIEWS)[number]

export const viewOf = (state: SearchState): SearchView =>
  (SEARCH_VIEWS as readonly string[]).includes(state.view ?? '') ? (state.view as SearchView) : 'board'
export { DEFAULT_RADIUS_KM } from '../../../shared/schemas/search'

const DAY = /^\d{4}-\d{2}-\d{2}$/

export function readSearchState(params: URLSearchParams): SearchState {
  const state: SearchState = {}
  for (const key of SEARCH_PARAMS) {
    const value = params.get(key)
    if (value !== null) state[key] = value
  }
  return normaliseSearch(state)
}

export const hasOrigin = (state: SearchState) => Boolean(state.place || state.near)

/**
 * One spelling per search: trimmed, empties and defaults left out, and nothing that only makes
 * sense with a place (a distance, "nearest first") kept once the place is gone.
 */
export function normaliseSearch(state: SearchState): SearchState {
  const out: SearchState = {}
  for (const key of SEARCH_PARAMS) {
    const value = state[key]?.trim()
    if (value) out[key] = value
  }
  if (out.page === '1') delete out.page
  if (out.view !== undefined && viewOf(out) === 'board') delete out.view
  if (out.perPage === String(DEFAULT_PER_PAGE)) delete out.perPage
  if (!hasOrigin(out)) {
    delete out.radiusKm
    if (out.sort === 'distance') delete out.sort
  }
  return out
}

/** The URL's query string, parameters always in the same order. */
export function searchString(state: SearchState): string {
  const params = new URLSearchParams()
  const normal = normaliseSearch(state)
  for (const key of SEARCH_PARAMS) if (normal[key] !== undefined) params.set(key, normal[key])
  return params.toString()
}

/** The search itself, whichever way it is laid out: the cache key of its answer. */
export const answerKey = (state: SearchState) => searchString({ ...state, view: undefined })

export function withView(state: SearchState, view: SearchView): SearchState {
  return normaliseSearch({ ...state, view })
}

/** A change of filters starts again at the first page. */
export function withFilters(state: SearchState, changes: SearchState): SearchState {
  return normaliseSearch({ ...state, ...changes, page: undefined })
}

export function withPage(state: SearchState, page: number): SearchState {
  return normaliseSearch({ ...state, page: String(page) })
}

/**
 * The API's query for a search. Drop-off days are whole days where the potter is: the first from
 * local midnight, the last to one second before the next.
 */
export function apiQueryString(state: SearchState): string {
  const params = new URLSearchParams(searchString({ ...state, view: undefined }))
  const localDay = (key: 'from' | 'to', time: string) => {
    const day = params.get(key)
    if (!day || !DAY.test(day)) return
    const instant = new Date(`${day}T${time}`)
    // A day that does not exist ("2027-02-31") goes as typed, for the schema to name.
    if (!Number.isNaN(instant.getTime())) params.set(key, instant.toISOString())
  }
  localDay('from', '00:00:00')
  localDay('to', '23:59:59')
  return params.toString()
}

/** What the shared schema says about a search before it is sent, by field; null when it is sound. */
export function searchProblems(state: SearchState): FieldErrors | null {
  const parsed = searchQuerySchema.safeParse(Object.fromEntries(new URLSearchParams(apiQueryString(state))))
  if (parsed.success) return null
  const fields: FieldErrors = {}
  for (const issue of parsed.error.issues) {
    const field = String(issue.path[0] ?? '_')
    fields[field] ??= issue.message
  }
  return fields
}

/** The part of a search that says where: when it changes, the map goes there. */
export function whereKey(state: SearchState): string {
  return [state.place ?? '', state.near ?? '', state.radiusKm ?? ''].join('|')
}
