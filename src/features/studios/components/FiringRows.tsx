import { formatDateTime } from '../../../../shared/dates'
import { Button } from '../../../components/ui/Button'
import type { FiringRecord } from '../api/types'
import type { UnitSystem } from '../units'
import { firingInWords } from '../words'
import { FillGauge } from './FillGauge'
import { FiringStatusBadge } from './FiringStatusBadge'

interface FiringRowsProps {
  firings: FiringRecord[]
  kilnName: (kilnId: string) => string
  zone: string
  units: UnitSystem
  /** Given on the studio's own pages: each row gets a button that opens the firing. */
  onOpen?: (firing: FiringRecord) => void
}

/** Upcoming firings as a list that reads well on a phone: when, what, how full, and its status. */
export function FiringRows({ firings, kilnName, zone, units, onOpen }: FiringRowsProps) {
  return (
    <ul className="divide-y divide-slip-200 rounded-card border border-slip-200 bg-white">
      {firings.map((firing) => (
        <li key={firing.id} data-testid="firing-row" data-firing-id={firing.id} className="grid gap-3 px-4 py-3 sm:grid-cols-[1fr_12rem_auto] sm:items-center">
          <div>
            <p className="font-medium text-slip-900">{formatDateTime(firing.firingDate, zone)}</p>
            <p className="text-sm text-slip-600">
              {firingInWords(firing)} · {kilnName(firing.kilnId)}
            </p>
            <p className="text-xs text-slip-500">Drop-off by {formatDateTime(firing.dropOffBy, zone)}</p>
          </div>
          <FillGauge firing={firing} units={units} />
          <div className="flex items-center gap-2 sm:justify-end">
            <FiringStatusBadge status={firing.status} />
            {onOpen && (
              <Button variant="secondary" size="sm" onClick={() => onOpen(firing)} aria-label={`Manage the firing on ${formatDateTime(firing.firingDate, zone)}`}>
                Manage
              </Button>
            )}
          </div>
        </li>
      ))}
    </ul>
  )
}
