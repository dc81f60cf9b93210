import { forwardRef } from 'react'
import { Link } from 'react-router-dom'
import { formatMoney } from '../../../../shared/dates'
import type { SearchHit } from '../../../../shared/schemas/search'
import { Badge } from '../../../components/ui/Badge'
import { formatShelves } from '../../../lib/units'
import { formatDistance, formatLength, type UnitSystem } from '../units'
import { atmosphereLabel, firingKindLabel, formatDay, formatWhen, kilnKindLabel } from '../words'

interface ResultCardProps {
  hit: SearchHit
  units: UnitSystem
  selected: boolean
  onSelect: () => void
}

/** One firing found: where, what it fires, when, how much room and what a typical piece costs. */
export const ResultCard = forwardRef<HTMLElement, ResultCardProps>(function ResultCard({ hit, units, selected, onSelect }, ref) {
  const headingId = `firing-${hit.firingId}`
  const town = [hit.studio.city, hit.studio.region].filter(Boolean).join(', ')
  return (
    <article
      ref={ref}
      tabIndex={-1}
      aria-labelledby={headingId}
      className={`rounded-card border bg-white p-4 shadow-card transition-colors ${selected ? 'border-celadon-500 ring-2 ring-celadon-300' : 'border-slip-200'}`}
    >
      <div className="flex flex-wrap items-start justify-between gap-x-3 gap-y-1">
        <div className="min-w-0">
          <h3 id={headingId} className="flex flex-wrap items-center gap-2 text-base font-semibold text-slip-900">
            <Link to={`/studios/${hit.studio.id}`} className="hover:underline" data-testid="result-studio-link">
              {hit.studio.name}
            </Link>
            {hit.studio.verified && <Badge tone="celadon">✓ Verified</Badge>}
          </h3>
          <p className="text-sm text-slip-600">
            {town}
            {hit.distanceKm !== null && <span data-testid="result-distance"> · {formatDistance(hit.distanceKm, units)} away</span>}
          </p>
        </div>
        {hit.rating && (
          <p
            className="text-sm text-slip-700"
            aria-label={`Rated ${hit.rating.mean} out of 5 by ${hit.rating.count} ${hit.rating.count === 1 ? 'potter' : 'potters'}`}
          >
            <span aria-hidden className="text-ember-500">
              ★
            </span>{' '}
            {hit.rating.mean.toFixed(1)} <span className="text-slip-500">({hit.rating.count})</span>
          </p>
        )}
      </div>

      <p className="mt-2 flex flex-wrap gap-1.5 text-sm">
        <span data-testid="result-cone" data-value={hit.cone}>
          <Badge tone="clay">Cone {hit.cone}</Badge>
        </span>
        <span data-testid="result-atmosphere" data-value={hit.atmosphere}>
          <Badge>{atmosphereLabel(hit.atmosphere)}</Badge>
        </span>
        <span data-testid="result-kind" data-value={hit.kind}>
          <Badge>{firingKindLabel(hit.kind)}</Badge>
        </span>
      </p>

      <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
        <dt className="text-slip-500">Kiln</dt>
        <dd className="text-slip-800">
          {hit.kiln.name} · {kilnKindLabel(hit.kiln.kind)}, takes pieces up to {formatLength(hit.kiln.usableHeightMm, units)} tall
        </dd>
        <dt className="text-slip-500">Drop off by</dt>
        <dd className="text-slip-800">{formatWhen(hit.dropOffBy)}</dd>
        <dt className="text-slip-500">Fired</dt>
        <dd className="text-slip-800">{formatDay(hit.firingDate)}</dd>
        <dt className="text-slip-500">Space left</dt>
        <dd className="text-slip-800">
          {formatShelves(hit.space.shelvesLeft)} <span className="text-slip-500">of {formatShelves(hit.space.shelvesTotal)}</span>
        </dd>
        {hit.priceExample && (
          <>
            <dt className="text-slip-500">Example price</dt>
            <dd className="text-slip-800" data-testid="result-price">
              <strong className="font-semibold">{formatMoney(hit.priceExample.totalCents, hit.priceExample.currency)}</strong>{' '}
              <span className="text-slip-600">· {hit.priceExample.label}</span>
            </dd>
          </>
        )}
      </dl>

      <div className="mt-3 flex flex-wrap gap-2">
        <button
          type="button"
          aria-pressed={selected}
          onClick={onSelect}
          className="rounded-control border border-slip-300 px-3 py-1.5 text-sm font-medium text-slip-800 hover:bg-slip-100 aria-pressed:border-celadon-500 aria-pressed:bg-celadon-50 aria-pressed:text-celadon-700"
        >
          Show on the map
        </button>
        <Link to={`/studios/${hit.studio.id}`} className="rounded-control px-3 py-1.5 text-sm font-semibold text-clay-700 hover:bg-clay-50">
          See the studio<span className="sr-only"> {hit.studio.name}</span>
        </Link>
        <Link
          to={`/firings/${hit.firingId}/request`}
          className="rounded-control bg-clay-600 px-3 py-1.5 text-sm font-semibold text-white hover:bg-clay-700"
        >
          Request space<span className="sr-only"> at {hit.studio.name}</span>
        </Link>
      </div>
    </article>
  )
})
