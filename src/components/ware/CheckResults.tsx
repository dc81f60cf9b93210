import type { Finding, Piece, Severity, Verdict } from '../../../shared/firing/check'
import { Badge, type BadgeTone } from '../ui/Badge'

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

export function pieceName(pieces: readonly Pick<Piece, 'label'>[], index: number): string {
  return pieces[index]?.label?.trim() || `Piece ${index + 1}`
}

/** The id of a piece's row in a piece form, so a finding can take the potter to it. */
export const pieceRowId = (index: number) => `piece-row-${index + 1}`

function goToPiece(index: number) {
  const row = document.getElementById(pieceRowId(index))
  if (!row) return
  row.scrollIntoView({ block: 'start' })
  row.querySelector<HTMLElement>('input, select')?.focus({ preventScroll: true })
}

interface FindingsListProps {
  findings: readonly Finding[]
  pieces: readonly Pick<Piece, 'label'>[]
  /** On a page with the piece form: each finding about a piece offers to go to its row. */
  linkToRows?: boolean
}

/** Findings grouped by how much they matter, each saying which piece and what to change. */
export function FindingsList({ findings, pieces, linkToRows = true }: FindingsListProps) {
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
                <li
                  key={`${finding.code}-${finding.pieceIndex ?? 'all'}-${index}`}
                  data-finding={finding.code}
                  className={`border-l-4 pl-3 text-sm ${group.marker}`}
                >
                  <span className="text-slip-800">{finding.message}</span>
                  {finding.detail && <span className="mt-0.5 block text-xs text-slip-500">{finding.detail}</span>}
                  {finding.pieceIndex !== undefined &&
                    (linkToRows ? (
                      <button
                        type="button"
                        className="mt-0.5 block text-xs font-semibold text-clay-700 hover:underline"
                        onClick={() => goToPiece(finding.pieceIndex!)}
                      >
                        Go to {pieceName(pieces, finding.pieceIndex)}
                      </button>
                    ) : (
                      <span className="mt-0.5 block text-xs text-slip-500">{pieceName(pieces, finding.pieceIndex)}</span>
                    ))}
                </li>
              ))}
            </ul>
          </section>
        )
      })}
    </div>
  )
}
