// From drop-off to pickup: check-in (or refusal at the door), a price raised by the measured ware
// and the potter's answer, results, ready, the balance, collection. Every action goes through the
// one door (request-door.ts).
import type { EntityManager } from 'typeorm'
import { mmToIn } from '../../shared/firing/units'
import { refundUnderTerms } from '../../shared/refunds'
import type { AppContext } from '../context'
import { CheckIn, type ReceivedPiece } from '../entities/CheckIn'
import { FiringRequest } from '../entities/FiringRequest'
import { LedgerEntry } from '../entities/LedgerEntry'
import { RequestResult, type PieceOutcome } from '../entities/RequestResult'
import type { User } from '../entities/User'
import { HttpError } from '../http/errors'
import {
  dropOffMail,
  paymentReceivedMail,
  pickupMail,
  priceAnsweredMail,
  priceDeclinedPotterMail,
  readyMail,
  refusedMail,
} from '../mail/templates/pickup'
import { firingLogJson } from './firing-log'
import { enqueueExpireCheckouts, enqueueRefund, moneyOf } from './payments'
import { factsOf, type RequestContext } from './request-context'
import { requestAction } from './request-door'
import { checkAgainstFiring, recordCounterRefundDue } from './requests'
import { enqueueStudioSync } from './search-sync'

const describeSize = (m: { heightMm: number; widthMm: number; depthMm: number }) =>
  `${mmToIn(m.heightMm).toFixed(1)} × ${mmToIn(m.widthMm).toFixed(1)} × ${mmToIn(m.depthMm).toFixed(1)} in`

export interface CheckInBody {
  pieces: { pieceIndex: number; received: number; measured?: { heightMm: number; widthMm: number; depthMm: number } }[]
  conditionNotes?: string
  refuse?: { reason: string }
}

/**
 * Checks the ware in against the request: pieces received (count; measured size where it differs),
 * the condition they came in, or a refusal at the door. Measured changes re-run the ware check and
 * the quote; a lower price stands at once, a higher one waits for the potter to confirm or turn down.
 */
export async function checkIn(ctx: AppContext, actor: User, id: string, body: CheckInBody) {
  return requestAction(ctx, actor, id, 'check-in', async (step) => {
    const { manager, rc } = step
    const facts = factsOf(rc, ctx.config.publicUrl)
    const asked = rc.request.standingQuote ?? rc.request.quote
    if (body.refuse) {
      const { net } = await moneyOf(manager, id)
      const refund = refundUnderTerms(net, rc.firing.firingDate, rc.studio.policies.cancellation).refundCents
      await manager.getRepository(CheckIn).save({
        requestId: id,
        receivedPieces: [],
        conditionNotes: body.conditionNotes ?? '',
        refused: true,
        refusedReason: body.refuse.reason,
        quoteBefore: asked,
        quoteAfter: null,
        priceConfirmedAt: null,
        checkedInBy: actor.id,
      })
      await step.move('cancelled', `Refused at drop-off: ${body.refuse.reason}`, { by: 'refused-at-door', refundCents: refund })
      await enqueueRefund(manager, id, refund, 'Ware refused at drop-off; refunded under the studio’s terms')
      await recordCounterRefundDue(step, refund)
      await step.tellPotter('ware-refused', refusedMail(facts, body.refuse.reason, refund))
      await enqueueStudioSync(manager, rc.studio.id)
      return { refused: true as const, findings: [] }
    }

    const declared = rc.request.pieces
    const received: ReceivedPiece[] = declared.map((piece, i) => {
      const entry = body.pieces.find((p) => p.pieceIndex === i)
      return {
        pieceIndex: i,
        declared: piece.quantity,
        received: entry?.received ?? 0,
        ...(entry?.measured ? { measured: entry.measured } : {}),
      }
    })
    const actual = declared
      .map((piece, i) => ({ ...piece, quantity: received[i].received, ...(received[i].measured ?? {}) }))
      .filter((piece) => piece.quantity > 0)
    const { check, quote } = await checkAgainstFiring(manager, rc.firing, actual, { own: rc.request })
    const before = asked?.totalCents ?? 0
    const after = quote?.totalCents ?? before
    const raised = after > before
    await manager.getRepository(CheckIn).save({
      requestId: id,
      receivedPieces: received,
      conditionNotes: body.conditionNotes ?? '',
      refused: false,
      refusedReason: null,
      quoteBefore: asked,
      quoteAfter: quote,
      // A lower price needs nobody's agreement.
      priceConfirmedAt: raised ? null : new Date(),
      checkedInBy: actor.id,
    })
    if (quote && after !== before) {
      const change = raised ? { pendingQuote: quote } : { standingQuote: quote }
      Object.assign(rc.request, change)
      await manager.update(FiringRequest, id, change)
    }
    await step.move('received', body.conditionNotes ? `Taken in. Condition: ${body.conditionNotes}` : 'Taken in', {
      received: received.map((r) => r.received),
      priceBeforeCents: before,
      priceAfterCents: after,
    })
    await step.tellPotter(
      raised ? 'price-raised' : 'drop-off',
      dropOffMail(factsOf(rc, ctx.config.publicUrl), {
        rows: received.map((r, i) => ({
          label: declared[i].label || `Piece ${i + 1}`,
          declared: r.declared,
          received: r.received,
          ...(r.measured ? { measured: describeSize(r.measured) } : {}),
        })),
        conditionNotes: body.conditionNotes ?? '',
        quoteBeforeCents: before,
        quoteAfterCents: after,
        needsConfirmation: raised,
      }),
    )
    return {
      refused: false as const,
      findings: check.findings,
      verdict: check.verdict,
      priceBeforeCents: before,
      priceAfterCents: after,
      needsConfirmation: raised,
    }
  })
}

/** The potter agrees to the price the measured ware gives; it becomes the price that stands. */
export async function confirmPrice(ctx: AppContext, potter: User, id: string) {
  return requestAction(ctx, potter, id, 'confirm-price', async (step) => {
    const { manager, rc } = step
    const pending = rc.request.pendingQuote!
    rc.request.standingQuote = pending
    rc.request.pendingQuote = null
    await manager.update(FiringRequest, id, { standingQuote: pending, pendingQuote: null })
    await manager.update(CheckIn, id, { priceConfirmedAt: new Date() })
    await step.note('New price confirmed', { totalCents: pending.totalCents })
    await step.tellStudio('price-confirmed', priceAnsweredMail(factsOf(rc, ctx.config.publicUrl), 'confirmed', 0))
  })
}

/**
 * The potter turns the measured price down: the request is withdrawn, the ware stays out of the load
 * for them to collect, and everything paid goes back in full (the price changed, not their mind).
 */
export async function declinePrice(ctx: AppContext, potter: User, id: string) {
  return requestAction(ctx, potter, id, 'decline-price', async (step) => {
    const { manager, rc } = step
    const { net } = await moneyOf(manager, id)
    const declined = rc.request.pendingQuote!
    rc.request.pendingQuote = null
    await manager.update(FiringRequest, id, { pendingQuote: null })
    await step.move('withdrawn', 'The potter turned down the price from the measured ware', {
      by: 'price-declined',
      declinedTotalCents: declined.totalCents,
      refundCents: net,
    })
    await enqueueRefund(manager, id, net, 'The potter turned down the price from the measured ware: refunded in full')
    await recordCounterRefundDue(step, net)
    await enqueueExpireCheckouts(manager, id)
    const facts = factsOf(rc, ctx.config.publicUrl)
    await step.tellStudio('price-declined', priceAnsweredMail(facts, 'declined', net))
    await step.tellPotter('price-declined', priceDeclinedPotterMail(facts, net))
    await enqueueStudioSync(manager, rc.studio.id)
    return { refundCents: net }
  })
}

export async function postResults(
  ctx: AppContext,
  actor: User,
  id: string,
  body: { outcomes: { pieceIndex: number; outcome: PieceOutcome; notes?: string }[]; notes?: string },
) {
  return requestAction(ctx, actor, id, 'results', async (step) => {
    const { manager, rc } = step
    const bad = body.outcomes.find((o) => o.pieceIndex >= rc.request.pieces.length)
    if (bad)
      throw new HttpError(400, 'invalid-input', 'A result names a piece the potter did not send.', {
        outcomes: `No piece ${bad.pieceIndex + 1}.`,
      })
    await manager.getRepository(RequestResult).save({
      requestId: id,
      outcomes: body.outcomes.map((o) => ({ ...o, notes: o.notes ?? '' })),
      notes: body.notes ?? '',
      postedBy: actor.id,
    })
    await step.note('Results posted')
  })
}

export async function markReady(ctx: AppContext, actor: User, id: string) {
  return requestAction(ctx, actor, id, 'ready', async (step) => {
    await step.move('ready', 'Ready for pickup')
    await step.tellPotter(
      'ready',
      readyMail(factsOf(step.rc, ctx.config.publicUrl), step.rc.studio.dropOffHours, step.facts.balanceOwedCents),
    )
  })
}

/**
 * Money taken at the studio's counter: toward the deposit (which books the space once it is all
 * paid) or the balance. Never more than is owed; the potter gets a receipt, the studio a notice.
 */
export async function counterPayment(ctx: AppContext, actor: User, id: string, body: { amountCents?: number; note?: string }) {
  return requestAction(ctx, actor, id, 'counter-payment', async (step) => {
    const { manager, rc, facts } = step
    const deposit = rc.request.state === 'accepted'
    const owed = deposit ? facts.depositOwedCents : facts.balanceOwedCents
    const amount = body.amountCents ?? owed
    if (amount > owed) {
      throw new HttpError(400, 'invalid-input', `That is more than is owed: ${owed} cents ${deposit ? 'toward the deposit' : 'in all'}.`, {
        amountCents: `At most ${owed} cents are owed.`,
      })
    }
    const currency = (rc.request.standingQuote ?? rc.request.quote)?.currency ?? rc.studio.currency
    await manager.getRepository(LedgerEntry).save({
      requestId: id,
      direction: 'in',
      kind: 'counter',
      amountCents: amount,
      currency,
      stripeSessionId: null,
      stripePaymentIntentId: null,
      stripeRefundId: null,
      note: body.note ?? (deposit ? 'Deposit paid at the counter' : 'Balance paid at the counter'),
    })
    const left = owed - amount
    if (deposit && left === 0) {
      await step.move('deposit_paid', 'Deposit paid at the counter', { amountCents: amount })
      await enqueueExpireCheckouts(manager, id)
      await enqueueStudioSync(manager, rc.studio.id)
    } else await step.note(`${amount} cents paid at the counter`, { amountCents: amount, owedCents: left })
    const { net } = await moneyOf(manager, id)
    const receipt = {
      what: deposit ? ('deposit' as const) : ('balance' as const),
      how: 'counter' as const,
      amountCents: amount,
      paidCents: net,
      owedCents: left,
    }
    const mailFacts = factsOf(rc, ctx.config.publicUrl)
    await step.tellPotter('payment-received', paymentReceivedMail(mailFacts, 'potter', receipt))
    await step.tellStudio('payment-received', paymentReceivedMail(mailFacts, 'studio', receipt))
    return { owedCents: left }
  })
}

/** The studio hands back money owed from the counter and marks it so. */
export async function markCounterRefundPaid(ctx: AppContext, actor: User, id: string, refundId: string) {
  return requestAction(ctx, actor, id, 'hand-back', async (step) => {
    const { manager } = step
    const { counterRefunds } = await moneyOf(manager, id)
    const due = counterRefunds.find((r) => r.id === refundId && !r.paidAt)
    if (!due) throw new HttpError(404, 'not-found', 'That counter refund was not found, or is already marked paid.')
    await manager.query(`UPDATE counter_refunds SET paid_at = now(), paid_by = $2 WHERE id = $1`, [due.id, actor.id])
    await manager.getRepository(LedgerEntry).save({
      requestId: id,
      direction: 'out',
      kind: 'counter-refund',
      amountCents: due.amountCents,
      currency: due.currency,
      stripeSessionId: null,
      stripePaymentIntentId: null,
      stripeRefundId: null,
      note: 'Handed back at the counter',
    })
    await step.note(`${due.amountCents} cents handed back at the counter`, { amountCents: due.amountCents })
  })
}

export async function markCollected(ctx: AppContext, actor: User, id: string) {
  return requestAction(ctx, actor, id, 'collected', async (step) => {
    const { manager, rc } = step
    await step.move('collected', 'Picked up by the potter')
    const quote = rc.request.standingQuote ?? rc.request.quote
    const { paidIn, refunded } = await moneyOf(manager, id)
    await step.tellPotter('pickup', pickupMail(factsOf(rc, ctx.config.publicUrl), quote?.lines ?? [], paidIn, refunded))
  })
}

/** The drop-off-to-pickup side of a request's view. */
export async function pickupJson(manager: EntityManager, rc: RequestContext) {
  const checkInRow = await manager.getRepository(CheckIn).findOne({ where: { requestId: rc.request.id } })
  const result = await manager.getRepository(RequestResult).findOne({ where: { requestId: rc.request.id } })
  return {
    checkIn: checkInRow
      ? {
          refused: checkInRow.refused,
          refusedReason: checkInRow.refusedReason,
          receivedPieces: checkInRow.receivedPieces,
          conditionNotes: checkInRow.conditionNotes,
          quoteBefore: checkInRow.quoteBefore,
          quoteAfter: checkInRow.quoteAfter,
          priceConfirmedAt: checkInRow.priceConfirmedAt?.toISOString() ?? null,
          at: checkInRow.at.toISOString(),
        }
      : null,
    results: result ? { outcomes: result.outcomes, notes: result.notes, at: result.updatedAt.toISOString() } : null,
    firingLog: await firingLogJson(manager, rc.firing.id),
  }
}
