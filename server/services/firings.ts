import { TZDate } from '@date-fns/tz'
import type { EntityManager } from 'typeorm'
import { addWeeks } from 'date-fns'
import { randomUUID } from 'node:crypto'
import type { Firing as FiringSpec, Kiln as KilnSpec } from '../../shared/firing/check'
import { loadKiln, type LoadRoom } from '../../shared/firing/load'
import { compareCones, coneTemperatureC, formatCone } from '../../shared/firing/cones'
import type { PriceList } from '../../shared/firing/quote'
import { plannedFinalRateCPerHour } from '../../shared/firing/schedule'
import type { FiringJson } from '../../shared/api/studios'
import type { FiringCreateBody, FiringPatchBody } from '../../shared/schemas/studios'
import { nextFiringStatuses, type FiringStatus } from '../../shared/workflow/firing-status'
import { UNDO_WINDOW_MS } from '../../shared/workflow/undo'
import { enqueueStudioSync } from './search-sync'
import type { AppContext } from '../context'
import { Firing } from '../entities/Firing'
import { Kiln } from '../entities/Kiln'
import { Studio } from '../entities/Studio'
import { badRequest, conflict, type FieldErrors, HttpError, notFound } from '../http/errors'
import { isUuid } from '../http/validate'
import { getKiln, getPriceList, kilnSpec } from './kilns'
import { firingLoad, loadsOf } from './load-plan'

export function firingJson(firing: Firing, studioId: string, space: LoadRoom, undo: FiringJson['undo'] = null): FiringJson {
  return {
    id: firing.id,
    kilnId: firing.kilnId,
    studioId,
    kind: firing.kind,
    cone: firing.cone,
    atmosphere: firing.atmosphere,
    slowCool: firing.slowCool,
    cooling: firing.cooling,
    dropOffBy: firing.dropOffBy.toISOString(),
    firingDate: firing.firingDate.toISOString(),
    readyBy: firing.readyBy.toISOString(),
    layersOnSale: firing.layersOnSale,
    space,
    status: firing.status,
    nextStatuses: nextFiringStatuses(firing.status),
    schedule: firing.schedule,
    notes: firing.notes,
    seriesId: firing.seriesId,
    cancelledReason: firing.cancelledReason,
    undo,
  }
}

/** Each firing's last stage move that can still be undone (see firing-stages.ts). */
async function undoableMoves(manager: EntityManager, firingIds: string[], now = new Date()): Promise<Map<string, FiringJson['undo']>> {
  const moves = new Map<string, FiringJson['undo']>()
  if (!firingIds.length) return moves
  const rows: { firing_id: string; from_status: FiringStatus; to_status: FiringStatus; at: Date; undone_at: Date | null }[] =
    await manager.query(
      `SELECT DISTINCT ON (firing_id) firing_id, from_status, to_status, at, undone_at FROM firing_events
       WHERE firing_id = ANY($1::uuid[]) ORDER BY firing_id, at DESC`,
      [firingIds],
    )
  for (const row of rows) {
    const until = new Date(new Date(row.at).getTime() + UNDO_WINDOW_MS)
    if (!row.undone_at && row.to_status !== 'cancelled' && until > now)
      moves.set(row.firing_id, { from: row.from_status, until: until.toISOString() })
  }
  return moves
}

/** Firings as JSON with the space their loads have left, for one query's worth of firings. */
export async function firingsJson(manager: EntityManager, firings: Firing[], studioId: string): Promise<FiringJson[]> {
  const loads = await loadsOf(manager, firings)
  const undo = await undoableMoves(
    manager,
    firings.map((f) => f.id),
  )
  return firings.map((f) => {
    const move = undo.get(f.id)
    return firingJson(f, studioId, loads.get(f.id)!.room, move && f.status !== 'cancelled' ? move : null)
  })
}

/** Why a firing cannot be run in this kiln, per field; empty when it can. */
export function firingProblems(kiln: KilnSpec, firing: { cone?: string; atmosphere?: string; layersOnSale?: number | null }): FieldErrors {
  const problems: FieldErrors = {}
  if (firing.cone !== undefined) {
    if (compareCones(firing.cone, kiln.minCone) < 0 || compareCones(firing.cone, kiln.maxCone) > 0) {
      problems.cone = `This kiln fires ${formatCone(kiln.minCone)} to ${formatCone(kiln.maxCone)}.`
    } else if (coneTemperatureC(firing.cone, plannedFinalRateCPerHour(firing.cone, kiln)) > kiln.maxTempC) {
      problems.cone = `${formatCone(firing.cone)} needs more heat than this kiln’s top temperature.`
    }
  }
  if (firing.atmosphere !== undefined && !kiln.atmospheres.includes(firing.atmosphere as KilnSpec['atmospheres'][number])) {
    problems.atmosphere = `This kiln fires ${kiln.atmospheres.join(' or ')}.`
  }
  if (firing.layersOnSale !== undefined && firing.layersOnSale !== null) {
    const layers = loadKiln(kiln).layers
    if (firing.layersOnSale > layers)
      problems.layersOnSale = `The kiln’s shelves make ${layers} ${layers === 1 ? 'layer' : 'layers'}; offer at most that.`
  }
  return problems
}

export async function getFiring(manager: EntityManager, id: string, lock = false): Promise<Firing> {
  const firing = await manager
    .getRepository(Firing)
    .findOne({ where: { id }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) })
  if (!firing) throw notFound('That firing')
  return firing
}

/** Creates one firing, or a series: the same local time every N weeks in the studio's zone. */
export async function createFirings(ctx: AppContext, kilnId: string, body: FiringCreateBody): Promise<Firing[]> {
  return ctx.db.transaction(async (manager) => {
    const kiln = await getKiln(manager, kilnId)
    if (kiln.retiredAt) throw conflict('This kiln is retired and takes no new firings.', 'kiln-retired')
    const problems = firingProblems(kilnSpec(kiln), body)
    if (Object.keys(problems).length) throw badRequest('This firing does not suit the kiln.', problems)
    const studio = await manager.getRepository(Studio).findOneByOrFail({ id: kiln.studioId })
    const times = body.repeat?.times ?? 1
    const seriesId = times > 1 ? randomUUID() : null
    const shift = (iso: string, i: number) =>
      new Date(addWeeks(new TZDate(iso, studio.timezone), i * (body.repeat?.everyWeeks ?? 1)).getTime())
    const firings = Array.from({ length: times }, (_, i) =>
      manager.getRepository(Firing).create({
        kilnId,
        kind: body.kind,
        cone: body.cone,
        atmosphere: body.atmosphere,
        slowCool: body.slowCool ?? false,
        cooling: body.cooling ?? 'natural',
        dropOffBy: shift(body.dropOffBy, i),
        firingDate: shift(body.firingDate, i),
        readyBy: shift(body.readyBy, i),
        layersOnSale: body.layersOnSale ?? null,
        status: 'open',
        schedule: body.schedule ?? null,
        notes: body.notes ?? '',
        seriesId,
        cancelledReason: null,
      }),
    )
    const saved = await manager.getRepository(Firing).save(firings)
    await enqueueStudioSync(manager, kiln.studioId)
    return saved
  })
}

export async function updateFiring(ctx: AppContext, id: string, patch: FiringPatchBody): Promise<Firing> {
  return ctx.db.transaction(async (manager) => {
    const firing = await getFiring(manager, id, true)
    const kiln = await getKiln(manager, firing.kilnId)
    // The stage (status) moves through firing-stages.ts; this changes dates, space and notes.
    const fields = patch
    if (firing.status === 'cancelled') throw conflict('This firing is cancelled.', 'firing-cancelled')
    if (Object.keys(fields).length) {
      const problems = firingProblems(kilnSpec(kiln), fields)
      if (Object.keys(problems).length) throw badRequest('This firing does not suit the kiln.', problems)
      const next = {
        dropOffBy: fields.dropOffBy ? new Date(fields.dropOffBy) : firing.dropOffBy,
        firingDate: fields.firingDate ? new Date(fields.firingDate) : firing.firingDate,
        readyBy: fields.readyBy ? new Date(fields.readyBy) : firing.readyBy,
      }
      if (next.dropOffBy > next.firingDate)
        throw badRequest('Some fields need fixing.', { dropOffBy: 'Drop-off must close before the firing starts.' })
      if (next.firingDate > next.readyBy)
        throw badRequest('Some fields need fixing.', { readyBy: 'Ware can be ready only after the firing.' })
      if (fields.layersOnSale !== undefined) {
        // Fewer layers may not leave out ware the load already holds.
        const now = await firingLoad(manager, firing)
        const after = await firingLoad(manager, { ...firing, layersOnSale: fields.layersOnSale })
        if (after.plan.unplaced.length > now.plan.unplaced.length) {
          const need = now.plan.layers.length
          throw new HttpError(
            409,
            'layers-below-held',
            `The ware taken on already fills ${need} ${need === 1 ? 'layer' : 'layers'}; offer at least that.`,
            {
              layersOnSale: `The load already takes ${need} ${need === 1 ? 'layer' : 'layers'}.`,
            },
          )
        }
      }
      Object.assign(firing, { ...fields, ...next })
    }
    const saved = await manager.getRepository(Firing).save(firing)
    await enqueueStudioSync(manager, kiln.studioId)
    return saved
  })
}

/** The firings of a kiln; the public sees upcoming ones that are not cancelled. */
export async function listKilnFirings(manager: EntityManager, kilnId: string, { all = false } = {}): Promise<Firing[]> {
  const qb = manager.getRepository(Firing).createQueryBuilder('f').where('f.kiln_id = :kilnId', { kilnId }).orderBy('f.firing_date', 'ASC')
  if (!all) qb.andWhere(`f.status <> 'cancelled'`).andWhere('f.ready_by >= now()')
  return qb.getMany()
}

/** A studio's firings between two instants (all kilns), for the calendar and the kiln room. */
export async function listStudioFirings(
  manager: EntityManager,
  studioId: string,
  { from, to, includeCancelled = false }: { from?: Date; to?: Date; includeCancelled?: boolean } = {},
): Promise<Firing[]> {
  const qb = manager
    .getRepository(Firing)
    .createQueryBuilder('f')
    .innerJoin('f.kiln', 'k')
    .where('k.studio_id = :studioId', { studioId })
    .orderBy('f.firing_date', 'ASC')
  if (from) qb.andWhere('f.ready_by >= :from', { from })
  if (to) qb.andWhere('f.firing_date <= :to', { to })
  if (!includeCancelled) qb.andWhere(`f.status <> 'cancelled'`)
  return qb.getMany()
}

/** What the ware check needs for a firing people may see: its kiln, spec with space left, price list. */
export async function loadFiringForCheck(
  ctx: AppContext,
  firingId: string,
): Promise<{ kiln: KilnSpec; firing: FiringSpec; priceList: PriceList | null } | null> {
  if (!isUuid(firingId)) return null
  const firing = await ctx.db.getRepository(Firing).findOne({ where: { id: firingId } })
  if (!firing || firing.status === 'cancelled') return null
  const kiln = await ctx.db.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId })
  const studio = await ctx.db.getRepository(Studio).findOneByOrFail({ id: kiln.studioId })
  if (!studio.published) return null
  const { room } = await firingLoad(ctx.db.manager, firing)
  return {
    kiln: kilnSpec(kiln),
    firing: {
      kind: firing.kind,
      cone: firing.cone,
      atmosphere: firing.atmosphere,
      slowCool: firing.slowCool,
      cooling: firing.cooling,
      load: { room },
    },
    priceList: await getPriceList(ctx.db.manager, kiln.id),
  }
}
