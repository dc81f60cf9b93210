import { useState } from 'react'
import { Link } from 'react-router-dom'
import { Alert } from '../../../components/ui/Alert'
import { Badge } from '../../../components/ui/Badge'
import { Button } from '../../../components/ui/Button'
import { Card, EmptyState, PageHeader } from '../../../components/ui/Card'
import { Field, TextInput } from '../../../components/ui/Field'
import { Spinner } from '../../../components/ui/Spinner'
import { formatDateTime, formatMoney } from '../../../../shared/dates'
import { ROLE_LABELS } from '../../../../shared/schemas/auth'
import {
  useDeskRefund,
  useDeskStudios,
  useDeskUsers,
  useDisputes,
  useSuspendUser,
  useVerifyStudio,
  type DeskStudio,
  type DisputedRequest,
} from '../api/admin'

function StudioRow({ studio }: { studio: DeskStudio }) {
  const verify = useVerifyStudio()
  return (
    <li className="flex flex-wrap items-center justify-between gap-3 border-b border-slip-100 py-3 last:border-0">
      <div>
        <Link to={`/studios/${studio.id}`} className="font-semibold text-clay-800 hover:underline">
          {studio.name}
        </Link>
        <p className="text-sm text-slip-600">
          {[studio.city, studio.region].filter(Boolean).join(', ')} · {studio.kilns} kiln{studio.kilns === 1 ? '' : 's'} ·{' '}
          {studio.upcomingFirings} firing
          {studio.upcomingFirings === 1 ? '' : 's'} ahead · {(studio.owners ?? []).map((o) => `${o.name} <${o.email}>`).join(', ')}
        </p>
      </div>
      <div className="flex items-center gap-2">
        {!studio.published && <Badge>Draft</Badge>}
        {studio.verified ? <Badge tone="celadon">Verified</Badge> : <Badge tone="ember">Not verified</Badge>}
        <Button
          size="sm"
          variant={studio.verified ? 'secondary' : 'primary'}
          busy={verify.isPending}
          onClick={() => verify.mutate({ id: studio.id, verified: !studio.verified })}
        >
          {studio.verified ? 'Withdraw verification' : 'Verify'}
        </Button>
      </div>
      {verify.isError && (
        <Alert tone="danger" className="w-full">
          {verify.error.message}
        </Alert>
      )}
    </li>
  )
}

function DisputeRow({ request }: { request: DisputedRequest }) {
  const refund = useDeskRefund()
  const [amount, setAmount] = useState('')
  const [reason, setReason] = useState('')
  const currency = request.quote?.currency ?? 'USD'
  const cents = Math.round(Number(amount) * 100)
  return (
    <li className="space-y-2 border-b border-slip-100 py-3 last:border-0">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <Link to={`/requests/${request.id}`} className="font-semibold text-clay-800 hover:underline">
          {request.potterName} · {request.studio.name}
        </Link>
        <span className="text-sm text-slip-600">
          {request.firing.kilnName}, cone {request.firing.cone} {request.firing.atmosphere},{' '}
          {formatDateTime(request.firing.firingDate, request.studio.timezone)} · quoted{' '}
          {request.quote ? formatMoney(request.quote.totalCents, currency) : '—'}
        </span>
      </div>
      <div className="flex flex-wrap items-end gap-2">
        <Field label={`Refund (${currency})`}>
          {(a11y) => (
            <TextInput {...a11y} inputMode="decimal" value={amount} onChange={(e) => setAmount(e.target.value)} className="w-28" />
          )}
        </Field>
        <Field label="Why" className="min-w-60 flex-1">
          {(a11y) => <TextInput {...a11y} value={reason} onChange={(e) => setReason(e.target.value)} />}
        </Field>
        <Button
          size="sm"
          busy={refund.isPending}
          disabled={!(cents > 0) || reason.trim().length < 3}
          onClick={() => refund.mutate({ id: request.id, amountCents: cents, reason })}
        >
          Refund
        </Button>
      </div>
      {refund.isSuccess && <Alert tone="success">The refund is on its way through Stripe; it shows in the ware’s money in and out.</Alert>}
      {refund.isError && <Alert tone="danger">{refund.error.message}</Alert>}
    </li>
  )
}

function Disputes() {
  const disputes = useDisputes()
  return (
    <Card>
      <h2 className="text-lg font-semibold">Disputes</h2>
      <p className="mt-1 text-sm text-slip-600">
        Open the ware’s page to read its record (drop-off, firing log, results, messages) before refunding.
      </p>
      {disputes.isPending ? (
        <Spinner />
      ) : disputes.isError ? (
        <Alert tone="danger" className="mt-3">
          {disputes.error.message}
        </Alert>
      ) : disputes.data.requests.length === 0 ? (
        <div className="mt-3">
          <EmptyState title="No open disputes" />
        </div>
      ) : (
        <ul className="mt-2">
          {disputes.data.requests.map((r) => (
            <DisputeRow key={r.id} request={r} />
          ))}
        </ul>
      )}
    </Card>
  )
}

function Accounts() {
  const [q, setQ] = useState('')
  const users = useDeskUsers(q)
  const suspend = useSuspendUser()
  return (
    <Card>
      <h2 className="text-lg font-semibold">Accounts</h2>
      <p className="mt-1 text-sm text-slip-600">
        Suspend an account that abuses the marketplace; its sessions end at once. Restoring it lets it sign in again.
      </p>
      <Field label="Find by name or e-mail" className="mt-4 max-w-md">
        {(a11y) => <TextInput {...a11y} value={q} onChange={(e) => setQ(e.target.value)} placeholder="e.g. okafor" />}
      </Field>
      {suspend.isError && (
        <Alert tone="danger" className="mt-3">
          {suspend.error.message}
        </Alert>
      )}
      {users.isPending ? (
        <Spinner />
      ) : users.isError ? (
        <Alert tone="danger" className="mt-3">
          {users.error.message}
        </Alert>
      ) : (
        <ul className="mt-3">
          {users.data.users.map((user) => (
            <li
              key={user.id}
              className="flex flex-wrap items-center justify-between gap-2 border-b border-slip-100 py-2 text-sm last:border-0"
            >
              <span>
                <span className="font-medium">{user.displayName}</span>{' '}
                <span className="text-slip-600">
                  {user.email} · {ROLE_LABELS[user.role]}
                </span>
              </span>
              <span className="flex items-center gap-2">
                {user.suspended && <Badge tone="danger">Suspended</Badge>}
                <Button
                  size="sm"
                  variant={user.suspended ? 'secondary' : 'ghost'}
                  onClick={() => suspend.mutate({ id: user.id, suspended: !user.suspended })}
                >
                  {user.suspended ? 'Restore' : 'Suspend'}
                </Button>
              </span>
            </li>
          ))}
        </ul>
      )}
    </Card>
  )
}

/** The marketplace admin's home: studios to verify first, then every studio, then accounts. */
export function FrontDeskPage() {
  const studios = useDeskStudios()
  const waiting = studios.data?.studios.filter((s) => s.published && !s.verified) ?? []
  const others = studios.data?.studios.filter((s) => !(s.published && !s.verified)) ?? []
  return (
    <>
      <PageHeader title="Front desk" lead="Verify studios and keep the marketplace honest." />
      <div className="space-y-6">
        <Card>
          <h2 className="text-lg font-semibold">Waiting for verification</h2>
          <p className="mt-1 text-sm text-slip-600">
            Published studios nobody has checked yet. Verify once you have seen the kilns and spoken to the owner.
          </p>
          {studios.isPending ? (
            <Spinner />
          ) : studios.isError ? (
            <Alert tone="danger" className="mt-3">
              {studios.error.message}
            </Alert>
          ) : waiting.length === 0 ? (
            <div className="mt-3">
              <EmptyState title="Nothing waiting">Every published studio is verified.</EmptyState>
            </div>
          ) : (
            <ul className="mt-2">
              {waiting.map((s) => (
                <StudioRow key={s.id} studio={s} />
              ))}
            </ul>
          )}
        </Card>
        {others.length > 0 && (
          <Card>
            <h2 className="text-lg font-semibold">All studios</h2>
            <ul className="mt-2">
              {others.map((s) => (
                <StudioRow key={s.id} studio={s} />
              ))}
            </ul>
          </Card>
        )}
        <Disputes />
        <Accounts />
      </div>
    </>
  )
}
