import { Gauge } from '../../../components/ui/Gauge'
import { formatShelves } from '../../../lib/units'

/** The shelves the ware takes, planned on the kiln's own shelves, against the shelves the load has left. */
export function SpaceGauge({ need, left }: { need: number; left: number }) {
  const over = need > left
  return (
    <div className="space-y-1" data-testid="space-gauge">
      <Gauge
        value={need}
        max={Math.max(left, 0.001)}
        label="Shelves your ware takes"
        valueText={`${formatShelves(need)} of ${formatShelves(left)} left`}
      />
      <p className={`text-sm ${over ? 'font-semibold text-danger-700' : 'text-slip-700'}`}>
        Takes <strong data-testid="space-needed">{formatShelves(need)}</strong> of the {formatShelves(left)} left
        {over && ': more than there is.'}
      </p>
    </div>
  )
}
