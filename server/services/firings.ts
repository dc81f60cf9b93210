import { TZDate } from '@date-fns/tz'
import { addWeeks } from 'date-fns'
import { randomUUID } from 'node:crypto'
import { In, type EntityManager } from 'typeorm'
import { kilnVolumeL, type Firing as FiringSpec, type Kiln as KilnSpec } from '../../shared/firing/check'
import { compareCones, coneTemperatureC, formatCone } from '../../shared/firing/cones'
import type { PriceList } from '../../shared/firing/quote'
import { plannedFinalRateCPerHour } from '../../shared/firing/schedule'
import type { FiringJson } from '../../shared/api/studios'
import type { FiringCreateBody, FiringPatchBody } from '../../shared/schemas/studios'
import { canMoveFiring, nextFiringStatuses } from '../../shared/workflow/firing-status'
import { HOLDING_STATES } from '../../shared/workflow/request-states'
import { enqueueStudioSync } from './search-sync'
import type { AppContext } from '../context'
import { Firing } from '../entities/Firing'
import { FiringRequest } from '../entities/FiringRequest'
import { Kiln } from '../entities/Kiln'
import { RequestEvent } from '../entities/RequestEvent'
import { Studio } from '../entities/Studio'
import { User } from '../entities/User'
import { badRequest, conflict, type FieldErrors, HttpError, notFound } from '../http/errors'
import { isUuid } from '../http/validate'
import { firingCancelledMail } from '../mail/templates/firings'
import { getKiln, getPriceList, kilnSpec } from './kilns'
import { queueMail } from './mail'
import { onFiringStatus } from './pickup'
import { refundCancelledByFiring } from './requests'

/** Litres held per firing by the requests in holding states; computed, never stored. */
export async function heldLitres(manager: EntityManager, firingIds: string[]): Promise<Map<string, number>> {
  const held = new Map<string, number>(firingIds.map((id) => [id, 0]))
  if (!firingIds.length) return held
  const rows: { firing_id: string; held: number }[] = await manager.query(
    `SELECT firing_id, coalesce(sum(volume_l), 0)::float8 AS held FROM firing_requests
     WHERE firing_id = ANY($1::uuid[]) AND state = ANY($2::text[]) GROUP BY firing_id`,
    [firingIds, HOLDING_STATES],
  )
  for (const row of rows) held.set(row.firing_id, row.held)
  return held
}

export function firingJson(firing: Firing, studioId: string, heldL: number): FiringJson {
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
    capacityL: firing.capacityL,
    heldL: round1(heldL),
    spaceLeftL: round1(Math.max(0, firing.capacityL - heldL)),
    status: firing.status,
    nextStatuses: nextFiringStatuses(firing.status),
    schedule: firing.schedule,
    notes: firing.notes,
    seriesId: firing.seriesId,
    cancelledReason: firing.cancelledReason,
  }
}

const round1 = (n: number) => Math.round(n * 10) / 10

/** Firings as JSON with their held space, for one query's worth of firings. */
export async function firingsJson(manager: EntityManager, firings: Firing[], studioId: string): Promise<FiringJson[]> {
  const held = await heldLitres(
    manager,
    firings.map((f) => f.id),
  )
  return firings.map((f) => firingJson(f, studioId, held.get(f.id) ?? 0))
}

/** Why a firing cannot be run in this kiln, per field; empty when it can. */
export function firingProblems(kiln: KilnSpec, firing: { cone?: string; atmosphere?: string; capacityL?: number }): FieldErrors {
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
  if (firing.capacityL !== undefined) {
    const volume = kilnVolumeL(kiln)
    if (firing.capacityL > volume) problems.capacityL = `The kiln holds about ${Math.floor(volume)} litres; offer at most that.`
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
        capacityL: body.capacityL,
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

export async function updateFiring(ctx: AppContext, id: string, patch: FiringPatchBody, actorId: string): Promise<Firing> {
  return ctx.db.transaction(async (manager) => {
    const firing = await getFiring(manager, id, true)
    const kiln = await getKiln(manager, firing.kilnId)
    const { status, ...fields } = patch
    if (firing.status === 'cancelled') throw conflict('This firing is cancelled.', 'firing-cancelled')
    if (status && status !== firing.status) {
      if (status === 'cancelled') throw conflict('Cancel a firing with its cancel action, giving a reason.', 'use-cancel')
      if (!canMoveFiring(firing.status, status)) {
        throw conflict(`A firing that is ${firing.status} cannot become ${status}.`, 'bad-status-change', {
          allowed: nextFiringStatuses(firing.status),
        })
      }
      firing.status = status
      await onFiringStatus(ctx, manager, firing, status, actorId)
    }
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
      if (fields.capacityL !== undefined) {
        const held = (await heldLitres(manager, [id])).get(id) ?? 0
        if (fields.capacityL < held) {
          throw new HttpError(409, 'capacity-below-held', `Requests already hold ${round1(held)} litres; offer at least that.`, {
            capacityL: `At least ${round1(held)} litres are held.`,
          })
        }
      }
      Object.assign(firing, { ...fields, ...next })
    }
    const saved = await manager.getRepository(Firing).save(firing)
    await enqueueStudioSync(manager, kiln.studioId)
    return saved
  })
}

/** Requests that still expect this firing to happen. */
const LIVE_REQUEST_STATES = ['draft', 'sent', 'accepted', 'deposit_paid'] as const

/** Cancels a firing and every live request in it, refunds what was paid in full and mails each potter. */
export async function cancelFiring(
  ctx: AppContext,
  id: string,
  reason: string,
  actorId: string,
): Promise<{ firing: Firing; requestIds: string[] }> {
  return ctx.db.transaction(async (manager) => {
    const firing = await getFiring(manager, id, true)
    if (firing.status === 'cancelled') throw conflict('This firing is already cancelled.', 'firing-cancelled')
    if (!canMoveFiring(firing.status, 'cancelled')) {
      throw conflict('Ware is already in the kiln; this firing can no longer be cancelled.', 'bad-status-change', {
        allowed: nextFiringStatuses(firing.status),
      })
    }
    firing.status = 'cancelled'
    firing.cancelledReason = reason
    await manager.getRepository(Firing).save(firing)

    const kiln = await manager.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId })
    const studio = await manager.getRepository(Studio).findOneByOrFail({ id: kiln.studioId })
    await enqueueStudioSync(manager, studio.id)
    const requests = await manager
      .getRepository(FiringRequest)
      .find({ where: { firingId: id, state: In([...LIVE_REQUEST_STATES]) }, lock: { mode: 'pessimistic_write' } })
    for (const request of requests) {
      await manager.getRepository(RequestEvent).save({
        requestId: request.id,
        actorId,
        fromState: request.state,
        toState: 'cancelled',
        reason: `Firing cancelled: ${reason}`,
        data: { by: 'studio' },
      })
      await manager.update(FiringRequest, request.id, { state: 'cancelled' })
      if (request.state === 'draft') continue
      const potter = await manager.getRepository(User).findOneByOrFail({ id: request.potterId })
      await queueMail(
        manager,
        potter.email,
        'firing-cancelled',
        firingCancelledMail(
          potter.displayName,
          {
            studioName: studio.name,
            kilnName: kiln.name,
            cone: firing.cone,
            atmosphere: firing.atmosphere,
            kind: firing.kind,
            firingDate: firing.firingDate,
            timezone: studio.timezone,
          },
          reason,
          `${ctx.config.publicUrl}/requests/${request.id}`,
        ),
      )
    }
    // Everything paid for those requests goes back in full.
    await refundCancelledByFiring(
      manager,
      requests.map((r) => r.id),
    )
    return { firing, requestIds: requests.map((r) => r.id) }
  })
}

/** The firings of a kiln; the public sees upcoming ones that are not cancelled. */
export async function listKilnFirings(manager: EntityManager, kilnId: string, { all = false } = {}): Promise<Firing[]> {
  const qb = manager.getRepository(Firing).createQueryBuilder('f').where('f.kiln_id = :kilnId', { kilnId }).orderBy('f.firing_date', 'ASC')
  if (!all) qb.andWhere(`f.status <> 'cancelled'`).andWhere('f.ready_by >= now()')
  return qb.getMany()
}

/** A studio's firings between two instants (all kilns), for the calendar and the host home. */
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
  const held = (await heldLitres(ctx.db.manager, [firing.id])).get(firing.id) ?? 0
  return {
    kiln: kilnSpec(kiln),
    firing: {
      kind: firing.kind,
      cone: firing.cone,
      atmosphere: firing.atmosphere,
      slowCool: firing.slowCool,
      cooling: firing.cooling,
      remainingCapacityL: Math.max(0, firing.capacityL - held),
    },
    priceList: await getPriceList(ctx.db.manager, kiln.id),
  }
}
