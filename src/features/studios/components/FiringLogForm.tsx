import { zoneName } from '../../../../shared/dates'
import { useState } from 'react'
import { useFieldArray, useForm, useWatch, type Control, type Path } from 'react-hook-form'
import { parseCone, type Cone } from '../../../../shared/firing/cones'
import { curveOfReadings } from '../../../../shared/firing/curve'
import type { Reading } from '../../../../shared/firing/readings'
import type { Segment } from '../../../../shared/firing/schedule'
import { crossCheckCones, type ConeBend, type WitnessReading } from '../../../../shared/firing/witness'
import { CONE_BENDS, firingLogSchema } from '../../../../shared/schemas/pickup'
import { BEND_WORDS, ConeCheckNote, type FiringLogRecord } from '../../../components/firing/FiringLog'
import { LogChart } from '../../../components/firing/LogChart'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Field, Select, TextArea, TextInput } from '../../../components/ui/Field'
import { FormSection } from '../../../components/ui/FormSection'
import { MeasureField } from '../../../components/ui/MeasureField'
import { ConeField, ConeSuggestions } from '../../../components/ware/ConeField'
import { applyServerErrors } from '../../../lib/forms'
import { ApiError } from '../../../lib/api'
import { COUNT, rateMeasure, scaleOf, temperatureMeasure, type UnitSystem } from '../../../lib/units'
import { useSaveFiringLog } from '../api/firingLog'
import { ReadingsEditor } from './ReadingsEditor'
import { ZonedDateTimeField } from './ZonedDateTimeField'

interface LogValues {
  loadedAt: string
  startedAt: string
  offAt: string
  openedAt: string
  peakC: number | null | undefined
  finalRateCPerHour: number | null | undefined
  holdMinutes: number | null | undefined
  witnessCones: { cone: string; bend: ConeBend; position: string }[]
  notes: string
}

const NUMBER_FIELDS = new Set(['peakC', 'finalRateCPerHour', 'holdMinutes'])

const TIMES = [
  { name: 'loadedAt', label: 'Loaded' },
  { name: 'startedAt', label: 'Started' },
  { name: 'offAt', label: 'Turned off' },
  { name: 'openedAt', label: 'Opened' },
] as const

function valuesOf(log: FiringLogRecord | null): LogValues {
  return {
    loadedAt: log?.loadedAt ?? '',
    startedAt: log?.startedAt ?? '',
    offAt: log?.offAt ?? '',
    openedAt: log?.openedAt ?? '',
    peakC: log?.peakC ?? null,
    finalRateCPerHour: log?.finalRateCPerHour ?? null,
    holdMinutes: log?.holdMinutes ?? null,
    witnessCones: log?.witnessCones.map((c) => ({ cone: c.cone, bend: c.bend, position: c.position ?? '' })) ?? [],
    notes: log?.notes ?? '',
  }
}

/** The body the API takes: empty times and numbers as null, cones as written (the schema reads them). */
function bodyOf(values: LogValues, readings: Reading[]) {
  const number = (n: number | null | undefined) => (n === undefined ? null : n)
  return {
    loadedAt: values.loadedAt || null,
    startedAt: values.startedAt || null,
    offAt: values.offAt || null,
    openedAt: values.openedAt || null,
    peakC: number(values.peakC),
    finalRateCPerHour: number(values.finalRateCPerHour),
    holdMinutes: number(values.holdMinutes),
    witnessCones: values.witnessCones.map((c) => ({
      cone: c.cone,
      bend: c.bend,
      ...(c.position.trim() ? { position: c.position.trim() } : {}),
    })),
    readings,
    notes: values.notes.trim(),
  }
}

/** Hours from start to off, to the tenth, as the server works it out. */
function hoursBetween(from: string, to: string): number | null {
  if (!from || !to) return null
  const hours = (Date.parse(to) - Date.parse(from)) / 3_600_000
  return Number.isFinite(hours) && hours >= 0 ? Math.round(hours * 10) / 10 : null
}

interface FiringLogFormProps {
  firingId: string
  log: FiringLogRecord | null
  zone: string
  units: UnitSystem
  /** The plan the logged curve is held against. */
  plan: Segment[]
  firingCone: Cone
}

/**
 * The firing's log as the kiln tech writes it, through the firing: times in the studio's zone, the
 * peak in the reader's units, witness cones row by row; the cone reached and its cross-check with
 * the peak update as they type.
 */
export function FiringLogForm({ firingId, log, zone, units, plan, firingCone }: FiringLogFormProps) {
  const save = useSaveFiringLog(firingId)
  const [formError, setFormError] = useState<string | null>(null)
  const [saved, setSaved] = useState(false)
  // Readings can run to thousands from a controller's export: kept beside the form, not as its fields.
  const [readings, setReadingsState] = useState<Reading[]>(log?.readings ?? [])
  const [readingsDirty, setReadingsDirty] = useState(false)
  const [readingsError, setReadingsError] = useState<string | undefined>()
  const setReadings = (next: Reading[]) => {
    setReadingsState(next)
    setReadingsDirty(true)
    setSaved(false)
  }
  const { control, register, handleSubmit, setError, setValue, reset, formState } = useForm<LogValues>({ defaultValues: valuesOf(log) })
  const cones = useFieldArray({ control, name: 'witnessCones' })
  // Elapsed times in an export count from the start, else from the loading.
  const [startedAt, loadedAt] = useWatch({ control, name: ['startedAt', 'loadedAt'] })

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null)
    setSaved(false)
    setReadingsError(undefined)
    const parsed = firingLogSchema.safeParse(bodyOf(values, readings))
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        // A number field holding text reaches the schema as NaN; say so in words.
        const message =
          issue.code === 'invalid_type' && NUMBER_FIELDS.has(String(issue.path[0])) ? 'Enter a number, or leave it empty.' : issue.message
        setError(issue.path.join('.') as Path<LogValues>, { type: 'schema', message })
      }
      setFormError('Check the fields marked in red.')
      return
    }
    try {
      const next = await save.mutateAsync(parsed.data)
      reset(valuesOf(next))
      setReadingsState(next.readings)
      setReadingsDirty(false)
      setSaved(true)
    } catch (error) {
      if (error instanceof ApiError && error.fields.readings) setReadingsError(error.fields.readings)
      setFormError(applyServerErrors(error, setError))
    }
  })

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6" aria-label="Firing log" data-testid="firing-log-form">
      <ConeSuggestions />
      <FormSection title="Times" lead={`In the studio’s time (${zoneName(zone)}). “Now” fills in this moment.`}>
        <div className="grid gap-4 sm:grid-cols-2">
          {TIMES.map((time) => (
            <div key={time.name} className="space-y-1">
              <ZonedDateTimeField control={control} name={time.name} label={time.label} zone={zone} />
              <button
                type="button"
                className="text-xs font-semibold text-clay-700 hover:underline"
                onClick={() => setValue(time.name, new Date(Math.floor(Date.now() / 60_000) * 60_000).toISOString(), { shouldDirty: true })}
                aria-label={`${time.label}: now`}
              >
                Now
              </button>
            </div>
          ))}
        </div>
        <TotalHours control={control} />
      </FormSection>

      <FormSection title="Heat" lead="From the controller or the pyrometer.">
        <div className="grid gap-4 sm:grid-cols-3">
          <MeasureField
            control={control}
            name="peakC"
            label="Peak temperature"
            measure={temperatureMeasure(units)}
            units={units}
            empty={null}
          />
          <MeasureField
            control={control}
            name="finalRateCPerHour"
            label="Final rate"
            measure={rateMeasure(units)}
            units={units}
            empty={null}
            hint={units === 'metric' ? 'Over the last 100 °C.' : 'Over the last 180 °F.'}
          />
          <MeasureField control={control} name="holdMinutes" label="Hold at peak (minutes)" measure={COUNT} units={units} empty={null} />
        </div>
      </FormSection>

      <FormSection title="Witness cones" lead="Each cone set in the kiln, how far it bent and where it stood.">
        <div className="space-y-3">
          {cones.fields.length === 0 && <p className="text-sm text-slip-600">No cones yet. Add one row per cone in each pack.</p>}
          {cones.fields.map((field, index) => (
            <fieldset
              key={field.id}
              className="grid gap-3 rounded-control border border-slip-200 p-3 sm:grid-cols-[8rem_1fr_1fr_auto] sm:items-end"
              data-testid="witness-cone-row"
            >
              <legend className="sr-only">Witness cone {index + 1}</legend>
              <ConeField
                register={register}
                name={`witnessCones.${index}.cone`}
                label="Cone"
                error={formState.errors.witnessCones?.[index]?.cone?.message}
              />
              <Field label="How far it bent" error={formState.errors.witnessCones?.[index]?.bend?.message}>
                {(a11y) => (
                  <Select {...a11y} {...register(`witnessCones.${index}.bend`)}>
                    {CONE_BENDS.map((bend) => (
                      <option key={bend} value={bend}>
                        {BEND_WORDS[bend].long}
                      </option>
                    ))}
                  </Select>
                )}
              </Field>
              <Field label="Where it stood" error={formState.errors.witnessCones?.[index]?.position?.message}>
                {(a11y) => (
                  <TextInput {...a11y} placeholder="Top shelf, back" maxLength={80} {...register(`witnessCones.${index}.position`)} />
                )}
              </Field>
              <Button variant="ghost" size="sm" onClick={() => cones.remove(index)} aria-label={`Remove witness cone ${index + 1}`}>
                Remove
              </Button>
            </fieldset>
          ))}
          <Button variant="secondary" size="sm" onClick={() => cones.append({ cone: '', bend: 'standing', position: '' })}>
            Add a witness cone
          </Button>
          <LiveConeCheck control={control} readings={readings} firingCone={firingCone} />
        </div>
      </FormSection>

      <FormSection
        title="The logged curve"
        lead="Readings typed in as the kiln climbs, or a controller’s export. The chart holds them against the plan in the zones where speed hurts ware."
      >
        <ReadingsEditor
          readings={readings}
          onChange={setReadings}
          zone={zone}
          units={units}
          startIso={startedAt || loadedAt || null}
          error={readingsError}
        />
        {readings.length >= 2 && (
          <div className="mt-4">
            <LogChart plan={plan} curve={curveOfReadings(readings)} scale={scaleOf(units)} />
          </div>
        )}
      </FormSection>

      <FormSection title="Notes">
        <Field
          label="Notes on the firing"
          hint="Every potter in this firing reads them: anything unusual, a shelf that ran hot, a slow climb."
        >
          {(a11y) => <TextArea {...a11y} rows={3} maxLength={4000} {...register('notes')} />}
        </Field>
      </FormSection>

      <div className="space-y-3">
        {formError && <Alert tone="danger">{formError}</Alert>}
        <div className="flex flex-wrap items-center gap-3">
          <Button type="submit" busy={formState.isSubmitting}>
            Save the log
          </Button>
          {saved && !formState.isDirty && !readingsDirty && (
            <span className="text-sm text-celadon-700">Saved. Every potter in the firing sees it on their request.</span>
          )}
          {(formState.isDirty || readingsDirty) && <span className="text-sm text-slip-600">Changes not saved yet.</span>}
        </div>
      </div>
    </form>
  )
}

function TotalHours({ control }: { control: Control<LogValues> }) {
  const [startedAt, offAt] = useWatch({ control, name: ['startedAt', 'offAt'] })
  const hours = hoursBetween(startedAt, offAt)
  return (
    <p className="mt-4 text-sm text-slip-700" data-testid="total-hours">
      Firing time (start to off): <strong>{hours !== null ? `${hours} h` : '—'}</strong>
    </p>
  )
}

/** The cross-check as it will be saved, worked out by the same rule the server uses. */
function LiveConeCheck({ control, readings, firingCone }: { control: Control<LogValues>; readings: Reading[]; firingCone: Cone }) {
  const [witnessCones, peakC, finalRate, hold] = useWatch({ control, name: ['witnessCones', 'peakC', 'finalRateCPerHour', 'holdMinutes'] })
  const cones: WitnessReading[] = []
  for (const row of witnessCones ?? []) {
    const cone = parseCone(row.cone ?? '')
    if (cone.ok) cones.push({ cone: cone.cone, bend: row.bend, position: row.position })
  }
  const number = (n: unknown) => (typeof n === 'number' && Number.isFinite(n) ? n : null)
  const rate = number(finalRate)
  const curve = curveOfReadings(readings)
  const record = {
    curve: curve.length >= 2 ? curve : null,
    peakC: number(peakC),
    finalRateCPerHour: rate !== null && rate > 0 ? rate : null,
    holdMinutes: number(hold),
  }
  return (
    <div className="border-t border-slip-200 pt-3" aria-live="polite">
      <ConeCheckNote check={crossCheckCones(cones, record, firingCone)} />
    </div>
  )
}
