import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { Link, useNavigate, useSearchParams } from 'react-router-dom'
import { loginSchema, type LoginBody } from '../../../../shared/schemas/auth'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Field, TextInput } from '../../../components/ui/Field'
import { applyServerErrors } from '../../../lib/forms'
import { useSignIn } from '../api/auth'
import { AuthCard } from '../components/AuthCard'
import { homePath } from '../homePath'

export function SignInPage() {
  const navigate = useNavigate()
  const [params] = useSearchParams()
  const signIn = useSignIn()
  const [formError, setFormError] = useState<string | null>(null)
  const { register, handleSubmit, setError, formState } = useForm<LoginBody>({ resolver: zodResolver(loginSchema) })

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null)
    try {
      const user = await signIn.mutateAsync(values)
      const next = params.get('next')
      navigate(next?.startsWith('/') && !next.startsWith('//') ? next : homePath(user!), { replace: true })
    } catch (error) {
      setFormError(applyServerErrors(error, setError))
    }
  })

  return (
    <AuthCard
      title="Sign in"
      lead="Pick up where you left your ware."
      footer={
        <>
          New here?{' '}
          <Link className="font-semibold text-clay-700 hover:underline" to="/join">
            Make an account
          </Link>
        </>
      }
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        {formError && <Alert tone="danger">{formError}</Alert>}
        <Field label="E-mail" error={formState.errors.email?.message}>
          {(a11y) => <TextInput {...a11y} type="email" autoComplete="email" {...register('email')} />}
        </Field>
        <Field label="Password" error={formState.errors.password?.message}>
          {(a11y) => <TextInput {...a11y} type="password" autoComplete="current-password" {...register('password')} />}
        </Field>
        <div className="flex items-center justify-between">
          <Link to="/forgot-password" className="text-sm text-clay-700 hover:underline">
            Forgot your password?
          </Link>
          <Button type="submit" busy={formState.isSubmitting}>
            Sign in
          </Button>
        </div>
      </form>
    </AuthCard>
  )
}
