// The firing log as the log routes and the request view answer with it: declared once, read by the
// client, written by server/services/firing-log.ts.
import type { Cone } from '../firing/cones'
import type { CurveFlag } from '../firing/curve'
import type { Reading } from '../firing/readings'
import type { Segment } from '../firing/schedule'
import type { ConeBend, WitnessCheck } from '../firing/witness'

export interface WitnessConeRecord {
  cone: string
  bend: ConeBend
  position?: string
}

/** What the logged curve says: the cone its heat work gives, and where it ran faster than the plan. */
export interface LoggedCurve {
  cone: Cone | null
  peakC: number
  minutes: number
  flags: CurveFlag[]
}

export interface FiringLogRecord {
  loadedAt: string | null
  startedAt: string | null
  peakC: number | null
  finalRateCPerHour: number | null
  holdMinutes: number | null
  offAt: string | null
  openedAt: string | null
  totalHours: number | null
  witnessCones: WitnessConeRecord[]
  readings: Reading[]
  notes: string
  /** The firing's cone, which the cold spot should reach. */
  firingCone: Cone
  /** The plan the curve is held against: the posted schedule, or the plan for the firing and kiln. */
  plan: Segment[]
  curve: LoggedCurve | null
  coneCheck: WitnessCheck
  updatedAt: string
}

export type FiringLogJson = FiringLogRecord
export type WitnessConeJson = WitnessConeRecord
