// Damage claims: the studio's owner raises one on the potter whose ware caused an incident, within the
// studio's terms (shared/claims.ts); the potter pays it through a checkout page on the ask, or with the
// card they kept at the deposit (charged off-session, once they accept), so it joins the ask's ledger
// and the studio's payout; or contests it; the front desk upholds or waives a contested one. Every step
// goes through the ask's one door: a timeline entry and the other side told.
import type { EntityManager } from 'typeorm'
import Stripe from 'stripe'
import type { ClaimJson, ClaimPayAnswer } from '../../shared/api/incidents'
import {
  claimActions,
  claimAmountProblem,
  CLAIM_STATUS_LABELS,
  DAMAGE_CHARGE_LABELS,
  damageChargesOf,
  type ClaimAction,
} from '../../shared/claims'
import { formatMoney } from '../../shared/dates'
import { earnsPayout } from '../../shared/payouts'
import type { ClaimBody, ClaimDecisionBody, ClaimPayBody } from '../../shared/schemas/incidents'
import type { AppContext } from '../context'
import { Claim } from '../entities/Claim'
import { LedgerEntry } from '../entities/LedgerEntry'
import { Payment } from '../entities/Payment'
import type { User } from '../entities/User'
import { badRequest, conflict, forbidden, notFound } from '../http/errors'
import { isUuid } from '../http/validate'
import { claimContestedMail, claimDecidedMail, claimPaidMail, claimRaisedMail, type ClaimFacts } from '../mail/templates/incidents'
import { loadIncident } from './incident-access'
import { keptCardLabel, keptCardOf, keptCardRefusal, type CardOnFile } from './kept-cards'
import { openCheckout } from './payments'
import { transferGroupOf } from './payouts'
import { stripeFor } from './stripe'
import { earnPayout } from './payouts'
import { askCurrency, factsOf } from './request-context'
import { requestAction, type ActionStep } from './request-door'

const claimFacts = (claim: Claim): ClaimFacts => ({
  chargeLabel: DAMAGE_CHARGE_LABELS[claim.chargeKind],
  amountCents: claim.amountCents,
  currency: claim.currency,
  note: claim.note,
})

const incidentUrl = (ctx: AppContext, claim: Pick<Claim, 'incidentId'>) => `${ctx.config.publicUrl}/incidents/${claim.incidentId}`

export function claimJson(
  claim: Claim,
  names: { potter: string; studio: string },
  side: 'potter' | 'studio' | 'admin',
  keptCard: string | null = null,
): ClaimJson {
  const actions = claimActions(claim.status, side)
  return {
    id: claim.id,
    incidentId: claim.incidentId,
    requestId: claim.requestId,
    chargeKind: claim.chargeKind,
    chargeLabel: DAMAGE_CHARGE_LABELS[claim.chargeKind],
    amountCents: claim.amountCents,
    currency: claim.currency,
    note: claim.note,
    status: claim.status,
    statusLabel: CLAIM_STATUS_LABELS[claim.status],
    contestReason: claim.contestReason,
    deskNote: claim.deskNote,
    potterName: names.potter,
    studioName: names.studio,
    actions,
    keptCard: side === 'potter' && actions.includes('pay') ? keptCard : null,
    at: claim.createdAt.toISOString(),
    paidAt: claim.paidAt?.toISOString() ?? null,
  }
}

async function namesOfClaimRequest(manager: EntityManager, requestId: string) {
  const [row]: { potter: string; studio: string }[] = await manager.query(
    `SELECT u.display_name AS potter, s.name AS studio FROM firing_requests r JOIN users u ON u.id = r.potter_id
     JOIN firings f ON f.id = r.firing_id JOIN kilns k ON k.id = f.kiln_id JOIN studios s ON s.id = k.studio_id WHERE r.id = $1`,
    [requestId],
  )
  return row
}

async function keptCardNameOf(manager: EntityManager, requestId: string) {
  const kept = await keptCardOf(manager, requestId)
  return kept && keptCardLabel(kept)
}

export async function claimsOfIncident(manager: EntityManager, incidentId: string, side: 'potter' | 'studio' | 'admin') {
  const claims = await manager.getRepository(Claim).find({ where: { incidentId }, order: { createdAt: 'ASC' } })
  if (!claims.length) return []
  const names = await namesOfClaimRequest(manager, claims[0].requestId)
  const kept = side === 'potter' ? await keptCardNameOf(manager, claims[0].requestId) : null
  return claims.map((c) => claimJson(c, names, side, kept))
}

/** The studio's owner raises a claim on the potter whose ware failed, within the studio's terms. */
export async function raiseClaim(ctx: AppContext, user: User, incidentId: string, body: ClaimBody): Promise<ClaimJson> {
  const { incident } = await loadIncident(ctx.db.manager, incidentId)
  return requestAction(ctx, user, incident.requestId, 'claim', async (step) => {
    if (step.viewer.side === 'potter') throw forbidden('Only the studio raises a damage claim.')
    if (step.viewer.side !== 'studio' || step.viewer.role !== 'owner') throw forbidden('Only the studio’s owner raises a damage claim.')
    const problem = claimAmountProblem(damageChargesOf(step.rc.studio.policies), body.chargeKind, body.amountCents)
    if (problem) throw badRequest(problem, { amountCents: problem }, 'over-terms')
    const open: unknown[] = await step.manager.query(
      `SELECT 1 FROM claims WHERE incident_id = $1 AND charge_kind = $2 AND status <> 'waived'`,
      [incidentId, body.chargeKind],
    )
    if (open.length) throw conflict('This incident already has a claim for that charge.', 'claim-exists')
    const currency = askCurrency(step.rc.request, step.rc.studio)
    const claim = await step.manager.getRepository(Claim).save({
      incidentId,
      requestId: incident.requestId,
      raisedBy: user.id,
      chargeKind: body.chargeKind,
      amountCents: body.amountCents,
      currency,
      note: body.note,
      status: 'raised' as const,
      contestReason: null,
      deskNote: null,
      paidAt: null,
    })
    await step.note(
      `Damage claim raised: ${DAMAGE_CHARGE_LABELS[claim.chargeKind].toLowerCase()}, ${formatMoney(claim.amountCents, currency)}`,
      { claimId: claim.id, incidentId },
    )
    await step.tellPotter(
      'claim-raised',
      claimRaisedMail(
        factsOf(step.rc, ctx.config.publicUrl),
        claimFacts(claim),
        incidentUrl(ctx, claim),
        await keptCardNameOf(step.manager, claim.requestId),
      ),
    )
    return claimJson(claim, { potter: step.rc.potter.displayName, studio: step.rc.studio.name }, 'studio')
  })
}

async function loadClaim(manager: EntityManager, id: string) {
  if (!isUuid(id)) throw notFound('That claim')
  const claim = await manager.getRepository(Claim).findOne({ where: { id } })
  if (!claim) throw notFound('That claim')
  return claim
}

/** A claim action through the ask's door, with the claim read again under the ask's lock and checked against its table. */
async function claimStep<T>(
  ctx: AppContext,
  user: User | null,
  claimId: string,
  action: ClaimAction,
  apply: (step: ActionStep, claim: Claim) => Promise<T>,
): Promise<T> {
  const unlocked = await loadClaim(ctx.db.manager, claimId)
  return requestAction(ctx, user, unlocked.requestId, 'claim', async (step) => {
    const claim = await step.manager.getRepository(Claim).findOneOrFail({ where: { id: claimId }, lock: { mode: 'pessimistic_write' } })
    const side = step.viewer.side === 'system' ? 'admin' : step.viewer.side
    if (!claimActions(claim.status, side).includes(action)) {
      const anyStatus = (['raised', 'contested', 'upheld'] as const).some((s) => claimActions(s, side).includes(action))
      if (!anyStatus)
        throw forbidden(
          action === 'uphold' || action === 'waive'
            ? 'Only the front desk decides a contested claim.'
            : 'Only the potter pays or contests a claim.',
        )
      throw conflict(`This claim stands at “${CLAIM_STATUS_LABELS[claim.status]}”; that cannot be done now.`, 'bad-claim-state', {
        status: claim.status,
      })
    }
    return apply(step, claim)
  })
}

/**
 * The potter agrees to pay: on the checkout page for the claim, or at once with the card kept at the
 * deposit. Either way the money is on the ask, so it joins the ask's ledger and the studio's payout.
 */
export async function acceptClaim(ctx: AppContext, user: User, claimId: string, body: ClaimPayBody): Promise<ClaimPayAnswer> {
  const { claim, card } = await claimStep(ctx, user, claimId, 'pay', async (step, claim) => {
    const card = body.with === 'kept-card' ? await keptCardOf(step.manager, claim.requestId) : null
    if (body.with === 'kept-card' && !card) throw conflict('No card is kept for this ask; pay on a checkout page.', 'no-kept-card')
    // Coming back to pay after leaving the checkout page, or after a declined card, is the same agreement: noted once.
    const agreedBefore = claim.cardTries > 0 || (await step.manager.getRepository(Payment).exists({ where: { claimId } }))
    if (!agreedBefore)
      await step.note(`The potter agreed to pay the damage claim (${formatMoney(claim.amountCents, claim.currency)})`, { claimId })
    return { claim, card }
  })
  if (card) return { claim: await payWithKeptCard(ctx, claim, card) }
  // Stripe is asked outside the transaction: no lock is held across a network call.
  const payment = await openCheckout(ctx, claim.requestId, 'claim', claim.amountCents, {
    claim: {
      claimId: claim.id,
      label: `Damage claim: ${DAMAGE_CHARGE_LABELS[claim.chargeKind]}`,
      returnPath: `/incidents/${claim.incidentId}`,
    },
  })
  return { checkoutUrl: payment.checkoutUrl }
}

/**
 * Charges the kept card off-session. The key counts declined tries, so a retry of one try (a double
 * click, a lost answer) is the same payment at Stripe, and a try after a decline is a new one.
 */
async function payWithKeptCard(ctx: AppContext, claim: Claim, card: CardOnFile): Promise<ClaimJson> {
  const label = keptCardLabel(card)
  // `paidWith` tells the webhook this payment has no checkout page to book it (see payments.ts).
  const metadata = { requestId: claim.requestId, purpose: 'claim', claimId: claim.id, paidWith: 'kept-card' }
  let intent: Stripe.PaymentIntent
  try {
    intent = await stripeFor(ctx.config).paymentIntents.create(
      {
        amount: claim.amountCents,
        currency: claim.currency.toLowerCase(),
        customer: card.stripeCustomerId,
        payment_method: card.stripePaymentMethodId,
        off_session: true,
        confirm: true,
        description: `Damage claim: ${DAMAGE_CHARGE_LABELS[claim.chargeKind]}`,
        metadata,
        transfer_group: transferGroupOf(claim.requestId),
      },
      { idempotencyKey: `claim-card:${claim.id}:${claim.cardTries}` },
    )
  } catch (error) {
    if (!(error instanceof Stripe.errors.StripeCardError)) throw error
    await requestAction(ctx, null, claim.requestId, 'claim', async (step) => {
      await step.manager.increment(Claim, { id: claim.id, cardTries: claim.cardTries }, 'cardTries', 1)
      await step.note(`The kept card (${label}) was declined for the damage claim: ${error.message}`, {
        claimId: claim.id,
      })
    })
    throw keptCardRefusal(error)
  }
  await requestAction(ctx, null, claim.requestId, 'claim', (step) =>
    bookClaimPaid(step, claim.id, { sessionId: null, paymentIntentId: intent.id, card: label }),
  )
  const paid = await ctx.db.getRepository(Claim).findOneByOrFail({ id: claim.id })
  return claimJson(paid, await namesOfClaimRequest(ctx.db.manager, paid.requestId), 'potter')
}

export async function contestClaim(ctx: AppContext, user: User, claimId: string, reason: string): Promise<ClaimJson> {
  return claimStep(ctx, user, claimId, 'contest', async (step, claim) => {
    claim.status = 'contested'
    claim.contestReason = reason
    await step.manager.update(Claim, claim.id, { status: 'contested', contestReason: reason })
    await step.note(`The potter contested the damage claim; it goes to the front desk: ${reason}`, { claimId })
    await step.tellStudio(
      'claim-contested',
      claimContestedMail(factsOf(step.rc, ctx.config.publicUrl), claimFacts(claim), reason, incidentUrl(ctx, claim)),
    )
    return claimJson(claim, { potter: step.rc.potter.displayName, studio: step.rc.studio.name }, 'potter')
  })
}

/** The front desk upholds a contested claim (the potter is asked to pay) or waives it (closed). */
export async function decideClaim(ctx: AppContext, admin: User, claimId: string, body: ClaimDecisionBody): Promise<ClaimJson> {
  return claimStep(ctx, admin, claimId, body.decision, async (step, claim) => {
    claim.status = body.decision === 'uphold' ? 'upheld' : 'waived'
    claim.deskNote = body.note
    await step.manager.update(Claim, claim.id, { status: claim.status, deskNote: body.note })
    await step.note(
      `The front desk ${body.decision === 'uphold' ? 'upheld' : 'waived'} the damage claim${body.note ? `: ${body.note}` : ''}`,
      {
        claimId,
      },
    )
    const mail = claimDecidedMail(
      factsOf(step.rc, ctx.config.publicUrl),
      claimFacts(claim),
      body.decision,
      body.note,
      incidentUrl(ctx, claim),
    )
    await step.tellPotter('claim-decided', mail)
    await step.tellStudio('claim-decided', mail)
    return claimJson(claim, { potter: step.rc.potter.displayName, studio: step.rc.studio.name }, 'admin')
  })
}

/**
 * A paid claim, inside the ask's door (the webhook's checkout session, or the demo's card payment):
 * booked on the ask's ledger as a claim, the claim marked paid, both sides told, and, when the ask's
 * share is already earned, the studio's part of it earned with it (the payout rules, hold and all).
 */
export async function bookClaimPaid(
  step: ActionStep,
  claimId: string,
  stripe: { sessionId: string | null; paymentIntentId: string | null; card?: string },
) {
  const { manager, ctx } = step
  const claim = await manager.getRepository(Claim).findOneOrFail({ where: { id: claimId }, lock: { mode: 'pessimistic_write' } })
  if (claim.status === 'paid') return
  await manager.getRepository(LedgerEntry).save({
    requestId: claim.requestId,
    direction: 'in',
    kind: 'claim',
    amountCents: claim.amountCents,
    currency: claim.currency,
    stripeSessionId: stripe.sessionId,
    stripePaymentIntentId: stripe.paymentIntentId,
    stripeRefundId: null,
    note: `Damage claim: ${DAMAGE_CHARGE_LABELS[claim.chargeKind]}`,
  })
  await manager.update(Claim, claim.id, { status: 'paid', paidAt: new Date() })
  await step.note(
    `Damage claim paid through Stripe${stripe.card ? ` with the kept card (${stripe.card})` : ''}: ${formatMoney(claim.amountCents, claim.currency)}`,
    {
      claimId: claim.id,
      sessionId: stripe.sessionId,
    },
  )
  const mail = claimPaidMail(factsOf(step.rc, ctx.config.publicUrl), claimFacts(claim), incidentUrl(ctx, claim))
  await step.tellStudio('claim-paid', mail)
  await step.tellPotter('claim-paid', mail)
  // An ask already earned (collected, or ended with money the studio keeps) earns the claim's share
  // with it; one still in hand carries the claim's money to its collection.
  if (earnsPayout(step.rc.request.state)) await earnPayout(step)
}

/** Contested claims for the front desk, with both sides' words and the incident they rest on. */
export async function deskClaims(ctx: AppContext): Promise<ClaimJson[]> {
  const manager = ctx.db.manager
  const claims = await manager.getRepository(Claim).find({ where: { status: 'contested' }, order: { updatedAt: 'ASC' }, take: 100 })
  const out: ClaimJson[] = []
  for (const claim of claims) out.push(claimJson(claim, await namesOfClaimRequest(manager, claim.requestId), 'admin'))
  return out
}
