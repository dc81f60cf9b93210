import { Alert } from '../../../components/ui/Alert'
import { ButtonLink } from '../../../components/ui/Button'
import { EmptyState } from '../../../components/ui/Card'
import { ApiError } from '../../../lib/api'

/** A failed load in words people can act on: not there (404), not yours (403), or try again. */
export function ApiProblem({ error, what = 'this page', onRetry }: { error: unknown; what?: string; onRetry?: () => void }) {
  if (error instanceof ApiError && error.status === 404) {
    return (
      <EmptyState title={`We could not find ${what}`} action={<ButtonLink to="/" variant="secondary">Go to the start</ButtonLink>}>
        It may have been taken down, or it is not published yet. Check the link you followed.
      </EmptyState>
    )
  }
  if (error instanceof ApiError && error.status === 403) {
    return (
      <Alert tone="warning" title="This is not open to you">
        {error.message} If you work at this studio, ask its owner to invite you to the crew.
      </Alert>
    )
  }
  if (error instanceof ApiError && error.status === 401) {
    return <Alert tone="warning" title="Sign in first">Your session ended. Sign in again to carry on.</Alert>
  }
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
