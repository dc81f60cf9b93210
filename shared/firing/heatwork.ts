// Heat work from a firing curve. A cone bends when enough "heat work" has been done on it, and heat
// work is time and temperature together: a slower climb bends a cone at a lower temperature, a hold
// keeps bending it. We model each cone as a reaction with an Arrhenius rate, k = A·exp(−B/T) (T in
// kelvin), and say the cone is down when the integral of k over the curve reaches 1. B and A are fitted
// per cone to the published chart's three columns (15, 60 and 150 °C/h over the last 100 °C), and then A
// is set so that the chart's temperature at every column does the cone's full work: a steady climb that
// ends at the charted temperature gives that cone. Each k is positive, so a hold or a slow cool only
// ever adds heat work: they can never lower the cone.

import { CHARTED_CONES, CONE_TABLE_RATES_C_PER_HOUR, chartedTemperaturesC, type Cone } from './cones'

export interface CurvePoint {
  /** Minutes from any fixed start (the first reading, the controller's start). */
  minute: number
  tempC: number
}

const KELVIN = 273.15
/** Work counted as done: 1 less rounding, so a climb that ends exactly on a charted temperature counts. */
const DOWN = 1 - 1e-9
/** The fitted curve starts every chart climb here: a room-temperature load (common practice for planning). */
const CHART_START_C = 20

/**
 * ∫₀ᵀ exp(−B/t) dt = T·e^(−B/T) − B·E₁(B/T). For the x = B/T of firing (roughly 15 to 300) the
 * asymptotic series of E₁ converges fast; the terms below keep the relative error under 1e-9 there.
 */
function integralOfExp(b: number, tK: number): number {
  const x = b / tK
  const e = Math.exp(-x)
  if (e === 0) return 0
  // T·e^(−x)·(1 − Σ) where the asymptotic series of x·eˣ·E₁(x) is 1 − 1/x + 2/x² − 6/x³ + …
  let term = 1
  let series = 1
  for (let n = 1; n < 12; n++) {
    const next = (-term * n) / x
    if (Math.abs(next) > Math.abs(term)) break
    term = next
    series += term
  }
  return tK * e * (1 - series)
}

/** ∫ exp(−B/T) dt over one straight piece of the curve, minutes. */
function segmentIntegral(b: number, fromC: number, toC: number, minutes: number): number {
  if (minutes <= 0) return 0
  const t1 = fromC + KELVIN
  const t2 = toC + KELVIN
  const dT = t2 - t1
  // Below half a degree of change the piece is a hold; the midpoint rule is exact enough and avoids
  // subtracting two nearly equal integrals.
  if (Math.abs(dT) < 0.5) return minutes * Math.exp(-b / ((t1 + t2) / 2))
  return (minutes / dT) * (integralOfExp(b, t2) - integralOfExp(b, t1))
}

interface ConeModel {
  cone: Cone
  /** B in kelvin (activation energy over the gas constant). */
  b: number
  /** ln A, A per minute. */
  lnA: number
}

/** ln of ∫ exp(−B/T) dt for a steady climb from the chart start to tempC at rateCPerHour. */
function lnSteadyClimb(b: number, tempC: number, rateCPerHour: number): number {
  const minutes = ((tempC - CHART_START_C) / rateCPerHour) * 60
  return Math.log(segmentIntegral(b, CHART_START_C, tempC, minutes))
}

function chartPoints(cone: Cone): { rate: number; tempC: number }[] {
  const row = chartedTemperaturesC(cone)!
  const points: { rate: number; tempC: number }[] = []
  CONE_TABLE_RATES_C_PER_HOUR.forEach((rate, column) => {
    const tempC = row[column]
    if (tempC !== null) points.push({ rate, tempC })
  })
  return points
}

/** Spread of the needed ln A across the chart's columns for one B: small when B explains the columns. */
function spread(b: number, points: readonly { rate: number; tempC: number }[]): number {
  const needed = points.map((p) => -lnSteadyClimb(b, p.tempC, p.rate))
  const mean = needed.reduce((sum, v) => sum + v, 0) / needed.length
  return needed.reduce((sum, v) => sum + (v - mean) ** 2, 0)
}

function fitCone(cone: Cone): ConeModel {
  const points = chartPoints(cone)
  // Golden-section search on ln B for the B that best explains all columns at once.
  let lo = Math.log(5_000)
  let hi = Math.log(400_000)
  const golden = (Math.sqrt(5) - 1) / 2
  let x1 = hi - golden * (hi - lo)
  let x2 = lo + golden * (hi - lo)
  let f1 = spread(Math.exp(x1), points)
  let f2 = spread(Math.exp(x2), points)
  for (let i = 0; i < 80; i++) {
    if (f1 < f2) {
      hi = x2
      x2 = x1
      f2 = f1
      x1 = hi - golden * (hi - lo)
      f1 = spread(Math.exp(x1), points)
    } else {
      lo = x1
      x1 = x2
      f1 = f2
      x2 = lo + golden * (hi - lo)
      f2 = spread(Math.exp(x2), points)
    }
  }
  const b = Math.exp((lo + hi) / 2)
  // The largest A any column needs: at each charted temperature the work is then at least 1.
  const lnA = Math.max(...points.map((p) => -lnSteadyClimb(b, p.tempC, p.rate)))
  return { cone, b, lnA }
}

let models: readonly ConeModel[] | null = null

/** The fitted model of every charted cone, coolest first (fitted once, on first use). */
export function coneModels(): readonly ConeModel[] {
  models ??= CHARTED_CONES.map(fitCone)
  return models
}

/** Heat work done on one cone by the curve: 1 means it is down (tip level with its base). */
export function heatWork(model: Pick<ConeModel, 'b' | 'lnA'>, points: readonly CurvePoint[]): number {
  let integral = 0
  for (let i = 1; i < points.length; i++) {
    const from = points[i - 1]
    const to = points[i]
    integral += segmentIntegral(model.b, from.tempC, to.tempC, to.minute - from.minute)
  }
  return Math.exp(model.lnA) * integral
}

export interface CurveCone {
  /** The hottest charted cone the curve brings down; null if not even cone 022. */
  cone: Cone | null
  /** Work done on the next hotter cone (0–1): how far it has bent towards down. */
  nextConeWork: number | null
  peakC: number
  minutes: number
}

/**
 * The cone a firing curve brings down. Points must be in time order; readings out of order or with
 * non-finite values are ignored rather than guessed at.
 */
export function coneFromCurve(points: readonly CurvePoint[]): CurveCone {
  const clean: CurvePoint[] = []
  for (const point of points) {
    if (!Number.isFinite(point.minute) || !Number.isFinite(point.tempC)) continue
    if (clean.length > 0 && point.minute < clean[clean.length - 1].minute) continue
    clean.push(point)
  }
  let peakC = -Infinity
  for (const point of clean) if (point.tempC > peakC) peakC = point.tempC
  const minutes = clean.length > 1 ? clean[clean.length - 1].minute - clean[0].minute : 0
  // The hottest cone whose work is done. Cones fitted to the chart bend in chart order wherever the
  // chart reaches; scanning them all keeps an odd pair far off the chart from hiding a hotter cone.
  const models = coneModels()
  const works = models.map((model) => heatWork(model, clean))
  let hottest = -1
  for (let i = 0; i < works.length; i++) if (works[i] >= DOWN) hottest = i
  const cone = hottest >= 0 ? models[hottest].cone : null
  const nextConeWork = hottest + 1 < works.length ? Math.min(1, works[hottest + 1]) : null
  return { cone, nextConeWork, peakC: Number.isFinite(peakC) ? peakC : 0, minutes }
}

/** A steady climb from room heat to peakC at rateCPerHour, then a hold: the curve of a simple log. */
export function steadyCurve(peakC: number, rateCPerHour: number, holdMinutes = 0): CurvePoint[] {
  const climb = (Math.max(0, peakC - CHART_START_C) / rateCPerHour) * 60
  const points: CurvePoint[] = [
    { minute: 0, tempC: CHART_START_C },
    { minute: climb, tempC: peakC },
  ]
  if (holdMinutes > 0) points.push({ minute: climb + holdMinutes, tempC: peakC })
  return points
}
