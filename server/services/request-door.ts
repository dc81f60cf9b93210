// The one door every request action goes through, in a fixed order: lock the firing (or firings),
// then the request; authorize from the policy table; apply; write the timeline; queue the side effects
// (mail, notices, search sync, jobs) — all in one transaction. Lock order is always firings (by id)
// before requests (by id), everywhere, so two actions never wait on each other in a circle; should
// PostgreSQL still report a deadlock or a serialization failure, the whole action is run again.
import { QueryFailedError, type EntityManager } from 'typeorm'
import {
  allowedActions,
  refusalOf,
  SYSTEM_ACTIONS,
  type RequestAction,
  type RequestFacts,
  type SystemAction,
} from '../../shared/workflow/policy'
import { nextRequestStates, type RequestState } from '../../shared/workflow/request-states'
import type { AppContext } from '../context'
import { Firing } from '../entities/Firing'
import { FiringRequest } from '../entities/FiringRequest'
import { RequestEvent } from '../entities/RequestEvent'
import { RequestResult } from '../entities/RequestResult'
import { Review } from '../entities/Review'
import type { User } from '../entities/User'
import { HttpError, notFound } from '../http/errors'
import { isUuid } from '../http/validate'
import type { MailContent } from '../mail/render'
import { tell } from './notices'
import { moneyOf } from './payments'
import { earnPayout } from './payouts'
import {
  loadRequest,
  moveRequest,
  reviewOpenedAt,
  reviewWindowOpen,
  studioPeople,
  viewerOf,
  type RequestContext,
  type Viewer,
} from './request-context'

const RETRYABLE = new Set(['40P01', '40001'])
const ATTEMPTS = 5

/** Runs work in a transaction, again (up to five times) when PostgreSQL picks it as a deadlock victim. */
export async function inTransaction<T>(ctx: AppContext, work: (manager: EntityManager) => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await ctx.db.transaction(work)
    } catch (error) {
      const code = error instanceof QueryFailedError ? (error.driverError as { code?: string }).code : undefined
      if (!(error instanceof RetryAction) && !(code && RETRYABLE.has(code))) throw error
      if (attempt >= ATTEMPTS) throw new HttpError(503, 'busy', 'The studio’s board is busy right now. Try again in a moment.')
      // A short random pause, so the transactions that collided do not collide again.
      await new Promise((resolve) => setTimeout(resolve, 10 + Math.random() * 40 * attempt))
    }
  }
}

/** Thrown when the request moved to another firing between reading it and locking it. */
class RetryAction extends Error {}

/** Locks firings in id order: the first step of every action that touches a firing. */
export async function lockFirings(manager: EntityManager, ids: string[]): Promise<Map<string, Firing>> {
  const sorted = [...new Set(ids)].sort()
  const locked = new Map<string, Firing>()
  for (const id of sorted) {
    const firing = await manager.getRepository(Firing).findOne({ where: { id }, lock: { mode: 'pessimistic_write' } })
    if (firing) locked.set(id, firing)
  }
  return locked
}

/** What the policy needs to know about a request beyond its state, read inside the action's transaction. */
export async function requestFacts(manager: EntityManager, rc: RequestContext): Promise<RequestFacts> {
  const requestId = rc.request.id
  const { net, counterRefundDue } = await moneyOf(manager, requestId)
  const reviews = await manager.getRepository(Review).find({ where: { requestId }, select: { side: true } })
  const total = rc.request.standingQuote?.totalCents ?? rc.request.quote?.totalCents ?? 0
  return {
    state: rc.request.state,
    firingStatus: rc.firing.status,
    depositOwedCents: rc.request.state === 'accepted' ? Math.max(0, (rc.request.depositAskedCents ?? 0) - net) : 0,
    balanceOwedCents: Math.max(0, total - net),
    pricePending: rc.request.pendingQuote !== null,
    proposedMove: rc.request.proposedFiringId !== null,
    resultsPosted: await manager.getRepository(RequestResult).exists({ where: { requestId } }),
    ratedBy: { potter: reviews.some((r) => r.side === 'potter'), studio: reviews.some((r) => r.side === 'studio') },
    reviewWindowOpen: reviewWindowOpen(await reviewOpenedAt(manager, requestId)),
    counterRefundDueCents: counterRefundDue,
  }
}

/** Everything an action's body works with, and the ways it records and tells what it did. */
export interface ActionStep {
  ctx: AppContext
  manager: EntityManager
  rc: RequestContext
  /** Who acts: a person on a side, or Conewright itself (webhooks, timers, a firing moving). */
  viewer: Viewer | { side: 'system' }
  actorId: string | null
  facts: RequestFacts
  /** Moves the request along the state machine, writing the timeline entry. */
  move(to: RequestState, reason: string, data?: Record<string, unknown>): Promise<void>
  /** A timeline entry for an action that leaves the state as it is (a price confirmed, results posted). */
  note(reason: string, data?: Record<string, unknown>): Promise<void>
  /** A notice and a mail to the potter. */
  tellPotter(kind: string, content: MailContent): Promise<void>
  /** A notice and a mail to each of the studio's people. */
  tellStudio(kind: string, content: MailContent): Promise<void>
  /** Set when the action's mail and refunds are held back until an undo window closes. */
  hold?: HoldBack
}

/**
 * Side effects held back until a stage move can no longer be undone: mail to people and money going
 * out wait until `runAt`; notices are shown at once and taken back by an undo.
 */
export interface HoldBack {
  runAt: Date
  firingEventId: string
  /** Keys of the held jobs and ids of the held mails, filled in as the move runs, for the undo. */
  jobKeys: string[]
  mailIds: string[]
  counterRefundIds: string[]
}

/** A job key for a held-back job, remembered on the hold so an undo can remove the job. */
export function heldJobKey(hold: HoldBack, what: string): string {
  const key = `firing-event:${hold.firingEventId}:${what}:${hold.jobKeys.length}`
  hold.jobKeys.push(key)
  return key
}

export interface ActionOptions {
  /** Hold mail and refunds back (a stage move that may be undone). */
  hold?: HoldBack
  /** Other firings the action touches (a move to another firing): locked with the request's own, in id order. */
  alsoLock?: (request: FiringRequest) => string[]
}

/**
 * Runs one action on one request through the door. `actor` null is Conewright itself, which may take
 * only the system actions; a person's action is checked against the policy table (403 for the wrong
 * side, 409 for the wrong moment, 404 for someone with no standing on the request).
 */
export async function requestAction<T>(
  ctx: AppContext,
  actor: Pick<User, 'id' | 'role'> | null,
  requestId: string,
  action: ActionChoice,
  apply: (step: ActionStep) => Promise<T>,
  options: ActionOptions = {},
): Promise<T> {
  if (!isUuid(requestId)) throw notFound('That ask')
  return inTransaction(ctx, (manager) => requestActionIn(ctx, manager, actor, requestId, action, apply, options))
}

/** An action, or a choice of action by the state the locked request is in (decline before acceptance, call off after). */
export type ActionChoice = RequestAction | SystemAction | ((state: RequestState) => RequestAction)

/**
 * The same door inside a transaction the caller already holds (a webhook recording its event, a
 * firing moving all its requests): the caller locked any firing first, and retries the whole.
 */
export async function requestActionIn<T>(
  ctx: AppContext,
  manager: EntityManager,
  actor: Pick<User, 'id' | 'role'> | null,
  requestId: string,
  choice: ActionChoice,
  apply: (step: ActionStep) => Promise<T>,
  options: ActionOptions = {},
): Promise<T> {
  {
    const unlocked = await manager.getRepository(FiringRequest).findOne({ where: { id: requestId } })
    if (!unlocked) throw notFound('That ask')
    await lockFirings(manager, [unlocked.firingId, ...(options.alsoLock?.(unlocked) ?? [])])
    const rc = await loadRequest(manager, requestId, { lock: true })
    if (rc.request.firingId !== unlocked.firingId) throw new RetryAction()
    const viewer: ActionStep['viewer'] = actor ? await viewerOf(manager, rc, actor) : { side: 'system' }
    const action = typeof choice === 'function' ? choice(rc.request.state) : choice
    const facts = await requestFacts(manager, rc)
    // System actions are Conewright's own (or the desk's, behind the admin guard): the policy table
    // governs what people on either side may do.
    if (viewer.side !== 'system' && !(SYSTEM_ACTIONS as readonly string[]).includes(action)) {
      const refusal = refusalOf(action as RequestAction, facts, viewer.side)
      if (refusal) {
        throw new HttpError(refusal.status, refusal.code, refusal.message, undefined, {
          state: facts.state,
          allowed: nextRequestStates(facts.state),
          actions: allowedActions(facts, viewer.side),
        })
      }
    }
    const actorId = actor?.id ?? null
    const path = `/requests/${requestId}`
    const hold = options.hold
    const links = { path, requestId, firingId: rc.firing.id, firingEventId: hold?.firingEventId ?? null }
    const tellOne = async (person: User, kind: string, content: MailContent) => {
      const mailId = await tell(manager, person, kind, content, links, hold ? { runAt: hold.runAt, jobKey: heldJobKey(hold, 'mail') } : {})
      if (hold && mailId) hold.mailIds.push(mailId)
    }
    const step: ActionStep = {
      ctx,
      manager,
      rc,
      viewer,
      actorId,
      facts,
      move: (to, reason, data = {}) => moveRequest(manager, rc.request, to, actorId, reason, data),
      note: async (reason, data = {}) => {
        await manager
          .getRepository(RequestEvent)
          .save({ requestId, actorId, fromState: rc.request.state, toState: rc.request.state, reason, data })
      },
      tellPotter: (kind, content) => tellOne(rc.potter, kind, content),
      tellStudio: async (kind, content) => {
        for (const person of await studioPeople(manager, rc.studio.id)) await tellOne(person, kind, content)
      },
      hold,
    }
    const before = rc.request.state
    const result = await apply(step)
    // Reaching collection, or ending with money the studio keeps, earns the studio its share.
    if (rc.request.state !== before) await earnPayout(step)
    return result
  }
}
