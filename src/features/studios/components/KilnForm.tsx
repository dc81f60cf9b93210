import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm, useWatch, type DefaultValues } from 'react-hook-form'
import type { z } from 'zod'
import { CONES } from '../../../../shared/firing/cones'
import { kilnBodySchema } from '../../../../shared/schemas/studios'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Card } from '../../../components/ui/Card'
import { Checkbox, Field, Select, TextArea, TextInput } from '../../../components/ui/Field'
import { applyServerErrors } from '../../../lib/forms'
import { lengthMeasure, localiseMessage, rateMeasure, shelfLoadMeasure, temperatureMeasure, type UnitSystem } from '../../../lib/units'
import { ATMOSPHERES, KILN_KINDS } from '../../../lib/firingWords'
import { MeasureField } from '../../../components/ui/MeasureField'
import { UnitSwitch } from './UnitSwitch'

export type KilnInput = z.input<typeof kilnBodySchema>
export type KilnOutput = z.output<typeof kilnBodySchema>

/** A new kiln starts as the common electric top-loader, its sizes and limits left for the studio. */
export const NEW_KILN: DefaultValues<KilnInput> = {
  name: '',
  kind: 'electric',
  atmospheres: ['oxidation'],
  interior: { shape: 'round' },
  minCone: '022',
  maxCone: '',
  preheatHold: true,
  controlledCooling: false,
  shelfCount: 0,
  shelfWidthMm: null,
  shelfDepthMm: null,
  shelfLoadKg: null,
  notes: '',
}

interface KilnFormProps {
  defaultValues: DefaultValues<KilnInput>
  initialUnits: UnitSystem
  submitLabel: string
  onSubmit: (body: KilnOutput) => Promise<unknown>
  /** Crew see the limits but cannot change them. */
  readOnly?: boolean
}

/** Every field of a kiln, typed in the units chosen on the form and sent in SI. */
export function KilnForm({ defaultValues, initialUnits, submitLabel, onSubmit, readOnly = false }: KilnFormProps) {
  const [units, setUnits] = useState<UnitSystem>(initialUnits)
  const [formError, setFormError] = useState<string | null>(null)
  const [saved, setSaved] = useState(false)
  const { register, control, handleSubmit, setError, setValue, getValues, reset, formState } = useForm<KilnInput, unknown, KilnOutput>({
    resolver: zodResolver(kilnBodySchema),
    defaultValues,
  })
  const shape = useWatch({ control, name: 'interior.shape' })
  const errors = formState.errors
  const message = (text: string | undefined) => (text ? localiseMessage(text, units) : undefined)
  const length = lengthMeasure(units)

  const chooseShape = (next: 'round' | 'box') => {
    const heightMm = getValues('interior.heightMm')
    // The other shape's sizes are dropped; the sizes of the new one start empty for the owner to fill.
    const interior = next === 'round' ? { shape: 'round', heightMm } : { shape: 'box', heightMm }
    setValue('interior', interior as KilnInput['interior'], { shouldDirty: true })
  }

  const submit = handleSubmit(async (body) => {
    setFormError(null)
    setSaved(false)
    try {
      await onSubmit(body)
      // What was saved becomes the form's starting point, so "unsaved changes" means changes since.
      reset(getValues())
      setSaved(true)
    } catch (error) {
      setFormError(applyServerErrors(error, setError))
    }
  })

  return (
    <form onSubmit={submit} noValidate aria-label="Kiln">
      <fieldset disabled={readOnly} className="space-y-5">
        <div className="flex flex-wrap items-center justify-between gap-3">
          <UnitSwitch value={units} onChange={setUnits} />
          <p className="text-xs text-slip-500">Sizes and temperatures are kept in mm and °C; the switch only changes what you see.</p>
        </div>
        {formError && <Alert tone="danger">{formError}</Alert>}

        <Card>
          <h2 className="mb-4 font-semibold">The kiln</h2>
          <div className="grid gap-4 sm:grid-cols-2">
            <Field label="Name" hint="As potters will see it, e.g. “Big electric”." error={errors.name?.message}>
              {(a11y) => <TextInput {...a11y} {...register('name')} />}
            </Field>
            <Field label="Kind" error={errors.kind?.message}>
              {(a11y) => (
                <Select {...a11y} {...register('kind')}>
                  {KILN_KINDS.map((k) => (
                    <option key={k.value} value={k.value}>
                      {k.label}
                    </option>
                  ))}
                </Select>
              )}
            </Field>
          </div>
          <fieldset className="mt-4">
            <legend className="mb-2 text-sm font-medium text-slip-800">Atmospheres it can fire</legend>
            <div className="flex flex-wrap gap-4">
              {ATMOSPHERES.map((a) => (
                <Checkbox key={a.value} label={a.label} value={a.value} {...register('atmospheres')} />
              ))}
            </div>
            {errors.atmospheres && (
              <p className="mt-1 text-xs font-medium text-danger-700" role="alert">
                {errors.atmospheres.message ?? errors.atmospheres.root?.message}
              </p>
            )}
          </fieldset>
        </Card>

        <Card>
          <h2 className="mb-4 font-semibold">Inside size</h2>
          <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
            <Field label="Shape">
              {(a11y) => (
                <Select {...a11y} value={shape} onChange={(e) => chooseShape(e.target.value as 'round' | 'box')}>
                  <option value="round">Round (top-loader)</option>
                  <option value="box">Box (front-loader, car)</option>
                </Select>
              )}
            </Field>
            {shape === 'round' ? (
              <MeasureField control={control} name="interior.diameterMm" label="Inside diameter" measure={length} units={units} />
            ) : (
              <>
                <MeasureField control={control} name="interior.widthMm" label="Inside width" measure={length} units={units} />
                <MeasureField control={control} name="interior.depthMm" label="Inside depth" measure={length} units={units} />
              </>
            )}
            <MeasureField control={control} name="interior.heightMm" label="Inside height" measure={length} units={units} />
            <MeasureField
              control={control}
              name="usableHeightMm"
              label="Usable height"
              measure={length}
              units={units}
              hint="The tallest piece it takes. Leave empty to allow about 65 mm (2½ in) for posts, one shelf and the lid."
            />
          </div>
          <div className="mt-4 grid gap-4 sm:grid-cols-3">
            <Field label="Shelves" error={errors.shelfCount?.message}>
              {(a11y) => (
                <TextInput {...a11y} type="number" min={0} inputMode="numeric" {...register('shelfCount', { valueAsNumber: true })} />
              )}
            </Field>
            <MeasureField
              control={control}
              name="shelfWidthMm"
              label="Shelf width"
              measure={length}
              units={units}
              empty={null}
              hint="Optional."
            />
            <MeasureField
              control={control}
              name="shelfDepthMm"
              label="Shelf depth"
              measure={length}
              units={units}
              empty={null}
              hint="Optional; the diameter for round shelves."
            />
          </div>
        </Card>

        <Card>
          <h2 className="mb-4 font-semibold">Limits</h2>
          <datalist id="kiln-cones">
            {CONES.map((cone) => (
              <option key={cone} value={cone} />
            ))}
          </datalist>
          <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
            <Field label="Coolest cone" hint="e.g. 022 or 06" error={errors.minCone?.message}>
              {(a11y) => <TextInput {...a11y} list="kiln-cones" autoComplete="off" {...register('minCone')} />}
            </Field>
            <Field label="Hottest cone" hint="e.g. 6 or 10" error={errors.maxCone?.message}>
              {(a11y) => <TextInput {...a11y} list="kiln-cones" autoComplete="off" {...register('maxCone')} />}
            </Field>
            <MeasureField
              control={control}
              name="maxTempC"
              label="Top temperature"
              measure={temperatureMeasure(units)}
              units={units}
              hint="From the kiln’s plate or manual."
            />
            <MeasureField control={control} name="maxRampCPerHour" label="Fastest climb" measure={rateMeasure(units)} units={units} />
          </div>
          <div className="mt-4 grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
            <MeasureField
              control={control}
              name="shelfLoadKg"
              label="One shelf carries"
              measure={shelfLoadMeasure(units)}
              units={units}
              empty={null}
              hint="Optional: from the shelf maker. Heavy pieces and full shelves are checked against it."
            />
          </div>
          <div className="mt-4 grid gap-2 sm:grid-cols-2">
            <Checkbox label="Can hold a low preheat below boiling (candling)" {...register('preheatHold')} />
            <Checkbox label="Can control its cooling (slow cool)" {...register('controlledCooling')} />
          </div>
          {(errors.preheatHold || errors.controlledCooling) && (
            <p className="mt-1 text-xs font-medium text-danger-700" role="alert">
              {message(errors.preheatHold?.message ?? errors.controlledCooling?.message)}
            </p>
          )}
        </Card>

        <Card>
          <Field
            label="Notes"
            hint="Anything potters should know: elements replaced last spring, kiln wash on every shelf…"
            error={errors.notes?.message}
          >
            {(a11y) => <TextArea {...a11y} rows={3} {...register('notes')} />}
          </Field>
        </Card>

        {!readOnly && (
          <div className="flex flex-wrap items-center justify-end gap-3">
            {saved && !formState.isDirty && (
              <span role="status" className="text-sm text-celadon-700">
                Saved.
              </span>
            )}
            <Button type="submit" busy={formState.isSubmitting}>
              {submitLabel}
            </Button>
          </div>
        )}
      </fieldset>
    </form>
  )
}
