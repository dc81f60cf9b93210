import { lazy, Suspense, useCallback, useEffect, useMemo, useRef, useState } from 'react'
import { useSearchParams } from 'react-router-dom'
import type { SearchHit } from '../../../../shared/schemas/search'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { MapPlaceholder } from '../../../components/map/MapPlaceholder'
import { ApiError, type FieldErrors } from '../../../lib/api'
import { useMe } from '../../auth/api/auth'
import { useFiringSearch } from '../api/search'
import { NoResults } from '../components/NoResults'
import { Pagination } from '../components/Pagination'
import { ResultList, ResultSkeletons } from '../components/ResultList'
import { SearchFilters } from '../components/SearchFilters'
import { studiosOf, type AreaSearch, type MapFit } from '../mapStudios'
import {
  DEFAULT_RADIUS_KM,
  hasOrigin,
  readSearchState,
  searchProblems,
  searchString,
  whereKey,
  withFilters,
  type SearchState,
} from '../searchState'
import type { UnitSystem } from '../units'
import { readerZone } from '../words'

// The map (Leaflet and the basemap) arrives after the filters and the list, which people read first.
const loadResultsMap = () => import('../components/ResultsMap')
const ResultsMap = lazy(() => loadResultsMap().then((m) => ({ default: m.ResultsMap })))
const MAP_CLASS = 'h-72 sm:h-96 lg:sticky lg:top-4 lg:order-2 lg:h-[calc(100vh-2rem)] lg:max-h-[44rem]'

/** Messages the filters show beside themselves; anything else is said above the results. */
const FILTER_FIELDS = new Set([
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
])

/** /find: open firings on a map and in a list, filtered by what the potter's ware needs. */
export function FindFiringPage() {
  const me = useMe()
  const [chosenUnits, setChosenUnits] = useState<UnitSystem | null>(null)
  const units: UnitSystem = chosenUnits ?? me.data?.unitSystem ?? 'imperial'

  const [params, setParams] = useSearchParams()
  const state = useMemo(() => readSearchState(params), [params])
  const problems = useMemo(() => searchProblems(state), [state])
  const search = useFiringSearch(state, { enabled: problems === null })

  const serverFields = search.error instanceof ApiError ? search.error.fields : {}
  const fieldErrors: FieldErrors = problems ?? serverFields
  const otherProblems = Object.entries(fieldErrors).filter(([field]) => !FILTER_FIELDS.has(field))

  const onSearch = useCallback((next: SearchState) => setParams(new URLSearchParams(searchString(withFilters(next, {})))), [setParams])
  const onSearchArea = useCallback(
    ({ near, radiusKm }: AreaSearch) => onSearch({ ...state, place: undefined, near, radiusKm }),
    [onSearch, state],
  )

  const [selection, setSelection] = useState<{ firingId: string; studioId: string } | null>(null)
  const cards = useRef(new Map<string, HTMLElement>())
  const cardRef = useCallback((firingId: string, element: HTMLElement | null) => {
    if (element) cards.current.set(firingId, element)
    else cards.current.delete(firingId)
  }, [])

  const response = search.data
  const fresh = response && !search.isPlaceholderData ? response : null
  const hits = useMemo(() => response?.hits ?? [], [response])
  const studios = useMemo(() => studiosOf(hits), [hits])
  const radiusKm = hasOrigin(state) ? Number(state.radiusKm ?? DEFAULT_RADIUS_KM) : null
  // The map dedupes by key: it goes somewhere new only when where-to-search changes, not for each filter.
  const fit = useMemo<MapFit | null>(
    () => (fresh ? { key: whereKey(state), origin: fresh.origin, radiusKm, studios: studiosOf(fresh.hits) } : null),
    [fresh, state, radiusKm],
  )

  const selected = selection && hits.some((h) => h.firingId === selection.firingId) ? selection : null
  const selectHit = (hit: SearchHit) => setSelection({ firingId: hit.firingId, studioId: hit.studio.id })
  const selectStudio = (studioId: string) => {
    const hit = hits.find((h) => h.studio.id === studioId)
    if (!hit) return
    selectHit(hit)
    const card = cards.current.get(hit.firingId)
    card?.scrollIntoView({ block: 'nearest', behavior: 'smooth' })
    card?.focus({ preventScroll: true })
  }

  const busy = search.isFetching && (search.isPlaceholderData || search.isPending)
  // The map opens where the first answer is, so it never fetches the basemap of a view it leaves at
  // once; its code is fetched meanwhile.
  const mapWaits = problems === null && search.isPending
  useEffect(() => {
    void loadResultsMap()
  }, [])
  const error = problems ? null : search.error

  return (
    <>
      <SearchFilters
        state={state}
        units={units}
        onUnitsChange={setChosenUnits}
        errors={fieldErrors}
        facets={response?.facets}
        onSearch={onSearch}
      />

      {response?.degraded && !search.isPlaceholderData && (
        <Alert tone="warning" className="mt-4" title="Search is running on a backup; results may be incomplete.">
          <span data-testid="degraded-notice">
            Firings added in the last few minutes may be missing. Try again shortly for the full list.
          </span>
        </Alert>
      )}

      <div className="mt-4 grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)] lg:items-start">
        <Suspense fallback={<MapPlaceholder className={`rounded-card border border-slip-200 ${MAP_CLASS}`} />}>
          {mapWaits ? (
            <MapPlaceholder className={`rounded-card border border-slip-200 ${MAP_CLASS}`} />
          ) : (
            <ResultsMap
              className={MAP_CLASS}
              studios={studios}
              selectedStudioId={selected?.studioId ?? null}
              onSelectStudio={selectStudio}
              fit={fit}
              origin={response?.origin ?? null}
              radiusKm={response?.origin ? radiusKm : null}
              onSearchArea={onSearchArea}
            />
          )}
        </Suspense>

        <section aria-labelledby="results-heading" className="min-w-0 space-y-3 lg:order-1" aria-busy={busy}>
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h2 id="results-heading" className="text-lg font-semibold text-slip-900">
              {response ? (
                <span data-testid="result-total">
                  {response.total} {response.total === 1 ? 'firing' : 'firings'}
                  {response.origin ? ` near ${response.origin.label}` : ''}
                </span>
              ) : (
                'Firings'
              )}
            </h2>
            <p className="text-xs text-slip-500">Times in your zone: {readerZone()}</p>
          </div>

          <div aria-live="polite" className="sr-only">
            {busy ? 'Updating the results…' : response && !search.isPlaceholderData ? `${response.total} firings found.` : ''}
          </div>

          {problems && (
            <Alert tone="danger" title="Check the highlighted filter">
              {otherProblems.length > 0 ? otherProblems.map(([, message]) => message).join(' ') : 'Fix it and the search runs again.'}
            </Alert>
          )}
          {error && (
            <Alert tone="danger" title="We could not search">
              <span data-testid="search-error">{error.message}</span>
              {otherProblems.length > 0 && ` ${otherProblems.map(([, message]) => message).join(' ')}`}
              {!(error instanceof ApiError && error.status === 400) && (
                <Button variant="ghost" size="sm" className="ml-2" onClick={() => search.refetch()}>
                  Try again
                </Button>
              )}
            </Alert>
          )}

          {response === undefined ? (
            search.isPending && !problems && <ResultSkeletons />
          ) : response.hits.length === 0 ? (
            search.isPlaceholderData ? (
              <ResultSkeletons />
            ) : (
              <NoResults state={state} units={units} />
            )
          ) : (
            <div className={`space-y-4 transition-opacity ${search.isPlaceholderData ? 'opacity-60' : ''}`}>
              <ResultList
                hits={response.hits}
                units={units}
                selectedFiringId={selected?.firingId ?? null}
                onSelect={selectHit}
                cardRef={cardRef}
              />
              <Pagination state={state} total={response.total} page={response.page} perPage={response.perPage} onSearch={onSearch} />
            </div>
          )}
        </section>
      </div>
    </>
  )
}
