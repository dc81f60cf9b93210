import { useId, useState, type FormEvent } from 'react'
import { CONES } from '../../../../shared/firing/cones'
import { Button, ButtonLink } from '../../../components/ui/Button'
import { ChoiceSwitch } from '../../../components/ui/ChoiceSwitch'
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

  // On a phone the place comes first and the rest folds away, unless one of them needs fixing.
  const moreId = useId()
  const [showMore, setShowMore] = useState(false)
  const setCount = Object.keys(state).filter((key) => !['place', 'near', 'page', 'perPage'].includes(key)).length
  const mustShow = Object.keys(errors).some((key) => key !== 'place' && key !== 'near')
  const more = showMore || mustShow ? '' : 'max-sm:hidden'

  const [coneLow, coneHigh] = splitCone(state.cone)
  const located = hasOrigin(state)
  const counts = (facet: string, value: string, filtered: boolean) => {
    // Counts for a facet already filtered on would read 0 for every other choice: left out there.
    const count = filtered ? undefined : facets?.[facet]?.[value]
    return count === undefined ? '' : ` (${count})`
  }
  /** A filter whose choices show how many results each would give. */
  const facetSelect = (facet: 'atmosphere' | 'kind', label: string, any: string, choices: readonly { value: string; label: string }[]) => (
    <Field className={more} label={label} error={errors[facet]}>
      {(control) => (
        <Select {...control} value={state[facet] ?? ''} onChange={(e) => searchWith({ [facet]: e.target.value || undefined })}>
          <option value="">{any}</option>
          {choices.map((choice) => (
            <option key={choice.value} value={choice.value}>
              {choice.label + counts(facet, choice.value, Boolean(state[facet]))}
            </option>
          ))}
        </Select>
      )}
    </Field>
  )

  // The usual reach is the empty choice; a distance set from the map joins the list where it falls.
  const offered = distanceChoices(units)
  const distances = [
    { km: '', label: `Within ${formatDistance(DEFAULT_RADIUS_KM, units)} (usual)`, order: DEFAULT_RADIUS_KM },
    ...offered.map((d) => ({ ...d, order: Number(d.km) })),
    ...(state.radiusKm && !offered.some((d) => d.km === state.radiusKm)
      ? [{ km: state.radiusKm, label: `Within ${formatDistance(Number(state.radiusKm), units)} (map area)`, order: Number(state.radiusKm) }]
      : []),
  ].sort((a, b) => a.order - b.order)
  const suffix = lengthSuffix(units)

  const placeField = (
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
  )

  return (
    <form
      role="search"
      aria-label="Find a firing"
      noValidate
      onSubmit={onSubmit}
      className="rounded-card border border-slip-200 bg-white p-4 shadow-card"
    >
      <div id={moreId} className="grid items-start gap-x-3 gap-y-3 sm:grid-cols-2 lg:grid-cols-6">
        <div className="sm:col-span-2">{placeField}</div>
        <button
          type="button"
          className="justify-self-start text-sm font-semibold text-clay-700 underline sm:hidden"
          aria-expanded={Boolean(showMore || mustShow)}
          aria-controls={moreId}
          onClick={() => setShowMore((open) => !open)}
        >
          {showMore || mustShow ? 'Fewer filters' : `More filters${setCount ? ` (${setCount} set)` : ''}`}
        </button>
        <Field className={more} label="Distance" hint={located ? undefined : 'Give a place first.'} error={errors.radiusKm}>
          {(control) => (
            <Select
              {...control}
              disabled={!located}
              value={state.radiusKm ?? ''}
              onChange={(e) => searchWith({ radiusKm: e.target.value || undefined })}
            >
              {distances.map((d) => (
                <option key={d.km} value={d.km}>
                  {d.label}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field className={more} label="Cone" error={errors.cone}>
          {(control) => (
            <Select
              {...control}
              value={coneLow}
              onChange={(e) => searchWith({ cone: joinCone(e.target.value, e.target.value ? coneHigh : '') })}
            >
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
        <Field className={more} label="Up to cone">
          {(control) => (
            <Select
              {...control}
              disabled={!coneLow}
              value={coneHigh}
              onChange={(e) => searchWith({ cone: joinCone(coneLow, e.target.value) })}
            >
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
        {facetSelect('atmosphere', 'Atmosphere', 'Any atmosphere', ATMOSPHERE_CHOICES)}

        {facetSelect('kind', 'Firing', 'Any firing', FIRING_KIND_CHOICES)}
        <Field className={more} label="Drop off from" error={errors.from}>
          {(control) => <TextInput {...control} type="date" value={draft.from} onChange={(e) => edit('from')(e.target.value)} />}
        </Field>
        <Field className={more} label="Drop off until" error={errors.to}>
          {(control) => (
            <TextInput
              {...control}
              type="date"
              value={draft.to}
              min={draft.from || undefined}
              onChange={(e) => edit('to')(e.target.value)}
            />
          )}
        </Field>
        <Field label="Words" error={errors.q} className={`sm:col-span-2 ${more}`}>
          {(control) => (
            <TextInput
              {...control}
              type="search"
              placeholder="A studio, town or kiln"
              value={draft.q}
              onChange={(e) => edit('q')(e.target.value)}
            />
          )}
        </Field>
        <Field className={more} label="Sort" error={errors.sort}>
          {(control) => (
            <Select
              {...control}
              value={state.sort ?? (located ? 'distance' : 'soonest')}
              onChange={(e) => searchWith({ sort: e.target.value })}
            >
              {SORT_CHOICES.map((choice) => (
                <option key={choice.value} value={choice.value} disabled={choice.value === 'distance' && !located}>
                  {choice.label}
                </option>
              ))}
            </Select>
          )}
        </Field>

        <fieldset className={`sm:col-span-2 lg:col-span-4 ${more}`}>
          <legend className="text-sm font-semibold text-slip-800">
            Fits my piece <span className="font-normal text-slip-500">— a width alone means a round piece that wide</span>
          </legend>
          <div className="mt-1 grid grid-cols-3 items-start gap-3 sm:grid-cols-4">
            <SizeField label={`Height (${suffix})`} value={draft.height} onChange={edit('height')} error={errors.fitsHeightMm} />
            <SizeField label={`Width (${suffix})`} value={draft.width} onChange={edit('width')} error={errors.fitsWidthMm} />
            <SizeField label={`Depth (${suffix})`} value={draft.depth} onChange={edit('depth')} error={errors.fitsDepthMm} />
            <UnitChoice value={units} onChange={switchUnits} />
          </div>
        </fieldset>
        <div className="flex flex-wrap items-center gap-2 self-end sm:col-span-2">
          <Button type="submit">Search</Button>
          <ButtonLink to="/find" variant="ghost">
            Clear all
          </ButtonLink>
          <p className="w-full text-xs text-slip-500">Lists apply at once; typed fields on Search or Enter.</p>
        </div>
      </div>
    </form>
  )
}

function SizeField({ label, value, onChange, error }: { label: string; value: string; onChange: (text: string) => void; error?: string }) {
  return (
    <Field label={label} error={error}>
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
  return <ChoiceSwitch legend="Units" layout="stacked" value={value} choices={UNIT_CHOICES} onChange={onChange} />
}
