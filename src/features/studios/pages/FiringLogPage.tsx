import { Link, useParams } from 'react-router-dom'
import { formatDateTime } from '../../../../shared/dates'
import type { Kiln } from '../../../../shared/firing/check'
import { planSchedule, type Segment } from '../../../../shared/firing/schedule'
import { REQUEST_STATE_LABELS } from '../../../../shared/workflow/request-states'
import { Alert } from '../../../components/ui/Alert'
import { Badge } from '../../../components/ui/Badge'
import { Card, EmptyState, PageHeader } from '../../../components/ui/Card'
import { Spinner } from '../../../components/ui/Spinner'
import { firingInWords } from '../../../lib/firingWords'
import type { UnitSystem } from '../../../lib/units'
import { useMe } from '../../auth/api/auth'
import { useFiring, useFiringLog, useFiringRequests, type FiringRequestLine } from '../api/firingLog'
import { useKiln } from '../api/kilns'
import { useStudio } from '../api/studios'
import { isMemberView, type FiringRecord, type MemberStudio } from '../api/types'
import { ApiProblem } from '../components/ApiProblem'
import { FillGauge } from '../components/FillGauge'
import { FiringLogForm } from '../components/FiringLogForm'
import { FiringStatusBadge } from '../components/FiringStatusBadge'
import { FiringStatusButtons } from '../components/FiringStatusButtons'
import { StudioNav } from '../components/StudioNav'

/** /firings/:firingId/log: the studio works one firing: its status, its log, and the requests in it. */
export function FiringLogPage() {
  const { firingId = '' } = useParams()
  const firing = useFiring(firingId)
  const studio = useStudio(firing.data?.studioId)
  if (firing.isError) return <ApiProblem error={firing.error} what="this firing" onRetry={() => firing.refetch()} />
  if (studio.isError) return <ApiProblem error={studio.error} what="this studio" onRetry={() => studio.refetch()} />
  if (firing.isPending || studio.isPending) return <Spinner label="Loading the firing…" />
  if (!isMemberView(studio.data)) {
    return (
      <Alert tone="warning" title="The firing log is kept by the studio’s own people">
        Potters see the log on their ware’s page once the studio has written it.
      </Alert>
    )
  }
  return <FiringWorkbench firing={firing.data} studio={studio.data} />
}

function FiringWorkbench({ firing, studio }: { firing: FiringRecord; studio: MemberStudio }) {
  const me = useMe()
  const units: UnitSystem = me.data?.unitSystem ?? 'imperial'
  const kiln = useKiln(firing.kilnId)
  const log = useFiringLog(firing.id)
  const zone = studio.timezone

  return (
    <>
      <p className="mb-2 text-sm">
        <Link to={`/studios/${studio.id}/calendar`} className="font-medium text-clay-700 hover:underline">
          ← {studio.name}’s calendar
        </Link>
      </p>
      <PageHeader
        title="Firing log"
        lead={`${firingInWords(firing)}${kiln.data ? ` · ${kiln.data.name}` : ''} · fires ${formatDateTime(firing.firingDate, zone)}`}
        actions={
          <Link to={`/firings/${firing.id}/incidents/new`} className="font-medium text-clay-700 hover:underline">
            Report what went wrong
          </Link>
        }
      />
      <StudioNav studioId={studio.id} role={studio.myRole} />

      {/* On a phone the status comes first; on a wide screen it heads the side column. */}
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem] lg:grid-rows-[auto_1fr] lg:items-start">
        <div className="min-w-0 lg:col-start-2 lg:row-start-1">
          <Card>
            <h2 className="mb-3 flex flex-wrap items-center gap-2 text-lg font-semibold">
              Status <FiringStatusBadge status={firing.status} />
            </h2>
            {firing.status === 'cancelled' ? (
              <p className="text-sm text-slip-600">Called off{firing.cancelledReason ? `: ${firing.cancelledReason}` : '.'}</p>
            ) : (
              <div className="space-y-2">
                {/* Also when nothing comes next: the last move may still be undone. */}
                {(firing.nextStatuses.some((s) => s !== 'cancelled') || firing.undo) && <FiringStatusButtons firing={firing} />}
                {firing.status === 'unloaded' && (
                  <p className="text-sm text-slip-600">Unloaded: post the results for each potter’s ware below.</p>
                )}
              </div>
            )}
            <div className="mt-4">
              <FillGauge firing={firing} />
            </div>
          </Card>
        </div>

        <div className="min-w-0 lg:col-start-1 lg:row-span-2 lg:row-start-1">
          {log.isPending ? (
            <Spinner label="Loading the log…" />
          ) : log.isError ? (
            <ApiProblem error={log.error} what="the log" onRetry={() => log.refetch()} />
          ) : (
            <FiringLogForm
              firingId={firing.id}
              log={log.data}
              zone={zone}
              units={units}
              plan={log.data?.plan ?? planFor(firing, kiln.data)}
              firingCone={firing.cone}
            />
          )}
        </div>

        <aside className="min-w-0 space-y-6 lg:col-start-2 lg:row-start-2">
          <Card>
            <h2 className="mb-3 text-lg font-semibold">Ware in this firing</h2>
            <FiringRequests firingId={firing.id} />
          </Card>
        </aside>
      </div>
    </>
  )
}

/** The plan a new log is held against, by the rule the server uses: the posted schedule, or the plan for firing and kiln. */
function planFor(firing: FiringRecord, kiln: Kiln | undefined): Segment[] {
  if (firing.schedule && firing.schedule.length > 0) return firing.schedule
  if (!kiln) return []
  return planSchedule({ kind: firing.kind, cone: firing.cone, kiln, pieces: [], slowCool: firing.slowCool, cooling: firing.cooling })
    .segments
}

/** States where the request's ware is (or was meant to be) in this firing. */
const IN_THE_KILN = new Set(['deposit_paid', 'received', 'fired', 'ready', 'collected'])

function FiringRequests({ firingId }: { firingId: string }) {
  const requests = useFiringRequests(firingId)
  if (requests.isPending) return <Spinner label="Loading the requests…" />
  if (requests.isError) return <ApiProblem error={requests.error} what="the requests" onRetry={() => requests.refetch()} />
  const shown = requests.data.filter((r) => IN_THE_KILN.has(r.state) || r.state === 'accepted')
  if (shown.length === 0) return <EmptyState title="No ware in this firing" />
  return (
    <ul className="divide-y divide-slip-100" data-testid="firing-requests">
      {shown.map((request) => (
        <FiringRequestRow key={request.id} request={request} />
      ))}
    </ul>
  )
}

function FiringRequestRow({ request }: { request: FiringRequestLine }) {
  const todo =
    request.state === 'deposit_paid'
      ? 'Take the ware in'
      : request.state === 'fired'
        ? 'Post results'
        : request.state === 'accepted'
          ? 'Deposit not paid'
          : null
  return (
    <li
      className="flex flex-wrap items-center justify-between gap-2 py-2"
      data-testid="firing-request"
      data-request-id={request.id}
      data-state={request.state}
    >
      <div className="min-w-0">
        <Link to={`/requests/${request.id}`} className="font-medium text-clay-700 hover:underline">
          {request.potterName}
        </Link>
        <p className="text-xs text-slip-500">
          {request.pieceCount} {request.pieceCount === 1 ? 'piece' : 'pieces'}
          {todo && ` · ${todo}`}
        </p>
      </div>
      <Badge tone={request.state === 'accepted' ? 'ember' : 'celadon'}>{REQUEST_STATE_LABELS[request.state]}</Badge>
    </li>
  )
}
