import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { studioCreateSchema } from '../../../../shared/schemas/studios'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Field, TextInput } from '../../../components/ui/Field'
import { applyServerErrors } from '../../../lib/forms'
import { useCreateStudio } from '../api/studios'
import type { MemberStudio } from '../api/types'

type StudioCreateInput = z.input<typeof studioCreateSchema>
const emptyToUndefined = (value: unknown) => (typeof value === 'string' && value.trim() === '' ? undefined : value)

/** A name and where it is: enough for a draft studio; the rest is filled in on the studio's settings. */
export function StudioCreateForm({ onCreated }: { onCreated: (studio: MemberStudio) => void }) {
  const create = useCreateStudio()
  const [byAddress, setByAddress] = useState(false)
  const [formError, setFormError] = useState<string | null>(null)
  const { register, handleSubmit, setError, setValue, formState } = useForm<
    StudioCreateInput,
    unknown,
    z.output<typeof studioCreateSchema>
  >({
    resolver: zodResolver(studioCreateSchema),
  })

  const onSubmit = handleSubmit(async (body) => {
    setFormError(null)
    try {
      onCreated(await create.mutateAsync(body))
    } catch (error) {
      setFormError(applyServerErrors(error, setError))
    }
  })

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="New studio">
      {formError && <Alert tone="danger">{formError}</Alert>}
      <Field label="Studio name" error={formState.errors.name?.message}>
        {(a11y) => <TextInput {...a11y} autoComplete="organization" {...register('name')} />}
      </Field>
      {byAddress ? (
        <Field
          label="Street address"
          hint="With the town and state, or the ZIP code."
          error={formState.errors.address?.message ?? formState.errors.postalCode?.message}
        >
          {(a11y) => <TextInput {...a11y} autoComplete="street-address" {...register('address', { setValueAs: emptyToUndefined })} />}
        </Field>
      ) : (
        <Field
          label="Postal code"
          hint="Puts the studio on the map; you can move the pin afterwards."
          error={formState.errors.postalCode?.message}
        >
          {(a11y) => (
            <TextInput
              {...a11y}
              autoComplete="postal-code"
              inputMode="text"
              className="max-w-40"
              {...register('postalCode', { setValueAs: emptyToUndefined })}
            />
          )}
        </Field>
      )}
      <button
        type="button"
        className="text-sm font-medium text-clay-700 hover:underline"
        onClick={() => {
          setValue(byAddress ? 'address' : 'postalCode', undefined)
          setByAddress(!byAddress)
        }}
      >
        {byAddress ? 'Use a postal code instead' : 'Give the street address instead'}
      </button>
      <div>
        <Button type="submit" busy={formState.isSubmitting}>
          Set up the studio
        </Button>
      </div>
    </form>
  )
}
