import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { Link } from 'react-router-dom'
import { passwordResetRequestSchema } from '../../../../shared/schemas/auth'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Field, TextInput } from '../../../components/ui/Field'
import { applyServerErrors } from '../../../lib/forms'
import { useRequestPasswordReset } from '../api/auth'
import { AuthCard } from '../components/AuthCard'

export function ForgotPasswordPage() {
  const request = useRequestPasswordReset()
  const [formError, setFormError] = useState<string | null>(null)
  const { register, handleSubmit, setError, formState } = useForm<{ email: string }>({ resolver: zodResolver(passwordResetRequestSchema) })

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null)
    try {
      await request.mutateAsync(values)
    } catch (error) {
      setFormError(applyServerErrors(error, setError))
    }
  })

  return (
    <AuthCard
      title="Set a new password"
      lead="We will mail you a link that sets a new password."
      footer={
        <Link className="text-clay-700 hover:underline" to="/sign-in">
          Back to sign in
        </Link>
      }
    >
      {request.isSuccess ? (
        <Alert tone="success" title="Check your mail">
          If that address has a Conewright account, a link is on its way. It works once, for one hour.
        </Alert>
      ) : (
        <form onSubmit={onSubmit} noValidate className="space-y-4">
          {formError && <Alert tone="danger">{formError}</Alert>}
          <Field label="E-mail" error={formState.errors.email?.message}>
            {(a11y) => <TextInput {...a11y} type="email" autoComplete="email" {...register('email')} />}
          </Field>
          <Button type="submit" className="w-full" busy={formState.isSubmitting}>
            Mail me a link
          </Button>
        </form>
      )}
    </AuthCard>
  )
}
