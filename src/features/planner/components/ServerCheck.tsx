import type { WareCheck } from '../../../../shared/firing/check'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { ApiError } from '../../../lib/api'
import type { useServerWareCheck } from '../api/wareChecks'
import { VerdictLine } from '../../../components/ware/CheckResults'

const codesOf = (check: WareCheck) =>
  check.findings
    .map((finding) => `${finding.code}:${finding.pieceIndex ?? ''}`)
    .sort()
    .join(' ')

/** The server's answer beside the browser's: the server's is the one a studio will go by. */
export function ServerCheck({ server, local }: { server: ReturnType<typeof useServerWareCheck>; local: WareCheck | null }) {
  const { query, behind, asking } = server
  let body
  if (!asking) body = <p className="text-sm text-slip-600">Asked once every field above is filled in correctly.</p>
  else if (query.isError && !behind) {
    const error = query.error
    body = (
      <Alert tone="warning">
        {error instanceof ApiError ? error.message : 'Conewright could not be reached to check it again.'}{' '}
        <Button variant="ghost" size="sm" onClick={() => query.refetch()}>
          Try again
        </Button>
      </Alert>
    )
  } else if (!query.data) body = <p className="text-sm text-slip-600">Checking it again, as a studio will…</p>
  else {
    const agrees = local !== null && codesOf(local) === codesOf(query.data) && local.verdict === query.data.verdict
    body = (
      <div className="space-y-1">
        <VerdictLine verdict={query.data.verdict} testId="server-verdict" explain={false} />
        <p className="text-xs text-slip-500" aria-live="polite">
          {behind
            ? 'Checking the latest changes…'
            : agrees
              ? 'The check a studio goes by agrees with the one above.'
              : 'The check a studio goes by differs from the one above; it is the one that counts.'}
        </p>
        {!behind && !agrees && (
          <ul className="list-disc pl-5 text-xs text-slip-700">
            {query.data.findings.map((finding, index) => (
              <li key={index}>{finding.message}</li>
            ))}
          </ul>
        )}
      </div>
    )
  }
  return (
    <div>
      <h3 className="mb-1 text-sm font-semibold text-slip-800">The check a studio goes by</h3>
      {body}
    </div>
  )
}
