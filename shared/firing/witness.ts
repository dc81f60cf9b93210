// Reading witness cones. A self-supporting cone has reached its heat work when its tip has come down
// level with its base, which on the clock face of the trade is "3 o'clock" (from memory of the cone
// maker's guidance; common practice reads it the same way). A tip touching the shelf is overfired
// for that cone; a standing cone has not been reached.
import { compareCones, coneReached, formatCone, type Cone } from './cones'

export type ConeBend = 'standing' | 'three-oclock' | 'touching'

export interface WitnessReading {
  cone: Cone
  bend: ConeBend
}

/** The hottest cone reached: the hottest one at 3 o'clock or further down; null if none bent. */
export function coneFromWitnesses(readings: readonly WitnessReading[]): Cone | null {
  let reached: Cone | null = null
  for (const r of readings) {
    if (r.bend === 'standing') continue
    if (reached === null || compareCones(r.cone, reached) > 0) reached = r.cone
  }
  return reached
}

export interface WitnessCheck {
  fromCones: Cone | null
  fromPeak: Cone | null
  agree: boolean | null
  message: string
  /** Readings that cannot both be true: a hotter cone further down than a cooler one. */
  inconsistent: boolean
}

const BEND_RANK: Record<ConeBend, number> = { standing: 0, 'three-oclock': 1, touching: 2 }

/**
 * Compares the cones with what the controller's peak and final rate predict. A disagreement usually
 * means a thermocouple reading off, or uneven heat where the cones stood.
 */
export function crossCheckCones(readings: readonly WitnessReading[], peakC: number | null, finalRateCPerHour: number | null): WitnessCheck {
  const fromCones = coneFromWitnesses(readings)
  const fromPeak = peakC !== null ? coneReached(peakC, finalRateCPerHour ?? 60) : null
  const sorted = [...readings].sort((a, b) => compareCones(a.cone, b.cone))
  const inconsistent = sorted.some((r, i) =>
    sorted.slice(0, i).some((cooler) => compareCones(cooler.cone, r.cone) < 0 && BEND_RANK[cooler.bend] < BEND_RANK[r.bend]),
  )
  if (fromCones === null && fromPeak === null) {
    return { fromCones, fromPeak, agree: null, inconsistent, message: 'No cone has bent and no peak is recorded yet.' }
  }
  if (fromCones === null || fromPeak === null) {
    return {
      fromCones,
      fromPeak,
      agree: null,
      inconsistent,
      message: fromCones ? `The cones show ${formatCone(fromCones)} reached.` : `The peak predicts ${formatCone(fromPeak!)}.`,
    }
  }
  const agree = compareCones(fromCones, fromPeak) === 0
  return {
    fromCones,
    fromPeak,
    agree,
    inconsistent,
    message: agree
      ? `The cones and the peak agree: ${formatCone(fromCones)}.`
      : `The cones show ${formatCone(fromCones)} but the peak and final rate predict ${formatCone(fromPeak)}: check the thermocouple and how even the heat was.`,
  }
}
