import { zodResolver } from '@hookform/resolvers/zod'
import { useMemo, useState } from 'react'
import { useForm, useWatch } from 'react-hook-form'
import type { z } from 'zod'
import { CONES, coneIndex } from '../../../../shared/firing/cones'
import { formatDate, zoneName } from '../../../../shared/dates'
import { firingCreateSchema } from '../../../../shared/schemas/studios'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Checkbox, Field, Select, TextArea, TextInput } from '../../../components/ui/Field'
import { applyServerErrors } from '../../../lib/forms'
import { useCreateFirings } from '../api/firings'
import type { FiringRecord, KilnRecord } from '../api/types'
import { weekdayIn } from '../zonedTime'
import { ATMOSPHERES, COOLING_CHOICES, FIRING_KINDS } from '../../../lib/firingWords'
import { ZonedDateTimeField } from './ZonedDateTimeField'

type FiringInput = z.input<typeof firingCreateSchema>
type FiringOutput = z.output<typeof firingCreateSchema>

const REPEAT_WEEKS = [
  { value: 1, label: 'every week' },
  { value: 2, label: 'every other week' },
  { value: 3, label: 'every 3 weeks' },
  { value: 4, label: 'every 4 weeks' },
  { value: 6, label: 'every 6 weeks' },
  { value: 8, label: 'every 8 weeks' },
]

function conesOf(kiln: KilnRecord): readonly string[] {
  return CONES.slice(coneIndex(kiln.minCone), coneIndex(kiln.maxCone) + 1)
}

interface FiringFormProps {
  studioId: string
  zone: string
  kilns: KilnRecord[]
  onCreated: (firings: FiringRecord[]) => void
  onCancel?: () => void
}

/** Posts a firing, or a series of them on the same weekday and time in the studio's zone. */
export function FiringForm({ studioId, zone, kilns, onCreated, onCancel }: FiringFormProps) {
  const create = useCreateFirings(studioId)
  const [kilnId, setKilnId] = useState(kilns[0]?.id ?? '')
  const [repeating, setRepeating] = useState(false)
  const [formError, setFormError] = useState<string | null>(null)
  const kiln = kilns.find((k) => k.id === kilnId) ?? kilns[0]
  const cones = useMemo(() => (kiln ? conesOf(kiln) : CONES), [kiln])

  const { register, control, handleSubmit, setError, setValue, formState } = useForm<FiringInput, unknown, FiringOutput>({
    resolver: zodResolver(firingCreateSchema),
    defaultValues: {
      kind: 'glaze',
      cone: cones.includes('6') ? '6' : cones[cones.length - 1],
      atmosphere: kiln?.atmospheres[0] ?? 'oxidation',
      slowCool: false,
      cooling: 'natural',
      dropOffBy: '',
      firingDate: '',
      readyBy: '',
      layersOnSale: null,
      notes: '',
    },
  })
  const firingDate = useWatch({ control, name: 'firingDate' })
  const repeat = useWatch({ control, name: 'repeat' })
  const cooling = useWatch({ control, name: 'cooling' })

  const chooseKiln = (id: string) => {
    const next = kilns.find((k) => k.id === id)
    setKilnId(id)
    if (!next) return
    const range = conesOf(next)
    setValue('cone', range.includes('6') ? '6' : range[range.length - 1])
    setValue('atmosphere', next.atmospheres[0])
  }

  const toggleRepeat = (on: boolean) => {
    setRepeating(on)
    setValue('repeat', on ? { everyWeeks: 2, times: 4 } : undefined)
  }

  const onSubmit = handleSubmit(async (body) => {
    setFormError(null)
    try {
      onCreated(await create.mutateAsync({ kilnId: kiln.id, body }))
    } catch (error) {
      setFormError(applyServerErrors(error, setError))
    }
  })

  if (!kiln) return <Alert tone="warning">Add a kiln first: firings are posted per kiln.</Alert>

  const errors = formState.errors
  const seriesText =
    repeating && firingDate && repeat?.everyWeeks && repeat?.times
      ? `${REPEAT_WEEKS.find((w) => w.value === Number(repeat.everyWeeks))?.label ?? `every ${repeat.everyWeeks} weeks`} on ${weekdayIn(firingDate, zone)}, ${repeat.times} firings from ${formatDate(firingDate, zone)}`
      : null

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="New firing">
      {formError && <Alert tone="danger">{formError}</Alert>}
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Kiln">
          {(a11y) => (
            <Select {...a11y} value={kiln.id} onChange={(e) => chooseKiln(e.target.value)}>
              {kilns.map((k) => (
                <option key={k.id} value={k.id}>
                  {k.name}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Kind of firing" error={errors.kind?.message}>
          {(a11y) => (
            <Select {...a11y} {...register('kind')}>
              {FIRING_KINDS.map((k) => (
                <option key={k.value} value={k.value}>
                  {k.label}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Cone" hint={`This kiln fires cone ${kiln.minCone} to ${kiln.maxCone}.`} error={errors.cone?.message}>
          {(a11y) => (
            <Select {...a11y} {...register('cone')}>
              {cones.map((cone) => (
                <option key={cone} value={cone}>
                  Cone {cone}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Atmosphere" error={errors.atmosphere?.message}>
          {(a11y) => (
            <Select {...a11y} {...register('atmosphere')}>
              {ATMOSPHERES.filter((a) => kiln.atmospheres.includes(a.value)).map((a) => (
                <option key={a.value} value={a.value}>
                  {a.label}
                </option>
              ))}
            </Select>
          )}
        </Field>
      </div>
      {kiln.controlledCooling && (
        <div className="grid gap-4 sm:grid-cols-2 sm:items-end">
          <Field label="Glaze cooling" hint={COOLING_CHOICES.find((c) => c.value === cooling)?.hint} error={errors.cooling?.message}>
            {(a11y) => (
              <Select {...a11y} {...register('cooling')}>
                {COOLING_CHOICES.map((choice) => (
                  <option key={choice.value} value={choice.value}>
                    {choice.label}
                  </option>
                ))}
              </Select>
            )}
          </Field>
          <Checkbox label="Slow cool through the inversions (controlled cooling after the peak)" {...register('slowCool')} />
        </div>
      )}
      <div className="grid gap-4 sm:grid-cols-3">
        <ZonedDateTimeField control={control} name="dropOffBy" label="Drop-off closes" zone={zone} />
        <ZonedDateTimeField control={control} name="firingDate" label="Firing starts" zone={zone} />
        <ZonedDateTimeField control={control} name="readyBy" label="Ready for pickup" zone={zone} />
      </div>
      <p className="-mt-2 text-xs text-slip-500">Times are the studio’s ({zoneName(zone)}), whatever zone your device is set to.</p>
      <Field
        label="Layers on sale"
        hint="Leave empty to offer every layer the kiln’s shelves make; the load plan works out the space from its shelves and posts."
        error={errors.layersOnSale?.message}
      >
        {(a11y) => (
          <TextInput
            {...a11y}
            inputMode="numeric"
            {...register('layersOnSale', { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v)) })}
          />
        )}
      </Field>
      <Field label="Notes for potters" error={errors.notes?.message}>
        {(a11y) => <TextArea {...a11y} rows={2} {...register('notes')} />}
      </Field>
      <fieldset className="space-y-3 rounded-control border border-slip-200 p-3">
        <legend className="px-1 text-sm font-medium text-slip-800">Repeat</legend>
        <Checkbox label="Post a series on the same weekday and time" checked={repeating} onChange={(e) => toggleRepeat(e.target.checked)} />
        {repeating && (
          <div className="grid gap-4 sm:grid-cols-2">
            <Field label="How often" error={errors.repeat?.everyWeeks?.message}>
              {(a11y) => (
                <Select {...a11y} {...register('repeat.everyWeeks', { valueAsNumber: true })}>
                  {REPEAT_WEEKS.map((w) => (
                    <option key={w.value} value={w.value}>
                      {w.label}
                    </option>
                  ))}
                </Select>
              )}
            </Field>
            <Field label="How many firings" error={errors.repeat?.times?.message}>
              {(a11y) => (
                <TextInput
                  {...a11y}
                  type="number"
                  min={2}
                  max={26}
                  inputMode="numeric"
                  {...register('repeat.times', { valueAsNumber: true })}
                />
              )}
            </Field>
          </div>
        )}
        {seriesText && (
          <p className="text-sm text-slip-700" data-testid="series-summary">
            {seriesText[0].toUpperCase() + seriesText.slice(1)}.
          </p>
        )}
      </fieldset>
      <div className="flex flex-wrap justify-end gap-2">
        {onCancel && (
          <Button variant="secondary" onClick={onCancel}>
            Close
          </Button>
        )}
        <Button type="submit" busy={formState.isSubmitting}>
          {repeating ? 'Post the firings' : 'Post the firing'}
        </Button>
      </div>
    </form>
  )
}
