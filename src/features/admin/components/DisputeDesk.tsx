import { useState, type ReactNode } from 'react'
import { Link } from 'react-router-dom'
import type { DeskDispute } from '../../../../shared/api/admin'
import type { RequestMessageJson, RequestView } from '../../../../shared/api/requests'
import { formatDateTime, formatMoney } from '../../../../shared/dates'
import { FiringLogView } from '../../../components/firing/FiringLog'
import { PhotoGallery } from '../../../components/photos/PhotoGallery'
import { Timeline } from '../../../components/requests/Timeline'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Card, EmptyState } from '../../../components/ui/Card'
import { Field, TextInput } from '../../../components/ui/Field'
import { Spinner } from '../../../components/ui/Spinner'
import type { UnitSystem } from '../../../lib/units'
import { outcomeLabel } from '../../../lib/pieceWords'
import { useDeskRefund, useDisputeRecord, useDisputes } from '../api/admin'

const RAISED_BY_WORDS: Record<NonNullable<DeskDispute['dispute']>['raisedBy'], string> = {
  potter: 'the potter',
  studio: 'the studio',
  desk: 'the desk',
}

const pieceName = (view: RequestView, index: number) => view.pieces[index]?.label || `Piece ${index + 1}`

function Evidence({ title, children, testId }: { title: string; children: ReactNode; testId: string }) {
  return (
    <section className="space-y-2" data-testid={testId} aria-label={title}>
      <h4 className="text-sm font-semibold text-slip-900">{title}</h4>
      {children}
    </section>
  )
}

function CheckInEvidence({ view }: { view: RequestView }) {
  const checkIn = view.checkIn
  if (!checkIn) return <p className="text-sm text-slip-600">Not checked in.</p>
  return (
    <div className="space-y-1 text-sm text-slip-800">
      <p>{formatDateTime(checkIn.at, view.studio.timezone)}</p>
      {checkIn.refused ? (
        <p>Turned away at the door: {checkIn.refusedReason}</p>
      ) : (
        <ul className="list-disc pl-5">
          {checkIn.receivedPieces.map((piece) => (
            <li key={piece.pieceIndex}>
              {pieceName(view, piece.pieceIndex)}: {piece.received} of {piece.declared} received
            </li>
          ))}
        </ul>
      )}
      {checkIn.conditionNotes && <p>“{checkIn.conditionNotes}”</p>}
    </div>
  )
}

function ResultsEvidence({ view }: { view: RequestView }) {
  const results = view.results
  if (!results) return <p className="text-sm text-slip-600">No results posted.</p>
  return (
    <div className="space-y-1 text-sm text-slip-800">
      <ul className="list-disc pl-5">
        {results.outcomes.map((outcome) => (
          <li key={outcome.pieceId}>
            {pieceName(view, outcome.pieceIndex)} ({outcome.tag}):{' '}
            <strong className="font-semibold">{outcomeLabel(outcome.outcome)}</strong>
            {outcome.notes && ` — ${outcome.notes}`}
          </li>
        ))}
      </ul>
      {results.notes && <p>“{results.notes}”</p>}
    </div>
  )
}

function MessagesEvidence({ messages, zone }: { messages: RequestMessageJson[]; zone: string }) {
  if (messages.length === 0) return <p className="text-sm text-slip-600">No messages.</p>
  return (
    <ol className="space-y-2 text-sm">
      {messages.map((message) => (
        <li key={message.id} className="rounded-control border border-slip-200 bg-slip-50 px-3 py-2">
          <p className="text-xs text-slip-600">
            {message.author} ({message.side === 'potter' ? 'potter' : 'studio'}) · {formatDateTime(message.at, zone)}
          </p>
          <p className="whitespace-pre-line text-slip-900">{message.body}</p>
        </li>
      ))}
    </ol>
  )
}

/** Everything on record for one disputed request, read in one place before deciding. */
function DisputeRecord({ id, units }: { id: string; units: UnitSystem }) {
  const { view, messages } = useDisputeRecord(id)
  if (view.isPending) return <Spinner label="Loading the record…" />
  if (view.isError) return <Alert tone="danger">{view.error.message}</Alert>
  const record = view.data
  const zone = record.studio.timezone
  const price = record.price
  return (
    <div className="space-y-5 border-t border-slip-200 pt-4" data-testid="dispute-record">
      <Evidence title="Money" testId="evidence-money">
        <p className="text-sm text-slip-800">
          Price {formatMoney(price.totalCents, price.currency)} · paid {formatMoney(price.paidInCents, price.currency)}
          {price.refundedCents > 0 && ` · refunded ${formatMoney(price.refundedCents, price.currency)}`}
        </p>
      </Evidence>
      <Evidence title="Check-in" testId="evidence-check-in">
        <CheckInEvidence view={record} />
      </Evidence>
      <Evidence title="The firing log" testId="evidence-log">
        {record.firingLog ? (
          <FiringLogView log={record.firingLog} zone={zone} units={units} />
        ) : (
          <p className="text-sm text-slip-600">No log written.</p>
        )}
      </Evidence>
      <Evidence title="Results" testId="evidence-results">
        <ResultsEvidence view={record} />
      </Evidence>
      <Evidence title="Photos" testId="evidence-photos">
        <PhotoGallery photos={record.photos} headingLevel="h4" empty="No photos." />
      </Evidence>
      <Evidence title="Messages" testId="evidence-messages">
        {messages.isPending ? (
          <Spinner label="Loading the messages…" />
        ) : messages.isError ? (
          <Alert tone="danger">{messages.error.message}</Alert>
        ) : (
          <MessagesEvidence messages={messages.data.messages} zone={zone} />
        )}
      </Evidence>
      <Evidence title="What has happened" testId="evidence-timeline">
        <Timeline entries={record.timeline} zone={zone} />
      </Evidence>
    </div>
  )
}

function RefundForm({ dispute }: { dispute: DeskDispute }) {
  const refund = useDeskRefund()
  const [amount, setAmount] = useState('')
  const [reason, setReason] = useState('')
  const currency = dispute.price?.currency ?? 'USD'
  const cents = Math.round(Number(amount) * 100)
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-end gap-2">
        <Field label={`Refund (${currency})`}>
          {(a11y) => (
            <TextInput {...a11y} inputMode="decimal" value={amount} onChange={(e) => setAmount(e.target.value)} className="w-28" />
          )}
        </Field>
        <Field label="Why" className="min-w-48 flex-1">
          {(a11y) => <TextInput {...a11y} value={reason} onChange={(e) => setReason(e.target.value)} />}
        </Field>
        <Button
          size="sm"
          busy={refund.isPending}
          disabled={!(cents > 0) || reason.trim().length < 3}
          onClick={() => refund.mutate({ id: dispute.id, amountCents: cents, reason })}
        >
          Refund
        </Button>
      </div>
      {refund.isSuccess && <Alert tone="success">The refund is on its way to the potter; it shows in the request’s money.</Alert>}
      {refund.isError && <Alert tone="danger">{refund.error.message}</Alert>}
    </div>
  )
}

function DisputeCard({ dispute, units }: { dispute: DeskDispute; units: UnitSystem }) {
  const [open, setOpen] = useState(false)
  const zone = dispute.studio.timezone
  return (
    <Card as="li" className="space-y-3">
      <div data-testid="desk-dispute" data-request-id={dispute.id} className="space-y-2">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h3 className="font-semibold">
            <Link to={`/requests/${dispute.id}`} className="text-clay-800 hover:underline">
              {dispute.potterName} · {dispute.studio.name}
            </Link>
          </h3>
          <span className="text-sm text-slip-600">
            {dispute.firing.kilnName}, cone {dispute.firing.cone} {dispute.firing.atmosphere},{' '}
            {formatDateTime(dispute.firing.firingDate, zone)}
            {dispute.price && ` · ${formatMoney(dispute.price.totalCents, dispute.price.currency)}`}
          </span>
        </div>
        {dispute.dispute ? (
          <blockquote className="border-l-4 border-ember-300 pl-3 text-sm text-slip-900" data-testid="dispute-reason">
            <p>“{dispute.dispute.reason}”</p>
            <footer className="mt-1 text-xs text-slip-600">
              Raised by {RAISED_BY_WORDS[dispute.dispute.raisedBy]}, {dispute.dispute.raisedByName},{' '}
              {formatDateTime(dispute.dispute.at, zone)}
            </footer>
          </blockquote>
        ) : (
          <p className="text-sm text-slip-600">No reason was recorded.</p>
        )}
        <Button variant="secondary" size="sm" aria-expanded={open} onClick={() => setOpen((was) => !was)}>
          {open ? 'Hide the record' : 'Read the record'}
        </Button>
      </div>
      {open && <DisputeRecord id={dispute.id} units={units} />}
      <RefundForm dispute={dispute} />
    </Card>
  )
}

/** Open disputes, each with its reason, the record to read and a refund to give. */
export function DisputeDesk({ units }: { units: UnitSystem }) {
  const disputes = useDisputes()
  if (disputes.isPending) return <Spinner label="Loading the disputes…" />
  if (disputes.isError) return <Alert tone="danger">{disputes.error.message}</Alert>
  if (disputes.data.requests.length === 0) return <EmptyState title="No open disputes" />
  return (
    <ul className="space-y-4">
      {disputes.data.requests.map((dispute) => (
        <DisputeCard key={dispute.id} dispute={dispute} units={units} />
      ))}
    </ul>
  )
}
