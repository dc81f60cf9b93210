// Paying studios through Stripe Connect: each studio's Express connected account and its onboarding,
// the studio's share of a request transferred from the charges that paid for it (separate charges and
// transfers, one transfer group per request), taken back in part when a refund follows, and the
// events Stripe sends about accounts, transfers and payouts. The arithmetic is shared/payouts.ts.
//
// Money moves in one job per request (`pay-studio`), run in the request's own queue after its refunds:
// it reads what Stripe holds for the request's transfer group first, so a transfer made by a run that
// crashed before recording it is found, not made twice; then it sends what is due or takes back what
// is over. A studio whose payout account cannot take transfers yet accrues, and is paid when it can.
import type Stripe from 'stripe'
import type { EntityManager } from 'typeorm'
import { z } from 'zod'
import { randomUUID } from 'node:crypto'
import {
  earnsPayout,
  feeRuleOf,
  payoutStage,
  tally,
  type FeeRule,
  type Movement,
  type PayoutAccountFacts,
  type RequestLedger,
} from '../../shared/payouts'
import { statementPeriodSchema } from '../../shared/schemas/payouts'
import type { RequestState } from '../../shared/workflow/request-states'
import type { Config } from '../config'
import type { AppContext } from '../context'
import { PayoutAccount } from '../entities/PayoutAccount'
import { RequestPayout } from '../entities/RequestPayout'
import { Studio } from '../entities/Studio'
import { StudioTransfer } from '../entities/StudioTransfer'
import type { User } from '../entities/User'
import { badRequest, conflict, HttpError } from '../http/errors'
import { enqueueJob, type JobOptions } from '../jobs/queue'
import {
  disputeSettledMail,
  payoutsOnMail,
  payoutWaitingMail,
  reversedMail,
  transferredMail,
  type PayoutFacts,
} from '../mail/templates/payouts'
import { tell } from './notices'
import { factsOf } from './request-context'
import { heldJobKey, inTransaction, requestAction, type ActionStep } from './request-door'
import { stripeFor } from './stripe'

export const PAYOUT_TASK = 'pay-studio'
export const PAYOUT_SWEEP_TASK = 'payout-sweep'

/** One transfer group per request: its charges and the transfers paid from them. */
export const transferGroupOf = (requestId: string) => `request:${requestId}`
const REQUEST_GROUP = /^request:([0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})$/i

/** A request's money jobs (refunds, payout runs) share a queue, so they run one at a time, in order. */
export const moneyQueueOf = (requestId: string) => `money:${requestId}`

export const feeRuleFrom = (config: Pick<Config, 'marketplaceFee'>): FeeRule =>
  feeRuleOf(config.marketplaceFee.percent, config.marketplaceFee.minimumCents)

const canReceiveTransfers = (account: PayoutAccount | null) =>
  Boolean(account && account.transfersStatus === 'active' && !account.disabledReason?.startsWith('rejected.'))

export function accountFacts(account: PayoutAccount | null): PayoutAccountFacts | null {
  if (!account) return null
  return {
    detailsSubmitted: account.detailsSubmitted,
    transfers: account.transfersStatus,
    payoutsEnabled: account.payoutsEnabled,
    currentlyDue: account.currentlyDue,
    pendingVerification: account.pendingVerification,
    disabledReason: account.disabledReason,
    bankLast4: account.bankLast4,
  }
}

/** Queues a payout run for a request in its money queue; the run decides what, if anything, moves. */
export async function enqueuePayout(manager: EntityManager, requestId: string, options: Pick<JobOptions, 'runAt' | 'jobKey'> = {}) {
  await manager.query(`UPDATE request_payouts SET paid_up_at = NULL WHERE request_id = $1`, [requestId])
  await enqueueJob(manager, PAYOUT_TASK, { requestId }, { queueName: moneyQueueOf(requestId), jobKey: `payout:${requestId}`, ...options })
}

/** Queues a run for a request whose share is already earned (a refund landed after it was). */
export async function enqueuePayoutIfEarned(manager: EntityManager, requestId: string) {
  const earned: unknown[] = await manager.query(`SELECT 1 FROM request_payouts WHERE request_id = $1`, [requestId])
  if (earned.length) await enqueuePayout(manager, requestId)
}

/**
 * Called by the door when a request reaches a state that earns the studio its share (collected, or
 * ended with money kept under the studio's terms): records the fee rule in force and when the share
 * may go, and queues the run, in the transaction that made the change. A stage move that can still be
 * undone holds the run back with its mail and refunds.
 */
export async function earnPayout(step: Pick<ActionStep, 'ctx' | 'manager' | 'rc' | 'hold'>) {
  const { ctx, manager, rc, hold } = step
  if (!earnsPayout(rc.request.state)) return
  const money: unknown[] = await manager.query(`SELECT 1 FROM ledger_entries WHERE request_id = $1 LIMIT 1`, [rc.request.id])
  if (!money.length) return
  const rule = feeRuleFrom(ctx.config)
  const holdHours = rc.request.state === 'collected' ? ctx.config.payoutHoldHours : 0
  const releaseAt = holdHours > 0 ? new Date(Date.now() + holdHours * 3600_000) : null
  const currency = (rc.request.standingQuote ?? rc.request.quote)?.currency ?? rc.studio.currency
  await manager.query(
    `INSERT INTO request_payouts (request_id, studio_id, currency, fee_percent_bp, fee_minimum_cents, earned_at, release_at)
     VALUES ($1, $2, $3, $4, $5, now(), $6)
     ON CONFLICT (request_id) DO UPDATE SET earned_at = now(), release_at = EXCLUDED.release_at, paid_up_at = NULL, updated_at = now()`,
    [rc.request.id, rc.studio.id, currency.toUpperCase(), rule.percentBp, rule.minimumCents, releaseAt],
  )
  const runAt = [hold?.runAt, releaseAt].filter((d): d is Date => Boolean(d)).sort((a, b) => b.getTime() - a.getTime())[0]
  if (hold) await enqueuePayout(manager, rc.request.id, { runAt, jobKey: heldJobKey(hold, 'payout') })
  else if (runAt) await enqueuePayout(manager, rc.request.id, { runAt, jobKey: `payout-release:${rc.request.id}` })
  else await enqueuePayout(manager, rc.request.id)
}

/** Every money movement of these requests, by request, in the kinds the ledger knows. */
export async function movementsOf(manager: EntityManager, requestIds: string[]): Promise<Map<string, Movement[]>> {
  const out = new Map<string, Movement[]>(requestIds.map((id) => [id, []]))
  if (!requestIds.length) return out
  const push = (rows: { request_id: string; kind: Movement['kind']; amount: number }[]) => {
    for (const row of rows) if (row.amount > 0) out.get(row.request_id)?.push({ kind: row.kind, amountCents: row.amount })
  }
  push(
    await manager.query(
      `SELECT request_id, kind, sum(amount_cents)::int AS amount FROM ledger_entries WHERE request_id = ANY($1::uuid[]) GROUP BY 1, 2`,
      [requestIds],
    ),
  )
  push(
    await manager.query(
      `SELECT request_id, 'counter-refund-due' AS kind, sum(amount_cents)::int AS amount FROM counter_refunds
       WHERE paid_at IS NULL AND request_id = ANY($1::uuid[]) GROUP BY 1`,
      [requestIds],
    ),
  )
  push(
    await manager.query(
      `SELECT request_id, 'transfer' AS kind, sum(amount_cents)::int AS amount FROM studio_transfers WHERE request_id = ANY($1::uuid[]) GROUP BY 1`,
      [requestIds],
    ),
  )
  push(
    await manager.query(
      `SELECT request_id, 'transfer-reversal' AS kind, sum(amount_cents)::int AS amount FROM transfer_reversals WHERE request_id = ANY($1::uuid[]) GROUP BY 1`,
      [requestIds],
    ),
  )
  return out
}

export interface RequestPayoutFacts {
  requestId: string
  state: RequestState
  studioId: string
  currency: string
  row: RequestPayout | null
  rule: FeeRule
  ledger: RequestLedger
  stage: ReturnType<typeof payoutStage>
}

/** Where one request's money stands now. */
export async function payoutFactsOf(
  manager: EntityManager,
  config: Config,
  requestId: string,
  now = new Date(),
): Promise<RequestPayoutFacts | null> {
  const [request]: { state: RequestState; studio_id: string; currency: string | null; studio_currency: string }[] = await manager.query(
    `SELECT r.state, k.studio_id, coalesce(r.standing_quote, r.quote) ->> 'currency' AS currency, s.currency AS studio_currency
     FROM firing_requests r JOIN firings f ON f.id = r.firing_id JOIN kilns k ON k.id = f.kiln_id JOIN studios s ON s.id = k.studio_id WHERE r.id = $1`,
    [requestId],
  )
  if (!request) return null
  const row = await manager.getRepository(RequestPayout).findOne({ where: { requestId } })
  const rule = row ? { percentBp: row.feePercentBp, minimumCents: row.feeMinimumCents } : feeRuleFrom(config)
  // Without a record the share was never earned here: a dispute before collection still shows as one.
  const stage = payoutStage(request.state, { releaseAt: row?.releaseAt ?? null, disputeSettled: Boolean(row?.disputeSettledAt) }, now)
  const movements = (await movementsOf(manager, [requestId])).get(requestId)!
  return {
    requestId,
    state: request.state,
    studioId: request.studio_id,
    currency: (request.currency ?? request.studio_currency).toUpperCase(),
    row,
    rule,
    ledger: tally(movements, rule, stage === 'earned'),
    stage,
  }
}

async function ownersOf(manager: EntityManager, studioId: string): Promise<Pick<User, 'id' | 'email' | 'displayName'>[]> {
  return manager.query(
    `SELECT u.id, u.email, u.display_name AS "displayName" FROM studio_members m JOIN users u ON u.id = m.user_id
     WHERE m.studio_id = $1 AND m.role = 'owner' ORDER BY u.id`,
    [studioId],
  )
}

/** Tells the studio's owners (never its crew: money is the owner's business). */
async function tellOwners(
  manager: EntityManager,
  studioId: string,
  kind: string,
  content: (owner: string) => Parameters<typeof tell>[3],
  path: string,
  requestId: string | null,
) {
  for (const owner of await ownersOf(manager, studioId)) {
    await tell(manager, owner, kind, content(owner.displayName), { path, requestId })
  }
}

async function payoutMailFacts(
  manager: EntityManager,
  config: Config,
  requestId: string,
): Promise<Omit<PayoutFacts, 'ownerName'> & { studioId: string }> {
  const [row]: { studio_id: string; studio_name: string; timezone: string; potter_name: string; firing_date: Date; currency: string }[] =
    await manager.query(
      `SELECT s.id AS studio_id, s.name AS studio_name, s.timezone, u.display_name AS potter_name, f.firing_date,
            coalesce(coalesce(r.standing_quote, r.quote) ->> 'currency', s.currency) AS currency
     FROM firing_requests r JOIN firings f ON f.id = r.firing_id JOIN kilns k ON k.id = f.kiln_id JOIN studios s ON s.id = k.studio_id
     JOIN users u ON u.id = r.potter_id WHERE r.id = $1`,
      [requestId],
    )
  return {
    studioId: row.studio_id,
    studioName: row.studio_name,
    potterName: row.potter_name,
    firingDate: new Date(row.firing_date),
    timezone: row.timezone,
    currency: row.currency,
    moneyUrl: `${config.publicUrl}/studios/${row.studio_id}/money`,
  }
}

/** Records a transfer Stripe made (by this app or found in its list), once. */
async function recordTransfer(manager: EntityManager, transfer: Stripe.Transfer, requestId: string, studioId: string) {
  await manager.query(
    `INSERT INTO studio_transfers (request_id, studio_id, stripe_transfer_id, stripe_account_id, source_charge_id, amount_cents, currency, created_at)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8) ON CONFLICT (stripe_transfer_id) DO NOTHING`,
    [
      requestId,
      studioId,
      transfer.id,
      typeof transfer.destination === 'string' ? transfer.destination : (transfer.destination?.id ?? ''),
      typeof transfer.source_transaction === 'string' ? transfer.source_transaction : (transfer.source_transaction?.id ?? null),
      transfer.amount,
      transfer.currency.toUpperCase(),
      new Date(transfer.created * 1000),
    ],
  )
  for (const reversal of transfer.reversals?.data ?? []) await recordReversal(manager, reversal, requestId)
}

async function recordReversal(manager: EntityManager, reversal: Stripe.TransferReversal, requestId: string) {
  const transferId = typeof reversal.transfer === 'string' ? reversal.transfer : reversal.transfer.id
  await manager.query(
    `INSERT INTO transfer_reversals (transfer_id, request_id, stripe_reversal_id, amount_cents, created_at)
     SELECT t.id, $2, $3, $4, $5 FROM studio_transfers t WHERE t.stripe_transfer_id = $1
     ON CONFLICT (stripe_reversal_id) DO NOTHING`,
    [transferId, requestId, reversal.id, reversal.amount, new Date(reversal.created * 1000)],
  )
}

/** What Stripe holds for the request's transfer group, brought into our record first. */
async function syncTransfers(ctx: AppContext, requestId: string, studioId: string) {
  const stripe = stripeFor(ctx.config)
  for await (const transfer of stripe.transfers.list({ transfer_group: transferGroupOf(requestId), limit: 100 })) {
    await ctx.db.transaction(async (manager) => {
      await recordTransfer(manager, transfer, requestId, studioId)
      if (transfer.reversals?.has_more) {
        for await (const reversal of stripe.transfers.listReversals(transfer.id, { limit: 100 }))
          await recordReversal(manager, reversal, requestId)
      }
    })
  }
}

/** The charges that paid for a request online, oldest first, with what is left of each to transfer from. */
async function chargesOf(ctx: AppContext, requestId: string): Promise<{ id: string; currency: string; left: number }[]> {
  const stripe = stripeFor(ctx.config)
  const intents: { pi: string }[] = await ctx.db.query(
    `SELECT stripe_payment_intent_id AS pi FROM ledger_entries WHERE request_id = $1 AND kind IN ('deposit', 'balance', 'claim')
     AND stripe_payment_intent_id IS NOT NULL GROUP BY 1 ORDER BY min(at)`,
    [requestId],
  )
  const sent: { charge: string; amount: number }[] = await ctx.db.query(
    `SELECT t.source_charge_id AS charge, sum(t.amount_cents - coalesce(r.reversed, 0))::int AS amount
     FROM studio_transfers t LEFT JOIN (SELECT transfer_id, sum(amount_cents) AS reversed FROM transfer_reversals GROUP BY 1) r ON r.transfer_id = t.id
     WHERE t.request_id = $1 AND t.source_charge_id IS NOT NULL GROUP BY 1`,
    [requestId],
  )
  const charges: { id: string; currency: string; left: number }[] = []
  for (const { pi } of intents) {
    const intent = await stripe.paymentIntents.retrieve(pi, { expand: ['latest_charge'] })
    const charge = intent.latest_charge
    if (!charge || typeof charge === 'string' || charge.status !== 'succeeded') continue
    const already = sent.find((s) => s.charge === charge.id)?.amount ?? 0
    charges.push({ id: charge.id, currency: charge.currency, left: charge.amount - charge.amount_refunded - already })
  }
  return charges
}

/**
 * The payout run for one request: brings Stripe's record in, then transfers what is due (from the
 * request's own charges, with `source_transaction`) or reverses what was sent over the studio's share,
 * newest transfer first. Marks the request paid up when nothing is left to move.
 */
export async function payStudio(ctx: AppContext, requestId: string, now = new Date()): Promise<RequestLedger | null> {
  const first = await payoutFactsOf(ctx.db.manager, ctx.config, requestId, now)
  if (!first || !first.row) return first?.ledger ?? null
  const account = await ctx.db.getRepository(PayoutAccount).findOne({ where: { studioId: first.studioId } })
  // Without a payout account there is nowhere a transfer could have gone.
  if (account) await syncTransfers(ctx, requestId, first.studioId)
  let facts = (await payoutFactsOf(ctx.db.manager, ctx.config, requestId, now))!
  const due = facts.ledger.dueCents
  if (due > 0 && facts.stage === 'earned') {
    if (canReceiveTransfers(account)) await transferDue(ctx, facts, account!)
    else await tellWaiting(ctx, facts)
  } else if (due < 0) {
    await reverseOver(ctx, facts)
  }
  facts = (await payoutFactsOf(ctx.db.manager, ctx.config, requestId, now))!
  if (facts.ledger.dueCents === 0) {
    await ctx.db.query(`UPDATE request_payouts SET paid_up_at = now() WHERE request_id = $1 AND paid_up_at IS NULL`, [requestId])
  }
  return facts.ledger
}

async function transferDue(ctx: AppContext, facts: RequestPayoutFacts, account: PayoutAccount) {
  const stripe = stripeFor(ctx.config)
  let remaining = facts.ledger.dueCents
  let sent = 0
  for (const charge of await chargesOf(ctx, facts.requestId)) {
    if (remaining <= 0) break
    const amount = Math.min(remaining, charge.left)
    if (amount <= 0) continue
    const count = await ctx.db.getRepository(StudioTransfer).count({ where: { requestId: facts.requestId } })
    let transfer: Stripe.Transfer
    try {
      transfer = await stripe.transfers.create(
        {
          amount,
          currency: charge.currency,
          destination: account.stripeAccountId,
          source_transaction: charge.id,
          transfer_group: transferGroupOf(facts.requestId),
          description: 'The studio’s share of a firing, less Conewright’s fee',
          metadata: { requestId: facts.requestId, studioId: facts.studioId },
        },
        // Counted after reading Stripe's own list: a transfer made by a run that died before recording
        // it is already counted, so this key names a new one.
        { idempotencyKey: `transfer:${facts.requestId}:${count}:${charge.id}:${amount}` },
      )
    } catch (error) {
      if ((error as Stripe.errors.StripeError).code === 'insufficient_capabilities_for_transfer') {
        // Stripe took the account's transfers away since we last heard: ask it, and wait for the account.
        await refreshAccount(ctx, account.studioId)
        return
      }
      throw error
    }
    await ctx.db.transaction((manager) => recordTransfer(manager, transfer, facts.requestId, facts.studioId))
    remaining -= amount
    sent += amount
  }
  if (sent > 0) {
    await ctx.db.transaction(async (manager) => {
      const mail = await payoutMailFacts(manager, ctx.config, facts.requestId)
      await tellOwners(
        manager,
        facts.studioId,
        'payout-transferred',
        (ownerName) => transferredMail({ ...mail, ownerName }, sent, facts.ledger.feeCents),
        `/studios/${facts.studioId}/money`,
        facts.requestId,
      )
    })
  }
}

async function reverseOver(ctx: AppContext, facts: RequestPayoutFacts) {
  const stripe = stripeFor(ctx.config)
  const transfers: { id: string; stripe_transfer_id: string; left: number; reversals: number }[] = await ctx.db.query(
    `SELECT t.id, t.stripe_transfer_id, (t.amount_cents - coalesce(sum(r.amount_cents), 0))::int AS left, count(r.id)::int AS reversals
     FROM studio_transfers t LEFT JOIN transfer_reversals r ON r.transfer_id = t.id WHERE t.request_id = $1
     GROUP BY t.id ORDER BY t.created_at DESC, t.id DESC`,
    [facts.requestId],
  )
  let remaining = -facts.ledger.dueCents
  let taken = 0
  for (const transfer of transfers) {
    if (remaining <= 0) break
    const amount = Math.min(remaining, transfer.left)
    if (amount <= 0) continue
    const reversal = await stripe.transfers.createReversal(
      transfer.stripe_transfer_id,
      { amount, metadata: { requestId: facts.requestId, reason: 'refund' } },
      { idempotencyKey: `reversal:${transfer.stripe_transfer_id}:${transfer.reversals}:${amount}` },
    )
    await ctx.db.transaction((manager) => recordReversal(manager, reversal, facts.requestId))
    remaining -= amount
    taken += amount
  }
  if (taken > 0) {
    await ctx.db.transaction(async (manager) => {
      const mail = await payoutMailFacts(manager, ctx.config, facts.requestId)
      await tellOwners(
        manager,
        facts.studioId,
        'payout-reversed',
        (ownerName) => reversedMail({ ...mail, ownerName }, taken),
        `/studios/${facts.studioId}/money`,
        facts.requestId,
      )
    })
  }
}

/** Once per request: the owner hears that money waits for a payout account. */
async function tellWaiting(ctx: AppContext, facts: RequestPayoutFacts) {
  await ctx.db.transaction(async (manager) => {
    const told: unknown[] = await manager.query(`SELECT 1 FROM notices WHERE request_id = $1 AND kind = 'payout-waiting' LIMIT 1`, [
      facts.requestId,
    ])
    if (told.length) return
    const mail = await payoutMailFacts(manager, ctx.config, facts.requestId)
    await tellOwners(
      manager,
      facts.studioId,
      'payout-waiting',
      (ownerName) => payoutWaitingMail({ ...mail, ownerName }, facts.ledger.dueCents),
      `/studios/${facts.studioId}/money`,
      facts.requestId,
    )
  })
}

/** Queues a payout run for every earned request of the studio not yet paid up (its account just became able to take them). */
async function enqueueStudioPayouts(manager: EntityManager, studioId: string) {
  const rows: { request_id: string }[] = await manager.query(
    `SELECT request_id FROM request_payouts WHERE studio_id = $1 AND paid_up_at IS NULL`,
    [studioId],
  )
  for (const { request_id } of rows) await enqueuePayout(manager, request_id)
}

/**
 * The scheduled catch-up: every earned request past its hold, not paid up, whose studio can take
 * transfers, gets a run (a release-time job replaced by another, a run that failed for good).
 */
export async function sweepPayouts(ctx: AppContext): Promise<number> {
  return ctx.db.transaction(async (manager) => {
    const rows: { request_id: string }[] = await manager.query(
      `SELECT rp.request_id FROM request_payouts rp JOIN payout_accounts pa ON pa.studio_id = rp.studio_id AND pa.transfers_status = 'active'
       WHERE rp.paid_up_at IS NULL AND (rp.release_at IS NULL OR rp.release_at <= now()) ORDER BY rp.request_id LIMIT 500`,
    )
    for (const { request_id } of rows) await enqueuePayout(manager, request_id)
    return rows.length
  })
}

/**
 * Applies what Stripe says of a connected account, unless we already applied something newer. When
 * the account becomes able to take transfers, what the studio accrued is queued to go and its owners
 * are told.
 */
export async function applyAccount(ctx: AppContext, manager: EntityManager, account: Stripe.Account, seenAt: Date) {
  const row = await manager
    .getRepository(PayoutAccount)
    .findOne({ where: { stripeAccountId: account.id }, lock: { mode: 'pessimistic_write' } })
  if (!row) return null
  if (row.stripeSeenAt && row.stripeSeenAt.getTime() > seenAt.getTime()) return row
  const couldReceive = canReceiveTransfers(row)
  const bank = account.external_accounts?.data?.find((external) => external.object === 'bank_account') as Stripe.BankAccount | undefined
  Object.assign(row, {
    detailsSubmitted: account.details_submitted,
    transfersStatus: account.capabilities?.transfers ?? null,
    payoutsEnabled: account.payouts_enabled,
    currentlyDue: account.requirements?.currently_due ?? [],
    pendingVerification: account.requirements?.pending_verification ?? [],
    disabledReason: account.requirements?.disabled_reason ?? null,
    bankLast4: bank?.last4 ?? row.bankLast4,
    stripeSeenAt: seenAt,
  })
  await manager.getRepository(PayoutAccount).save(row)
  if (!couldReceive && canReceiveTransfers(row)) {
    await enqueueStudioPayouts(manager, row.studioId)
    const studio = await manager.getRepository(Studio).findOneByOrFail({ id: row.studioId })
    await tellOwners(
      manager,
      row.studioId,
      'payouts-on',
      (ownerName) => payoutsOnMail(ownerName, studio.name, `${ctx.config.publicUrl}/studios/${row.studioId}/money`),
      `/studios/${row.studioId}/money`,
      null,
    )
  }
  return row
}

/** Asks Stripe for the studio's account as it is now (the owner is back from onboarding). */
export async function refreshAccount(ctx: AppContext, studioId: string) {
  const row = await ctx.db.getRepository(PayoutAccount).findOne({ where: { studioId } })
  if (!row) return null
  const account = await stripeFor(ctx.config).accounts.retrieve(row.stripeAccountId)
  return inTransaction(ctx, (manager) => applyAccount(ctx, manager, account, new Date()))
}

/**
 * The owner's way to Stripe's hosted onboarding: the studio's Express account (made once; the
 * idempotency key makes a double click one account) and a fresh account link to it.
 */
export async function startOnboarding(ctx: AppContext, studioId: string, owner: Pick<User, 'email'>): Promise<{ url: string }> {
  const stripe = stripeFor(ctx.config)
  const studio = await ctx.db.getRepository(Studio).findOneByOrFail({ id: studioId })
  let row = await ctx.db.getRepository(PayoutAccount).findOne({ where: { studioId } })
  if (!row) {
    const account = await stripe.accounts.create(
      {
        type: 'express',
        country: studio.country,
        email: owner.email,
        business_profile: { name: studio.name, product_description: 'Contract kiln firing: space in scheduled firings, sold to potters' },
        capabilities: { transfers: { requested: true } },
        metadata: { studioId },
      },
      { idempotencyKey: `payout-account:${studioId}` },
    )
    await ctx.db.query(
      `INSERT INTO payout_accounts (studio_id, stripe_account_id, transfers_status, currently_due, pending_verification, disabled_reason)
       VALUES ($1, $2, $3, $4, $5, $6) ON CONFLICT (studio_id) DO NOTHING`,
      [
        studioId,
        account.id,
        account.capabilities?.transfers ?? null,
        JSON.stringify(account.requirements?.currently_due ?? []),
        JSON.stringify(account.requirements?.pending_verification ?? []),
        account.requirements?.disabled_reason ?? null,
      ],
    )
    row = await ctx.db.getRepository(PayoutAccount).findOneByOrFail({ studioId })
  }
  if (row.disabledReason?.startsWith('rejected.')) {
    throw conflict('Stripe could not accept this payout account. Write to the Conewright desk.', 'payout-account-rejected')
  }
  const page = `${ctx.config.publicUrl}/studios/${studioId}/money`
  const link = await stripe.accountLinks.create({
    account: row.stripeAccountId,
    type: 'account_onboarding',
    refresh_url: `${page}?onboarding=refresh`,
    return_url: `${page}?onboarding=return`,
  })
  return { url: link.url }
}

/** Verifies a Connect webhook's signature with the Connect endpoint's own secret; a bad one is a 400. */
export function verifyConnectWebhook(ctx: AppContext, rawBody: Buffer, signature: string | undefined): Stripe.Event {
  if (!signature) throw badRequest('Missing Stripe-Signature header.', undefined, 'bad-signature')
  try {
    return stripeFor(ctx.config).webhooks.constructEvent(rawBody, signature, ctx.config.stripeConnectWebhookSecret)
  } catch {
    throw badRequest('The webhook signature does not match.', undefined, 'bad-signature')
  }
}

const connectEventShape = z.object({
  id: z.string().min(1).max(255),
  type: z.string().min(1).max(255),
  created: z.number().int().nonnegative(),
  account: z.string().min(1).max(255).optional(),
  data: z.object({ object: z.looseObject({ id: z.string().optional() }) }),
})

/**
 * Handles one verified event about a connected account, once (recorded by id with the other Stripe
 * events, in the same transaction as its effects): the account's state, and its payouts to the bank.
 */
export async function handleConnectEvent(ctx: AppContext, raw: unknown): Promise<'handled' | 'duplicate' | 'flagged'> {
  const parsed = connectEventShape.safeParse(raw)
  if (!parsed.success) {
    const id = typeof (raw as { id?: unknown })?.id === 'string' ? (raw as { id: string }).id.slice(0, 255) : `malformed:${randomUUID()}`
    await ctx.db.query(
      `INSERT INTO stripe_events (id, type, payload, problem) VALUES ($1, 'malformed', $2, $3) ON CONFLICT (id) DO UPDATE SET problem = EXCLUDED.problem`,
      [id, JSON.stringify(raw ?? null), 'The event is not shaped as Stripe sends them.'],
    )
    throw badRequest('That event is not shaped as Stripe sends them.', undefined, 'malformed-event')
  }
  const event = raw as Stripe.Event
  const seenAt = new Date(event.created * 1000)
  return inTransaction(ctx, async (manager) => {
    const recorded: unknown[] = await manager.query(
      `INSERT INTO stripe_events (id, type, payload) VALUES ($1, $2, $3) ON CONFLICT (id) DO NOTHING RETURNING id`,
      [event.id, event.type, JSON.stringify(event)],
    )
    if (!recorded.length) return 'duplicate'
    const flag = async (problem: string) => {
      await manager.query(`UPDATE stripe_events SET problem = $2 WHERE id = $1`, [event.id, problem])
      ctx.log.warn(`stripe event ${event.id} (${event.type}) not applied: ${problem}`)
      return 'flagged' as const
    }
    if (event.type === 'account.updated') {
      const applied = await applyAccount(ctx, manager, event.data.object, seenAt)
      if (!applied) return flag('No studio of ours has this connected account.')
    } else if (event.type.startsWith('payout.')) {
      const payout = event.data.object as Stripe.Payout
      const owner = await manager.getRepository(PayoutAccount).findOne({ where: { stripeAccountId: event.account ?? '' } })
      if (!owner) return flag('The payout is on an account that is not one of our studios’.')
      await manager.query(
        `INSERT INTO studio_payouts (studio_id, stripe_payout_id, amount_cents, currency, status, arrival_date, failure_message, created_at, stripe_seen_at)
         VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9)
         ON CONFLICT (stripe_payout_id) DO UPDATE SET status = EXCLUDED.status, arrival_date = EXCLUDED.arrival_date,
           failure_message = EXCLUDED.failure_message, stripe_seen_at = EXCLUDED.stripe_seen_at, updated_at = now()
         WHERE studio_payouts.stripe_seen_at <= EXCLUDED.stripe_seen_at`,
        [
          owner.studioId,
          payout.id,
          payout.amount,
          payout.currency.toUpperCase(),
          payout.status,
          new Date(payout.arrival_date * 1000),
          payout.failure_message,
          new Date(payout.created * 1000),
          seenAt,
        ],
      )
    }
    return 'handled'
  })
}

/**
 * Transfer events on the platform's own endpoint: a transfer or reversal made outside this app's run
 * (in Stripe's dashboard, say) is recorded against its request. Nothing is sent or taken back for it.
 */
export async function handleTransferEvent(manager: EntityManager, event: Stripe.Event) {
  if (event.type !== 'transfer.created' && event.type !== 'transfer.reversed' && event.type !== 'transfer.updated') return
  const transfer = event.data.object
  const requestId = REQUEST_GROUP.exec(transfer.transfer_group ?? '')?.[1]
  if (!requestId) return
  const [request]: { studio_id: string }[] = await manager.query(
    `SELECT k.studio_id FROM firing_requests r JOIN firings f ON f.id = r.firing_id JOIN kilns k ON k.id = f.kiln_id WHERE r.id = $1`,
    [requestId],
  )
  if (request) await recordTransfer(manager, transfer, requestId, request.studio_id)
}

/**
 * The desk settles a dispute (after any refund it makes): the studio's held share is released and
 * sent, less the fee on what was kept; both sides are told.
 */
export async function settleDispute(ctx: AppContext, admin: Pick<User, 'id' | 'role'>, requestId: string, note: string) {
  return requestAction(ctx, admin, requestId, 'desk-settle', async (step) => {
    const { manager, rc } = step
    if (rc.request.state !== 'disputed') throw conflict('Only a disputed request can be settled.', 'not-disputed')
    const rule = feeRuleFrom(ctx.config)
    const currency = (rc.request.standingQuote ?? rc.request.quote)?.currency ?? rc.studio.currency
    const settled: unknown[] = await manager.query(
      `INSERT INTO request_payouts (request_id, studio_id, currency, fee_percent_bp, fee_minimum_cents, earned_at, dispute_settled_at)
       VALUES ($1, $2, $3, $4, $5, now(), now())
       ON CONFLICT (request_id) DO UPDATE SET dispute_settled_at = now(), paid_up_at = NULL, updated_at = now()
       WHERE request_payouts.dispute_settled_at IS NULL RETURNING request_id`,
      [requestId, rc.studio.id, currency.toUpperCase(), rule.percentBp, rule.minimumCents],
    )
    if (!settled.length) throw conflict('This dispute is already settled.', 'already-settled')
    await step.note(note ? `Dispute settled by the desk: ${note}` : 'Dispute settled by the desk', { disputeSettled: true })
    await enqueuePayout(manager, requestId)
    const mail = disputeSettledMail(factsOf(rc, ctx.config.publicUrl), note)
    await step.tellPotter('dispute-settled', mail)
    await step.tellStudio('dispute-settled', mail)
  })
}

export function parseStatementPeriod(period: string): { from: string; kind: 'month' | 'year' } {
  if (!statementPeriodSchema.safeParse(period).success) {
    throw new HttpError(400, 'invalid-input', 'Name a month (2026-05) or a year (2026).', {
      period: 'A month as YYYY-MM or a year as YYYY.',
    })
  }
  return { from: period, kind: period.length === 4 ? 'year' : 'month' }
}
