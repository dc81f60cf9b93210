// Requests as the API answers them: the whole view of one request for a person with standing on it,
// and list rows. What each reader may do comes from the one policy table (shared/workflow/policy.ts).
import { In, type EntityManager } from 'typeorm'
import type { PriceJson, RequestRow, RequestView } from '../../shared/api/requests'
import { minimumOnlineCharge } from '../../shared/payments'
import { allowedActions, type RequestFacts } from '../../shared/workflow/policy'
import { holdsSpace, nextRequestStates, type RequestState } from '../../shared/workflow/request-states'
import { Firing } from '../entities/Firing'
import { FiringRequest } from '../entities/FiringRequest'
import { RequestEvent } from '../entities/RequestEvent'
import { StudioMember } from '../entities/StudioMember'
import { User } from '../entities/User'
import { firingsJson } from './firings'
import { kilnJson } from './kilns'
import { shelvesNeeded, shelvesNeededOf } from './load-plan'
import { requestPieces } from './pieces'
import { moneyOf, openPaymentsOf } from './payments'
import { requestPhotos } from './photos'
import { pickupJson } from './pickup'
import { loadRequest, reviewWindowOpen, viewerOf, type RequestContext, type Viewer } from './request-context'
import { requestFacts } from './request-door'
import { potterRecord } from './requests'
import { reviewsOfRequest } from './reviews'
import { keptCardView } from './kept-cards'

function priceJson(rc: RequestContext, facts: RequestFacts, money: Awaited<ReturnType<typeof moneyOf>>): PriceJson {
  const standing = rc.request.standingQuote ?? rc.request.quote
  const currency = standing?.currency ?? rc.studio.currency
  return {
    currency,
    asked: rc.request.quote,
    standing,
    pending: rc.request.pendingQuote,
    totalCents: standing?.totalCents ?? 0,
    depositCents: rc.request.depositAskedCents ?? standing?.depositCents ?? 0,
    depositAsked: rc.request.depositAskedCents !== null,
    paidInCents: money.paidIn,
    refundedCents: money.refunded,
    netPaidCents: money.net,
    depositOwedCents: facts.depositOwedCents,
    balanceOwedCents: holdsSpace(rc.request.state) ? facts.balanceOwedCents : 0,
    counterRefundDueCents: money.counterRefundDue,
    minimumOnlineCents: minimumOnlineCharge(currency),
  }
}

export async function requestJson(manager: EntityManager, rc: RequestContext, viewer: Viewer): Promise<RequestView> {
  const events = await manager.getRepository(RequestEvent).find({ where: { requestId: rc.request.id }, order: { at: 'ASC' } })
  const actorIds = [...new Set(events.map((e) => e.actorId).filter((id): id is string => Boolean(id)))]
  const actors = new Map(
    (actorIds.length ? await manager.getRepository(User).findBy({ id: In(actorIds) }) : []).map((u) => [u.id, u.displayName]),
  )
  const money = await moneyOf(manager, rc.request.id)
  const facts = await requestFacts(manager, rc)
  // A damage claim's checkout lives on the claim, not among the ask's own payments.
  const payments = (await openPaymentsOf(manager, rc.request.id)).filter(
    (p): p is typeof p & { purpose: 'deposit' | 'balance' } => p.purpose !== 'claim',
  )
  const proposed = rc.request.proposedFiringId ? await manager.getRepository(Firing).findOneBy({ id: rc.request.proposedFiringId }) : null
  const [firing, proposedFiring] = await firingsJson(manager, proposed ? [rc.firing, proposed] : [rc.firing], rc.studio.id)
  // The street address goes to a potter only once the studio has agreed to take the ware.
  const showAddress = viewer.side !== 'potter' || holdsSpace(rc.request.state)
  return {
    id: rc.request.id,
    state: rc.request.state,
    nextStates: nextRequestStates(rc.request.state),
    actions: allowedActions(facts, viewer.side),
    viewer: viewer.side,
    pieces: rc.request.pieces,
    notes: rc.request.notes,
    volumeL: Math.round(rc.request.volumeL * 100) / 100,
    verdict: rc.request.verdict,
    findings: rc.request.findings,
    acknowledgedWarnings: rc.request.acknowledgedWarnings,
    quote: rc.request.standingQuote ?? rc.request.quote,
    price: priceJson(rc, facts, money),
    policiesVersion: rc.request.policiesVersion,
    depositDueAt: rc.request.depositDueAt?.toISOString() ?? null,
    sentAt: rc.request.sentAt?.toISOString() ?? null,
    createdAt: rc.request.createdAt.toISOString(),
    firing,
    proposedFiring: proposedFiring ?? null,
    kiln: kilnJson(rc.kiln),
    studio: {
      id: rc.studio.id,
      name: rc.studio.name,
      city: rc.studio.city,
      region: rc.studio.region,
      timezone: rc.studio.timezone,
      dropOffHours: rc.studio.dropOffHours,
      dropOffChecklist: rc.studio.dropOffChecklist,
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
    counterRefunds: money.counterRefunds.map((r) => ({
      id: r.id,
      amountCents: r.amountCents,
      currency: r.currency,
      reason: r.reason,
      paidAt: r.paidAt?.toISOString() ?? null,
    })),
    ...(await pickupJson(manager, rc)),
    pieceRecords: await requestPieces(manager, rc.request.id, rc.request.pieces),
    shelvesNeeded: shelvesNeeded(rc.kiln, rc.firing, rc.request.pieces),
    photos: await requestPhotos(manager, rc.request.id),
    reviews: await reviewsOfRequest(manager, rc.request.id, viewer.side),
    keptCard: viewer.side === 'potter' ? await keptCardView(manager, rc.request.id) : null,
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

interface RowFacts {
  id: string
  potter_id: string
  firing_id: string
  firing_date: Date
  drop_off_by: Date
  firing_status: RequestFacts['firingStatus']
  cone: string
  atmosphere: RequestRow['firing']['atmosphere']
  kind: RequestRow['firing']['kind']
  studio_id: string
  studio_name: string
  timezone: string
  kiln_name: string
  potter_name: string
  net: number
  counter_due: number
  results: boolean
  potter_rated: boolean
  studio_rated: boolean
  review_opened: Date | null
}

/** List rows: enough to show state, price and next step, with the reader's actions from the policy. */
export async function requestRows(manager: EntityManager, requests: FiringRequest[], reader: Pick<User, 'id'>): Promise<RequestRow[]> {
  if (!requests.length) return []
  const rows: RowFacts[] = await manager.query(
    `SELECT r.id, r.potter_id, f.id AS firing_id, f.firing_date, f.drop_off_by, f.status AS firing_status, f.cone, f.atmosphere, f.kind,
            s.id AS studio_id, s.name AS studio_name, s.timezone, k.name AS kiln_name, u.display_name AS potter_name,
            coalesce((SELECT sum(CASE WHEN l.direction = 'in' THEN l.amount_cents ELSE -l.amount_cents END) FROM ledger_entries l WHERE l.request_id = r.id), 0)::int AS net,
            coalesce((SELECT sum(c.amount_cents) FROM counter_refunds c WHERE c.request_id = r.id AND c.paid_at IS NULL), 0)::int AS counter_due,
            EXISTS (SELECT 1 FROM request_results x WHERE x.request_id = r.id) AS results,
            EXISTS (SELECT 1 FROM reviews g WHERE g.request_id = r.id AND g.side = 'potter') AS potter_rated,
            EXISTS (SELECT 1 FROM reviews g WHERE g.request_id = r.id AND g.side = 'studio') AS studio_rated,
            (SELECT min(e.at) FROM request_events e WHERE e.request_id = r.id AND e.to_state IN ('collected', 'disputed')) AS review_opened
     FROM firing_requests r JOIN firings f ON f.id = r.firing_id JOIN kilns k ON k.id = f.kiln_id JOIN studios s ON s.id = k.studio_id JOIN users u ON u.id = r.potter_id
     WHERE r.id = ANY($1::uuid[])`,
    [requests.map((r) => r.id)],
  )
  const byId = new Map(rows.map((r) => [r.id, r]))
  // What a waiting request would take, for the studio deciding on it.
  const needed = await shelvesNeededOf(
    manager,
    requests.filter((r) => r.state === 'sent'),
  )
  return requests.map((r) => {
    const row = byId.get(r.id)!
    const standing = r.standingQuote ?? r.quote
    const net = row.net - row.counter_due
    const facts: RequestFacts = {
      state: r.state,
      firingStatus: row.firing_status,
      depositOwedCents: r.state === 'accepted' ? Math.max(0, (r.depositAskedCents ?? 0) - net) : 0,
      balanceOwedCents: Math.max(0, (standing?.totalCents ?? 0) - net),
      pricePending: r.pendingQuote !== null,
      proposedMove: r.proposedFiringId !== null,
      resultsPosted: row.results,
      ratedBy: { potter: row.potter_rated, studio: row.studio_rated },
      reviewWindowOpen: reviewWindowOpen(row.review_opened ? new Date(row.review_opened) : null),
      counterRefundDueCents: row.counter_due,
    }
    const side = row.potter_id === reader.id ? 'potter' : 'studio'
    const owed = facts.state === 'accepted' ? facts.depositOwedCents : holdsSpace(r.state) ? facts.balanceOwedCents : 0
    return {
      id: r.id,
      state: r.state,
      side,
      actions: allowedActions(facts, side),
      verdict: r.verdict,
      findings: r.findings.length,
      volumeL: Math.round(r.volumeL * 100) / 100,
      pieceCount: r.pieces.reduce((n, p) => n + p.quantity, 0),
      shelvesNeeded: needed.get(r.id) ?? null,
      price: standing
        ? {
            totalCents: standing.totalCents,
            depositCents: r.depositAskedCents ?? standing.depositCents,
            netPaidCents: net,
            owedCents: owed,
            pricePending: r.pendingQuote !== null,
            currency: standing.currency,
          }
        : null,
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
        status: row.firing_status,
      },
      studio: { id: row.studio_id, name: row.studio_name, timezone: row.timezone },
    }
  })
}

/** A request as the given person may see it (a 404 for anyone without a right to it). */
export async function showRequest(manager: EntityManager, requestId: string, user: Pick<User, 'id' | 'role'>) {
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
  return requestRows(manager, await qb.getMany(), user)
}
