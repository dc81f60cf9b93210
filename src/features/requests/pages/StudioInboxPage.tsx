import { useState } from 'react'
import { Link, useParams, useSearchParams } from 'react-router-dom'
import { formatDateTime } from '../../../../shared/dates'
import { REQUEST_STATES, type RequestState } from '../../../../shared/workflow/request-states'
import { Badge } from '../../../components/ui/Badge'
import { Button, ButtonLink } from '../../../components/ui/Button'
import { EmptyState, PageHeader } from '../../../components/ui/Card'
import { Spinner } from '../../../components/ui/Spinner'
import { VERDICT_WORDS } from '../../../components/ware/CheckResults'
import { firingInWords } from '../../../lib/firingWords'
import { useFiring, useStudio, useStudioFirings } from '../api/firings'
import { useRequest, useRequests } from '../api/requests'
import type { FiringRecord, RequestRow } from '../api/types'
import { PotterRecordLine } from '../components/PotterRecordLine'
import { RequestProblem } from '../components/RequestProblem'
import { RequestStateBadge } from '../components/RequestStateBadge'
import { SpaceGauge } from '../components/SpaceGauge'
import { AcceptButton, ReasonDialog } from '../components/StudioActions'
import { rowMoneyLine, rowNextStep, stateLabel } from '../requestWords'

/** /studios/:id/requests: every potter's ask to the studio. */
export function StudioInboxPage() {
  const { id = '' } = useParams()
  const studio = useStudio(id)
  if (studio.isPending) return <Spinner label="Loading the studio…" />
  if (studio.isError)
    return (
      <RequestProblem
        error={studio.error}
        what="this studio"
        onRetry={() => studio.refetch()}
        back={{ to: '/kiln-room', label: 'Back to the kiln room' }}
      />
    )
  return (
    <Inbox
      studioId={id}
      title={`Asks to ${studio.data.name}`}
      lead="Each potter’s ask with the check, the space it needs, the quote and the potter’s record."
    />
  )
}

/** /firings/:firingId/requests: the asks for one firing. */
export function FiringInboxPage() {
  const { firingId = '' } = useParams()
  const firing = useFiring(firingId)
  const studio = useStudio(firing.data?.studioId)
  if (firing.isError)
    return (
      <RequestProblem
        error={firing.error}
        what="this firing"
        onRetry={() => firing.refetch()}
        back={{ to: '/kiln-room', label: 'Back to the kiln room' }}
      />
    )
  if (studio.isError) return <RequestProblem error={studio.error} what="this studio" onRetry={() => studio.refetch()} />
  if (firing.isPending || studio.isPending) return <Spinner label="Loading the firing…" />
  return (
    <Inbox
      studioId={studio.data.id}
      firing={firing.data}
      title={`Asks for the ${firingInWords(firing.data)}`}
      lead={`${studio.data.name} · ${Date.parse(firing.data.firingDate) > Date.now() ? 'fires' : 'fired'} ${formatDateTime(firing.data.firingDate, studio.data.timezone)}`}
    />
  )
}

const FILTERS: readonly (RequestState | 'all')[] = ['all', ...REQUEST_STATES.filter((s) => s !== 'draft')]

function Inbox({ studioId, firing, title, lead }: { studioId: string; firing?: FiringRecord; title: string; lead: string }) {
  const [params, setParams] = useSearchParams()
  const filter = (FILTERS as readonly string[]).includes(params.get('state') ?? '') ? (params.get('state') as RequestState) : 'all'
  const requests = useRequests({ as: 'studio', studioId, firingId: firing?.id })
  // Space left per firing, for the studio-wide list (a firing's own inbox has it already).
  const firings = useStudioFirings(studioId, { enabled: !firing })
  const spaceLeft = (firingId: string) =>
    firing?.id === firingId ? firing.space.shelvesLeft : firings.data?.find((f) => f.id === firingId)?.space.shelvesLeft

  const all = requests.data ?? []
  const counts = new Map<string, number>([['all', all.length]])
  for (const row of all) counts.set(row.state, (counts.get(row.state) ?? 0) + 1)
  const shown = filter === 'all' ? all : all.filter((r) => r.state === filter)
  // Decisions first: what is waiting on the studio, then the rest, latest change first.
  const ordered = [...shown.filter((r) => r.state === 'sent'), ...shown.filter((r) => r.state !== 'sent')]

  return (
    <>
      <PageHeader
        title={title}
        lead={lead}
        actions={
          <>
            {firing && (
              <>
                <ButtonLink to={`/firings/${firing.id}/load`}>The load</ButtonLink>
                <a
                  href={`/api/firings/${firing.id}/labels.html`}
                  target="_blank"
                  rel="noreferrer"
                  className="focus-ring inline-flex items-center rounded-control border border-slip-300 bg-white px-4 py-2.5 text-sm font-semibold hover:bg-slip-100"
                >
                  Print labels
                </a>
                <ButtonLink to={`/firings/${firing.id}/unload`} variant="secondary">
                  Unloading
                </ButtonLink>
                <ButtonLink to={`/studios/${studioId}/requests`} variant="secondary">
                  All the studio’s asks
                </ButtonLink>
              </>
            )}
            <ButtonLink to="/kiln-room" variant="ghost">
              Kiln room
            </ButtonLink>
          </>
        }
      />
      <nav aria-label="Show asks by state" className="mb-4 flex flex-wrap gap-2">
        {FILTERS.filter((f) => f === 'all' || f === filter || (counts.get(f) ?? 0) > 0).map((f) => (
          <button
            key={f}
            type="button"
            aria-pressed={filter === f}
            onClick={() => setParams(f === 'all' ? {} : { state: f }, { replace: true })}
            className="rounded-full border border-slip-300 bg-white px-3 py-1 text-sm font-medium text-slip-700 hover:bg-slip-100 aria-pressed:border-clay-600 aria-pressed:bg-clay-600 aria-pressed:text-white"
          >
            {f === 'all' ? 'All' : stateLabel(f)} <span className="tabular-nums opacity-80">{counts.get(f) ?? 0}</span>
          </button>
        ))}
      </nav>
      {requests.isPending ? (
        <Spinner label="Loading asks…" />
      ) : requests.isError ? (
        <RequestProblem error={requests.error} what="the asks" onRetry={() => requests.refetch()} />
      ) : ordered.length === 0 ? (
        <EmptyState title={filter === 'all' ? 'No one has asked yet' : `Nothing at “${stateLabel(filter)}”`}>
          {filter === 'all'
            ? 'Potters find your open firings in search and on your studio page; their asks arrive here and by mail.'
            : 'Choose another state above.'}
        </EmptyState>
      ) : (
        <ul className="space-y-3" aria-label="Asks">
          {ordered.map((row) => (
            <InboxRow key={row.id} row={row} shelvesLeft={spaceLeft(row.firing.id)} showFiring={!firing} />
          ))}
        </ul>
      )}
    </>
  )
}

function InboxRow({ row, shelvesLeft, showFiring }: { row: RequestRow; shelvesLeft: number | undefined; showFiring: boolean }) {
  const waiting = row.state === 'sent'
  // The list row has no record of the potter; the request itself does, and it is needed to decide.
  const detail = useRequest(waiting ? row.id : undefined)
  const [declining, setDeclining] = useState(false)
  const zone = row.studio.timezone
  const verdict = VERDICT_WORDS[row.verdict]
  const canDecide = row.actions.includes('accept')
  return (
    <li
      data-testid="inbox-request"
      data-request-id={row.id}
      data-state={row.state}
      className={`rounded-card border bg-white p-4 shadow-card ${waiting ? 'border-clay-300' : 'border-slip-200'}`}
    >
      <div className="grid gap-4 md:grid-cols-[minmax(0,1fr)_14rem_auto] md:items-start">
        <div className="min-w-0 space-y-1">
          <div className="flex flex-wrap items-center gap-2">
            <h2 className="font-semibold text-slip-900">
              <Link to={`/requests/${row.id}`} className="hover:underline">
                {row.potterName}
              </Link>
            </h2>
            <RequestStateBadge state={row.state} />
          </div>
          {showFiring && (
            <p className="text-sm text-slip-700">
              <Link to={`/firings/${row.firing.id}/requests`} className="hover:underline">
                {firingInWords(row.firing)}
              </Link>{' '}
              · {row.firing.kilnName} · {formatDateTime(row.firing.firingDate, zone)}
            </p>
          )}
          <p className="text-sm">
            {waiting ? (
              detail.data ? (
                <PotterRecordLine name={row.potterName} record={detail.data.potter.record} />
              ) : (
                <span className="text-slip-500">Loading the potter’s record…</span>
              )
            ) : (
              <span className="text-slip-600">{rowNextStep(row)}</span>
            )}
          </p>
          <p className="flex flex-wrap items-center gap-2 text-sm text-slip-700">
            <Badge tone={verdict.tone}>{verdict.title}</Badge>
            <span>
              {row.findings === 0 ? 'no findings' : `${row.findings} ${row.findings === 1 ? 'finding' : 'findings'}`} · {row.pieceCount}{' '}
              {row.pieceCount === 1 ? 'piece' : 'pieces'}
            </span>
            {/* Its own item (no leading dot): on a phone it wraps to a line of its own. */}
            {row.price && <span data-testid="row-money">{rowMoneyLine(row)}</span>}
          </p>
        </div>
        <div>
          {waiting && shelvesLeft !== undefined && row.shelvesNeeded !== null ? (
            <SpaceGauge need={row.shelvesNeeded} left={shelvesLeft} />
          ) : null}
        </div>
        <div className="flex flex-wrap items-start gap-2 md:justify-end">
          {canDecide && (
            <>
              {detail.data && <AcceptButton view={detail.data} size="sm" />}
              <Button size="sm" variant="secondary" onClick={() => setDeclining(true)}>
                Turn it down…
              </Button>
            </>
          )}
          <ButtonLink size="sm" variant="ghost" to={`/requests/${row.id}`}>
            Open<span className="sr-only"> {row.potterName}’s ask</span>
          </ButtonLink>
        </div>
      </div>
      <ReasonDialog requestId={row.id} open={declining} onClose={() => setDeclining(false)} mode="decline" />
    </li>
  )
}
