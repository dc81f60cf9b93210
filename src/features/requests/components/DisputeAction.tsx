import { useState } from 'react'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Dialog } from '../../../components/ui/Dialog'
import { Field, TextArea } from '../../../components/ui/Field'
import { api } from '../../../lib/api'
import { useRequestChange } from '../api/requests'
import type { RequestView } from '../api/types'

/** Either side can take fired ware to the Conewright desk when something went wrong. */
export function DisputeAction({ view }: { view: RequestView }) {
  const [open, setOpen] = useState(false)
  const [reason, setReason] = useState('')
  const dispute = useRequestChange((body: { reason: string }) =>
    api<RequestView>(`/api/requests/${view.id}/dispute`, { method: 'POST', body }),
  )
  return (
    <>
      <Button variant="ghost" size="sm" onClick={() => setOpen(true)}>
        Raise a dispute…
      </Button>
      <Dialog
        open={open}
        onClose={() => setOpen(false)}
        title="Raise a dispute"
        description="The Conewright desk reads the whole record — drop-off, firing log, results, messages — and contacts both sides. Try the message thread first; a dispute ends the normal path of this firing for this ware."
        footer={
          <>
            <Button variant="secondary" onClick={() => setOpen(false)}>
              Keep talking instead
            </Button>
            <Button
              variant="danger"
              busy={dispute.isPending}
              disabled={reason.trim().length < 5}
              onClick={() => dispute.mutate({ reason }, { onSuccess: () => setOpen(false) })}
            >
              Raise the dispute
            </Button>
          </>
        }
      >
        {dispute.isError && (
          <Alert tone="danger" className="mb-3">
            {dispute.error.message}
          </Alert>
        )}
        <Field label="What went wrong" hint="Facts help: which pieces, what you saw, what you were told.">
          {(a11y) => <TextArea {...a11y} rows={5} value={reason} onChange={(e) => setReason(e.target.value)} />}
        </Field>
      </Dialog>
    </>
  )
}
