import { Gauge } from '../../../components/ui/Gauge'
import type { FiringRecord } from '../api/types'
import { formatVolume, type UnitSystem } from '../../../lib/units'

/** Space held against space on sale, with the space left in words beside it. */
export function FillGauge({ firing, units }: { firing: Pick<FiringRecord, 'heldL' | 'capacityL' | 'spaceLeftL'>; units: UnitSystem }) {
  return (
    <div className="min-w-40 space-y-1">
      <Gauge
        value={firing.heldL}
        max={firing.capacityL}
        label="Space held"
        valueText={`${formatVolume(firing.heldL, units)} of ${formatVolume(firing.capacityL, units)} held`}
      />
      <p className="text-xs text-slip-600">
        <span data-testid="space-left" className="font-semibold text-slip-800">
          {formatVolume(firing.spaceLeftL, units)} left
        </span>{' '}
        of {formatVolume(firing.capacityL, units)}
      </p>
    </div>
  )
}
