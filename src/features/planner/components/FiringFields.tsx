import { Checkbox, Field, Select } from '../../../components/ui/Field'
import { FormSection } from '../../../components/ui/FormSection'
import { ConeField } from '../../../components/ware/ConeField'
import type { FormSectionProps } from './sectionProps'
import { ATMOSPHERES } from './KilnFields'

export function FiringFields({ register, messages }: FormSectionProps) {
  return (
    <FormSection title="Firing" lead="What the load will be fired as.">
      <div className="grid gap-4 sm:grid-cols-3">
        <Field label="Firing" error={messages['firing.kind']}>
          {(a11y) => (
            <Select {...a11y} {...register('firing.kind')}>
              <option value="bisque">Bisque</option>
              <option value="glaze">Glaze</option>
              <option value="single">Single (raw-glazed greenware, fired once)</option>
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
        <div className="sm:col-span-3">
          <Checkbox label="Slow cool through the inversions" {...register('firing.slowCool')} />
        </div>
      </div>
    </FormSection>
  )
}
