import { useWatch } from 'react-hook-form'
import { Checkbox, Field, Select, TextInput } from '../../../components/ui/Field'
import { FormSection } from '../../../components/ui/FormSection'
import { MeasureField } from '../../../components/ui/MeasureField'
import { FRACTIONAL_CENTS, moneyMeasure, PERCENT } from '../../../lib/units'
import type { FormSectionProps } from './sectionProps'

const SHELF_STEPS = [
  [0.25, 'Quarter shelves'],
  [1 / 3, 'Third shelves'],
  [0.5, 'Half shelves'],
  [1, 'Whole shelves'],
] as const

export function PriceListFields({ control, register, messages, units }: FormSectionProps) {
  const [quoteOn, model, volumeUnit, depositKind, currency] = useWatch({
    control,
    name: ['quoteOn', 'priceList.model', 'priceList.volumeUnit', 'priceList.depositKind', 'priceList.currency'],
  })
  const money = moneyMeasure(currency)
  const shared = { control, units }
  const m = (name: string) => messages[`priceList.${name}`]

  return (
    <FormSection title="Price list" lead="Optional: a studio's rates, to see what the load would cost.">
      <Checkbox label="Work out a quote" {...register('quoteOn')} />
      {quoteOn && (
        <div className="mt-4 grid gap-4 sm:grid-cols-2">
          <Field label="Currency" hint="Three letters, like USD or EUR." error={m('currency')}>
            {(a11y) => <TextInput {...a11y} maxLength={3} autoComplete="off" {...register('priceList.currency')} />}
          </Field>
          <Field label="Priced by" error={m('model')}>
            {(a11y) => (
              <Select {...a11y} {...register('priceList.model')}>
                <option value="volume">Volume of each piece</option>
                <option value="shelf">Share of a shelf</option>
                <option value="kiln">The whole kiln</option>
              </Select>
            )}
          </Field>
          {model === 'volume' && (
            <>
              <Field label="Volume unit">
                {(a11y) => (
                  <Select {...a11y} {...register('priceList.volumeUnit')}>
                    <option value="cubicInch">Per cubic inch</option>
                    <option value="litre">Per litre</option>
                  </Select>
                )}
              </Field>
              {volumeUnit === 'cubicInch' ? (
                <MeasureField
                  {...shared}
                  name="priceList.centsPerCubicInch"
                  error={m('centsPerCubicInch')}
                  label="Price per cubic inch"
                  measure={FRACTIONAL_CENTS}
                />
              ) : (
                <MeasureField
                  {...shared}
                  name="priceList.centsPerLitre"
                  error={m('centsPerLitre')}
                  label="Price per litre"
                  measure={FRACTIONAL_CENTS}
                />
              )}
              {volumeUnit === 'litre' && m('centsPerCubicInch') && (
                <p className="text-xs font-medium text-danger-700 sm:col-span-2">{m('centsPerCubicInch')}</p>
              )}
            </>
          )}
          {model === 'shelf' && (
            <>
              <MeasureField
                {...shared}
                name="priceList.shelfCents"
                error={m('shelfCents')}
                label="Price of a whole shelf"
                measure={money}
              />
              <Field label="Sold in" error={m('shelfStep')}>
                {(a11y) => (
                  <Select {...a11y} {...register('priceList.shelfStep', { setValueAs: Number })}>
                    {SHELF_STEPS.map(([step, label]) => (
                      <option key={label} value={step}>
                        {label}
                      </option>
                    ))}
                  </Select>
                )}
              </Field>
            </>
          )}
          {model === 'kiln' && (
            <MeasureField {...shared} name="priceList.kilnCents" error={m('kilnCents')} label="Price of the whole kiln" measure={money} />
          )}
          <MeasureField
            {...shared}
            name="priceList.minimumPerPieceCents"
            error={m('minimumPerPieceCents')}
            label="Minimum per piece"
            measure={money}
            hint="Optional."
          />
          <MeasureField
            {...shared}
            name="priceList.surcharges.reduction"
            error={m('surcharges.reduction')}
            label="Reduction surcharge"
            measure={PERCENT}
            hint="Optional, of the base price."
          />
          <MeasureField
            {...shared}
            name="priceList.surcharges.slowCool"
            error={m('surcharges.slowCool')}
            label="Slow-cool surcharge"
            measure={PERCENT}
            hint="Optional."
          />
          <MeasureField
            {...shared}
            name="priceList.surcharges.preheat"
            error={m('surcharges.preheat')}
            label="Long-preheat surcharge"
            measure={PERCENT}
            hint="Optional."
          />
          <Field label="Deposit as" error={m('deposit')}>
            {(a11y) => (
              <Select {...a11y} {...register('priceList.depositKind')}>
                <option value="percent">A percent of the total</option>
                <option value="fixed">A fixed sum</option>
              </Select>
            )}
          </Field>
          {depositKind === 'percent' ? (
            <MeasureField {...shared} name="priceList.deposit.percent" error={m('deposit.percent')} label="Deposit" measure={PERCENT} />
          ) : (
            <MeasureField {...shared} name="priceList.deposit.fixedCents" error={m('deposit.fixedCents')} label="Deposit" measure={money} />
          )}
        </div>
      )}
    </FormSection>
  )
}
