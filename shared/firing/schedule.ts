// Plans a firing curve from the ware and the kiln: slow where the clay is changing (water leaving,
// bound water leaving, organics burning out, quartz and cristobalite inverting), slower still for
// thick, closed and solid ware, the final 100 °C at the rate that sets the cone, and a cooling path
// down to handling heat. All rates are °C/h. Cooling that the kiln does by itself is an estimate, not
// a step to program, and is marked so.

import { coneReached, coneTemperatureC, type Cone } from './cones'
import type { FiringKind, Kiln, Piece, PieceForm } from './check'

export const SEGMENT_ZONES = [
  'water-smoking',
  'candling',
  'ramp',
  'dehydroxylation',
  'quartz-inversion',
  'burnout',
  'final-100',
  'cool',
  'glaze-development-cool',
  'drop-and-hold',
  'quartz-inversion-cool',
  'cristobalite-cool',
  'pulled-hot',
] as const
export type SegmentZone = (typeof SEGMENT_ZONES)[number]

/** How a glaze firing cools from its peak: by itself, slowly through glaze development, or dropped and held. */
export const COOLING_PROFILES = ['natural', 'glaze-development', 'drop-and-hold'] as const
export type CoolingProfile = (typeof COOLING_PROFILES)[number]

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
  /** The kiln's own cooling (or ware cooling outside it): a rough figure for the time, not a step to program. */
  estimate?: boolean
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
  /** The cooling profile the plan follows: the one asked for when the kiln can do it, else natural. */
  cooling: CoolingProfile
  /** The wall the heating rates were set for: the thickest, counted thicker for closed and solid forms. */
  effectiveWallMm: number
}

export interface ScheduleRequest {
  kind: FiringKind
  cone: Cone
  kiln: Pick<Kiln, 'maxRampCPerHour' | 'preheatHold' | 'controlledCooling'>
  pieces: readonly Pick<Piece, 'state' | 'wallThicknessMm' | 'form'>[]
  slowCool?: boolean
  cooling?: CoolingProfile
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
  'glaze-development-cool': 'Slow cool through glaze development',
  'drop-and-hold': 'Drop and hold',
  'quartz-inversion-cool': 'Quartz inversion (cooling)',
  'cristobalite-cool': 'Cristobalite inversion (cooling)',
  'pulled-hot': 'Pulled hot (cools outside the kiln)',
}

export function zoneLabel(zone: SegmentZone): string {
  return ZONE_LABELS[zone]
}

/** The kiln starts from a room-temperature load (common practice for planning). */
export const ROOM_C = 20
/** Kept shut until about 50 °C (125 °F): cool enough to handle; opening hotter can crack ware (common practice). */
export const HANDLING_C = 50
/** Water boils at 100 °C; steam that builds inside a wall faster than it can leave bursts the piece. */
export const BOILING_C = 100
/**
 * The candling hold sits below boiling, at 90 °C (potters candle at about 80–95 °C, common practice):
 * the ware dries through without any water inside it turning to steam.
 */
export const CANDLING_C = 90
/** Physically held water keeps leaving the clay up to about 200 °C (common practice). */
export const WATER_SMOKING_TO_C = 200
/** Chemically bound water leaves roughly 480–540 °C (common practice); the slow band runs from 480 °C. */
export const DEHYDROXYLATION_FROM_C = 480
/** The quartz inversion at 573 °C (about 1 % volume change); the slow band brackets it by 25–30 °C. */
export const QUARTZ_INVERSION_C = 573
export const QUARTZ_BAND_FROM_C = 550
export const QUARTZ_BAND_TO_C = 600
export const QUARTZ_COOL_TO_C = 540
/** Up to here the heating rates follow the wall: water, bound water and quartz all lag in thick ware. */
export const THICKNESS_BANDS_TO_C = 650
/** Carbon and sulfur burn out from about 300 °C up to about 870 °C (1600 °F), common practice. */
export const BURNOUT_FROM_C = 300
export const BURNOUT_TO_C = 870
/** The cristobalite inversion, around 220 °C (about 3 % contraction); the slow band brackets it. */
export const CRISTOBALITE_INVERSION_C = 220
export const CRISTOBALITE_BAND_FROM_C = 250
export const CRISTOBALITE_BAND_TO_C = 190
/** Glazes grow their crystals and matte surfaces from about 1040 °C down to 760 °C (common practice). */
export const GLAZE_DEVELOPMENT_FROM_C = 1040
export const GLAZE_DEVELOPMENT_TO_C = 760
/** Cooled through glaze development at 70–85 °C/h (common practice): 80 °C/h here. */
const GLAZE_DEVELOPMENT_RATE = 80
/** Drop about 55 °C (100 °F) from the peak and hold 30 minutes to heal pinholes (common practice). */
const DROP_C = 55
const DROP_HOLD_MINUTES = 30

/**
 * Walls thicker than about half an inch (13 mm) count as thick: thrown and slab ware is mostly under
 * 10 mm, and past half an inch the middle of the wall dries and heats far behind its surface, so it
 * needs a long candle and a gentle cool (common practice).
 */
export const THICK_WALL_MM = 13
/** Solid pieces over about 25 mm, and thick ware generally, are taken no faster than 55 °C/h to 650 °C (common practice; from memory). */
export const VERY_THICK_MM = 25
const THICK_RATE_CAP = 55
/** The wall the base rates are set for: a typical thrown pot, about a quarter inch. */
const REFERENCE_WALL_MM = 6

/**
 * Closed forms keep steam in (a vent hole lets it out only slowly) and solid forms have no inside to
 * dry from, so both are counted thicker than their wall: our rule, to take them slowest.
 */
const FORM_FACTOR: Record<PieceForm, number> = { open: 1, closed: 1.5, solid: 2 }

/** The cone-setting rate: the middle column (60 °C/h, 108 °F/h) of the cone table. */
const FINAL_RATE = 60
/** Raku climbs its last 100 °C fast: the chart's fastest column (150 °C/h). */
const RAKU_FINAL_RATE = 150
const MIN_RATE = 10
const GREENWARE_FIRST_RATE = 80
const BISQUE_WARE_FIRST_RATE = 100
const BISQUE_RAMP_RATE = 100
const GLAZE_RAMP_RATE = 150
const LUSTRE_RAMP_RATE = 150
const RAKU_RAMP_RATE = 300
/** Through dehydroxylation and burnout, slow enough for gases to leave with the kiln vented. */
const BURNOUT_RATE = 80
const BISQUE_QUARTZ_RATE = 60
const GLAZE_QUARTZ_RATE = 80
const GLAZE_SOAK_MINUTES = 10
const MIN_CANDLING_MINUTES = 30
const MAX_CANDLING_MINUTES = 24 * 60
/** Ware pulled hot and set in a can or on the ground: out of the kiln to handling heat in about half an hour. */
const PULLED_COOL_RATE = 2000

// Natural cooling of a loaded, shut kiln, rough figures for the time estimate: fast from the top,
// slower as the kiln nears room heat. Controlled rates are only used where they are slower.
const COOLING_STEPS: readonly { downToC: number; zone: SegmentZone; naturalRate: number; controlledRate: number }[] = [
  { downToC: QUARTZ_BAND_TO_C, zone: 'cool', naturalRate: 150, controlledRate: 150 },
  { downToC: QUARTZ_COOL_TO_C, zone: 'quartz-inversion-cool', naturalRate: 120, controlledRate: 50 },
  { downToC: CRISTOBALITE_BAND_FROM_C, zone: 'cool', naturalRate: 80, controlledRate: 80 },
  { downToC: CRISTOBALITE_BAND_TO_C, zone: 'cristobalite-cool', naturalRate: 50, controlledRate: 30 },
  { downToC: HANDLING_C, zone: 'cool', naturalRate: 30, controlledRate: 30 },
]

/** The wall a piece is heated as: its wall, counted thicker when it is closed or solid. */
export function effectiveWallMm(piece: Pick<Piece, 'wallThicknessMm' | 'form'>): number {
  return piece.wallThicknessMm * FORM_FACTOR[piece.form ?? 'open']
}

/** The thickest effective wall in the load; a typical pot's when the load is empty. */
export function thickestEffectiveWallMm(pieces: readonly Pick<Piece, 'wallThicknessMm' | 'form'>[]): number {
  let thickest = 0
  for (const piece of pieces) {
    const wall = effectiveWallMm(piece)
    if (wall > thickest) thickest = wall
  }
  return thickest > 0 ? thickest : REFERENCE_WALL_MM
}

/**
 * A base rate (set for a 6 mm wall) scaled for a thicker wall: by the square root of the thinness,
 * since moisture and heat move through a wall by diffusion, and no faster than 55 °C/h once the
 * wall is thick. Never rises with the wall.
 */
export function wallRate(baseRate: number, wallMm: number): number {
  const scaled = wallMm <= REFERENCE_WALL_MM ? baseRate : baseRate * Math.sqrt(REFERENCE_WALL_MM / wallMm)
  const capped = wallMm > THICK_WALL_MM ? Math.min(scaled, THICK_RATE_CAP) : scaled
  return Math.max(MIN_RATE, Math.floor(capped))
}

/** The thickest wall in the load as measured; a typical pot's when the load is empty. */
export function thickestWallMm(pieces: readonly Pick<Piece, 'wallThicknessMm'>[]): number {
  let thickest = 0
  for (const piece of pieces) if (piece.wallThicknessMm > thickest) thickest = piece.wallThicknessMm
  return thickest > 0 ? thickest : REFERENCE_WALL_MM
}

/** Candling hold for greenware: about an hour per 6 mm of the (effective) wall, in whole quarter hours. */
export function candlingHoldMinutes(wallThicknessMm: number): number {
  const minutes = Math.ceil(((wallThicknessMm / REFERENCE_WALL_MM) * 60) / 15) * 15
  return Math.min(MAX_CANDLING_MINUTES, Math.max(MIN_CANDLING_MINUTES, minutes))
}

/** Thick walls cool unevenly and dunt at the inversions, so they ask for a slow cool. */
export function wareAsksForSlowCooling(pieces: readonly Pick<Piece, 'wallThicknessMm'>[]): boolean {
  for (const piece of pieces) if (piece.wallThicknessMm > THICK_WALL_MM) return true
  return false
}

/** Glaze and single firings melt glaze, so only they follow a glaze cooling profile. */
export function meltsGlaze(kind: FiringKind): boolean {
  return kind === 'glaze' || kind === 'single'
}

/**
 * The rate for the last 100 °C: the table's 60 °C/h (150 °C/h for raku), within the kiln's limit,
 * within the quartz rate when the final climb still starts below the top of the quartz band (the
 * coolest cones), and within the wall's rate when it starts below 650 °C.
 */
export function plannedFinalRateCPerHour(
  cone: Cone,
  kiln: Pick<Kiln, 'maxRampCPerHour'>,
  kind: FiringKind = 'glaze',
  effectiveWall: number = REFERENCE_WALL_MM,
): number {
  let rate = Math.min(kind === 'raku' ? RAKU_FINAL_RATE : FINAL_RATE, kiln.maxRampCPerHour)
  const fromC = coneTemperatureC(cone, rate) - 100
  if (fromC < QUARTZ_BAND_TO_C) rate = Math.min(rate, quartzCap(kiln.maxRampCPerHour))
  if (fromC < THICKNESS_BANDS_TO_C) rate = Math.min(rate, wallRate(FINAL_RATE, effectiveWall))
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

// Rate helpers take the kiln's limit and the wall as arguments rather than closing over them: the
// ware check runs thousands of times a second and closures made per call cost more than the arithmetic.
function byWall(rate: number, wall: number, maxRamp: number): number {
  return Math.min(wallRate(rate, wall), maxRamp)
}

function quartzRate(rate: number, wall: number, maxRamp: number): number {
  return Math.min(byWall(rate, wall, maxRamp), quartzCap(maxRamp))
}

function band(upToC: number, zone: SegmentZone, rate: number, holdMinutes = 0): HeatingBand {
  return { upToC, zone, rate, holdMinutes }
}

function heatingBands(request: ScheduleRequest, wall: number, hasGreenware: boolean): HeatingBand[] {
  const { kind, kiln } = request
  const max = kiln.maxRampCPerHour

  if (kind === 'raku') {
    // Bisqued raku ware, warmed gently while damp glaze dries, then a fast climb (common practice).
    return [
      band(WATER_SMOKING_TO_C, 'water-smoking', byWall(RAKU_RAMP_RATE / 2, wall, max)),
      band(QUARTZ_BAND_FROM_C, 'ramp', byWall(RAKU_RAMP_RATE, wall, max)),
      band(QUARTZ_BAND_TO_C, 'quartz-inversion', quartzRate(RAKU_RAMP_RATE / 2, wall, max)),
      band(THICKNESS_BANDS_TO_C, 'ramp', byWall(RAKU_RAMP_RATE, wall, max)),
      band(Infinity, 'ramp', Math.min(RAKU_RAMP_RATE, max)),
    ]
  }
  if (kind === 'lustre') {
    // Lustres, china paints and decal papers carry oils that burn off below about 550 °C with the kiln
    // vented (common practice); then the vent can close for the short climb to the cone.
    return [
      band(QUARTZ_BAND_FROM_C, 'burnout', byWall(LUSTRE_RAMP_RATE, wall, max)),
      band(QUARTZ_BAND_TO_C, 'quartz-inversion', quartzRate(GLAZE_QUARTZ_RATE, wall, max)),
      band(THICKNESS_BANDS_TO_C, 'ramp', byWall(LUSTRE_RAMP_RATE, wall, max)),
      band(Infinity, 'ramp', Math.min(LUSTRE_RAMP_RATE, max)),
    ]
  }
  const clayStillChanging = kind !== 'glaze' || hasGreenware
  if (!clayStillChanging) {
    return [
      band(120, 'water-smoking', byWall(BISQUE_WARE_FIRST_RATE, wall, max)),
      band(QUARTZ_BAND_FROM_C, 'ramp', byWall(GLAZE_RAMP_RATE, wall, max)),
      band(QUARTZ_BAND_TO_C, 'quartz-inversion', quartzRate(GLAZE_QUARTZ_RATE, wall, max)),
      band(THICKNESS_BANDS_TO_C, 'ramp', byWall(GLAZE_RAMP_RATE, wall, max)),
      band(Infinity, 'ramp', Math.min(GLAZE_RAMP_RATE, max)),
    ]
  }
  const candling = hasGreenware && kiln.preheatHold ? candlingHoldMinutes(wall) : 0
  // Without a low hold, greenware climbs through the wet range at half the rate to give the steam time.
  const first = byWall(GREENWARE_FIRST_RATE, wall, max)
  const wet = hasGreenware && !kiln.preheatHold ? Math.min(Math.max(MIN_RATE / 2, first / 2), max) : first
  return [
    band(CANDLING_C, 'candling', wet, candling),
    band(WATER_SMOKING_TO_C, 'water-smoking', wet),
    band(DEHYDROXYLATION_FROM_C, 'ramp', byWall(BISQUE_RAMP_RATE, wall, max)),
    band(QUARTZ_BAND_FROM_C, 'dehydroxylation', byWall(BURNOUT_RATE, wall, max)),
    band(QUARTZ_BAND_TO_C, 'quartz-inversion', quartzRate(BISQUE_QUARTZ_RATE, wall, max)),
    band(THICKNESS_BANDS_TO_C, 'burnout', byWall(BURNOUT_RATE, wall, max)),
    band(BURNOUT_TO_C, 'burnout', Math.min(BURNOUT_RATE, max)),
    band(Infinity, 'ramp', Math.min(BISQUE_RAMP_RATE, max)),
  ]
}

/** The cooling profile a plan can follow: the one asked for, when the firing melts glaze and the kiln can. */
export function coolingProfileFor(request: Pick<ScheduleRequest, 'kind' | 'kiln' | 'cooling'>): CoolingProfile {
  const asked = request.cooling ?? 'natural'
  if (asked === 'natural' || !meltsGlaze(request.kind) || !request.kiln.controlledCooling) return 'natural'
  return asked
}

function coolingSegments(request: ScheduleRequest, peakC: number, profile: CoolingProfile, controlled: boolean): Segment[] {
  const max = request.kiln.maxRampCPerHour
  const segments: Segment[] = []
  let atC = peakC
  if (request.kind === 'raku') {
    segments.push({ fromC: atC, toC: HANDLING_C, rateCPerHour: PULLED_COOL_RATE, holdMinutes: 0, zone: 'pulled-hot', estimate: true })
    return segments
  }
  if (profile === 'drop-and-hold' && atC - DROP_C > HANDLING_C) {
    // The drop is the kiln falling as fast as it will; the hold is the programmed step.
    segments.push({
      fromC: atC,
      toC: atC - DROP_C,
      rateCPerHour: Math.min(COOLING_STEPS[0].naturalRate, max),
      holdMinutes: DROP_HOLD_MINUTES,
      zone: 'drop-and-hold',
    })
    atC -= DROP_C
  }
  if (profile === 'glaze-development' && atC > GLAZE_DEVELOPMENT_TO_C) {
    if (atC > GLAZE_DEVELOPMENT_FROM_C) {
      segments.push({
        fromC: atC,
        toC: GLAZE_DEVELOPMENT_FROM_C,
        rateCPerHour: Math.min(COOLING_STEPS[0].naturalRate, max),
        holdMinutes: 0,
        zone: 'cool',
        estimate: true,
      })
      atC = GLAZE_DEVELOPMENT_FROM_C
    }
    segments.push({
      fromC: atC,
      toC: GLAZE_DEVELOPMENT_TO_C,
      rateCPerHour: Math.min(GLAZE_DEVELOPMENT_RATE, max),
      holdMinutes: 0,
      zone: 'glaze-development-cool',
    })
    atC = GLAZE_DEVELOPMENT_TO_C
  }
  for (const step of COOLING_STEPS) {
    if (step.downToC >= atC) continue
    const slowed = controlled && step.controlledRate < step.naturalRate
    const rate = Math.min(slowed ? step.controlledRate : step.naturalRate, max)
    segments.push({
      fromC: atC,
      toC: step.downToC,
      rateCPerHour: rate,
      holdMinutes: 0,
      zone: step.zone,
      ...(slowed ? {} : { estimate: true }),
    })
    atC = step.downToC
  }
  return segments
}

export function planSchedule(request: ScheduleRequest): FiringSchedule {
  const { kind, cone, kiln, pieces } = request

  let hasGreenware = pieces.length === 0 && (kind === 'bisque' || kind === 'single')
  for (const piece of pieces) if (piece.state === 'greenware') hasGreenware = true
  const wall = thickestEffectiveWallMm(pieces)

  const finalRate = plannedFinalRateCPerHour(cone, kiln, kind, wall)
  // Rounded up to a whole degree: the gap between neighbouring cones is at least 3 °C, so this never
  // reaches the next cone.
  const peakC = Math.ceil(coneTemperatureC(cone, finalRate))
  const finalFromC = peakC - 100

  const bands = heatingBands(request, wall, hasGreenware)
  const segments: Segment[] = []
  let atC = ROOM_C
  let candling = 0
  for (const band of bands) {
    const toC = Math.min(band.upToC, finalFromC)
    if (toC <= atC) continue
    const holdMinutes = toC === band.upToC ? band.holdMinutes : 0
    if (band.zone === 'candling') candling = holdMinutes
    segments.push({ fromC: atC, toC, rateCPerHour: band.rate, holdMinutes, zone: band.zone })
    atC = toC
  }
  const soak = meltsGlaze(kind) ? GLAZE_SOAK_MINUTES : 0
  segments.push({ fromC: atC, toC: peakC, rateCPerHour: finalRate, holdMinutes: soak, zone: 'final-100' })

  const controlled = (request.slowCool === true || wareAsksForSlowCooling(pieces)) && kiln.controlledCooling && kind !== 'raku'
  const profile = coolingProfileFor(request)
  segments.push(...coolingSegments(request, peakC, profile, controlled))

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
    cooling: profile,
    effectiveWallMm: wall,
  }
}

/** The plan as a curve, minute by minute at its corners, from the load at room heat. */
export function scheduleCurve(segments: readonly Segment[]): { minute: number; tempC: number }[] {
  if (segments.length === 0) return []
  const points = [{ minute: 0, tempC: segments[0].fromC }]
  let minute = 0
  for (const segment of segments) {
    minute += (Math.abs(segment.toC - segment.fromC) / segment.rateCPerHour) * 60
    points.push({ minute, tempC: segment.toC })
    if (segment.holdMinutes > 0) {
      minute += segment.holdMinutes
      points.push({ minute, tempC: segment.toC })
    }
  }
  return points
}
