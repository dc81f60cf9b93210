import { useEffect, useRef } from 'react'
import { Link, useParams, useSearchParams } from 'react-router-dom'
import type {
  BankPayoutJson,
  EarningJson,
  EarningMonthJson,
  PayoutAccountJson,
  StudioPayoutsJson,
  TransferJson,
} from '../../../../shared/api/payouts'
import { formatDate, formatMoney } from '../../../../shared/dates'
import { Alert } from '../../../components/ui/Alert'
import { Badge, type BadgeTone } from '../../../components/ui/Badge'
import { Button } from '../../../components/ui/Button'
import { Card, EmptyState, PageHeader } from '../../../components/ui/Card'
import { Spinner } from '../../../components/ui/Spinner'
import { Table, Td, Th } from '../../../components/ui/Table'
import { statementUrl, useRefreshPayouts, useStartOnboarding, useStudioPayouts } from '../api/payouts'
import { useStudio } from '../api/studios'
import { isMemberView, type MemberStudio } from '../api/types'
import { ApiProblem } from '../components/ApiProblem'
import { StudioNav } from '../components/StudioNav'

/** /studios/:id/money: the owner's view of the studio's payout account, what it is owed and has had. */
export function MoneyPage() {
  const { id = '' } = useParams()
  const studio = useStudio(id)
  if (studio.isPending) return <Spinner label="Loading the studio…" />
  if (studio.isError) return <ApiProblem error={studio.error} what="this studio" />
  const found = studio.data
  if (!isMemberView(found) || found.myRole !== 'owner') {
    return (
      <Alert tone="warning" title="Only the studio’s owner sees its money">
        Payouts, fees and statements stay with the owner. Ask them if something about a payment looks wrong.
      </Alert>
    )
  }
  return <Money studio={found} />
}

const ACCOUNT_TONE: Record<PayoutAccountJson['state'], BadgeTone> = {
  none: 'neutral',
  incomplete: 'ember',
  'needs-info': 'ember',
  checking: 'neutral',
  rejected: 'danger',
  ready: 'celadon',
}

const ACCOUNT_BADGE: Record<PayoutAccountJson['state'], string> = {
  none: 'Not set up',
  incomplete: 'Setup not finished',
  'needs-info': 'Action needed',
  checking: 'Being checked',
  rejected: 'Refused',
  ready: 'On',
}

const ACCOUNT_ACTION: Partial<Record<PayoutAccountJson['state'], string>> = {
  none: 'Set up payouts with Stripe',
  incomplete: 'Continue setup with Stripe',
  'needs-info': 'Give Stripe what it needs',
}

function Money({ studio }: { studio: MemberStudio }) {
  const [params, setParams] = useSearchParams()
  const onboarding = params.get('onboarding')
  const money = useStudioPayouts(studio.id)
  const start = useStartOnboarding(studio.id)
  const refresh = useRefreshPayouts(studio.id)
  const asked = useRef(false)

  // Back from Stripe: ask it how the account stands now rather than wait for its webhook.
  useEffect(() => {
    if (onboarding === 'return' && !asked.current) {
      asked.current = true
      refresh.mutate()
    }
  }, [onboarding, refresh])

  return (
    <>
      <PageHeader title="Money" lead={`${studio.name}. What your firings earn, what Conewright keeps, and what reached your bank.`} />
      <StudioNav studioId={studio.id} role="owner" />
      {onboarding === 'refresh' && (
        <Alert tone="warning" title="That setup link has expired" className="mb-4">
          Links to Stripe work once and for a few minutes. Start again: Stripe keeps what you already gave it.
        </Alert>
      )}
      {money.isPending ? (
        <Spinner label="Loading the studio’s money…" />
      ) : money.isError ? (
        <ApiProblem error={money.error} what="the studio’s money" onRetry={() => money.refetch()} />
      ) : (
        <div className="space-y-8">
          <AccountCard
            money={money.data}
            busy={start.isPending}
            checking={refresh.isPending}
            problem={start.error?.message ?? refresh.error?.message ?? null}
            onStart={() => start.mutate()}
            onCheck={() => {
              setParams({}, { replace: true })
              refresh.mutate()
            }}
          />
          <Balance money={money.data} />
          <Months studioId={studio.id} months={money.data.months} currency={money.data.balance.currency} />
          <Firings firings={money.data.firings} zone={money.data.timezone} />
          <Transfers transfers={money.data.transfers} zone={money.data.timezone} />
          <BankPayouts payouts={money.data.payouts} zone={money.data.timezone} />
        </div>
      )}
    </>
  )
}

function AccountCard(props: {
  money: StudioPayoutsJson
  busy: boolean
  checking: boolean
  problem: string | null
  onStart: () => void
  onCheck: () => void
}) {
  const { account } = props.money
  const action = ACCOUNT_ACTION[account.state]
  return (
    <Card>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2 className="flex items-center gap-2 text-lg font-semibold" data-testid="payout-state" data-state={account.state}>
            {account.title} <Badge tone={ACCOUNT_TONE[account.state]}>{ACCOUNT_BADGE[account.state]}</Badge>
          </h2>
          <p className="mt-1 max-w-2xl text-sm text-slip-700">{account.detail}</p>
          {account.due.length > 0 && (
            <ul className="mt-2 list-disc pl-5 text-sm text-slip-700" aria-label="What Stripe still needs">
              {account.due.map((item) => (
                <li key={item}>{item}</li>
              ))}
            </ul>
          )}
        </div>
        <div className="flex flex-wrap gap-2">
          {action && (
            <Button onClick={props.onStart} busy={props.busy}>
              {action}
            </Button>
          )}
          {account.state !== 'none' && account.state !== 'ready' && (
            <Button variant="secondary" onClick={props.onCheck} busy={props.checking}>
              Check with Stripe again
            </Button>
          )}
        </div>
      </div>
      {props.problem && (
        <Alert tone="danger" className="mt-3">
          {props.problem}
        </Alert>
      )}
      <p className="mt-4 text-xs text-slip-500">
        Conewright’s fee is {props.money.fee.words}. Money taken at your own counter stays with you and carries no fee.
        {props.money.holdHours > 0
          ? ` Your share is transferred ${props.money.holdHours} hours after the ware is picked up.`
          : ' Your share is transferred when the ware is picked up.'}
      </p>
    </Card>
  )
}

function Stat({ label, cents, currency, hint, testId }: { label: string; cents: number; currency: string; hint: string; testId: string }) {
  return (
    <Card as="div" className="p-4">
      <p className="text-xs font-semibold uppercase tracking-wide text-slip-500">{label}</p>
      <p className="mt-1 text-2xl font-bold tabular-nums text-slip-900" data-testid={testId} data-cents={cents}>
        {formatMoney(cents, currency)}
      </p>
      <p className="mt-1 text-xs text-slip-600">{hint}</p>
    </Card>
  )
}

function Balance({ money }: { money: StudioPayoutsJson }) {
  const { balance } = money
  return (
    <section aria-labelledby="balance-heading" className="space-y-2">
      <h2 id="balance-heading" className="text-lg font-semibold">
        Balance
      </h2>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <Stat
          label="Owed to you"
          cents={balance.owedCents}
          currency={balance.currency}
          testId="balance-owed"
          hint="Earned and still with Conewright: waiting for your payout account, a hold or a dispute."
        />
        <Stat
          label="Waiting for pickup"
          cents={balance.waitingCents}
          currency={balance.currency}
          testId="balance-waiting"
          hint="Paid by potters whose ware is still with you; earned when it is picked up."
        />
        <Stat
          label="Transferred"
          cents={balance.transferredCents}
          currency={balance.currency}
          testId="balance-transferred"
          hint="Sent to your Stripe account, less anything taken back for refunds."
        />
        <Stat
          label="Conewright’s fee"
          cents={balance.feeCents}
          currency={balance.currency}
          testId="balance-fee"
          hint="Kept from what potters paid online."
        />
      </div>
      <p className="text-sm text-slip-600">Taken at your counter: {formatMoney(balance.atCounterCents, balance.currency)}.</p>
    </section>
  )
}

const money = (cents: number, currency: string) => formatMoney(cents, currency)

function monthName(month: string) {
  const [year, index] = month.split('-').map(Number)
  return new Intl.DateTimeFormat('en-US', { month: 'long', year: 'numeric', timeZone: 'UTC' }).format(
    new Date(Date.UTC(year, index - 1, 15)),
  )
}

function Months({ studioId, months, currency }: { studioId: string; months: EarningMonthJson[]; currency: string }) {
  const years = [...new Set(months.map((m) => m.month.slice(0, 4)))]
  return (
    <section aria-labelledby="months-heading" className="space-y-2">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="months-heading" className="text-lg font-semibold">
          By month
        </h2>
        <div className="flex flex-wrap gap-3 text-sm">
          {years.map((year) => (
            <a key={year} href={statementUrl(studioId, year)} download className="font-semibold text-clay-700 hover:underline">
              Statement for {year} (CSV)
            </a>
          ))}
        </div>
      </div>
      {months.length === 0 ? (
        <EmptyState title="Nothing earned yet">A firing’s money shows here in the month its ware is picked up.</EmptyState>
      ) : (
        <Table caption="Earnings by month">
          <thead>
            <tr>
              <Th>Month</Th>
              <Th className="text-right">Requests</Th>
              <Th className="text-right">Paid in</Th>
              <Th className="text-right">Refunds</Th>
              <Th className="text-right">Fee</Th>
              <Th className="text-right">Net</Th>
              <Th className="text-right">Transferred</Th>
              <Th className="text-right">Still held</Th>
              <Th>
                <span className="sr-only">Statement</span>
              </Th>
            </tr>
          </thead>
          <tbody className="divide-y divide-slip-100">
            {months.map((m) => (
              <tr key={m.month} data-testid="earning-month" data-month={m.month}>
                <Td className="whitespace-nowrap font-medium">{monthName(m.month)}</Td>
                <Td className="text-right tabular-nums">{m.requests}</Td>
                <Td className="text-right tabular-nums">{money(m.grossCents, currency)}</Td>
                <Td className="text-right tabular-nums">{money(m.refundsCents, currency)}</Td>
                <Td className="text-right tabular-nums">{money(m.feeCents, currency)}</Td>
                <Td className="text-right tabular-nums font-semibold">{money(m.netCents, currency)}</Td>
                <Td className="text-right tabular-nums">{money(m.transferredCents, currency)}</Td>
                <Td className="text-right tabular-nums">{money(m.pendingCents, currency)}</Td>
                <Td className="whitespace-nowrap">
                  <a href={statementUrl(studioId, m.month)} download className="text-sm font-semibold text-clay-700 hover:underline">
                    CSV
                  </a>
                </Td>
              </tr>
            ))}
          </tbody>
        </Table>
      )}
    </section>
  )
}

function Firings({ firings, zone }: { firings: EarningJson[]; zone: string }) {
  return (
    <section aria-labelledby="firings-heading" className="space-y-2">
      <h2 id="firings-heading" className="text-lg font-semibold">
        By firing
      </h2>
      {firings.length === 0 ? (
        <EmptyState title="No money has moved yet">Each request shows here once its potter pays something.</EmptyState>
      ) : (
        <Table caption="Earnings by firing">
          <thead>
            <tr>
              <Th>Potter</Th>
              <Th>Firing</Th>
              <Th>Where it stands</Th>
              <Th className="text-right">Paid in</Th>
              <Th className="text-right">Refunds</Th>
              <Th className="text-right">Fee</Th>
              <Th className="text-right">Net</Th>
              <Th className="text-right">Transferred</Th>
              <Th className="text-right">Still held</Th>
            </tr>
          </thead>
          <tbody className="divide-y divide-slip-100">
            {firings.map((f) => (
              <tr key={f.requestId} data-testid="earning-line" data-request-id={f.requestId} data-stage={f.stage}>
                <Td>
                  <Link to={`/requests/${f.requestId}`} className="font-medium text-clay-700 hover:underline">
                    {f.potterName}
                  </Link>
                </Td>
                <Td className="whitespace-nowrap">
                  {formatDate(f.firingDate, zone)}
                  <span className="block text-xs text-slip-500">{f.kilnName}</span>
                </Td>
                <Td>{f.stageWords}</Td>
                <Td className="text-right tabular-nums">{money(f.grossCents, f.currency)}</Td>
                <Td className="text-right tabular-nums">{money(f.refundsCents, f.currency)}</Td>
                <Td className="text-right tabular-nums">{money(f.feeCents, f.currency)}</Td>
                <Td className="text-right tabular-nums font-semibold">{money(f.netCents, f.currency)}</Td>
                <Td className="text-right tabular-nums" data-testid="earning-transferred" data-cents={f.transferredCents}>
                  {money(f.transferredCents, f.currency)}
                </Td>
                <Td className="text-right tabular-nums">{money(f.pendingCents, f.currency)}</Td>
              </tr>
            ))}
          </tbody>
        </Table>
      )}
    </section>
  )
}

function Transfers({ transfers, zone }: { transfers: TransferJson[]; zone: string }) {
  return (
    <section aria-labelledby="transfers-heading" className="space-y-2">
      <h2 id="transfers-heading" className="text-lg font-semibold">
        Transfers to your Stripe account
      </h2>
      {transfers.length === 0 ? (
        <EmptyState title="No transfers yet">
          Your share of a firing is transferred once its ware is picked up and payouts are on.
        </EmptyState>
      ) : (
        <ul className="divide-y divide-slip-200 rounded-card border border-slip-200 bg-white">
          {transfers.map((t) => (
            <li
              key={t.id}
              className="flex flex-wrap items-baseline justify-between gap-2 px-4 py-3"
              data-testid="transfer-line"
              data-cents={t.amountCents}
              data-reversed-cents={t.reversedCents}
            >
              <div>
                <p className="font-medium">
                  {formatMoney(t.amountCents, t.currency)} for {t.potterName}’s firing
                </p>
                <p className="text-xs text-slip-500">
                  {formatDate(t.at, zone)} · <code title={t.stripeTransferId}>{t.stripeTransferId}</code>
                </p>
                {t.reversals.map((r) => (
                  <p key={r.stripeReversalId} className="text-sm text-danger-700">
                    {formatMoney(r.amountCents, t.currency)} taken back on {formatDate(r.at, zone)} for a refund
                  </p>
                ))}
              </div>
              <p className="tabular-nums font-semibold">{formatMoney(t.amountCents - t.reversedCents, t.currency)}</p>
            </li>
          ))}
        </ul>
      )}
    </section>
  )
}

function payoutWords(p: BankPayoutJson, zone: string) {
  if (p.status === 'paid') return `Reached your bank on ${formatDate(p.arrivalDate, zone)}`
  if (p.status === 'failed') return `Failed${p.failureMessage ? `: ${p.failureMessage}` : ''}; the money went back to your Stripe account`
  if (p.status === 'canceled') return 'Cancelled'
  return `On its way to your bank, expected ${formatDate(p.arrivalDate, zone)}`
}

function BankPayouts({ payouts, zone }: { payouts: BankPayoutJson[]; zone: string }) {
  return (
    <section aria-labelledby="payouts-heading" className="space-y-2">
      <h2 id="payouts-heading" className="text-lg font-semibold">
        Payouts to your bank
      </h2>
      <p className="text-sm text-slip-600">
        As Stripe reports them: Stripe sends your Stripe account’s balance to your bank on its schedule.
      </p>
      {payouts.length === 0 ? (
        <EmptyState title="No payouts reported yet" />
      ) : (
        <ul className="divide-y divide-slip-200 rounded-card border border-slip-200 bg-white">
          {payouts.map((p) => (
            <li
              key={p.id}
              className="flex flex-wrap items-baseline justify-between gap-2 px-4 py-3"
              data-testid="payout-line"
              data-status={p.status}
            >
              <span>{payoutWords(p, zone)}</span>
              <span className="tabular-nums font-semibold">{formatMoney(p.amountCents, p.currency)}</span>
            </li>
          ))}
        </ul>
      )}
    </section>
  )
}
