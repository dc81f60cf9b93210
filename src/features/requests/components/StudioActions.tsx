import { useState } from 'react'
import { formatDateTime, formatMoney, zoneName } from '../../../../shared/dates'
import { requestDeclineSchema } from '../../../../shared/schemas/requests'
import { takesRequests } from '../../../../shared/workflow/firing-status'
import { Alert } from '../../../components/ui/Alert'
import { ConfirmDialog } from '../../../components/ui/ConfirmDialog'
import { Button } from '../../../components/ui/Button'
import { Dialog } from '../../../components/ui/Dialog'
import { Field, Select, TextArea } from '../../../components/ui/Field'
import { Spinner } from '../../../components/ui/Spinner'
import { ApiError } from '../../../lib/api'
import { firingInWords } from '../../../lib/firingWords'
import { formatShelves } from '../../../lib/units'
import { useStudioFirings } from '../api/firings'
import { useAcceptRequest, useDeclineRequest, useProposeMove } from '../api/requests'
import type { RequestView } from '../api/types'
import { HandoverActions } from './HandoverActions'

const problemOf = (error: unknown) => (error instanceof ApiError ? error.message : 'Something went wrong. Please try again.')

/**
 * Taking an ask on holds its space and asks for the deposit: the button says so before it does it.
 * The server refuses when the firing has filled up or stopped taking ware meanwhile.
 */
export function AcceptButton({ view, size = 'md' }: { view: RequestView; size?: 'sm' | 'md' }) {
  const accept = useAcceptRequest()
  const [asking, setAsking] = useState(false)
  const deposit = view.price.depositCents
  const holdHours = view.studio.policies.depositHoldHours
  const dueBy = new Date(Date.now() + holdHours * 3600_000).toISOString()
  return (
    <span className="inline-flex flex-col gap-1">
      <Button size={size} onClick={() => setAsking(true)}>
        Take it on…
      </Button>
      {accept.isError && !asking && (
        <span className="text-xs font-medium text-danger-700" role="alert">
          {problemOf(accept.error)}
        </span>
      )}
      <ConfirmDialog
        open={asking}
        onClose={() => setAsking(false)}
        title={`Take on ${view.potter.displayName}’s ware?`}
        confirmLabel="Take it on"
        busy={accept.isPending}
        problem={accept.isError ? problemOf(accept.error) : null}
        onConfirm={() => accept.mutate(view.id, { onSuccess: () => setAsking(false) })}
      >
        <ul className="list-disc space-y-1 pl-5" data-testid="accept-effects">
          <li>
            {formatShelves(view.shelvesNeeded)} of the load is held for it ({formatShelves(view.firing.space.shelvesLeft)} free now).
          </li>
          {deposit > 0 ? (
            <li>
              {view.potter.displayName} is asked for a deposit of <strong>{formatMoney(deposit, view.price.currency)}</strong>, to pay by{' '}
              {formatDateTime(dueBy, view.studio.timezone)}; unpaid by then, the space comes back to you.
            </li>
          ) : (
            <li>No deposit is asked: the space is held at once.</li>
          )}
          <li>The potter gets your street address and a mail.</li>
        </ul>
      </ConfirmDialog>
    </span>
  )
}

interface ReasonDialogProps {
  requestId: string
  open: boolean
  onClose: () => void
  /** Turning an ask down, or calling off ware the studio already took on. */
  mode: 'decline' | 'cancel'
  refundText?: string
}

/** Turn an ask down (or, once taken on, call it off) with a reason the potter reads. */
export function ReasonDialog({ requestId, open, onClose, mode, refundText }: ReasonDialogProps) {
  const decline = useDeclineRequest()
  const [reason, setReason] = useState('')
  const [touched, setTouched] = useState(false)
  const parsed = requestDeclineSchema.safeParse({ reason })
  const cancelling = mode === 'cancel'
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title={cancelling ? `Call off this ware’s place?` : 'Turn this ask down?'}
      description={
        cancelling ? 'The space comes back to you and the potter is told why.' : 'The potter is told why and can look for another firing.'
      }
      footer={
        <>
          <Button variant="ghost" onClick={onClose}>
            Go back
          </Button>
          <Button
            variant="danger"
            busy={decline.isPending}
            onClick={() => {
              setTouched(true)
              if (parsed.success) decline.mutate({ id: requestId, reason: parsed.data.reason }, { onSuccess: onClose })
            }}
          >
            {cancelling ? 'Call it off' : 'Turn it down'}
          </Button>
        </>
      }
    >
      <div className="space-y-4">
        {cancelling && (
          <Alert tone="warning" title="The potter is refunded in full">
            {refundText ?? 'Everything they paid goes back to their card.'}
          </Alert>
        )}
        <Field
          label="Reason"
          hint="A sentence is enough: what would have to change, or what you can offer instead."
          error={touched && !parsed.success ? parsed.error.issues[0]?.message : undefined}
        >
          {(a11y) => (
            <TextArea
              {...a11y}
              rows={3}
              value={reason}
              onChange={(event) => setReason(event.target.value)}
              onBlur={() => setTouched(true)}
            />
          )}
        </Field>
        {decline.isError && <Alert tone="danger">{problemOf(decline.error)}</Alert>}
      </div>
    </Dialog>
  )
}

/** Suggest another of the studio's open firings; the potter moves or keeps the first. */
export function MoveDialog({ view, open, onClose }: { view: RequestView; open: boolean; onClose: () => void }) {
  const firings = useStudioFirings(view.studio.id, { enabled: open })
  const move = useProposeMove()
  const [firingId, setFiringId] = useState('')
  const zone = view.studio.timezone
  const now = Date.now()
  const choices = (firings.data ?? []).filter(
    (f) => f.id !== view.firing.id && takesRequests(f.status) && new Date(f.dropOffBy).getTime() > now,
  )
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Suggest another firing"
      description="The potter chooses whether to move; until then the ask stays where it is."
      footer={
        <>
          <Button variant="ghost" onClick={onClose}>
            Go back
          </Button>
          <Button busy={move.isPending} disabled={!firingId} onClick={() => move.mutate({ id: view.id, firingId }, { onSuccess: onClose })}>
            Suggest it
          </Button>
        </>
      }
    >
      {firings.isPending ? (
        <Spinner label="Loading your firings…" />
      ) : firings.isError ? (
        <Alert tone="danger">{problemOf(firings.error)}</Alert>
      ) : choices.length === 0 ? (
        <p className="text-sm text-slip-600">
          No other firing of this studio is taking ware. Post one in the calendar first, or turn the ask down with a reason.
        </p>
      ) : (
        <div className="space-y-3">
          <Field label="Firing" hint={`Times in ${zoneName(zone)}. The ware needs ${formatShelves(view.shelvesNeeded)}.`}>
            {(a11y) => (
              <Select {...a11y} value={firingId} onChange={(event) => setFiringId(event.target.value)}>
                <option value="">Choose a firing</option>
                {choices.map((f) => (
                  <option key={f.id} value={f.id} disabled={f.space.shelvesLeft < view.shelvesNeeded}>
                    {formatDateTime(f.firingDate, zone)} · {firingInWords(f)} · {formatShelves(f.space.shelvesLeft)} left
                  </option>
                ))}
              </Select>
            )}
          </Field>
          {move.isError && <Alert tone="danger">{problemOf(move.error)}</Alert>}
        </div>
      )}
    </Dialog>
  )
}

/** What the studio can do with an ask now (the server lists the actions; it still checks each). */
export function StudioActions({ view }: { view: RequestView }) {
  const [dialog, setDialog] = useState<'decline' | 'cancel' | 'move' | null>(null)
  const can = (action: RequestView['actions'][number]) => view.actions.includes(action)
  const paid = view.price.netPaidCents
  const currency = view.price.currency
  const deciding = can('accept') || can('decline') || can('move') || can('cancel')
  return (
    <div className="space-y-3">
      {can('check-in') && (
        <a href="#check-in-heading" className="block text-sm font-semibold text-clay-700 hover:underline">
          Take the ware in ↓
        </a>
      )}
      {can('results') && (
        <a href="#results-heading" className="block text-sm font-semibold text-clay-700 hover:underline">
          {view.results ? 'Change the results' : 'Post the results'} ↓
        </a>
      )}
      <HandoverActions view={view} />
      {can('rate') && (
        <a href="#reviews-heading" className="block text-sm font-semibold text-clay-700 hover:underline">
          Answer a few questions about {view.potter.displayName} ↓
        </a>
      )}
      {deciding && (
        <div className="flex flex-wrap items-start gap-2">
          {can('accept') && <AcceptButton view={view} />}
          {can('decline') && view.state === 'sent' && (
            <Button variant="secondary" onClick={() => setDialog('decline')}>
              Turn it down…
            </Button>
          )}
          {can('move') && (
            <Button variant="secondary" onClick={() => setDialog('move')}>
              Suggest another firing…
            </Button>
          )}
          {can('cancel') && (
            <Button variant="ghost" onClick={() => setDialog('cancel')}>
              Call it off…
            </Button>
          )}
        </div>
      )}
      {can('accept') && (
        <p className="text-xs text-slip-600">
          Taking it on holds {formatShelves(view.shelvesNeeded)} of the load and asks the potter for the deposit.
        </p>
      )}
      <ReasonDialog requestId={view.id} open={dialog === 'decline'} onClose={() => setDialog(null)} mode="decline" />
      <ReasonDialog
        requestId={view.id}
        open={dialog === 'cancel'}
        onClose={() => setDialog(null)}
        mode="cancel"
        refundText={
          paid > 0 ? `${formatMoney(paid, currency)} goes back to their card.` : 'Nothing has been paid yet, so nothing is refunded.'
        }
      />
      <MoveDialog view={view} open={dialog === 'move'} onClose={() => setDialog(null)} />
    </div>
  )
}
