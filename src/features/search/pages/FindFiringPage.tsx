import { lazy, Suspense, useCallback, useEffect, useMemo, useRef, useState } from 'react'
import { Link, useSearchParams } from 'react-router-dom'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { MapPlaceholder } from '../../../components/map/MapPlaceholder'
import { ApiError, type FieldErrors } from '../../../lib/api'
import { useMe } from '../../auth/api/auth'
import { useFiringBoard } from '../api/search'
import { NoResults } from '../components/NoResults'
import { Pagination } from '../components/Pagination'
import { ResultSkeletons } from '../components/ResultSkeletons'
import { SearchFilters } from '../components/SearchFilters'
import { StudioCard } from '../components/StudioCard'
import { WeekBoard } from '../components/WeekBoard'
import { studiosOf, type AreaSearch, type MapFit } from '../mapStudios'
import {
  DEFAULT_RADIUS_KM,
  hasOrigin,
  readSearchState,
  searchProblems,
  searchString,
  viewOf,
  whereKey,
  withFilters,
  withView,
  type SearchState,
  type SearchView,
} from '../searchState'
import type { UnitSystem } from '../units'
import { readerZone } from '../words'

// The map (Leaflet and the basemap) is fetched only for the map view.
const loadResultsMap = () => import('../components/ResultsMap')
const ResultsMap = lazy(() => loadResultsMap().then((m) => ({ default: m.ResultsMap })))
const MAP_CLASS = 'h-80 sm:h-[28rem]'

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

const VIEWS: { view: SearchView; label: string }[] = [
  { view: 'board', label: 'By studio' },
  { view: 'weeks', label: 'By week' },
  { view: 'map', label: 'Map' },
]

/** /find: the firing board — studios with their upcoming firings — by studio, by week or on a map. */
export function FindFiringPage() {
  const me = useMe()
  const [chosenUnits, setChosenUnits] = useState<UnitSystem | null>(null)
  const units: UnitSystem = chosenUnits ?? me.data?.unitSystem ?? 'imperial'

  const [params, setParams] = useSearchParams()
  const state = useMemo(() => readSearchState(params), [params])
  const view = viewOf(state)
  const problems = useMemo(() => searchProblems(state), [state])
  const search = useFiringBoard(state, { enabled: problems === null })

  const serverFields = search.error instanceof ApiError ? search.error.fields : {}
  const fieldErrors: FieldErrors = problems ?? serverFields
  const otherProblems = Object.entries(fieldErrors).filter(([field]) => !FILTER_FIELDS.has(field))

  // flushSync: the page shows the new search in the same task that puts it in the URL, so a second
  // change made at once (a quick hand, a test) builds on this one rather than on the search before it.
  const onSearch = useCallback(
    (next: SearchState) => setParams(new URLSearchParams(searchString(withFilters(next, {}))), { flushSync: true }),
    [setParams],
  )
  const onSearchArea = useCallback(
    ({ near, radiusKm }: AreaSearch) => onSearch({ ...state, place: undefined, near, radiusKm }),
    [onSearch, state],
  )

  const response = search.data
  const fresh = response && !search.isPlaceholderData ? response : null
  const board = useMemo(() => response?.studios ?? [], [response])
  const pins = useMemo(() => studiosOf(board), [board])
  const radiusKm = hasOrigin(state) ? Number(state.radiusKm ?? DEFAULT_RADIUS_KM) : null
  // The map dedupes by key: it goes somewhere new only when where-to-search changes, not for each filter.
  const fit = useMemo<MapFit | null>(
    () => (fresh ? { key: whereKey(state), origin: fresh.origin, radiusKm, studios: studiosOf(fresh.studios) } : null),
    [fresh, state, radiusKm],
  )

  const [chosenStudioId, setChosenStudioId] = useState<string | null>(null)
  const chosen = board.find((card) => card.studio.id === chosenStudioId) ?? null
  const chosenCard = useRef<HTMLDivElement>(null)
  const showOnMap = (studioId: string) => {
    setChosenStudioId(studioId)
    setParams(new URLSearchParams(searchString(withView(state, 'map'))), { flushSync: true })
  }

  const busy = search.isFetching && (search.isPlaceholderData || search.isPending)
  // The map opens where the first answer is, so it never fetches the basemap of a view it leaves at
  // once; its code is fetched meanwhile.
  const mapWaits = problems === null && search.isPending
  useEffect(() => {
    if (view === 'map') void loadResultsMap()
  }, [view])
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

      <section aria-labelledby="results-heading" className="mt-4 min-w-0 space-y-3" aria-busy={busy}>
        <div className="flex flex-wrap items-end justify-between gap-x-4 gap-y-2">
          <div className="min-w-0">
            <h2 id="results-heading" className="text-lg font-semibold text-slip-900">
              {response ? (
                <span data-testid="result-total" data-studios={response.total} data-firings={response.firingTotal}>
                  {response.total} {response.total === 1 ? 'studio' : 'studios'} with {response.firingTotal}{' '}
                  {response.firingTotal === 1 ? 'firing' : 'firings'}
                  {response.origin ? ` near ${response.origin.label}` : ''}
                </span>
              ) : (
                'Firings'
              )}
            </h2>
            <p className="text-xs text-slip-600">Times in your zone: {readerZone()}</p>
          </div>
          <nav aria-label="Ways to see the firings" className="flex rounded-control border border-slip-300 bg-white p-0.5 text-sm">
            {VIEWS.map((option) => (
              <Link
                key={option.view}
                to={`?${searchString(withView(state, option.view))}`}
                aria-current={view === option.view ? 'page' : undefined}
                className="rounded-control px-3 py-1 font-medium text-slip-700 hover:bg-slip-100 aria-[current=page]:bg-clay-600 aria-[current=page]:text-white"
              >
                {option.label}
              </Link>
            ))}
          </nav>
        </div>

        <div aria-live="polite" className="sr-only">
          {busy
            ? 'Updating the results…'
            : response && !search.isPlaceholderData
              ? `${response.total} studios with ${response.firingTotal} firings found.`
              : ''}
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

        {view === 'map' && (
          <Suspense fallback={<MapPlaceholder className={`rounded-card border border-slip-200 ${MAP_CLASS}`} />}>
            {mapWaits ? (
              <MapPlaceholder className={`rounded-card border border-slip-200 ${MAP_CLASS}`} />
            ) : (
              <ResultsMap
                className={MAP_CLASS}
                studios={pins}
                selectedStudioId={chosen?.studio.id ?? null}
                onSelectStudio={(studioId) => {
                  setChosenStudioId(studioId)
                  chosenCard.current?.scrollIntoView({ block: 'nearest', behavior: 'smooth' })
                }}
                fit={fit}
                origin={response?.origin ?? null}
                radiusKm={response?.origin ? radiusKm : null}
                onSearchArea={onSearchArea}
              />
            )}
          </Suspense>
        )}

        {response === undefined ? (
          search.isPending && !problems && <ResultSkeletons />
        ) : board.length === 0 ? (
          search.isPlaceholderData ? (
            <ResultSkeletons />
          ) : (
            <NoResults state={state} units={units} />
          )
        ) : (
          <div className={`space-y-4 transition-opacity ${search.isPlaceholderData ? 'opacity-60' : ''}`}>
            {view === 'board' && (
              <ol className="space-y-3" aria-label="Studios found">
                {board.map((card) => (
                  <li key={card.studio.id} className="min-w-0">
                    <StudioCard
                      card={card}
                      units={units}
                      ownPiece={response.piece !== null}
                      onShowOnMap={() => showOnMap(card.studio.id)}
                    />
                  </li>
                ))}
              </ol>
            )}
            {view === 'weeks' && <WeekBoard studios={board} units={units} />}
            {view === 'map' && (
              <div ref={chosenCard}>
                {chosen ? (
                  <StudioCard card={chosen} units={units} ownPiece={response.piece !== null} selected />
                ) : (
                  <p className="rounded-card border border-dashed border-slip-300 p-4 text-sm text-slip-600" data-testid="map-pick-hint">
                    Pick a studio’s tag on the map to see its firings here.
                  </p>
                )}
              </div>
            )}
            <Pagination state={state} total={response.total} page={response.page} perPage={response.perPage} onSearch={onSearch} />
          </div>
        )}
      </section>
    </>
  )
}
