import { Controller, useWatch } from 'react-hook-form'
import type { Atmosphere } from '../../../../shared/firing/check'
import { Checkbox, Field, Select } from '../../../components/ui/Field'
import { DEMO_KILNS } from '../demoKilns'
import { FormSection } from '../../../components/ui/FormSection'
import { MeasureField } from '../../../components/ui/MeasureField'
import { ConeField } from '../../../components/ware/ConeField'
import { lengthMeasure, rateMeasure, shelfLoadMeasure, temperatureMeasure } from '../../../lib/units'
import type { FormSectionProps } from './sectionProps'

const KINDS = [
  ['electric', 'Electric'],
  ['gas', 'Gas'],
  ['wood', 'Wood'],
  ['soda', 'Soda'],
  ['salt', 'Salt'],
  ['raku', 'Raku'],
] as const

export const ATMOSPHERES: readonly { value: Atmosphere; label: string }[] = [
  { value: 'oxidation', label: 'Oxidation' },
  { value: 'reduction', label: 'Reduction' },
  { value: 'neutral', label: 'Neutral' },
]

export function KilnFields({ control, register, messages, units, onPickDemo }: FormSectionProps & { onPickDemo: (id: string) => void }) {
  const shape = useWatch({ control, name: 'kiln.interior.shape' })
  const length = lengthMeasure(units)
  const shared = { control, units }
  const m = (name: string) => messages[name]

  return (
    <FormSection title="Kiln" lead="Its real limits: what it can reach, hold and fit.">
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Start from a demo kiln" hint="Invented examples; change anything that differs in yours." className="sm:col-span-2">
          {(a11y) => (
            <Select {...a11y} {...register('demoKilnId', { onChange: (event) => onPickDemo(event.target.value) })}>
              <option value="">My own kiln</option>
              {DEMO_KILNS.map((demo) => (
                <option key={demo.id} value={demo.id}>
                  {demo.name}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Kind" error={messages['kiln.kind']}>
          {(a11y) => (
            <Select {...a11y} {...register('kiln.kind')}>
              {KINDS.map(([value, label]) => (
                <option key={value} value={value}>
                  {label}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Controller
          control={control}
          name="kiln.atmospheres"
          render={({ field }) => (
            <fieldset>
              <legend className="block text-sm font-medium text-slip-800">Atmospheres it can fire</legend>
              <div className="mt-2 flex flex-wrap gap-x-4 gap-y-1">
                {ATMOSPHERES.map((atmosphere) => (
                  <Checkbox
                    key={atmosphere.value}
                    label={atmosphere.label}
                    checked={field.value.includes(atmosphere.value)}
                    onChange={(event) =>
                      field.onChange(
                        event.target.checked
                          ? ATMOSPHERES.map((a) => a.value).filter((a) => a === atmosphere.value || field.value.includes(a))
                          : field.value.filter((a) => a !== atmosphere.value),
                      )
                    }
                  />
                ))}
              </div>
              {messages['kiln.atmospheres'] && (
                <p className="mt-1 text-xs font-medium text-danger-700" role="alert">
                  {messages['kiln.atmospheres']}
                </p>
              )}
            </fieldset>
          )}
        />
        <Field label="Inside shape" error={messages['kiln.interior']}>
          {(a11y) => (
            <Select {...a11y} {...register('kiln.interior.shape')}>
              <option value="round">Round</option>
              <option value="box">Box</option>
            </Select>
          )}
        </Field>
        {shape === 'round' ? (
          <MeasureField
            {...shared}
            name="kiln.interior.diameterMm"
            error={m('kiln.interior.diameterMm')}
            label="Inside diameter"
            measure={length}
          />
        ) : (
          <>
            <MeasureField
              {...shared}
              name="kiln.interior.widthMm"
              error={m('kiln.interior.widthMm')}
              label="Inside width"
              measure={length}
            />
            <MeasureField
              {...shared}
              name="kiln.interior.depthMm"
              error={m('kiln.interior.depthMm')}
              label="Inside depth"
              measure={length}
            />
          </>
        )}
        <MeasureField
          {...shared}
          name="kiln.interior.heightMm"
          error={m('kiln.interior.heightMm')}
          label="Inside height"
          measure={length}
        />
        <MeasureField
          {...shared}
          name="kiln.usableHeightMm"
          error={m('kiln.usableHeightMm')}
          label="Usable height"
          measure={length}
          hint="Optional. Left empty: the inside height less about 65 mm (2½ in) for posts, a shelf and the lid."
        />
        <ConeField register={register} error={m('kiln.minCone')} name="kiln.minCone" label="Coolest cone" />
        <ConeField register={register} error={m('kiln.maxCone')} name="kiln.maxCone" label="Hottest cone" />
        <MeasureField
          {...shared}
          name="kiln.maxTempC"
          error={m('kiln.maxTempC')}
          label="Top temperature"
          measure={temperatureMeasure(units)}
        />
        <MeasureField
          {...shared}
          name="kiln.maxRampCPerHour"
          error={m('kiln.maxRampCPerHour')}
          label="Fastest climb"
          measure={rateMeasure(units)}
        />
        <MeasureField
          {...shared}
          name="kiln.shelfLoadKg"
          error={m('kiln.shelfLoadKg')}
          label="One shelf carries"
          measure={shelfLoadMeasure(units)}
          hint="Optional: what one shelf may hold; heavy pieces are checked against it."
        />
        <div className="space-y-2 sm:col-span-2">
          <Checkbox label="Can hold a low preheat below boiling (candling)" {...register('kiln.preheatHold')} />
          <Checkbox label="Can control its cooling (slow cool, fire down)" {...register('kiln.controlledCooling')} />
        </div>
      </div>
    </FormSection>
  )
}
