import type { EntityManager } from 'typeorm'
import { reviewWindowClosesAt } from '../../shared/reviews'
import { canMoveRequest, nextRequestStates, REQUEST_STATE_LABELS, type RequestState } from '../../shared/workflow/request-states'
import { Firing } from '../entities/Firing'
import { FiringRequest } from '../entities/FiringRequest'
import { Kiln } from '../entities/Kiln'
import { RequestEvent } from '../entities/RequestEvent'
import { Studio } from '../entities/Studio'
import { StudioMember } from '../entities/StudioMember'
import { User } from '../entities/User'
import { conflict, notFound } from '../http/errors'
import { isUuid } from '../http/validate'
import type { RequestFacts } from '../mail/templates/requests'

/** A request with everything around it that the workflow and the views need. */
export interface RequestContext {
  request: FiringRequest
  firing: Firing
  kiln: Kiln
  studio: Studio
  potter: User
}

/** Who is looking at a request: its potter, one of the studio's people, or an admin. */
/** The currency of an ask's money, as an upper-case ISO code: its standing quote's, else its quote's, else the studio's. */
export const askCurrency = (request: Pick<FiringRequest, 'standingQuote' | 'quote'>, studio: Pick<Studio, 'currency'>) =>
  ((request.standingQuote ?? request.quote)?.currency ?? studio.currency).toUpperCase()

export type Viewer = { side: 'potter' } | { side: 'studio'; role: 'owner' | 'crew' } | { side: 'admin' }

export async function loadRequest(manager: EntityManager, id: string, { lock = false } = {}): Promise<RequestContext> {
  if (!isUuid(id)) throw notFound('That ask')
  const request = await manager
    .getRepository(FiringRequest)
    .findOne({ where: { id }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) })
  if (!request) throw notFound('That ask')
  const firing = await manager.getRepository(Firing).findOneByOrFail({ id: request.firingId })
  const kiln = await manager.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId })
  const studio = await manager.getRepository(Studio).findOneByOrFail({ id: kiln.studioId })
  const potter = await manager.getRepository(User).findOneByOrFail({ id: request.potterId })
  return { request, firing, kiln, studio, potter }
}

/**
 * The viewer's standing on a request, or a 404 as if it did not exist: the one place that decides
 * who may see a request.
 */
export async function viewerOf(manager: EntityManager, rc: RequestContext, user: Pick<User, 'id' | 'role'>): Promise<Viewer> {
  if (user.role === 'admin') return { side: 'admin' }
  if (rc.request.potterId === user.id) return { side: 'potter' }
  const member = await manager.getRepository(StudioMember).findOne({ where: { studioId: rc.studio.id, userId: user.id } })
  // A draft is the potter's own until it is sent.
  if (member && rc.request.state !== 'draft') return { side: 'studio', role: member.role }
  throw notFound('That ask')
}

const inWords = (state: RequestState) => `“${REQUEST_STATE_LABELS[state]}”`

/** The state machine's refusal: a 409 naming the request's state and the states allowed from it. */
export function stateConflict(request: FiringRequest, message = `This stands at ${inWords(request.state)}; that cannot be done now.`) {
  return conflict(message, 'bad-state-change', { state: request.state, allowed: nextRequestStates(request.state) })
}

/** Moves a request along the one state machine, recording who, when, from, to and why. */
export async function moveRequest(
  manager: EntityManager,
  request: FiringRequest,
  to: RequestState,
  actorId: string | null,
  reason = '',
  data: Record<string, unknown> = {},
) {
  if (!canMoveRequest(request.state, to))
    throw stateConflict(request, `What stands at ${inWords(request.state)} cannot move to ${inWords(to)}.`)
  await manager.getRepository(RequestEvent).save({ requestId: request.id, actorId, fromState: request.state, toState: to, reason, data })
  request.state = to
  await manager.update(FiringRequest, request.id, { state: to })
}

/** Everyone on the studio's side who hears about its requests: the owner and the crew. */
export async function studioPeople(manager: EntityManager, studioId: string): Promise<User[]> {
  const members = await manager.getRepository(StudioMember).find({ where: { studioId }, relations: { user: true } })
  return members.map((m) => m.user)
}

export function factsOf(rc: RequestContext, publicUrl: string): RequestFacts {
  return {
    requestUrl: `${publicUrl}/requests/${rc.request.id}`,
    potterName: rc.potter.displayName,
    studioName: rc.studio.name,
    kilnName: rc.kiln.name,
    cone: rc.firing.cone,
    atmosphere: rc.firing.atmosphere,
    kind: rc.firing.kind,
    firingDate: rc.firing.firingDate,
    dropOffBy: rc.firing.dropOffBy,
    timezone: rc.studio.timezone,
    pieceCount: rc.request.pieces.reduce((n, p) => n + p.quantity, 0),
    currency: (rc.request.standingQuote ?? rc.request.quote)?.currency ?? rc.studio.currency,
    // The price that stands and the deposit as asked: the same figures on every screen and in every mail.
    totalCents: (rc.request.standingQuote ?? rc.request.quote)?.totalCents ?? 0,
    depositCents: rc.request.depositAskedCents ?? rc.request.quote?.depositCents ?? 0,
  }
}

/** When the answers after pickup opened: the ware collected, or a dispute raised before that. Null before either. */
export async function reviewOpenedAt(manager: EntityManager, requestId: string): Promise<Date | null> {
  const [row]: { opened: Date | null }[] = await manager.query(
    `SELECT min(at) AS opened FROM request_events WHERE request_id = $1 AND to_state IN ('collected', 'disputed')`,
    [requestId],
  )
  return row?.opened ? new Date(row.opened) : null
}

/** Whether answers may still be given at `now`; before pickup the state decides, so the window counts as open. */
export function reviewWindowOpen(openedAt: Date | null, now = new Date()): boolean {
  return openedAt === null || now.getTime() < reviewWindowClosesAt(openedAt).getTime()
}
