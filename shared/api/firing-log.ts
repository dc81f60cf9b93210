// The firing log as the API answers it (server/services/firing-log.ts firingLogJson).
import type { ConeBend, WitnessCheck } from '../firing/witness'

export interface WitnessConeJson {
  cone: string
  bend: ConeBend
  position?: string
}

export interface FiringLogJson {
  loadedAt: string | null
  startedAt: string | null
  peakC: number | null
  finalRateCPerHour: number | null
  holdMinutes: number | null
  offAt: string | null
  openedAt: string | null
  totalHours: number | null
  witnessCones: WitnessConeJson[]
  notes: string
  coneCheck: WitnessCheck
  updatedAt: string
}
