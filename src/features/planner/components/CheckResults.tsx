import type { Finding, Kiln, Piece, Severity, Verdict, WareCheck } from '../../../../shared/firing/check'
import { kilnVolumeL } from '../../../../shared/firing/check'
import { formatCone } from '../../../../shared/firing/cones'
import { Badge, type BadgeTone } from '../../../components/ui/Badge'
import { formatDuration, formatLength, formatRate, formatTemperature, formatVolume, type TemperatureScale, type UnitSystem } from '../units'

export const VERDICT_WORDS: Record<Verdict, { title: string; tone: BadgeTone; text: string }> = {
  ok: { title: 'Good to fire', tone: 'celadon', text: 'Nothing here stops this kiln firing these pieces.' },
  warn: { title: 'Fire with care', tone: 'ember', text: 'Nothing blocks it, but read the warnings first.' },
  block: { title: 'Blocked', tone: 'danger', text: 'Change what is marked below before this kiln can fire it.' },
}

export function VerdictLine({ verdict, testId, explain = true }: { verdict: Verdict; testId: string; explain?: boolean }) {
  const words = VERDICT_WORDS[verdict]
  return (
    <p className="flex flex-wrap items-center gap-2" data-testid={testId} data-verdict={verdict}>
      <Badge tone={words.tone}>{words.title}</Badge>
      {explain && <span className="text-sm text-slip-700">{words.text}</span>}
    </p>
  )
}

const GROUPS: readonly { severity: Severity; title: string; marker: string }[] = [
  { severity: 'block', title: 'Must change', marker: 'border-danger-500' },
  { severity: 'warn', title: 'Check before firing', marker: 'border-ember-500' },
  { severity: 'info', title: 'Good to know', marker: 'border-slip-300' },
]

export function pieceName(pieces: readonly Piece[], index: number): string {
  return pieces[index]?.label?.trim() || `Piece ${index + 1}`
}

/** The id of a piece's row in the form, so a finding can take the potter to it. */
export const pieceRowId = (index: number) => `planner-piece-${index + 1}`

function goToPiece(index: number) {
  const row = document.getElementById(pieceRowId(index))
  if (!row) return
  row.scrollIntoView({ block: 'start' })
  row.querySelector<HTMLElement>('input, select')?.focus({ preventScroll: true })
}

/** Findings grouped by how much they matter, each saying which piece and what to change. */
export function FindingsList({ findings, pieces }: { findings: readonly Finding[]; pieces: readonly Piece[] }) {
  if (findings.length === 0) return <p className="text-sm text-slip-600">No findings: the kiln, the firing and the pieces agree.</p>
  return (
    <div className="space-y-4">
      {GROUPS.map((group) => {
        const inGroup = findings.filter((finding) => finding.severity === group.severity)
        if (inGroup.length === 0) return null
        return (
          <section key={group.severity} aria-label={group.title}>
            <h4 className="text-sm font-semibold text-slip-800">
              {group.title} <span className="font-normal text-slip-500">({inGroup.length})</span>
            </h4>
            <ul className="mt-2 space-y-2">
              {inGroup.map((finding, index) => (
                <li key={`${finding.code}-${finding.pieceIndex ?? 'all'}-${index}`} data-finding={finding.code} className={`border-l-4 pl-3 text-sm ${group.marker}`}>
                  <span className="text-slip-800">{finding.message}</span>
                  {finding.detail && <span className="mt-0.5 block text-xs text-slip-500">{finding.detail}</span>}
                  {finding.pieceIndex !== undefined && (
                    <button type="button" className="mt-0.5 block text-xs font-semibold text-clay-700 hover:underline" onClick={() => goToPiece(finding.pieceIndex!)}>
                      Go to {pieceName(pieces, finding.pieceIndex)}
                    </button>
                  )}
                </li>
              ))}
            </ul>
          </section>
        )
      })}
    </div>
  )
}

/** How the load fits the kiln, what the curve comes to and how long it takes. */
export function FitSummary({ check, kiln, units, scale }: { check: WareCheck; kiln: Kiln; units: UnitSystem; scale: TemperatureScale }) {
  const { fit, schedule } = check
  const shelf = fit.shelf.shape === 'round' ? `${formatLength(fit.shelf.diameterMm, units)} round` : `${formatLength(fit.shelf.widthMm, units)} × ${formatLength(fit.shelf.depthMm, units)}`
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
