// Making good to potters whose pieces an incident hurt. The studio's owner gives a credit on the hurt
// potter's own ask (refunded through Stripe on what was paid online, the rest owed back at the counter:
// both booked on that ask's ledger, and a share already paid to the studio is taken back by the payout
// run as for any late refund), or promises to refire named pieces free, perhaps in a coming firing.
// Each goes through the hurt ask's one door: locked, one timeline entry, both sides told.
import { In, type EntityManager } from 'typeorm'
import type { ComingFiringJson, HurtAskJson, RemedyJson } from '../../shared/api/incidents'
import { formatDate, formatMoney } from '../../shared/dates'
import { INCIDENT_KIND_LABELS } from '../../shared/firing/incidents'
import { creditRefusal, creditSplit, REMEDY_LABELS } from '../../shared/remedies'
import type { RemedyBody } from '../../shared/schemas/incidents'
import type { AppContext } from '../context'
import { CounterRefund } from '../entities/CounterRefund'
import { Firing } from '../entities/Firing'
import { FiringRequest } from '../entities/FiringRequest'
import type { Incident } from '../entities/Incident'
import { IncidentRemedy } from '../entities/IncidentRemedy'
import { Kiln } from '../entities/Kiln'
import { Photo } from '../entities/Photo'
import { User } from '../entities/User'
import { WarePiece } from '../entities/WarePiece'
import { badRequest, conflict, forbidden, HttpError } from '../http/errors'
import { creditGivenMail, refirePromisedMail, type RemedyFacts } from '../mail/templates/incidents'
import { incidentViewerOf, loadIncident, type IncidentViewer } from './incident-access'
import { enqueueRefund, moneyOf } from './payments'
import { tagFrom } from './pieces'
import { photoJson } from './photos'
import { askCurrency, factsOf } from './request-context'
import { requestAction, type ActionStep } from './request-door'

/** Firing statuses before loading: a firing that can still take a refire. */
const COMING = ['open', 'full', 'closed'] as const

const isOwner = (viewer: IncidentViewer | ActionStep['viewer']) => viewer.side === 'studio' && viewer.role === 'owner'

/** The pieces an incident hurt, with the ask each came with. */
async function hurtPiecesOf(manager: EntityManager, incidentId: string): Promise<WarePiece[]> {
  const rows: { piece_id: string }[] = await manager.query(
    `SELECT piece_id FROM incident_pieces WHERE incident_id = $1 AND role = 'hurt'`,
    [incidentId],
  )
  if (!rows.length) return []
  return manager.getRepository(WarePiece).find({ where: { id: In(rows.map((r) => r.piece_id)) }, order: { tag: 'ASC' } })
}

/** The studio's firings still to come, other than the one the incident happened in. */
async function comingFiringsOf(manager: EntityManager, studioId: string, exceptFiringId: string): Promise<ComingFiringJson[]> {
  const rows: { id: string; firing_date: Date; kiln_name: string; kind: ComingFiringJson['firingKind']; cone: string }[] =
    await manager.query(
      `SELECT f.id, f.firing_date, k.name AS kiln_name, f.kind, f.cone FROM firings f JOIN kilns k ON k.id = f.kiln_id
       WHERE k.studio_id = $1 AND f.status = ANY($2::text[]) AND f.firing_date > now() AND f.id <> $3 ORDER BY f.firing_date LIMIT 20`,
      [studioId, COMING, exceptFiringId],
    )
  return rows.map((r) => ({
    id: r.id,
    date: new Date(r.firing_date).toISOString(),
    kilnName: r.kiln_name,
    firingKind: r.kind,
    cone: r.cone,
  }))
}

async function remedyJsons(manager: EntityManager, remedies: IncidentRemedy[]): Promise<RemedyJson[]> {
  if (!remedies.length) return []
  const requests = await manager.getRepository(FiringRequest).find({ where: { id: In(remedies.map((r) => r.requestId)) } })
  const potters = await manager.getRepository(User).find({ where: { id: In(requests.map((r) => r.potterId)) } })
  const targetIds = remedies.map((r) => r.targetFiringId).filter((id): id is string => id !== null)
  const firings = targetIds.length ? await manager.getRepository(Firing).find({ where: { id: In(targetIds) } }) : []
  const kilns = firings.length ? await manager.getRepository(Kiln).find({ where: { id: In(firings.map((f) => f.kilnId)) } }) : []
  return remedies.map((remedy) => {
    const request = requests.find((r) => r.id === remedy.requestId)
    const firing = firings.find((f) => f.id === remedy.targetFiringId)
    return {
      id: remedy.id,
      incidentId: remedy.incidentId,
      requestId: remedy.requestId,
      potterName: potters.find((p) => p.id === request?.potterId)?.displayName ?? '',
      kind: remedy.kind,
      kindLabel: REMEDY_LABELS[remedy.kind],
      amountCents: remedy.amountCents,
      onlineCents: remedy.onlineCents,
      counterCents: remedy.counterCents,
      currency: remedy.currency?.trim() ?? null,
      pieceTags: remedy.pieceTags,
      targetFiring: firing
        ? { id: firing.id, date: firing.firingDate.toISOString(), kilnName: kilns.find((k) => k.id === firing.kilnId)?.name ?? '' }
        : null,
      note: remedy.note,
      at: remedy.createdAt.toISOString(),
    }
  })
}

/** The remedies of these incidents, only those on the given asks when `onAsks` is set (a potter's own). */
export async function remediesOf(manager: EntityManager, incidentIds: string[], onAsks?: string[]): Promise<RemedyJson[]> {
  if (!incidentIds.length || onAsks?.length === 0) return []
  const remedies = await manager.getRepository(IncidentRemedy).find({
    where: { incidentId: In(incidentIds), ...(onAsks ? { requestId: In(onAsks) } : {}) },
    order: { createdAt: 'ASC' },
  })
  return remedyJsons(manager, remedies)
}

/**
 * What an incident's viewer sees of making good: the remedies that concern them (all of them for the
 * studio and the desk, those on their own asks for a potter), and for the studio's owner each hurt ask
 * with its pieces, their photos and the room for a credit, and the studio's coming firings.
 */
export async function remediesView(
  manager: EntityManager,
  incident: Incident,
  studio: { id: string; currency: string },
  viewer: IncidentViewer,
  userId: string,
): Promise<{ remedies: RemedyJson[]; canMakeGood: boolean; hurtAsks: HurtAskJson[]; comingFirings: ComingFiringJson[] }> {
  const query = manager.getRepository(IncidentRemedy).createQueryBuilder('m').where('m.incident_id = :id', { id: incident.id })
  if (viewer.side === 'potter' || viewer.side === 'neighbour')
    query.andWhere('m.request_id IN (SELECT id FROM firing_requests WHERE potter_id = :userId)', { userId })
  const given = await query.orderBy('m.created_at', 'ASC').getMany()
  const remedies = await remedyJsons(manager, given)
  if (!isOwner(viewer)) return { remedies, canMakeGood: false, hurtAsks: [], comingFirings: [] }

  const pieces = await hurtPiecesOf(manager, incident.id)
  const requestIds = [...new Set(pieces.map((p) => p.requestId))]
  const requests = requestIds.length ? await manager.getRepository(FiringRequest).find({ where: { id: In(requestIds) } }) : []
  const potters = requests.length ? await manager.getRepository(User).find({ where: { id: In(requests.map((r) => r.potterId)) } }) : []
  const photos = pieces.length ? await manager.getRepository(Photo).find({ where: { pieceId: In(pieces.map((p) => p.id)) } }) : []
  const hurtAsks: HurtAskJson[] = []
  for (const request of requests) {
    const money = await moneyOf(manager, request.id)
    const currency = askCurrency(request, studio)
    const refusal = creditRefusal({ state: request.state, creditableCents: money.net }, undefined, (c) => formatMoney(c, currency))
    hurtAsks.push({
      requestId: request.id,
      potterName: potters.find((p) => p.id === request.potterId)?.displayName ?? '',
      pieces: pieces
        .filter((p) => p.requestId === request.id)
        .map((p) => ({
          tag: p.tag,
          label: request.pieces[p.pieceIndex]?.label?.trim() || `Piece ${p.pieceIndex + 1}`,
          photos: photos.filter((ph) => ph.pieceId === p.id).map(photoJson),
        })),
      currency,
      creditableCents: Math.max(0, money.net),
      creditBlocked: refusal?.message ?? null,
      given: given.filter((g) => g.requestId === request.id).map((g) => g.kind),
    })
  }
  return { remedies, canMakeGood: true, hurtAsks, comingFirings: await comingFiringsOf(manager, studio.id, incident.firingId) }
}

/** The pieces named for a refire, read from their tags: each must be a piece of this ask the incident hurt. */
function refirePieces(hurt: WarePiece[], requestId: string, tags: string[]): WarePiece[] {
  const own = hurt.filter((p) => p.requestId === requestId)
  const chosen: WarePiece[] = []
  for (const [n, input] of tags.entries()) {
    let tag: string
    try {
      tag = tagFrom(input)
    } catch {
      throw badRequest(`“${input.slice(0, 20)}” is not a tag as printed on our labels.`, { [`tags.${n}`]: 'Not a tag.' }, 'bad-tag')
    }
    const piece = own.find((p) => p.tag === tag)
    if (!piece)
      throw badRequest(`${tag} is not one of this potter’s pieces the incident hurt.`, { [`tags.${n}`]: 'Not a hurt piece of this ask.' })
    if (!chosen.includes(piece)) chosen.push(piece)
  }
  return chosen
}

/**
 * The studio's owner makes good to one hurt potter, on that potter's own ask: a credit or a free
 * refire, once each per incident and ask.
 */
export async function makeGood(ctx: AppContext, user: User, incidentId: string, body: RemedyBody): Promise<RemedyJson> {
  const record = await loadIncident(ctx.db.manager, incidentId)
  const viewer = await incidentViewerOf(ctx.db.manager, record, user)
  if (!isOwner(viewer)) throw forbidden('Only the studio’s owner makes good to potters whose pieces were hurt.')
  const { incident } = record
  const hurt = await hurtPiecesOf(ctx.db.manager, incident.id)
  if (!hurt.some((p) => p.requestId === body.requestId))
    throw badRequest('No piece of that ask was hurt in this incident.', { requestId: 'Not a hurt potter’s ask.' }, 'not-hurt')

  const remedyId = await requestAction(ctx, user, body.requestId, 'remedy', async (step) => {
    if (!isOwner(step.viewer)) throw forbidden('Only the studio’s owner makes good to potters whose pieces were hurt.')
    const { manager, rc } = step
    const done = await manager.getRepository(IncidentRemedy).exists({ where: { incidentId, requestId: body.requestId, kind: body.kind } })
    if (done)
      throw conflict(
        body.kind === 'credit'
          ? 'This potter already has a credit for this incident.'
          : 'This potter already has a free refire promised for this incident.',
        'remedy-given',
      )
    const facts: RemedyFacts = {
      incidentUrl: `${ctx.config.publicUrl}/incidents/${incidentId}`,
      kindLabel: INCIDENT_KIND_LABELS[incident.kind],
      note: body.note,
    }
    const mailFacts = factsOf(rc, ctx.config.publicUrl)
    if (body.kind === 'credit') {
      const amount = body.amountCents!
      const currency = askCurrency(rc.request, rc.studio)
      const money = await moneyOf(manager, rc.request.id)
      const refusal = creditRefusal({ state: rc.request.state, creditableCents: money.net }, amount, (c) => formatMoney(c, currency))
      if (refusal)
        throw new HttpError(
          refusal.status,
          refusal.code,
          refusal.message,
          refusal.status === 400 ? { amountCents: refusal.message } : undefined,
        )
      const split = creditSplit(amount, money.onlineNet)
      const reason = `Credit for ware hurt in an incident (${INCIDENT_KIND_LABELS[incident.kind].toLowerCase()}, incident ${incidentId})`
      // The existing refund path: the queued job refunds through Stripe and books the ledger line, and a
      // share the studio was already paid is taken back by the payout run, as for any late refund.
      await enqueueRefund(manager, rc.request.id, split.onlineCents, reason)
      if (split.counterCents > 0)
        await manager.getRepository(CounterRefund).save({
          requestId: rc.request.id,
          amountCents: split.counterCents,
          currency,
          reason,
          paidAt: null,
          paidBy: null,
        })
      const saved = await manager.getRepository(IncidentRemedy).save({
        incidentId,
        requestId: rc.request.id,
        kind: 'credit' as const,
        amountCents: amount,
        onlineCents: split.onlineCents,
        counterCents: split.counterCents,
        currency,
        pieceTags: [],
        targetFiringId: null,
        note: body.note,
        givenBy: user.id,
      })
      const how = [
        split.onlineCents > 0 ? `${formatMoney(split.onlineCents, currency)} refunded to the card` : '',
        split.counterCents > 0 ? `${formatMoney(split.counterCents, currency)} owed back at the counter` : '',
      ].filter(Boolean)
      await step.note(`Credit for ware hurt in an incident: ${formatMoney(amount, currency)} (${how.join(', ')})`, {
        incidentId,
        remedyId: saved.id,
        amountCents: amount,
        onlineCents: split.onlineCents,
        counterCents: split.counterCents,
      })
      const credit = { amountCents: amount, onlineCents: split.onlineCents, counterCents: split.counterCents, currency }
      await step.tellPotter('remedy-credit', creditGivenMail(mailFacts, facts, credit, 'potter'))
      await step.tellStudio('remedy-credit', creditGivenMail(mailFacts, facts, credit, 'studio'))
      return saved.id
    }

    const pieces = refirePieces(hurt, rc.request.id, body.tags)
    let target: { firing: Firing; kilnName: string } | null = null
    if (body.firingId) {
      const coming = await comingFiringsOf(manager, rc.studio.id, incident.firingId)
      const chosen = coming.find((f) => f.id === body.firingId)
      if (!chosen) throw badRequest('Choose one of your coming firings, or none.', { firingId: 'Not one of your coming firings.' })
      target = { firing: await manager.getRepository(Firing).findOneByOrFail({ id: chosen.id }), kilnName: chosen.kilnName }
    }
    const tags = pieces.map((p) => p.tag)
    const saved = await manager.getRepository(IncidentRemedy).save({
      incidentId,
      requestId: rc.request.id,
      kind: 'refire' as const,
      amountCents: null,
      onlineCents: null,
      counterCents: null,
      currency: null,
      pieceTags: tags,
      targetFiringId: target?.firing.id ?? null,
      note: body.note,
      givenBy: user.id,
    })
    const where = target ? ` in the ${target.kilnName} firing of ${formatDate(target.firing.firingDate, rc.studio.timezone)}` : ''
    await step.note(`Free refire promised for ware hurt in an incident: ${tags.join(', ')}${where}`, {
      incidentId,
      remedyId: saved.id,
      tags,
      firingId: target?.firing.id ?? null,
    })
    const refire = { tags, firing: target ? { date: target.firing.firingDate, kilnName: target.kilnName } : null }
    await step.tellPotter('remedy-refire', refirePromisedMail(mailFacts, facts, refire, 'potter'))
    await step.tellStudio('remedy-refire', refirePromisedMail(mailFacts, facts, refire, 'studio'))
    return saved.id
  })
  const [json] = await remedyJsons(ctx.db.manager, [await ctx.db.getRepository(IncidentRemedy).findOneByOrFail({ id: remedyId })])
  return json
}
