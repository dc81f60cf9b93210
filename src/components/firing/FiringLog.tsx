// The firing log as both sides read it: when the kiln was loaded, fired, turned off and opened; its
// peak; the witness cones and what they say against the peak.
import { formatDateTime, zoneName } from '../../../shared/dates'
import { formatCone } from '../../../shared/firing/cones'
import type { FiringLogRecord } from '../../../shared/api/firing-log'
import { BEND_LABELS, type ConeBend, type WitnessCheck } from '../../../shared/firing/witness'
import { formatDuration, formatRate, formatTemperature, scaleOf, type UnitSystem } from '../../lib/units'
import { curveOfReadings } from '../../../shared/firing/curve'
import { Alert } from '../ui/Alert'
import { LogChart } from './LogChart'
import { Table, Td, Th } from '../ui/Table'

export type { FiringLogRecord, WitnessConeRecord } from '../../../shared/api/firing-log'

export const BEND_WORDS: Record<ConeBend, { short: string; long: string }> = {
  standing: { short: BEND_LABELS.standing, long: 'Standing: not reached' },
  bending: { short: BEND_LABELS.bending, long: 'Bending: on its way' },
  'three-oclock': { short: BEND_LABELS['three-oclock'], long: 'Tip level with base: reached' },
  touching: { short: BEND_LABELS.touching, long: 'Tip touching: past it' },
}

/** What the cones, position by position, and the logged heat work say together, as the studio and the potters read it. */
export function ConeCheckNote({ check }: { check: WitnessCheck }) {
  const tone = check.agree === false || check.inconsistent || check.coldSpotReached === false ? 'warning' : check.agree ? 'success' : 'info'
  return (
    <div className="space-y-2" data-testid="cone-check" data-agree={check.agree === null ? 'unknown' : String(check.agree)}>
      <p className="text-sm">
        <span className="text-slip-600">Cone reached everywhere: </span>
        <strong className="font-semibold" data-testid="cone-reached">
          {check.fromCones ? formatCone(check.fromCones) : 'not read yet'}
        </strong>
        {check.fromCurve && <span className="text-slip-600"> · the logged heat work gives {formatCone(check.fromCurve)}</span>}
      </p>
      {check.positions.length > 1 && (
        <ul className="text-sm text-slip-700" data-testid="cone-positions">
          {check.positions.map((p) => (
            <li key={p.position} data-position={p.position}>
              {p.position}: {p.reached ? `${formatCone(p.reached)} down` : 'none down'}
              {p.bending ? `, ${formatCone(p.bending)} bending` : ''}
              {check.coolest?.position === p.position && ' (coolest)'}
              {check.hottest?.position === p.position && check.hottest !== check.coolest && ' (hottest)'}
            </li>
          ))}
        </ul>
      )}
      <Alert tone={tone}>
        {check.message}
        {check.inconsistent &&
          ' Some readings contradict each other: a hotter cone is further down than a cooler one. Check which cone stood where.'}
      </Alert>
    </div>
  )
}

interface FiringLogViewProps {
  log: FiringLogRecord
  zone: string
  units: UnitSystem
}

/** The saved log, read-only. */
export function FiringLogView({ log, zone, units }: FiringLogViewProps) {
  const scale = scaleOf(units)
  const when = (iso: string | null) => (iso ? formatDateTime(iso, zone) : '—')
  const rows: [string, string][] = [
    ['Loaded', when(log.loadedAt)],
    ['Started', when(log.startedAt)],
    ['Peak', log.peakC !== null ? formatTemperature(log.peakC, scale) : '—'],
    ['Final rate', log.finalRateCPerHour !== null ? formatRate(log.finalRateCPerHour, scale) : '—'],
    ['Hold at peak', log.holdMinutes !== null ? formatDuration(log.holdMinutes) : '—'],
    ['Turned off', when(log.offAt)],
    ['Opened', when(log.openedAt)],
    ['Firing time', log.totalHours !== null ? `${log.totalHours} h` : '—'],
  ]
  return (
    <div className="space-y-4" data-testid="firing-log">
      <dl className="grid gap-x-4 gap-y-1.5 text-sm sm:grid-cols-[auto_1fr]">
        {rows.map(([label, value]) => (
          <div key={label} className="contents">
            <dt className="text-slip-500">{label}</dt>
            <dd className="text-slip-900" data-testid={`log-${label.toLowerCase().replace(/ /g, '-')}`}>
              {value}
            </dd>
          </div>
        ))}
      </dl>
      {log.witnessCones.length > 0 ? (
        <Table caption="Witness cones">
          <thead>
            <tr>
              <Th>Cone</Th>
              <Th>How far it bent</Th>
              <Th>Where it stood</Th>
            </tr>
          </thead>
          <tbody className="divide-y divide-slip-100">
            {log.witnessCones.map((c, index) => (
              <tr key={index} data-testid="witness-cone">
                <Td className="font-medium">{formatCone(c.cone)}</Td>
                <Td>{BEND_WORDS[c.bend].long}</Td>
                <Td>{c.position || '—'}</Td>
              </tr>
            ))}
          </tbody>
        </Table>
      ) : (
        <p className="text-sm text-slip-600">No witness cones recorded.</p>
      )}
      <ConeCheckNote check={log.coneCheck} />
      {log.readings.length >= 2 && (
        <div>
          <h3 className="mb-2 font-semibold text-slip-900">The logged curve</h3>
          <LogChart plan={log.plan} curve={curveOfReadings(log.readings)} flags={log.curve?.flags} scale={scale} />
        </div>
      )}
      {log.notes && <p className="whitespace-pre-line text-sm text-slip-800">{log.notes}</p>}
      <p className="text-xs text-slip-500">
        Times are the studio’s ({zoneName(zone)}). Last written {formatDateTime(log.updatedAt, zone)}.
      </p>
    </div>
  )
}
