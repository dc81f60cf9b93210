import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { Link, useNavigate, useSearchParams } from 'react-router-dom'
import type { z } from 'zod'
import { formatDate } from '../../../../shared/dates'
import { registerSchema, type PublicUser } from '../../../../shared/schemas/auth'
import { Alert } from '../../../components/ui/Alert'
import { Button, ButtonLink } from '../../../components/ui/Button'
import { Card, EmptyState } from '../../../components/ui/Card'
import { Field, TextInput } from '../../../components/ui/Field'
import { Spinner } from '../../../components/ui/Spinner'
import { ApiError } from '../../../lib/api'
import { applyServerErrors } from '../../../lib/forms'
import { useMe, useRegister, useSignOut } from '../../auth/api/auth'
import { useAcceptInvite, useInviteLookup } from '../api/crew'
import type { InviteDetails } from '../api/types'

/** /join-studio?token=…: the page a crew invitation links to, for people with or without an account. */
export function JoinStudioPage() {
  const [params] = useSearchParams()
  const token = params.get('token')
  const invite = useInviteLookup(token)
  const me = useMe()

  if (!token || token.length < 10) {
    return (
      <EmptyState
        title="This invitation link is incomplete"
        action={
          <ButtonLink to="/" variant="secondary">
            Go to the start
          </ButtonLink>
        }
      >
        Open the link from the mail again, or copy all of it into the address bar.
      </EmptyState>
    )
  }
  if (invite.isPending || me.isPending) return <Spinner label="Checking the invitation…" />
  if (invite.isError) {
    const expired = invite.error instanceof ApiError && invite.error.code === 'bad-token'
    return (
      <div className="mx-auto max-w-lg py-6">
        <Alert
          tone={expired ? 'warning' : 'danger'}
          title={expired ? 'This invitation has been used or has expired' : 'Could not check the invitation'}
        >
          {expired ? 'Ask the studio’s owner to send a new one.' : invite.error.message}
        </Alert>
      </div>
    )
  }
  const details = invite.data
  return (
    <div className="mx-auto w-full max-w-md py-6">
      <Card className="p-6 sm:p-8">
        <p className="text-sm font-semibold uppercase tracking-wide text-clay-600">Crew invitation</p>
        <h1 className="mt-1 text-2xl font-bold tracking-tight" data-testid="invite-studio">
          Join {details.studioName}
        </h1>
        <p className="mt-1 text-sm text-slip-600">
          Sent to <strong data-testid="invite-email">{details.email}</strong>; the link works until{' '}
          {formatDate(details.expiresAt, Intl.DateTimeFormat().resolvedOptions().timeZone)}.
        </p>
        <p className="mt-3 text-sm text-slip-700">Crew post the studio’s firings and move them along from loading to unloading.</p>
        <div className="mt-6">
          {me.data ? <SignedIn user={me.data} invite={details} token={token} /> : <SignedOut invite={details} token={token} />}
        </div>
      </Card>
    </div>
  )
}

function SignedIn({ user, invite, token }: { user: PublicUser; invite: InviteDetails; token: string }) {
  const accept = useAcceptInvite()
  const signOut = useSignOut()
  const navigate = useNavigate()
  if (user.studios?.some((s) => s.id === invite.studioId)) {
    return (
      <Alert tone="success" title="You are already on this crew">
        <Link to="/kiln-room" className="font-semibold underline">
          Go to the kiln room
        </Link>
      </Alert>
    )
  }
  if (user.email !== invite.email) {
    return (
      <div className="space-y-3">
        <Alert tone="warning" title="This invitation is for another address">
          You are signed in as {user.email}. Sign out, then sign in or register with {invite.email}.
        </Alert>
        <Button variant="secondary" busy={signOut.isPending} onClick={() => signOut.mutate()}>
          Sign out
        </Button>
      </div>
    )
  }
  return (
    <div className="space-y-3">
      {accept.isError && <Alert tone="danger">{accept.error.message}</Alert>}
      <Button
        className="w-full"
        busy={accept.isPending}
        onClick={() => accept.mutate(token, { onSuccess: () => navigate('/kiln-room', { replace: true }) })}
      >
        Join the crew
      </Button>
    </div>
  )
}

type RegisterInput = z.input<typeof registerSchema>

function SignedOut({ invite, token }: { invite: InviteDetails; token: string }) {
  const registerUser = useRegister()
  const navigate = useNavigate()
  const [formError, setFormError] = useState<string | null>(null)
  // The server makes an invited account crew whatever role is sent; the schema asks for one.
  const { register, handleSubmit, setError, formState } = useForm<RegisterInput, unknown, z.output<typeof registerSchema>>({
    resolver: zodResolver(registerSchema),
    defaultValues: { email: invite.email, role: 'potter', inviteToken: token, displayName: '', password: '' },
  })
  const next = `/join-studio?token=${encodeURIComponent(token)}`

  const onSubmit = handleSubmit(async (body) => {
    setFormError(null)
    try {
      await registerUser.mutateAsync(body)
      navigate('/kiln-room', { replace: true })
    } catch (error) {
      setFormError(applyServerErrors(error, setError))
    }
  })

  return (
    <div className="space-y-6">
      <p className="text-sm text-slip-700">
        Have an account with {invite.email}?{' '}
        <Link to={`/sign-in?next=${encodeURIComponent(next)}`} className="font-semibold text-clay-700 hover:underline">
          Sign in to join
        </Link>
      </p>
      <form onSubmit={onSubmit} noValidate className="space-y-4 border-t border-slip-200 pt-5" aria-label="Make a crew account">
        <h2 className="font-semibold">New here? Make your account</h2>
        {formError && <Alert tone="danger">{formError}</Alert>}
        <Field label="E-mail" hint="The address the invitation was sent to." error={formState.errors.email?.message}>
          {(a11y) => <TextInput {...a11y} type="email" readOnly {...register('email')} />}
        </Field>
        <Field label="Your name" hint="Shown to the studio and to potters." error={formState.errors.displayName?.message}>
          {(a11y) => <TextInput {...a11y} autoComplete="name" {...register('displayName')} />}
        </Field>
        <Field label="Password" hint="At least 10 characters; a few unrelated words work well." error={formState.errors.password?.message}>
          {(a11y) => <TextInput {...a11y} type="password" autoComplete="new-password" {...register('password')} />}
        </Field>
        <Button type="submit" className="w-full" busy={formState.isSubmitting}>
          Make my account and join
        </Button>
      </form>
    </div>
  )
}
