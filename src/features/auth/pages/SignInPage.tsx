import { zodResolver } from '@hookform/resolvers/zod'
import { useEffect, useRef, useState } from 'react'
import { useForm } from 'react-hook-form'
import { Link, useNavigate, useSearchParams } from 'react-router-dom'
import { loginSchema, type LoginBody, type PublicUser } from '../../../../shared/schemas/auth'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Field, TextInput } from '../../../components/ui/Field'
import { ApiError } from '../../../lib/api'
import { applyServerErrors } from '../../../lib/forms'
import { useRequestSignInLink, useSignIn, useSignInWithLink } from '../api/auth'
import { AuthCard } from '../components/AuthCard'
import { homePath } from '../homePath'

export function SignInPage() {
  const navigate = useNavigate()
  const [params] = useSearchParams()
  const signIn = useSignIn()
  const requestLink = useRequestSignInLink()
  const withLink = useSignInWithLink()
  const [formError, setFormError] = useState<string | null>(null)
  // Password sign-in is paused for this account or address: offer the mailed one-time link instead.
  const [offerLink, setOfferLink] = useState(false)
  const { register, handleSubmit, setError, getValues, formState } = useForm<LoginBody>({ resolver: zodResolver(loginSchema) })

  const goOn = (user: PublicUser | null) => {
    const next = params.get('next')
    navigate(next?.startsWith('/') && !next.startsWith('//') ? next : homePath(user!), { replace: true })
  }

  // Arriving from the mailed link (/sign-in?link=…): spend it once, then go on as after any sign-in.
  const link = params.get('link')
  const spent = useRef(false)
  useEffect(() => {
    if (!link || spent.current) return
    spent.current = true
    withLink.mutateAsync(link).then(goOn, (error) => setFormError(error instanceof ApiError ? error.message : 'That link did not work.'))
    // eslint-disable-next-line react-hooks/exhaustive-deps -- once per link
  }, [link])

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null)
    try {
      goOn(await signIn.mutateAsync(values))
    } catch (error) {
      setOfferLink(error instanceof ApiError && error.status === 429 && error.body.signInLink === true)
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
        {offerLink &&
          (requestLink.isSuccess ? (
            <Alert tone="success">If that address has an account, a one-time sign-in link is on its way. It works for 15 minutes.</Alert>
          ) : (
            <Button
              type="button"
              variant="secondary"
              busy={requestLink.isPending}
              onClick={() => requestLink.mutate({ email: getValues('email') })}
            >
              Mail me a sign-in link
            </Button>
          ))}
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
