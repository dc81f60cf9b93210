import { useQueryClient } from '@tanstack/react-query'
import { useState } from 'react'
import type { Finding } from '../../../../shared/firing/check'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Dialog } from '../../../components/ui/Dialog'
import { Checkbox } from '../../../components/ui/Field'
import { Spinner } from '../../../components/ui/Spinner'
import { FindingsList, pieceName } from '../../../components/ware/CheckResults'
import { ApiError } from '../../../lib/api'
import { damageChargesInWords, policiesInWords } from '../../../lib/firingWords'
import { requestKeys } from '../api/keys'
import { useRequest, useSendRequest } from '../api/requests'
import type { RequestView } from '../api/types'

interface SendDialogProps {
  requestId: string | null
  onClose: () => void
  onSent: (view: RequestView) => void
}

/** Sending a draft: each warning acknowledged on its own, the studio's terms agreed, then the server decides. */
export function SendDialog({ requestId, onClose, onSent }: SendDialogProps) {
  return (
    <Dialog
      open={requestId !== null}
      onClose={onClose}
      title="Ask the studio"
      description="The studio sees your pieces, the check and the quote, and answers whether it takes them on."
      size="lg"
    >
      {requestId && <SendForm requestId={requestId} onClose={onClose} onSent={onSent} />}
    </Dialog>
  )
}

const warningsOf = (findings: readonly Finding[]) =>
  findings
    .map((finding, index) => ({ finding, key: `${finding.code}:${finding.pieceIndex ?? 'all'}:${index}` }))
    .filter((w) => w.finding.severity === 'warn')

function SendForm({ requestId, onClose, onSent }: { requestId: string; onClose: () => void; onSent: (view: RequestView) => void }) {
  const queryClient = useQueryClient()
  const request = useRequest(requestId)
  const send = useSendRequest()
  // The server's answer to a refused send replaces the findings it was shown with.
  const [serverFindings, setServerFindings] = useState<Finding[] | null>(null)
  const [acknowledged, setAcknowledged] = useState<ReadonlySet<string>>(new Set())
  const [agreed, setAgreed] = useState(false)
  const [problem, setProblem] = useState<{ title: string; text: string; blocked?: Finding[] } | null>(null)

  if (request.isPending) return <Spinner label="Loading your pieces…" />
  if (request.isError) return <Alert tone="danger">{request.error.message}</Alert>
  const view = request.data
  const findings = serverFindings ?? view.findings
  const warnings = warningsOf(findings)
  const allAcknowledged = warnings.every((w) => acknowledged.has(w.key))
  const policies = view.studio.policies

  const submit = () => {
    setProblem(null)
    const codes = [...new Set(warnings.filter((w) => acknowledged.has(w.key)).map((w) => w.finding.code))]
    send.mutate(
      { id: view.id, acknowledged: codes, policiesVersion: view.studio.policiesVersion },
      {
        onSuccess: onSent,
        onError: (error) => {
          if (!(error instanceof ApiError)) return setProblem({ title: 'Not sent', text: 'Something went wrong. Please try again.' })
          const answered = Array.isArray(error.body.findings) ? (error.body.findings as Finding[]) : null
          if (error.code === 'ware-blocked') {
            setServerFindings(answered)
            setProblem({
              title: 'The studio’s kiln cannot take this ware as described',
              text: error.message,
              blocked: answered?.filter((f) => f.severity === 'block') ?? [],
            })
          } else if (error.code === 'unacknowledged-warnings') {
            setServerFindings(answered)
            setProblem({
              title: 'There are warnings to read first',
              text: 'The check found warnings you have not acknowledged yet; they are listed above.',
            })
          } else if (error.code === 'policies-changed') {
            setAgreed(false)
            void queryClient.invalidateQueries({ queryKey: requestKeys.requests.detail(view.id) })
            setProblem({ title: 'The studio changed its terms', text: 'Read them again above and agree to the new version to send.' })
          } else setProblem({ title: 'Not sent', text: error.message })
        },
      },
    )
  }

  return (
    <div className="space-y-5">
      <section aria-labelledby="send-warnings">
        <h3 id="send-warnings" className="font-semibold">
          Warnings to acknowledge
        </h3>
        {warnings.length === 0 ? (
          <p className="mt-1 text-sm text-slip-600">The check found nothing to warn about.</p>
        ) : (
          <>
            <p className="mt-1 text-sm text-slip-600">The studio sees that you read each one. Tick them one by one.</p>
            <ul className="mt-2 space-y-2">
              {warnings.map(({ finding, key }) => (
                <li
                  key={key}
                  className="rounded-control border border-ember-300 bg-ember-100/40 p-3"
                  data-testid="warning-to-acknowledge"
                  data-code={finding.code}
                >
                  <Checkbox
                    label={
                      <>
                        {finding.pieceIndex !== undefined && (
                          <strong className="font-semibold">{pieceName(view.pieces, finding.pieceIndex)}: </strong>
                        )}
                        {finding.message}
                        {finding.detail && <span className="block text-xs text-slip-600">{finding.detail}</span>}
                      </>
                    }
                    checked={acknowledged.has(key)}
                    onChange={(event) =>
                      setAcknowledged((current) => {
                        const next = new Set(current)
                        if (event.target.checked) next.add(key)
                        else next.delete(key)
                        return next
                      })
                    }
                  />
                </li>
              ))}
            </ul>
          </>
        )}
      </section>

      <section aria-labelledby="send-policies">
        <h3 id="send-policies" className="font-semibold">
          {view.studio.name}’s terms
        </h3>
        <ul className="mt-2 list-disc space-y-1 pl-5 text-sm text-slip-800" data-testid="send-policies">
          {policiesInWords(policies).map((line) => (
            <li key={line}>{line}</li>
          ))}
        </ul>
        {policies.wareRequirements && (
          <>
            <h4 className="mt-3 text-sm font-semibold">What ware must be like</h4>
            <p className="mt-1 whitespace-pre-line text-sm text-slip-700">{policies.wareRequirements}</p>
          </>
        )}
        <h4 className="mt-3 text-sm font-semibold">If your ware damages the kiln or other ware, at most</h4>
        <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-slip-800" data-testid="send-damage-charges">
          {damageChargesInWords(policies, view.price.currency).map((line) => (
            <li key={line}>{line}</li>
          ))}
        </ul>
        <div className="mt-3">
          <Checkbox
            label={`I agree to ${view.studio.name}’s terms`}
            checked={agreed}
            onChange={(event) => setAgreed(event.target.checked)}
          />
        </div>
      </section>

      {problem && (
        <Alert tone="danger" title={problem.title}>
          <p>{problem.text}</p>
          {problem.blocked && problem.blocked.length > 0 && (
            <div className="mt-2">
              <FindingsList findings={problem.blocked} pieces={view.pieces} linkToRows={false} />
            </div>
          )}
        </Alert>
      )}

      <div className="flex flex-wrap justify-end gap-2 border-t border-slip-200 pt-4">
        <Button variant="ghost" onClick={onClose}>
          Not yet
        </Button>
        <Button onClick={submit} busy={send.isPending} disabled={!allAcknowledged || !agreed || problem?.blocked !== undefined}>
          Send to {view.studio.name}
        </Button>
      </div>
      {(!allAcknowledged || !agreed) && (
        <p className="text-right text-xs text-slip-500">
          {!allAcknowledged && !agreed
            ? 'Acknowledge each warning and agree to the terms to send.'
            : !allAcknowledged
              ? 'Acknowledge each warning to send.'
              : 'Agree to the terms to send.'}
        </p>
      )}
    </div>
  )
}
