// The firing request workflow: draft, send (the server's own ware check), the studio's decision,
// the deposit hold, moves, withdrawals, lapses and their refunds. Every action after the draft is
// made goes through the one door (request-door.ts): lock, authorize, apply, record, tell.
import type { EntityManager } from 'typeorm'
import { randomUUID } from 'node:crypto'
import { checkWare, requestVolumeL, shelvesWords, type Piece, type WareCheck } from '../../shared/firing/check'
import { shelvesLeftFor } from '../../shared/firing/load'
import { quoteRequest } from '../../shared/firing/quote'
import { depositToAsk } from '../../shared/payments'
import { refundUnderTerms } from '../../shared/refunds'
import { takesRequests } from '../../shared/workflow/firing-status'
import { holdsSpace, type RequestState } from '../../shared/workflow/request-states'
import type { AppContext } from '../context'
import { CounterRefund } from '../entities/CounterRefund'
import { Firing } from '../entities/Firing'
import { FiringRequest } from '../entities/FiringRequest'
import { Kiln } from '../entities/Kiln'
import { RequestEvent } from '../entities/RequestEvent'
import { Studio } from '../entities/Studio'
import type { User } from '../entities/User'
import { conflict, HttpError } from '../http/errors'
import { enqueueJob } from '../jobs/queue'
import {
  disputedMail,
  lapsedMail,
  moveProposedMail,
  requestAcceptedMail,
  requestDeclinedMail,
  requestSentMail,
  studioCancelledMail,
  withdrawnMail,
  type LapseCause,
} from '../mail/templates/requests'
import { getPriceList, kilnSpec } from './kilns'
import { fitsInLoad } from './load-plan'
import { enqueueExpireCheckouts, enqueueOpenCheckout, enqueueRefund, moneyOf } from './payments'
import { factsOf } from './request-context'
import { heldJobKey, requestAction, type ActionStep } from './request-door'
import { potterReviewRecord } from './reviews'
import { enqueueStudioSync } from './search-sync'

export const DEPOSIT_EXPIRY_TASK = 'deposit-expiry'

/**
 * The server's ware check of pieces against a firing as it stands now: the pieces are planned into its
 * load, so the check says whether they go in. `own` is a request already in the firing, left out of
 * the load for its own re-check (its pieces as measured are the ones planned).
 */
export async function checkAgainstFiring(
  manager: EntityManager,
  firing: Firing,
  pieces: Piece[],
  { own, potter }: { own?: FiringRequest; potter?: Pick<User, 'id' | 'displayName'> } = {},
) {
  const kiln = await manager.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId })
  const spec = kilnSpec(kiln)
  const mine = own && own.firingId === firing.id && holdsSpace(own.state) ? own.id : undefined
  const requestId = own?.id ?? randomUUID()
  const { fits, room } = await fitsInLoad(
    manager,
    firing,
    { requestId, potterId: own?.potterId ?? potter?.id ?? requestId, potterName: potter?.displayName ?? '', pieces },
    { exclude: mine },
  )
  const check: WareCheck = checkWare(
    spec,
    { kind: firing.kind, cone: firing.cone, atmosphere: firing.atmosphere, slowCool: firing.slowCool, load: { room, fits } },
    pieces,
  )
  const priceList = await getPriceList(manager, kiln.id)
  const quote = priceList ? quoteRequest(priceList, firing, pieces, spec) : null
  return { check, quote, volumeL: requestVolumeL(pieces) }
}

async function requireOpenFiring(manager: EntityManager, firingId: string) {
  const firing = await manager.getRepository(Firing).findOne({ where: { id: firingId } })
  const kiln = firing && (await manager.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId }))
  const studio = kiln && (await manager.getRepository(Studio).findOneByOrFail({ id: kiln.studioId }))
  if (!firing || !studio?.published || firing.status === 'cancelled') throw new HttpError(404, 'not-found', 'That firing was not found.')
  return { firing, studio }
}

const notTakingWare = () => conflict('This firing is not taking ware any more.', 'firing-not-open')

export async function createDraft(ctx: AppContext, potter: User, firingId: string, body: { pieces: Piece[]; notes?: string }) {
  return ctx.db.transaction(async (manager) => {
    const { firing } = await requireOpenFiring(manager, firingId)
    if (!takesRequests(firing.status) || firing.dropOffBy.getTime() < Date.now()) throw notTakingWare()
    const { check, quote, volumeL } = await checkAgainstFiring(manager, firing, body.pieces)
    const request = await manager.getRepository(FiringRequest).save({
      firingId,
      potterId: potter.id,
      state: 'draft',
      pieces: body.pieces,
      notes: body.notes ?? '',
      volumeL,
      verdict: check.verdict,
      findings: check.findings,
      acknowledgedWarnings: [],
      quote,
      standingQuote: null,
      pendingQuote: null,
      depositAskedCents: null,
      policiesVersion: null,
      depositDueAt: null,
      proposedFiringId: null,
      sentAt: null,
    })
    await manager
      .getRepository(RequestEvent)
      .save({ requestId: request.id, actorId: potter.id, fromState: null, toState: 'draft', reason: '', data: {} })
    return request.id
  })
}

export async function updateDraft(ctx: AppContext, potter: User, id: string, body: { pieces?: Piece[]; notes?: string }) {
  return requestAction(ctx, potter, id, 'edit', async ({ manager, rc }) => {
    const pieces = body.pieces ?? rc.request.pieces
    const { check, quote, volumeL } = await checkAgainstFiring(manager, rc.firing, pieces)
    await manager.update(FiringRequest, id, {
      pieces,
      notes: body.notes ?? rc.request.notes,
      volumeL,
      verdict: check.verdict,
      findings: check.findings,
      quote,
    })
  })
}

/**
 * Sends a draft. The server checks the ware again (the browser's check is never trusted): blocking
 * findings are a 422 with the findings; each warning must be acknowledged by its code; the potter
 * agrees to the studio's policies in their current version. The quote sent is the price that stands.
 */
export async function sendRequest(ctx: AppContext, potter: User, id: string, body: { acknowledged: string[]; policiesVersion: number }) {
  return requestAction(ctx, potter, id, 'send', async (step) => {
    const { manager, rc } = step
    if (!takesRequests(rc.firing.status) || rc.firing.dropOffBy.getTime() < Date.now()) throw notTakingWare()
    const { check, quote, volumeL } = await checkAgainstFiring(manager, rc.firing, rc.request.pieces)
    if (check.verdict === 'block') {
      throw new HttpError(
        422,
        'ware-blocked',
        'The ware cannot go in this firing as described. Change what the findings say and try again.',
        undefined,
        { findings: check.findings },
      )
    }
    const warnings = [...new Set(check.findings.filter((f) => f.severity === 'warn').map((f) => f.code))]
    const missing = warnings.filter((code) => !body.acknowledged.includes(code))
    if (missing.length) {
      throw new HttpError(422, 'unacknowledged-warnings', 'Read and acknowledge each warning before sending.', undefined, {
        missing,
        findings: check.findings,
      })
    }
    if (body.policiesVersion !== rc.studio.policiesVersion) {
      throw conflict('The studio changed its terms since you read them. Read them again before sending.', 'policies-changed', {
        policiesVersion: rc.studio.policiesVersion,
      })
    }
    Object.assign(rc.request, { quote, standingQuote: quote, volumeL, verdict: check.verdict, findings: check.findings })
    await manager.update(FiringRequest, id, {
      verdict: check.verdict,
      findings: check.findings,
      quote,
      standingQuote: quote,
      volumeL,
      acknowledgedWarnings: warnings,
      policiesVersion: rc.studio.policiesVersion,
      sentAt: new Date(),
    })
    await step.move('sent', '', { acknowledged: warnings, policiesVersion: rc.studio.policiesVersion })
    await step.tellStudio('request-sent', requestSentMail(factsOf(rc, ctx.config.publicUrl)))
  })
}

/**
 * Takes a request on, holding its space. The firing's row is locked first, so concurrent accepts are
 * served one at a time and the firing is never oversold.
 */
export async function acceptRequest(ctx: AppContext, actor: User, id: string) {
  return requestAction(ctx, actor, id, 'accept', (step) => holdSpace(step, 'Taken on by the studio'))
}

async function holdSpace(step: ActionStep, reason: string) {
  const { manager, rc, ctx } = step
  // Planned into the load under the firing's lock (the door took it): the ware goes in, or the request waits.
  const { fits, room, unplaced } = await fitsInLoad(manager, rc.firing, {
    requestId: rc.request.id,
    potterId: rc.potter.id,
    potterName: rc.potter.displayName,
    pieces: rc.request.pieces,
  })
  if (!fits) {
    const tallest = rc.request.pieces.reduce((h, p) => Math.max(h, p.heightMm), 0)
    const left = shelvesLeftFor(room, tallest)
    throw conflict(
      `Not enough space left: ${unplaced.length || 'some'} of the pieces find no place in the load, which has ${shelvesWords(left)} left for pieces this tall.`,
      'no-space',
      { shelvesLeft: left, tallestMm: room.tallestMm, unplaced: unplaced.length },
    )
  }
  const quote = rc.request.standingQuote ?? rc.request.quote
  const deposit = quote ? depositToAsk(quote.depositCents, quote.totalCents, quote.currency) : 0
  const holdHours = rc.studio.policies.depositHoldHours
  const due = deposit > 0 ? new Date(Date.now() + holdHours * 3600_000) : null
  rc.request.depositAskedCents = deposit
  rc.request.depositDueAt = due
  await manager.update(FiringRequest, rc.request.id, { depositDueAt: due, depositAskedCents: deposit, proposedFiringId: null })
  await step.move('accepted', reason, { depositAskedCents: deposit, depositDueAt: due?.toISOString() ?? null })
  const facts = factsOf(rc, ctx.config.publicUrl)
  if (due) {
    await enqueueOpenCheckout(manager, rc.request.id, 'deposit', deposit)
    await enqueueJob(manager, DEPOSIT_EXPIRY_TASK, { requestId: rc.request.id }, { runAt: due, jobKey: `deposit-expiry:${rc.request.id}` })
  } else {
    await step.move('deposit_paid', 'No deposit is asked for this firing')
  }
  await step.tellPotter('request-accepted', requestAcceptedMail(facts, due))
  await enqueueStudioSync(manager, rc.studio.id)
}

/**
 * Declines a sent request with a reason. After taking it on the studio can still call it off: the
 * request is cancelled and everything paid is refunded in full.
 */
export async function declineRequest(ctx: AppContext, actor: User, id: string, reason: string) {
  return requestAction(
    ctx,
    actor,
    id,
    (state) => (state === 'sent' ? 'decline' : 'cancel'),
    async (step) => {
      const { manager, rc } = step
      const facts = factsOf(rc, ctx.config.publicUrl)
      if (rc.request.state === 'sent') {
        await step.move('declined', reason)
        await step.tellPotter('request-declined', requestDeclinedMail(facts, reason))
        return
      }
      const { net } = await moneyOf(manager, id)
      await step.move('cancelled', reason, { by: 'studio', refundCents: net })
      await enqueueRefund(manager, id, net, `Cancelled by the studio: ${reason}`)
      await recordCounterRefundDue(step, net)
      await enqueueExpireCheckouts(manager, id)
      await step.tellPotter('request-cancelled', studioCancelledMail(facts, reason, net))
      await enqueueStudioSync(manager, rc.studio.id)
    },
  )
}

/** The studio offers another of its firings instead; the potter accepts or refuses. */
export async function proposeMove(ctx: AppContext, actor: User, id: string, firingId: string) {
  return requestAction(
    ctx,
    actor,
    id,
    'move',
    async (step) => {
      const { manager, rc } = step
      const target = await manager.getRepository(Firing).findOne({ where: { id: firingId } })
      const targetKiln = target && (await manager.getRepository(Kiln).findOneByOrFail({ id: target.kilnId }))
      if (!target || targetKiln!.studioId !== rc.studio.id)
        throw new HttpError(400, 'invalid-input', 'Choose one of this studio’s firings.', { firingId: 'Not a firing of this studio.' })
      if (target.id === rc.firing.id)
        throw new HttpError(400, 'invalid-input', 'That is the firing the request is already for.', { firingId: 'Choose another firing.' })
      if (!takesRequests(target.status)) throw conflict('That firing is not taking ware.', 'firing-not-open')
      const { check } = await checkAgainstFiring(manager, target, rc.request.pieces)
      if (check.verdict === 'block') {
        throw new HttpError(422, 'ware-blocked', 'This ware cannot go in that firing.', undefined, { findings: check.findings })
      }
      await manager.update(FiringRequest, id, { proposedFiringId: target.id })
      await step.note('Another firing suggested', { proposedFiringId: target.id })
      await step.tellPotter('move-proposed', moveProposedMail(factsOf(rc, ctx.config.publicUrl), target))
    },
    { alsoLock: () => [firingId] },
  )
}

/** The potter's answer to a proposed move: accepting takes (and holds) the place in the other firing. */
export async function answerMove(ctx: AppContext, potter: User, id: string, accept: boolean) {
  return requestAction(
    ctx,
    potter,
    id,
    'answer-move',
    async (step) => {
      const { manager, rc } = step
      const to = rc.request.proposedFiringId!
      if (!accept) {
        await manager.update(FiringRequest, id, { proposedFiringId: null })
        await step.note('The potter kept the first firing', { proposedFiringId: to })
        return
      }
      const target = await manager.getRepository(Firing).findOneByOrFail({ id: to })
      if (!takesRequests(target.status)) throw conflict('That firing is not taking ware any more.', 'firing-not-open')
      const { check, quote, volumeL } = await checkAgainstFiring(manager, target, rc.request.pieces)
      if (check.verdict === 'block')
        throw new HttpError(422, 'ware-blocked', 'The ware cannot go in that firing any more.', undefined, { findings: check.findings })
      await manager.update(FiringRequest, id, {
        firingId: to,
        quote,
        standingQuote: quote,
        volumeL,
        verdict: check.verdict,
        findings: check.findings,
      })
      await step.note('Moved to the suggested firing', { from: rc.firing.id, to })
      Object.assign(rc.request, { firingId: to, quote, standingQuote: quote, volumeL })
      rc.firing = target
      await holdSpace(step, 'Moved to the proposed firing')
    },
    // The proposed firing is locked with the request's own, in id order, before the request.
    { alsoLock: (request) => (request.proposedFiringId ? [request.proposedFiringId] : []) },
  )
}

/**
 * The potter withdraws before drop-off. A paid deposit is refunded under the studio's terms: in full
 * until N days before the firing, P % after.
 */
export async function withdrawRequest(ctx: AppContext, potter: User, id: string, reason?: string) {
  return requestAction(ctx, potter, id, 'withdraw', async (step) => {
    const { manager, rc } = step
    const { net } = await moneyOf(manager, id)
    const refund = refundUnderTerms(net, rc.firing.firingDate, rc.studio.policies.cancellation).refundCents
    const heldSpace = holdsSpace(rc.request.state)
    const wasSent = rc.request.sentAt !== null
    await step.move('withdrawn', reason ?? '', { paidCents: net, refundCents: refund })
    await enqueueRefund(manager, id, refund, 'Withdrawn by the potter')
    await recordCounterRefundDue(step, refund)
    await enqueueExpireCheckouts(manager, id)
    if (wasSent) await step.tellStudio('request-withdrawn', withdrawnMail(factsOf(rc, ctx.config.publicUrl), refund, reason))
    if (heldSpace) await enqueueStudioSync(manager, rc.studio.id)
    return { refundCents: refund }
  })
}

/**
 * Money taken at the counter cannot go back through Stripe: when a refund is owed and the online
 * payments cannot cover it, the rest is recorded as a counter refund the studio owes the potter.
 */
export async function recordCounterRefundDue(step: Pick<ActionStep, 'manager' | 'rc' | 'hold'>, refundCents: number) {
  const { manager, rc } = step
  if (refundCents <= 0) return
  const { onlineNet } = await moneyOf(manager, rc.request.id)
  const atCounter = refundCents - Math.min(refundCents, onlineNet)
  if (atCounter > 0) {
    const due = await manager.getRepository(CounterRefund).save({
      requestId: rc.request.id,
      amountCents: atCounter,
      currency: (rc.request.standingQuote ?? rc.request.quote)?.currency ?? rc.studio.currency,
      reason: 'Owed back from money taken at the counter',
      paidAt: null,
      paidBy: null,
    })
    step.hold?.counterRefundIds.push(due.id)
  }
}

/**
 * A request still waiting (for the studio's answer, or for its deposit) lapses: the space is released,
 * money paid goes back (in full unless the potter let the deposit hold run out, then under the terms),
 * and both sides are told.
 */
export async function lapse(step: ActionStep, cause: LapseCause, { tellStudio = true } = {}) {
  const { manager, rc, ctx, hold } = step
  const held = (what: string) => (hold ? { runAt: hold.runAt, jobKey: heldJobKey(hold, what) } : {})
  const { net } = await moneyOf(manager, rc.request.id)
  const refund = cause === 'deposit-late' ? refundUnderTerms(net, rc.firing.firingDate, rc.studio.policies.cancellation).refundCents : net
  const heldSpace = holdsSpace(rc.request.state)
  await step.move('lapsed', LAPSE_REASON[cause], { by: cause, refundCents: refund })
  await enqueueRefund(manager, rc.request.id, refund, `Lapsed: ${LAPSE_REASON[cause]}`, held('refund'))
  await recordCounterRefundDue(step, refund)
  await enqueueExpireCheckouts(manager, rc.request.id, held('checkouts'))
  const facts = factsOf(rc, ctx.config.publicUrl)
  await step.tellPotter('lapsed', lapsedMail(facts, 'potter', cause, refund))
  // A lapse the studio caused by its own stage move was named in the confirmation it agreed to.
  if (tellStudio) await step.tellStudio('lapsed', lapsedMail(facts, 'studio', cause, refund))
  if (heldSpace) await enqueueStudioSync(manager, rc.studio.id)
}

const LAPSE_REASON: Record<LapseCause, string> = {
  'firing-closed': 'The firing stopped taking ware before the ask was settled',
  'firing-loading': 'Loading started before the ask was settled',
  'deposit-late': 'The deposit was not paid in time; the space went back to the studio',
  'drop-off-passed': 'The drop-off deadline passed with no answer',
}

/** The deposit hold ran out: a request taken on and still unpaid lapses and releases its space. */
export async function expireDepositHold(ctx: AppContext, id: string, now = new Date()) {
  return requestAction(ctx, null, id, 'lapse', async (step) => {
    const { request } = step.rc
    if (request.state !== 'accepted' || !request.depositDueAt || request.depositDueAt > now || step.facts.depositOwedCents === 0)
      return false
    await lapse(step, 'deposit-late')
    return true
  })
}

/**
 * The sweep for what dates alone make stale: a request still unanswered when drop-off closes, or taken
 * on with its deposit hold run out (should its own timer job have been lost). Runs on a schedule.
 */
export async function sweepStaleRequests(ctx: AppContext, now = new Date()): Promise<number> {
  const rows: { id: string; state: RequestState }[] = await ctx.db.query(
    `SELECT r.id, r.state FROM firing_requests r JOIN firings f ON f.id = r.firing_id
     WHERE (r.state = 'sent' AND f.drop_off_by < $1) OR (r.state = 'accepted' AND r.deposit_due_at < $1)
     ORDER BY r.id LIMIT 500`,
    [now],
  )
  let lapsed = 0
  for (const row of rows) {
    const done = await requestAction(ctx, null, row.id, 'lapse', async (step) => {
      const { request, firing } = step.rc
      if (request.state === 'sent' && firing.dropOffBy < now) {
        await lapse(step, 'drop-off-passed')
        return true
      }
      if (request.state === 'accepted' && request.depositDueAt && request.depositDueAt < now && step.facts.depositOwedCents > 0) {
        await lapse(step, 'deposit-late')
        return true
      }
      return false
    })
    if (done) lapsed++
  }
  return lapsed
}

/** A potter's record, as studios see it when deciding on a new ask: the studios' answers only once published. */
export async function potterRecord(manager: EntityManager, potterId: string) {
  const rows: { state: RequestState; by: string | null; count: number }[] = await manager.query(
    `SELECT r.state, e.data->>'by' AS by, count(*)::int AS count
     FROM firing_requests r
     LEFT JOIN LATERAL (SELECT data FROM request_events WHERE request_id = r.id ORDER BY at DESC LIMIT 1) e ON true
     WHERE r.potter_id = $1 AND r.state <> 'draft' GROUP BY 1, 2`,
    [potterId],
  )
  const count = (pred: (r: (typeof rows)[number]) => boolean) => rows.filter(pred).reduce((n, r) => n + r.count, 0)
  return {
    requests: count(() => true),
    collected: count((r) => r.state === 'collected'),
    // Not showing up: space held and released for an unpaid deposit, or ware refused at the door or never brought.
    noShows: count(
      (r) =>
        (r.state === 'lapsed' && r.by === 'deposit-late') ||
        (r.state === 'cancelled' && (r.by === 'deposit-hold' || r.by === 'refused-at-door' || r.by === 'no-show')),
    ),
    reviews: await potterReviewRecord(manager, potterId),
  }
}

/**
 * Either side raises a dispute once the ware has been fired: the request leaves the normal path and
 * waits for the marketplace's admins, who may refund.
 */
export async function disputeRequest(ctx: AppContext, user: User, id: string, reason: string) {
  return requestAction(ctx, user, id, 'dispute', async (step) => {
    const side = step.viewer.side
    await step.move('disputed', reason, { by: side })
    const mail = disputedMail(factsOf(step.rc, ctx.config.publicUrl), user.displayName, reason)
    if (side === 'potter') await step.tellStudio('disputed', mail)
    else await step.tellPotter('disputed', mail)
  })
}

/** An admin's refund while settling a dispute: at most what was paid and not yet refunded. */
export async function adminRefund(ctx: AppContext, admin: User, id: string, amountCents: number, reason: string) {
  return requestAction(ctx, admin, id, 'desk-refund', async (step) => {
    const { net } = await moneyOf(step.manager, id)
    if (amountCents > net)
      throw new HttpError(400, 'invalid-input', 'That is more than was paid and not yet refunded.', {
        amountCents: `At most ${net} cents.`,
      })
    await enqueueRefund(step.manager, id, amountCents, `Refunded by the Conewright desk: ${reason}`)
    await recordCounterRefundDue(step, amountCents)
    await step.note(`Refund of ${amountCents} cents by the desk: ${reason}`, { amountCents })
  })
}
