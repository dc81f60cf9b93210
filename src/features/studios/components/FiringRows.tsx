import type { ReactNode } from 'react'
import { formatDateTime } from '../../../../shared/dates'
import { Button } from '../../../components/ui/Button'
import type { FiringRecord } from '../api/types'
import { firingInWords } from '../../../lib/firingWords'
import { FillGauge } from './FillGauge'
import { FiringStatusBadge } from './FiringStatusBadge'

interface FiringRowsProps {
  firings: FiringRecord[]
  kilnName: (kilnId: string) => string
  zone: string
  /** Given on the studio's own pages: each row gets a button that opens the firing. */
  onOpen?: (firing: FiringRecord) => void
  /** More for a row's end: a link to request space, a count of requests waiting. */
  extra?: (firing: FiringRecord) => ReactNode
}

/** Upcoming firings as a list that reads well on a phone: when, what, how full, and its status. */
export function FiringRows({ firings, kilnName, zone, onOpen, extra }: FiringRowsProps) {
  return (
    <ul className="divide-y divide-slip-200 rounded-card border border-slip-200 bg-white">
      {firings.map((firing) => (
        <li
          key={firing.id}
          data-testid="firing-row"
          data-firing-id={firing.id}
          className="grid gap-3 px-4 py-3 sm:grid-cols-[1fr_12rem_auto] sm:items-center"
        >
          <div>
            <p className="font-medium text-slip-900">{formatDateTime(firing.firingDate, zone)}</p>
            <p className="text-sm text-slip-600">
              {firingInWords(firing)} · {kilnName(firing.kilnId)}
            </p>
            <p className="text-xs text-slip-500">Drop-off by {formatDateTime(firing.dropOffBy, zone)}</p>
          </div>
          <FillGauge firing={firing} />
          <div className="flex flex-wrap items-center gap-2 sm:justify-end">
            <FiringStatusBadge status={firing.status} />
            {extra?.(firing)}
            {onOpen && (
              <Button
                variant="secondary"
                size="sm"
                onClick={() => onOpen(firing)}
                aria-label={`Manage the firing on ${formatDateTime(firing.firingDate, zone)}`}
              >
                Manage
              </Button>
            )}
          </div>
        </li>
      ))}
    </ul>
  )
}
