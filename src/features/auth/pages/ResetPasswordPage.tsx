import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { Link, useSearchParams } from 'react-router-dom'
import { passwordResetConfirmSchema } from '../../../../shared/schemas/auth'
import { Alert } from '../../../components/ui/Alert'
import { Button, ButtonLink } from '../../../components/ui/Button'
import { Field, TextInput } from '../../../components/ui/Field'
import { applyServerErrors } from '../../../lib/forms'
import { useConfirmPasswordReset } from '../api/auth'
import { AuthCard } from '../components/AuthCard'

export function ResetPasswordPage() {
  const [params] = useSearchParams()
  const confirm = useConfirmPasswordReset()
  const [formError, setFormError] = useState<string | null>(null)
  const { register, handleSubmit, setError, formState } = useForm<{ token: string; password: string }>({
    resolver: zodResolver(passwordResetConfirmSchema),
    defaultValues: { token: params.get('token') ?? '' },
  })

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null)
    try {
      await confirm.mutateAsync(values)
    } catch (error) {
      setFormError(applyServerErrors(error, setError))
    }
  })

  if (confirm.isSuccess) {
    return (
      <AuthCard title="Password changed">
        <div className="space-y-4">
          <Alert tone="success">Your new password is set, and you are signed out everywhere else. Sign in with it now.</Alert>
          <ButtonLink to="/sign-in">Sign in</ButtonLink>
        </div>
      </AuthCard>
    )
  }

  return (
    <AuthCard
      title="Choose a new password"
      footer={
        <Link className="text-clay-700 hover:underline" to="/forgot-password">
          Ask for a new link
        </Link>
      }
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        {(formError || formState.errors.token) && <Alert tone="danger">{formError ?? formState.errors.token?.message}</Alert>}
        <input type="hidden" {...register('token')} />
        <Field
          label="New password"
          hint="At least 10 characters; a few unrelated words work well."
          error={formState.errors.password?.message}
        >
          {(a11y) => <TextInput {...a11y} type="password" autoComplete="new-password" {...register('password')} />}
        </Field>
        <Button type="submit" className="w-full" busy={formState.isSubmitting}>
          Set password
        </Button>
      </form>
    </AuthCard>
  )
}
