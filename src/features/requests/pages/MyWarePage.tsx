import { Link } from 'react-router-dom'
import { formatDateTime } from '../../../../shared/dates'
import { ButtonLink } from '../../../components/ui/Button'
import { EmptyState, PageHeader } from '../../../components/ui/Card'
import { Spinner } from '../../../components/ui/Spinner'
import { firingInWords } from '../../../lib/firingWords'
import { formatVolume, type UnitSystem } from '../../../lib/units'
import { useMe } from '../../auth/api/auth'
import { useRequests } from '../api/requests'
import type { RequestRow } from '../api/types'
import { RequestProblem } from '../components/RequestProblem'
import { RequestStateBadge } from '../components/RequestStateBadge'
import { rowNextStep, rowWantsMe, rowMoneyLine } from '../requestWords'

/** Drafts first (they wait on the potter), then the rest as the server orders them: latest change first. */
function inOrder(requests: RequestRow[]): RequestRow[] {
  return [...requests.filter((r) => r.state === 'draft'), ...requests.filter((r) => r.state !== 'draft')]
}

/** The potter's home: every ask with its state and what happens next. */
export function MyWarePage() {
  const me = useMe()
  const requests = useRequests({ as: 'potter' })
  const units: UnitSystem = me.data?.unitSystem ?? 'imperial'
  return (
    <>
      <PageHeader
        title="My ware"
        lead={`Welcome, ${me.data?.displayName ?? ''}. Your ware in studios’ firings and what happens next with each.`}
        actions={requests.data && requests.data.length > 0 ? <ButtonLink to="/find">Find a firing</ButtonLink> : undefined}
      />
      {requests.isPending ? (
        <Spinner label="Loading your ware…" />
      ) : requests.isError ? (
        <RequestProblem error={requests.error} what="your ware" onRetry={() => requests.refetch()} />
      ) : requests.data.length === 0 ? (
        <EmptyState
          title="No ware in a firing yet"
          action={
            <div className="flex flex-wrap justify-center gap-2">
              <ButtonLink to="/find">Find a firing near you</ButtonLink>
              <ButtonLink to="/planner" variant="secondary">
                Check a piece against a kiln
              </ButtonLink>
            </div>
          }
        >
          Find a studio firing at your cone and atmosphere, describe your pieces and ask for space. Or try the firing planner first to see
          what a kiln can take.
        </EmptyState>
      ) : (
        <ul className="space-y-3" aria-label="Your ware in firings">
          {inOrder(requests.data).map((row) => (
            <RequestCard key={row.id} row={row} units={units} />
          ))}
        </ul>
      )}
    </>
  )
}

function RequestCard({ row, units }: { row: RequestRow; units: UnitSystem }) {
  const zone = row.studio.timezone
  const next = rowNextStep(row)
  const needsMe = rowWantsMe(row)
  const money = rowMoneyLine(row)
  return (
    <li
      data-testid="my-request"
      data-request-id={row.id}
      data-state={row.state}
      className={`rounded-card border bg-white p-4 shadow-card ${needsMe ? 'border-clay-300' : 'border-slip-200'}`}
    >
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div className="min-w-0">
          <h2 className="font-semibold text-slip-900">
            <Link to={`/requests/${row.id}`} className="hover:underline">
              {row.studio.name}: {firingInWords(row.firing)}
            </Link>
          </h2>
          <p className="text-sm text-slip-600">
            {row.firing.kilnName} · {Date.parse(row.firing.firingDate) > Date.now() ? 'fires' : 'fired'}{' '}
            {formatDateTime(row.firing.firingDate, zone)}
          </p>
        </div>
        <RequestStateBadge state={row.state} />
      </div>
      <p className={`mt-2 text-sm ${needsMe ? 'font-semibold text-clay-800' : 'text-slip-700'}`} data-testid="next-step">
        {next}
      </p>
      <p className="mt-1 text-xs text-slip-500">
        {row.pieceCount} {row.pieceCount === 1 ? 'piece' : 'pieces'} · {formatVolume(row.volumeL, units)}
        {money && <span data-testid="row-money"> · {money}</span>}
      </p>
    </li>
  )
}
