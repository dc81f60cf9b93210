import { useState } from 'react'
import { formatMoney } from '../../../../shared/dates'
import { counterPaymentSchema } from '../../../../shared/schemas/pickup'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { ConfirmDialog } from '../../../components/ui/ConfirmDialog'
import { Dialog } from '../../../components/ui/Dialog'
import { Field, TextInput } from '../../../components/ui/Field'
import { ApiError } from '../../../lib/api'
import { moneyMeasure, parseShown, shownText } from '../../../lib/units'
import { useCounterPayment, useMarkCollected, useMarkReady } from '../api/pickup'
import type { RequestView } from '../api/types'

const problemOf = (error: unknown) => (error instanceof ApiError ? error.message : 'Something went wrong. Please try again.')

/** What is owed at the counter now: the deposit while the request is accepted, otherwise the balance. */
const counterOwedCents = (view: RequestView) => (view.state === 'accepted' ? view.price.depositOwedCents : view.price.balanceOwedCents)

/** Money handed over at the studio, recorded in the ledger; the full amount owed unless a part is given. */
function CounterPaymentDialog({ view, open, onClose }: { view: RequestView; open: boolean; onClose: () => void }) {
  const record = useCounterPayment()
  const currency = view.price.currency
  const measure = moneyMeasure(currency)
  const owed = counterOwedCents(view)
  const [amount, setAmount] = useState(() => shownText(owed, measure))
  const [note, setNote] = useState('')
  const shown = parseShown(amount)
  const cents = shown === undefined || Number.isNaN(shown) ? Number.NaN : measure.fromShown(shown)
  const parsed = counterPaymentSchema.safeParse({ amountCents: cents, ...(note.trim() ? { note: note.trim() } : {}) })
  const tooMuch = parsed.success && (parsed.data.amountCents ?? 0) > owed
  const amountError = !parsed.success
    ? parsed.error.issues.find((i) => i.path[0] === 'amountCents')
      ? 'Enter the amount paid.'
      : undefined
    : tooMuch
      ? `At most ${formatMoney(owed, currency)} is owed.`
      : undefined
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Paid at the counter"
      description={
        view.state === 'accepted' ? 'The deposit paid in person holds the space.' : 'The balance paid in person; it goes in the ledger.'
      }
      footer={
        <>
          <Button variant="ghost" onClick={onClose}>
            Go back
          </Button>
          <Button
            busy={record.isPending}
            disabled={!parsed.success || tooMuch}
            onClick={() =>
              parsed.success &&
              record.mutate({ id: view.id, amountCents: parsed.data.amountCents, note: parsed.data.note }, { onSuccess: onClose })
            }
          >
            Record the payment
          </Button>
        </>
      }
    >
      <div className="space-y-4">
        <p className="text-sm text-slip-700">
          Owed now: <strong data-testid="counter-owed">{formatMoney(owed, currency)}</strong>
        </p>
        <Field label={`Amount paid (${currency})`} error={amountError}>
          {(a11y) => (
            <TextInput
              {...a11y}
              inputMode="decimal"
              autoComplete="off"
              value={amount}
              onChange={(event) => setAmount(event.target.value)}
            />
          )}
        </Field>
        <Field label="Note (optional)" hint="Cash, card on the studio’s own reader, a cheque number…">
          {(a11y) => <TextInput {...a11y} value={note} maxLength={300} onChange={(event) => setNote(event.target.value)} />}
        </Field>
        {record.isError && <Alert tone="danger">{problemOf(record.error)}</Alert>}
      </div>
    </Dialog>
  )
}

/** The studio's steps once the ware is out of the kiln: ready for pickup, money at the counter, handed over. */
export function HandoverActions({ view }: { view: RequestView }) {
  const ready = useMarkReady()
  const collected = useMarkCollected()
  const [counter, setCounter] = useState(false)
  const [handingOver, setHandingOver] = useState(false)
  const can = (action: RequestView['actions'][number]) => view.actions.includes(action)
  const currency = view.price.currency
  const owedOnCollect =
    collected.error instanceof ApiError && collected.error.code === 'balance-owed'
      ? Number(collected.error.body.owedCents ?? view.price.balanceOwedCents)
      : null
  if (!can('ready') && !can('counter-payment') && !can('collected') && view.state !== 'ready') return null

  return (
    <div className="space-y-3" data-testid="handover-actions">
      {can('ready') && (
        <div className="space-y-1">
          <Button busy={ready.isPending} disabled={!view.results} onClick={() => ready.mutate(view.id)}>
            Mark ready for pickup
          </Button>
          <p className="text-xs text-slip-600">
            {view.results
              ? 'The potter gets a mail with the pickup hours and what is owed.'
              : 'Post the results first: the potter hears about them with the ready mail.'}
          </p>
          {ready.isError && (
            <p className="text-sm font-medium text-danger-700" role="alert">
              {problemOf(ready.error)}
            </p>
          )}
        </div>
      )}
      {view.state === 'ready' && (
        <p className="text-sm" data-testid="owed-now">
          {view.price.balanceOwedCents > 0 ? (
            <>
              Still owed: <strong>{formatMoney(view.price.balanceOwedCents, currency)}</strong>
            </>
          ) : (
            <span className="text-celadon-700">Everything is paid.</span>
          )}
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        {can('counter-payment') && (
          <Button variant="secondary" onClick={() => setCounter(true)}>
            Paid at the counter…
          </Button>
        )}
        {(can('collected') || view.state === 'ready') && (
          <Button variant={can('collected') ? 'primary' : 'secondary'} busy={collected.isPending} onClick={() => setHandingOver(true)}>
            Picked up…
          </Button>
        )}
      </div>
      <ConfirmDialog
        open={handingOver}
        onClose={() => setHandingOver(false)}
        title={`Hand the ware over to ${view.potter.displayName}?`}
        confirmLabel="Yes, picked up"
        busy={collected.isPending}
        onConfirm={() => collected.mutate(view.id, { onSettled: () => setHandingOver(false) })}
      >
        <p>
          The ware is marked picked up and {view.potter.displayName} is mailed the receipt. After this, each side answers a few questions
          about the other, kept from each other until both have answered.
        </p>
      </ConfirmDialog>
      {owedOnCollect !== null ? (
        <Alert tone="warning" title="Not handed over yet">
          {formatMoney(owedOnCollect, currency)} is still owed. Take it at the counter, or let the potter pay online first.
        </Alert>
      ) : (
        collected.isError && <Alert tone="danger">{problemOf(collected.error)}</Alert>
      )}
      <CounterPaymentDialog key={String(counter)} view={view} open={counter} onClose={() => setCounter(false)} />
    </div>
  )
}
