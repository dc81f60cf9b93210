// A firing's load, planned on every read from what it holds: the declared pieces of requests taken on
// (until their ware is checked in) and the tagged pieces after, around the placements the crew chose.
// Space left, the refusal when a request does not fit, search's figures and the unloading list all
// come from here (the planning itself is shared/firing/load.ts).
import { In, type EntityManager } from 'typeorm'
import type { LoadItemJson, LoadPlanJson } from '../../shared/api/load'
import type { Piece } from '../../shared/firing/check'
import {
  gapFor,
  loadKiln,
  loadRoom,
  piecesOfLine,
  placementsOf,
  planLoad,
  shelfShare,
  UNPLACED_WORDS,
  type LoadKiln,
  type LoadPiece,
  type LoadPlan,
  type LoadRoom,
  type Placement,
} from '../../shared/firing/load'
import { HOLDING_STATES, type RequestState } from '../../shared/workflow/request-states'
import type { AppContext } from '../context'
import { Firing } from '../entities/Firing'
import { FiringRequest } from '../entities/FiringRequest'
import { Kiln } from '../entities/Kiln'
import { LoadPlanRecord } from '../entities/LoadPlanRecord'
import type { User } from '../entities/User'
import { WarePiece } from '../entities/WarePiece'
import { badRequest, conflict } from '../http/errors'
import { kilnSpec } from './kilns'
import { lockFirings } from './request-door'
import { enqueueStudioSync } from './search-sync'

/** Requests whose ware is declared but not yet in the studio's hands. */
const BEFORE_DROP_OFF: readonly RequestState[] = ['accepted', 'deposit_paid']

export interface LoadItem extends Omit<LoadItemJson, 'heightMm' | 'widthMm' | 'depthMm' | 'round' | 'weightKg'> {
  piece: LoadPiece
}

export interface FiringLoad {
  firing: Firing
  kiln: LoadKiln
  items: LoadItem[]
  held: (LoadItem & { holdReason: string })[]
  plan: LoadPlan
  room: LoadRoom
  loadedAt: Date | null
}

/** Pieces planned for a request that is not in the load yet (a request being taken on, or a draft being checked). */
export interface ExtraWare {
  requestId: string
  potterId: string
  potterName: string
  pieces: Piece[]
}

export const loadKey = (requestId: string, pieceIndex: number, copy: number) => `${requestId}:${pieceIndex}:${copy}`

const lineLabel = (line: Piece | undefined, index: number) => line?.label?.trim() || `Piece ${index + 1}`

function itemOfRecord(record: WarePiece, line: Piece | undefined, potter: { id: string; name: string }): LoadItem {
  // Weighed at drop-off, or as the potter declared it.
  const weightG = record.weightG ?? line?.weightG ?? null
  return {
    key: loadKey(record.requestId, record.pieceIndex, record.copy),
    tag: record.tag,
    pieceId: record.id,
    requestId: record.requestId,
    potterId: potter.id,
    potterName: potter.name,
    label: lineLabel(line, record.pieceIndex),
    pieceIndex: record.pieceIndex,
    copy: record.copy,
    of: line?.quantity ?? record.copy,
    outcome: record.outcome,
    piece: {
      key: loadKey(record.requestId, record.pieceIndex, record.copy),
      heightMm: record.heightMm,
      widthMm: record.widthMm,
      depthMm: record.round ? record.widthMm : record.depthMm,
      round: record.round,
      weightKg: weightG !== null ? weightG / 1000 : null,
    },
  }
}

/** Declared pieces of a line not yet tagged: every copy no record took. */
function declaredItems(requestId: string, lines: Piece[], taken: Set<string>, potter: { id: string; name: string }): LoadItem[] {
  const items: LoadItem[] = []
  lines.forEach((line, index) => {
    for (const piece of piecesOfLine(`${requestId}:${index}`, line)) {
      if (taken.has(piece.key)) continue
      const copy = Number(piece.key.slice(piece.key.lastIndexOf(':') + 1))
      items.push({
        key: piece.key,
        tag: null,
        pieceId: null,
        requestId,
        potterId: potter.id,
        potterName: potter.name,
        label: lineLabel(line, index),
        pieceIndex: index,
        copy,
        of: line.quantity,
        outcome: null,
        piece,
      })
    }
  })
  return items
}

interface LoadOptions {
  /** A request's pieces planned as if it were in the load. */
  extra?: ExtraWare
  /** A request left out (re-checked with the pieces it actually brought, passed as extra). */
  exclude?: string
  /** Placements to plan around instead of the stored ones (the crew's edit being checked). */
  pins?: Placement[]
}

/** The loads of several firings, planned from one read of their requests, pieces, plans and kilns. */
export async function loadsOf(manager: EntityManager, firings: Firing[], options: LoadOptions = {}): Promise<Map<string, FiringLoad>> {
  const loads = new Map<string, FiringLoad>()
  if (!firings.length) return loads
  const firingIds = firings.map((f) => f.id)
  const kilns = new Map(
    (await manager.getRepository(Kiln).findBy({ id: In([...new Set(firings.map((f) => f.kilnId))]) })).map((k) => [k.id, k]),
  )
  const requests: (Pick<FiringRequest, 'id' | 'firingId' | 'potterId' | 'state' | 'pieces'> & { potterName: string })[] = (
    await manager.query(
      `SELECT r.id, r.firing_id, r.potter_id, r.state, r.pieces, u.display_name FROM firing_requests r JOIN users u ON u.id = r.potter_id
       WHERE r.firing_id = ANY($1::uuid[]) AND r.state = ANY($2::text[]) ORDER BY r.sent_at NULLS LAST, r.id`,
      [firingIds, HOLDING_STATES],
    )
  ).map((r: { id: string; firing_id: string; potter_id: string; state: RequestState; pieces: Piece[]; display_name: string }) => ({
    id: r.id,
    firingId: r.firing_id,
    potterId: r.potter_id,
    state: r.state,
    pieces: r.pieces,
    potterName: r.display_name,
  }))
  const records = requests.length
    ? await manager.getRepository(WarePiece).find({
        where: { requestId: In(requests.map((r) => r.id)) },
        order: { pieceIndex: 'ASC', copy: 'ASC' },
      })
    : []
  const stored = new Map((await manager.getRepository(LoadPlanRecord).findBy({ firingId: In(firingIds) })).map((p) => [p.firingId, p]))

  for (const firing of firings) {
    const kiln = loadKiln(kilnSpec(kilns.get(firing.kilnId)!))
    const items: LoadItem[] = []
    const held: FiringLoad['held'] = []
    for (const request of requests) {
      if (request.firingId !== firing.id || request.id === options.exclude) continue
      const potter = { id: request.potterId, name: request.potterName }
      const own = records.filter((r) => r.requestId === request.id)
      for (const record of own) {
        const item = itemOfRecord(record, request.pieces[record.pieceIndex], potter)
        if (record.status === 'held') held.push({ ...item, holdReason: record.holdReason ?? '' })
        else items.push(item)
      }
      // Before drop-off the declared pieces hold the place; those already tagged stand for themselves.
      if (BEFORE_DROP_OFF.includes(request.state))
        items.push(
          ...declaredItems(request.id, request.pieces, new Set(own.map((r) => loadKey(r.requestId, r.pieceIndex, r.copy))), potter),
        )
    }
    const extra = options.extra
    if (extra) items.push(...declaredItems(extra.requestId, extra.pieces, new Set(), { id: extra.potterId, name: extra.potterName }))
    const record = stored.get(firing.id)
    const present = new Set(items.map((i) => i.key))
    const plan = planLoad({
      kiln,
      gapMm: gapFor(kiln, firing.kind),
      pieces: items.map((i) => i.piece),
      // Stored placements of pieces that left the load (withdrawn, held back) are simply dropped.
      pins: options.pins ?? (record?.placements ?? []).filter((p) => present.has(p.key)),
      maxLayers: firing.layersOnSale ?? undefined,
    })
    loads.set(firing.id, { firing, kiln, items, held, plan, room: loadRoom(plan), loadedAt: record?.loadedAt ?? null })
  }
  return loads
}

export async function firingLoad(manager: EntityManager, firing: Firing, options: LoadOptions = {}): Promise<FiringLoad> {
  return (await loadsOf(manager, [firing], options)).get(firing.id)!
}

/** The shelves declared ware takes in a firing's kiln, planned alone (what shelf pricing charges for). */
export function shelvesNeeded(kiln: Kiln, firing: Pick<Firing, 'kind'>, lines: Piece[]): number {
  const load = loadKiln(kilnSpec(kiln))
  return shelfShare(
    load,
    gapFor(load, firing.kind),
    lines.flatMap((line, index) => piecesOfLine(`n:${index}`, line)),
  ).shelves
}

/** Shelves needed by each of these requests, in their own firings' kilns. */
export async function shelvesNeededOf(manager: EntityManager, requests: Pick<FiringRequest, 'id' | 'firingId' | 'pieces'>[]) {
  const needed = new Map<string, number>()
  if (!requests.length) return needed
  const rows: { firing_id: string; kind: Firing['kind']; kiln_id: string }[] = await manager.query(
    `SELECT f.id AS firing_id, f.kind, f.kiln_id FROM firings f WHERE f.id = ANY($1::uuid[])`,
    [[...new Set(requests.map((r) => r.firingId))]],
  )
  const kilns = new Map((await manager.getRepository(Kiln).findBy({ id: In(rows.map((r) => r.kiln_id)) })).map((k) => [k.id, k]))
  const firings = new Map(rows.map((r) => [r.firing_id, r]))
  for (const request of requests) {
    const firing = firings.get(request.firingId)!
    needed.set(request.id, shelvesNeeded(kilns.get(firing.kiln_id)!, firing, request.pieces))
  }
  return needed
}

/** Whether extra ware goes into the firing's load as it stands, and the room before it. */
export async function fitsInLoad(manager: EntityManager, firing: Firing, extra: ExtraWare, { exclude }: { exclude?: string } = {}) {
  const before = await firingLoad(manager, firing, { exclude })
  const after = await firingLoad(manager, firing, { exclude, extra })
  const mine = new Set(after.items.filter((i) => i.requestId === extra.requestId).map((i) => i.key))
  const left = after.plan.unplaced.filter((u) => mine.has(u.key))
  // Fits when every piece of it has a place and nobody already in the load lost theirs.
  const fits = left.length === 0 && after.plan.unplaced.length <= before.plan.unplaced.length
  return { fits, room: before.room, unplaced: left }
}

const itemJson = (item: LoadItem): LoadItemJson => {
  const { piece, ...rest } = item
  return { ...rest, heightMm: piece.heightMm, widthMm: piece.widthMm, depthMm: piece.depthMm, round: piece.round, weightKg: piece.weightKg }
}

/** Crew may move pieces until the firing starts. */
const editableIn = (status: Firing['status']) => status === 'open' || status === 'full' || status === 'closed' || status === 'loading'

export function loadPlanJson(load: FiringLoad): LoadPlanJson {
  const byKey = new Map(load.items.map((i) => [i.key, i]))
  const potters: { id: string; name: string }[] = []
  for (const item of [...load.items, ...load.held])
    if (!potters.some((p) => p.id === item.potterId)) potters.push({ id: item.potterId, name: item.potterName })
  return {
    firingId: load.firing.id,
    firingStatus: load.firing.status,
    editable: editableIn(load.firing.status),
    loadedAt: load.loadedAt?.toISOString() ?? null,
    kiln: load.kiln,
    gapMm: load.plan.gapMm,
    maxLayers: load.plan.maxLayers,
    stackMm: load.plan.stackMm,
    layers: load.plan.layers.map((layer) => ({
      ...layer,
      shelves: layer.shelves.map((shelf) => ({
        ...shelf,
        pieces: shelf.pieces.map((placed) => {
          const { piece: _piece, ...who } = byKey.get(placed.key)!
          return { ...who, ...placed }
        }),
      })),
    })),
    unplaced: load.plan.unplaced.map((u) => ({ ...itemJson(byKey.get(u.key)!), reason: u.reason, reasonText: UNPLACED_WORDS[u.reason] })),
    held: load.held.map((h) => ({ ...itemJson(h), holdReason: h.holdReason })),
    problems: load.plan.problems,
    room: load.room,
    potters,
  }
}

/** Where a piece stands in its firing's load, if it has a place. */
export function placeOf(load: FiringLoad, key: string) {
  const placed = placementsOf(load.plan).find((p) => p.key === key)
  return placed
    ? { layer: placed.layer, shelf: placed.shelf, x: placed.x, y: placed.y, rotation: placed.rotation, layerCount: load.plan.layers.length }
    : null
}

/** A firing's load as its studio's people see it. */
export async function firingLoadPlan(ctx: AppContext, firingId: string): Promise<LoadPlanJson> {
  const firing = await ctx.db.getRepository(Firing).findOneByOrFail({ id: firingId })
  return loadPlanJson(await firingLoad(ctx.db.manager, firing))
}

/**
 * The crew's placements, checked by planning the load around them: any that cannot stand (over the
 * edge, too close to another piece, an overloaded shelf, a stack above the usable height) refuse the
 * whole edit with a message per placement. Kept once they stand; the firing's row is locked first.
 */
export async function saveLoadPlan(
  ctx: AppContext,
  actor: Pick<User, 'id'>,
  firingId: string,
  placements: Placement[],
): Promise<LoadPlanJson> {
  return ctx.db.transaction(async (manager) => {
    const firing = (await lockFirings(manager, [firingId])).get(firingId)!
    if (!editableIn(firing.status)) throw conflict('The firing has started; its load can no longer be changed.', 'load-fired')
    const load = await firingLoad(manager, firing, { pins: placements })
    if (load.plan.problems.length) {
      const fields: Record<string, string> = {}
      for (const problem of load.plan.problems) {
        const index = placements.findIndex((p) => p.key === problem.key)
        fields[`placements.${index >= 0 ? index : '_'}`] ??= problem.message
      }
      throw badRequest('Some pieces cannot stand where they were put.', fields, 'plan-invalid')
    }
    await manager.getRepository(LoadPlanRecord).save({ firingId, placements, updatedBy: actor.id, loadedAt: load.loadedAt })
    await enqueueStudioSync(manager, (await manager.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId })).studioId)
    return loadPlanJson(load)
  })
}

/**
 * Loading started: the plan as it stands becomes the load as it went in (every piece kept where it
 * was planned), so nothing moves when a piece is held back or the plan is read again.
 */
export async function recordLoaded(manager: EntityManager, firing: Firing, at = new Date()) {
  const load = await firingLoad(manager, firing)
  const placements: Placement[] = placementsOf(load.plan).map(({ key, layer, shelf, x, y, rotation }) => ({
    key,
    layer,
    shelf,
    x,
    y,
    rotation,
  }))
  await manager.getRepository(LoadPlanRecord).save({ firingId: firing.id, placements, loadedAt: at })
}
