import { zoneCity, zoneName } from '../../../../shared/dates'
import { zodResolver } from '@hookform/resolvers/zod'
import { lazy, Suspense, useMemo, useState } from 'react'
import { useForm, useWatch, type FieldNamesMarkedBoolean } from 'react-hook-form'
import { useParams } from 'react-router-dom'
import type { z } from 'zod'
import { DAMAGE_CHARGE_KINDS, DAMAGE_CHARGE_LABELS, damageChargesOf } from '../../../../shared/claims'
import { CLAY_BODIES, studioPatchSchema, type StudioPatchBody } from '../../../../shared/schemas/studios'
import { MapPlaceholder } from '../../../components/map/MapPlaceholder'
import { Alert } from '../../../components/ui/Alert'
import { Button, ButtonLink } from '../../../components/ui/Button'
import { Card, PageHeader } from '../../../components/ui/Card'
import { Checkbox, Field, Select, TextArea, TextInput } from '../../../components/ui/Field'
import { MeasureField } from '../../../components/ui/MeasureField'
import { Spinner } from '../../../components/ui/Spinner'
import { applyServerErrors } from '../../../lib/forms'
import { moneyMeasure } from '../../../lib/units'
import { useStudio, useUpdateStudio } from '../api/studios'
import { isMemberView, type MemberStudio } from '../api/types'
import { ApiProblem } from '../components/ApiProblem'
import { StudioNav } from '../components/StudioNav'

type StudioInput = z.input<typeof studioPatchSchema>
type StudioOutput = z.output<typeof studioPatchSchema>

const CURRENCIES = ['USD', 'CAD', 'EUR', 'GBP', 'AUD', 'NZD']
const CLAY_BODY_LABELS: Record<(typeof CLAY_BODIES)[number], string> = {
  earthenware: 'Earthenware',
  stoneware: 'Stoneware',
  porcelain: 'Porcelain',
  other: 'Other bodies',
}
const emptyToUndefined = (value: unknown) => (typeof value === 'string' && value.trim() === '' ? undefined : value)
const emptyToNull = (value: unknown) => (typeof value === 'string' && value.trim() === '' ? null : value)

function formValues(studio: MemberStudio): StudioInput {
  return {
    name: studio.name,
    description: studio.description,
    address: studio.address,
    postalCode: studio.postalCode ?? undefined,
    lat: studio.lat,
    lng: studio.lng,
    timezone: studio.timezone,
    currency: studio.currency,
    dropOffHours: studio.dropOffHours,
    // A studio that has set no damage charges sees the defaults it is held to (shared/claims.ts).
    policies: { ...studio.policies, damageCharges: damageChargesOf(studio.policies) },
    published: studio.published,
  }
}

/**
 * Only what was changed is sent: a new address alone moves the pin on the server, a dragged pin is
 * sent as lat and lng together and wins over the address.
 */
function changedFields(studio: MemberStudio, values: StudioOutput, dirty: Partial<FieldNamesMarkedBoolean<StudioInput>>): StudioPatchBody {
  const body: Record<string, unknown> = {}
  for (const key of Object.keys(dirty) as (keyof StudioOutput)[]) {
    if (key === 'lat' || key === 'lng') continue
    body[key] = values[key]
  }
  // Defaults shown but not touched stay defaults, so a studio keeps following them if they change.
  const chargesTouched = Object.values(dirty.policies?.damageCharges ?? {}).some(Boolean)
  if (body.policies && values.policies && !studio.policies.damageCharges && !chargesTouched) {
    const { damageCharges: _shown, ...policies } = values.policies
    body.policies = policies
  }
  if (dirty.lat || dirty.lng) Object.assign(body, { lat: values.lat, lng: values.lng })
  return body as StudioPatchBody
}

// The pin map (Leaflet) comes after the form, which is what most edits are about.
const PinPicker = lazy(() => import('../../../components/map/PinPicker').then((m) => ({ default: m.PinPicker })))

export function StudioEditorPage() {
  const { id = '' } = useParams()
  const studio = useStudio(id)
  if (studio.isPending) return <Spinner label="Loading the studio…" />
  if (studio.isError) return <ApiProblem error={studio.error} what="this studio" onRetry={() => studio.refetch()} />
  const found = studio.data
  if (!isMemberView(found) || found.myRole !== 'owner') {
    return (
      <>
        <PageHeader title={found.name} />
        {isMemberView(found) && <StudioNav studioId={found.id} role={found.myRole} />}
        <Alert tone="warning" title="Only the studio’s owner changes its settings">
          Crew run the firing calendar; the owner sets the studio’s address, terms and prices.
        </Alert>
      </>
    )
  }
  return <StudioEditor key={found.id} studio={found} />
}

function StudioEditor({ studio }: { studio: MemberStudio }) {
  const update = useUpdateStudio(studio.id)
  const [formError, setFormError] = useState<string | null>(null)
  const [saved, setSaved] = useState(false)
  const { register, control, handleSubmit, setError, setValue, reset, formState } = useForm<StudioInput, unknown, StudioOutput>({
    resolver: zodResolver(studioPatchSchema),
    defaultValues: formValues(studio),
  })
  const [lat, lng, timezone, currency] = useWatch({ control, name: ['lat', 'lng', 'timezone', 'currency'] })
  const errors = formState.errors
  const zones = useMemo(() => {
    const all = Intl.supportedValuesOf('timeZone')
    return timezone && !all.includes(timezone) ? [timezone, ...all] : all
  }, [timezone])
  const currencies = currency && !CURRENCIES.includes(currency) ? [currency, ...CURRENCIES] : CURRENCIES
  const money = moneyMeasure(currency ?? studio.currency)

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null)
    setSaved(false)
    const body = changedFields(studio, values, formState.dirtyFields)
    if (Object.keys(body).length === 0) return setSaved(true)
    try {
      const next = await update.mutateAsync(body)
      reset(formValues(next))
      setSaved(true)
    } catch (error) {
      setFormError(applyServerErrors(error, setError))
    }
  })

  return (
    <>
      <PageHeader
        title="Studio settings"
        lead={studio.name}
        actions={
          <ButtonLink to={`/studios/${studio.id}`} variant="secondary">
            View public page
          </ButtonLink>
        }
      />
      <StudioNav studioId={studio.id} role="owner" />
      <form onSubmit={onSubmit} noValidate className="space-y-6" aria-label="Studio settings">
        {formError && <Alert tone="danger">{formError}</Alert>}

        <Card>
          <h2 className="mb-4 font-semibold">About the studio</h2>
          <div className="space-y-4">
            <Field label="Name" error={errors.name?.message}>
              {(a11y) => <TextInput {...a11y} {...register('name')} />}
            </Field>
            <Field
              label="Description"
              hint="What kind of studio it is, what you fire, how to find the door."
              error={errors.description?.message}
            >
              {(a11y) => <TextArea {...a11y} rows={4} {...register('description')} />}
            </Field>
            <Field label="Drop-off hours" hint="e.g. “Tue–Sat 10 am–6 pm; ring the side bell.”" error={errors.dropOffHours?.message}>
              {(a11y) => <TextInput {...a11y} {...register('dropOffHours')} />}
            </Field>
            <div className="grid gap-4 sm:grid-cols-2">
              <Field label="Time zone" hint="Deadlines and firing times are shown in this zone." error={errors.timezone?.message}>
                {(a11y) => (
                  <Select {...a11y} {...register('timezone')}>
                    {zones.map((zone) => (
                      <option key={zone} value={zone}>
                        {zoneName(zone)} ({zoneCity(zone)})
                      </option>
                    ))}
                  </Select>
                )}
              </Field>
              <Field label="Currency" error={errors.currency?.message}>
                {(a11y) => (
                  <Select {...a11y} {...register('currency')}>
                    {currencies.map((code) => (
                      <option key={code} value={code}>
                        {code}
                      </option>
                    ))}
                  </Select>
                )}
              </Field>
            </div>
          </div>
        </Card>

        <Card>
          <h2 className="mb-1 font-semibold">Where it is</h2>
          <p className="mb-4 text-sm text-slip-600">
            Potters see the town and the pin; the street address is shown only once you take their ware on.
          </p>
          <div className="grid gap-4 sm:grid-cols-[1fr_10rem]">
            <Field
              label="Street address"
              hint="Changing it moves the pin, unless you move the pin yourself too."
              error={errors.address?.message}
            >
              {(a11y) => <TextInput {...a11y} autoComplete="street-address" {...register('address', { setValueAs: emptyToNull })} />}
            </Field>
            <Field label="Postal code" error={errors.postalCode?.message}>
              {(a11y) => <TextInput {...a11y} autoComplete="postal-code" {...register('postalCode', { setValueAs: emptyToUndefined })} />}
            </Field>
          </div>
          <p className="mt-2 text-sm text-slip-600">
            Now placed in {[studio.city, studio.region, studio.country].filter(Boolean).join(', ')}.
          </p>
          <div className="mt-4">
            <Suspense fallback={<MapPlaceholder className="h-72 rounded-card border border-slip-200" label="Studio location" />}>
              <PinPicker
                value={{ lat: lat ?? studio.lat, lng: lng ?? studio.lng }}
                onChange={(p) => {
                  setValue('lat', p.lat, { shouldDirty: true })
                  setValue('lng', p.lng, { shouldDirty: true })
                }}
              />
            </Suspense>
            {errors.lat && (
              <p className="mt-1 text-xs font-medium text-danger-700" role="alert">
                {errors.lat.message}
              </p>
            )}
          </div>
        </Card>

        <Card>
          <h2 className="mb-4 font-semibold">Your terms</h2>
          <div className="space-y-5">
            <fieldset>
              <legend className="mb-2 text-sm font-medium text-slip-800">Clay bodies you take</legend>
              <div className="flex flex-wrap gap-4">
                {CLAY_BODIES.map((body) => (
                  <Checkbox key={body} label={CLAY_BODY_LABELS[body]} value={body} {...register('policies.clayBodies')} />
                ))}
              </div>
              {errors.policies?.clayBodies && (
                <p className="mt-1 text-xs font-medium text-danger-700" role="alert">
                  {errors.policies.clayBodies.message ?? errors.policies.clayBodies.root?.message}
                </p>
              )}
            </fieldset>
            <Field
              label="Ware requirements"
              hint="What ware must be like to come in: bone dry, clean feet, cookies under runny glazes…"
              error={errors.policies?.wareRequirements?.message}
            >
              {(a11y) => <TextArea {...a11y} rows={3} {...register('policies.wareRequirements')} />}
            </Field>
            <fieldset>
              <legend className="mb-2 text-sm font-medium text-slip-800">When a potter withdraws</legend>
              <div className="grid gap-4 sm:grid-cols-3">
                <Field
                  label="Everything paid comes back until (days before the firing)"
                  error={errors.policies?.cancellation?.fullRefundDaysBefore?.message}
                >
                  {(a11y) => (
                    <TextInput
                      {...a11y}
                      type="number"
                      min={0}
                      max={90}
                      inputMode="numeric"
                      {...register('policies.cancellation.fullRefundDaysBefore', { valueAsNumber: true })}
                    />
                  )}
                </Field>
                <Field label="Share that comes back after that (%)" error={errors.policies?.cancellation?.laterRefundPercent?.message}>
                  {(a11y) => (
                    <TextInput
                      {...a11y}
                      type="number"
                      min={0}
                      max={100}
                      inputMode="decimal"
                      {...register('policies.cancellation.laterRefundPercent', { valueAsNumber: true })}
                    />
                  )}
                </Field>
                <Field
                  label="Deposit hold (hours)"
                  hint="How long ware you take on waits for its deposit before the space comes back to you."
                  error={errors.policies?.depositHoldHours?.message}
                >
                  {(a11y) => (
                    <TextInput
                      {...a11y}
                      type="number"
                      min={1}
                      max={336}
                      inputMode="numeric"
                      {...register('policies.depositHoldHours', { valueAsNumber: true })}
                    />
                  )}
                </Field>
              </div>
            </fieldset>
            <fieldset>
              <legend className="mb-1 text-sm font-medium text-slip-800">When a potter’s ware does damage: the most you charge</legend>
              <p className="mb-2 text-xs text-slip-600">
                A claim you raise on an incident may ask up to these amounts. 0 means you do not charge for it, and a claim for it is
                refused.
              </p>
              <div className="grid gap-4 sm:grid-cols-2">
                {DAMAGE_CHARGE_KINDS.map((kind) => (
                  <MeasureField
                    key={kind}
                    control={control}
                    name={`policies.damageCharges.${kind}`}
                    label={DAMAGE_CHARGE_LABELS[kind]}
                    measure={money}
                    // Money messages name no unit to convert.
                    units="metric"
                  />
                ))}
              </div>
            </fieldset>
          </div>
        </Card>

        <Card>
          <h2 className="mb-3 font-semibold">On Conewright</h2>
          <Checkbox label="Published: potters can find this studio, its kilns and firings" {...register('published')} />
          <p className="mt-2 text-xs text-slip-500">A draft is seen only by you and your crew.</p>
        </Card>

        <div className="sticky bottom-0 -mx-4 flex flex-wrap items-center justify-end gap-3 border-t border-slip-200 bg-slip-50/95 px-4 py-3">
          {formState.isDirty ? (
            <span className="text-sm text-slip-600">Unsaved changes</span>
          ) : (
            saved && (
              <span role="status" className="text-sm text-celadon-700">
                Saved.
              </span>
            )
          )}
          <Button type="submit" busy={formState.isSubmitting}>
            Save settings
          </Button>
        </div>
      </form>
    </>
  )
}
