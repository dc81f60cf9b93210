// A firing moving through its stages (taking ware, full, closed, loading, firing, cooling, unloaded),
// its cancellation, and the undo of its last stage move. Each runs through the same door as request
// actions, in the same lock order: the firing first, then its requests by id.
//
// A stage move carries every request in the firing along (a lapse for what was still waiting, a
// no-show for ware never brought, "fired" at unloading). Its notices show at once; its mail and money
// wait until the undo window has closed, so an undo within it takes everything back.
import { TZDate } from '@date-fns/tz'
import { In, IsNull, type EntityManager } from 'typeorm'
import { formatDateTime } from '../../shared/dates'
import { refundUnderTerms } from '../../shared/refunds'
import { canMoveFiring, FIRING_STATUS_LABELS, nextFiringStatuses, type FiringStatus } from '../../shared/workflow/firing-status'
import type { RequestState } from '../../shared/workflow/request-states'
import { UNDO_WINDOW_MS } from '../../shared/workflow/undo'
import type { AppContext } from '../context'
import type { Firing } from '../entities/Firing'
import { FiringEvent, type FiringMoveEffects } from '../entities/FiringEvent'
import { FiringRequest } from '../entities/FiringRequest'
import { Kiln } from '../entities/Kiln'
import { OutboundMail } from '../entities/OutboundMail'
import { RequestEvent } from '../entities/RequestEvent'
import { Studio } from '../entities/Studio'
import type { User } from '../entities/User'
import { conflict, HttpError, notFound } from '../http/errors'
import { firingCancelledMail } from '../mail/templates/firings'
import { firingProgressMail, noShowMail } from '../mail/templates/pickup'
import { recordLoaded } from './load-plan'
import { withdrawNotices } from './notices'
import { enqueueExpireCheckouts, enqueueRefund, moneyOf } from './payments'
import { factsOf } from './request-context'
import { heldJobKey, inTransaction, lockFirings, requestActionIn, type ActionStep, type HoldBack } from './request-door'
import { lapse, recordCounterRefundDue } from './requests'
import { enqueueStudioSync } from './search-sync'

/** Held mail and money go out a minute after the window, so an undo at its last second still wins. */
const HOLD_MS = UNDO_WINDOW_MS + 60_000

/** Requests that still expect the firing to happen, locked in id order after the firing. */
async function lockRequests(manager: EntityManager, firingId: string, states: readonly RequestState[]) {
  return manager
    .getRepository(FiringRequest)
    .createQueryBuilder('r')
    .where('r.firing_id = :firingId', { firingId })
    .andWhere('r.state IN (:...states)', { states })
    .orderBy('r.id', 'ASC')
    .setLock('pessimistic_write')
    .getMany()
}

const noEffects = (): FiringMoveEffects => ({ requests: [], jobKeys: [], mailIds: [], counterRefundIds: [] })

const WAITING: RequestState[] = ['sent', 'accepted']
const AFFECTED_BY_STAGE: RequestState[] = ['sent', 'accepted', 'deposit_paid', 'received']

/** What a move would do to the requests in the firing, in words for the confirmation. */
function effectsInWords(to: FiringStatus, requests: FiringRequest[]): string[] {
  const count = (states: RequestState[]) => requests.filter((r) => states.includes(r.state)).length
  const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`
  const words: string[] = []
  const waiting = count(WAITING)
  if ((to === 'full' || to === 'closed' || to === 'loading') && waiting > 0)
    words.push(`${plural(waiting, 'ask still waiting lapses', 'asks still waiting lapse')}, and their potters are told.`)
  const absent = count(['deposit_paid'])
  if (to === 'loading' && absent > 0)
    words.push(
      `${plural(absent, 'potter with space held has', 'potters with space held have')} not brought ware: their places lapse under your terms.`,
    )
  return words
}

function studioDay(date: Date, timezone: string) {
  const local = new TZDate(date, timezone)
  return `${local.getFullYear()}-${local.getMonth()}-${local.getDate()}`
}

/**
 * Why a move needs the studio's confirmation, or null: starting before the posted date or loading
 * while drop-off is still open, and any move that makes requests lapse.
 */
function confirmationNeeded(firing: Firing, to: FiringStatus, timezone: string, requests: FiringRequest[], now: Date): string | null {
  const reasons: string[] = []
  if (to === 'firing' && firing.firingDate > now && studioDay(firing.firingDate, timezone) !== studioDay(now, timezone))
    reasons.push(`This firing is posted for ${formatDateTime(firing.firingDate, timezone)}. Start it now, ahead of that date?`)
  if (to === 'loading' && firing.dropOffBy > now)
    reasons.push(`Drop-off is open until ${formatDateTime(firing.dropOffBy, timezone)}. Start loading before it closes?`)
  reasons.push(...effectsInWords(to, requests))
  return reasons.length ? reasons.join(' ') : null
}

export interface MoveFiringResult {
  firing: Firing
  event: FiringEvent
}

/**
 * Moves a firing to another stage. A move that needs confirmation is refused with 409
 * `needs-confirmation` and the reason (naming the date) until it is asked again with `confirm`.
 */
export async function moveFiring(
  ctx: AppContext,
  actor: Pick<User, 'id' | 'role'>,
  firingId: string,
  to: FiringStatus,
  { confirm = false, now = new Date() }: { confirm?: boolean; now?: Date } = {},
): Promise<MoveFiringResult> {
  return inTransaction(ctx, async (manager) => {
    const firing = (await lockFirings(manager, [firingId])).get(firingId)
    if (!firing) throw notFound('That firing')
    if (firing.status === 'cancelled') throw conflict('This firing is cancelled.', 'firing-cancelled')
    if (to === 'cancelled') throw conflict('Cancel a firing with its cancel action, giving a reason.', 'use-cancel')
    if (to === firing.status) throw conflict(`This firing is already ${FIRING_STATUS_LABELS[to].toLowerCase()}.`, 'no-change')
    if (!canMoveFiring(firing.status, to)) {
      throw conflict(
        `A firing that is ${FIRING_STATUS_LABELS[firing.status].toLowerCase()} cannot become ${FIRING_STATUS_LABELS[to].toLowerCase()}.`,
        'bad-status-change',
        {
          allowed: nextFiringStatuses(firing.status),
        },
      )
    }
    const kiln = await manager.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId })
    const studio = await manager.getRepository(Studio).findOneByOrFail({ id: kiln.studioId })
    const requests = await lockRequests(manager, firingId, AFFECTED_BY_STAGE)
    const question = confirmationNeeded(firing, to, studio.timezone, requests, now)
    if (question && !confirm) throw new HttpError(409, 'needs-confirmation', question, undefined, { status: to })

    const from = firing.status
    const event = await manager.getRepository(FiringEvent).save({
      firingId,
      actorId: actor.id,
      fromStatus: from,
      toStatus: to,
      reason: '',
      effects: noEffects(),
      undoneAt: null,
    })
    const hold: HoldBack = {
      runAt: new Date(now.getTime() + HOLD_MS),
      firingEventId: event.id,
      jobKeys: [],
      mailIds: [],
      counterRefundIds: [],
    }
    firing.status = to
    await manager.update('firings', firingId, { status: to })
    const moved: FiringMoveEffects['requests'] = []
    for (const request of requests) {
      const before = request.state
      await requestActionIn(ctx, manager, null, request.id, 'firing-moved', (step) => carryAlong(step, to), { hold })
      const after = (await manager.getRepository(FiringRequest).findOneByOrFail({ id: request.id })).state
      if (after !== before) moved.push({ requestId: request.id, from: before, to: after })
    }
    // What goes into the kiln is the plan as it stands now: kept, so nothing moves afterwards.
    if (to === 'loading') await recordLoaded(manager, firing, now)
    event.effects = { requests: moved, jobKeys: hold.jobKeys, mailIds: hold.mailIds, counterRefundIds: hold.counterRefundIds }
    await manager.getRepository(FiringEvent).save(event)
    await enqueueStudioSync(manager, studio.id)
    return { firing, event }
  })
}

const STAGE_NOTE: Partial<Record<FiringStatus, string>> = {
  loading: 'Loaded into the kiln',
  firing: 'The firing started',
  cooling: 'The kiln is cooling',
}

/** One request carried along by its firing's move (inside the door, under the firing's lock). */
async function carryAlong(step: ActionStep, to: FiringStatus) {
  const { manager, rc, ctx, hold } = step
  const state = rc.request.state
  if (state === 'sent' || state === 'accepted') {
    if (to === 'full' || to === 'closed') await lapse(step, 'firing-closed', { tellStudio: false })
    else if (to === 'loading') await lapse(step, 'firing-loading', { tellStudio: false })
    return
  }
  if (state === 'deposit_paid') {
    if (to !== 'loading') return
    const { net } = await moneyOf(manager, rc.request.id)
    const refund = refundUnderTerms(net, rc.firing.firingDate, rc.studio.policies.cancellation).refundCents
    await step.move('cancelled', 'The ware was not dropped off before loading', { by: 'no-show', refundCents: refund })
    const held = (what: string) => (hold ? { runAt: hold.runAt, jobKey: heldJobKey(hold, what) } : {})
    await enqueueRefund(manager, rc.request.id, refund, 'No-show: refunded under the studio’s terms', held('refund'))
    await recordCounterRefundDue(step, refund)
    await step.tellPotter('no-show', noShowMail(factsOf(rc, ctx.config.publicUrl), refund))
    return
  }
  if (state !== 'received') return
  if (to === 'unloaded') {
    await step.move('fired', 'The kiln was unloaded')
    await step.tellPotter('firing-progress', firingProgressMail(factsOf(rc, ctx.config.publicUrl), 'unloaded'))
  } else if (STAGE_NOTE[to]) {
    await step.note(STAGE_NOTE[to]!, { firingStatus: to })
    if (to === 'firing') await step.tellPotter('firing-progress', firingProgressMail(factsOf(rc, ctx.config.publicUrl), 'firing'))
  }
}

/** The firing's last stage move, if it can still be undone. */
export async function undoableMove(manager: EntityManager, firing: Firing, now = new Date()): Promise<FiringEvent | null> {
  const last = await manager.getRepository(FiringEvent).findOne({ where: { firingId: firing.id }, order: { at: 'DESC' } })
  if (!last || last.undoneAt || last.toStatus !== firing.status || last.toStatus === 'cancelled') return null
  return now.getTime() - last.at.getTime() <= UNDO_WINDOW_MS ? last : null
}

/**
 * Takes back the firing's last stage move within the undo window: the firing returns to where it was,
 * each request it carried along goes back (with the undo on its timeline), and the held mail, refunds
 * and notices are withdrawn before any of them went out.
 */
export async function undoFiringMove(ctx: AppContext, actor: Pick<User, 'id'>, firingId: string, now = new Date()) {
  return inTransaction(ctx, async (manager) => {
    const firing = (await lockFirings(manager, [firingId])).get(firingId)
    if (!firing) throw notFound('That firing')
    const event = await undoableMove(manager, firing, now)
    if (!event)
      throw conflict('There is no stage move to undo: the last one is more than 10 minutes old, or already undone.', 'nothing-to-undo')
    const requests = await manager
      .getRepository(FiringRequest)
      .createQueryBuilder('r')
      .where('r.id IN (:...ids)', { ids: event.effects.requests.map((r) => r.requestId).concat('00000000-0000-0000-0000-000000000000') })
      .orderBy('r.id', 'ASC')
      .setLock('pessimistic_write')
      .getMany()
    for (const effect of event.effects.requests) {
      const request = requests.find((r) => r.id === effect.requestId)
      // The request moved on by itself since (a potter withdrew, say): it stays where it now is.
      if (!request || request.state !== effect.to) continue
      await manager.update(FiringRequest, request.id, { state: effect.from })
      await manager.getRepository(RequestEvent).save({
        requestId: request.id,
        actorId: actor.id,
        fromState: effect.to,
        toState: effect.from,
        reason: `Undone: the firing went back from ${FIRING_STATUS_LABELS[event.toStatus].toLowerCase()} to ${FIRING_STATUS_LABELS[event.fromStatus].toLowerCase()}`,
        data: { undoOf: event.id },
      })
    }
    // Received ware that only got a timeline note (loading, firing, cooling) hears of the undo too.
    const noted = await manager.query(
      `SELECT DISTINCT request_id AS id FROM request_events WHERE (data ->> 'firingStatus') = $1 AND at >= $2 AND request_id IN (SELECT id FROM firing_requests WHERE firing_id = $3)`,
      [event.toStatus, event.at, firingId],
    )
    for (const { id } of noted as { id: string }[]) {
      const state = (await manager.getRepository(FiringRequest).findOneByOrFail({ id })).state
      await manager.getRepository(RequestEvent).save({
        requestId: id,
        actorId: actor.id,
        fromState: state,
        toState: state,
        reason: `Undone: the firing went back to ${FIRING_STATUS_LABELS[event.fromStatus].toLowerCase()}`,
        data: { undoOf: event.id },
      })
    }
    for (const key of event.effects.jobKeys) await manager.query('SELECT graphile_worker.remove_job($1)', [key])
    if (event.effects.mailIds.length) await manager.getRepository(OutboundMail).delete({ id: In(event.effects.mailIds), sentAt: IsNull() })
    if (event.effects.counterRefundIds.length)
      await manager.query(`DELETE FROM counter_refunds WHERE id = ANY($1::uuid[]) AND paid_at IS NULL`, [event.effects.counterRefundIds])
    await withdrawNotices(manager, event.id)
    await manager.update('firings', firingId, { status: event.fromStatus })
    firing.status = event.fromStatus
    await manager.update(FiringEvent, event.id, { undoneAt: now })
    const kiln = await manager.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId })
    await enqueueStudioSync(manager, kiln.studioId)
    return firing
  })
}

/** Requests that still expect this firing to happen. */
const LIVE_REQUEST_STATES: RequestState[] = ['draft', 'sent', 'accepted', 'deposit_paid']

/** Cancels a firing and every live request in it, refunds what was paid in full and tells each potter. */
export async function cancelFiring(
  ctx: AppContext,
  actor: Pick<User, 'id'>,
  firingId: string,
  reason: string,
): Promise<{ firing: Firing; requestIds: string[] }> {
  return inTransaction(ctx, async (manager) => {
    const firing = (await lockFirings(manager, [firingId])).get(firingId)
    if (!firing) throw notFound('That firing')
    if (firing.status === 'cancelled') throw conflict('This firing is already cancelled.', 'firing-cancelled')
    if (!canMoveFiring(firing.status, 'cancelled')) {
      throw conflict('Ware is already in the kiln; this firing can no longer be called off.', 'bad-status-change', {
        allowed: nextFiringStatuses(firing.status),
      })
    }
    await manager.getRepository(FiringEvent).save({
      firingId,
      actorId: actor.id,
      fromStatus: firing.status,
      toStatus: 'cancelled',
      reason,
      effects: noEffects(),
      undoneAt: null,
    })
    firing.status = 'cancelled'
    firing.cancelledReason = reason
    await manager.update('firings', firingId, { status: 'cancelled', cancelledReason: reason })
    const requests = await lockRequests(manager, firingId, LIVE_REQUEST_STATES)
    for (const request of requests) {
      await requestActionIn(ctx, manager, null, request.id, 'firing-moved', async (step) => {
        const { rc } = step
        if (rc.request.state === 'draft') {
          await step.move('cancelled', `Firing called off: ${reason}`, { by: 'studio' })
          return
        }
        // Everything paid goes back in full: the studio called the firing off.
        const { net } = await moneyOf(manager, rc.request.id)
        await step.move('cancelled', `Firing called off: ${reason}`, { by: 'studio', refundCents: net })
        await enqueueRefund(manager, rc.request.id, net, 'The firing was cancelled by the studio')
        await recordCounterRefundDue(step, net)
        await enqueueExpireCheckouts(manager, rc.request.id)
        await step.tellPotter(
          'firing-cancelled',
          firingCancelledMail(
            rc.potter.displayName,
            {
              studioName: rc.studio.name,
              kilnName: rc.kiln.name,
              cone: rc.firing.cone,
              atmosphere: rc.firing.atmosphere,
              kind: rc.firing.kind,
              firingDate: rc.firing.firingDate,
              timezone: rc.studio.timezone,
            },
            reason,
            `${ctx.config.publicUrl}/requests/${rc.request.id}`,
          ),
        )
      })
    }
    const kiln = await manager.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId })
    await enqueueStudioSync(manager, kiln.studioId)
    return { firing, requestIds: requests.map((r) => r.id) }
  })
}
