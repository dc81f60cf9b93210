import { useWatch } from 'react-hook-form'
import { Checkbox, Field, Select } from '../../../components/ui/Field'
import { meltsGlaze } from '../../../../shared/firing/schedule'
import { COOLING_CHOICES } from '../../../lib/firingWords'
import { FormSection } from '../../../components/ui/FormSection'
import { ConeField } from '../../../components/ware/ConeField'
import type { FormSectionProps } from './sectionProps'
import { ATMOSPHERES } from './KilnFields'

export function FiringFields({ register, messages, control }: FormSectionProps) {
  const [cooling, kind] = useWatch({ control, name: ['firing.cooling', 'firing.kind'] })
  return (
    <FormSection title="Firing" lead="What the load will be fired as.">
      <div className="grid gap-4 sm:grid-cols-3">
        <Field label="Firing" error={messages['firing.kind']}>
          {(a11y) => (
            <Select {...a11y} {...register('firing.kind')}>
              <option value="bisque">Bisque</option>
              <option value="glaze">Glaze</option>
              <option value="single">Single (raw-glazed greenware, fired once)</option>
              <option value="lustre">Lustre, decals and china paint (cone 022–015)</option>
              <option value="raku">Raku (fast, pulled hot)</option>
            </Select>
          )}
        </Field>
        <ConeField register={register} error={messages['firing.cone']} name="firing.cone" label="Cone" />
        <Field label="Atmosphere" error={messages['firing.atmosphere']}>
          {(a11y) => (
            <Select {...a11y} {...register('firing.atmosphere')}>
              {ATMOSPHERES.map((atmosphere) => (
                <option key={atmosphere.value} value={atmosphere.value}>
                  {atmosphere.label}
                </option>
              ))}
            </Select>
          )}
        </Field>
        {meltsGlaze(kind) && (
          <Field
            label="Cooling"
            hint={COOLING_CHOICES.find((c) => c.value === cooling)?.hint}
            error={messages['firing.cooling']}
            className="sm:col-span-2"
          >
            {(a11y) => (
              <Select {...a11y} {...register('firing.cooling')}>
                {COOLING_CHOICES.map((choice) => (
                  <option key={choice.value} value={choice.value}>
                    {choice.label}
                  </option>
                ))}
              </Select>
            )}
          </Field>
        )}
        <div className="space-y-2 sm:col-span-3">
          <Checkbox label="Slow cool through the inversions" {...register('firing.slowCool')} />
          <Checkbox label="Shared load (other people’s ware in the kiln)" {...register('firing.sharedLoad')} />
        </div>
      </div>
    </FormSection>
  )
}
