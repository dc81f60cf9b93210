import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { formatDateTime } from '../../../../shared/dates'
import { firingCancelSchema } from '../../../../shared/schemas/studios'
import { wareIsLoaded } from '../../../../shared/workflow/firing-status'
import { Alert } from '../../../components/ui/Alert'
import { Button, ButtonLink } from '../../../components/ui/Button'
import { Dialog } from '../../../components/ui/Dialog'
import { Field, TextArea } from '../../../components/ui/Field'
import { applyServerErrors } from '../../../lib/forms'
import { useCancelFiring } from '../api/firings'
import type { FiringRecord } from '../api/types'
import { formatShelves } from '../../../lib/units'
import { firingInWords } from '../../../lib/firingWords'
import { FillGauge } from './FillGauge'
import { FiringStatusBadge } from './FiringStatusBadge'
import { FiringStatusButtons } from './FiringStatusButtons'

interface FiringDialogProps {
  firing: FiringRecord | null
  kilnName: string
  zone: string
  onClose: () => void
}

/** One firing: its dates in the studio's zone, space held, the status moves allowed now, and cancel. */
export function FiringDialog({ firing, kilnName, zone, onClose }: FiringDialogProps) {
  const [cancelling, setCancelling] = useState(false)
  return (
    <Dialog
      open={firing !== null}
      onClose={() => {
        setCancelling(false)
        onClose()
      }}
      title={firing ? firingInWords(firing) : ''}
      description={firing ? `${kilnName} · fires ${formatDateTime(firing.firingDate, zone)}` : undefined}
    >
      {firing &&
        (cancelling ? (
          <CancelFiring firing={firing} onDone={() => setCancelling(false)} />
        ) : (
          <FiringDetails firing={firing} zone={zone} onCancel={() => setCancelling(true)} />
        ))}
    </Dialog>
  )
}

function FiringDetails({ firing, zone, onCancel }: { firing: FiringRecord; zone: string; onCancel: () => void }) {
  const movable = firing.nextStatuses.some((s) => s !== 'cancelled')
  const canCancel = firing.nextStatuses.includes('cancelled')
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center gap-3">
        <FiringStatusBadge status={firing.status} />
        {firing.seriesId && <span className="text-xs text-slip-500">Part of a repeating series</span>}
      </div>
      <dl className="grid gap-x-4 gap-y-2 text-sm sm:grid-cols-[auto_1fr]">
        <dt className="font-medium text-slip-600">Drop-off closes</dt>
        <dd>{formatDateTime(firing.dropOffBy, zone)}</dd>
        <dt className="font-medium text-slip-600">Firing</dt>
        <dd>{formatDateTime(firing.firingDate, zone)}</dd>
        <dt className="font-medium text-slip-600">Ready by</dt>
        <dd>{formatDateTime(firing.readyBy, zone)}</dd>
        <dt className="font-medium text-slip-600">Space</dt>
        <dd>
          <FillGauge firing={firing} />
        </dd>
        {firing.notes && (
          <>
            <dt className="font-medium text-slip-600">Notes</dt>
            <dd className="whitespace-pre-line">{firing.notes}</dd>
          </>
        )}
        {firing.cancelledReason && (
          <>
            <dt className="font-medium text-slip-600">Called off because</dt>
            <dd>{firing.cancelledReason}</dd>
          </>
        )}
      </dl>
      {firing.status !== 'cancelled' && (
        <div className="flex flex-wrap items-center gap-3 rounded-control border border-slip-200 bg-slip-50 p-3">
          <p className="flex-1 text-sm text-slip-700">
            {wareIsLoaded(firing.status)
              ? 'Times, peak and witness cones for every potter in this firing.'
              : 'The log of the firing and the ware in it, from drop-off to results.'}
          </p>
          <ButtonLink to={`/firings/${firing.id}/load`} variant="secondary" size="sm">
            The load
          </ButtonLink>
          <ButtonLink to={`/firings/${firing.id}/log`} variant="secondary" size="sm">
            Firing log
          </ButtonLink>
        </div>
      )}
      {movable || canCancel || firing.undo ? (
        <div className="space-y-2">
          <p className="text-sm font-medium text-slip-800">Move this firing on</p>
          <FiringStatusButtons firing={firing}>
            {canCancel && (
              <button
                type="button"
                onClick={onCancel}
                className="rounded-control px-3 py-1.5 text-sm font-semibold text-danger-700 hover:bg-danger-50"
              >
                Call this firing off…
              </button>
            )}
          </FiringStatusButtons>
        </div>
      ) : (
        <p className="text-sm text-slip-600">
          This firing is {firing.status === 'cancelled' ? 'cancelled' : 'done'}; nothing more to change.
        </p>
      )}
    </div>
  )
}

type CancelInput = z.input<typeof firingCancelSchema>

function CancelFiring({ firing, onDone }: { firing: FiringRecord; onDone: () => void }) {
  const cancel = useCancelFiring(firing.studioId)
  const [formError, setFormError] = useState<string | null>(null)
  const { register, handleSubmit, setError, formState } = useForm<CancelInput, unknown, z.output<typeof firingCancelSchema>>({
    resolver: zodResolver(firingCancelSchema),
  })
  if (cancel.isSuccess) {
    const told = cancel.data.cancelledRequests
    return (
      <div className="space-y-3">
        <Alert tone="success" title="Firing called off">
          {told === 0
            ? 'No one was holding space in it.'
            : `${told} ${told === 1 ? 'potter’s place was' : 'potters’ places were'} called off; the potters are told by mail.`}
        </Alert>
        <Button variant="secondary" onClick={onDone}>
          Back to the firing
        </Button>
      </div>
    )
  }
  const onSubmit = handleSubmit(async ({ reason }) => {
    setFormError(null)
    try {
      await cancel.mutateAsync({ firingId: firing.id, reason })
    } catch (error) {
      setFormError(applyServerErrors(error, setError))
    }
  })
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <Alert tone="warning" title="Potters holding space are told by mail">
        {firing.space.shelvesTaken > 0
          ? `Potters hold ${formatShelves(firing.space.shelvesTaken)} in this firing. Each gets a mail with your reason, and paid deposits are refunded.`
          : 'No space is held yet, but anyone who asked for space in this firing gets a mail with your reason.'}
      </Alert>
      {formError && <Alert tone="danger">{formError}</Alert>}
      <Field
        label="Why is it called off?"
        hint="Potters read this, e.g. “An element failed; the next firing is on the 14th.”"
        error={formState.errors.reason?.message}
      >
        {(a11y) => <TextArea {...a11y} rows={3} {...register('reason')} />}
      </Field>
      <div className="flex flex-wrap justify-end gap-2">
        <Button variant="secondary" onClick={onDone}>
          Keep the firing
        </Button>
        <Button type="submit" variant="danger" busy={formState.isSubmitting}>
          Call the firing off
        </Button>
      </div>
    </form>
  )
}
