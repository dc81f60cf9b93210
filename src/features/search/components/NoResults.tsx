import { CONES } from '../../../../shared/firing/cones'
import { ButtonLink } from '../../../components/ui/Button'
import { EmptyState } from '../../../components/ui/Card'
import { DEFAULT_RADIUS_KM, hasOrigin, searchString, withFilters, type SearchState } from '../searchState'
import { formatDistance, type UnitSystem } from '../units'

const WIDEST_KM = 2000

interface Suggestion {
  label: string
  state: SearchState
}

/** One-click ways out of an empty search: each loosens one filter that is set. */
export function loosenings(state: SearchState, units: UnitSystem): Suggestion[] {
  const out: Suggestion[] = []
  if (hasOrigin(state)) {
    const now = Number(state.radiusKm ?? DEFAULT_RADIUS_KM)
    const wider = Math.min(WIDEST_KM, Math.round(now * 2.5))
    if (Number.isFinite(now) && wider > now)
      out.push({ label: `Search within ${formatDistance(wider, units)}`, state: withFilters(state, { radiusKm: String(wider) }) })
  }
  if (state.cone) {
    const [low, high] = state.cone.split('..')
    const index = CONES.indexOf(low)
    // A single cone: its neighbours too, as glazes often mature across a cone either way (common practice).
    if (!high && index >= 0) {
      const from = CONES[Math.max(0, index - 1)]
      const to = CONES[Math.min(CONES.length - 1, index + 1)]
      out.push({ label: `Cones ${from} to ${to}`, state: withFilters(state, { cone: `${from}..${to}` }) })
    }
    out.push({ label: 'Any cone', state: withFilters(state, { cone: undefined }) })
  }
  if (state.atmosphere) out.push({ label: 'Any atmosphere', state: withFilters(state, { atmosphere: undefined }) })
  if (state.kind) out.push({ label: 'Any firing', state: withFilters(state, { kind: undefined }) })
  if (state.from || state.to) out.push({ label: 'Any drop-off date', state: withFilters(state, { from: undefined, to: undefined }) })
  if (state.fitsHeightMm || state.fitsWidthMm || state.fitsDepthMm) {
    out.push({
      label: 'Any piece size',
      state: withFilters(state, { fitsHeightMm: undefined, fitsWidthMm: undefined, fitsDepthMm: undefined }),
    })
  }
  if (state.q) out.push({ label: `Without “${state.q}”`, state: withFilters(state, { q: undefined }) })
  return out
}

export function NoResults({ state, units }: { state: SearchState; units: UnitSystem }) {
  const suggestions = loosenings(state, units)
  return (
    <div data-testid="no-results">
      <EmptyState
        title="No firings match — try a wider distance or another cone"
        action={
          suggestions.length > 0 && (
            <ul className="flex flex-wrap justify-center gap-2" aria-label="Ways to widen the search">
              {suggestions.map((s) => (
                <li key={s.label}>
                  <ButtonLink to={`?${searchString(s.state)}`} variant="secondary" size="sm">
                    {s.label}
                  </ButtonLink>
                </li>
              ))}
            </ul>
          )
        }
      >
        {suggestions.length === 0 ? 'No studio has an open firing coming up yet. Look again soon.' : 'Loosen one filter:'}
      </EmptyState>
    </div>
  )
}
