import { useRouteHeading } from './RouteHeading'

/**
 * Shown in the page's place while its code arrives on a first visit: the shape of a page (a title
 * unless the route draws its own heading above, two cards) in the slip colours, so the layout does
 * not jump when the page comes in.
 */
export function PageSkeleton() {
  const heading = useRouteHeading()
  return (
    <div role="status" aria-live="polite" data-testid="page-skeleton">
      <span className="sr-only">Loading the page…</span>
      {!heading && (
        <div className="mb-6 animate-pulse space-y-3" aria-hidden>
          <div className="h-8 w-2/3 max-w-md rounded-control bg-slip-200" />
          <div className="h-4 w-full max-w-xl rounded-control bg-slip-100" />
        </div>
      )}
      <div className="grid animate-pulse gap-4 md:grid-cols-2" aria-hidden>
        {[0, 1].map((i) => (
          <div key={i} className="space-y-3 rounded-card border border-slip-200 bg-white p-5 shadow-card">
            <div className="h-4 w-1/3 rounded-control bg-slip-200" />
            <div className="h-3 w-full rounded-control bg-slip-100" />
            <div className="h-3 w-5/6 rounded-control bg-slip-100" />
            <div className="h-3 w-2/3 rounded-control bg-slip-100" />
          </div>
        ))}
      </div>
    </div>
  )
}
