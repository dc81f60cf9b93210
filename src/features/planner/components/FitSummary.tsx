import type { Kiln, WareCheck } from '../../../../shared/firing/check'
import { kilnVolumeL } from '../../../../shared/firing/check'
import { formatCone } from '../../../../shared/firing/cones'
import {
  formatDuration,
  formatLength,
  formatRate,
  formatTemperature,
  formatVolume,
  type TemperatureScale,
  type UnitSystem,
} from '../../../lib/units'

/** How the load fits the kiln, what the curve comes to and how long it takes. */
export function FitSummary({ check, kiln, units, scale }: { check: WareCheck; kiln: Kiln; units: UnitSystem; scale: TemperatureScale }) {
  const { fit, schedule } = check
  const shelf =
    fit.shelf.shape === 'round'
      ? `${formatLength(fit.shelf.diameterMm, units)} round`
      : `${formatLength(fit.shelf.widthMm, units)} × ${formatLength(fit.shelf.depthMm, units)}`
  const rows: [string, string, string?][] = [
    ['Usable height', formatLength(fit.usableHeightMm, units)],
    ['Shelf', shelf],
    ['Pieces take', `${formatVolume(fit.requestVolumeL, units)} of ${formatVolume(kilnVolumeL(kiln), units)} inside`],
    ['Predicted cone', schedule.predictedCone ? formatCone(schedule.predictedCone) : 'none reached', 'predicted-cone'],
    ['Peak', formatTemperature(schedule.peakC, scale), 'peak-temperature'],
    ['Final climb', `${formatRate(schedule.finalRateCPerHour, scale)} over the last ${scale === 'F' ? '180 °F' : '100 °C'}`],
    ...(schedule.candlingHoldMinutes > 0 ? [['Candling hold', formatDuration(schedule.candlingHoldMinutes)] as [string, string]] : []),
    ['Total time', `${formatDuration(schedule.totalMinutes)} (firing and cooling)`, 'total-time'],
  ]
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1.5 text-sm">
      {rows.map(([term, value, testId]) => (
        <div key={term} className="contents">
          <dt className="text-slip-500">{term}</dt>
          <dd className="font-medium text-slip-900 tabular-nums" data-testid={testId}>
            {value}
          </dd>
        </div>
      ))}
    </dl>
  )
}
