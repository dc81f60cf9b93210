// A studio's money as its owner reads it: the payout account's state, what it is owed and has had,
// each firing's money (gross, fee, refunds, net, transferred, pending) and each month's, the
// transfers and the bank payouts Stripe reported, and the CSV statement for a month or a year.
import type { EntityManager } from 'typeorm'
import type {
  BankPayoutJson,
  EarningJson,
  EarningMonthJson,
  PayoutAccountJson,
  StudioPayoutsJson,
  TransferJson,
} from '../../shared/api/payouts'
import { formatDateTime, formatMoney } from '../../shared/dates'
import {
  dueInWords,
  feeRuleInWords,
  payoutAccountState,
  payoutAccountWords,
  payoutStage,
  tally,
  type FeeRule,
  type PayoutStage,
  type RequestLedger,
} from '../../shared/payouts'
import type { RequestState } from '../../shared/workflow/request-states'
import type { Config } from '../config'
import { PayoutAccount } from '../entities/PayoutAccount'
import { Studio } from '../entities/Studio'
import { accountFacts, feeRuleFrom, movementsOf, parseStatementPeriod } from './payouts'

interface EarningRow {
  id: string
  state: RequestState
  potter_name: string
  firing_date: Date
  kiln_name: string
  currency: string
  fee_percent_bp: number | null
  fee_minimum_cents: number | null
  earned_at: Date | null
  release_at: Date | null
  dispute_settled_at: Date | null
}

interface Earning {
  json: EarningJson
  ledger: RequestLedger
}

/** The month (YYYY-MM) of an instant in the studio's zone. */
function monthIn(date: Date, timeZone: string): string {
  const parts = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit' }).formatToParts(date)
  return `${parts.find((p) => p.type === 'year')!.value}-${parts.find((p) => p.type === 'month')!.value}`
}

function stageWords(stage: PayoutStage, ledger: RequestLedger, releaseAt: Date | null, accountReady: boolean, timeZone: string): string {
  switch (stage) {
    case 'in-hand':
      return 'Earned when the ware is collected'
    case 'hold':
      return `Held until ${formatDateTime(releaseAt!, timeZone)}, after collection`
    case 'dispute':
      return 'Held while the dispute is open'
    case 'earned':
      if (ledger.heldCents > 0) return accountReady ? 'Being transferred' : 'Waiting for your payout account'
      if (ledger.transferredCents > 0) return 'Transferred'
      if (ledger.atCounterCents > 0) return 'Taken at your counter'
      return 'Nothing to pay out'
  }
}

/** Every request of the studio that money moved for, newest first, with its ledger. */
async function earningsOf(manager: EntityManager, studio: Studio, config: Config, accountReady: boolean, now: Date): Promise<Earning[]> {
  const rows: EarningRow[] = await manager.query(
    `SELECT r.id, r.state, u.display_name AS potter_name, f.firing_date, k.name AS kiln_name,
            upper(coalesce(coalesce(r.standing_quote, r.quote) ->> 'currency', s.currency)) AS currency,
            rp.fee_percent_bp, rp.fee_minimum_cents, rp.earned_at, rp.release_at, rp.dispute_settled_at
     FROM firing_requests r JOIN firings f ON f.id = r.firing_id JOIN kilns k ON k.id = f.kiln_id JOIN studios s ON s.id = k.studio_id
     JOIN users u ON u.id = r.potter_id LEFT JOIN request_payouts rp ON rp.request_id = r.id
     WHERE k.studio_id = $1
       AND (EXISTS (SELECT 1 FROM ledger_entries l WHERE l.request_id = r.id) OR EXISTS (SELECT 1 FROM studio_transfers t WHERE t.request_id = r.id))
     ORDER BY coalesce(rp.earned_at, f.firing_date) DESC, r.id`,
    [studio.id],
  )
  const movements = await movementsOf(
    manager,
    rows.map((r) => r.id),
  )
  const fallback = feeRuleFrom(config)
  return rows.map((row) => {
    const rule: FeeRule =
      row.fee_percent_bp === null ? fallback : { percentBp: row.fee_percent_bp, minimumCents: row.fee_minimum_cents ?? 0 }
    const stage: PayoutStage = payoutStage(row.state, { releaseAt: row.release_at, disputeSettled: row.dispute_settled_at !== null }, now)
    const ledger = tally(movements.get(row.id)!, rule, stage === 'earned')
    const net = ledger.paidInCents - ledger.refundedCents - ledger.feeCents
    return {
      ledger,
      json: {
        requestId: row.id,
        potterName: row.potter_name,
        firingDate: new Date(row.firing_date).toISOString(),
        kilnName: row.kiln_name,
        state: row.state,
        stage,
        stageWords: stageWords(stage, ledger, row.release_at, accountReady, studio.timezone),
        earnedAt: stage === 'in-hand' || !row.earned_at ? null : new Date(row.earned_at).toISOString(),
        currency: row.currency,
        grossCents: ledger.paidInCents,
        refundsCents: ledger.refundedCents,
        feeCents: ledger.feeCents,
        netCents: net,
        atCounterCents: ledger.atCounterCents,
        transferredCents: ledger.transferredCents,
        pendingCents: ledger.heldCents,
      },
    }
  })
}

function monthsOf(earnings: Earning[], timeZone: string): EarningMonthJson[] {
  const months = new Map<string, EarningMonthJson>()
  for (const { json } of earnings) {
    if (!json.earnedAt) continue
    const month = monthIn(new Date(json.earnedAt), timeZone)
    const total = months.get(month) ?? {
      month,
      requests: 0,
      grossCents: 0,
      refundsCents: 0,
      feeCents: 0,
      netCents: 0,
      atCounterCents: 0,
      transferredCents: 0,
      pendingCents: 0,
    }
    total.requests += 1
    total.grossCents += json.grossCents
    total.refundsCents += json.refundsCents
    total.feeCents += json.feeCents
    total.netCents += json.netCents
    total.atCounterCents += json.atCounterCents
    total.transferredCents += json.transferredCents
    total.pendingCents += json.pendingCents
    months.set(month, total)
  }
  return [...months.values()].sort((a, b) => b.month.localeCompare(a.month))
}

export function accountJson(account: PayoutAccount | null): PayoutAccountJson {
  const facts = accountFacts(account)
  const state = payoutAccountState(facts)
  return {
    state,
    ...payoutAccountWords(state, facts),
    due: dueInWords(facts?.currentlyDue ?? []),
    bankLast4: facts?.bankLast4 ?? null,
    payoutsEnabled: facts?.payoutsEnabled ?? false,
  }
}

/** The studio's money page: account, balance, transfers, bank payouts, each firing and each month. */
export async function studioPayouts(
  manager: EntityManager,
  config: Config,
  studioId: string,
  now = new Date(),
): Promise<StudioPayoutsJson> {
  const studio = await manager.getRepository(Studio).findOneByOrFail({ id: studioId })
  const account = await manager.getRepository(PayoutAccount).findOne({ where: { studioId } })
  const accountState = accountJson(account)
  const earnings = await earningsOf(manager, studio, config, account?.transfersStatus === 'active', now)
  const balance = {
    currency: studio.currency,
    owedCents: 0,
    waitingCents: 0,
    transferredCents: 0,
    feeCents: 0,
    atCounterCents: 0,
  }
  for (const { json, ledger } of earnings) {
    if (json.stage === 'in-hand') balance.waitingCents += ledger.heldCents
    else balance.owedCents += ledger.heldCents
    balance.transferredCents += ledger.transferredCents
    balance.feeCents += ledger.feeCents
    balance.atCounterCents += ledger.atCounterCents
  }
  const transferRows: {
    id: string
    request_id: string
    potter_name: string
    created_at: Date
    amount_cents: number
    currency: string
    stripe_transfer_id: string
  }[] = await manager.query(
    `SELECT t.id, t.request_id, u.display_name AS potter_name, t.created_at, t.amount_cents, t.currency, t.stripe_transfer_id
     FROM studio_transfers t JOIN firing_requests r ON r.id = t.request_id JOIN users u ON u.id = r.potter_id
     WHERE t.studio_id = $1 ORDER BY t.created_at DESC, t.id LIMIT 200`,
    [studioId],
  )
  const reversals: { transfer_id: string; created_at: Date; amount_cents: number; stripe_reversal_id: string }[] = transferRows.length
    ? await manager.query(
        `SELECT transfer_id, created_at, amount_cents, stripe_reversal_id FROM transfer_reversals WHERE transfer_id = ANY($1::uuid[]) ORDER BY created_at`,
        [transferRows.map((t) => t.id)],
      )
    : []
  const transfers: TransferJson[] = transferRows.map((t) => {
    const own = reversals.filter((r) => r.transfer_id === t.id)
    return {
      id: t.id,
      requestId: t.request_id,
      potterName: t.potter_name,
      at: new Date(t.created_at).toISOString(),
      amountCents: t.amount_cents,
      reversedCents: own.reduce((n, r) => n + r.amount_cents, 0),
      currency: t.currency.trim(),
      stripeTransferId: t.stripe_transfer_id,
      reversals: own.map((r) => ({
        at: new Date(r.created_at).toISOString(),
        amountCents: r.amount_cents,
        stripeReversalId: r.stripe_reversal_id,
      })),
    }
  })
  const payoutRows: {
    id: string
    amount_cents: number
    currency: string
    status: string
    arrival_date: Date
    created_at: Date
    failure_message: string | null
  }[] = await manager.query(
    `SELECT id, amount_cents, currency, status, arrival_date, created_at, failure_message FROM studio_payouts WHERE studio_id = $1 ORDER BY created_at DESC LIMIT 100`,
    [studioId],
  )
  const payouts: BankPayoutJson[] = payoutRows.map((p) => ({
    id: p.id,
    amountCents: p.amount_cents,
    currency: p.currency.trim(),
    status: p.status,
    arrivalDate: new Date(p.arrival_date).toISOString(),
    createdAt: new Date(p.created_at).toISOString(),
    failureMessage: p.failure_message,
  }))
  const rule = feeRuleFrom(config)
  return {
    studioId,
    timezone: studio.timezone,
    account: accountState,
    balance,
    fee: {
      percent: config.marketplaceFee.percent,
      minimumCents: config.marketplaceFee.minimumCents,
      words: feeRuleInWords(rule, (cents) => formatMoney(cents, studio.currency)),
    },
    holdHours: config.payoutHoldHours,
    transfers,
    payouts,
    firings: earnings.map((e) => e.json),
    months: monthsOf(earnings, studio.timezone),
  }
}

const CSV_COLUMNS = [
  'Earned on',
  'Request',
  'Potter',
  'Firing date',
  'Kiln',
  'State',
  'Currency',
  'Paid in',
  'Refunded',
  'Conewright fee',
  'Net',
  'Taken at the counter',
  'Transferred',
  'Still held',
] as const

// RFC 4180: a field with a comma, a quote or a line break is quoted, its quotes doubled.
function csvField(value: string): string {
  return /[",\r\n]/.test(value) ? `"${value.replaceAll('"', '""')}"` : value
}

const amount = (cents: number) =>
  `${cents < 0 ? '-' : ''}${Math.floor(Math.abs(cents) / 100)}.${String(Math.abs(cents) % 100).padStart(2, '0')}`

function dayIn(date: Date, timeZone: string): string {
  return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(date)
}

/**
 * The statement for bookkeeping: one line per request earned in the month (YYYY-MM) or year (YYYY)
 * in the studio's time zone, and a total line. Amounts in the currency's units with two decimals.
 */
export async function statementCsv(manager: EntityManager, config: Config, studioId: string, period: string, now = new Date()) {
  const { from } = parseStatementPeriod(period)
  const studio = await manager.getRepository(Studio).findOneByOrFail({ id: studioId })
  const account = await manager.getRepository(PayoutAccount).findOne({ where: { studioId } })
  const earnings = (await earningsOf(manager, studio, config, account?.transfersStatus === 'active', now))
    .filter(({ json }) => json.earnedAt && monthIn(new Date(json.earnedAt), studio.timezone).startsWith(from))
    .reverse()
  const lines = [CSV_COLUMNS.join(',')]
  const total = { gross: 0, refunds: 0, fee: 0, net: 0, counter: 0, transferred: 0, pending: 0 }
  for (const { json } of earnings) {
    lines.push(
      [
        dayIn(new Date(json.earnedAt!), studio.timezone),
        json.requestId,
        json.potterName,
        dayIn(new Date(json.firingDate), studio.timezone),
        json.kilnName,
        json.state,
        json.currency,
        amount(json.grossCents),
        amount(json.refundsCents),
        amount(json.feeCents),
        amount(json.netCents),
        amount(json.atCounterCents),
        amount(json.transferredCents),
        amount(json.pendingCents),
      ]
        .map(csvField)
        .join(','),
    )
    total.gross += json.grossCents
    total.refunds += json.refundsCents
    total.fee += json.feeCents
    total.net += json.netCents
    total.counter += json.atCounterCents
    total.transferred += json.transferredCents
    total.pending += json.pendingCents
  }
  lines.push(
    [
      'Total',
      `${earnings.length} requests`,
      '',
      '',
      '',
      '',
      studio.currency,
      amount(total.gross),
      amount(total.refunds),
      amount(total.fee),
      amount(total.net),
      amount(total.counter),
      amount(total.transferred),
      amount(total.pending),
    ]
      .map(csvField)
      .join(','),
  )
  const slug = studio.name
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '')
  return { filename: `conewright-${slug || 'studio'}-${from}.csv`, body: lines.join('\r\n') + '\r\n' }
}
