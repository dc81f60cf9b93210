import { useState } from 'react'
import { formatDate, formatDateTime, formatMoney } from '../../../../shared/dates'
import { requestWithdrawSchema } from '../../../../shared/schemas/requests'
import { Alert } from '../../../components/ui/Alert'
import { Button, ButtonLink } from '../../../components/ui/Button'
import { Dialog } from '../../../components/ui/Dialog'
import { Checkbox, Field, TextArea } from '../../../components/ui/Field'
import { ApiError } from '../../../lib/api'
import { firingInWords } from '../../../lib/firingWords'
import { formatShelves } from '../../../lib/units'
import { QuoteSummary } from '../../../components/ware/QuoteSummary'
import { ConfirmDialog } from '../../../components/ui/ConfirmDialog'
import { useConfirmPrice, useDeclinePrice } from '../api/pickup'
import { useAnswerMove, useOpenCheckout, useWithdrawRequest } from '../api/requests'
import type { RequestView } from '../api/types'
import { refundIfWithdrawn } from '../requestWords'
import { SendDialog } from './SendDialog'

const problemOf = (error: unknown) => (error instanceof ApiError ? error.message : 'Something went wrong. Please try again.')

/** What a card can be charged for: the processor refuses less, and the counter takes it instead. */
const payableByCard = (view: RequestView, cents: number) => cents >= view.price.minimumOnlineCents

/** Opens the payment provider's page for the deposit or the balance and leaves for it. */
function CheckoutButton({
  view,
  purpose,
  label,
  keepCard = false,
}: {
  view: RequestView
  purpose: 'deposit' | 'balance'
  label: string
  keepCard?: boolean
}) {
  const checkout = useOpenCheckout()
  return (
    <div className="space-y-2">
      <Button
        busy={checkout.isPending || checkout.isSuccess}
        onClick={() =>
          checkout.mutate({ id: view.id, purpose, keepCard }, { onSuccess: ({ checkoutUrl }) => window.location.assign(checkoutUrl) })
        }
      >
        {label}
      </Button>
      {checkout.isError && (
        <p className="text-sm font-medium text-danger-700" role="alert">
          {problemOf(checkout.error)}
        </p>
      )}
    </div>
  )
}

function UnderCardMinimum({ view, cents }: { view: RequestView; cents: number }) {
  return (
    <p className="text-sm text-slip-700" data-testid="pay-at-counter">
      {formatMoney(cents, view.price.currency)} is less than a card can be charged: pay it at the studio’s counter.
    </p>
  )
}

/**
 * The deposit, with the choice to keep the card for a damage claim on this ask. Off by default: it is
 * the potter's own choice, and the card is charged only for a claim they accept.
 */
export function PayDepositButton({ view, label }: { view: RequestView; label?: string }) {
  const [keepCard, setKeepCard] = useState(false)
  const owed = view.price.depositOwedCents
  if (!payableByCard(view, owed)) return <UnderCardMinimum view={view} cents={owed} />
  return (
    <div className="space-y-2">
      <Checkbox
        checked={keepCard}
        onChange={(e) => setKeepCard(e.target.checked)}
        label={
          <>
            Keep this card for a damage claim on this ask.{' '}
            <span className="text-slip-600">
              If {view.studio.name} claims for damage under its terms and you accept, it is paid in one step. It is never charged without
              your yes, and you can forget it at any time.
            </span>
          </>
        }
      />
      <CheckoutButton
        view={view}
        purpose="deposit"
        keepCard={keepCard}
        label={label ?? `Pay the deposit · ${formatMoney(owed, view.price.currency)}`}
      />
    </div>
  )
}

export function PayBalanceButton({ view, label }: { view: RequestView; label?: string }) {
  const owed = view.price.balanceOwedCents
  if (!payableByCard(view, owed)) return <UnderCardMinimum view={view} cents={owed} />
  return <CheckoutButton view={view} purpose="balance" label={label ?? `Pay the balance · ${formatMoney(owed, view.price.currency)}`} />
}

/** The price the measured ware gives, before and after, for the potter to agree to. */
function ConfirmPrice({ view }: { view: RequestView }) {
  const confirm = useConfirmPrice()
  const decline = useDeclinePrice()
  const [declining, setDeclining] = useState(false)
  const before = view.price.standing
  const after = view.price.pending
  if (!after) return null
  const currency = after.currency
  return (
    <div className="space-y-3 rounded-control border border-ember-300 bg-ember-100/40 p-4" data-testid="confirm-price">
      <h3 className="font-semibold">The studio measured your ware</h3>
      <p className="text-sm text-slip-800">
        The price goes from {before ? formatMoney(before.totalCents, currency) : 'the first quote'} to{' '}
        <strong>{formatMoney(after.totalCents, currency)}</strong>. It needs your agreement before the firing.
      </p>
      <QuoteSummary quote={after} />
      <div className="flex flex-wrap gap-2">
        <Button busy={confirm.isPending} onClick={() => confirm.mutate(view.id)}>
          Confirm the new price
        </Button>
        <Button variant="secondary" onClick={() => setDeclining(true)}>
          Turn it down…
        </Button>
      </div>
      {confirm.isError && (
        <p className="text-sm font-medium text-danger-700" role="alert">
          {problemOf(confirm.error)}
        </p>
      )}
      <p className="text-xs text-slip-600">If the sizes look wrong, ask the studio in the messages before answering.</p>
      <ConfirmDialog
        open={declining}
        onClose={() => setDeclining(false)}
        title="Turn the new price down?"
        confirmLabel="Turn it down and withdraw"
        tone="danger"
        busy={decline.isPending}
        problem={decline.isError ? problemOf(decline.error) : null}
        onConfirm={() => decline.mutate(view.id, { onSuccess: () => setDeclining(false) })}
      >
        <p>
          Your ask is withdrawn and the ware is not fired. Everything you paid,{' '}
          <strong>{formatMoney(view.price.netPaidCents, currency)}</strong>, comes back to you in full.
        </p>
        <p>Pick your ware up from {view.studio.name} in their opening hours.</p>
      </ConfirmDialog>
    </div>
  )
}

/** What the potter can do with their ask now (the server lists the actions; it still checks each). */
export function PotterActions({ view }: { view: RequestView }) {
  const [sending, setSending] = useState(false)
  const [withdrawing, setWithdrawing] = useState(false)
  const answer = useAnswerMove()
  const can = (action: RequestView['actions'][number]) => view.actions.includes(action)
  const zone = view.studio.timezone

  return (
    <div className="space-y-4">
      {can('answer-move') && view.proposedFiring && (
        <div className="rounded-control border border-ember-300 bg-ember-100/40 p-4" data-testid="proposed-move">
          <h3 className="font-semibold">{view.studio.name} suggests another firing</h3>
          <p className="mt-1 text-sm text-slip-800">{firingInWords(view.proposedFiring)}</p>
          <p className="text-sm text-slip-700">
            Drop off by {formatDateTime(view.proposedFiring.dropOffBy, zone)}; fired {formatDateTime(view.proposedFiring.firingDate, zone)}.
          </p>
          <p className="text-xs text-slip-600">{formatShelves(view.proposedFiring.space.shelvesLeft)} left in it.</p>
          <div className="mt-3 flex flex-wrap gap-2">
            <Button
              busy={answer.isPending && answer.variables?.accept === true}
              onClick={() => answer.mutate({ id: view.id, accept: true })}
            >
              Move my ware there
            </Button>
            <Button
              variant="secondary"
              busy={answer.isPending && answer.variables?.accept === false}
              onClick={() => answer.mutate({ id: view.id, accept: false })}
            >
              Keep the first firing
            </Button>
          </div>
          {answer.isError && (
            <p className="mt-2 text-sm font-medium text-danger-700" role="alert">
              {problemOf(answer.error)}
            </p>
          )}
          <p className="mt-2 text-xs text-slip-600">
            Moving means the studio takes your ware on in that firing; you then pay the deposit to hold the space.
          </p>
        </div>
      )}

      {can('confirm-price') && <ConfirmPrice view={view} />}

      {can('pay-balance') && (
        <div className="space-y-1">
          <PayBalanceButton view={view} />
          <p className="text-xs text-slip-600">Or pay at the studio’s counter when you pick up.</p>
        </div>
      )}

      {can('rate') && (
        <a href="#reviews-heading" className="block text-sm font-semibold text-clay-700 hover:underline">
          Answer a few questions about the firing ↓
        </a>
      )}

      {can('pay-deposit') && (
        <div className="space-y-1">
          <PayDepositButton view={view} />
          {view.depositDueAt && (
            <p className="text-xs text-slip-600">Pay by {formatDateTime(view.depositDueAt, zone)} or the space goes back to the studio.</p>
          )}
        </div>
      )}

      <div className="flex flex-wrap gap-2">
        {can('edit') && (
          <ButtonLink variant={can('send') ? 'secondary' : 'primary'} to={`/firings/${view.firing.id}/request?draft=${view.id}`}>
            Edit the pieces
          </ButtonLink>
        )}
        {can('send') && (
          <Button onClick={() => setSending(true)} disabled={view.verdict === 'block'}>
            Send…
          </Button>
        )}
        {can('withdraw') && (
          <Button variant="ghost" onClick={() => setWithdrawing(true)}>
            Withdraw…
          </Button>
        )}
      </div>
      {can('send') && view.verdict === 'block' && (
        <p className="text-sm text-slip-600">The check blocks this ware: edit the pieces before sending.</p>
      )}

      <SendDialog requestId={sending ? view.id : null} onClose={() => setSending(false)} onSent={() => setSending(false)} />
      <WithdrawDialog view={view} open={withdrawing} onClose={() => setWithdrawing(false)} />
    </div>
  )
}

function WithdrawDialog({ view, open, onClose }: { view: RequestView; open: boolean; onClose: () => void }) {
  const withdraw = useWithdrawRequest()
  const [reason, setReason] = useState('')
  const paidCents = view.price.netPaidCents
  const terms = view.studio.policies.cancellation
  const preview = refundIfWithdrawn(paidCents, view.firing.firingDate, terms)
  const currency = view.price.currency
  const money = (cents: number) => formatMoney(cents, currency)
  const parsed = requestWithdrawSchema.safeParse({ reason })

  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Withdraw your ask?"
      description="The studio is told, and any space held for you goes back to them."
      footer={
        <>
          <Button variant="ghost" onClick={onClose}>
            Keep it
          </Button>
          <Button
            variant="danger"
            busy={withdraw.isPending}
            disabled={!parsed.success}
            onClick={() => withdraw.mutate({ id: view.id, reason: reason.trim() || undefined }, { onSuccess: onClose })}
          >
            Withdraw
          </Button>
        </>
      }
    >
      <div className="space-y-4">
        <div className="rounded-control border border-slip-200 bg-slip-50 p-3 text-sm" data-testid="withdraw-refund">
          {paidCents <= 0 ? (
            <p>Nothing has been paid, so there is nothing to refund.</p>
          ) : (
            <>
              <p className="font-semibold">
                Under the studio’s terms you get {money(preview.refundCents)} back of the {money(paidCents)} paid.
              </p>
              <p className="mt-1 text-slip-700">
                {preview.full
                  ? `All of it comes back until ${formatDate(preview.fullUntil, view.studio.timezone)}, ${terms.fullRefundDaysBefore} ${terms.fullRefundDaysBefore === 1 ? 'day' : 'days'} before the firing.`
                  : `Since ${formatDate(preview.fullUntil, view.studio.timezone)} the studio’s terms give ${terms.laterRefundPercent} % back.`}
              </p>
            </>
          )}
        </div>
        <Field label="Why (optional)" hint="The studio sees this." error={parsed.success ? undefined : parsed.error.issues[0]?.message}>
          {(a11y) => <TextArea {...a11y} rows={3} value={reason} onChange={(event) => setReason(event.target.value)} />}
        </Field>
        {withdraw.isError && <Alert tone="danger">{problemOf(withdraw.error)}</Alert>}
      </div>
    </Dialog>
  )
}
