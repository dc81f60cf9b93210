// A card kept at the deposit. When the potter asks, the deposit's checkout page saves the card on the
// potter's Stripe Customer for payments without them at the card (setup_future_usage off_session); it then
// pays a damage claim on that ask that the potter accepts, in one click and with no second checkout page.
// It is never charged for anything the potter has not accepted, and the potter can forget it at any time.
import { IsNull, type EntityManager } from 'typeorm'
import Stripe from 'stripe'
import type { KeptCardJson } from '../../shared/api/requests'
import { cardLabel } from '../../shared/payments'
import type { AppContext } from '../context'
import { KeptCard } from '../entities/KeptCard'
import type { User } from '../entities/User'
import { HttpError, forbidden, conflict } from '../http/errors'
import { enqueueJob } from '../jobs/queue'
import { requestAction } from './request-door'
import { stripeFor } from './stripe'

export const KEEP_CARD_TASK = 'keep-card'

/** A kept card that can be charged: Stripe has attached it and the potter has not forgotten it. */
export type CardOnFile = KeptCard & { stripePaymentMethodId: string; keptAt: Date }

/** The card as people name it: "Visa ending 4242". */
export const keptCardLabel = (card: Pick<KeptCard, 'brand' | 'last4'>) => cardLabel(card.brand, card.last4)

/** The potter's Stripe Customer: the one an earlier kept card made, or a new one. */
export async function customerFor(ctx: AppContext, potter: Pick<User, 'id' | 'email' | 'displayName'>): Promise<string> {
  const earlier = await ctx.db.getRepository(KeptCard).findOne({ where: { userId: potter.id }, order: { agreedAt: 'DESC' } })
  if (earlier) return earlier.stripeCustomerId
  const customer = await stripeFor(ctx.config).customers.create(
    { email: potter.email, name: potter.displayName, metadata: { userId: potter.id } },
    // Two tabs asking at once get one Customer.
    { idempotencyKey: `customer:${potter.id}` },
  )
  return customer.id
}

/** Records the potter's agreement, before the page that keeps the card is opened. */
export async function agreeToKeepCard(manager: EntityManager, requestId: string, userId: string, customerId: string) {
  await manager.query(
    `INSERT INTO kept_cards (request_id, user_id, stripe_customer_id) VALUES ($1, $2, $3)
     ON CONFLICT (request_id) DO UPDATE SET stripe_customer_id = EXCLUDED.stripe_customer_id, agreed_at = now()
     WHERE kept_cards.stripe_payment_method_id IS NULL`,
    [requestId, userId, customerId],
  )
}

/**
 * After a deposit paid on a page that keeps the card: once the checkout has completed, in the webhook's
 * transaction, the card is looked up by a queued job (no network call inside the transaction). A deposit
 * paid on a plain page drops an agreement that was never used.
 */
export async function afterDepositPaid(manager: EntityManager, requestId: string, keepsCard: boolean, paymentIntentId: string | null) {
  if (keepsCard && paymentIntentId) {
    await enqueueJob(manager, KEEP_CARD_TASK, { requestId, paymentIntentId }, { jobKey: `keep-card:${requestId}` })
    return
  }
  await manager.query(`DELETE FROM kept_cards WHERE request_id = $1 AND stripe_payment_method_id IS NULL`, [requestId])
}

/** The queued job: reads the card Stripe attached and keeps what a person recognises it by. */
export async function keepCard(ctx: AppContext, payload: { requestId: string; paymentIntentId: string }) {
  const stripe = stripeFor(ctx.config)
  const row = await ctx.db.getRepository(KeptCard).findOneBy({ requestId: payload.requestId })
  if (!row || row.stripePaymentMethodId) return
  const intent = await stripe.paymentIntents.retrieve(payload.paymentIntentId)
  const methodId = typeof intent.payment_method === 'string' ? intent.payment_method : (intent.payment_method?.id ?? null)
  const customerId = typeof intent.customer === 'string' ? intent.customer : (intent.customer?.id ?? null)
  if (!methodId || customerId !== row.stripeCustomerId) {
    ctx.log.warn(`deposit ${payload.paymentIntentId} for ${payload.requestId} was not kept on the potter's Customer; no card kept`)
    return
  }
  const { card } = await stripe.paymentMethods.retrieve(methodId)
  const named = { brand: card?.brand ?? null, last4: card?.last4 ?? null }
  await requestAction(ctx, null, payload.requestId, 'kept-card', async (step) => {
    const { affected } = await step.manager.update(
      KeptCard,
      { requestId: payload.requestId, stripePaymentMethodId: IsNull(), forgottenAt: IsNull() },
      { stripePaymentMethodId: methodId, ...named, keptAt: new Date() },
    )
    if (affected) await step.note(`The potter’s card (${keptCardLabel(named)}) is kept for damage claims they accept`)
  })
}

/** The card kept for an ask, as the potter sees it; null when there is none or it was forgotten. */
export async function keptCardOf(manager: EntityManager, requestId: string): Promise<CardOnFile | null> {
  const row = await manager.getRepository(KeptCard).findOneBy({ requestId })
  return row?.stripePaymentMethodId && row.keptAt && !row.forgottenAt ? (row as CardOnFile) : null
}

export async function keptCardView(manager: EntityManager, requestId: string): Promise<KeptCardJson | null> {
  const row = await keptCardOf(manager, requestId)
  return row && { label: keptCardLabel(row), keptAt: row.keptAt.toISOString() }
}

/** The potter forgets the card: detached from their Customer at Stripe, and never charged again. */
export async function forgetKeptCard(ctx: AppContext, potter: User, requestId: string) {
  const row = await requestAction(ctx, potter, requestId, 'kept-card', async (step) => {
    if (step.viewer.side !== 'potter') throw forbidden('Only the potter can forget their card.')
    const kept = await keptCardOf(step.manager, requestId)
    if (!kept) throw conflict('No card is kept for this ask.', 'no-kept-card')
    await step.manager.update(KeptCard, { requestId }, { forgottenAt: new Date() })
    await step.note(`The potter asked us to forget their card (${keptCardLabel(kept)})`)
    return kept
  })
  // Stripe is asked outside the transaction; a card already detached there is as good as forgotten.
  try {
    await stripeFor(ctx.config).paymentMethods.detach(row.stripePaymentMethodId)
  } catch (error) {
    if (!(error instanceof Stripe.errors.StripeInvalidRequestError)) throw error
  }
}

/** What a refused payment on the kept card tells the potter: why, and that a checkout page still works. */
export function keptCardRefusal(error: Stripe.errors.StripeCardError): HttpError {
  const why =
    error.code === 'authentication_required'
      ? 'Your bank wants you to confirm this payment yourself.'
      : (error.message ?? 'Your card was declined.')
  return new HttpError(402, 'card-declined', `${why} Pay it on a checkout page instead.`)
}
