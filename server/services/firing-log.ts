// The firing's log: times, peak, rate, hold and witness cones, with the cone reached read from the
// witness cones and checked against the peak.
import type { EntityManager } from 'typeorm'
import { crossCheckCones } from '../../shared/firing/witness'
import type { FiringLogBody } from '../../shared/schemas/pickup'
import type { AppContext } from '../context'
import { FiringLog } from '../entities/FiringLog'
import { HttpError } from '../http/errors'

/** The firing's log, with the cone reached read from the witness cones and checked against the peak. */
export async function firingLogJson(manager: EntityManager, firingId: string) {
  const log = await manager.getRepository(FiringLog).findOne({ where: { firingId } })
  if (!log) return null
  const hours = log.startedAt && log.offAt ? (log.offAt.getTime() - log.startedAt.getTime()) / 3600_000 : null
  return {
    loadedAt: log.loadedAt?.toISOString() ?? null,
    startedAt: log.startedAt?.toISOString() ?? null,
    peakC: log.peakC,
    finalRateCPerHour: log.finalRateCPerHour,
    holdMinutes: log.holdMinutes,
    offAt: log.offAt?.toISOString() ?? null,
    openedAt: log.openedAt?.toISOString() ?? null,
    totalHours: hours === null ? null : Math.round(hours * 10) / 10,
    witnessCones: log.witnessCones,
    notes: log.notes,
    coneCheck: crossCheckCones(log.witnessCones, log.peakC, log.finalRateCPerHour),
    updatedAt: log.updatedAt.toISOString(),
  }
}

export async function putFiringLog(ctx: AppContext, actorId: string, firingId: string, body: FiringLogBody) {
  const date = (v: string | null | undefined) => (v ? new Date(v) : null)
  const times = [body.loadedAt, body.startedAt, body.offAt, body.openedAt].map(date)
  for (let i = 1; i < times.length; i++) {
    const earlier = times.slice(0, i).filter(Boolean).at(-1)
    if (earlier && times[i] && times[i]! < earlier) {
      throw new HttpError(400, 'invalid-input', 'The times must run in order: loaded, started, off, opened.', {
        [['loadedAt', 'startedAt', 'offAt', 'openedAt'][i]]: 'Earlier than the step before it.',
      })
    }
  }
  await ctx.db.getRepository(FiringLog).save({
    firingId,
    loadedAt: times[0],
    startedAt: times[1],
    offAt: times[2],
    openedAt: times[3],
    peakC: body.peakC ?? null,
    finalRateCPerHour: body.finalRateCPerHour ?? null,
    holdMinutes: body.holdMinutes ?? null,
    witnessCones: body.witnessCones,
    notes: body.notes ?? '',
    updatedBy: actorId,
  })
  return firingLogJson(ctx.db.manager, firingId)
}
