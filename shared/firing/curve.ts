// The logged curve against the plan: the zones where going too fast hurts ware, and every stretch of
// the log that climbed or fell faster there than the plan allowed. Pure, so the log page draws the
// same flags the server stores and the incident reading later builds on.

import type { CurvePoint } from './heatwork'
import {
  BURNOUT_FROM_C,
  BURNOUT_TO_C,
  CRISTOBALITE_BAND_FROM_C,
  CRISTOBALITE_BAND_TO_C,
  QUARTZ_BAND_FROM_C,
  QUARTZ_BAND_TO_C,
  QUARTZ_COOL_TO_C,
  ROOM_C,
  WATER_SMOKING_TO_C,
  type FiringSchedule,
  type Segment,
} from './schedule'

export type { CurvePoint } from './heatwork'

export const CRITICAL_ZONE_IDS = ['water-smoking', 'quartz-heating', 'burnout', 'quartz-cooling', 'cristobalite-cooling'] as const
export type CriticalZoneId = (typeof CRITICAL_ZONE_IDS)[number]

export interface CriticalZone {
  id: CriticalZoneId
  label: string
  /** Heating zones hurt ware climbed too fast; cooling zones hurt ware cooled too fast. */
  direction: 'heating' | 'cooling'
  /** The band in °C, lowC < highC whichever way the kiln moves through it. */
  lowC: number
  highC: number
  /** What goes wrong when the kiln runs through it too fast. */
  harm: string
}

/** The zones where ware is hurt by speed (common practice), coolest first within each direction. */
export const CRITICAL_ZONES: readonly CriticalZone[] = [
  {
    id: 'water-smoking',
    label: 'Water smoking',
    direction: 'heating',
    lowC: ROOM_C,
    highC: WATER_SMOKING_TO_C,
    harm: 'Water left in the clay turns to steam faster than it can leave: pieces crack or burst.',
  },
  {
    id: 'burnout',
    label: 'Burnout',
    direction: 'heating',
    lowC: BURNOUT_FROM_C,
    highC: BURNOUT_TO_C,
    harm: 'Carbon and sulfur sealed in by a fast climb bloat the clay and blister glazes (black coring).',
  },
  {
    id: 'quartz-heating',
    label: 'Quartz inversion (heating)',
    direction: 'heating',
    lowC: QUARTZ_BAND_FROM_C,
    highC: QUARTZ_BAND_TO_C,
    harm: 'Quartz grows about 1 % at 573 °C; a fast climb strains thick or uneven ware into cracks.',
  },
  {
    id: 'quartz-cooling',
    label: 'Quartz inversion (cooling)',
    direction: 'cooling',
    lowC: QUARTZ_COOL_TO_C,
    highC: QUARTZ_BAND_TO_C,
    harm: 'Quartz shrinks back at 573 °C; cooled fast, ware dunts (clean, sharp cracks).',
  },
  {
    id: 'cristobalite-cooling',
    label: 'Cristobalite inversion (cooling)',
    direction: 'cooling',
    lowC: CRISTOBALITE_BAND_TO_C,
    highC: CRISTOBALITE_BAND_FROM_C,
    harm: 'Cristobalite shrinks about 3 % near 220 °C; cooled fast, ware dunts and glazes craze.',
  },
]

/** The critical zone with this id. */
export function criticalZone(id: CriticalZoneId): CriticalZone {
  return CRITICAL_ZONES.find((zone) => zone.id === id)!
}

/**
 * How much faster than the plan a stretch may run before it is flagged: readings are typed by hand or
 * logged a minute apart and controllers overshoot a little, so 15 % (our allowance).
 */
export const RATE_TOLERANCE = 0.15

export interface CurveFlag {
  zone: CriticalZoneId
  direction: 'heating' | 'cooling'
  fromMinute: number
  toMinute: number
  fromC: number
  toC: number
  /** The fastest rate over the flagged stretch, °C/h (always positive). */
  rateCPerHour: number
  /** The slowest the plan allowed anywhere in the stretch, °C/h. */
  allowedCPerHour: number
  message: string
}

/**
 * The slowest rate the plan runs in one direction anywhere between lowC and highC; null when the plan
 * never moves that way there (a raku pull, a plan that never gets so hot).
 */
export function plannedRateBetween(plan: readonly Segment[], direction: 'heating' | 'cooling', lowC: number, highC: number): number | null {
  let slowest: number | null = null
  for (const segment of plan) {
    const heating = segment.toC > segment.fromC
    if (segment.toC === segment.fromC || heating !== (direction === 'heating')) continue
    if (segment.zone === 'pulled-hot') continue
    const low = Math.min(segment.fromC, segment.toC)
    const high = Math.max(segment.fromC, segment.toC)
    if (high <= lowC || low >= highC) continue
    if (slowest === null || segment.rateCPerHour < slowest) slowest = segment.rateCPerHour
  }
  return slowest
}

function minutesText(minute: number): string {
  const h = Math.floor(minute / 60)
  const m = Math.round(minute - h * 60)
  return `${h}:${String(m).padStart(2, '0')}`
}

/**
 * Every stretch of the readings that climbed (or cooled) through a critical zone faster than the plan
 * allowed there, by more than RATE_TOLERANCE. Neighbouring fast stretches in one zone make one flag.
 * Readings must be in time order; points out of order are skipped.
 */
export function curveFlags(plan: readonly Segment[] | FiringSchedule, readings: readonly CurvePoint[]): CurveFlag[] {
  const segments = Array.isArray(plan) ? (plan as readonly Segment[]) : (plan as FiringSchedule).segments
  const flags: CurveFlag[] = []
  let previous: CurvePoint | null = null
  for (const point of readings) {
    if (!Number.isFinite(point.minute) || !Number.isFinite(point.tempC)) continue
    if (previous === null || point.minute <= previous.minute) {
      if (previous === null) previous = point
      continue
    }
    const from = previous
    previous = point
    const dT = point.tempC - from.tempC
    if (dT === 0) continue
    const rate = Math.abs(dT / (point.minute - from.minute)) * 60
    const direction = dT > 0 ? 'heating' : 'cooling'
    const low = Math.min(from.tempC, point.tempC)
    const high = Math.max(from.tempC, point.tempC)
    for (const zone of CRITICAL_ZONES) {
      if (zone.direction !== direction || high <= zone.lowC || low >= zone.highC) continue
      const allowed = plannedRateBetween(segments, direction, Math.max(low, zone.lowC), Math.min(high, zone.highC))
      if (allowed === null || rate <= allowed * (1 + RATE_TOLERANCE)) continue
      const last = flags.at(-1)
      if (last && last.zone === zone.id && last.toMinute === from.minute) {
        last.toMinute = point.minute
        last.toC = point.tempC
        last.rateCPerHour = Math.max(last.rateCPerHour, rate)
        last.allowedCPerHour = Math.min(last.allowedCPerHour, allowed)
      } else {
        flags.push({
          zone: zone.id,
          direction,
          fromMinute: from.minute,
          toMinute: point.minute,
          fromC: from.tempC,
          toC: point.tempC,
          rateCPerHour: rate,
          allowedCPerHour: allowed,
          message: '',
        })
      }
    }
  }
  for (const flag of flags) {
    const zone = criticalZone(flag.zone)
    flag.message =
      `${zone.label}: ${flag.direction === 'heating' ? 'climbed' : 'cooled'} at up to ${Math.round(flag.rateCPerHour)} °C/h ` +
      `from ${minutesText(flag.fromMinute)} to ${minutesText(flag.toMinute)} (${Math.round(flag.fromC)} → ${Math.round(flag.toC)} °C); ` +
      `the plan allowed ${Math.round(flag.allowedCPerHour)} °C/h. ${zone.harm}`
  }
  return flags
}

/** Readings with clock times as a curve in minutes from the first reading, in time order. */
export function curveOfReadings(readings: readonly { at: string; tempC: number }[]): CurvePoint[] {
  const timed = readings
    .map((r) => ({ t: Date.parse(r.at), tempC: r.tempC }))
    .filter((r) => Number.isFinite(r.t) && Number.isFinite(r.tempC))
    .sort((a, b) => a.t - b.t)
  if (timed.length === 0) return []
  const start = timed[0].t
  return timed.map((r) => ({ minute: (r.t - start) / 60_000, tempC: r.tempC }))
}
