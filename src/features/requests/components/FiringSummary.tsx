import { Link } from 'react-router-dom'
import { formatDateTime } from '../../../../shared/dates'
import { firingInWords, kilnLimitsInWords } from '../../../lib/firingWords'
import { formatShelves, type UnitSystem } from '../../../lib/units'
import type { FiringRecord, KilnRecord } from '../api/types'

interface FiringSummaryProps {
  firing: FiringRecord
  kiln: KilnRecord
  studio: { id: string; name: string; city: string; region: string; timezone: string }
  units: UnitSystem
  /** Space left is worth showing before the studio decides, not after. */
  showSpace?: boolean
}

/** The firing a request is for: where, what, when (in the studio's zone) and how much room is left. */
export function FiringSummary({ firing, kiln, studio, units, showSpace = true }: FiringSummaryProps) {
  const zone = studio.timezone
  const place = [studio.city, studio.region].filter(Boolean).join(', ')
  return (
    <dl className="grid gap-x-4 gap-y-2 text-sm sm:grid-cols-[auto_1fr]" data-testid="firing-summary">
      <dt className="text-slip-500">Studio</dt>
      <dd>
        <Link to={`/studios/${studio.id}`} className="font-semibold text-clay-700 hover:underline">
          {studio.name}
        </Link>
        {place && <span className="text-slip-600"> · {place}</span>}
      </dd>
      <dt className="text-slip-500">Firing</dt>
      <dd className="font-medium text-slip-900">{firingInWords(firing)}</dd>
      <dt className="text-slip-500">Kiln</dt>
      <dd className="text-slip-800">
        <span className="font-medium">{kiln.name}</span>: {kilnLimitsInWords(kiln, units)}
      </dd>
      <dt className="text-slip-500">Drop off by</dt>
      <dd className="text-slip-800" data-testid="drop-off-by">
        {formatDateTime(firing.dropOffBy, zone)}
      </dd>
      <dt className="text-slip-500">Fired</dt>
      <dd className="text-slip-800">{formatDateTime(firing.firingDate, zone)}</dd>
      {showSpace && (
        <>
          <dt className="text-slip-500">Space left</dt>
          <dd className="text-slip-800">
            {formatShelves(firing.space.shelvesLeft)} <span className="text-slip-500">of {formatShelves(firing.space.shelvesTotal)}</span>
          </dd>
        </>
      )}
      <dd className="text-xs text-slip-500 sm:col-span-2">Times are the studio’s: {zone.replace(/_/g, ' ')}.</dd>
    </dl>
  )
}
