// From drop-off to pickup: check-in (or refusal at the door), a price raised by the measured ware
// and the potter's answer, results, ready, the balance, collection. Every action goes through the
// one door (request-door.ts).
import type { EntityManager } from 'typeorm'
import type { Piece } from '../../shared/firing/check'
import { readTag } from '../../shared/firing/tags'
import { mmToIn } from '../../shared/firing/units'
import type { PieceOutcome } from '../../shared/schemas/pickup'
import { refundUnderTerms } from '../../shared/refunds'
import type { AppContext } from '../context'
import { CheckIn, type ReceivedPiece } from '../entities/CheckIn'
import { FiringRequest } from '../entities/FiringRequest'
import { LedgerEntry } from '../entities/LedgerEntry'
import { RequestResult } from '../entities/RequestResult'
import { WarePiece } from '../entities/WarePiece'
import type { User } from '../entities/User'
import { conflict, HttpError } from '../http/errors'
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
import { insertPiece } from './pieces'
import { checkAgainstFiring, recordCounterRefundDue } from './requests'
import { enqueueStudioSync } from './search-sync'

const describeSize = (m: { heightMm: number; widthMm: number; depthMm: number }) =>
  `${mmToIn(m.heightMm).toFixed(1)} × ${mmToIn(m.widthMm).toFixed(1)} × ${mmToIn(m.depthMm).toFixed(1)} in`

export interface ResultsBody {
  outcomes?: { pieceIndex: number; outcome: PieceOutcome; notes?: string }[]
  pieces?: { tag: string; outcome: PieceOutcome; notes?: string }[]
  notes?: string
}

/** The ware that goes into the load, as declared lines: one line per declared line and measured size. */
export function loadedLines(
  declared: Piece[],
  records: Pick<WarePiece, 'pieceIndex' | 'status' | 'heightMm' | 'widthMm' | 'depthMm'>[],
): Piece[] {
  const lines = new Map<string, Piece>()
  for (const record of records) {
    if (record.status !== 'in-load') continue
    const key = `${record.pieceIndex}|${record.heightMm}|${record.widthMm}|${record.depthMm}`
    const line = lines.get(key)
    if (line) line.quantity++
    else
      lines.set(key, {
        ...declared[record.pieceIndex],
        quantity: 1,
        heightMm: record.heightMm,
        widthMm: record.widthMm,
        depthMm: record.depthMm,
      })
  }
  return [...lines.values()]
}

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
    const pieces = manager.getRepository(WarePiece)
    const tagged = await pieces.find({ where: { requestId: id } })
    const fields: Record<string, string> = {}
    declared.forEach((_, i) => {
      const count = tagged.filter((r) => r.pieceIndex === i).length
      const entry = body.pieces.find((p) => p.pieceIndex === i)
      if ((entry?.received ?? 0) < count) fields[`pieces.${i}.received`] = `${count} of these are tagged already; count at least those.`
    })
    if (Object.keys(fields).length) throw new HttpError(400, 'invalid-input', 'Count every piece already tagged.', fields)
    // Pieces counted in without being tagged one by one get their records and tags now.
    for (const [i, line] of declared.entries()) {
      const entry = body.pieces.find((p) => p.pieceIndex === i)
      const size = entry?.measured ?? line
      const copies = new Set(tagged.filter((r) => r.pieceIndex === i).map((r) => r.copy))
      let copy = 1
      for (let n = copies.size; n < (entry?.received ?? 0); n++) {
        while (copies.has(copy)) copy++
        copies.add(copy)
        await insertPiece(manager, {
          requestId: id,
          pieceIndex: i,
          copy,
          heightMm: size.heightMm,
          widthMm: size.widthMm,
          depthMm: line.round === true ? size.widthMm : size.depthMm,
          round: line.round === true,
          weightG: line.weightG ?? null,
          checks: [],
          status: 'in-load',
          holdReason: null,
          heldAt: null,
          outcome: null,
          outcomeNotes: '',
          outcomeAt: null,
          outcomeBy: null,
          checkedInBy: actor.id,
        })
      }
    }
    const records = await pieces.find({ where: { requestId: id }, order: { pieceIndex: 'ASC', copy: 'ASC' } })
    const received: ReceivedPiece[] = declared.map((piece, i) => {
      const entry = body.pieces.find((p) => p.pieceIndex === i)
      const held = records.filter((r) => r.pieceIndex === i && r.status === 'held').length
      return {
        pieceIndex: i,
        declared: piece.quantity,
        received: entry?.received ?? 0,
        ...(held ? { held } : {}),
        ...(entry?.measured ? { measured: entry.measured } : {}),
      }
    })
    const actual = loadedLines(declared, records)
    if (!actual.length)
      throw conflict('Every piece received is held back: refuse the ware at the door instead, or take some of it in.', 'all-held')
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
          held: r.held,
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

/**
 * The results of a request: each piece by its tag, or one outcome for every piece of a declared line.
 * Every piece in the load must end up with its outcome; then the results stand and the studio can
 * mark the ware ready.
 */
export async function postResults(ctx: AppContext, actor: User, id: string, body: ResultsBody) {
  return requestAction(ctx, actor, id, 'results', async (step) => {
    const { manager, rc } = step
    const bad = body.outcomes?.find((o) => o.pieceIndex >= rc.request.pieces.length)
    if (bad)
      throw new HttpError(400, 'invalid-input', 'A result names a piece the potter did not send.', {
        outcomes: `No piece ${bad.pieceIndex + 1}.`,
      })
    const records = await manager.getRepository(WarePiece).find({ where: { requestId: id, status: 'in-load' } })
    if (!records.length) throw conflict('No piece of this request went into the load.', 'no-pieces')
    const now = new Date()
    const set = (record: WarePiece, outcome: PieceOutcome, notes?: string) =>
      Object.assign(record, { outcome, outcomeNotes: notes ?? '', outcomeAt: now, outcomeBy: actor.id })
    for (const o of body.outcomes ?? [])
      for (const record of records.filter((r) => r.pieceIndex === o.pieceIndex)) set(record, o.outcome, o.notes)
    const fields: Record<string, string> = {}
    for (const [i, p] of (body.pieces ?? []).entries()) {
      const reading = readTag(p.tag)
      const record = reading.ok ? records.find((r) => r.tag === reading.tag) : undefined
      if (!record) fields[`pieces.${i}.tag`] = reading.ok ? 'Not a piece of this request in the load.' : reading.reason
      else set(record, p.outcome, p.notes)
    }
    if (Object.keys(fields).length) throw new HttpError(400, 'invalid-input', 'Some results name no piece of this request.', fields)
    const missing = records.filter((r) => r.outcome === null).length
    if (missing)
      throw new HttpError(400, 'invalid-input', 'Give every piece in the load how it came out.', {
        pieces: `${missing} ${missing === 1 ? 'piece has' : 'pieces have'} no outcome yet.`,
      })
    await manager.getRepository(WarePiece).save(records)
    await manager.getRepository(RequestResult).save({ requestId: id, notes: body.notes ?? '', postedBy: actor.id })
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
  const fired = result
    ? await manager
        .getRepository(WarePiece)
        .find({ where: { requestId: rc.request.id, status: 'in-load' }, order: { pieceIndex: 'ASC', copy: 'ASC' } })
    : []
  const counts: Partial<Record<PieceOutcome, number>> = {}
  for (const piece of fired) if (piece.outcome) counts[piece.outcome] = (counts[piece.outcome] ?? 0) + 1
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
    results: result
      ? {
          outcomes: fired
            .filter((p) => p.outcome !== null)
            .map((p) => ({
              pieceId: p.id,
              tag: p.tag,
              pieceIndex: p.pieceIndex,
              copy: p.copy,
              outcome: p.outcome!,
              notes: p.outcomeNotes,
            })),
          counts,
          notes: result.notes,
          at: result.updatedAt.toISOString(),
        }
      : null,
    firingLog: await firingLogJson(manager, rc.firing.id),
  }
}
