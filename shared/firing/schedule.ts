// Plans a firing curve from the ware and the kiln: slow where the clay is changing (water leaving,
// bound water leaving, organics burning out, quartz and cristobalite inverting), the final 100 °C at
// the rate that sets the cone, and a cooling path down to handling heat. All rates are °C/h.

import { coneReached, coneTemperatureC, type Cone } from './cones'
import type { FiringKind, Kiln, Piece } from './check'

export const SEGMENT_ZONES = [
  'water-smoking',
  'candling',
  'ramp',
  'dehydroxylation',
  'quartz-inversion',
  'burnout',
  'final-100',
  'cool',
  'quartz-inversion-cool',
  'cristobalite-cool',
] as const
export type SegmentZone = (typeof SEGMENT_ZONES)[number]

/**
 * One controller step: climb (toC > fromC) or cool (toC < fromC) at rateCPerHour, then hold at toC
 * for holdMinutes. The candling hold and the soak at peak sit on the segment that reaches them.
 */
export interface Segment {
  fromC: number
  toC: number
  rateCPerHour: number
  holdMinutes: number
  zone: SegmentZone
}

export interface FiringSchedule {
  segments: Segment[]
  totalMinutes: number
  predictedCone: Cone | null
  peakC: number
  finalRateCPerHour: number
  candlingHoldMinutes: number
  /** True when the plan slows the cooling through the inversions (the ware asked and the kiln can). */
  controlledCooling: boolean
}

export interface ScheduleRequest {
  kind: FiringKind
  cone: Cone
  kiln: Pick<Kiln, 'maxRampCPerHour' | 'preheatHold' | 'controlledCooling'>
  pieces: readonly Pick<Piece, 'state' | 'wallThicknessMm'>[]
  slowCool?: boolean
}

const ZONE_LABELS: Record<SegmentZone, string> = {
  'water-smoking': 'Water smoking',
  candling: 'Candling',
  ramp: 'Ramp',
  dehydroxylation: 'Dehydroxylation',
  'quartz-inversion': 'Quartz inversion',
  burnout: 'Burnout',
  'final-100': 'Final 100 °C',
  cool: 'Cooling',
  'quartz-inversion-cool': 'Quartz inversion (cooling)',
  'cristobalite-cool': 'Cristobalite inversion (cooling)',
}

export function zoneLabel(zone: SegmentZone): string {
  return ZONE_LABELS[zone]
}

/** The kiln starts from a room-temperature load (common practice for planning). */
export const ROOM_C = 20
/** Kept shut until about 50 °C (125 °F): cool enough to handle; opening hotter can crack ware (common practice). */
export const HANDLING_C = 50
/** Water boils at 100 °C; below it steam has not yet built up inside the wall. */
export const BOILING_C = 100
/**
 * The candling hold sits at 120 °C (about 250 °F): the thermocouple reads the air, and the middle of a
 * wall lags behind it, so a hold just above boiling lets the core reach 100 °C and steam out slowly.
 */
export const CANDLING_C = 120
/** Chemically bound water leaves roughly 480–540 °C (common practice); the slow band runs from 480 °C. */
export const DEHYDROXYLATION_FROM_C = 480
/** The quartz inversion at 573 °C (about 1 % volume change); the slow band brackets it by 25–30 °C. */
export const QUARTZ_INVERSION_C = 573
const QUARTZ_BAND_FROM_C = 550
const QUARTZ_BAND_TO_C = 600
const QUARTZ_COOL_TO_C = 540
/** Organics, sulfur and fluorine compounds burn out up to about 870 °C (1600 °F), common practice. */
export const BURNOUT_TO_C = 870
/** The cristobalite inversion, around 220 °C (about 3 % contraction); the slow band brackets it. */
export const CRISTOBALITE_INVERSION_C = 220
const CRISTOBALITE_BAND_FROM_C = 250
const CRISTOBALITE_BAND_TO_C = 190

/**
 * Walls thicker than about half an inch (13 mm) count as thick: thrown and slab ware is mostly under
 * 10 mm, and past half an inch the middle of the wall dries and heats far behind its surface, so it
 * needs a long candle and a gentle cool (common practice).
 */
export const THICK_WALL_MM = 13
/** The wall the base rates are set for: a typical thrown pot, about a quarter inch. */
const REFERENCE_WALL_MM = 6

/** The cone-setting rate: the middle column (60 °C/h, 108 °F/h) of the cone table. */
const FINAL_RATE = 60
const GREENWARE_FIRST_RATE = 80
const BISQUE_WARE_FIRST_RATE = 100
const MIN_FIRST_RATE = 10
const BISQUE_RAMP_RATE = 100
const GLAZE_RAMP_RATE = 150
/** Through dehydroxylation and burnout, slow enough for gases to leave with the kiln vented. */
const BURNOUT_RATE = 80
const BISQUE_QUARTZ_RATE = 60
const GLAZE_QUARTZ_RATE = 80
const GLAZE_SOAK_MINUTES = 10
const MIN_CANDLING_MINUTES = 30
const MAX_CANDLING_MINUTES = 24 * 60

// Natural cooling of a loaded, shut kiln, rough figures for the time estimate: fast from the top,
// slower as the kiln nears room heat. Controlled rates are only used where they are slower.
const COOLING_STEPS: readonly { downToC: number; zone: SegmentZone; naturalRate: number; controlledRate: number }[] = [
  { downToC: QUARTZ_BAND_TO_C, zone: 'cool', naturalRate: 150, controlledRate: 150 },
  { downToC: QUARTZ_COOL_TO_C, zone: 'quartz-inversion-cool', naturalRate: 120, controlledRate: 50 },
  { downToC: CRISTOBALITE_BAND_FROM_C, zone: 'cool', naturalRate: 80, controlledRate: 80 },
  { downToC: CRISTOBALITE_BAND_TO_C, zone: 'cristobalite-cool', naturalRate: 50, controlledRate: 30 },
  { downToC: HANDLING_C, zone: 'cool', naturalRate: 30, controlledRate: 30 },
]

/** The thickest wall in the load; a typical pot's when the load is empty. */
export function thickestWallMm(pieces: readonly Pick<Piece, 'wallThicknessMm'>[]): number {
  let thickest = 0
  for (const piece of pieces) if (piece.wallThicknessMm > thickest) thickest = piece.wallThicknessMm
  return thickest > 0 ? thickest : REFERENCE_WALL_MM
}

/** Candling hold for greenware: about an hour per 6 mm of the thickest wall, in whole quarter hours. */
export function candlingHoldMinutes(wallThicknessMm: number): number {
  const minutes = Math.ceil(((wallThicknessMm / REFERENCE_WALL_MM) * 60) / 15) * 15
  return Math.min(MAX_CANDLING_MINUTES, Math.max(MIN_CANDLING_MINUTES, minutes))
}

/** Thick walls cool unevenly and dunt at the inversions, so they ask for a slow cool. */
export function wareAsksForSlowCooling(pieces: readonly Pick<Piece, 'wallThicknessMm'>[]): boolean {
  for (const piece of pieces) if (piece.wallThicknessMm > THICK_WALL_MM) return true
  return false
}

/**
 * The rate for the last 100 °C: the table's 60 °C/h, within the kiln's limit, and within the quartz
 * rate when the final climb still starts below the top of the quartz band (the coolest cones).
 * It depends on the cone and the kiln only, never on the ware.
 */
export function plannedFinalRateCPerHour(cone: Cone, kiln: Pick<Kiln, 'maxRampCPerHour'>): number {
  const rate = Math.min(FINAL_RATE, kiln.maxRampCPerHour)
  if (coneTemperatureC(cone, rate) - 100 < QUARTZ_BAND_TO_C) return Math.min(rate, quartzCap(kiln.maxRampCPerHour))
  return rate
}

// Through the quartz inversion the climb runs at most half the kiln's fastest, so it is always the
// slower part of the curve even in a kiln that cannot ramp fast.
function quartzCap(maxRampCPerHour: number): number {
  return maxRampCPerHour / 2
}

interface HeatingBand {
  upToC: number
  zone: SegmentZone
  rate: number
  holdMinutes: number
}

export function planSchedule(request: ScheduleRequest): FiringSchedule {
  const { kind, cone, kiln, pieces } = request
  const maxRamp = kiln.maxRampCPerHour
  const cap = (rate: number) => Math.min(rate, maxRamp)

  let hasGreenware = pieces.length === 0 && kind !== 'glaze'
  for (const piece of pieces) if (piece.state === 'greenware') hasGreenware = true
  const clayStillChanging = kind !== 'glaze' || hasGreenware
  const wall = thickestWallMm(pieces)
  const thinness = Math.min(1, REFERENCE_WALL_MM / wall)

  const finalRate = plannedFinalRateCPerHour(cone, kiln)
  // Rounded up to a whole degree: the gap between neighbouring cones is at least 3 °C, so this never
  // reaches the next cone.
  const peakC = Math.ceil(coneTemperatureC(cone, finalRate))
  const finalFromC = peakC - 100

  const candling = hasGreenware && kiln.preheatHold ? candlingHoldMinutes(wall) : 0
  let firstRate: number
  if (clayStillChanging) {
    firstRate = Math.max(MIN_FIRST_RATE, Math.floor(GREENWARE_FIRST_RATE * thinness))
    // Without a low hold, greenware climbs to candling heat at half the rate to give the steam time.
    if (hasGreenware && !kiln.preheatHold) firstRate = Math.max(MIN_FIRST_RATE / 2, firstRate / 2)
  } else {
    firstRate = Math.max(MIN_FIRST_RATE, Math.floor(BISQUE_WARE_FIRST_RATE * thinness))
  }
  firstRate = cap(firstRate)

  let bands: HeatingBand[]
  if (clayStillChanging) {
    const ramp = cap(BISQUE_RAMP_RATE)
    const burnout = cap(BURNOUT_RATE)
    bands = [
      { upToC: BOILING_C, zone: 'water-smoking', rate: firstRate, holdMinutes: 0 },
      { upToC: CANDLING_C, zone: 'candling', rate: firstRate, holdMinutes: candling },
      { upToC: DEHYDROXYLATION_FROM_C, zone: 'ramp', rate: ramp, holdMinutes: 0 },
      { upToC: QUARTZ_BAND_FROM_C, zone: 'dehydroxylation', rate: burnout, holdMinutes: 0 },
      { upToC: QUARTZ_BAND_TO_C, zone: 'quartz-inversion', rate: Math.min(BISQUE_QUARTZ_RATE, quartzCap(maxRamp)), holdMinutes: 0 },
      { upToC: BURNOUT_TO_C, zone: 'burnout', rate: burnout, holdMinutes: 0 },
      { upToC: Infinity, zone: 'ramp', rate: ramp, holdMinutes: 0 },
    ]
  } else {
    const ramp = cap(GLAZE_RAMP_RATE)
    bands = [
      { upToC: CANDLING_C, zone: 'water-smoking', rate: firstRate, holdMinutes: 0 },
      { upToC: QUARTZ_BAND_FROM_C, zone: 'ramp', rate: ramp, holdMinutes: 0 },
      { upToC: QUARTZ_BAND_TO_C, zone: 'quartz-inversion', rate: Math.min(GLAZE_QUARTZ_RATE, quartzCap(maxRamp)), holdMinutes: 0 },
      { upToC: Infinity, zone: 'ramp', rate: ramp, holdMinutes: 0 },
    ]
  }

  const segments: Segment[] = []
  let atC = ROOM_C
  for (const band of bands) {
    const toC = Math.min(band.upToC, finalFromC)
    if (toC <= atC) continue
    segments.push({ fromC: atC, toC, rateCPerHour: band.rate, holdMinutes: toC === band.upToC ? band.holdMinutes : 0, zone: band.zone })
    atC = toC
  }
  const soak = kind === 'bisque' ? 0 : GLAZE_SOAK_MINUTES
  segments.push({ fromC: atC, toC: peakC, rateCPerHour: finalRate, holdMinutes: soak, zone: 'final-100' })
  atC = peakC

  const controlled = (request.slowCool === true || wareAsksForSlowCooling(pieces)) && kiln.controlledCooling
  for (const step of COOLING_STEPS) {
    if (step.downToC >= atC) continue
    const rate = cap(controlled ? step.controlledRate : step.naturalRate)
    segments.push({ fromC: atC, toC: step.downToC, rateCPerHour: rate, holdMinutes: 0, zone: step.zone })
    atC = step.downToC
  }

  let minutes = 0
  for (const segment of segments) {
    minutes += (Math.abs(segment.toC - segment.fromC) / segment.rateCPerHour) * 60 + segment.holdMinutes
  }

  return {
    segments,
    totalMinutes: Math.round(minutes),
    predictedCone: coneReached(peakC, finalRate),
    peakC,
    finalRateCPerHour: finalRate,
    candlingHoldMinutes: candling,
    controlledCooling: controlled,
  }
}
