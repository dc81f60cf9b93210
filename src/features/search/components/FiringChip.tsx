import { Link } from 'react-router-dom'
import type { BoardFiring } from '../../../../shared/api/board'
import { formatMoney } from '../../../../shared/dates'
import { formatShelves } from '../../../lib/units'
import { atmosphereLabel, firingKindLabel } from '../words'

const chipDay = new Intl.DateTimeFormat(undefined, { weekday: 'short', month: 'short', day: 'numeric' })

interface FiringChipProps {
  firing: BoardFiring
  studioName: string
  /** In the week view the week already says when; the chip names the day only. */
  compact?: boolean
}

/**
 * One upcoming firing on a studio's card: its day, cone, atmosphere and kind, the space left and, when
 * the potter gave their piece, its price. The chip is the way to ask for space in that firing.
 */
export function FiringChip({ firing, studioName, compact = false }: FiringChipProps) {
  const full = firing.space.shelvesLeft <= 0
  const price = firing.piecePrice ? formatMoney(firing.piecePrice.totalCents, firing.piecePrice.currency) : null
  return (
    <Link
      to={`/firings/${firing.firingId}/request`}
      data-testid="firing-chip"
      data-firing-id={firing.firingId}
      data-cone={firing.cone}
      data-atmosphere={firing.atmosphere}
      className={`relative block max-w-full min-w-0 rounded-control border px-2.5 py-1.5 text-xs leading-snug hover:border-clay-500 hover:bg-clay-50 ${
        full ? 'border-slip-200 bg-slip-50 text-slip-600' : 'border-slip-300 bg-white text-slip-800'
      }`}
    >
      {/* The chip's own words name the link; what it does and where is added for a screen reader (the chip is
          positioned, so the hidden words stay inside it and never widen a phone's page). */}
      <span className="sr-only">Ask for space at {studioName}: </span>
      <span className="block font-semibold text-slip-900">
        {compact ? chipDay.format(new Date(firing.dropOffBy)) : `By ${chipDay.format(new Date(firing.dropOffBy))}`}
      </span>
      <span className="block">
        <span className="font-semibold text-clay-800">∆{firing.cone}</span> {atmosphereLabel(firing.atmosphere).toLowerCase()} ·{' '}
        {firingKindLabel(firing.kind).toLowerCase()}
      </span>
      <span className="block text-slip-600">
        {full ? 'full' : `${formatShelves(firing.space.shelvesLeft)} left`}
        {price && <span className="font-semibold text-slip-900"> · {price}</span>}
      </span>
    </Link>
  )
}
