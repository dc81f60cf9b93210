import type { ReactNode } from 'react'
import type { Piece, Verdict, WareCheck } from '../../../shared/firing/check'
import { Alert } from '../ui/Alert'
import { Badge } from '../ui/Badge'
import { Card } from '../ui/Card'
import { FindingsList, VERDICT_WORDS, VerdictLine } from './CheckResults'

interface CheckCardProps {
  /** The heading's id, so the phone's verdict bar can take the reader to it. */
  id: string
  /** The browser's check, or null while some field does not parse. */
  check: WareCheck | null
  /** Why the firing science refused inputs that passed the schemas, if it did. */
  problem: string | null
  pieces: readonly Piece[]
  /** What follows the findings: the server's answer, the space the ware takes. */
  children?: ReactNode
}

/** The live check beside a form: the verdict, the findings, or what to fix before it can run. */
export function CheckCard({ id, check, problem, pieces, children }: CheckCardProps) {
  return (
    <Card>
      <h2 id={id} className="mb-3 scroll-mt-4 text-lg font-semibold text-slip-900">
        The check
      </h2>
      {check ? (
        <div className="space-y-4">
          <div aria-live="polite">
            <VerdictLine verdict={check.verdict} testId="verdict" />
          </div>
          <FindingsList findings={check.findings} pieces={pieces} />
          {children}
        </div>
      ) : problem ? (
        <Alert tone="danger" title="These inputs could not be checked">
          {problem}
        </Alert>
      ) : (
        <p className="text-sm text-slip-600" data-testid="verdict" data-verdict="incomplete">
          Fix the fields marked in red and the check comes back.
        </p>
      )}
    </Card>
  )
}

/** On a phone the check sits below a long form; this keeps the verdict in sight while typing. */
export function VerdictBar({ verdict, checkId }: { verdict: Verdict | null; checkId: string }) {
  return (
    <div className="fixed inset-x-0 bottom-0 z-30 flex items-center justify-between gap-3 border-t border-slip-200 bg-white/95 px-4 py-2 backdrop-blur lg:hidden">
      {verdict ? (
        <Badge tone={VERDICT_WORDS[verdict].tone}>{VERDICT_WORDS[verdict].title}</Badge>
      ) : (
        <span className="text-sm text-slip-600">Some fields need fixing</span>
      )}
      <a href={`#${checkId}`} className="text-sm font-semibold text-clay-700 hover:underline">
        See the check
      </a>
    </div>
  )
}
