import { isRouteErrorResponse, useRouteError } from 'react-router-dom'
import { Logo } from '../components/Logo'
import { ButtonLink } from '../components/ui/Button'

// What browsers say when a page's chunk cannot be fetched: after a new release (the old hashed
// files are gone) or when the connection dropped.
const CHUNK_FAILED = /dynamically imported module|Importing a module script failed|error loading dynamically imported module/i

/** The router's error boundary: something broke while drawing a page. */
export function ErrorPage() {
  const error = useRouteError()
  const chunkFailed = error instanceof Error && CHUNK_FAILED.test(error.message)
  const message = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : 'Unknown error'
  return (
    <div className="mx-auto max-w-lg px-4 py-16">
      <Logo />
      <h1 className="mt-8 text-2xl font-bold">{chunkFailed ? 'This page did not arrive' : 'This page cracked in the firing'}</h1>
      <p className="mt-2 text-slip-600">
        {chunkFailed
          ? 'Its part of Conewright could not be loaded: the connection dropped, or a newer Conewright came out while this tab was open. Reload to fetch it again.'
          : 'Something went wrong while showing it. Nothing you entered was sent twice; reload to try again.'}
      </p>
      <pre className="mt-4 overflow-auto rounded-control bg-slip-100 p-3 text-xs text-slip-700">{message}</pre>
      <div className="mt-6 flex gap-2">
        <button
          type="button"
          className="rounded-control bg-clay-600 px-4 py-2 text-sm font-semibold text-white"
          onClick={() => window.location.reload()}
        >
          Reload
        </button>
        <ButtonLink to="/" variant="secondary">
          Go to the start
        </ButtonLink>
      </div>
    </div>
  )
}

export function NotFoundPage() {
  return (
    <div className="mx-auto max-w-lg py-16 text-center">
      <p className="text-sm font-semibold uppercase tracking-wide text-clay-600">404</p>
      <h1 className="mt-2 text-2xl font-bold">No such page</h1>
      <p className="mt-2 text-slip-600">The address may be mistyped, or the page was taken down.</p>
      <div className="mt-6">
        <ButtonLink to="/">Go to the start</ButtonLink>
      </div>
    </div>
  )
}
