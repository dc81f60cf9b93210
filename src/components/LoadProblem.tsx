import type { ReactNode } from 'react'
import { ApiError } from '../lib/api'
import { Alert } from './ui/Alert'
import { ButtonLink } from './ui/Button'
import { EmptyState } from './ui/Card'

export interface LoadProblemProps {
  error: unknown
  /** What failed to load, in words: "the request", "this studio". */
  what?: string
  onRetry?: () => void
  back?: { to: string; label: string }
  /** What a 404 most likely means where this is shown. */
  notFoundHint?: ReactNode
  /** What to do about a 403 where this is shown (after the server's own message). */
  forbiddenHint?: ReactNode
}

/** A failed load in words people can act on: not there, not theirs, signed out, or try again. */
export function LoadProblem({
  error,
  what = 'this page',
  onRetry,
  back = { to: '/', label: 'Go to the start' },
  notFoundHint,
  forbiddenHint,
}: LoadProblemProps) {
  if (error instanceof ApiError && error.status === 404) {
    return (
      <EmptyState
        title={`We could not find ${what}`}
        action={
          <ButtonLink to={back.to} variant="secondary">
            {back.label}
          </ButtonLink>
        }
      >
        {notFoundHint ?? 'The link may be old. Check the link you followed.'}
      </EmptyState>
    )
  }
  if (error instanceof ApiError && error.status === 403) {
    return (
      <Alert tone="warning" title="This is not open to you">
        {error.message} {forbiddenHint}
      </Alert>
    )
  }
  if (error instanceof ApiError && error.status === 401) {
    return (
      <Alert tone="warning" title="Sign in first">
        Your session ended. Sign in again to carry on.
      </Alert>
    )
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
