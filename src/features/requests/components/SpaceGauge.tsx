import { Gauge } from '../../../components/ui/Gauge'
import { formatVolume, type UnitSystem } from '../../../lib/units'

/** The space the ware takes against what is left in the firing. */
export function SpaceGauge({ needL, leftL, units }: { needL: number; leftL: number; units: UnitSystem }) {
  const over = needL > leftL
  return (
    <div className="space-y-1" data-testid="space-gauge">
      <Gauge
        value={needL}
        max={Math.max(leftL, 0.001)}
        label="Space your ware takes"
        valueText={`${formatVolume(needL, units)} of ${formatVolume(leftL, units)} left`}
      />
      <p className={`text-sm ${over ? 'font-semibold text-danger-700' : 'text-slip-700'}`}>
        Takes <strong data-testid="space-needed">{formatVolume(needL, units)}</strong> of the {formatVolume(leftL, units)} left
        {over && ': more than there is.'}
      </p>
    </div>
  )
}
