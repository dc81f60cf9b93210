// Pieces as records: tagged one by one at drop-off against the studio's own checklist, held back
// (with the reason, a photo and the potter told) without holding back the request, released again,
// given their result at unloading, and opened by their tag. Every change goes through the one door.
import { randomBytes } from 'node:crypto'
import { In, IsNull, type EntityManager } from 'typeorm'
import type { PieceJson, PieceTagged, PieceView } from '../../shared/api/load'
import type { Piece } from '../../shared/firing/check'
import { newTag, readTag } from '../../shared/firing/tags'
import { itemApplies, type PieceResultBody, type PieceTagBody } from '../../shared/schemas/pieces'
import { allowedActions } from '../../shared/workflow/policy'
import type { AppContext } from '../context'
import { Photo, type PhotoKind } from '../entities/Photo'
import { RequestResult } from '../entities/RequestResult'
import type { User } from '../entities/User'
import { WarePiece, type PieceCheck } from '../entities/WarePiece'
import { badRequest, conflict, HttpError, notFound } from '../http/errors'
import { pieceHeldMail, pieceReleasedMail } from '../mail/templates/pickup'
import { firingLoad, loadKey, placeOf } from './load-plan'
import { photoJson } from './photos'
import { factsOf, loadRequest, viewerOf } from './request-context'
import { requestAction, requestFacts, type ActionStep } from './request-door'
import { enqueueStudioSync } from './search-sync'

const lineLabel = (line: Piece | undefined, index: number) => line?.label?.trim() || `Piece ${index + 1}`

export function pieceJson(record: WarePiece, line: Piece | undefined, photos: Photo[] = []): PieceJson {
  return {
    id: record.id,
    tag: record.tag,
    requestId: record.requestId,
    pieceIndex: record.pieceIndex,
    copy: record.copy,
    of: line?.quantity ?? record.copy,
    label: lineLabel(line, record.pieceIndex),
    heightMm: record.heightMm,
    widthMm: record.widthMm,
    depthMm: record.depthMm,
    round: record.round,
    weightG: record.weightG,
    status: record.status,
    hold: record.holdReason !== null ? { reason: record.holdReason, at: (record.heldAt ?? record.createdAt).toISOString() } : null,
    checks: record.checks,
    outcome: record.outcome
      ? { outcome: record.outcome, notes: record.outcomeNotes, at: (record.outcomeAt ?? record.updatedAt).toISOString() }
      : null,
    photos: photos.filter((p) => p.pieceId === record.id).map(photoJson),
    createdAt: record.createdAt.toISOString(),
  }
}

/** A request's pieces in line and copy order, with their own photos. */
export async function requestPieces(manager: EntityManager, requestId: string, lines: Piece[]): Promise<PieceJson[]> {
  const records = await manager.getRepository(WarePiece).find({ where: { requestId }, order: { pieceIndex: 'ASC', copy: 'ASC' } })
  if (!records.length) return []
  const photos = await manager.getRepository(Photo).find({ where: { pieceId: In(records.map((r) => r.id)) }, order: { createdAt: 'ASC' } })
  return records.map((r) => pieceJson(r, lines[r.pieceIndex], photos))
}

/** Inserts a piece under a fresh tag; a tag already taken (a one in hundreds of millions draw) is drawn again. */
export async function insertPiece(
  manager: EntityManager,
  values: Omit<WarePiece, 'id' | 'tag' | 'request' | 'createdAt' | 'updatedAt'>,
): Promise<WarePiece> {
  for (;;) {
    const tag = newTag((n) => randomBytes(n))
    const rows: { id: string }[] = await manager.query(
      `INSERT INTO pieces (tag, request_id, piece_index, copy, height_mm, width_mm, depth_mm, round, weight_g, checks, status, hold_reason, held_at,
                           outcome, outcome_notes, outcome_at, outcome_by, checked_in_by)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15, $16, $17, $18)
       ON CONFLICT (tag) DO NOTHING RETURNING id`,
      [
        tag,
        values.requestId,
        values.pieceIndex,
        values.copy,
        values.heightMm,
        values.widthMm,
        values.depthMm,
        values.round,
        values.weightG,
        JSON.stringify(values.checks),
        values.status,
        values.holdReason,
        values.heldAt,
        values.outcome,
        values.outcomeNotes,
        values.outcomeAt,
        values.outcomeBy,
        values.checkedInBy,
      ],
    )
    if (rows.length) return manager.getRepository(WarePiece).findOneByOrFail({ id: rows[0].id })
  }
}

/** Photos the studio took of this request (uploaded first, named here) become the piece's own. */
async function attachPhotos(
  manager: EntityManager,
  requestId: string,
  pieceId: string,
  photoIds: string[] | undefined,
  kinds: PhotoKind[],
) {
  if (!photoIds?.length) return
  const photos = await manager.getRepository(Photo).findBy({ id: In(photoIds), requestId, kind: In(kinds) })
  if (photos.length !== new Set(photoIds).size)
    throw badRequest('A photo named is not one of the studio’s photos of this ask.', { photoIds: 'Upload the photo to this ask first.' })
  if (photos.some((p) => p.pieceId !== null && p.pieceId !== pieceId))
    throw badRequest('A photo named already shows another piece.', { photoIds: 'That photo shows another piece.' })
  await manager.getRepository(Photo).update({ id: In(photoIds) }, { pieceId })
}

const pieceFacts = (record: WarePiece, line: Piece | undefined) => ({
  tag: record.tag,
  label: lineLabel(line, record.pieceIndex),
  copy: record.copy,
  of: line?.quantity ?? record.copy,
})

async function holdAndTell(step: ActionStep, record: WarePiece, reason: string) {
  const line = step.rc.request.pieces[record.pieceIndex]
  await step.note(`Piece ${record.tag} held back: ${reason}`, { pieceId: record.id, tag: record.tag })
  await step.tellPotter('piece-held', pieceHeldMail(factsOf(step.rc, step.ctx.config.publicUrl), pieceFacts(record, line), reason))
  await enqueueStudioSync(step.manager, step.rc.studio.id)
}

/**
 * One piece taken in at drop-off: the studio's checklist items that apply to its declared line, each
 * ticked or failed; a failed item (or a reason given) holds this piece back, names why, keeps its
 * photos and tells the potter, while the rest of the request goes on. The piece gets its tag here.
 */
export async function tagPiece(ctx: AppContext, actor: User, requestId: string, body: PieceTagBody): Promise<PieceTagged> {
  return requestAction(ctx, actor, requestId, 'tag-piece', async (step) => {
    const { manager, rc } = step
    const line = rc.request.pieces[body.pieceIndex]
    if (!line) throw badRequest('The request declares no such piece.', { pieceIndex: `No piece ${body.pieceIndex + 1}.` })
    const taken = new Set(
      (await manager.getRepository(WarePiece).find({ where: { requestId, pieceIndex: body.pieceIndex } })).map((r) => r.copy),
    )
    let copy = 1
    while (taken.has(copy)) copy++
    if (copy > line.quantity)
      throw conflict(
        `All ${line.quantity} of “${lineLabel(line, body.pieceIndex)}” declared are tagged. A piece not on the ask needs the potter to add it first.`,
        'all-tagged',
      )
    const items = rc.studio.dropOffChecklist.filter((item) => itemApplies(item, line))
    const fields: Record<string, string> = {}
    for (const item of items) if (body.checks[item.id] === undefined) fields[`checks.${item.id}`] = 'Tick or fail this item.'
    for (const id of Object.keys(body.checks))
      if (!items.some((item) => item.id === id)) fields[`checks.${id}`] = 'Not on the studio’s checklist for this piece.'
    if (Object.keys(fields).length) throw badRequest('Answer every item of the checklist for this piece.', fields)
    const checks: PieceCheck[] = items.map((item) => ({ id: item.id, label: item.label, passed: body.checks[item.id] }))
    const failed = checks.filter((c) => !c.passed)
    const reason = body.holdReason ?? (failed.length ? `Failed at drop-off: ${failed.map((c) => c.label).join('; ')}` : null)
    const size = body.measured ?? line
    const record = await insertPiece(manager, {
      requestId,
      pieceIndex: body.pieceIndex,
      copy,
      heightMm: size.heightMm,
      widthMm: size.widthMm,
      depthMm: line.round === true ? size.widthMm : size.depthMm,
      round: line.round === true,
      weightG: body.weightG ?? line.weightG ?? null,
      checks,
      status: reason ? 'held' : 'in-load',
      holdReason: reason,
      heldAt: reason ? new Date() : null,
      outcome: null,
      outcomeNotes: '',
      outcomeAt: null,
      outcomeBy: null,
      checkedInBy: actor.id,
    })
    await attachPhotos(manager, requestId, record.id, body.photoIds, ['check-in', 'refusal'])
    if (reason) await holdAndTell(step, record, reason)
    const pieces = await requestPieces(manager, requestId, rc.request.pieces)
    return { piece: pieces.find((p) => p.id === record.id)!, pieces }
  })
}

/** Reads a tag as typed or scanned; a malformed one is a 400 that says what is wrong with it. */
export function tagFrom(input: string): string {
  const reading = readTag(input)
  if (!reading.ok) throw new HttpError(400, 'bad-tag', reading.reason, { tag: reading.reason })
  return reading.tag
}

async function pieceByTag(manager: EntityManager, tag: string, lock = false): Promise<WarePiece> {
  const record = await manager
    .getRepository(WarePiece)
    .findOne({ where: { tag }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) })
  if (!record) throw notFound('No piece with that tag')
  return record
}

/** Runs an action on the request a tagged piece belongs to, with the piece read again under the lock. */
async function pieceAction<T>(
  ctx: AppContext,
  actor: User,
  tagInput: string,
  action: 'hold-piece' | 'results',
  apply: (step: ActionStep, record: WarePiece) => Promise<T>,
): Promise<T> {
  const tag = tagFrom(tagInput)
  const found = await pieceByTag(ctx.db.manager, tag)
  // Someone with no standing on the request learns nothing about the piece.
  await viewerOf(ctx.db.manager, await loadRequest(ctx.db.manager, found.requestId), actor)
  return requestAction(ctx, actor, found.requestId, action, async (step) => apply(step, await pieceByTag(step.manager, tag, true)))
}

/** Holds a piece back before loading (cracked on the shelf, still damp after all): the potter is told why. */
export async function holdPiece(ctx: AppContext, actor: User, tag: string, body: { reason: string; photoIds?: string[] }) {
  await pieceAction(ctx, actor, tag, 'hold-piece', async (step, record) => {
    if (record.status === 'held') throw conflict('That piece is held back already.', 'already-held')
    await step.manager.update(WarePiece, record.id, { status: 'held', holdReason: body.reason, heldAt: new Date() })
    await attachPhotos(step.manager, record.requestId, record.id, body.photoIds, ['check-in', 'refusal'])
    await holdAndTell(step, record, body.reason)
  })
  return showPiece(ctx, actor, tag)
}

/** Takes a held piece into the load after all, if the load still has room for it. */
export async function releasePiece(ctx: AppContext, actor: User, tag: string) {
  await pieceAction(ctx, actor, tag, 'hold-piece', async (step, record) => {
    const { manager, rc } = step
    if (record.status !== 'held') throw conflict('That piece is not held back.', 'not-held')
    await manager.update(WarePiece, record.id, { status: 'in-load', holdReason: null, heldAt: null })
    const load = await firingLoad(manager, rc.firing)
    if (load.plan.unplaced.some((u) => u.key === loadKey(record.requestId, record.pieceIndex, record.copy)))
      throw conflict('The load has no room left for this piece.', 'no-space', { shelvesLeft: load.room.shelvesLeft })
    await step.note(`Piece ${record.tag} taken back into the load`, { pieceId: record.id, tag: record.tag })
    await step.tellPotter(
      'piece-released',
      pieceReleasedMail(factsOf(rc, ctx.config.publicUrl), pieceFacts(record, rc.request.pieces[record.pieceIndex])),
    )
    await enqueueStudioSync(manager, rc.studio.id)
  })
  return showPiece(ctx, actor, tag)
}

/**
 * Once every piece in the load has its outcome, the request's results stand (the studio can then mark
 * it ready); written once, with a timeline entry.
 */
export async function resultsCompleteIfAll(step: Pick<ActionStep, 'manager' | 'rc' | 'note'>, actorId: string, notes?: string) {
  const { manager, rc } = step
  const open = await manager.getRepository(WarePiece).count({ where: { requestId: rc.request.id, status: 'in-load', outcome: IsNull() } })
  if (open > 0) return false
  const existing = await manager.getRepository(RequestResult).findOne({ where: { requestId: rc.request.id } })
  await manager.getRepository(RequestResult).save({ requestId: rc.request.id, notes: notes ?? existing?.notes ?? '', postedBy: actorId })
  if (!existing) await step.note('Results posted for every piece')
  return true
}

/** A piece's result, posted from its tag at unloading: how it came out, with notes and photos. */
export async function postPieceResult(ctx: AppContext, actor: User, tag: string, body: PieceResultBody) {
  await pieceAction(ctx, actor, tag, 'results', async (step, record) => {
    if (record.status === 'held') throw conflict('That piece was held back and not fired.', 'piece-held')
    await step.manager.update(WarePiece, record.id, {
      outcome: body.outcome,
      outcomeNotes: body.notes ?? '',
      outcomeAt: new Date(),
      outcomeBy: actor.id,
    })
    await attachPhotos(step.manager, record.requestId, record.id, body.photoIds, ['result'])
    await resultsCompleteIfAll(step, actor.id)
  })
  return showPiece(ctx, actor, tag)
}

/** A piece opened by its tag: for its potter, the studio's people and admins; a 404 for anyone else. */
export async function showPiece(ctx: AppContext, user: Pick<User, 'id' | 'role'>, tagInput: string): Promise<PieceView> {
  const manager = ctx.db.manager
  const record = await pieceByTag(manager, tagFrom(tagInput))
  const rc = await loadRequest(manager, record.requestId)
  const viewer = await viewerOf(manager, rc, user)
  const photos = await manager.getRepository(Photo).find({ where: { pieceId: record.id }, order: { createdAt: 'ASC' } })
  const line = rc.request.pieces[record.pieceIndex]
  const load = await firingLoad(manager, rc.firing)
  const allowed = allowedActions(await requestFacts(manager, rc), viewer.side)
  const actions: PieceView['actions'] = []
  if (allowed.includes('hold-piece')) actions.push(record.status === 'held' ? 'release' : 'hold')
  if (allowed.includes('results') && record.status === 'in-load') actions.push('result')
  return {
    ...pieceJson(record, line, photos),
    viewer: viewer.side,
    potter: { id: rc.potter.id, displayName: rc.potter.displayName },
    request: { id: rc.request.id, state: rc.request.state },
    firing: {
      id: rc.firing.id,
      kind: rc.firing.kind,
      cone: rc.firing.cone,
      atmosphere: rc.firing.atmosphere,
      firingDate: rc.firing.firingDate.toISOString(),
      status: rc.firing.status,
    },
    studio: { id: rc.studio.id, name: rc.studio.name, timezone: rc.studio.timezone },
    kilnName: rc.kiln.name,
    findings: rc.request.findings.filter((f) => f.pieceIndex === record.pieceIndex),
    place: record.status === 'in-load' ? placeOf(load, loadKey(record.requestId, record.pieceIndex, record.copy)) : null,
    actions,
  }
}
