// Incidents: what went wrong in a firing, reported by the crew or by the potter, the pieces it names
// (by tag), its photos, and the likely phase worked out by the diagnosis engine (shared/firing/incidents)
// from what was seen, the ware's own check and the firing's logged curve. The report goes through the
// one door of the ask whose ware failed; potters whose pieces it hurt are told.
import { In, type EntityManager } from 'typeorm'
import type {
  FiringIncidentJson,
  IncidentHistoryRow,
  IncidentJson,
  IncidentPieceJson,
  IncidentSummaryJson,
  PotterIncidentRecord,
  StudioIncidentHistory,
} from '../../shared/api/incidents'
import { damageChargesOf } from '../../shared/claims'
import { curveOfReadings } from '../../shared/firing/curve'
import { diagnose, INCIDENT_KIND_LABELS, PHASE_LABELS, type Diagnosis, type IncidentObservation } from '../../shared/firing/incidents'
import type { Piece } from '../../shared/firing/check'
import type { IncidentBody } from '../../shared/schemas/incidents'
import type { AppContext } from '../context'
import { Firing } from '../entities/Firing'
import { FiringRequest } from '../entities/FiringRequest'
import { Incident } from '../entities/Incident'
import { IncidentPiece } from '../entities/IncidentPiece'
import { Kiln } from '../entities/Kiln'
import { Photo } from '../entities/Photo'
import { Studio } from '../entities/Studio'
import { StudioMember } from '../entities/StudioMember'
import { User } from '../entities/User'
import { WarePiece } from '../entities/WarePiece'
import { badRequest, forbidden, notFound } from '../http/errors'
import { isUuid } from '../http/validate'
import { incidentReportedMail, wareHurtMail, type IncidentFacts } from '../mail/templates/incidents'
import { claimsOfIncident } from './claims'
import { firingLogJson } from './firing-log'
import { incidentViewerOf, loadIncident, type IncidentRecord } from './incident-access'
import { tell } from './notices'
import { tagFrom } from './pieces'
import { addPhotos, photoJson, type UploadedFile } from './photos'
import { askCurrency, factsOf, loadRequest } from './request-context'
import { remediesOf, remediesView } from './remedies'
import { requestAction } from './request-door'

const observationOf = (i: Pick<Incident, 'kind' | 'crackEdge' | 'shards' | 'neighboursHit' | 'shelfDamage' | 'elementDamage'>) =>
  ({
    kind: i.kind,
    crackEdge: i.crackEdge ?? undefined,
    shards: i.shards,
    neighboursHit: i.neighboursHit,
    shelfDamage: i.shelfDamage,
    elementDamage: i.elementDamage,
  }) satisfies IncidentObservation

/**
 * The engine's reading of an incident: the failed pieces' own declared lines (or the whole ask's when no
 * piece is named), the ware check the server made of them, and the firing's plan and logged curve.
 */
async function diagnosisOf(
  manager: EntityManager,
  seen: IncidentObservation,
  firing: Firing,
  request: FiringRequest,
  failed: WarePiece[],
): Promise<{ diagnosis: Diagnosis; logged: boolean }> {
  const lines = failed.length
    ? [...new Set(failed.map((p) => p.pieceIndex))].map((i) => request.pieces[i]).filter((p): p is Piece => p !== undefined)
    : request.pieces
  const log = await firingLogJson(manager, firing.id)
  const readings = log ? curveOfReadings(log.readings) : []
  const diagnosis = diagnose(seen, {
    firing: { kind: firing.kind, cone: firing.cone, atmosphere: firing.atmosphere, slowCool: firing.slowCool },
    pieces: lines,
    findings: request.findings,
    plan: log?.plan,
    readings,
  })
  return { diagnosis, logged: readings.length > 1 }
}

/** Where the person stands on a firing: one of its studio's people, a potter with ware in it, or neither. */
async function standingOnFiring(manager: EntityManager, firing: Firing, user: Pick<User, 'id' | 'role'>) {
  const kiln = await manager.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId })
  const member = await manager.getRepository(StudioMember).findOne({ where: { studioId: kiln.studioId, userId: user.id } })
  if (member) return { side: 'studio' as const, kiln, own: [] as FiringRequest[] }
  const own = await manager
    .getRepository(FiringRequest)
    .createQueryBuilder('r')
    .where('r.firing_id = :firingId AND r.potter_id = :userId', { firingId: firing.id, userId: user.id })
    .andWhere(`r.state <> 'draft'`)
    .getMany()
  if (user.role === 'admin') return { side: 'admin' as const, kiln, own }
  if (own.length) return { side: 'potter' as const, kiln, own }
  return null
}

async function loadFiring(manager: EntityManager, firingId: string) {
  if (!isUuid(firingId)) throw notFound('That firing')
  const firing = await manager.getRepository(Firing).findOne({ where: { id: firingId } })
  if (!firing) throw notFound('That firing')
  return firing
}

/** Reads tags into this firing's pieces; a tag that is not a piece of this firing is a 400 on its field. */
async function piecesOfFiring(manager: EntityManager, firingId: string, tags: string[], field: string): Promise<WarePiece[]> {
  if (!tags.length) return []
  const wanted: string[] = []
  for (const [n, input] of tags.entries()) {
    try {
      wanted.push(tagFrom(input))
    } catch {
      throw badRequest(`“${input.slice(0, 20)}” is not a tag as printed on our labels.`, { [`${field}.${n}`]: 'Not a tag.' }, 'bad-tag')
    }
  }
  const records = await manager
    .getRepository(WarePiece)
    .createQueryBuilder('p')
    .innerJoin('firing_requests', 'r', 'r.id = p.request_id')
    .where('p.tag IN (:...tags) AND r.firing_id = :firingId', { tags: wanted, firingId })
    .getMany()
  const missing = wanted.findIndex((tag) => !records.some((r) => r.tag === tag))
  if (missing >= 0)
    throw badRequest(
      `No piece tagged ${wanted[missing]} is in this firing.`,
      { [`${field}.${missing}`]: 'Not in this firing.' },
      'unknown-tag',
    )
  return records
}

const incidentUrl = (ctx: AppContext, id: string) => `${ctx.config.publicUrl}/incidents/${id}`

async function photoUrls(ctx: AppContext, manager: EntityManager, incidentId: string) {
  const photos = await manager.getRepository(Photo).find({ where: { incidentId }, order: { createdAt: 'ASC' } })
  return photos.map((p) => `${ctx.config.publicUrl}/api/photos/${p.id}`)
}

/** Tells each potter whose pieces the incident hurt (once per potter), with the photos linked. */
async function tellHurtPotters(ctx: AppContext, manager: EntityManager, incident: Incident, facts: IncidentFacts) {
  const rows: { request_id: string }[] = await manager.query(
    `SELECT DISTINCT p.request_id FROM incident_pieces ip JOIN pieces p ON p.id = ip.piece_id WHERE ip.incident_id = $1 AND ip.role = 'hurt'`,
    [incident.id],
  )
  for (const { request_id } of rows) {
    if (request_id === incident.requestId) continue
    const rc = await loadRequest(manager, request_id)
    await tell(manager, rc.potter, 'ware-hurt', wareHurtMail(factsOf(rc, ctx.config.publicUrl), facts), {
      path: `/incidents/${incident.id}`,
      requestId: request_id,
      firingId: incident.firingId,
    })
  }
}

/**
 * Reports an incident on a firing. The studio's people name the failed pieces by tag (and any other
 * potters' pieces it hurt); a potter reports on their own ask. The failed pieces name the ask, which
 * must be one ask of this firing.
 */
export async function reportIncident(ctx: AppContext, user: User, firingId: string, body: IncidentBody): Promise<IncidentJson> {
  const manager = ctx.db.manager
  const firing = await loadFiring(manager, firingId)
  const standing = await standingOnFiring(manager, firing, user)
  if (!standing || standing.side === 'admin') throw notFound('That firing')
  const failed = await piecesOfFiring(manager, firingId, body.pieceTags, 'pieceTags')
  const hurt = await piecesOfFiring(manager, firingId, body.hurtTags, 'hurtTags')
  if (standing.side === 'potter' && hurt.length)
    throw forbidden('The studio names other potters’ pieces; say in the note what else you saw.')
  const requestIds = new Set(failed.map((p) => p.requestId))
  if (requestIds.size > 1)
    throw badRequest('Name the pieces of one ask at a time: report each potter’s ware on its own.', { pieceTags: 'More than one ask.' })
  let requestId = [...requestIds][0] ?? body.requestId
  if (!requestId && standing.side === 'potter' && standing.own.length === 1) requestId = standing.own[0].id
  if (!requestId) throw badRequest('Name the failed pieces by their tags, or the ask they came with.', { pieceTags: 'Name a piece.' })
  if (body.requestId && body.requestId !== requestId)
    throw badRequest('Those pieces came with another ask.', { requestId: 'Not the ask of those pieces.' })
  const request = await manager.getRepository(FiringRequest).findOne({ where: { id: requestId } })
  if (!request || request.firingId !== firingId) throw badRequest('That ask is not in this firing.', { requestId: 'Not in this firing.' })
  if (standing.side === 'potter' && !standing.own.some((r) => r.id === requestId)) throw notFound('That ask')
  if (hurt.some((p) => failed.some((f) => f.id === p.id)))
    throw badRequest('A piece is either the one that failed or one it hurt, not both.', { hurtTags: 'Also named as failed.' })
  const seen: IncidentObservation = {
    kind: body.kind,
    crackEdge: body.kind === 'crack' ? (body.crackEdge ?? 'unknown') : undefined,
    shards: body.shards,
    neighboursHit: body.neighboursHit || hurt.length > 0,
    shelfDamage: body.shelfDamage,
    elementDamage: body.elementDamage,
  }
  const { diagnosis } = await diagnosisOf(manager, seen, firing, request, failed)

  const id = await requestAction(ctx, user, requestId, 'incident', async (step) => {
    const saved = await step.manager.getRepository(Incident).save({
      firingId,
      requestId,
      reporterId: user.id,
      reporterSide: standing.side,
      kind: seen.kind,
      crackEdge: seen.crackEdge ?? null,
      shards: seen.shards ?? false,
      neighboursHit: seen.neighboursHit ?? false,
      shelfDamage: seen.shelfDamage ?? false,
      elementDamage: seen.elementDamage ?? false,
      whereInKiln: body.whereInKiln,
      note: body.note,
      phase: diagnosis.phase,
    })
    const named = [
      ...failed.map((p) => ({ pieceId: p.id, role: 'failed' as const })),
      ...hurt.map((p) => ({ pieceId: p.id, role: 'hurt' as const })),
    ]
    if (named.length) await step.manager.getRepository(IncidentPiece).insert(named.map((n) => ({ ...n, incidentId: saved.id })))
    await step.note(`Incident reported: ${INCIDENT_KIND_LABELS[seen.kind].toLowerCase()}`, { incidentId: saved.id })
    const facts: IncidentFacts = {
      incidentUrl: incidentUrl(ctx, saved.id),
      kindLabel: INCIDENT_KIND_LABELS[seen.kind],
      phaseLabel: diagnosis.label,
      photoUrls: [],
    }
    const mail = incidentReportedMail(factsOf(step.rc, ctx.config.publicUrl), facts, standing.side)
    if (standing.side === 'studio') await step.tellPotter('incident-reported', mail)
    else await step.tellStudio('incident-reported', mail)
    await tellHurtPotters(ctx, step.manager, saved, facts)
    return saved.id
  })
  return incidentJson(ctx, user, id)
}

/** Adds photos to an incident: the studio's people or the potter whose ware failed. Hurt potters are sent the links. */
export async function addIncidentPhotos(ctx: AppContext, user: User, incidentId: string, files: UploadedFile[]) {
  const record = await loadIncident(ctx.db.manager, incidentId)
  const viewer = await incidentViewerOf(ctx.db.manager, record, user)
  if (viewer.side === 'neighbour') throw forbidden('The studio and the potter whose ware failed add the photos.')
  const photos = await addPhotos(ctx, user, record.incident.requestId, 'incident', files, record.incident.id)
  await ctx.db.transaction(async (manager) => {
    const facts: IncidentFacts = {
      incidentUrl: incidentUrl(ctx, record.incident.id),
      kindLabel: INCIDENT_KIND_LABELS[record.incident.kind],
      phaseLabel: record.incident.phase ? PHASE_LABELS[record.incident.phase] : null,
      photoUrls: await photoUrls(ctx, manager, record.incident.id),
    }
    await tellHurtPotters(ctx, manager, record.incident, facts)
  })
  return photos
}

function summaryJson(incident: Incident, reporterName: string, tags: string[]): IncidentSummaryJson {
  return {
    id: incident.id,
    firingId: incident.firingId,
    kind: incident.kind,
    kindLabel: INCIDENT_KIND_LABELS[incident.kind],
    reportedBy: incident.reporterSide,
    reporterName,
    at: incident.createdAt.toISOString(),
    pieceTags: tags,
  }
}

async function namesOf(manager: EntityManager, ids: string[]) {
  const users = ids.length ? await manager.getRepository(User).find({ where: { id: In([...new Set(ids)]) } }) : []
  return new Map(users.map((u) => [u.id, u.displayName]))
}

export async function incidentJson(ctx: AppContext, user: Pick<User, 'id' | 'role'>, id: string): Promise<IncidentJson> {
  const manager = ctx.db.manager
  const record: IncidentRecord = await loadIncident(manager, id)
  const viewer = await incidentViewerOf(manager, record, user)
  const { incident } = record
  const firing = await manager.getRepository(Firing).findOneByOrFail({ id: incident.firingId })
  const kiln = await manager.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId })
  const studio = await manager.getRepository(Studio).findOneByOrFail({ id: kiln.studioId })
  const request = await manager.getRepository(FiringRequest).findOneByOrFail({ id: incident.requestId })
  const named = await manager.getRepository(IncidentPiece).find({ where: { incidentId: id }, relations: { piece: true } })
  const requests = named.length
    ? await manager.getRepository(FiringRequest).find({ where: { id: In(named.map((n) => n.piece.requestId)) } })
    : []
  const names = await namesOf(manager, [incident.reporterId, request.potterId, ...requests.map((r) => r.potterId)])
  const pieces: IncidentPieceJson[] = named.map((n) => {
    const owner = requests.find((r) => r.id === n.piece.requestId)!
    return {
      tag: n.piece.tag,
      label: owner.pieces[n.piece.pieceIndex]?.label?.trim() || `Piece ${n.piece.pieceIndex + 1}`,
      requestId: owner.id,
      potterName: names.get(owner.potterId) ?? '',
      role: n.role,
    }
  })
  const failed = named.filter((n) => n.role === 'failed').map((n) => n.piece)
  const { diagnosis, logged } = await diagnosisOf(manager, observationOf(incident), firing, request, failed)
  const photos = await manager.getRepository(Photo).find({ where: { incidentId: id }, order: { createdAt: 'ASC' } })
  const side = viewer.side === 'studio' ? 'studio' : viewer.side
  return {
    ...summaryJson(
      incident,
      names.get(incident.reporterId) ?? '',
      pieces.filter((p) => p.role === 'failed').map((p) => p.tag),
    ),
    studioId: studio.id,
    studioName: studio.name,
    timezone: studio.timezone,
    kilnName: kiln.name,
    firingDate: firing.firingDate.toISOString(),
    firingKind: firing.kind,
    cone: firing.cone,
    requestId: request.id,
    potterName: names.get(request.potterId) ?? '',
    crackEdge: incident.crackEdge,
    shards: incident.shards,
    neighboursHit: incident.neighboursHit,
    shelfDamage: incident.shelfDamage,
    elementDamage: incident.elementDamage,
    whereInKiln: incident.whereInKiln,
    note: incident.note,
    pieces,
    photos: photos.map(photoJson),
    logged,
    diagnosis,
    claims: viewer.side === 'neighbour' ? [] : await claimsOfIncident(manager, id, side === 'neighbour' ? 'potter' : side),
    viewerSide: side,
    canClaim: viewer.side === 'studio' && viewer.role === 'owner',
    damageCharges: damageChargesOf(studio.policies),
    // The currency a claim on this ask is raised in (raiseClaim): the ask's quote's, else the studio's.
    claimCurrency: askCurrency(request, studio),
    ...(await remediesView(manager, incident, studio, viewer, user.id)),
  }
}

/** The incidents of a firing the person may see: all of them for its studio, their own or those that hurt their ware for a potter. */
export async function firingIncidents(ctx: AppContext, user: Pick<User, 'id' | 'role'>, firingId: string): Promise<FiringIncidentJson[]> {
  const manager = ctx.db.manager
  const firing = await loadFiring(manager, firingId)
  const standing = await standingOnFiring(manager, firing, user)
  if (!standing) throw notFound('That firing')
  const query = manager
    .getRepository(Incident)
    .createQueryBuilder('i')
    .where('i.firing_id = :firingId', { firingId })
    .orderBy('i.created_at', 'ASC')
  if (standing.side === 'potter') {
    query.andWhere(
      `(i.request_id IN (:...own) OR EXISTS (SELECT 1 FROM incident_pieces ip JOIN pieces p ON p.id = ip.piece_id
        WHERE ip.incident_id = i.id AND p.request_id IN (:...own)))`,
      { own: standing.own.map((r) => r.id) },
    )
  }
  const incidents = await query.getMany()
  const summaries = await summariesOf(manager, incidents)
  // What the studio did for hurt pieces: all of it for the studio, their own asks' for a potter.
  const remedies = await remediesOf(
    manager,
    incidents.map((i) => i.id),
    standing.side === 'potter' ? standing.own.map((r) => r.id) : undefined,
  )
  return summaries.map((summary) => ({ ...summary, remedies: remedies.filter((r) => r.incidentId === summary.id) }))
}

async function summariesOf(manager: EntityManager, incidents: Incident[]) {
  const names = await namesOf(
    manager,
    incidents.map((i) => i.reporterId),
  )
  const tags: { incident_id: string; tag: string }[] = incidents.length
    ? await manager.query(
        `SELECT ip.incident_id, p.tag FROM incident_pieces ip JOIN pieces p ON p.id = ip.piece_id
         WHERE ip.role = 'failed' AND ip.incident_id = ANY($1::uuid[]) ORDER BY p.tag`,
        [incidents.map((i) => i.id)],
      )
    : []
  return incidents.map((i) =>
    summaryJson(
      i,
      names.get(i.reporterId) ?? '',
      tags.filter((t) => t.incident_id === i.id).map((t) => t.tag),
    ),
  )
}

/** A studio's incidents over time, counted by kiln, firing kind, cone, atmosphere and phase, newest first. */
export async function studioIncidentHistory(ctx: AppContext, studioId: string): Promise<StudioIncidentHistory> {
  const manager = ctx.db.manager
  const rows: {
    kiln_id: string
    kiln_name: string
    kind: IncidentHistoryRow['firingKind']
    cone: string
    atmosphere: string
    phase: IncidentHistoryRow['phase']
    count: number
    last: Date
  }[] = await manager.query(
    `SELECT k.id AS kiln_id, k.name AS kiln_name, f.kind, f.cone, f.atmosphere, i.phase, count(*)::int AS count, max(i.created_at) AS last
     FROM incidents i JOIN firings f ON f.id = i.firing_id JOIN kilns k ON k.id = f.kiln_id
     WHERE k.studio_id = $1 GROUP BY 1, 2, 3, 4, 5, 6 ORDER BY count DESC, last DESC`,
    [studioId],
  )
  const incidents = await manager
    .getRepository(Incident)
    .createQueryBuilder('i')
    .innerJoin('firings', 'f', 'f.id = i.firing_id')
    .innerJoin('kilns', 'k', 'k.id = f.kiln_id')
    .where('k.studio_id = :studioId', { studioId })
    .orderBy('i.created_at', 'DESC')
    .limit(100)
    .getMany()
  const firings = incidents.length ? await manager.getRepository(Firing).find({ where: { id: In(incidents.map((i) => i.firingId)) } }) : []
  const kilns = rows.length ? await manager.getRepository(Kiln).find({ where: { studioId } }) : []
  const summaries = await summariesOf(manager, incidents)
  const studio = await manager.getRepository(Studio).findOneByOrFail({ id: studioId })
  return {
    timezone: studio.timezone,
    rows: rows.map((r) => ({
      kilnId: r.kiln_id,
      kilnName: r.kiln_name,
      firingKind: r.kind,
      cone: r.cone,
      atmosphere: r.atmosphere,
      phase: r.phase,
      phaseLabel: r.phase ? PHASE_LABELS[r.phase] : 'Not read',
      count: r.count,
      last: new Date(r.last).toISOString(),
    })),
    incidents: summaries.map((s, n) => {
      const firing = firings.find((f) => f.id === incidents[n].firingId)!
      return {
        ...s,
        kilnName: kilns.find((k) => k.id === firing.kilnId)?.name ?? '',
        firingDate: firing.firingDate.toISOString(),
        phase: incidents[n].phase,
      }
    }),
  }
}

/** A potter's record of incidents their ware caused, anywhere, for a studio deciding on their ask. */
export async function potterIncidentRecord(ctx: AppContext, user: User, requestId: string): Promise<PotterIncidentRecord> {
  const manager = ctx.db.manager
  const rc = await loadRequest(manager, requestId)
  const member = await manager.getRepository(StudioMember).findOne({ where: { studioId: rc.studio.id, userId: user.id } })
  if (!member && user.role !== 'admin') throw notFound('That ask')
  const rows: { kind: Incident['kind']; at: Date; studio_name: string }[] = await manager.query(
    `SELECT i.kind, i.created_at AS at, s.name AS studio_name FROM incidents i JOIN firing_requests r ON r.id = i.request_id
     JOIN firings f ON f.id = i.firing_id JOIN kilns k ON k.id = f.kiln_id JOIN studios s ON s.id = k.studio_id
     WHERE r.potter_id = $1 ORDER BY i.created_at DESC LIMIT 50`,
    [rc.potter.id],
  )
  const [claims]: { paid: number; waived: number }[] = await manager.query(
    `SELECT count(*) FILTER (WHERE c.status = 'paid')::int AS paid, count(*) FILTER (WHERE c.status = 'waived')::int AS waived
     FROM claims c JOIN firing_requests r ON r.id = c.request_id WHERE r.potter_id = $1`,
    [rc.potter.id],
  )
  return {
    count: rows.length,
    claimsPaid: claims.paid,
    claimsWaived: claims.waived,
    incidents: rows.map((r) => ({
      kind: r.kind,
      kindLabel: INCIDENT_KIND_LABELS[r.kind],
      at: new Date(r.at).toISOString(),
      studioName: r.studio_name,
    })),
  }
}
