// Money through Stripe: checkout sessions for deposits and balances, refunds, and the webhook events
// that confirm them. Every movement is booked in the ledger; every event is handled once.
import type Stripe from 'stripe'
import { In, type EntityManager } from 'typeorm'
import type { AppContext } from '../context'
import { LedgerEntry } from '../entities/LedgerEntry'
import { Payment } from '../entities/Payment'
import { badRequest, conflict } from '../http/errors'
import { enqueueJob } from '../jobs/queue'
import { depositReceivedMail, refundedMail } from '../mail/templates/requests'
import { queueMail } from './mail'
import { factsOf, loadRequest, moveRequest, studioPeople, type RequestContext } from './request-context'
import { stripeFor } from './stripe'
import { settleBalance } from './pickup'
import { enqueueStudioSync } from './search-sync'

export const REFUND_TASK = 'refund-payment'
export const OPEN_CHECKOUT_TASK = 'open-checkout'

/** How long a hosted checkout page stays open (Stripe allows 30 minutes to 24 hours). */
const CHECKOUT_LIFETIME_S = 2 * 3600

/** What came in and went out for a request, from the ledger. */
export async function moneyOf(manager: EntityManager, requestId: string) {
  const entries = await manager.getRepository(LedgerEntry).find({ where: { requestId }, order: { at: 'ASC' } })
  const paidIn = entries.filter((e) => e.direction === 'in').reduce((n, e) => n + e.amountCents, 0)
  const refunded = entries.filter((e) => e.direction === 'out').reduce((n, e) => n + e.amountCents, 0)
  const depositPaid = entries.filter((e) => e.kind === 'deposit').reduce((n, e) => n + e.amountCents, 0)
  return { entries, paidIn, refunded, depositPaid, net: paidIn - refunded }
}

/**
 * The hosted checkout page for a request's deposit or balance: the open one if there is one, else a
 * new Checkout Session. The idempotency key counts earlier sessions, so a retry of the same attempt
 * (by the job or the route) gets the same session back from Stripe.
 */
export async function openCheckout(
  ctx: AppContext,
  requestId: string,
  purpose: 'deposit' | 'balance',
  amountCents: number,
): Promise<Payment> {
  const rc = await loadRequest(ctx.db.manager, requestId)
  const payments = ctx.db.getRepository(Payment)
  const open = await payments.findOne({ where: { requestId, purpose, status: 'open' }, order: { createdAt: 'DESC' } })
  if (open && open.expiresAt.getTime() > Date.now() + 5 * 60_000 && open.amountCents === amountCents) return open
  if (amountCents <= 0) throw conflict('Nothing is owed.', 'nothing-owed')
  const attempt = await payments.count({ where: { requestId, purpose } })
  const currency = (rc.request.quote?.currency ?? rc.studio.currency).toLowerCase()
  const base = `${ctx.config.publicUrl}/requests/${requestId}`
  const session = await stripeFor(ctx.config).checkout.sessions.create(
    {
      mode: 'payment',
      line_items: [
        {
          quantity: 1,
          price_data: {
            currency,
            unit_amount: amountCents,
            product_data: { name: `${purpose === 'deposit' ? 'Deposit' : 'Balance'}: ${rc.kiln.name} firing at ${rc.studio.name}` },
          },
        },
      ],
      success_url: `${base}?paid=${purpose}&session={CHECKOUT_SESSION_ID}`,
      cancel_url: `${base}?unpaid=${purpose}`,
      client_reference_id: requestId,
      customer_email: rc.potter.email,
      metadata: { requestId, purpose },
      payment_intent_data: { metadata: { requestId, purpose } },
      expires_at: Math.floor(Date.now() / 1000) + CHECKOUT_LIFETIME_S,
    },
    { idempotencyKey: `${purpose}:${requestId}:${attempt}:${amountCents}` },
  )
  if (open && open.stripeSessionId !== session.id) await payments.update(open.id, { status: 'expired' })
  // The job and the route may open the same attempt at once: Stripe answers both with one session
  // (same idempotency key) and the first to record it wins.
  await payments
    .createQueryBuilder()
    .insert()
    .values({
      requestId,
      purpose,
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

/** Queues the deposit's checkout session so it exists by the time the potter opens the request. */
export async function enqueueOpenCheckout(manager: EntityManager, requestId: string, purpose: 'deposit' | 'balance', amountCents: number) {
  await enqueueJob(manager, OPEN_CHECKOUT_TASK, { requestId, purpose, amountCents }, { jobKey: `checkout:${purpose}:${requestId}` })
}

/**
 * Queues a refund of up to `amountCents` of what was paid for a request, in the caller's transaction.
 * The worker makes it through Stripe, payment by payment, with idempotency keys, and books it.
 */
export async function enqueueRefund(manager: EntityManager, requestId: string, amountCents: number, reason: string) {
  if (amountCents <= 0) return
  await enqueueJob(manager, REFUND_TASK, { requestId, amountCents, reason, key: `${requestId}:${Date.now()}` })
}

/** Makes a queued refund: splits it over the request's paid payments, newest first. */
export async function makeRefund(ctx: AppContext, payload: { requestId: string; amountCents: number; reason: string; key: string }) {
  const stripe = stripeFor(ctx.config)
  const paid = await ctx.db
    .getRepository(Payment)
    .find({ where: { requestId: payload.requestId, status: 'paid' }, order: { createdAt: 'DESC' } })
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
    const rc = await loadRequest(manager, requestId)
    await queueMail(manager, rc.potter.email, 'refunded', refundedMail(factsOf(rc, ctx.config.publicUrl), refund.amount))
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

const metadataOf = (object: { metadata?: Stripe.Metadata | null }) => ({
  requestId: object.metadata?.requestId ?? null,
  purpose: (object.metadata?.purpose ?? null) as 'deposit' | 'balance' | null,
})

/**
 * Handles one verified Stripe event, once. Events may come twice, late or out of order: each is
 * recorded by id in the same transaction as its effects, and each effect checks the state it finds.
 */
export async function handleStripeEvent(ctx: AppContext, event: Stripe.Event): Promise<'handled' | 'duplicate'> {
  return ctx.db.transaction(async (manager) => {
    const recorded: unknown[] = await manager.query(
      `INSERT INTO stripe_events (id, type, payload) VALUES ($1, $2, $3) ON CONFLICT (id) DO NOTHING RETURNING id`,
      [event.id, event.type, JSON.stringify(event)],
    )
    if (!recorded.length) return 'duplicate'

    switch (event.type) {
      case 'checkout.session.completed': {
        const session = event.data.object
        if (session.payment_status !== 'paid') break
        const payment = await manager
          .getRepository(Payment)
          .findOne({ where: { stripeSessionId: session.id }, lock: { mode: 'pessimistic_write' } })
        const { requestId, purpose } = metadataOf(session)
        if (!payment || !requestId || !purpose || payment.status === 'paid') break
        const paymentIntentId = typeof session.payment_intent === 'string' ? session.payment_intent : (session.payment_intent?.id ?? null)
        await manager.update(Payment, payment.id, { status: 'paid', stripePaymentIntentId: paymentIntentId })
        payment.status = 'paid'
        payment.stripePaymentIntentId = paymentIntentId
        await manager.getRepository(LedgerEntry).save({
          requestId,
          direction: 'in',
          kind: purpose,
          amountCents: session.amount_total ?? payment.amountCents,
          currency: (session.currency ?? payment.currency).toUpperCase(),
          stripeSessionId: session.id,
          stripePaymentIntentId: paymentIntentId,
          stripeRefundId: null,
          note: '',
        })
        const rc = await loadRequest(manager, requestId, { lock: true })
        if (purpose === 'deposit') await settleDeposit(ctx, manager, rc, payment)
        else await settleBalance(ctx, manager, rc, payment)
        break
      }
      case 'checkout.session.expired': {
        await manager.getRepository(Payment).update({ stripeSessionId: event.data.object.id, status: 'open' }, { status: 'expired' })
        break
      }
      case 'payment_intent.payment_failed': {
        const intent = event.data.object
        const { requestId, purpose } = metadataOf(intent)
        if (!requestId || !purpose) break
        await manager
          .getRepository(Payment)
          .update(
            { requestId, purpose, status: 'open' },
            { failureMessage: intent.last_payment_error?.message ?? 'The card was declined.' },
          )
        break
      }
      case 'payment_intent.succeeded':
        // The checkout session's own event books the money; this one only ties the intent to the payment.
        break
      case 'charge.refunded': {
        const charge = event.data.object
        const intentId = typeof charge.payment_intent === 'string' ? charge.payment_intent : charge.payment_intent?.id
        const payment = intentId ? await manager.getRepository(Payment).findOne({ where: { stripePaymentIntentId: intentId } }) : null
        if (!payment) break
        // A refund made outside Conewright (in Stripe's dashboard, say) is booked here; ours already are.
        const refunds = charge.refunds?.data ?? []
        const known = await manager.getRepository(LedgerEntry).find({ where: { stripeRefundId: In(refunds.map((r) => r.id)) } })
        for (const refund of refunds.filter((r) => !known.some((k) => k.stripeRefundId === r.id))) {
          await manager.getRepository(LedgerEntry).save({
            requestId: payment.requestId,
            direction: 'out',
            kind: 'refund',
            amountCents: refund.amount,
            currency: refund.currency.toUpperCase(),
            stripeRefundId: refund.id,
            stripePaymentIntentId: intentId!,
            stripeSessionId: null,
            note: 'Refunded in Stripe',
          })
        }
        break
      }
      default:
        break
    }
    return 'handled'
  })
}

/** A paid deposit confirms the space, or, when it came after the request ended, goes straight back. */
async function settleDeposit(ctx: AppContext, manager: EntityManager, rc: RequestContext, payment: Payment) {
  if (rc.request.state === 'accepted') {
    await moveRequest(manager, rc.request, 'deposit_paid', null, 'Deposit paid through Stripe', { sessionId: payment.stripeSessionId })
    const facts = factsOf(rc, ctx.config.publicUrl)
    await queueMail(manager, rc.potter.email, 'deposit-received', depositReceivedMail(facts, 'potter', payment.amountCents))
    for (const person of await studioPeople(manager, rc.studio.id)) {
      await queueMail(manager, person.email, 'deposit-received', depositReceivedMail(facts, 'studio', payment.amountCents))
    }
    await enqueueStudioSync(manager, rc.studio.id)
  } else {
    await enqueueRefund(manager, rc.request.id, payment.amountCents, `Deposit arrived after the request was ${rc.request.state}`)
  }
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
