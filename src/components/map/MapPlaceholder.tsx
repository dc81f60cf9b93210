/**
 * Holds a map's place, at the map's size and in the colour of its water, while the map's code is
 * still arriving; no Leaflet here, so pages can show it straight away.
 */
export function MapPlaceholder({ className = 'h-96', label = 'Map' }: { className?: string; label?: string }) {
  return (
    <div
      role="status"
      aria-label={label}
      data-testid="map-placeholder"
      className={`relative isolate flex items-center justify-center overflow-hidden bg-water-100 ${className}`}
    >
      <span className="flex items-center gap-2 rounded-control bg-white/80 px-3 py-1.5 text-sm text-slip-600 shadow-card">
        <span className="size-3 animate-pulse rounded-full bg-clay-400" aria-hidden />
        Loading the map…
      </span>
    </div>
  )
}
