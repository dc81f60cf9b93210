import { Gauge } from '../../../components/ui/Gauge'
import type { FiringRecord } from '../api/types'
import { formatShelves } from '../../../lib/units'

/** Shelves the load plan has taken against the shelves on sale, with the shelves left in words beside it. */
export function FillGauge({ firing }: { firing: Pick<FiringRecord, 'space'> }) {
  const { shelvesTaken, shelvesTotal, shelvesLeft, tallestMm } = firing.space
  return (
    <div className="min-w-40 space-y-1">
      <Gauge
        value={shelvesTaken}
        max={Math.max(shelvesTotal, 0.001)}
        label="Shelves taken"
        valueText={`${formatShelves(shelvesTaken)} of ${formatShelves(shelvesTotal)} taken`}
      />
      <p className="text-xs text-slip-600">
        <span data-testid="space-left" className="font-semibold text-slip-800">
          {formatShelves(shelvesLeft)} left
        </span>{' '}
        of {formatShelves(shelvesTotal)}
        {tallestMm > 0 && `, up to ${Math.round(tallestMm)} mm tall`}
      </p>
    </div>
  )
}
