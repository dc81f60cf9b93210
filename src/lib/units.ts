// The client's edges: what people read and type (inches or mm, °F or °C, cubic feet or litres, money)
// against the SI values the API and the firing science keep (mm, °C, °C/h, litres, cents).
// Conversions come from shared/firing/units.ts.

import type { UnitSystem } from '../../shared/schemas/auth'
import {
  cToF,
  cubicInchesToLitres,
  fToC,
  gToLb,
  inToMm,
  lbToG,
  litresToCubicInches,
  mmToIn,
  rateCToF,
  rateFToC,
} from '../../shared/firing/units'

export type { UnitSystem }
export type TemperatureScale = 'F' | 'C'

export const scaleOf = (units: UnitSystem): TemperatureScale => (units === 'metric' ? 'C' : 'F')

/** How one kind of number is shown and typed: the stored SI value ↔ the value on screen. */
export interface Measure {
  suffix: string
  toShown(stored: number): number
  fromShown(shown: number): number
  /** Decimals kept when the value is written into a field. */
  decimals: number
}

const same = (value: number) => value
const CUBIC_INCHES_PER_CUBIC_FOOT = 12 * 12 * 12

export const INCHES: Measure = { suffix: 'in', toShown: mmToIn, fromShown: inToMm, decimals: 2 }
// A tenth of a millimetre keeps an inch figure typed elsewhere (4 in = 101.6 mm) as it was.
export const MILLIMETRES: Measure = { suffix: 'mm', toShown: same, fromShown: same, decimals: 1 }
export const FAHRENHEIT: Measure = { suffix: '°F', toShown: cToF, fromShown: fToC, decimals: 0 }
export const CELSIUS: Measure = { suffix: '°C', toShown: same, fromShown: same, decimals: 0 }
export const FAHRENHEIT_PER_HOUR: Measure = { suffix: '°F/h', toShown: rateCToF, fromShown: rateFToC, decimals: 0 }
export const CELSIUS_PER_HOUR: Measure = { suffix: '°C/h', toShown: same, fromShown: same, decimals: 0 }
export const LITRES: Measure = { suffix: 'L', toShown: same, fromShown: same, decimals: 1 }
export const CUBIC_FEET: Measure = {
  suffix: 'cu ft',
  toShown: (litres) => litresToCubicInches(litres) / CUBIC_INCHES_PER_CUBIC_FOOT,
  fromShown: (cubicFeet) => cubicInchesToLitres(cubicFeet * CUBIC_INCHES_PER_CUBIC_FOOT),
  decimals: 2,
}
export const GRAMS: Measure = { suffix: 'g', toShown: same, fromShown: same, decimals: 0 }
export const POUNDS: Measure = { suffix: 'lb', toShown: gToLb, fromShown: lbToG, decimals: 2 }
export const KILOGRAMS: Measure = { suffix: 'kg', toShown: same, fromShown: same, decimals: 1 }
export const POUNDS_FROM_KG: Measure = { suffix: 'lb', toShown: (kg) => gToLb(kg * 1000), fromShown: (lb) => lbToG(lb) / 1000, decimals: 1 }
export const COUNT: Measure = { suffix: '', toShown: same, fromShown: same, decimals: 0 }
export const PLAIN_NUMBER: Measure = { suffix: '', toShown: same, fromShown: same, decimals: 2 }
export const PERCENT: Measure = { suffix: '%', toShown: same, fromShown: same, decimals: 2 }
/** A rate kept in cents and typed in cents, fractions allowed (4.5 ¢ per cubic inch). */
export const FRACTIONAL_CENTS: Measure = { suffix: '¢', toShown: same, fromShown: same, decimals: 3 }

export const lengthMeasure = (units: UnitSystem) => (units === 'metric' ? MILLIMETRES : INCHES)
/** A piece's weight, stored in grams. */
export const pieceWeightMeasure = (units: UnitSystem) => (units === 'metric' ? GRAMS : POUNDS)
/** A shelf's load, stored in kilograms. */
export const shelfLoadMeasure = (units: UnitSystem) => (units === 'metric' ? KILOGRAMS : POUNDS_FROM_KG)
export const temperatureMeasure = (units: UnitSystem) => (units === 'metric' ? CELSIUS : FAHRENHEIT)
export const rateMeasure = (units: UnitSystem) => (units === 'metric' ? CELSIUS_PER_HOUR : FAHRENHEIT_PER_HOUR)
export const capacityMeasure = (units: UnitSystem) => (units === 'metric' ? LITRES : CUBIC_FEET)

/**
 * Money is typed in currency units and kept in cents. Whole prices round to the cent; rates (per
 * cubic inch) keep `decimals` places of the currency unit, so fractions of a cent survive.
 */
const moneyMeasures = new Map<string, Measure>()
export function moneyMeasure(currency: string, decimals = 2): Measure {
  const code = /^[A-Za-z]{3}$/.test(currency.trim()) ? currency.trim().toUpperCase() : ''
  const key = `${code}|${decimals}`
  let measure = moneyMeasures.get(key)
  if (!measure) {
    const fromShown =
      decimals <= 2 ? (amount: number) => Math.round(amount * 100) : (amount: number) => Number((amount * 100).toFixed(decimals))
    measure = { suffix: code, toShown: (cents) => cents / 100, fromShown, decimals }
    moneyMeasures.set(key, measure)
  }
  return measure
}

/** A number as it goes into a field: rounded to the measure's decimals, no trailing zeros. */
export function shownText(stored: number | null | undefined, measure: Measure): string {
  if (stored === undefined || stored === null || !Number.isFinite(stored)) return ''
  return String(Number(measure.toShown(stored).toFixed(measure.decimals)))
}

/** What a field's text means: undefined when empty, NaN when it is not a number (the schema says so). */
export function parseShown(text: string): number | undefined {
  const trimmed = text.trim().replace(',', '.')
  if (trimmed === '') return undefined
  return /^[-+]?(\d+\.?\d*|\.\d+)$/.test(trimmed) ? Number(trimmed) : Number.NaN
}

const trimmed = (value: number, decimals: number) => String(Number(value.toFixed(decimals)))

export function formatLength(mm: number, units: UnitSystem): string {
  return units === 'metric' ? `${Math.round(mm)} mm` : `${trimmed(mmToIn(mm), 1)} in`
}

export function formatTemperature(celsius: number, scale: TemperatureScale): string {
  return scale === 'C' ? `${Math.round(celsius)} °C` : `${Math.round(cToF(celsius))} °F`
}

export function formatRate(celsiusPerHour: number, scale: TemperatureScale): string {
  return scale === 'C' ? `${Math.round(celsiusPerHour)} °C/h` : `${Math.round(rateCToF(celsiusPerHour))} °F/h`
}

/** Litres for metric readers, cubic feet for imperial ones. */
export function formatVolume(litres: number, units: UnitSystem): string {
  if (units === 'metric') return `${trimmed(litres, 1)} L`
  return `${trimmed(litresToCubicInches(litres) / CUBIC_INCHES_PER_CUBIC_FOOT, 2)} cu ft`
}

export function formatLitres(litres: number): string {
  return `${trimmed(litres, 1)} L`
}

/** Litres always (the unit space is sold in), with cubic feet beside them for imperial readers. */
export function formatSpace(litres: number, units: UnitSystem): string {
  if (units === 'metric') return formatLitres(litres)
  return `${formatLitres(litres)} (${trimmed(CUBIC_FEET.toShown(litres), 2)} cu ft)`
}

/** Space in a load, in shelves of the kiln (a half shelf is half a shelf), the way crew count it. */
export function formatShelves(shelves: number): string {
  const n = trimmed(shelves, 1)
  return `${n} ${n === '1' ? 'shelf' : 'shelves'}`
}

export function formatDuration(minutes: number): string {
  const whole = Math.round(minutes)
  const hours = Math.floor(whole / 60)
  const rest = whole % 60
  if (hours === 0) return `${rest} min`
  return rest === 0 ? `${hours} h` : `${hours} h ${rest} min`
}

/**
 * The shared schemas speak SI ("more than 0 mm", "at least 100 °C"); on an imperial form the same
 * message is shown in the units the person typed.
 */
export function localiseMessage(message: string, units: UnitSystem): string {
  if (units === 'metric') return message
  return message
    .replace(/(-?\d[\d ]*(?:\.\d+)?) °C per hour/g, (_, n: string) => `${trimmed(rateCToF(Number(n.replace(/ /g, ''))), 1)} °F per hour`)
    .replace(/ in °C per hour/g, ' in °F per hour')
    .replace(/(-?\d[\d ]*(?:\.\d+)?) °C/g, (_, n: string) => `${Math.round(cToF(Number(n.replace(/ /g, ''))))} °F`)
    .replace(/ in °C/g, ' in °F')
    .replace(/(-?\d[\d ]*(?:\.\d+)?) mm\b/g, (_, n: string) => `${trimmed(mmToIn(Number(n.replace(/ /g, ''))), 2)} in`)
    .replace(/ in millimetres/g, ' in inches')
}
