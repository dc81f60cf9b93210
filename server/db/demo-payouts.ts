// The demo's money, made through Stripe after start (the local stand-in under `npm start`): the
// community studio's owner has finished onboarding, and the collected past firings were paid by card.
// The community studio's share is then transferred by the app's own payout run, less the fee; the gas
// works has not onboarded, so its share waits and its money page shows what it is owed.
//
// Stripe's Express onboarding is a page a person fills in; for the demo, Marisol "fills" the
// stand-in's hosted test page with its succeeding test values, over HTTP, as a browser would. The
// card payments are server-side test payments (`pm_card_visa`). Nothing here runs against a real
// Stripe account: without the stand-in it is skipped. Running it again changes nothing.
import type { EntityManager } from 'typeorm'
import type { AppContext } from '../context'
import { LedgerEntry } from '../entities/LedgerEntry'
import { PayoutAccount } from '../entities/PayoutAccount'
import { Studio } from '../entities/Studio'
import { User } from '../entities/User'
import { loadRequest } from '../services/request-context'
import { earnPayout, refreshAccount, startOnboarding, transferGroupOf } from '../services/payouts'
import { stripeFor } from '../services/stripe'
import { DEMO_PAID_ONLINE } from './demo-requests'
import { demoClaimsToPay } from './demo-incidents'
import type { Claim } from '../entities/Claim'
import { bookClaimPaid } from '../services/claims'
import { requestAction } from '../services/request-door'

/** The demo studio that has finished onboarding, and who did it. */
const ONBOARDED = { studio: 'Alder Street Clay Commons', owner: 'marisol.okafor@demo.conewright.test' }

// The stand-in's succeeding test values (its hosted onboarding page lists them); a made-up person.
const ONBOARDING_FORM = {
  businessType: 'individual',
  firstName: 'Marisol',
  lastName: 'Okafor',
  dob: '1901-01-01',
  ssnLast4: '0000',
  addressLine1: '2318 SE Alder St',
  postalCode: '97214',
  routingNumber: '110000000',
  accountNumber: '000123456789',
  tosAccepted: 'on',
}

async function demoRequestId(manager: EntityManager, key: string): Promise<string | null> {
  const rows: { request_id: string }[] = await manager.query(`SELECT request_id FROM request_events WHERE data->>'demoKey' = $1 LIMIT 1`, [
    key,
  ])
  return rows[0]?.request_id ?? null
}

async function onboardDemoStudio(ctx: AppContext) {
  const studio = await ctx.db.getRepository(Studio).findOneBy({ name: ONBOARDED.studio })
  const owner = await ctx.db.getRepository(User).findOneBy({ email: ONBOARDED.owner })
  if (!studio || !owner) return
  const existing = await ctx.db.getRepository(PayoutAccount).findOne({ where: { studioId: studio.id } })
  if (existing?.transfersStatus === 'active') return
  const { url } = await startOnboarding(ctx, studio.id, owner)
  const filled = await fetch(url, {
    method: 'POST',
    headers: { 'Content-Type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams(ONBOARDING_FORM),
    redirect: 'manual',
  })
  if (filled.status !== 303) throw new Error(`the stand-in's onboarding page answered ${filled.status}`)
  await refreshAccount(ctx, studio.id)
}

/** Pays a collected demo request by card, deposit and balance, and books it as the webhook would. */
async function payDemoRequest(ctx: AppContext, requestId: string) {
  const paid = await ctx.db.getRepository(LedgerEntry).count({ where: { requestId } })
  if (paid > 0) return
  const rc = await loadRequest(ctx.db.manager, requestId)
  const quote = rc.request.standingQuote ?? rc.request.quote
  if (!quote) return
  const deposit = rc.request.depositAskedCents ?? quote.depositCents
  const stripe = stripeFor(ctx.config)
  const charges: { kind: 'deposit' | 'balance'; amount: number }[] = [
    { kind: 'deposit', amount: deposit },
    { kind: 'balance', amount: quote.totalCents - deposit },
  ]
  const made: { kind: 'deposit' | 'balance'; amount: number; intent: string }[] = []
  for (const { kind, amount } of charges.filter((c) => c.amount > 0)) {
    const intent = await stripe.paymentIntents.create(
      {
        amount,
        currency: quote.currency.toLowerCase(),
        payment_method: 'pm_card_visa',
        allowed_payment_method_types: ['card'],
        confirm: true,
        receipt_email: rc.potter.email,
        transfer_group: transferGroupOf(requestId),
        metadata: { requestId, purpose: kind },
      },
      { idempotencyKey: `demo:${kind}:${requestId}` },
    )
    made.push({ kind, amount, intent: intent.id })
  }
  await ctx.db.transaction(async (manager) => {
    for (const { kind, amount, intent } of made) {
      await manager.getRepository(LedgerEntry).save({
        requestId,
        direction: 'in',
        kind,
        amountCents: amount,
        currency: quote.currency,
        stripeSessionId: null,
        stripePaymentIntentId: intent,
        stripeRefundId: null,
        note: kind === 'deposit' ? 'Deposit paid by card' : 'Balance paid by card',
      })
    }
    const locked = await loadRequest(manager, requestId, { lock: true })
    await earnPayout({ ctx, manager, rc: locked })
    // Earned when the ware was ready to collect, days ago: that is its month on the statement.
    await manager.query(`UPDATE request_payouts SET earned_at = $2 WHERE request_id = $1`, [requestId, locked.firing.readyBy])
  })
}

export async function seedDemoPayouts(ctx: AppContext) {
  if (!ctx.config.stripeApiBase) {
    ctx.log.info('demo payouts are made on the local Stripe stand-in only; skipped')
    return
  }
  await onboardDemoStudio(ctx)
  for (const key of DEMO_PAID_ONLINE) {
    const id = await demoRequestId(ctx.db.manager, key)
    if (id) await payDemoRequest(ctx, id)
  }
  for (const claim of await demoClaimsToPay(ctx)) await payDemoClaim(ctx, claim)
}

/** Pays the demo's damage claim by card, and books it as the webhook would. */
async function payDemoClaim(ctx: AppContext, claim: Claim) {
  const rc = await loadRequest(ctx.db.manager, claim.requestId)
  const intent = await stripeFor(ctx.config).paymentIntents.create(
    {
      amount: claim.amountCents,
      currency: claim.currency.toLowerCase(),
      payment_method: 'pm_card_visa',
      allowed_payment_method_types: ['card'],
      confirm: true,
      receipt_email: rc.potter.email,
      transfer_group: transferGroupOf(claim.requestId),
      metadata: { requestId: claim.requestId, purpose: 'claim', claimId: claim.id },
    },
    { idempotencyKey: `demo:claim:${claim.id}` },
  )
  await requestAction(ctx, null, claim.requestId, 'claim', (step) =>
    bookClaimPaid(step, claim.id, { sessionId: null, paymentIntentId: intent.id }),
  )
}
