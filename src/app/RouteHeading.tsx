import { Outlet, useMatches } from 'react-router-dom'
import { PageHeader } from '../components/ui/Card'
import type { PageHandle } from './router'

/** The heading of the open route, when the route names one (handle.heading). */
export function useRouteHeading() {
  return (useMatches().at(-1)?.handle as PageHandle | undefined)?.heading
}

/**
 * Draws the heading a route names above its page. It stays the same element while the page's code
 * arrives and after, so what the reader sees first (often drawn into the HTML by the build) is not
 * drawn a second time.
 */
export function RouteHeading() {
  const heading = useRouteHeading()
  return (
    <>
      {heading && <PageHeader title={heading.title} lead={heading.lead} />}
      <Outlet />
    </>
  )
}
