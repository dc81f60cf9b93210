import { useId, useState, type FormEvent, type ReactNode } from 'react'
import { CONES } from '../../../../shared/firing/cones'
import { Button, ButtonLink } from '../../../components/ui/Button'
import { Field, Select, TextInput } from '../../../components/ui/Field'
import type { FieldErrors } from '../../../lib/api'
import { DEFAULT_RADIUS_KM, hasOrigin, searchString, type SearchState } from '../searchState'
import { distanceChoices, formatDistance, lengthSuffix, mmToTypedLength, typedLengthToMm, type UnitSystem } from '../units'
import { ATMOSPHERE_CHOICES, FIRING_KIND_CHOICES, SORT_CHOICES } from '../words'
import { PlaceField } from './PlaceField'

/** What is typed but not searched yet; selects search at once, typed fields on Search or Enter. */
interface Draft {
  place: string
  q: string
  from: string
  to: string
  height: string
  width: string
  depth: string
}

const draftOf = (state: SearchState, units: UnitSystem): Draft => ({
  place: state.place ?? '',
  q: state.q ?? '',
  from: state.from ?? '',
  to: state.to ?? '',
  height: mmToTypedLength(state.fitsHeightMm, units),
  width: mmToTypedLength(state.fitsWidthMm, units),
  depth: mmToTypedLength(state.fitsDepthMm, units),
})

/** The search with what is typed applied: a named place replaces an area picked on the map. */
function applyDraft(state: SearchState, draft: Draft, units: UnitSystem): SearchState {
  const place = draft.place.trim()
  return {
    ...state,
    place: place || undefined,
    near: place ? undefined : state.near,
    q: draft.q,
    from: draft.from,
    to: draft.to,
    fitsHeightMm: typedLengthToMm(draft.height, units),
    fitsWidthMm: typedLengthToMm(draft.width, units),
    fitsDepthMm: typedLengthToMm(draft.depth, units),
  }
}

function splitCone(cone: string | undefined): [string, string] {
  if (!cone) return ['', '']
  const [low, high = ''] = cone.split('..')
  return [low, high]
}

const joinCone = (low: string, high: string) => (!low ? undefined : !high || high === low ? low : `${low}..${high}`)

export interface SearchFiltersProps {
  state: SearchState
  units: UnitSystem
  onUnitsChange: (units: UnitSystem) => void
  /** The schema's or the server's messages, by query parameter. */
  errors: FieldErrors
  /** Counts for the current results, shown beside the choices they describe. */
  facets?: Record<string, Record<string, number>>
  onSearch: (next: SearchState) => void
}

export function SearchFilters({ state, units, onUnitsChange, errors, facets, onSearch }: SearchFiltersProps) {
  const committed = searchString(state)
  const [draft, setDraft] = useState(() => draftOf(state, units))
  const [seen, setSeen] = useState(committed)
  // The URL moved (a search, the back button): the fields show that search again.
  if (seen !== committed) {
    setSeen(committed)
    setDraft(draftOf(state, units))
  }

  const edit = (key: keyof Draft) => (value: string) => setDraft((d) => ({ ...d, [key]: value }))
  const searchWith = (changes: SearchState = {}, from: Draft = draft) => onSearch({ ...applyDraft(state, from, units), ...changes })
  const onSubmit = (event: FormEvent) => {
    event.preventDefault()
    searchWith()
  }

  const switchUnits = (next: UnitSystem) => {
    // Sizes typed but not yet searched keep their length in the new units.
    const convert = (text: string) => mmToTypedLength(typedLengthToMm(text, units), next)
    setDraft((d) => ({ ...d, height: convert(d.height), width: convert(d.width), depth: convert(d.depth) }))
    onUnitsChange(next)
  }

  const [coneLow, coneHigh] = splitCone(state.cone)
  const located = hasOrigin(state)
  const counts = (facet: string, value: string, filtered: boolean) => {
    // Counts for a facet already filtered on would read 0 for every other choice: left out there.
    const count = filtered ? undefined : facets?.[facet]?.[value]
    return count === undefined ? '' : ` (${count})`
  }

  const distances = distanceChoices(units)
  const customDistance = state.radiusKm && !distances.some((d) => d.km === state.radiusKm) ? state.radiusKm : null
  const suffix = lengthSuffix(units)

  return (
    <form role="search" aria-label="Find a firing" noValidate onSubmit={onSubmit} className="space-y-4 rounded-card border border-slip-200 bg-white p-4 shadow-card sm:p-5">
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <div className="sm:col-span-2">
          <PlaceField
            value={draft.place}
            onChange={edit('place')}
            onChoose={(label) => searchWith({}, { ...draft, place: label })}
            error={errors.place ?? errors.near}
            hint={
              state.near && !draft.place ? (
                <span data-testid="map-area-note">
                  Searching the area you picked on the map.{' '}
                  <button type="button" className="font-semibold underline" onClick={() => searchWith({ near: undefined })}>
                    Forget it
                  </button>
                </span>
              ) : undefined
            }
          />
        </div>
        <Field label="Distance" hint={located ? undefined : 'Give a place to search around it.'} error={errors.radiusKm}>
          {(control) => (
            <Select {...control} disabled={!located} value={state.radiusKm ?? ''} onChange={(e) => searchWith({ radiusKm: e.target.value || undefined })}>
              <option value="">{`Within ${formatDistance(DEFAULT_RADIUS_KM, units)} (usual)`}</option>
              {customDistance && <option value={customDistance}>{`Within ${formatDistance(Number(customDistance), units)} (map area)`}</option>}
              {distances.map((d) => (
                <option key={d.km} value={d.km}>
                  {d.label}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Sort" error={errors.sort}>
          {(control) => (
            <Select {...control} value={state.sort ?? (located ? 'distance' : 'soonest')} onChange={(e) => searchWith({ sort: e.target.value })}>
              {SORT_CHOICES.map((choice) => (
                <option key={choice.value} value={choice.value} disabled={choice.value === 'distance' && !located}>
                  {choice.label}
                </option>
              ))}
            </Select>
          )}
        </Field>

        <Field label="Cone" error={errors.cone}>
          {(control) => (
            <Select {...control} value={coneLow} onChange={(e) => searchWith({ cone: joinCone(e.target.value, e.target.value ? coneHigh : '') })}>
              <option value="">Any cone</option>
              {coneLow && !CONES.includes(coneLow) && <option value={coneLow}>{coneLow}</option>}
              {CONES.map((cone) => (
                <option key={cone} value={cone}>
                  {`Cone ${cone}`}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Up to cone" hint="For a range of cones.">
          {(control) => (
            <Select {...control} disabled={!coneLow} value={coneHigh} onChange={(e) => searchWith({ cone: joinCone(coneLow, e.target.value) })}>
              <option value="">{coneLow ? `Just cone ${coneLow}` : 'Pick a cone first'}</option>
              {coneHigh && !CONES.includes(coneHigh) && <option value={coneHigh}>{coneHigh}</option>}
              {CONES.map((cone) => (
                <option key={cone} value={cone}>
                  {`Cone ${cone}`}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Atmosphere" error={errors.atmosphere}>
          {(control) => (
            <Select {...control} value={state.atmosphere ?? ''} onChange={(e) => searchWith({ atmosphere: e.target.value || undefined })}>
              <option value="">Any atmosphere</option>
              {ATMOSPHERE_CHOICES.map((choice) => (
                <option key={choice.value} value={choice.value}>
                  {choice.label + counts('atmosphere', choice.value, Boolean(state.atmosphere))}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Firing" error={errors.kind}>
          {(control) => (
            <Select {...control} value={state.kind ?? ''} onChange={(e) => searchWith({ kind: e.target.value || undefined })}>
              <option value="">Any firing</option>
              {FIRING_KIND_CHOICES.map((choice) => (
                <option key={choice.value} value={choice.value}>
                  {choice.label + counts('kind', choice.value, Boolean(state.kind))}
                </option>
              ))}
            </Select>
          )}
        </Field>

        <Field label="Drop off from" error={errors.from}>
          {(control) => <TextInput {...control} type="date" value={draft.from} onChange={(e) => edit('from')(e.target.value)} />}
        </Field>
        <Field label="Drop off until" error={errors.to}>
          {(control) => <TextInput {...control} type="date" value={draft.to} min={draft.from || undefined} onChange={(e) => edit('to')(e.target.value)} />}
        </Field>
        <Field label="Words" hint="A studio, town or kiln name." error={errors.q} className="sm:col-span-2">
          {(control) => <TextInput {...control} type="search" value={draft.q} onChange={(e) => edit('q')(e.target.value)} />}
        </Field>
      </div>

      <fieldset className="rounded-control border border-slip-200 p-3">
        <legend className="px-1 text-sm font-semibold text-slip-800">Fits my piece</legend>
        <div className="grid items-start gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <SizeField label={`Height (${suffix})`} value={draft.height} onChange={edit('height')} error={errors.fitsHeightMm} />
          <SizeField label={`Width (${suffix})`} value={draft.width} onChange={edit('width')} error={errors.fitsWidthMm} hint="Across, for a round piece." />
          <SizeField label={`Depth (${suffix})`} value={draft.depth} onChange={edit('depth')} error={errors.fitsDepthMm} hint="Leave empty for a round piece." />
          <UnitChoice value={units} onChange={switchUnits} />
        </div>
      </fieldset>

      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit">Search</Button>
        <ButtonLink to="/find" variant="ghost">
          Clear all
        </ButtonLink>
        <p className="text-xs text-slip-500">Lists apply at once; typed fields when you press Search or Enter.</p>
      </div>
    </form>
  )
}

function SizeField({ label, value, onChange, error, hint }: { label: string; value: string; onChange: (text: string) => void; error?: string; hint?: ReactNode }) {
  return (
    <Field label={label} error={error} hint={hint}>
      {(control) => <TextInput {...control} inputMode="decimal" value={value} onChange={(e) => onChange(e.target.value)} />}
    </Field>
  )
}

const UNIT_CHOICES: readonly { value: UnitSystem; label: string }[] = [
  { value: 'imperial', label: 'in · mi' },
  { value: 'metric', label: 'mm · km' },
]

/** Which units sizes and distances are shown and typed in; the search itself is in mm and km. */
function UnitChoice({ value, onChange }: { value: UnitSystem; onChange: (units: UnitSystem) => void }) {
  const name = useId()
  return (
    <fieldset className="space-y-1">
      <legend className="text-sm font-medium text-slip-800">Units</legend>
      <div className="inline-flex rounded-control border border-slip-300 bg-white p-0.5">
        {UNIT_CHOICES.map((choice) => (
          <label key={choice.value} className="cursor-pointer">
            <input type="radio" className="peer sr-only" name={name} value={choice.value} checked={value === choice.value} onChange={() => onChange(choice.value)} />
            <span className="block rounded-control px-3 py-1.5 text-sm font-medium text-slip-700 peer-checked:bg-clay-600 peer-checked:text-white peer-focus-visible:outline-2 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-clay-500">
              {choice.label}
            </span>
          </label>
        ))}
      </div>
    </fieldset>
  )
}
