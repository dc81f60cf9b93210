// The firing request workflow: draft, send (the server's own ware check), the studio's decision,
// the deposit hold, moves, withdrawals and their refunds.
import type { EntityManager } from 'typeorm'
import { In } from 'typeorm'
import { enqueueStudioSync } from './search-sync'
import { checkWare, requestVolumeL, type Piece, type WareCheck } from '../../shared/firing/check'
import { quoteRequest } from '../../shared/firing/quote'
import { takesRequests } from '../../shared/workflow/firing-status'
import { holdsSpace, type RequestState } from '../../shared/workflow/request-states'
import type { AppContext } from '../context'
import { Firing } from '../entities/Firing'
import { FiringRequest } from '../entities/FiringRequest'
import { Kiln } from '../entities/Kiln'
import { RequestEvent } from '../entities/RequestEvent'
import { Studio } from '../entities/Studio'
import type { User } from '../entities/User'
import { conflict, forbidden, HttpError } from '../http/errors'
import { enqueueJob } from '../jobs/queue'
import {
  holdReleasedMail,
  moveProposedMail,
  requestAcceptedMail,
  requestDeclinedMail,
  requestSentMail,
  studioCancelledMail,
  withdrawnMail,
  disputedMail,
} from '../mail/templates/requests'
import { heldLitres } from './firings'
import { getPriceList, kilnSpec } from './kilns'
import { queueMail } from './mail'
import { enqueueOpenCheckout, enqueueRefund, moneyOf } from './payments'
import { refundUnderTerms } from '../../shared/refunds'
import {
  factsOf,
  loadRequest,
  moveRequest,
  stateConflict,
  studioPeople,
  viewerOf,
  type RequestContext,
  type Viewer,
} from './request-context'

export const DEPOSIT_EXPIRY_TASK = 'deposit-expiry'

/**
 * The server's ware check of pieces against a firing as it stands now (space left included). `own` is
 * a request already in the firing whose held space is counted as free for its own re-check.
 */
export async function checkAgainstFiring(manager: EntityManager, firing: Firing, pieces: Piece[], { own }: { own?: FiringRequest } = {}) {
  const kiln = await manager.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId })
  const spec = kilnSpec(kiln)
  let held = (await heldLitres(manager, [firing.id])).get(firing.id) ?? 0
  if (own && own.firingId === firing.id && holdsSpace(own.state)) held -= own.volumeL
  const check: WareCheck = checkWare(
    spec,
    {
      kind: firing.kind,
      cone: firing.cone,
      atmosphere: firing.atmosphere,
      slowCool: firing.slowCool,
      remainingCapacityL: Math.max(0, firing.capacityL - held),
    },
    pieces,
  )
  const priceList = await getPriceList(manager, kiln.id)
  const quote = priceList ? quoteRequest(priceList, { atmosphere: firing.atmosphere, slowCool: firing.slowCool }, pieces, spec) : null
  return { check, quote, volumeL: requestVolumeL(pieces) }
}

async function requireOpenFiring(manager: EntityManager, firingId: string) {
  const firing = await manager.getRepository(Firing).findOne({ where: { id: firingId } })
  const kiln = firing && (await manager.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId }))
  const studio = kiln && (await manager.getRepository(Studio).findOneByOrFail({ id: kiln.studioId }))
  if (!firing || !studio?.published || firing.status === 'cancelled') throw new HttpError(404, 'not-found', 'That firing was not found.')
  return { firing, studio }
}

export async function createDraft(ctx: AppContext, potter: User, firingId: string, body: { pieces: Piece[]; notes?: string }) {
  return ctx.db.transaction(async (manager) => {
    const { firing } = await requireOpenFiring(manager, firingId)
    if (!takesRequests(firing.status) || firing.dropOffBy.getTime() < Date.now()) {
      throw conflict('This firing is not taking ware any more.', 'firing-not-open')
    }
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
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    const viewer = await viewerOf(manager, rc, potter)
    if (viewer.side !== 'potter') throw forbidden('Only the potter edits the ware of a request.')
    if (rc.request.state !== 'draft')
      throw conflict('Only a draft can be changed; this request was sent.', 'not-a-draft', { state: rc.request.state })
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
 * agrees to the studio's policies in their current version.
 */
export async function sendRequest(ctx: AppContext, potter: User, id: string, body: { acknowledged: string[]; policiesVersion: number }) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    const viewer = await viewerOf(manager, rc, potter)
    if (viewer.side !== 'potter') throw forbidden('Only the potter sends a request.')
    if (!takesRequests(rc.firing.status) || rc.firing.dropOffBy.getTime() < Date.now())
      throw conflict('This firing is not taking ware any more.', 'firing-not-open')
    const { check, quote, volumeL } = await checkAgainstFiring(manager, rc.firing, rc.request.pieces)
    await manager.update(FiringRequest, id, { verdict: check.verdict, findings: check.findings, quote, volumeL })
    if (check.verdict === 'block') {
      throw new HttpError(
        422,
        'ware-blocked',
        'The ware cannot go in this firing as described. Change what the findings say and try again.',
        undefined,
        {
          findings: check.findings,
        },
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
      throw conflict('The studio changed its policies since you read them. Read them again before sending.', 'policies-changed', {
        policiesVersion: rc.studio.policiesVersion,
      })
    }
    await manager.update(FiringRequest, id, {
      acknowledgedWarnings: warnings,
      policiesVersion: rc.studio.policiesVersion,
      sentAt: new Date(),
    })
    await moveRequest(manager, rc.request, 'sent', potter.id, '', { acknowledged: warnings, policiesVersion: rc.studio.policiesVersion })
    rc.request.quote = quote
    const facts = factsOf(rc, ctx.config.publicUrl)
    for (const person of await studioPeople(manager, rc.studio.id))
      await queueMail(manager, person.email, 'request-sent', requestSentMail(facts))
  })
}

function requireStudioSide(viewer: Viewer) {
  if (viewer.side === 'potter') throw forbidden('Only the studio decides on a request.', 'not-the-studio')
}

/**
 * Accepts a request, holding its space. The firing's row is locked for the check, so concurrent
 * accepts are served one at a time and the firing is never oversold.
 */
export async function acceptRequest(ctx: AppContext, actor: User, id: string) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    requireStudioSide(await viewerOf(manager, rc, actor))
    await holdSpace(ctx, manager, rc, actor.id, 'Accepted by the studio')
  })
}

async function holdSpace(ctx: AppContext, manager: EntityManager, rc: RequestContext, actorId: string, reason: string) {
  const firing = await manager
    .getRepository(Firing)
    .findOneOrFail({ where: { id: rc.request.firingId }, lock: { mode: 'pessimistic_write' } })
  if (rc.request.state !== 'sent')
    throw stateConflict(rc.request, `Only a sent request can be accepted; this one is ${rc.request.state.replace('_', ' ')}.`)
  const held = (await heldLitres(manager, [firing.id])).get(firing.id) ?? 0
  const left = firing.capacityL - held
  if (rc.request.volumeL > left + 1e-9) {
    throw conflict(
      `Not enough space left: the ware needs ${rc.request.volumeL.toFixed(1)} L and ${Math.max(0, left).toFixed(1)} L are free.`,
      'no-space',
      {
        spaceLeftL: Math.max(0, left),
      },
    )
  }
  const deposit = rc.request.quote?.depositCents ?? 0
  const holdHours = rc.studio.policies.depositHoldHours
  const due = deposit > 0 ? new Date(Date.now() + holdHours * 3600_000) : null
  await manager.update(FiringRequest, rc.request.id, { depositDueAt: due, proposedFiringId: null })
  await moveRequest(manager, rc.request, 'accepted', actorId, reason)
  const facts = factsOf(rc, ctx.config.publicUrl)
  if (due) {
    await enqueueOpenCheckout(manager, rc.request.id, 'deposit', deposit)
    await enqueueJob(manager, DEPOSIT_EXPIRY_TASK, { requestId: rc.request.id }, { runAt: due, jobKey: `deposit-expiry:${rc.request.id}` })
  } else {
    await moveRequest(manager, rc.request, 'deposit_paid', null, 'No deposit is asked for this firing')
  }
  await queueMail(manager, rc.potter.email, 'request-accepted', requestAcceptedMail(facts, due))
  await enqueueStudioSync(manager, rc.studio.id)
}

/**
 * Declines a sent request with a reason. After acceptance the studio can still call it off: the
 * request is cancelled and everything paid is refunded in full.
 */
export async function declineRequest(ctx: AppContext, actor: User, id: string, reason: string) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    requireStudioSide(await viewerOf(manager, rc, actor))
    const facts = factsOf(rc, ctx.config.publicUrl)
    if (rc.request.state === 'sent') {
      await moveRequest(manager, rc.request, 'declined', actor.id, reason)
      await queueMail(manager, rc.potter.email, 'request-declined', requestDeclinedMail(facts, reason))
      return
    }
    if (rc.request.state !== 'accepted' && rc.request.state !== 'deposit_paid') {
      throw stateConflict(rc.request, `A request that is ${rc.request.state.replace('_', ' ')} can no longer be declined or called off.`)
    }
    const { net } = await moneyOf(manager, id)
    await moveRequest(manager, rc.request, 'cancelled', actor.id, reason, { by: 'studio' })
    await enqueueRefund(manager, id, net, `Cancelled by the studio: ${reason}`)
    await queueMail(manager, rc.potter.email, 'request-cancelled', studioCancelledMail(facts, reason, net))
    await enqueueStudioSync(manager, rc.studio.id)
  })
}

/** The studio offers another of its firings instead; the potter accepts or refuses. */
export async function proposeMove(ctx: AppContext, actor: User, id: string, firingId: string) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    requireStudioSide(await viewerOf(manager, rc, actor))
    if (rc.request.state !== 'sent') throw stateConflict(rc.request, 'Only a sent request can be moved to another firing.')
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
    await manager.getRepository(RequestEvent).save({
      requestId: id,
      actorId: actor.id,
      fromState: 'sent',
      toState: 'sent',
      reason: 'Another firing proposed',
      data: { proposedFiringId: target.id },
    })
    await queueMail(manager, rc.potter.email, 'move-proposed', moveProposedMail(factsOf(rc, ctx.config.publicUrl), target))
  })
}

/** The potter's answer to a proposed move: accepting takes (and holds) the place in the other firing. */
export async function answerMove(ctx: AppContext, potter: User, id: string, accept: boolean) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    const viewer = await viewerOf(manager, rc, potter)
    if (viewer.side !== 'potter') throw forbidden('Only the potter answers a proposed move.')
    if (rc.request.state !== 'sent' || !rc.request.proposedFiringId) throw conflict('No move is waiting for an answer.', 'no-move')
    const to = rc.request.proposedFiringId
    if (!accept) {
      await manager.update(FiringRequest, id, { proposedFiringId: null })
      await manager.getRepository(RequestEvent).save({
        requestId: id,
        actorId: potter.id,
        fromState: 'sent',
        toState: 'sent',
        reason: 'Move refused',
        data: { proposedFiringId: to },
      })
      return
    }
    const target = await manager.getRepository(Firing).findOneByOrFail({ id: to })
    const { check, quote, volumeL } = await checkAgainstFiring(manager, target, rc.request.pieces)
    if (check.verdict === 'block')
      throw new HttpError(422, 'ware-blocked', 'The ware cannot go in that firing any more.', undefined, { findings: check.findings })
    await manager.update(FiringRequest, id, { firingId: to, quote, volumeL, verdict: check.verdict, findings: check.findings })
    await manager.getRepository(RequestEvent).save({
      requestId: id,
      actorId: potter.id,
      fromState: 'sent',
      toState: 'sent',
      reason: 'Move accepted',
      data: { from: rc.firing.id, to },
    })
    const moved = await loadRequest(manager, id, { lock: true })
    await holdSpace(ctx, manager, moved, potter.id, 'Moved to the proposed firing')
  })
}

/**
 * The potter withdraws before drop-off. A paid deposit is refunded under the studio's terms: in full
 * until N days before the firing, P % after.
 */
export async function withdrawRequest(ctx: AppContext, potter: User, id: string, reason?: string) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    const viewer = await viewerOf(manager, rc, potter)
    if (viewer.side !== 'potter') throw forbidden('Only the potter withdraws a request; the studio declines it.')
    const { net } = await moneyOf(manager, id)
    const refund = refundUnderTerms(net, rc.firing.firingDate, rc.studio.policies.cancellation).refundCents
    const heldSpace = rc.request.state === 'accepted' || rc.request.state === 'deposit_paid'
    await moveRequest(manager, rc.request, 'withdrawn', potter.id, reason ?? '', { paidCents: net, refundCents: refund })
    await enqueueRefund(manager, id, refund, 'Withdrawn by the potter')
    if (rc.request.sentAt) {
      const facts = factsOf(rc, ctx.config.publicUrl)
      for (const person of await studioPeople(manager, rc.studio.id))
        await queueMail(manager, person.email, 'request-withdrawn', withdrawnMail(facts, refund, reason))
    }
    if (heldSpace) await enqueueStudioSync(manager, rc.studio.id)
    return { refundCents: refund }
  })
}

/** The deposit hold ran out: an accepted request that is still unpaid releases its space. */
export async function expireDepositHold(ctx: AppContext, id: string, now = new Date()) {
  const released = await ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    if (rc.request.state !== 'accepted' || !rc.request.depositDueAt || rc.request.depositDueAt > now) return false
    await moveRequest(manager, rc.request, 'cancelled', null, 'The deposit was not paid in time; the space was released', {
      by: 'deposit-hold',
    })
    const facts = factsOf(rc, ctx.config.publicUrl)
    await queueMail(manager, rc.potter.email, 'hold-released', holdReleasedMail(facts, 'potter'))
    for (const person of await studioPeople(manager, rc.studio.id))
      await queueMail(manager, person.email, 'hold-released', holdReleasedMail(facts, 'studio'))
    await enqueueStudioSync(manager, rc.studio.id)
    return true
  })
  return released
}

/** Requests of a firing that hold space when it is cancelled are refunded in full (see cancelFiring). */
export async function refundCancelledByFiring(manager: EntityManager, requestIds: string[]) {
  const requests = await manager.getRepository(FiringRequest).find({ where: { id: In(requestIds) } })
  for (const request of requests) {
    const { net } = await moneyOf(manager, request.id)
    await enqueueRefund(manager, request.id, net, 'The firing was cancelled by the studio')
  }
}

/** A potter's record, as studios see it when deciding on a new request. */
export async function potterRecord(manager: EntityManager, potterId: string) {
  const rows: { state: RequestState; by: string | null; count: number }[] = await manager.query(
    `SELECT r.state, e.data->>'by' AS by, count(*)::int AS count
     FROM firing_requests r
     LEFT JOIN LATERAL (SELECT data FROM request_events WHERE request_id = r.id ORDER BY at DESC LIMIT 1) e ON true
     WHERE r.potter_id = $1 AND r.state <> 'draft' GROUP BY 1, 2`,
    [potterId],
  )
  const count = (pred: (r: (typeof rows)[number]) => boolean) => rows.filter(pred).reduce((n, r) => n + r.count, 0)
  const [rating] = await manager.query(
    `SELECT avg(stars)::float8 AS mean, count(*)::int AS count FROM ratings WHERE potter_id = $1 AND direction = 'studio-rates-potter'`,
    [potterId],
  )
  return {
    requests: count(() => true),
    collected: count((r) => r.state === 'collected'),
    // Not showing up: space held and released for an unpaid deposit, or ware refused at the door.
    noShows: count((r) => r.state === 'cancelled' && (r.by === 'deposit-hold' || r.by === 'refused-at-door')),
    rating: rating.count ? { mean: Math.round(rating.mean * 10) / 10, count: rating.count } : null,
  }
}

/**
 * Either side raises a dispute once the ware has been fired: the request leaves the normal path and
 * waits for the marketplace's admins, who may refund.
 */
export async function disputeRequest(ctx: AppContext, user: User, id: string, reason: string) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, id, { lock: true })
    const viewer = await viewerOf(manager, rc, user)
    await moveRequest(manager, rc.request, 'disputed', user.id, reason, { by: viewer.side })
    const facts = factsOf(rc, ctx.config.publicUrl)
    const others = viewer.side === 'potter' ? await studioPeople(manager, rc.studio.id) : [rc.potter]
    for (const person of others) await queueMail(manager, person.email, 'disputed', disputedMail(facts, user.displayName, reason))
  })
}

/** An admin's refund while settling a dispute: at most what was paid and not yet refunded. */
export async function adminRefund(ctx: AppContext, id: string, amountCents: number, reason: string) {
  return ctx.db.transaction(async (manager) => {
    await loadRequest(manager, id, { lock: true })
    const { net } = await moneyOf(manager, id)
    if (amountCents > net)
      throw new HttpError(400, 'invalid-input', 'That is more than was paid and not yet refunded.', {
        amountCents: `At most ${net} cents.`,
      })
    await enqueueRefund(manager, id, amountCents, `Refunded by the Conewright desk: ${reason}`)
    await manager.getRepository(RequestEvent).save({
      requestId: id,
      actorId: null,
      fromState: null,
      toState: (await manager.getRepository(FiringRequest).findOneByOrFail({ id })).state,
      reason: `Refund of ${amountCents} cents by the desk: ${reason}`,
      data: { amountCents },
    })
  })
}
