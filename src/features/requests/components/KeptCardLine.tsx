import { useState } from 'react'
import { formatDate } from '../../../../shared/dates'
import { Button } from '../../../components/ui/Button'
import { ConfirmDialog } from '../../../components/ui/ConfirmDialog'
import { ApiError } from '../../../lib/api'
import { useForgetKeptCard } from '../api/requests'
import type { RequestView } from '../api/types'

/** The card the potter kept at the deposit, and the way to forget it (asked first: it cannot be taken back). */
export function KeptCardLine({ view, zone }: { view: RequestView; zone: string }) {
  const forget = useForgetKeptCard()
  const [asking, setAsking] = useState(false)
  if (!view.keptCard) return null
  return (
    <div className="mt-3 flex flex-wrap items-center gap-x-3 gap-y-1 text-sm text-slip-700" data-testid="kept-card">
      <p>
        Kept for a damage claim you accept: <span className="font-medium text-slip-900">{view.keptCard.label}</span>, since{' '}
        {formatDate(view.keptCard.keptAt, zone)}.
      </p>
      <Button variant="secondary" size="sm" onClick={() => setAsking(true)}>
        Forget this card
      </Button>
      <ConfirmDialog
        open={asking}
        onClose={() => setAsking(false)}
        title="Forget this card?"
        confirmLabel="Forget it"
        tone="danger"
        busy={forget.isPending}
        problem={
          forget.isError ? (forget.error instanceof ApiError ? forget.error.message : 'Something went wrong. Please try again.') : null
        }
        onConfirm={() => forget.mutate({ id: view.id }, { onSuccess: () => setAsking(false) })}
      >
        {view.keptCard.label} is removed from your payment details with Stripe. A damage claim on this ask is then paid on a checkout page,
        with a card you enter again.
      </ConfirmDialog>
    </div>
  )
}
