export function Spinner({ label = 'Loading…' }: { label?: string }) {
  return (
    <div className="flex items-center gap-3 py-8 text-sm text-slip-600" role="status" aria-live="polite">
      <span className="size-5 animate-spin rounded-full border-2 border-clay-500 border-t-transparent" aria-hidden />
      {label}
    </div>
  )
}
