// Money through Stripe: checkout sessions for deposits and balances, refunds, and the webhook events
// that confirm them. Every movement is booked in the ledger; every event is handled once.
import { randomUUID } from 'node:crypto'
import type Stripe from 'stripe'
import { z } from 'zod'
import { In, IsNull, type EntityManager } from 'typeorm'
import type { AppContext } from '../context'
import { Claim } from '../entities/Claim'
import { CounterRefund } from '../entities/CounterRefund'
import { KeptCard } from '../entities/KeptCard'
import { LedgerEntry } from '../entities/LedgerEntry'
import { Payment } from '../entities/Payment'
import { formatMoney } from '../../shared/dates'
import { cardLabel, minimumOnlineCharge, payableOnline } from '../../shared/payments'
import type { User } from '../entities/User'
import { badRequest, conflict } from '../http/errors'
import { isUuid } from '../http/validate'
import { REQUEST_STATE_LABELS } from '../../shared/workflow/request-states'
import { enqueueJob, type JobOptions } from '../jobs/queue'
import { paymentReceivedMail } from '../mail/templates/pickup'
import { refundedMail } from '../mail/templates/requests'
import { tell } from './notices'
import { askCurrency, factsOf, loadRequest } from './request-context'
import { inTransaction, requestAction, requestActionIn, type ActionStep } from './request-door'
import { stripeFor } from './stripe'
import { enqueuePayoutIfEarned, handleTransferEvent, moneyQueueOf, transferGroupOf } from './payouts'
import { enqueueStudioSync } from './search-sync'
import { bookClaimPaid } from './claims'
import { afterDepositPaid, agreeToKeepCard, customerFor } from './kept-cards'

export const REFUND_TASK = 'refund-payment'
export const OPEN_CHECKOUT_TASK = 'open-checkout'

/** How long a hosted checkout page stays open (Stripe allows 30 minutes to 24 hours). */
const CHECKOUT_LIFETIME_S = 2 * 3600

const sum = (entries: { amountCents: number }[]) => entries.reduce((n, e) => n + e.amountCents, 0)

/**
 * What came in and went out for a request, from the ledger and the counter refunds still owed.
 * `net` is what the potter has paid and not had back (or been promised back at the counter);
 * `onlineNet` is the part that went through Stripe, which is all a Stripe refund can return.
 */
export async function moneyOf(manager: EntityManager, requestId: string) {
  const entries = await manager.getRepository(LedgerEntry).find({ where: { requestId }, order: { at: 'ASC' } })
  const counterRefunds = await manager.getRepository(CounterRefund).find({ where: { requestId }, order: { createdAt: 'ASC' } })
  // A damage claim paid is not toward the firing's price: it stays out of what is owed and refundable.
  const paidIn = sum(entries.filter((e) => e.direction === 'in' && e.kind !== 'claim'))
  const refunded = sum(entries.filter((e) => e.direction === 'out'))
  const counterRefundDue = sum(counterRefunds.filter((r) => !r.paidAt))
  const onlineIn = sum(entries.filter((e) => e.kind === 'deposit' || e.kind === 'balance'))
  const onlineOut = sum(entries.filter((e) => e.kind === 'refund'))
  return {
    entries,
    counterRefunds,
    paidIn,
    refunded,
    counterRefundDue,
    net: paidIn - refunded - counterRefundDue,
    onlineNet: onlineIn - onlineOut,
  }
}

/**
 * The hosted checkout page for a request's deposit or balance: the open one if there is one, else a
 * new Checkout Session. The idempotency key counts earlier sessions, so a retry of the same attempt
 * (by the job or the route) gets the same session back from Stripe.
 */
export async function openCheckout(
  ctx: AppContext,
  requestId: string,
  purpose: 'deposit' | 'balance' | 'claim',
  amountCents: number,
  options: {
    claim?: { claimId: string; label: string; returnPath: string }
    /** A deposit page that keeps the card on this Customer, for damage claims the potter accepts. */
    keepCardFor?: string
  } = {},
): Promise<Payment> {
  const { claim, keepCardFor } = options
  const rc = await loadRequest(ctx.db.manager, requestId)
  const payments = ctx.db.getRepository(Payment)
  const claimId = claim?.claimId ?? null
  const keepsCard = purpose === 'deposit' && Boolean(keepCardFor)
  const open = await payments.findOne({
    where: { requestId, purpose, status: 'open', claimId: claimId ?? IsNull() },
    order: { createdAt: 'DESC' },
  })
  if (open && open.expiresAt.getTime() > Date.now() + 5 * 60_000 && open.amountCents === amountCents && open.keepsCard === keepsCard)
    return open
  if (amountCents <= 0) throw conflict('Nothing is owed.', 'nothing-owed')
  const currency = askCurrency(rc.request, rc.studio).toLowerCase()
  if (!payableOnline(amountCents, currency)) {
    throw conflict(
      `${formatMoney(amountCents, currency.toUpperCase())} is less than a card can be charged; pay it at the studio’s counter.`,
      'below-minimum',
      { minimumCents: minimumOnlineCharge(currency) },
    )
  }
  const attempt = await payments.count({ where: { requestId, purpose, claimId: claimId ?? IsNull() } })
  const base = `${ctx.config.publicUrl}${claim?.returnPath ?? `/requests/${requestId}`}`
  const what = claim?.label ?? (purpose === 'deposit' ? 'Deposit' : 'Balance')
  const metadata = { requestId, purpose, ...(claimId ? { claimId } : {}) }
  const session = await stripeFor(ctx.config).checkout.sessions.create(
    {
      mode: 'payment',
      line_items: [
        {
          quantity: 1,
          price_data: {
            currency,
            unit_amount: amountCents,
            product_data: { name: `${what}: ${rc.kiln.name} firing at ${rc.studio.name}` },
          },
        },
      ],
      success_url: `${base}?paid=${purpose}&session={CHECKOUT_SESSION_ID}`,
      cancel_url: `${base}?unpaid=${purpose}`,
      client_reference_id: requestId,
      ...(keepsCard ? { customer: keepCardFor } : { customer_email: rc.potter.email }),
      metadata,
      // The request's transfer group ties its charges to the transfers that pay the studio its share.
      payment_intent_data: {
        metadata,
        transfer_group: transferGroupOf(requestId),
        ...(keepsCard ? { setup_future_usage: 'off_session' as const } : {}),
      },
      expires_at: Math.floor(Date.now() / 1000) + CHECKOUT_LIFETIME_S,
    },
    { idempotencyKey: `${purpose}:${claimId ?? requestId}:${attempt}:${amountCents}${keepsCard ? ':keep' : ''}` },
  )
  // One page to pay on at a time: the one it replaces is closed at Stripe too, so it cannot be paid as well.
  if (open && open.stripeSessionId !== session.id) {
    await payments.update(open.id, { status: 'expired' })
    await stripeFor(ctx.config)
      .checkout.sessions.expire(open.stripeSessionId)
      .catch((error: unknown) => ctx.log.warn(`could not close replaced checkout ${open.stripeSessionId}: ${String(error)}`))
  }
  // The job and the route may open the same attempt at once: Stripe answers both with one session
  // (same idempotency key) and the first to record it wins.
  await payments
    .createQueryBuilder()
    .insert()
    .values({
      requestId,
      purpose,
      claimId,
      keepsCard,
      stripeSessionId: session.id,
      checkoutUrl: session.url!,
      amountCents,
      currency: currency.toUpperCase(),
      status: 'open',
      stripePaymentIntentId: null,
      failureMessage: null,
      expiresAt: new Date((session.expires_at ?? Math.floor(Date.now() / 1000) + CHECKOUT_LIFETIME_S) * 1000),
    })
    .orIgnore()
    .execute()
  return payments.findOneByOrFail({ stripeSessionId: session.id })
}

/**
 * The potter's checkout page for what is owed now (the deposit before drop-off, the balance once the
 * ware is ready), after the door has checked that they may pay it.
 */
export async function checkoutFor(
  ctx: AppContext,
  potter: User,
  requestId: string,
  purpose: 'deposit' | 'balance',
  { keepCard = false }: { keepCard?: boolean } = {},
) {
  const owed = await requestAction(ctx, potter, requestId, purpose === 'deposit' ? 'pay-deposit' : 'pay-balance', async ({ facts }) =>
    purpose === 'deposit' ? facts.depositOwedCents : facts.balanceOwedCents,
  )
  // Stripe is asked outside the transaction: no lock is held across a network call.
  if (purpose !== 'deposit' || !keepCard) return openCheckout(ctx, requestId, purpose, owed)
  const customerId = await customerFor(ctx, potter)
  await agreeToKeepCard(ctx.db.manager, requestId, potter.id, customerId)
  return openCheckout(ctx, requestId, purpose, owed, { keepCardFor: customerId })
}

/** Queues the deposit's checkout session so it exists by the time the potter opens the request. */
export async function enqueueOpenCheckout(manager: EntityManager, requestId: string, purpose: 'deposit' | 'balance', amountCents: number) {
  const currency = (
    await manager.query(`SELECT coalesce(standing_quote, quote) ->> 'currency' AS c FROM firing_requests WHERE id = $1`, [requestId])
  )[0]?.c
  // A deposit smaller than a card can be charged is taken at the counter: no page to open.
  if (currency && !payableOnline(amountCents, currency)) return
  await enqueueJob(manager, OPEN_CHECKOUT_TASK, { requestId, purpose, amountCents }, { jobKey: `checkout:${purpose}:${requestId}` })
}

/**
 * Queues a refund of up to `amountCents` of what was paid for a request, in the caller's transaction.
 * The worker makes it through Stripe, payment by payment, with idempotency keys, and books it.
 */
export async function enqueueRefund(
  manager: EntityManager,
  requestId: string,
  amountCents: number,
  reason: string,
  options: Pick<JobOptions, 'runAt' | 'jobKey'> = {},
) {
  if (amountCents <= 0) return
  // In the request's money queue: a refund runs before any payout run queued after it.
  await enqueueJob(
    manager,
    REFUND_TASK,
    { requestId, amountCents, reason, key: `${requestId}:${Date.now()}` },
    { ...options, queueName: moneyQueueOf(requestId) },
  )
}

export const EXPIRE_CHECKOUTS_TASK = 'expire-checkouts'

/** Queues the closing of a request's open checkout pages (its space was released). */
export async function enqueueExpireCheckouts(
  manager: EntityManager,
  requestId: string,
  options: Pick<JobOptions, 'runAt' | 'jobKey'> = {},
) {
  await enqueueJob(manager, EXPIRE_CHECKOUTS_TASK, { requestId }, options)
}

/** Makes a queued refund: splits it over the request's paid payments, newest first. */
export async function makeRefund(ctx: AppContext, payload: { requestId: string; amountCents: number; reason: string; key: string }) {
  const stripe = stripeFor(ctx.config)
  const paid = await ctx.db
    .getRepository(Payment)
    .find({ where: { requestId: payload.requestId, status: 'paid', purpose: In(['deposit', 'balance']) }, order: { createdAt: 'DESC' } })
  const booked = await ctx.db.getRepository(LedgerEntry).find({ where: { requestId: payload.requestId, kind: 'refund' } })
  let left = payload.amountCents
  for (const payment of paid) {
    if (left <= 0) break
    const already = booked.filter((b) => b.stripePaymentIntentId === payment.stripePaymentIntentId).reduce((n, b) => n + b.amountCents, 0)
    const amount = Math.min(left, payment.amountCents - already)
    if (amount <= 0) continue
    const refund = await stripe.refunds.create(
      { payment_intent: payment.stripePaymentIntentId!, amount, metadata: { requestId: payload.requestId, reason: payload.reason } },
      { idempotencyKey: `refund:${payload.key}:${payment.id}` },
    )
    await bookRefund(ctx, payload.requestId, refund, payload.reason)
    left -= amount
  }
}

/** Books a Stripe refund once (the ledger's refund id is unique) and tells the potter. */
async function bookRefund(ctx: AppContext, requestId: string, refund: Stripe.Refund, note: string) {
  await ctx.db.transaction(async (manager) => {
    const inserted: unknown[] = await manager.query(
      `INSERT INTO ledger_entries (request_id, direction, kind, amount_cents, currency, stripe_refund_id, stripe_payment_intent_id, note)
       VALUES ($1, 'out', 'refund', $2, $3, $4, $5, $6) ON CONFLICT (stripe_refund_id) WHERE stripe_refund_id IS NOT NULL DO NOTHING RETURNING id`,
      [
        requestId,
        refund.amount,
        refund.currency.toUpperCase(),
        refund.id,
        typeof refund.payment_intent === 'string' ? refund.payment_intent : (refund.payment_intent?.id ?? null),
        note,
      ],
    )
    if (!inserted.length) return
    // A refund after the studio was paid takes back the studio's part of it.
    await enqueuePayoutIfEarned(manager, requestId)
    const rc = await loadRequest(manager, requestId)
    await tell(manager, rc.potter, 'refunded', refundedMail(factsOf(rc, ctx.config.publicUrl), refund.amount), {
      path: `/requests/${requestId}`,
      requestId,
      firingId: rc.firing.id,
    })
  })
}

/** Verifies a webhook's signature on the raw body; a bad one is a 400. */
export function verifyWebhook(ctx: AppContext, rawBody: Buffer, signature: string | undefined): Stripe.Event {
  if (!signature) throw badRequest('Missing Stripe-Signature header.', undefined, 'bad-signature')
  const stripe = stripeFor(ctx.config)
  let event: Stripe.Event
  try {
    event = stripe.webhooks.constructEvent(rawBody, signature, ctx.config.stripeWebhookSecret)
  } catch {
    throw badRequest('The webhook signature does not match.', undefined, 'bad-signature')
  }
  // The SDK refuses a timestamp older than its tolerance but not one from the future; an event signed
  // "an hour from now" is as suspect as one an hour old. Every t= is checked, whichever the SDK used.
  const stamps = [...signature.matchAll(/(?:^|,)\s*t=([^,]*)/g)].map((m) => Number(m[1]))
  const now = Date.now() / 1000
  if (!stamps.length || stamps.some((t) => !(Math.abs(now - t) <= stripe.webhooks.DEFAULT_TOLERANCE)))
    throw badRequest('The webhook timestamp is outside the tolerance.', undefined, 'bad-signature')
  return event
}

/** The least a signed event must carry before anything in it is trusted. */
const eventShape = z.object({
  id: z.string().min(1).max(255),
  type: z.string().min(1).max(255),
  data: z.object({ object: z.looseObject({ id: z.string().optional() }) }),
})

/** Records an event that cannot be applied, for the front desk to look at. Idempotent by event id. */
async function recordProblem(manager: EntityManager, id: string, type: string, payload: unknown, problem: string) {
  await manager.query(
    `INSERT INTO stripe_events (id, type, payload, problem) VALUES ($1, $2, $3, $4) ON CONFLICT (id) DO UPDATE SET problem = EXCLUDED.problem`,
    [id, type, JSON.stringify(payload ?? null), problem],
  )
}

/**
 * Handles one verified Stripe event, once. Events may come twice, late or out of order: each is
 * recorded by id in the same transaction as its effects, and each effect checks the state it finds.
 * A payment is found by its own checkout session id in our table, never by the metadata alone, and is
 * applied only when the amount and currency are the ones we asked for; anything else is recorded
 * with its problem for the front desk and changes nothing. A malformed signed event is a 400.
 */
export async function handleStripeEvent(ctx: AppContext, raw: unknown): Promise<'handled' | 'duplicate' | 'flagged'> {
  const parsed = eventShape.safeParse(raw)
  if (!parsed.success) {
    const id = typeof (raw as { id?: unknown })?.id === 'string' ? (raw as { id: string }).id.slice(0, 255) : `malformed:${randomUUID()}`
    await ctx.db.transaction((manager) => recordProblem(manager, id, 'malformed', raw, 'The event is not shaped as Stripe sends them.'))
    throw badRequest('That event is not shaped as Stripe sends them.', undefined, 'malformed-event')
  }
  const event = raw as Stripe.Event
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

    switch (event.type) {
      case 'checkout.session.completed': {
        const session = event.data.object
        if (session.payment_status !== 'paid') break
        const payment = await manager
          .getRepository(Payment)
          .findOne({ where: { stripeSessionId: session.id }, lock: { mode: 'pessimistic_write' } })
        if (!payment) return flag('No checkout session of ours has this id.')
        if (payment.status === 'paid') break
        const currency = (session.currency ?? '').toUpperCase()
        if (session.amount_total !== payment.amountCents || currency !== payment.currency) {
          return flag(
            `Paid ${session.amount_total ?? '?'} ${currency || '?'} where ${payment.amountCents} ${payment.currency} was asked for.`,
          )
        }
        if (session.metadata?.requestId && session.metadata.requestId !== payment.requestId) {
          return flag('The metadata names another request than the session was opened for.')
        }
        const paymentIntentId = typeof session.payment_intent === 'string' ? session.payment_intent : (session.payment_intent?.id ?? null)
        await manager.update(Payment, payment.id, { status: 'paid', stripePaymentIntentId: paymentIntentId })
        Object.assign(payment, { status: 'paid', stripePaymentIntentId: paymentIntentId })
        if (payment.purpose === 'claim') {
          // A claim books its own ledger entry with the claim it pays.
          await requestActionIn(ctx, manager, null, payment.requestId, 'claim', (step) =>
            bookClaimPaid(step, payment.claimId!, { sessionId: session.id, paymentIntentId }),
          )
          break
        }
        await manager.getRepository(LedgerEntry).save({
          requestId: payment.requestId,
          direction: 'in',
          kind: payment.purpose,
          amountCents: payment.amountCents,
          currency: payment.currency,
          stripeSessionId: session.id,
          stripePaymentIntentId: paymentIntentId,
          stripeRefundId: null,
          note: '',
        })
        await requestActionIn(
          ctx,
          manager,
          null,
          payment.requestId,
          payment.purpose === 'deposit' ? 'deposit-paid' : 'balance-paid',
          (step) => settlePayment(step, payment),
        )
        if (payment.purpose === 'deposit') await afterDepositPaid(manager, payment.requestId, payment.keepsCard, paymentIntentId)
        break
      }
      case 'checkout.session.expired': {
        await manager.getRepository(Payment).update({ stripeSessionId: event.data.object.id, status: 'open' }, { status: 'expired' })
        break
      }
      case 'payment_intent.payment_failed': {
        const intent = event.data.object
        const requestId = intent.metadata?.requestId
        const purpose = intent.metadata?.purpose
        if (!requestId || !isUuid(requestId) || (purpose !== 'deposit' && purpose !== 'balance')) break
        // Only a failure message is written, and only on our own open page for that request.
        await manager
          .getRepository(Payment)
          .update(
            { requestId, purpose, status: 'open' },
            { failureMessage: intent.last_payment_error?.message ?? 'The card was declined.' },
          )
        break
      }
      case 'payment_intent.succeeded': {
        // A checkout session's own event books its money. A claim paid with the kept card has no session:
        // the route books it when Stripe answers, and this event books it if that answer was lost.
        const intent = event.data.object
        const { requestId, claimId, paidWith } = intent.metadata ?? {}
        if (paidWith !== 'kept-card' || !requestId || !isUuid(requestId) || !claimId || !isUuid(claimId)) break
        const claim = await manager.getRepository(Claim).findOne({ where: { id: claimId, requestId } })
        if (!claim) return flag('No claim of ours has this id.')
        if (claim.status === 'paid') break
        if (intent.amount_received !== claim.amountCents || intent.currency.toUpperCase() !== claim.currency)
          return flag(
            `Paid ${intent.amount_received} ${intent.currency.toUpperCase()} where ${claim.amountCents} ${claim.currency} was claimed.`,
          )
        const kept = await manager.getRepository(KeptCard).findOneBy({ requestId })
        await requestActionIn(ctx, manager, null, requestId, 'claim', (step) =>
          bookClaimPaid(step, claimId, {
            sessionId: null,
            paymentIntentId: intent.id,
            card: cardLabel(kept?.brand ?? null, kept?.last4 ?? null),
          }),
        )
        break
      }
      case 'charge.refunded': {
        const charge = event.data.object
        const intentId = typeof charge.payment_intent === 'string' ? charge.payment_intent : charge.payment_intent?.id
        const payment = intentId ? await manager.getRepository(Payment).findOne({ where: { stripePaymentIntentId: intentId } }) : null
        if (!payment) break
        // A refund made outside Conewright (in Stripe's dashboard, say) is booked here; ours already are.
        const refunds = (charge.refunds?.data ?? []).filter((r) => typeof r?.id === 'string' && Number.isInteger(r.amount) && r.amount > 0)
        const known = await manager.getRepository(LedgerEntry).find({ where: { stripeRefundId: In(refunds.map((r) => r.id)) } })
        for (const refund of refunds.filter((r) => !known.some((k) => k.stripeRefundId === r.id))) {
          await manager.getRepository(LedgerEntry).save({
            requestId: payment.requestId,
            direction: 'out',
            kind: 'refund',
            amountCents: refund.amount,
            currency: payment.currency,
            stripeRefundId: refund.id,
            stripePaymentIntentId: intentId!,
            stripeSessionId: null,
            note: 'Refunded in Stripe',
          })
          await enqueuePayoutIfEarned(manager, payment.requestId)
        }
        break
      }
      case 'transfer.created':
      case 'transfer.updated':
      case 'transfer.reversed': {
        await handleTransferEvent(manager, event)
        break
      }
      default:
        break
    }
    return 'handled'
  })
}

/**
 * A paid deposit books the space (or, when it came after the request ended, goes straight back); a
 * paid balance is receipted. Either way both sides are told.
 */
async function settlePayment(step: ActionStep, payment: Payment) {
  const { manager, rc, ctx } = step
  const facts = factsOf(rc, ctx.config.publicUrl)
  const { net } = await moneyOf(manager, rc.request.id)
  if (payment.purpose === 'deposit') {
    if (rc.request.state !== 'accepted') {
      await step.note(
        `A deposit of ${payment.amountCents} cents arrived after this stood at “${REQUEST_STATE_LABELS[rc.request.state]}”; it is refunded`,
      )
      await enqueueRefund(manager, rc.request.id, payment.amountCents, `Deposit arrived after the request was ${rc.request.state}`)
      return
    }
    const owed = Math.max(0, (rc.request.depositAskedCents ?? 0) - net)
    const receipt = { what: 'deposit' as const, how: 'online' as const, amountCents: payment.amountCents, paidCents: net, owedCents: owed }
    if (owed === 0) await step.move('deposit_paid', 'Deposit paid through Stripe', { sessionId: payment.stripeSessionId })
    else await step.note('Part of the deposit paid through Stripe', { sessionId: payment.stripeSessionId })
    await step.tellPotter('payment-received', paymentReceivedMail(facts, 'potter', receipt))
    await step.tellStudio('payment-received', paymentReceivedMail(facts, 'studio', receipt))
    await enqueueStudioSync(manager, rc.studio.id)
    return
  }
  const total = (rc.request.standingQuote ?? rc.request.quote)?.totalCents ?? 0
  const receipt = {
    what: 'balance' as const,
    how: 'online' as const,
    amountCents: payment.amountCents,
    paidCents: net,
    owedCents: Math.max(0, total - net),
  }
  await step.note('Balance paid through Stripe', { sessionId: payment.stripeSessionId })
  await step.tellPotter('payment-received', paymentReceivedMail(facts, 'potter', receipt))
  await step.tellStudio('payment-received', paymentReceivedMail(facts, 'studio', receipt))
}

export async function openPaymentsOf(manager: EntityManager, requestId: string) {
  return manager.getRepository(Payment).find({ where: { requestId }, order: { createdAt: 'ASC' } })
}

/** Expires open checkout pages of a request in Stripe (after the space is released, say). */
export async function expireOpenCheckouts(ctx: AppContext, requestId: string) {
  const open = await ctx.db.getRepository(Payment).find({ where: { requestId, status: 'open' } })
  for (const payment of open) {
    try {
      await stripeFor(ctx.config).checkout.sessions.expire(payment.stripeSessionId)
    } catch (error) {
      // Already completed or expired on Stripe's side: the webhook settles which.
      ctx.log.warn(`could not expire checkout ${payment.stripeSessionId}`, error)
    }
    await ctx.db.getRepository(Payment).update({ id: payment.id, status: 'open' }, { status: 'expired' })
  }
}
