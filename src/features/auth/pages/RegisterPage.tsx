import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { Link, useNavigate } from 'react-router-dom'
import { registerSchema, type RegisterBody } from '../../../../shared/schemas/auth'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Field, TextInput } from '../../../components/ui/Field'
import { applyServerErrors } from '../../../lib/forms'
import { useRegister } from '../api/auth'
import { AuthCard } from '../components/AuthCard'
import { homePath } from '../homePath'

const ROLE_CHOICES = [
  { value: 'potter', title: 'I bring ware', text: 'Find a kiln that can fire your pieces and ask for space in a firing.' },
  { value: 'host', title: 'I fire kilns', text: 'Post your kilns’ limits and your firings, and take on ware from potters nearby.' },
] as const

export function RegisterPage() {
  const navigate = useNavigate()
  const registerUser = useRegister()
  const [formError, setFormError] = useState<string | null>(null)
  const { register, handleSubmit, setError, formState, watch } = useForm<RegisterBody>({
    resolver: zodResolver(registerSchema),
    defaultValues: { role: 'potter' },
  })
  const role = watch('role')

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null)
    try {
      const user = await registerUser.mutateAsync(values)
      navigate(homePath(user!), { replace: true })
    } catch (error) {
      setFormError(applyServerErrors(error, setError))
    }
  })

  return (
    <AuthCard
      title="Make an account"
      lead="One account for bringing ware and for running a kiln room."
      footer={
        <>
          Already have one?{' '}
          <Link className="font-semibold text-clay-700 hover:underline" to="/sign-in">
            Sign in
          </Link>
        </>
      }
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        {formError && <Alert tone="danger">{formError}</Alert>}
        <fieldset>
          <legend className="mb-2 text-sm font-medium text-slip-800">What brings you here?</legend>
          <div className="grid gap-2 sm:grid-cols-2">
            {ROLE_CHOICES.map((choice) => (
              <label
                key={choice.value}
                className={`cursor-pointer rounded-control border p-3 text-sm ${role === choice.value ? 'border-clay-500 bg-clay-50' : 'border-slip-200 bg-white hover:border-slip-300'}`}
              >
                <input type="radio" value={choice.value} className="sr-only" {...register('role')} />
                <span className="block font-semibold">{choice.title}</span>
                <span className="mt-0.5 block text-slip-600">{choice.text}</span>
              </label>
            ))}
          </div>
          {formState.errors.role && <p className="mt-1 text-xs text-danger-700">{formState.errors.role.message}</p>}
        </fieldset>
        <Field label="Your name" hint="Shown to studios and potters you work with." error={formState.errors.displayName?.message}>
          {(a11y) => <TextInput {...a11y} autoComplete="name" {...register('displayName')} />}
        </Field>
        <Field label="E-mail" error={formState.errors.email?.message}>
          {(a11y) => <TextInput {...a11y} type="email" autoComplete="email" {...register('email')} />}
        </Field>
        <Field label="Password" hint="At least 10 characters; a few unrelated words work well." error={formState.errors.password?.message}>
          {(a11y) => <TextInput {...a11y} type="password" autoComplete="new-password" {...register('password')} />}
        </Field>
        <Button type="submit" className="w-full" busy={formState.isSubmitting}>
          Make my account
        </Button>
      </form>
    </AuthCard>
  )
}
