// Reading witness cones, position by position. A self-supporting cone has reached its heat work when
// its tip has come down level with its base, which on the clock face of the trade is "3 o'clock"
// (from memory of the cone maker's guidance; common practice reads it the same way). A tip touching
// the shelf is overfired for that cone; a bending cone is on its way; a standing cone has not been
// reached. Each position in the kiln is read on its own: what matters is the coolest spot, since every
// pot there got no more heat work than its cones show.
import { compareCones, coneStep, formatCone, type Cone } from './cones'
import { coneFromCurve, steadyCurve, type CurvePoint } from './heatwork'

export const CONE_BENDS = ['standing', 'bending', 'three-oclock', 'touching'] as const
export type ConeBend = (typeof CONE_BENDS)[number]

export const BEND_LABELS: Record<ConeBend, string> = {
  standing: 'Standing',
  bending: 'Bending',
  'three-oclock': 'Tip level with base',
  touching: 'Tip touching',
}

export interface WitnessReading {
  cone: Cone
  bend: ConeBend
  /** Where the pack stood: top, middle, bottom, or a named spot. Readings without one share a position. */
  position?: string
}

const BEND_RANK: Record<ConeBend, number> = { standing: 0, bending: 1, 'three-oclock': 2, touching: 3 }
const UNNAMED = 'Unnamed position'

/** The hottest cone reached: the hottest one with its tip level with its base or further down; null if none. */
export function coneFromWitnesses(readings: readonly WitnessReading[]): Cone | null {
  let reached: Cone | null = null
  for (const r of readings) {
    if (BEND_RANK[r.bend] < BEND_RANK['three-oclock']) continue
    if (reached === null || compareCones(r.cone, reached) > 0) reached = r.cone
  }
  return reached
}

export interface PositionReading {
  position: string
  /** The hottest cone down at this position; null when none came down. */
  reached: Cone | null
  /** A hotter cone at this position that had started to bend, when one had. */
  bending: Cone | null
  /** On the whole-cone scale of coneStep, half a step more when a hotter cone is bending; null when nothing bent. */
  step: number | null
}

function readPosition(position: string, readings: readonly WitnessReading[]): PositionReading {
  const reached = coneFromWitnesses(readings)
  let bending: Cone | null = null
  for (const r of readings) {
    if (r.bend !== 'bending') continue
    if (reached !== null && compareCones(r.cone, reached) <= 0) continue
    if (bending === null || compareCones(r.cone, bending) < 0) bending = r.cone
  }
  const step = reached !== null ? coneStep(reached) + (bending !== null ? 0.5 : 0) : bending !== null ? coneStep(bending) - 0.5 : null
  return { position, reached, bending, step }
}

/** Each position's reading, in the order positions were first written. */
export function readPositions(readings: readonly WitnessReading[]): PositionReading[] {
  const byPosition = new Map<string, WitnessReading[]>()
  for (const r of readings) {
    const position = r.position?.trim() || UNNAMED
    const list = byPosition.get(position)
    if (list) list.push(r)
    else byPosition.set(position, [r])
  }
  return [...byPosition].map(([position, list]) => readPosition(position, list))
}

/** What the controller recorded: the whole curve, or its peak, final rate and hold. */
export interface CurveRecord {
  curve?: readonly CurvePoint[] | null
  peakC?: number | null
  finalRateCPerHour?: number | null
  holdMinutes?: number | null
}

/** The cone the record's heat work gives: from the curve when there is one, else peak, final rate and hold. */
export function expectedCone(record: CurveRecord): Cone | null {
  if (record.curve && record.curve.length >= 2) return coneFromCurve(record.curve).cone
  if (record.peakC === null || record.peakC === undefined) return null
  return coneFromCurve(steadyCurve(record.peakC, record.finalRateCPerHour ?? 60, record.holdMinutes ?? 0)).cone
}

export interface WitnessCheck {
  positions: PositionReading[]
  /** The position with the least heat work, and the one with the most (null without any bent cone). */
  coolest: PositionReading | null
  hottest: PositionReading | null
  /** The cone every position reached: the coolest position's. */
  fromCones: Cone | null
  /** The cone the logged heat work gives (the curve, or peak, final rate and hold). */
  fromCurve: Cone | null
  /** Whether the heat work lies within one cone of what the positions show; null without both. */
  agree: boolean | null
  /** Whether the coolest position reached the firing's cone; null without a firing cone or a reading. */
  coldSpotReached: boolean | null
  message: string
  /** Readings that cannot all be true at one position: a hotter cone further down than a cooler one. */
  inconsistent: boolean
}

/** How far the heat work may lie from the cones before a thermocouple check is suggested, in cones. */
export const CONE_TOLERANCE = 1

/**
 * Reads the cones position by position and compares them with the heat work of the logged curve. A
 * disagreement of more than one cone usually means a thermocouple reading off, or uneven heat.
 */
export function crossCheckCones(readings: readonly WitnessReading[], record: CurveRecord, firingCone?: Cone | null): WitnessCheck {
  const positions = readPositions(readings)
  const read = positions.filter((p) => p.step !== null)
  let coolest: PositionReading | null = null
  let hottest: PositionReading | null = null
  for (const p of read) {
    if (coolest === null || p.step! < coolest.step!) coolest = p
    if (hottest === null || p.step! > hottest.step!) hottest = p
  }
  const inconsistent = positionsInconsistent(readings)
  const fromCones = coolest?.reached ?? null
  const fromCurve = expectedCone(record)
  const coldSpotReached = firingCone && coolest ? coolest.reached !== null && compareCones(coolest.reached, firingCone) >= 0 : null

  let agree: boolean | null = null
  if (fromCurve !== null && coolest !== null && hottest !== null) {
    const expected = coneStep(fromCurve)
    agree = expected >= coolest.step! - CONE_TOLERANCE && expected <= hottest.step! + CONE_TOLERANCE
  }

  const parts: string[] = []
  if (coolest === null) parts.push('No cone has bent yet.')
  else if (read.length === 1) parts.push(`The cones show ${coneWords(coolest)}.`)
  else parts.push(`Coolest: ${coolest.position}, ${coneWords(coolest)}. Hottest: ${hottest!.position}, ${coneWords(hottest!)}.`)
  if (coldSpotReached === true) parts.push(`The cold spot reached ${formatCone(firingCone!)}.`)
  if (coldSpotReached === false) parts.push(`The cold spot did not reach ${formatCone(firingCone!)}: ware there is underfired.`)
  if (fromCurve === null) {
    if (record.peakC !== null && record.peakC !== undefined) parts.push('The logged heat work does not reach cone 022.')
  } else if (agree === null) parts.push(`The logged heat work gives ${formatCone(fromCurve)}.`)
  else if (agree) parts.push(`The logged heat work gives ${formatCone(fromCurve)}, within a cone of the witnesses.`)
  else
    parts.push(
      `The logged heat work gives ${formatCone(fromCurve)}, more than a cone from the witnesses: check the thermocouple and how even the heat was.`,
    )

  return { positions, coolest, hottest, fromCones, fromCurve, agree, coldSpotReached, message: parts.join(' '), inconsistent }
}

function coneWords(p: PositionReading): string {
  if (p.reached === null) return `${formatCone(p.bending!)} bending, none down`
  return p.bending ? `${formatCone(p.reached)} down, ${formatCone(p.bending)} bending` : `${formatCone(p.reached)} down`
}

/** At one position, a hotter cone cannot have bent further than a cooler one. */
function positionsInconsistent(readings: readonly WitnessReading[]): boolean {
  const byPosition = new Map<string, WitnessReading[]>()
  for (const r of readings) {
    const key = r.position?.trim() || UNNAMED
    byPosition.set(key, [...(byPosition.get(key) ?? []), r])
  }
  for (const list of byPosition.values()) {
    const sorted = [...list].sort((a, b) => compareCones(a.cone, b.cone))
    const bad = sorted.some((r, i) =>
      sorted.slice(0, i).some((cooler) => compareCones(cooler.cone, r.cone) < 0 && BEND_RANK[cooler.bend] < BEND_RANK[r.bend]),
    )
    if (bad) return true
  }
  return false
}
