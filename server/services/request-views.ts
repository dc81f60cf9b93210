import type { EntityManager } from 'typeorm'
import { holdsSpace, nextRequestStates, type RequestState } from '../../shared/workflow/request-states'
import { Firing } from '../entities/Firing'
import { FiringRequest } from '../entities/FiringRequest'
import { RequestEvent } from '../entities/RequestEvent'
import { StudioMember } from '../entities/StudioMember'
import { User } from '../entities/User'
import { firingJson, heldLitres } from './firings'
import { kilnJson } from './kilns'
import { moneyOf, openPaymentsOf } from './payments'
import { loadRequest, viewerOf, type RequestContext, type Viewer } from './request-context'
import { potterRecord } from './requests'
import { requestPhotos } from './photos'
import { pickupJson } from './pickup'
import { ratingsOfRequest } from './ratings'

/** What each side may do next with a request, for the page to offer (the server still checks). */
function actionsFor(rc: RequestContext, viewer: Viewer, pickup: Awaited<ReturnType<typeof pickupJson>>): string[] {
  const state = rc.request.state
  const studio = viewer.side !== 'potter'
  const potter = viewer.side === 'potter' || viewer.side === 'admin'
  const actions: string[] = ['message']
  if (potter && state === 'draft') actions.push('edit', 'send')
  if (potter && ['sent', 'accepted', 'deposit_paid'].includes(state)) actions.push('withdraw')
  if (potter && state === 'accepted' && rc.request.depositDueAt) actions.push('pay-deposit')
  if (potter && state === 'sent' && rc.request.proposedFiringId) actions.push('answer-move')
  if (studio && state === 'sent') actions.push('accept', 'decline', 'move')
  if (studio && ['accepted', 'deposit_paid'].includes(state)) actions.push('cancel')
  if (studio && state === 'deposit_paid') actions.push('check-in')
  if (studio && (state === 'accepted' || (state === 'ready' && pickup.owedCents > 0))) actions.push('counter-payment')
  if (studio && ['fired', 'ready'].includes(state)) actions.push('results')
  if (studio && state === 'fired') actions.push('ready')
  if (studio && state === 'ready' && pickup.owedCents === 0) actions.push('collected')
  if (potter && state === 'received' && pickup.checkIn && !pickup.checkIn.priceConfirmedAt) actions.push('confirm-price')
  if (potter && state === 'ready' && pickup.owedCents > 0) actions.push('pay-balance')
  if (['collected', 'disputed'].includes(state) && viewer.side !== 'admin') actions.push('rate')
  if (studio && ['collected', 'disputed'].includes(state)) actions.push('reply')
  if (viewer.side !== 'admin' && ['fired', 'ready', 'collected'].includes(state)) actions.push('dispute')
  return actions
}

export async function requestJson(manager: EntityManager, rc: RequestContext, viewer: Viewer) {
  const events = await manager.getRepository(RequestEvent).find({ where: { requestId: rc.request.id }, order: { at: 'ASC' } })
  const actors = new Map(
    (await manager.getRepository(User).findByIds([...new Set(events.map((e) => e.actorId).filter(Boolean))] as string[])).map((u) => [
      u.id,
      u.displayName,
    ]),
  )
  const money = await moneyOf(manager, rc.request.id)
  const payments = await openPaymentsOf(manager, rc.request.id)
  const held = (await heldLitres(manager, [rc.firing.id])).get(rc.firing.id) ?? 0
  const pickup = await pickupJson(manager, rc, money.net)
  const proposed = rc.request.proposedFiringId ? await manager.getRepository(Firing).findOneBy({ id: rc.request.proposedFiringId }) : null
  // The street address goes to a potter only once the studio has agreed to take the ware.
  const showAddress = viewer.side !== 'potter' || holdsSpace(rc.request.state)
  return {
    id: rc.request.id,
    state: rc.request.state,
    nextStates: nextRequestStates(rc.request.state),
    actions: actionsFor(rc, viewer, pickup),
    viewer: viewer.side,
    pieces: rc.request.pieces,
    notes: rc.request.notes,
    volumeL: Math.round(rc.request.volumeL * 100) / 100,
    verdict: rc.request.verdict,
    findings: rc.request.findings,
    acknowledgedWarnings: rc.request.acknowledgedWarnings,
    quote: rc.request.quote,
    policiesVersion: rc.request.policiesVersion,
    depositDueAt: rc.request.depositDueAt?.toISOString() ?? null,
    sentAt: rc.request.sentAt?.toISOString() ?? null,
    createdAt: rc.request.createdAt.toISOString(),
    firing: firingJson(rc.firing, rc.studio.id, held),
    proposedFiring: proposed ? firingJson(proposed, rc.studio.id, (await heldLitres(manager, [proposed.id])).get(proposed.id) ?? 0) : null,
    kiln: kilnJson(rc.kiln),
    studio: {
      id: rc.studio.id,
      name: rc.studio.name,
      city: rc.studio.city,
      region: rc.studio.region,
      timezone: rc.studio.timezone,
      dropOffHours: rc.studio.dropOffHours,
      policies: rc.studio.policies,
      policiesVersion: rc.studio.policiesVersion,
      address: showAddress ? rc.studio.addressLine : null,
    },
    potter: {
      id: rc.potter.id,
      displayName: rc.potter.displayName,
      ...(viewer.side !== 'potter' ? { email: rc.potter.email, record: await potterRecord(manager, rc.potter.id) } : {}),
    },
    timeline: events.map((e) => ({
      at: e.at.toISOString(),
      from: e.fromState,
      to: e.toState,
      by: e.actorId ? (actors.get(e.actorId) ?? 'Someone') : 'Conewright',
      reason: e.reason,
    })),
    ledger: money.entries.map((e) => ({
      at: e.at.toISOString(),
      direction: e.direction,
      kind: e.kind,
      amountCents: e.amountCents,
      currency: e.currency,
      stripeSessionId: e.stripeSessionId,
      stripePaymentIntentId: e.stripePaymentIntentId,
      stripeRefundId: e.stripeRefundId,
      note: e.note,
    })),
    paid: { inCents: money.paidIn, refundedCents: money.refunded, depositCents: money.depositPaid },
    ...pickup,
    photos: await requestPhotos(manager, rc.request.id),
    ratings: await ratingsOfRequest(manager, rc.request.id),
    payments: payments.map((p) => ({
      purpose: p.purpose,
      status: p.status,
      amountCents: p.amountCents,
      currency: p.currency,
      checkoutUrl: viewer.side === 'studio' ? null : p.status === 'open' ? p.checkoutUrl : null,
      failureMessage: p.failureMessage,
      expiresAt: p.expiresAt.toISOString(),
    })),
  }
}

/** A list row: enough to show state and next step. */
export async function requestRows(manager: EntityManager, requests: FiringRequest[]) {
  if (!requests.length) return []
  const rows: {
    id: string
    firing_id: string
    firing_date: Date
    drop_off_by: string
    cone: string
    atmosphere: string
    kind: string
    studio_id: string
    studio_name: string
    timezone: string
    kiln_name: string
    potter_name: string
  }[] = await manager.query(
    `SELECT r.id, f.id AS firing_id, f.firing_date, f.drop_off_by, f.cone, f.atmosphere, f.kind, s.id AS studio_id, s.name AS studio_name, s.timezone, k.name AS kiln_name, u.display_name AS potter_name
     FROM firing_requests r JOIN firings f ON f.id = r.firing_id JOIN kilns k ON k.id = f.kiln_id JOIN studios s ON s.id = k.studio_id JOIN users u ON u.id = r.potter_id
     WHERE r.id = ANY($1::uuid[])`,
    [requests.map((r) => r.id)],
  )
  const byId = new Map(rows.map((r) => [r.id, r]))
  return requests.map((r) => {
    const row = byId.get(r.id)!
    return {
      id: r.id,
      state: r.state,
      verdict: r.verdict,
      findings: r.findings.length,
      volumeL: Math.round(r.volumeL * 100) / 100,
      pieceCount: r.pieces.reduce((n, p) => n + p.quantity, 0),
      quote: r.quote ? { totalCents: r.quote.totalCents, depositCents: r.quote.depositCents, currency: r.quote.currency } : null,
      depositDueAt: r.depositDueAt?.toISOString() ?? null,
      proposedFiringId: r.proposedFiringId,
      updatedAt: r.updatedAt.toISOString(),
      potterName: row.potter_name,
      firing: {
        id: row.firing_id,
        firingDate: new Date(row.firing_date).toISOString(),
        dropOffBy: new Date(row.drop_off_by).toISOString(),
        cone: row.cone,
        atmosphere: row.atmosphere,
        kind: row.kind,
        kilnName: row.kiln_name,
      },
      studio: { id: row.studio_id, name: row.studio_name, timezone: row.timezone },
    }
  })
}

/** A request as the given person may see it (a 404 for anyone without a right to it). */
export async function showRequest(manager: EntityManager, requestId: string, user: User) {
  const rc = await loadRequest(manager, requestId)
  return requestJson(manager, rc, await viewerOf(manager, rc, user))
}

export interface RequestListQuery {
  firingId?: string
  studioId?: string
  state?: RequestState
  as?: 'potter' | 'studio'
}

/** Mine: a potter's own requests, and for studio people the requests to their studios (never drafts). */
export async function listRequests(manager: EntityManager, user: Pick<User, 'id'>, q: RequestListQuery) {
  const memberships = await manager.getRepository(StudioMember).find({ where: { userId: user.id } })
  const studioIds = memberships.map((m) => m.studioId).filter((sid) => !q.studioId || sid === q.studioId)
  const qb = manager
    .getRepository(FiringRequest)
    .createQueryBuilder('r')
    .innerJoin('r.firing', 'f')
    .innerJoin('f.kiln', 'k')
    .orderBy('r.updatedAt', 'DESC')
    .take(200)
  const asPotter = q.as !== 'studio'
  const asStudio = q.as !== 'potter' && studioIds.length > 0
  if (asPotter && asStudio)
    qb.where('(r.potter_id = :me OR (k.studio_id IN (:...studioIds) AND r.state <> :draft))', { me: user.id, studioIds, draft: 'draft' })
  else if (asStudio) qb.where('k.studio_id IN (:...studioIds) AND r.state <> :draft', { studioIds, draft: 'draft' })
  else qb.where('r.potter_id = :me', { me: user.id })
  if (q.firingId) qb.andWhere('r.firing_id = :firingId', { firingId: q.firingId })
  if (q.state) qb.andWhere('r.state = :state', { state: q.state })
  return requestRows(manager, await qb.getMany())
}
