// From drop-off to pickup: check-in (or refusal at the door), the firing's progress and log, results,
// ready, the balance, collection.
import type { EntityManager } from 'typeorm'
import { In } from 'typeorm'
import { enqueueStudioSync } from './search-sync'
import { mmToIn } from '../../shared/firing/units'
import type { FiringStatus } from '../../shared/workflow/firing-status'
import type { AppContext } from '../context'
import { CheckIn, type ReceivedPiece } from '../entities/CheckIn'
import type { Firing } from '../entities/Firing'
import { FiringRequest } from '../entities/FiringRequest'
import { LedgerEntry } from '../entities/LedgerEntry'
import { RequestEvent } from '../entities/RequestEvent'
import { RequestResult, type PieceOutcome } from '../entities/RequestResult'
import type { User } from '../entities/User'
import { conflict, forbidden, HttpError } from '../http/errors'
import { dropOffMail, firingProgressMail, noShowMail, pickupMail, readyMail, refusedMail } from '../mail/templates/pickup'
import { firingLogJson } from './firing-log'
import { queueMail } from './mail'
import { enqueueRefund, moneyOf, openCheckout } from './payments'
import { refundUnderTerms } from '../../shared/refunds'
import { factsOf, loadRequest, moveRequest, stateConflict, viewerOf, type RequestContext } from './request-context'
import { checkAgainstFiring } from './requests'
import type { Payment } from '../entities/Payment'

async function studioSide(manager: EntityManager, rc: RequestContext, user: User) {
  const viewer = await viewerOf(manager, rc, user)
  if (viewer.side === 'potter') throw forbidden('Only the studio’s people do that.', 'not-the-studio')
  return viewer
}

/** The price that stands: the check-in quote once the potter confirmed it (or when it went down). */
export async function standingQuote(manager: EntityManager, rc: RequestContext) {
  return quoteThatStands(rc.request, await manager.getRepository(CheckIn).findOne({ where: { requestId: rc.request.id } }))
}

function quoteThatStands(request: FiringRequest, checkIn: CheckIn | null) {
  return checkIn?.quoteAfter && checkIn.priceConfirmedAt ? checkIn.quoteAfter : request.quote
}

/** What the potter still owes: the standing total less what came in, plus what went back out. */
export async function owedCents(manager: EntityManager, rc: RequestContext) {
  const quote = await standingQuote(manager, rc)
  const { net } = await moneyOf(manager, rc.request.id)
  return Math.max(0, (quote?.totalCents ?? 0) - net)
}

const describeSize = (m: { heightMm: number; widthMm: number; depthMm: number }) =>
  `${mmToIn(m.heightMm).toFixed(1)} × ${mmToIn(m.widthMm).toFixed(1)} × ${mmToIn(m.depthMm).toFixed(1)} in`

/**
 * Checks the ware in against the request: pieces received (count; measured size where it differs),
 * the condition they came in, or a refusal at the door. Measured changes re-run the ware check and
 * the quote; a higher price waits for the potter's confirmation.
 */
export async function checkIn(
  ctx: AppContext,
  actor: User,
  id: string,
  body: {
    pieces: { pieceIndex: number; received: number; measured?: { heightMm: number; widthMm: number; depthMm: number } }[]
    conditionNotes?: string
    refuse?: { reason: string }
  },
) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    await studioSide(manager, rc, actor)
    if (rc.request.state === 'accepted') {
      throw conflict(
        'The deposit is not paid yet. Record it at the counter first, or ask the potter to pay it on the request.',
        'deposit-unpaid',
        { state: 'accepted' },
      )
    }
    if (rc.request.state !== 'deposit_paid')
      throw stateConflict(rc.request, `This request is ${rc.request.state.replace('_', ' ')}; only booked ware is checked in.`)
    const facts = factsOf(rc, ctx.config.publicUrl)
    if (body.refuse) {
      const { net } = await moneyOf(manager, id)
      const refund = refundUnderTerms(net, rc.firing.firingDate, rc.studio.policies.cancellation).refundCents
      await manager.getRepository(CheckIn).save({
        requestId: id,
        receivedPieces: [],
        conditionNotes: body.conditionNotes ?? '',
        refused: true,
        refusedReason: body.refuse.reason,
        quoteBefore: rc.request.quote,
        quoteAfter: null,
        priceConfirmedAt: null,
        checkedInBy: actor.id,
      })
      await moveRequest(manager, rc.request, 'cancelled', actor.id, `Refused at drop-off: ${body.refuse.reason}`, {
        by: 'refused-at-door',
        refundCents: refund,
      })
      await enqueueRefund(manager, id, refund, 'Ware refused at drop-off; refunded under the studio’s terms')
      await queueMail(manager, rc.potter.email, 'ware-refused', refusedMail(facts, body.refuse.reason, refund))
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
    const before = rc.request.quote?.totalCents ?? 0
    const after = quote?.totalCents ?? before
    const needsConfirmation = after > before
    await manager.getRepository(CheckIn).save({
      requestId: id,
      receivedPieces: received,
      conditionNotes: body.conditionNotes ?? '',
      refused: false,
      refusedReason: null,
      quoteBefore: rc.request.quote,
      quoteAfter: quote,
      // A lower price needs nobody's agreement.
      priceConfirmedAt: needsConfirmation ? null : new Date(),
      checkedInBy: actor.id,
    })
    await moveRequest(
      manager,
      rc.request,
      'received',
      actor.id,
      body.conditionNotes ? `Checked in. Condition: ${body.conditionNotes}` : 'Checked in',
      {
        received: received.map((r) => r.received),
        priceBeforeCents: before,
        priceAfterCents: after,
      },
    )
    await queueMail(
      manager,
      rc.potter.email,
      'drop-off',
      dropOffMail(facts, {
        rows: received.map((r, i) => ({
          label: declared[i].label || `Piece ${i + 1}`,
          declared: r.declared,
          received: r.received,
          ...(r.measured ? { measured: describeSize(r.measured) } : {}),
        })),
        conditionNotes: body.conditionNotes ?? '',
        quoteBeforeCents: before,
        quoteAfterCents: after,
        needsConfirmation,
      }),
    )
    return {
      refused: false as const,
      findings: check.findings,
      verdict: check.verdict,
      priceBeforeCents: before,
      priceAfterCents: after,
      needsConfirmation,
    }
  })
}

/** The potter agrees to the price the measured ware gives. */
export async function confirmPrice(ctx: AppContext, potter: User, id: string) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    const viewer = await viewerOf(manager, rc, potter)
    if (viewer.side !== 'potter') throw forbidden('Only the potter confirms a changed price.')
    const checkInRow = await manager.getRepository(CheckIn).findOne({ where: { requestId: id } })
    if (!checkInRow || checkInRow.priceConfirmedAt) throw conflict('No changed price waits for your confirmation.', 'nothing-to-confirm')
    await manager.update(CheckIn, id, { priceConfirmedAt: new Date() })
    await manager.getRepository(RequestEvent).save({
      requestId: id,
      actorId: potter.id,
      fromState: rc.request.state,
      toState: rc.request.state,
      reason: 'New price confirmed',
      data: { totalCents: checkInRow.quoteAfter?.totalCents },
    })
  })
}

const STAGE_NOTE: Partial<Record<FiringStatus, string>> = {
  loading: 'Loaded into the kiln',
  firing: 'The firing started',
  cooling: 'The kiln is cooling',
}

/**
 * A firing moving through loading, firing, cooling and unloaded moves every request in it along:
 * each gets the step on its timeline; ware never dropped off lapses when loading starts; unloading
 * marks the ware fired.
 */
export async function onFiringStatus(ctx: AppContext, manager: EntityManager, firing: Firing, to: FiringStatus, actorId: string) {
  if (!['loading', 'firing', 'cooling', 'unloaded'].includes(to)) return
  const requests = await manager
    .getRepository(FiringRequest)
    .find({ where: { firingId: firing.id, state: In(['accepted', 'deposit_paid', 'received']) }, lock: { mode: 'pessimistic_write' } })
  for (const request of requests) {
    const rc = await loadRequest(manager, request.id)
    const facts = factsOf(rc, ctx.config.publicUrl)
    if (request.state !== 'received') {
      if (to !== 'loading') continue
      const { net } = await moneyOf(manager, request.id)
      const refund = refundUnderTerms(net, firing.firingDate, rc.studio.policies.cancellation).refundCents
      await moveRequest(manager, request, 'cancelled', null, 'The ware was not dropped off before loading', {
        by: 'no-show',
        refundCents: refund,
      })
      await enqueueRefund(manager, request.id, refund, 'No-show: refunded under the studio’s terms')
      await queueMail(manager, rc.potter.email, 'no-show', noShowMail(facts, refund))
      continue
    }
    if (to === 'unloaded') {
      await moveRequest(manager, request, 'fired', actorId, 'The kiln was unloaded')
      await queueMail(manager, rc.potter.email, 'firing-progress', firingProgressMail(facts, 'unloaded'))
    } else {
      await manager.getRepository(RequestEvent).save({
        requestId: request.id,
        actorId,
        fromState: 'received',
        toState: 'received',
        reason: STAGE_NOTE[to]!,
        data: { firingStatus: to },
      })
      if (to === 'firing') await queueMail(manager, rc.potter.email, 'firing-progress', firingProgressMail(facts, 'firing'))
    }
  }
}

export async function postResults(
  ctx: AppContext,
  actor: User,
  id: string,
  body: { outcomes: { pieceIndex: number; outcome: PieceOutcome; notes?: string }[]; notes?: string },
) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    await studioSide(manager, rc, actor)
    if (!['fired', 'ready'].includes(rc.request.state))
      throw conflict('Results are posted once the kiln is unloaded.', 'not-fired', { state: rc.request.state })
    const bad = body.outcomes.find((o) => o.pieceIndex >= rc.request.pieces.length)
    if (bad)
      throw new HttpError(400, 'invalid-input', 'A result names a piece the request does not have.', {
        outcomes: `No piece ${bad.pieceIndex + 1}.`,
      })
    await manager.getRepository(RequestResult).save({
      requestId: id,
      outcomes: body.outcomes.map((o) => ({ ...o, notes: o.notes ?? '' })),
      notes: body.notes ?? '',
      postedBy: actor.id,
    })
    await manager.getRepository(RequestEvent).save({
      requestId: id,
      actorId: actor.id,
      fromState: rc.request.state,
      toState: rc.request.state,
      reason: 'Results posted',
      data: {},
    })
  })
}

export async function markReady(ctx: AppContext, actor: User, id: string) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    await studioSide(manager, rc, actor)
    if (rc.request.state === 'fired' && !(await manager.getRepository(RequestResult).exists({ where: { requestId: id } }))) {
      throw conflict('Post the results first: the potter hears about them with the ready mail.', 'results-missing')
    }
    await moveRequest(manager, rc.request, 'ready', actor.id, 'Ready for pickup')
    await queueMail(
      manager,
      rc.potter.email,
      'ready',
      readyMail(factsOf(rc, ctx.config.publicUrl), rc.studio.dropOffHours, await owedCents(manager, rc)),
    )
  })
}

/** The potter's checkout page for what is still owed. */
export async function openBalance(ctx: AppContext, potter: User, id: string) {
  const rc = await loadRequest(ctx.db.manager, id)
  const viewer = await viewerOf(ctx.db.manager, rc, potter)
  if (viewer.side === 'studio') throw forbidden('The potter pays the balance; record a payment at the counter instead.')
  if (rc.request.state !== 'ready') throw conflict('The balance is paid once the ware is ready.', 'not-ready', { state: rc.request.state })
  const owed = await owedCents(ctx.db.manager, rc)
  if (owed <= 0) throw conflict('Nothing is owed.', 'nothing-owed')
  return openCheckout(ctx, id, 'balance', owed)
}

/** Money taken at the studio's counter: the deposit (which books the space) or the balance. */
export async function counterPayment(ctx: AppContext, actor: User, id: string, body: { amountCents?: number; note?: string }) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    await studioSide(manager, rc, actor)
    const { depositPaid } = await moneyOf(manager, id)
    const owed =
      rc.request.state === 'accepted'
        ? Math.max(0, (rc.request.quote?.depositCents ?? 0) - depositPaid)
        : rc.request.state === 'ready'
          ? await owedCents(manager, rc)
          : 0
    if (owed <= 0) throw conflict('Nothing is owed at this point.', 'nothing-owed', { state: rc.request.state })
    const amount = body.amountCents ?? owed
    if (amount > owed)
      throw new HttpError(400, 'invalid-input', 'That is more than is owed.', { amountCents: `At most ${owed} cents are owed.` })
    await manager.getRepository(LedgerEntry).save({
      requestId: id,
      direction: 'in',
      kind: 'counter',
      amountCents: amount,
      currency: rc.request.quote?.currency ?? rc.studio.currency,
      stripeSessionId: null,
      stripePaymentIntentId: null,
      stripeRefundId: null,
      note: body.note ?? (rc.request.state === 'accepted' ? 'Deposit paid at the counter' : 'Balance paid at the counter'),
    })
    if (rc.request.state === 'accepted' && amount >= owed)
      await moveRequest(manager, rc.request, 'deposit_paid', actor.id, 'Deposit paid at the counter')
    return { owedCents: owed - amount }
  })
}

/** A paid balance checkout, from the webhook: booked by the payments service; nothing else moves. */
export async function settleBalance(_ctx: AppContext, manager: EntityManager, rc: RequestContext, payment: Payment) {
  await manager.getRepository(RequestEvent).save({
    requestId: rc.request.id,
    actorId: null,
    fromState: rc.request.state,
    toState: rc.request.state,
    reason: 'Balance paid through Stripe',
    data: { sessionId: payment.stripeSessionId },
  })
}

export async function markCollected(ctx: AppContext, actor: User, id: string) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    await studioSide(manager, rc, actor)
    const owed = await owedCents(manager, rc)
    if (rc.request.state === 'ready' && owed > 0)
      throw conflict(
        `${(owed / 100).toFixed(2)} is still owed. Take it at the counter or let the potter pay online first.`,
        'balance-owed',
        { owedCents: owed },
      )
    await moveRequest(manager, rc.request, 'collected', actor.id, 'Collected by the potter')
    const quote = await standingQuote(manager, rc)
    const { paidIn, refunded } = await moneyOf(manager, id)
    await queueMail(manager, rc.potter.email, 'pickup', pickupMail(factsOf(rc, ctx.config.publicUrl), quote?.lines ?? [], paidIn, refunded))
  })
}

/** The drop-off-to-pickup side of a request's view; `netPaidCents` is what the caller's ledger read gave. */
export async function pickupJson(manager: EntityManager, rc: RequestContext, netPaidCents: number) {
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
    owedCents: Math.max(0, (quoteThatStands(rc.request, checkInRow)?.totalCents ?? 0) - netPaidCents),
  }
}
