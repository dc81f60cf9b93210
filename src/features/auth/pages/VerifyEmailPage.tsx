import { useEffect, useRef } from 'react'
import { useSearchParams } from 'react-router-dom'
import { Alert } from '../../../components/ui/Alert'
import { ButtonLink } from '../../../components/ui/Button'
import { Spinner } from '../../../components/ui/Spinner'
import { useMe, useVerifyEmail } from '../api/auth'
import { AuthCard } from '../components/AuthCard'
import { homePath } from '../homePath'

export function VerifyEmailPage() {
  const [params] = useSearchParams()
  const token = params.get('token') ?? ''
  const verify = useVerifyEmail()
  const me = useMe()
  const sent = useRef(false)

  useEffect(() => {
    // The token is single use: send it once even when React mounts the page twice.
    if (token && !sent.current) {
      sent.current = true
      verify.mutate(token)
    }
  }, [token, verify])

  return (
    <AuthCard title="Confirm your address">
      {!token && <Alert tone="danger">This link has no token. Open the link from the mail again.</Alert>}
      {verify.isPending && <Spinner label="Confirming…" />}
      {verify.isError && <Alert tone="danger">{verify.error.message}</Alert>}
      {verify.isSuccess && (
        <div className="space-y-4">
          <Alert tone="success" title="Address confirmed">
            Thanks. Studios and potters can now reach you about firings.
          </Alert>
          <ButtonLink to={me.data ? homePath(me.data) : '/sign-in'}>{me.data ? 'Go to my home' : 'Sign in'}</ButtonLink>
        </div>
      )}
    </AuthCard>
  )
}
