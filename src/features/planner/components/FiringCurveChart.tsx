import { CartesianGrid, Line, LineChart, ReferenceArea, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts'
import type { FiringSchedule, SegmentZone } from '../../../../shared/firing/schedule'
import { cToF } from '../../../../shared/firing/units'
import { curvePoints, zoneName, zoneSpans } from '../firingCurve'
import { formatDuration, formatRate, formatTemperature, type TemperatureScale } from '../../../lib/units'
import { ChoiceSwitch } from '../../../components/ui/ChoiceSwitch'

// Zones where the clay is changing are tinted by what is happening: water (celadon), gases leaving
// (ember), the silica inversions and the cone-setting climb (clay); plain climbs and cooling stay slip.
const ZONE_FILL: Record<SegmentZone, string> = {
  'water-smoking': 'var(--color-celadon-100)',
  candling: 'var(--color-celadon-300)',
  ramp: 'var(--color-slip-100)',
  dehydroxylation: 'var(--color-ember-100)',
  'quartz-inversion': 'var(--color-clay-100)',
  burnout: 'var(--color-ember-300)',
  'final-100': 'var(--color-clay-200)',
  cool: 'var(--color-slip-200)',
  'glaze-development-cool': 'var(--color-celadon-100)',
  'drop-and-hold': 'var(--color-celadon-300)',
  'quartz-inversion-cool': 'var(--color-clay-100)',
  'cristobalite-cool': 'var(--color-clay-200)',
  'pulled-hot': 'var(--color-ember-100)',
}

/** Zones narrower than this share of the firing get no label on the chart; the table names them all. */
const MIN_LABELLED_SHARE = 0.035

const SCALES = [
  { value: 'F', label: '°F' },
  { value: 'C', label: '°C' },
] as const

export function FiringCurveChart({
  schedule,
  scale,
  onScaleChange,
}: {
  schedule: FiringSchedule
  scale: TemperatureScale
  onScaleChange: (scale: TemperatureScale) => void
}) {
  const shown = (celsius: number) => Math.round(scale === 'F' ? cToF(celsius) : celsius)
  const data = curvePoints(schedule).map((point) => ({ hours: point.hours, temperature: shown(point.temperatureC) }))
  const spans = zoneSpans(schedule)
  const totalHours = data.at(-1)?.hours ?? 0
  const unit = scale === 'F' ? '°F' : '°C'

  return (
    <div>
      <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <h3 className="font-semibold text-slip-900">Firing curve</h3>
        <ChoiceSwitch legend="Temperature scale" value={scale} choices={SCALES} onChange={onScaleChange} />
      </div>
      <div
        className="h-80 w-full"
        data-testid="firing-curve"
        role="img"
        aria-label={`Firing curve: temperature in ${unit} against hours, peaking at ${formatTemperature(schedule.peakC, scale)}.`}
      >
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={data} margin={{ top: 8, right: 12, bottom: 8, left: 4 }}>
            <CartesianGrid stroke="var(--color-slip-200)" strokeDasharray="3 3" />
            {spans.map((span, index) => (
              <ReferenceArea
                key={`${span.zone}-${index}`}
                x1={span.fromHours}
                x2={span.toHours}
                fill={ZONE_FILL[span.zone]}
                fillOpacity={0.7}
                ifOverflow="hidden"
                label={
                  totalHours > 0 && (span.toHours - span.fromHours) / totalHours >= MIN_LABELLED_SHARE
                    ? { value: zoneName(span.zone, scale), angle: -90, position: 'center', fontSize: 10, fill: 'var(--color-slip-700)' }
                    : undefined
                }
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
              formatter={(value) => [`${value} ${unit}`, 'Temperature']}
              labelFormatter={(hours) => formatDuration(Number(hours) * 60)}
              contentStyle={{ borderRadius: 'var(--radius-control)', borderColor: 'var(--color-slip-200)' }}
            />
            <Line
              type="linear"
              dataKey="temperature"
              stroke="var(--color-clay-600)"
              strokeWidth={2}
              dot={false}
              isAnimationActive={false}
            />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <SegmentTable schedule={schedule} scale={scale} />
    </div>
  )
}

function SegmentTable({ schedule, scale }: { schedule: FiringSchedule; scale: TemperatureScale }) {
  return (
    <div className="mt-3 overflow-x-auto">
      <table className="w-full text-left text-xs">
        <caption className="sr-only">Firing schedule, step by step</caption>
        <thead className="text-slip-500">
          <tr>
            <th scope="col" className="py-1 pr-3 font-medium">
              Zone
            </th>
            <th scope="col" className="py-1 pr-3 font-medium">
              From
            </th>
            <th scope="col" className="py-1 pr-3 font-medium">
              To
            </th>
            <th scope="col" className="py-1 pr-3 font-medium">
              Rate
            </th>
            <th scope="col" className="py-1 font-medium">
              Hold
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-slip-100 text-slip-800">
          {schedule.segments.map((segment, index) => (
            <tr key={index}>
              <td className="py-1 pr-3">
                <span
                  className="mr-1.5 inline-block size-2.5 rounded-sm align-middle"
                  style={{ background: ZONE_FILL[segment.zone] }}
                  aria-hidden
                />
                {zoneName(segment.zone, scale)}
              </td>
              <td className="py-1 pr-3 tabular-nums">{formatTemperature(segment.fromC, scale)}</td>
              <td className="py-1 pr-3 tabular-nums">{formatTemperature(segment.toC, scale)}</td>
              <td className="py-1 pr-3 tabular-nums">
                {segment.estimate ? `≈ ${formatRate(segment.rateCPerHour, scale)}` : formatRate(segment.rateCPerHour, scale)}
              </td>
              <td className="py-1 tabular-nums">{segment.holdMinutes > 0 ? formatDuration(segment.holdMinutes) : '—'}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {schedule.segments.some((segment) => segment.estimate) && (
        <p className="mt-2 text-xs text-slip-600">
          Rows marked ≈ are estimates of the kiln (or the ware) cooling by itself, for the time only: they are not steps to program.
        </p>
      )}
    </div>
  )
}
