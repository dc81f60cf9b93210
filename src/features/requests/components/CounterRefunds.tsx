import { useState } from 'react'
import { formatDateTime, formatMoney } from '../../../../shared/dates'
import { Button } from '../../../components/ui/Button'
import { ConfirmDialog } from '../../../components/ui/ConfirmDialog'
import { ApiError } from '../../../lib/api'
import { useMarkHandedBack } from '../api/pickup'
import type { CounterRefundJson, RequestView } from '../api/types'

/**
 * Money taken at the counter that is owed back: the studio hands it back and marks it so; the
 * potter sees what to collect.
 */
export function CounterRefunds({ view }: { view: RequestView }) {
  const handBack = useMarkHandedBack()
  const [asking, setAsking] = useState<CounterRefundJson | null>(null)
  const canHandBack = view.actions.includes('hand-back')
  return (
    <ul className="space-y-2" data-testid="counter-refunds">
      {view.counterRefunds.map((refund) => (
        <li
          key={refund.id}
          className="flex flex-wrap items-center justify-between gap-2 rounded-control border border-slip-200 px-3 py-2 text-sm"
        >
          <span>
            {refund.paidAt
              ? `${formatMoney(refund.amountCents, refund.currency)} handed back at the counter on ${formatDateTime(refund.paidAt, view.studio.timezone)}`
              : view.viewer === 'potter'
                ? `${formatMoney(refund.amountCents, refund.currency)} paid at the counter is owed back to you: pick it up at the studio.`
                : `${formatMoney(refund.amountCents, refund.currency)} taken at the counter is owed back to ${view.potter.displayName}.`}
          </span>
          {!refund.paidAt && canHandBack && (
            <Button size="sm" variant="secondary" onClick={() => setAsking(refund)}>
              Mark handed back…
            </Button>
          )}
        </li>
      ))}
      <ConfirmDialog
        open={asking !== null}
        onClose={() => setAsking(null)}
        title="Handed back at the counter?"
        confirmLabel="Yes, handed back"
        busy={handBack.isPending}
        problem={handBack.isError ? (handBack.error instanceof ApiError ? handBack.error.message : 'Something went wrong.') : null}
        onConfirm={() => asking && handBack.mutate({ id: view.id, refundId: asking.id }, { onSuccess: () => setAsking(null) })}
      >
        {asking && (
          <p>
            Mark <strong>{formatMoney(asking.amountCents, asking.currency)}</strong> as handed back to {view.potter.displayName}. It goes in
            the ledger as money out.
          </p>
        )}
      </ConfirmDialog>
    </ul>
  )
}
