// The firing log as both sides read it: when the kiln was loaded, fired, turned off and opened; its
// peak; the witness cones and what they say against the peak.
import { formatDateTime } from '../../../shared/dates'
import { formatCone } from '../../../shared/firing/cones'
import type { ConeBend, WitnessCheck } from '../../../shared/firing/witness'
import { formatDuration, formatRate, formatTemperature, scaleOf, type UnitSystem } from '../../lib/units'
import { Alert } from '../ui/Alert'
import { Table, Td, Th } from '../ui/Table'

export interface WitnessConeRecord {
  cone: string
  bend: ConeBend
  position?: string
}

export interface FiringLogRecord {
  loadedAt: string | null
  startedAt: string | null
  peakC: number | null
  finalRateCPerHour: number | null
  holdMinutes: number | null
  offAt: string | null
  openedAt: string | null
  totalHours: number | null
  witnessCones: WitnessConeRecord[]
  notes: string
  coneCheck: WitnessCheck
  updatedAt: string
}

export const BEND_WORDS: Record<ConeBend, { short: string; long: string }> = {
  standing: { short: 'Standing', long: 'Standing: not reached' },
  'three-oclock': { short: 'Tip at 3 o’clock', long: 'Tip at 3 o’clock: reached' },
  touching: { short: 'Tip touching', long: 'Tip touching: past it' },
}

/** What the cones and the peak say together, as the studio and the potters read it. */
export function ConeCheckNote({ check }: { check: WitnessCheck }) {
  const tone = check.agree === false || check.inconsistent ? 'warning' : check.agree ? 'success' : 'info'
  return (
    <div className="space-y-2" data-testid="cone-check" data-agree={check.agree === null ? 'unknown' : String(check.agree)}>
      <p className="text-sm">
        <span className="text-slip-600">Cone reached: </span>
        <strong className="font-semibold" data-testid="cone-reached">
          {check.fromCones ? formatCone(check.fromCones) : 'not read yet'}
        </strong>
        {check.fromPeak && <span className="text-slip-600"> · the peak predicts {formatCone(check.fromPeak)}</span>}
      </p>
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
      {log.notes && <p className="whitespace-pre-line text-sm text-slip-800">{log.notes}</p>}
      <p className="text-xs text-slip-500">
        Times are the studio’s: {zone.replace(/_/g, ' ')}. Last written {formatDateTime(log.updatedAt, zone)}.
      </p>
    </div>
  )
}
