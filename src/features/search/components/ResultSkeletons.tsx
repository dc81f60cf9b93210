/** Grey shapes where the first results will be, while they load. */
export function ResultSkeletons({ count = 3 }: { count?: number }) {
  return (
    <div>
      <p role="status" className="sr-only">
        Looking for studios and firings…
      </p>
      <ul className="space-y-3" aria-hidden data-testid="result-skeletons">
        {Array.from({ length: count }, (_, i) => (
          <li key={i} className="animate-pulse rounded-card border border-slip-200 bg-white p-4">
            <div className="h-4 w-1/2 rounded bg-slip-200" />
            <div className="mt-2 h-3 w-1/3 rounded bg-slip-100" />
            <div className="mt-4 flex gap-2">
              <div className="h-5 w-16 rounded-full bg-slip-200" />
              <div className="h-5 w-20 rounded-full bg-slip-100" />
            </div>
            <div className="mt-4 space-y-2">
              <div className="h-3 w-3/4 rounded bg-slip-100" />
              <div className="h-3 w-2/3 rounded bg-slip-100" />
            </div>
          </li>
        ))}
      </ul>
    </div>
  )
}
