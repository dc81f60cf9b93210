import { Link } from 'react-router-dom'
import type { BoardKiln, BoardStudio } from '../../../../shared/api/board'
import { formatMoney } from '../../../../shared/dates'
import { Badge } from '../../../components/ui/Badge'
import { formatLength, type UnitSystem } from '../../../lib/units'
import { formatDistance } from '../units'
import { kilnKindLabel } from '../words'
import { FiringChip } from './FiringChip'

interface StudioCardProps {
  card: BoardStudio
  units: UnitSystem
  /** The potter gave their piece's size: prices are for it, not the example mug. */
  ownPiece: boolean
  selected?: boolean
  onShowOnMap?: () => void
}

/** "Big Blue (electric, cone 022–6, 17.1 in tall)": what a kiln takes, in one breath. */
export function kilnLimits(kiln: BoardKiln, units: UnitSystem): string {
  return `${kiln.name} (${kilnKindLabel(kiln.kind).toLowerCase()}, cone ${kiln.minCone}–${kiln.maxCone}, ${formatLength(kiln.usableHeightMm, units)} tall)`
}

/** The cheapest price among the chips, for the card's headline. */
function cheapest(card: BoardStudio) {
  const priced = card.firings.flatMap((f) => (f.piecePrice ? [f.piecePrice] : []))
  return priced.length ? priced.reduce((low, p) => (p.totalCents < low.totalCents ? p : low)) : null
}

/** One studio on the firing board: where, its kilns and their limits, and its firings as chips. */
export function StudioCard({ card, units, ownPiece, selected = false, onShowOnMap }: StudioCardProps) {
  const { studio } = card
  const headingId = `studio-card-${studio.id}`
  const town = [studio.city, studio.region].filter(Boolean).join(', ')
  const yours = ownPiece ? cheapest(card) : null
  return (
    <article
      aria-labelledby={headingId}
      tabIndex={-1}
      data-testid="studio-card"
      data-studio-id={studio.id}
      data-selected={selected}
      className={`min-w-0 rounded-card border bg-white p-4 shadow-card ${selected ? 'border-celadon-500 ring-2 ring-celadon-300' : 'border-slip-200'}`}
    >
      <div className="flex flex-wrap items-start justify-between gap-x-3 gap-y-1">
        <div className="min-w-0">
          <h3 id={headingId} className="flex flex-wrap items-center gap-2 text-base font-semibold text-slip-900">
            <Link to={`/studios/${studio.id}`} className="hover:underline" data-testid="studio-card-link">
              {studio.name}
            </Link>
            {studio.verified && <Badge tone="celadon">✓ Verified</Badge>}
          </h3>
          <p className="text-sm text-slip-600">
            {town}
            {card.distanceKm !== null && <span data-testid="studio-distance"> · {formatDistance(card.distanceKm, units)} away</span>}
          </p>
        </div>
        <div className="text-right text-sm">
          {card.reviews && (
            <p className="text-slip-700" data-testid="studio-reviews">
              {card.reviews.fireAgain} of {card.reviews.count} would fire here again
            </p>
          )}
          {yours ? (
            <p data-testid="studio-piece-price" className="text-slip-800">
              Your piece from <strong className="font-semibold">{formatMoney(yours.totalCents, yours.currency)}</strong>
            </p>
          ) : (
            card.priceExample && (
              <p data-testid="studio-example-price" className="text-slip-600">
                {card.priceExample.label}: {formatMoney(card.priceExample.totalCents, card.priceExample.currency)}
              </p>
            )
          )}
        </div>
      </div>

      <p className="mt-2 text-sm break-words text-slip-700" data-testid="studio-kilns">
        <span className="font-medium text-slip-900">{card.kilns.length === 1 ? 'Kiln' : 'Kilns'}:</span>{' '}
        {card.kilns.map((kiln) => kilnLimits(kiln, units)).join(' · ')}
      </p>

      <ol className="mt-3 flex flex-wrap gap-2" aria-label={`Firings at ${studio.name}`}>
        {card.firings.map((firing) => (
          <li key={firing.firingId} className="min-w-0">
            <FiringChip firing={firing} studioName={studio.name} />
          </li>
        ))}
      </ol>

      <div className="mt-3 flex flex-wrap items-center gap-x-3 gap-y-2 text-sm">
        {card.moreFirings > 0 && (
          <Link to={`/studios/${studio.id}`} className="font-semibold text-clay-700 hover:underline">
            {card.moreFirings} more {card.moreFirings === 1 ? 'firing' : 'firings'} at the studio
          </Link>
        )}
        {onShowOnMap && (
          <button
            type="button"
            onClick={onShowOnMap}
            className="rounded-control border border-slip-300 px-3 py-1.5 font-medium text-slip-800 hover:bg-slip-100"
          >
            Show on the map<span className="sr-only"> {studio.name}</span>
          </button>
        )}
        <Link to={`/studios/${studio.id}`} className="rounded-control px-3 py-1.5 font-semibold text-clay-700 hover:bg-clay-50">
          See the studio<span className="sr-only"> {studio.name}</span>
        </Link>
      </div>
    </article>
  )
}
