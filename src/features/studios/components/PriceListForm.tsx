import { zodResolver } from '@hookform/resolvers/zod'
import { useMemo, useState } from 'react'
import { useForm, useWatch } from 'react-hook-form'
import type { z } from 'zod'
import { formatMoney } from '../../../../shared/dates'
import { EXAMPLE_PIECES } from '../../../../shared/firing/examples'
import { quoteRequest, type PriceList, type Quote } from '../../../../shared/firing/quote'
import { priceListSchema } from '../../../../shared/schemas/firing'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Card } from '../../../components/ui/Card'
import { Field, Select, TextInput } from '../../../components/ui/Field'
import { applyServerErrors } from '../../../lib/forms'
import type { KilnRecord } from '../api/types'
import { moneyMeasure, PERCENT, type UnitSystem } from '../../../lib/units'
import { MeasureField } from '../../../components/ui/MeasureField'

type PriceListInput = z.input<typeof priceListSchema>
type PriceListOutput = z.output<typeof priceListSchema>
type VolumeUnit = 'cubicInch' | 'litre'

const SHELF_STEPS = [
  { value: 1, label: 'Whole shelves only' },
  { value: 0.5, label: 'Half shelves' },
  { value: 0.25, label: 'Quarter shelves' },
  { value: 0.125, label: 'Eighth shelves' },
]

/** Only the fields of the chosen model go to the server, so a stale shelf price does not linger. */
function priceListBody(values: PriceListInput, volumeUnit: VolumeUnit): PriceListInput {
  const surcharges = Object.fromEntries(Object.entries(values.surcharges ?? {}).filter(([, v]) => v !== undefined))
  return {
    currency: values.currency,
    model: values.model,
    ...(values.model === 'volume'
      ? volumeUnit === 'cubicInch'
        ? { centsPerCubicInch: values.centsPerCubicInch }
        : { centsPerLitre: values.centsPerLitre }
      : values.model === 'shelf'
        ? { shelfCents: values.shelfCents, shelfStep: values.shelfStep }
        : { kilnCents: values.kilnCents }),
    ...(values.minimumPerPieceCents !== undefined ? { minimumPerPieceCents: values.minimumPerPieceCents } : {}),
    ...(Object.keys(surcharges).length ? { surcharges } : {}),
    deposit: values.deposit,
  }
}

/** The reference pieces priced as the server prices them for the studio page: cone 6, oxidation if the kiln has it. */
export function exampleQuotes(priceList: PriceList, kiln: KilnRecord): { label: string; quote: Quote }[] {
  const atmosphere = kiln.atmospheres.includes('oxidation') ? 'oxidation' : kiln.atmospheres[0]
  return EXAMPLE_PIECES.map((piece) => ({ label: piece.label ?? 'Piece', quote: quoteRequest(priceList, { atmosphere }, [piece], kiln) }))
}

interface PriceListFormProps {
  kiln: KilnRecord
  priceList: PriceList | null
  currency: string
  units: UnitSystem
  readOnly: boolean
  onSave: (body: PriceListOutput) => Promise<unknown>
}

/** How the kiln's space is priced, with the reference pieces quoted live as the fields change. */
export function PriceListForm({ kiln, priceList, currency, units, readOnly, onSave }: PriceListFormProps) {
  const [volumeUnit, setVolumeUnit] = useState<VolumeUnit>(
    priceList?.centsPerLitre !== undefined
      ? 'litre'
      : priceList?.centsPerCubicInch !== undefined || units === 'imperial'
        ? 'cubicInch'
        : 'litre',
  )
  const [depositKind, setDepositKind] = useState<'percent' | 'fixed'>(priceList && 'fixedCents' in priceList.deposit ? 'fixed' : 'percent')
  const [formError, setFormError] = useState<string | null>(null)
  const [saved, setSaved] = useState(false)
  const { register, control, handleSubmit, setError, setValue, reset, formState } = useForm<PriceListInput, unknown, PriceListOutput>({
    resolver: zodResolver(priceListSchema),
    defaultValues: priceList ?? { currency, model: 'volume', deposit: { percent: 25 } },
  })
  const values = useWatch({ control }) as PriceListInput
  const model = values.model
  const money = moneyMeasure(values.currency ?? currency)
  const rate = moneyMeasure(values.currency ?? currency, 4)
  const errors = formState.errors

  const examples = useMemo(() => {
    const parsed = priceListSchema.safeParse(priceListBody(values, volumeUnit))
    if (!parsed.success) return null
    try {
      return exampleQuotes(parsed.data, kiln)
    } catch {
      return null
    }
  }, [values, volumeUnit, kiln])

  const submit = handleSubmit(async () => {
    setFormError(null)
    setSaved(false)
    const parsed = priceListSchema.safeParse(priceListBody(values, volumeUnit))
    if (!parsed.success) return
    try {
      await onSave(parsed.data)
      reset(values)
      setSaved(true)
    } catch (error) {
      setFormError(applyServerErrors(error, setError))
    }
  })

  return (
    <form onSubmit={submit} noValidate aria-label="Price list" className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_20rem]">
      <fieldset disabled={readOnly} className="space-y-4" data-testid="price-list-fields" data-read-only={readOnly ? 'true' : 'false'}>
        {readOnly && (
          <Alert tone="info" title="Prices are the owner’s to set">
            Crew can see this price list but not change it; the server refuses changes from anyone but the studio’s owner.
          </Alert>
        )}
        {!priceList && !readOnly && (
          <Alert tone="info">This kiln has no prices yet, so potters cannot see what a firing costs. Set them here.</Alert>
        )}
        {formError && <Alert tone="danger">{formError}</Alert>}
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Price by" error={errors.model?.message}>
            {(a11y) => (
              <Select {...a11y} {...register('model')}>
                <option value="volume">Volume of each piece</option>
                <option value="shelf">Shelf space</option>
                <option value="kiln">The whole kiln</option>
              </Select>
            )}
          </Field>
          <Field label="Currency" error={errors.currency?.message}>
            {(a11y) => <TextInput {...a11y} maxLength={3} autoComplete="off" className="uppercase" {...register('currency')} />}
          </Field>
        </div>
        {model === 'volume' && (
          <div className="grid gap-4 sm:grid-cols-2">
            <Field label="Measured per">
              {(a11y) => (
                <Select
                  {...a11y}
                  value={volumeUnit}
                  onChange={(e) => {
                    const next = e.target.value as VolumeUnit
                    setVolumeUnit(next)
                    setValue(next === 'cubicInch' ? 'centsPerLitre' : 'centsPerCubicInch', undefined)
                  }}
                >
                  <option value="cubicInch">Cubic inch (height × width × depth)</option>
                  <option value="litre">Litre (height × width × depth)</option>
                </Select>
              )}
            </Field>
            {volumeUnit === 'cubicInch' ? (
              <MeasureField
                control={control}
                name="centsPerCubicInch"
                label="Price per cubic inch"
                measure={rate}
                units={units}
                hint="Often a few cents: 0.04 is 4 ¢."
              />
            ) : (
              <MeasureField control={control} name="centsPerLitre" label="Price per litre" measure={rate} units={units} />
            )}
          </div>
        )}
        {model === 'shelf' && (
          <div className="grid gap-4 sm:grid-cols-2">
            <MeasureField control={control} name="shelfCents" label="Price of a whole shelf" measure={money} units={units} />
            <Field label="Sold in" error={errors.shelfStep?.message}>
              {(a11y) => (
                <Select {...a11y} {...register('shelfStep', { setValueAs: (v) => (v === '' || v === undefined ? undefined : Number(v)) })}>
                  <option value="">Quarter shelves (the default)</option>
                  {SHELF_STEPS.map((s) => (
                    <option key={s.value} value={s.value}>
                      {s.label}
                    </option>
                  ))}
                </Select>
              )}
            </Field>
          </div>
        )}
        {model === 'kiln' && (
          <MeasureField control={control} name="kilnCents" label="Price of the whole kiln" measure={money} units={units} />
        )}
        <MeasureField
          control={control}
          name="minimumPerPieceCents"
          label="Minimum per piece"
          measure={money}
          units={units}
          hint="Optional: the least a piece costs, however small."
        />
        <fieldset>
          <legend className="mb-2 text-sm font-medium text-slip-800">Surcharges, as a percent of the price (optional)</legend>
          <div className="grid gap-4 sm:grid-cols-3">
            <MeasureField control={control} name="surcharges.reduction" label="Reduction" measure={PERCENT} units={units} />
            <MeasureField control={control} name="surcharges.slowCool" label="Slow cooling" measure={PERCENT} units={units} />
            <MeasureField control={control} name="surcharges.preheat" label="Long preheat" measure={PERCENT} units={units} />
          </div>
        </fieldset>
        <fieldset>
          <legend className="mb-2 text-sm font-medium text-slip-800">Deposit when you take ware on</legend>
          <div className="grid gap-4 sm:grid-cols-2">
            <Field label="Deposit is">
              {(a11y) => (
                <Select
                  {...a11y}
                  value={depositKind}
                  onChange={(e) => {
                    const next = e.target.value as 'percent' | 'fixed'
                    setDepositKind(next)
                    setValue('deposit', next === 'percent' ? { percent: 25 } : { fixedCents: 1000 }, { shouldDirty: true })
                  }}
                >
                  <option value="percent">A percent of the price</option>
                  <option value="fixed">A fixed sum</option>
                </Select>
              )}
            </Field>
            {depositKind === 'percent' ? (
              <MeasureField control={control} name="deposit.percent" label="Deposit" measure={PERCENT} units={units} />
            ) : (
              <MeasureField control={control} name="deposit.fixedCents" label="Deposit" measure={money} units={units} />
            )}
          </div>
          {errors.deposit?.message && (
            <p className="mt-1 text-xs font-medium text-danger-700" role="alert">
              {errors.deposit.message}
            </p>
          )}
        </fieldset>
        {!readOnly && (
          <div className="flex flex-wrap items-center justify-end gap-3">
            {saved && !formState.isDirty && (
              <span role="status" className="text-sm text-celadon-700">
                Prices saved.
              </span>
            )}
            <Button type="submit" busy={formState.isSubmitting}>
              Save prices
            </Button>
          </div>
        )}
      </fieldset>
      <Card as="div" className="h-fit bg-slip-50">
        <h3 className="font-semibold">Example prices</h3>
        <p className="mt-1 text-xs text-slip-600">The reference pieces every studio page shows, in a cone 6 glaze firing of this kiln.</p>
        {examples ? (
          <ul className="mt-3 space-y-3" data-testid="example-quotes">
            {examples.map(({ label, quote }) => (
              <li key={label} className="text-sm">
                <p className="font-medium">{label}</p>
                <ul className="mt-1 space-y-0.5 text-slip-600">
                  {quote.lines.map((line) => (
                    <li key={line.label} className="flex justify-between gap-2">
                      <span>{line.label}</span>
                      <span>{formatMoney(line.amountCents, quote.currency)}</span>
                    </li>
                  ))}
                </ul>
                <p className="mt-1 flex justify-between font-semibold" data-testid="example-total">
                  <span>Total</span>
                  <span>{formatMoney(quote.totalCents, quote.currency)}</span>
                </p>
                <p className="flex justify-between text-xs text-slip-500">
                  <span>Deposit</span>
                  <span>{formatMoney(quote.depositCents, quote.currency)}</span>
                </p>
              </li>
            ))}
          </ul>
        ) : (
          <p className="mt-3 text-sm text-slip-600">Fill in the prices to see what these pieces would cost.</p>
        )}
      </Card>
    </form>
  )
}
