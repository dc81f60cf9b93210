import { Alert } from '../../../components/ui/Alert'
import { ButtonLink } from '../../../components/ui/Button'
import { EmptyState } from '../../../components/ui/Card'
import { ApiError } from '../../../lib/api'

/** A failed load in words people can act on: not there (or not theirs, which looks the same), or try again. */
export function RequestProblem({ error, what, onRetry, back = { to: '/', label: 'Go to the start' } }: { error: unknown; what: string; onRetry?: () => void; back?: { to: string; label: string } }) {
  if (error instanceof ApiError && error.status === 404) {
    return (
      <EmptyState title={`We could not find ${what}`} action={<ButtonLink to={back.to} variant="secondary">{back.label}</ButtonLink>}>
        The link may be old, or it is for another account. Check that you are signed in as the right person.
      </EmptyState>
    )
  }
  if (error instanceof ApiError && error.status === 401) return <Alert tone="warning" title="Sign in first">Your session ended. Sign in again to carry on.</Alert>
  return (
    <Alert tone="danger" title={`Could not load ${what}`}>
      {error instanceof Error ? error.message : 'Something went wrong.'}
      {onRetry && (
        <button type="button" className="ml-2 font-semibold underline" onClick={onRetry}>
          Try again
        </button>
      )}
    </Alert>
  )
}
