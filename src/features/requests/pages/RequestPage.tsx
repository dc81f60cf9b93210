import { useEffect, useState } from 'react'
import { PotterIncidentRecordCard, RequestIncidents } from '../components/RequestIncidents'
import { Link, useParams, useSearchParams } from 'react-router-dom'
import { formatMoney } from '../../../../shared/dates'
import { HOLDING_STATES } from '../../../../shared/workflow/request-states'
import { Alert } from '../../../components/ui/Alert'
import { Card } from '../../../components/ui/Card'
import { Spinner } from '../../../components/ui/Spinner'
import { FiringLogView } from '../../../components/firing/FiringLog'
import { ButtonLink } from '../../../components/ui/Button'
import { FindingsList, VerdictLine } from '../../../components/ware/CheckResults'
import { QuoteSummary } from '../../../components/ware/QuoteSummary'
import { firingInWords } from '../../../lib/firingWords'
import { formatVolume, type UnitSystem } from '../../../lib/units'
import { useMe } from '../../auth/api/auth'
import { useRequest, type RequestPolling } from '../api/requests'
import type { RequestView } from '../api/types'
import { FiringSummary } from '../components/FiringSummary'
import { KeptCardLine } from '../components/KeptCardLine'
import { Ledger } from '../components/Ledger'
import { MessageThread } from '../components/MessageThread'
import { PiecesTable } from '../components/PiecesTable'
import { CheckInForm } from '../components/CheckInForm'
import { DropOffRecord, PriceChangeNote } from '../components/DropOffRecord'
import { PayBalanceButton, PayDepositButton, PotterActions } from '../components/PotterActions'
import { ResultsForm, ResultsView } from '../components/ResultsPanel'
import { ReviewsPanel } from '../components/ReviewsPanel'
import { WarePhotos } from '../components/WarePhotos'
import { potterPickupStep, priceChange, reviewStep, studioPickupStep } from '../pickupWords'
import { CounterRefunds } from '../components/CounterRefunds'
import { PotterRecordLine } from '../components/PotterRecordLine'
import { RequestProblem } from '../components/RequestProblem'
import { RequestStateBadge } from '../components/RequestStateBadge'
import { SpaceGauge } from '../components/SpaceGauge'
import { StudioActions } from '../components/StudioActions'
import { TaggedPieces } from '../components/TaggedPieces'
import { TagPieces } from '../components/TagPieces'
import { Timeline } from '../../../components/requests/Timeline'
import { DisputeAction } from '../components/DisputeAction'
import { potterNextStep, studioNextStep } from '../requestWords'

/** States in which what is still owed is worth a line of its own: from the drop-off to the handover. */
const OWING_STATES: readonly RequestView['state'][] = ['deposit_paid', 'received', 'fired', 'ready', 'collected']

/** How long a return from the payment page waits for the payment's confirmation before explaining. */
const CONFIRM_WINDOW_MS = 30_000
const CONFIRM_POLL_MS = 1_000

/** /requests/:id: one potter's ware in one firing, as the potter, the studio or an admin sees it, with what each may do next. */
export function RequestPage() {
  const { id = '' } = useParams()
  const [params] = useSearchParams()
  const me = useMe()
  const units: UnitSystem = me.data?.unitSystem ?? 'imperial'
  const paidFor = paymentPurpose(params.get('paid'))
  const unpaidFor = paymentPurpose(params.get('unpaid'))
  const returnedPaid = paidFor !== null
  const [returnedAt] = useState(() => Date.now())
  const [waitedOut, setWaitedOut] = useState(false)

  // Back from the hosted page: the payment is confirmed by the provider's webhook a moment later.
  const polling: RequestPolling = (view) =>
    paidFor && view && awaitingConfirmation(view, paidFor) && Date.now() - returnedAt < CONFIRM_WINDOW_MS ? CONFIRM_POLL_MS : false
  const request = useRequest(id, polling)

  useEffect(() => {
    if (!returnedPaid) return
    const timer = setTimeout(() => setWaitedOut(true), Math.max(0, returnedAt + CONFIRM_WINDOW_MS - Date.now()))
    return () => clearTimeout(timer)
  }, [returnedPaid, returnedAt])

  if (request.isPending) return <Spinner label="Loading…" />
  if (request.isError) return <RequestProblem error={request.error} what="this ware’s page" onRetry={() => request.refetch()} />
  return <RequestDetail view={request.data} units={units} paidFor={paidFor} waitedOut={waitedOut} unpaidFor={unpaidFor} />
}

type PaymentPurpose = 'deposit' | 'balance'

const paymentPurpose = (value: string | null): PaymentPurpose | null => (value === 'deposit' || value === 'balance' ? value : null)

/** Whether the page still waits for the webhook to book what the potter just paid. */
const awaitingConfirmation = (view: RequestView, purpose: PaymentPurpose) =>
  purpose === 'deposit' ? view.state === 'accepted' : view.state === 'ready' && view.price.balanceOwedCents > 0

interface DetailProps {
  view: RequestView
  units: UnitSystem
  paidFor: PaymentPurpose | null
  unpaidFor: PaymentPurpose | null
  waitedOut: boolean
}

function PaymentNotices(props: Omit<DetailProps, 'units'>) {
  if (props.view.viewer === 'studio') return null
  return (
    <>
      <DepositNotices
        view={props.view}
        returnedPaid={props.paidFor === 'deposit'}
        returnedUnpaid={props.unpaidFor === 'deposit'}
        waitedOut={props.waitedOut}
      />
      <BalanceNotices
        view={props.view}
        returnedPaid={props.paidFor === 'balance'}
        returnedUnpaid={props.unpaidFor === 'balance'}
        waitedOut={props.waitedOut}
      />
    </>
  )
}

interface NoticeProps {
  view: RequestView
  returnedPaid: boolean
  returnedUnpaid: boolean
  waitedOut: boolean
}

function ConfirmingPayment() {
  return (
    <Alert tone="info" title="Confirming your payment…">
      <span className="inline-flex items-center gap-2">
        <span className="size-4 animate-spin rounded-full border-2 border-clay-500 border-t-transparent" aria-hidden />
        The payment page sent you back; the card payment is being confirmed. This takes a few seconds.
      </span>
    </Alert>
  )
}

function NotConfirmedYet() {
  return (
    <Alert tone="warning" title="Your payment is not confirmed yet">
      We have not heard back from the card payment in 30 seconds. If the payment page showed it as paid, it will appear here shortly and you
      will get a mail; reload this page in a minute. If the payment page showed an error, nothing was charged and you can pay again.
    </Alert>
  )
}

function BalanceNotices({ view, returnedPaid, returnedUnpaid, waitedOut }: NoticeProps) {
  const awaiting = awaitingConfirmation(view, 'balance')
  const declined = view.payments.find((p) => p.purpose === 'balance' && p.failureMessage && p.status !== 'paid')
  return (
    <div className="space-y-3" aria-live="polite" data-testid="balance-notices">
      {returnedPaid && awaiting && !waitedOut && <ConfirmingPayment />}
      {returnedPaid && awaiting && waitedOut && <NotConfirmedYet />}
      {returnedPaid && !awaiting && view.price.balanceOwedCents === 0 && (
        <Alert tone="success" title="Balance paid">
          Thank you: nothing more is owed. Pick your ware up in the studio’s pickup hours.
        </Alert>
      )}
      {returnedUnpaid && awaiting && (
        <Alert tone="warning" title="The payment was not completed">
          <p>Nothing was charged. You can pay online again, or at the counter when you pick up.</p>
          {view.actions.includes('pay-balance') && (
            <div className="mt-2">
              <PayBalanceButton view={view} label="Try the payment again" />
            </div>
          )}
        </Alert>
      )}
      {awaiting && declined && !returnedPaid && (
        <Alert tone="danger" title="Your card was declined">
          {declined.failureMessage} Try another card, or pay at the counter.
        </Alert>
      )}
    </div>
  )
}

function DepositNotices({ view, returnedPaid, returnedUnpaid, waitedOut }: NoticeProps) {
  const awaiting = view.state === 'accepted'
  const declined = view.payments.find((p) => p.purpose === 'deposit' && p.failureMessage && p.status !== 'paid')
  return (
    <div className="space-y-3" aria-live="polite">
      {returnedPaid && awaiting && !waitedOut && <ConfirmingPayment />}
      {returnedPaid && awaiting && waitedOut && <NotConfirmedYet />}
      {returnedPaid && view.state === 'deposit_paid' && (
        <Alert tone="success" title="Deposit paid">
          Thank you. Your space is held; bring your ware by the drop-off time below.
        </Alert>
      )}
      {returnedUnpaid && awaiting && (
        <Alert tone="warning" title="The payment was not completed">
          <p>Nothing was charged. Your space stays held until the deposit deadline.</p>
          {view.actions.includes('pay-deposit') && (
            <div className="mt-2">
              <PayDepositButton view={view} label="Try the payment again" />
            </div>
          )}
        </Alert>
      )}
      {awaiting && declined && (
        <Alert tone="danger" title="Your card was declined">
          {declined.failureMessage} Try another card; the space stays held until the deposit deadline.
        </Alert>
      )}
    </div>
  )
}

function RequestDetail({ view, units, paidFor, unpaidFor, waitedOut }: DetailProps) {
  const zone = view.studio.timezone
  const isStudio = view.viewer !== 'potter'
  const facts = {
    state: view.state,
    depositDueAt: view.depositDueAt,
    proposedFiringId: view.proposedFiring?.id ?? null,
    dropOffBy: view.firing.dropOffBy,
    timezone: zone,
  }
  const nextStep =
    view.state === 'collected'
      ? reviewStep(view)
      : view.viewer === 'studio'
        ? (studioPickupStep(view.state, view) ?? studioNextStep(facts))
        : (potterPickupStep(view.state, view) ?? potterNextStep(facts))
  const standing = view.quote
  const change = priceChange(view)
  const remeasured = change !== null && !change.waiting && !change.declined
  const price = view.price
  const currency = price.currency
  const showResults = view.results !== null || view.actions.includes('results') || view.photos.some((p) => p.kind === 'result')
  const showReviews =
    view.actions.includes('rate') ||
    view.reviews.ofStudio !== null ||
    view.reviews.ofPotter !== null ||
    view.reviews.answered.potter ||
    view.reviews.answered.studio
  const warnings = view.findings.filter((f) => f.severity === 'warn')
  const acknowledged = view.acknowledgedWarnings.map((code) => ({ code, message: warnings.find((f) => f.code === code)?.message ?? code }))
  const decided = !['draft', 'sent'].includes(view.state)

  return (
    <article className="space-y-6">
      <header className="space-y-2">
        <p className="text-sm text-slip-600">
          {isStudio ? (
            <Link to={`/studios/${view.studio.id}/requests`} className="font-medium text-clay-700 hover:underline">
              ← Asks to {view.studio.name}
            </Link>
          ) : (
            <Link to="/my-ware" className="font-medium text-clay-700 hover:underline">
              ← My ware
            </Link>
          )}
        </p>
        <div className="flex flex-wrap items-center gap-3">
          <h1 className="text-2xl font-bold tracking-tight sm:text-3xl">
            {isStudio ? `${view.potter.displayName}’s ware` : `Your ware at ${view.studio.name}`}
          </h1>
          <RequestStateBadge state={view.state} />
        </div>
        <p className="text-slip-700" data-testid="next-step">
          {nextStep}
        </p>
      </header>

      <PaymentNotices view={view} paidFor={paidFor} unpaidFor={unpaidFor} waitedOut={waitedOut} />

      {/* On a phone what can be done comes first; on a wide screen it heads the side column. */}
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem] lg:grid-rows-[auto_1fr] lg:items-start">
        <div className="min-w-0 lg:col-start-2 lg:row-start-1">
          <Card>
            <h2 className="mb-3 text-lg font-semibold">Next</h2>
            {view.viewer === 'studio' ? <StudioActions view={view} /> : <PotterActions view={view} />}
            {view.viewer === 'admin' && (
              <div className="mt-4 border-t border-slip-200 pt-4">
                <StudioActions view={view} />
              </div>
            )}
            {view.actions.includes('dispute') && (
              <div className="mt-4 border-t border-slip-200 pt-3">
                <DisputeAction view={view} />
              </div>
            )}
            {!view.actions.some((a) => a !== 'message') && <p className="text-sm text-slip-600">Nothing to do here now.</p>}
          </Card>
        </div>
        <div className="min-w-0 space-y-6 lg:col-start-1 lg:row-span-2 lg:row-start-1">
          <Card>
            <h2 className="mb-3 text-lg font-semibold">The firing</h2>
            <FiringSummary firing={view.firing} kiln={view.kiln} studio={view.studio} units={units} showSpace={!decided} />
            {!decided && view.state !== 'draft' && (
              <div className="mt-4">
                <SpaceGauge need={view.shelvesNeeded} left={view.firing.space.shelvesLeft} />
              </div>
            )}
            {view.proposedFiring && view.viewer === 'studio' && (
              <p className="mt-3 text-sm text-ember-700">
                You suggested moving it to the {firingInWords(view.proposedFiring)}; waiting for the potter.
              </p>
            )}
          </Card>

          <PotterIncidentRecordCard view={view} />
          <RequestIncidents view={view} />

          {showReviews && (
            <Card>
              <h2 id="reviews-heading" className="mb-3 scroll-mt-4 text-lg font-semibold">
                After pickup
              </h2>
              <ReviewsPanel view={view} />
            </Card>
          )}

          {view.actions.includes('tag-piece') && (
            <Card>
              <h2 id="tag-pieces-heading" className="mb-3 scroll-mt-4 text-lg font-semibold">
                Check in piece by piece
              </h2>
              <TagPieces view={view} units={units} />
            </Card>
          )}

          {view.pieceRecords.length > 0 && (
            <Card>
              <h2 id="tagged-heading" className="mb-3 text-lg font-semibold">
                {isStudio ? 'Tagged pieces' : 'Your pieces, by their tags'}
              </h2>
              <TaggedPieces view={view} />
            </Card>
          )}

          {view.actions.includes('check-in') && (
            <Card>
              <h2 id="check-in-heading" className="mb-3 scroll-mt-4 text-lg font-semibold">
                Take the ware in
              </h2>
              <CheckInForm view={view} units={units} />
            </Card>
          )}

          {view.checkIn && (
            <Card>
              <h2 className="mb-3 text-lg font-semibold">{view.checkIn.refused ? 'Drop-off' : 'Received'}</h2>
              <DropOffRecord view={view} checkIn={view.checkIn} units={units} />
            </Card>
          )}

          {(view.firingLog || (isStudio && ['received', 'fired', 'ready'].includes(view.state))) && (
            <Card>
              <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
                <h2 className="text-lg font-semibold">The firing log</h2>
                {view.viewer !== 'potter' && (
                  <ButtonLink to={`/firings/${view.firing.id}/log`} variant="secondary" size="sm">
                    {view.firingLog ? 'Open the log' : 'Write the log'}
                  </ButtonLink>
                )}
              </div>
              {view.firingLog ? (
                <FiringLogView log={view.firingLog} zone={zone} units={units} />
              ) : (
                <p className="text-sm text-slip-600">Nothing logged yet. The log is kept per firing; every potter in it sees it here.</p>
              )}
            </Card>
          )}

          {showResults && (
            <Card>
              <h2 id="results-heading" className="mb-3 scroll-mt-4 text-lg font-semibold">
                Results
              </h2>
              {view.actions.includes('results') ? (
                <div className="space-y-6">
                  <ResultsForm view={view} />
                  {view.results && (
                    <div className="border-t border-slip-200 pt-4">
                      <h3 className="mb-2 text-sm font-semibold">What the potter sees</h3>
                      <ResultsView view={view} results={view.results} />
                    </div>
                  )}
                </div>
              ) : (
                <ResultsView view={view} results={view.results} />
              )}
            </Card>
          )}

          <section aria-labelledby="pieces-heading" className="space-y-3">
            <h2 id="pieces-heading" className="text-lg font-semibold">
              Pieces <span className="text-sm font-normal text-slip-600">· {formatVolume(view.volumeL, units)} in all</span>
            </h2>
            <PiecesTable pieces={view.pieces} units={units} />
            {view.notes && (
              <Card as="div">
                <h3 className="text-sm font-semibold">Notes from the potter</h3>
                <p className="mt-1 whitespace-pre-line text-sm text-slip-800">{view.notes}</p>
              </Card>
            )}
          </section>

          <Card>
            <h2 className="mb-3 text-lg font-semibold">The check</h2>
            <div className="space-y-4">
              <VerdictLine verdict={view.verdict} testId="request-verdict" />
              <FindingsList findings={view.findings} pieces={view.pieces} linkToRows={false} />
              {acknowledged.length > 0 && (
                <div>
                  <h3 className="text-sm font-semibold">Warnings the potter acknowledged</h3>
                  <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-slip-700" data-testid="acknowledged-warnings">
                    {acknowledged.map((a) => (
                      <li key={a.code}>{a.message}</li>
                    ))}
                  </ul>
                </div>
              )}
            </div>
          </Card>

          <Card>
            <h2 className="mb-3 text-lg font-semibold">{remeasured ? 'Quote, as measured at drop-off' : 'Quote'}</h2>
            {standing ? (
              <QuoteSummary
                quote={standing}
                deposit={price.depositAsked ? { cents: price.depositCents, label: 'Deposit asked' } : undefined}
              />
            ) : (
              <p className="text-sm text-slip-600">The kiln has no price list; the studio quotes in the messages.</p>
            )}
            {view.checkIn && (
              <div className="mt-3">
                <PriceChangeNote view={view} currency={currency} />
              </div>
            )}
            {(price.paidInCents > 0 || price.refundedCents > 0) && (
              <p className="mt-3 text-sm text-slip-700" data-testid="paid-summary">
                Paid {formatMoney(price.paidInCents, currency)}
                {price.refundedCents > 0 && `, refunded ${formatMoney(price.refundedCents, currency)}`}.
              </p>
            )}
            {view.state === 'accepted' && price.depositOwedCents > 0 && (
              <p className="mt-2 text-sm font-semibold text-slip-900" data-testid="deposit-owed" data-owed-cents={price.depositOwedCents}>
                Deposit still owed: {formatMoney(price.depositOwedCents, currency)}
              </p>
            )}
            {OWING_STATES.includes(view.state) && (
              <p
                className={`mt-2 text-sm ${price.balanceOwedCents > 0 ? 'font-semibold text-slip-900' : 'text-celadon-700'}`}
                data-testid="owed"
                data-owed-cents={price.balanceOwedCents}
              >
                {price.balanceOwedCents > 0 ? `Still owed: ${formatMoney(price.balanceOwedCents, currency)}` : 'Nothing more is owed.'}
              </p>
            )}
            {view.counterRefunds.length > 0 && (
              <div className="mt-3">
                <CounterRefunds view={view} />
              </div>
            )}
            <KeptCardLine view={view} zone={zone} />
          </Card>

          <Card>
            <h2 className="mb-3 text-lg font-semibold">Photos of the ware</h2>
            <WarePhotos view={view} />
          </Card>

          <section aria-labelledby="ledger-heading" className="space-y-3">
            <h2 id="ledger-heading" className="text-lg font-semibold">
              Money in and out
            </h2>
            <Ledger entries={view.ledger} zone={zone} showReferences={view.viewer !== 'potter'} />
          </section>

          <section aria-labelledby="timeline-heading" className="space-y-3">
            <h2 id="timeline-heading" className="text-lg font-semibold">
              What has happened
            </h2>
            <Timeline entries={view.timeline} zone={zone} />
          </section>
        </div>

        <aside className="min-w-0 space-y-6 lg:col-start-2 lg:row-start-2">
          {isStudio && (
            <Card>
              <h2 className="mb-2 text-lg font-semibold">The potter</h2>
              <p className="text-sm">
                <PotterRecordLine name={view.potter.displayName} record={view.potter.record} />
              </p>
              {view.potter.email && (
                <p className="mt-1 text-sm">
                  <a href={`mailto:${view.potter.email}`} className="text-clay-700 hover:underline">
                    {view.potter.email}
                  </a>
                </p>
              )}
            </Card>
          )}

          {!isStudio && (
            <Card>
              <h2 className="mb-2 text-lg font-semibold">{view.state === 'ready' ? 'Pickup' : 'Drop-off'}</h2>
              {view.studio.address ? (
                <address className="whitespace-pre-line text-sm not-italic text-slip-900" data-testid="studio-address">
                  {view.studio.address}
                </address>
              ) : (
                <p className="text-sm text-slip-600">
                  {HOLDING_STATES.includes(view.state)
                    ? 'The studio has not given a street address yet; ask in the messages.'
                    : 'The studio’s address is shown here once it takes your ware on.'}
                </p>
              )}
              {view.studio.dropOffHours && <p className="mt-2 text-sm text-slip-700">{view.studio.dropOffHours}</p>}
            </Card>
          )}

          <Card>
            <h2 className="mb-3 text-lg font-semibold">Messages</h2>
            <MessageThread
              requestId={view.id}
              zone={zone}
              otherSide={isStudio ? view.potter.displayName : view.studio.name}
              canWrite={view.actions.includes('message')}
            />
          </Card>
        </aside>
      </div>
    </article>
  )
}
