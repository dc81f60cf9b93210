// The logged curve against the plan: both lines on one time axis from the first reading, the critical
// zones as bands of temperature, every flagged stretch shaded, and the cone the curve's heat work gives.
import { CartesianGrid, Legend, Line, LineChart, ReferenceArea, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts'
import { formatCone } from '../../../shared/firing/cones'
import { CRITICAL_ZONES, curveFlags, type CurveFlag, type CurvePoint } from '../../../shared/firing/curve'
import { coneFromCurve } from '../../../shared/firing/heatwork'
import { scheduleCurve, type Segment } from '../../../shared/firing/schedule'
import { cToF } from '../../../shared/firing/units'
import { formatDuration, formatRate, formatTemperature, type TemperatureScale } from '../../lib/units'
import { Alert } from '../ui/Alert'

interface LogChartProps {
  plan: readonly Segment[]
  curve: readonly CurvePoint[]
  scale: TemperatureScale
  /** Flags worked out elsewhere (the server's); worked out here when absent. */
  flags?: readonly CurveFlag[]
}

const ZONE_FILL: Record<string, string> = {
  'water-smoking': 'var(--color-water-100)',
  burnout: 'var(--color-ember-100)',
  'quartz-heating': 'var(--color-clay-100)',
  'quartz-cooling': 'var(--color-clay-100)',
  'cristobalite-cooling': 'var(--color-clay-200)',
}

/** Plan and actual on one chart, with the flags and the cone listed beneath it. */
export function LogChart({ plan, curve, scale, flags }: LogChartProps) {
  const shown = (celsius: number) => Math.round(scale === 'F' ? cToF(celsius) : celsius)
  const unit = scale === 'F' ? '°F' : '°C'
  const found = flags ?? curveFlags(plan, curve)
  const cone = coneFromCurve(curve)
  const planPoints = scheduleCurve(plan)
  // One data set with both lines: recharts joins each line over the rows where it has a value.
  const rows = [
    ...planPoints.map((p) => ({ hours: p.minute / 60, plan: shown(p.tempC) })),
    ...curve.map((p) => ({ hours: p.minute / 60, actual: shown(p.tempC) })),
  ].sort((a, b) => a.hours - b.hours)

  return (
    <div className="space-y-3" data-testid="log-chart">
      <div
        className="h-72 w-full"
        role="img"
        aria-label={`The logged curve against the plan, in ${unit} against hours from the first reading.`}
      >
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={rows} margin={{ top: 8, right: 12, bottom: 8, left: 4 }}>
            <CartesianGrid stroke="var(--color-slip-200)" strokeDasharray="3 3" />
            {CRITICAL_ZONES.map((zone) => (
              <ReferenceArea
                key={zone.id}
                y1={shown(zone.lowC)}
                y2={shown(zone.highC)}
                fill={ZONE_FILL[zone.id]}
                fillOpacity={0.45}
                ifOverflow="hidden"
              />
            ))}
            {found.map((flag, index) => (
              <ReferenceArea
                key={`flag-${index}`}
                x1={flag.fromMinute / 60}
                x2={flag.toMinute / 60}
                fill="var(--color-danger-500)"
                fillOpacity={0.18}
                ifOverflow="hidden"
              />
            ))}
            <XAxis
              type="number"
              dataKey="hours"
              domain={[0, 'dataMax']}
              tickFormatter={(hours: number) => `${Math.round(hours)} h`}
              stroke="var(--color-slip-500)"
              fontSize={12}
            />
            <YAxis
              type="number"
              domain={[0, 'dataMax']}
              tickFormatter={(value: number) => `${value} ${unit}`}
              width={64}
              stroke="var(--color-slip-500)"
              fontSize={12}
            />
            <Tooltip
              formatter={(value, name) => [`${value} ${unit}`, name === 'plan' ? 'Plan' : 'Logged']}
              labelFormatter={(hours) => formatDuration(Number(hours) * 60)}
              contentStyle={{ borderRadius: 'var(--radius-control)', borderColor: 'var(--color-slip-200)' }}
            />
            <Legend formatter={(name) => (name === 'plan' ? 'Plan' : 'Logged')} />
            <Line
              type="linear"
              dataKey="plan"
              stroke="var(--color-slip-400)"
              strokeDasharray="5 4"
              dot={false}
              connectNulls
              isAnimationActive={false}
            />
            <Line
              type="linear"
              dataKey="actual"
              stroke="var(--color-clay-600)"
              strokeWidth={2}
              dot={false}
              connectNulls
              isAnimationActive={false}
            />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <p className="text-sm" data-testid="curve-cone">
        <span className="text-slip-600">The logged curve’s heat work: </span>
        <strong className="font-semibold">{cone.cone ? formatCone(cone.cone) : 'below cone 022'}</strong>
        <span className="text-slip-600">
          {' '}
          · peak {formatTemperature(cone.peakC, scale)} · {formatDuration(Math.round(cone.minutes))} logged
        </span>
      </p>
      {found.length === 0 ? (
        <p className="text-sm text-celadon-700" data-testid="curve-flags" data-count="0">
          No stretch ran faster than the plan in a critical zone.
        </p>
      ) : (
        <Alert tone="warning" title={`${found.length} ${found.length === 1 ? 'stretch' : 'stretches'} faster than the plan`}>
          <ul className="list-disc space-y-1 pl-5" data-testid="curve-flags" data-count={found.length}>
            {found.map((flag, index) => (
              <li key={index} data-zone={flag.zone}>
                {flagInWords(flag, scale)}
              </li>
            ))}
          </ul>
        </Alert>
      )}
    </div>
  )
}

function flagInWords(flag: CurveFlag, scale: TemperatureScale): string {
  const zone = CRITICAL_ZONES.find((z) => z.id === flag.zone)!
  const moved = flag.direction === 'heating' ? 'climbed' : 'cooled'
  return (
    `${zone.label}: ${moved} at up to ${formatRate(flag.rateCPerHour, scale)} between ` +
    `${formatDuration(Math.round(flag.fromMinute))} and ${formatDuration(Math.round(flag.toMinute))} ` +
    `(${formatTemperature(flag.fromC, scale)} → ${formatTemperature(flag.toC, scale)}); the plan allowed ${formatRate(flag.allowedCPerHour, scale)}. ${zone.harm}`
  )
}
