// The firing's log: times, peak, rate, hold, the logged curve and the witness cones. The cone reached is
// read position by position from the witness cones and checked against the heat work of the curve (or
// of the peak, final rate and hold); the curve is held against the plan in the critical zones.
import type { EntityManager } from 'typeorm'
import type { FiringLogRecord } from '../../shared/api/firing-log'
import { curveFlags, curveOfReadings } from '../../shared/firing/curve'
import { coneFromCurve } from '../../shared/firing/heatwork'
import { planSchedule, type Segment } from '../../shared/firing/schedule'
import { crossCheckCones } from '../../shared/firing/witness'
import type { FiringLogBody } from '../../shared/schemas/pickup'
import type { AppContext } from '../context'
import { Firing } from '../entities/Firing'
import { FiringLog } from '../entities/FiringLog'
import { Kiln } from '../entities/Kiln'
import { HttpError } from '../http/errors'
import { kilnSpec } from './kilns'

/** A clock a minute fast on the phone that types the reading is not the future. */
const CLOCK_SKEW_MS = 60_000

const TIME_FIELDS = ['loadedAt', 'startedAt', 'offAt', 'openedAt'] as const
const TIME_WORDS: Record<(typeof TIME_FIELDS)[number], string> = {
  loadedAt: 'loaded',
  startedAt: 'started',
  offAt: 'off',
  openedAt: 'opened',
}

/** The plan a log is held against: the schedule the studio posted, or the plan for this firing in this kiln. */
function planOf(firing: Firing, kiln: Kiln): Segment[] {
  if (firing.schedule && firing.schedule.length > 0) return firing.schedule
  return planSchedule({
    kind: firing.kind,
    cone: firing.cone,
    kiln: kilnSpec(kiln),
    pieces: [],
    slowCool: firing.slowCool,
    cooling: firing.cooling,
  }).segments
}

/** The firing's log, with the logged curve read and the cones checked against it; null before any is written. */
export async function firingLogJson(manager: EntityManager, firingId: string): Promise<FiringLogRecord | null> {
  const log = await manager.getRepository(FiringLog).findOne({ where: { firingId } })
  if (!log) return null
  const firing = await manager.getRepository(Firing).findOneByOrFail({ id: firingId })
  const kiln = await manager.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId })
  const hours = log.startedAt && log.offAt ? (log.offAt.getTime() - log.startedAt.getTime()) / 3600_000 : null
  const plan = planOf(firing, kiln)
  const points = curveOfReadings(log.readings)
  const curve =
    points.length >= 2
      ? (() => {
          const read = coneFromCurve(points)
          return { cone: read.cone, peakC: read.peakC, minutes: read.minutes, flags: curveFlags(plan, points) }
        })()
      : null
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
    readings: log.readings,
    notes: log.notes,
    firingCone: firing.cone,
    plan,
    curve,
    coneCheck: crossCheckCones(
      log.witnessCones,
      {
        curve: points.length >= 2 ? points : null,
        peakC: log.peakC,
        finalRateCPerHour: log.finalRateCPerHour,
        holdMinutes: log.holdMinutes,
      },
      firing.cone,
    ),
    updatedAt: log.updatedAt.toISOString(),
  }
}

/**
 * Every time in a log runs in order (loaded, started, off, opened), none is in the future, and no
 * reading is from before the kiln was loaded. Fields that break a rule come back as a 400 with a
 * message each.
 */
export function logTimeProblems(body: FiringLogBody, nowMs: number): Record<string, string> {
  const problems: Record<string, string> = {}
  const latest = nowMs + CLOCK_SKEW_MS
  const times = TIME_FIELDS.map((field) => (body[field] ? Date.parse(body[field]!) : null))
  times.forEach((ms, i) => {
    const field = TIME_FIELDS[i]
    if (ms === null) return
    if (ms > latest) {
      problems[field] = `That is in the future; enter when the kiln was ${TIME_WORDS[field]}.`
      return
    }
    const earlier = times.slice(0, i).filter((t): t is number => t !== null)
    if (earlier.length > 0 && ms < earlier[earlier.length - 1]) problems[field] = 'Earlier than the step before it.'
  })
  const loadedMs = times[0]
  const readings = body.readings ?? []
  if (readings.length > 0 && loadedMs === null) {
    problems.loadedAt ??= 'Enter when the kiln was loaded: readings are checked against it.'
  }
  for (let i = 0; i < readings.length; i++) {
    const ms = Date.parse(readings[i].at)
    if (ms > latest) {
      problems[`readings.${i}.at`] = `Reading ${i + 1} is in the future.`
      problems.readings ??= `Reading ${i + 1} is in the future; check the time column and the day it started.`
    } else if (loadedMs !== null && ms < loadedMs) {
      problems[`readings.${i}.at`] = `Reading ${i + 1} is from before the kiln was loaded.`
      problems.readings ??= `Reading ${i + 1} is from before the kiln was loaded; check the time column and the day it started.`
    }
  }
  return problems
}

export async function putFiringLog(ctx: AppContext, actorId: string, firingId: string, body: FiringLogBody) {
  const problems = logTimeProblems(body, Date.now())
  if (Object.keys(problems).length > 0) {
    const first = Object.values(problems)[0]
    throw new HttpError(400, 'invalid-input', first, problems)
  }
  const date = (v: string | null | undefined) => (v ? new Date(v) : null)
  const readings = [...(body.readings ?? [])]
    .map((r) => ({ at: new Date(r.at).toISOString(), tempC: r.tempC }))
    .sort((a, b) => Date.parse(a.at) - Date.parse(b.at))
  await ctx.db.getRepository(FiringLog).save({
    firingId,
    loadedAt: date(body.loadedAt),
    startedAt: date(body.startedAt),
    offAt: date(body.offAt),
    openedAt: date(body.openedAt),
    peakC: body.peakC ?? null,
    finalRateCPerHour: body.finalRateCPerHour ?? null,
    holdMinutes: body.holdMinutes ?? null,
    witnessCones: body.witnessCones,
    readings,
    notes: body.notes ?? '',
    updatedBy: actorId,
  })
  return firingLogJson(ctx.db.manager, firingId)
}
