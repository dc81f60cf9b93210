// The studio pages' edges: what hosts and potters read and type (inches or mm, °F or °C, litres or
// cubic feet, dollars) against the SI values the API keeps. Conversions come from shared/firing/units.ts.

import type { UnitSystem } from '../../../shared/schemas/auth'
import { cToF, fToC, inToMm, litresToCubicInches, cubicInchesToLitres, mmToIn, rateCToF, rateFToC } from '../../../shared/firing/units'

export type { UnitSystem }

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

const INCHES: Measure = { suffix: 'in', toShown: mmToIn, fromShown: inToMm, decimals: 2 }
const MILLIMETRES: Measure = { suffix: 'mm', toShown: same, fromShown: same, decimals: 0 }
const FAHRENHEIT: Measure = { suffix: '°F', toShown: cToF, fromShown: fToC, decimals: 0 }
const CELSIUS: Measure = { suffix: '°C', toShown: same, fromShown: same, decimals: 0 }
const FAHRENHEIT_PER_HOUR: Measure = { suffix: '°F/h', toShown: rateCToF, fromShown: rateFToC, decimals: 0 }
const CELSIUS_PER_HOUR: Measure = { suffix: '°C/h', toShown: same, fromShown: same, decimals: 0 }
const LITRES: Measure = { suffix: 'L', toShown: same, fromShown: same, decimals: 1 }
const CUBIC_FEET: Measure = {
  suffix: 'cu ft',
  toShown: (litres) => litresToCubicInches(litres) / CUBIC_INCHES_PER_CUBIC_FOOT,
  fromShown: (cubicFeet) => cubicInchesToLitres(cubicFeet * CUBIC_INCHES_PER_CUBIC_FOOT),
  decimals: 2,
}

export const lengthMeasure = (units: UnitSystem) => (units === 'metric' ? MILLIMETRES : INCHES)
export const temperatureMeasure = (units: UnitSystem) => (units === 'metric' ? CELSIUS : FAHRENHEIT)
export const rateMeasure = (units: UnitSystem) => (units === 'metric' ? CELSIUS_PER_HOUR : FAHRENHEIT_PER_HOUR)
export const capacityMeasure = (units: UnitSystem) => (units === 'metric' ? LITRES : CUBIC_FEET)
export const PLAIN_NUMBER: Measure = { suffix: '', toShown: same, fromShown: same, decimals: 2 }
export const PERCENT: Measure = { suffix: '%', toShown: same, fromShown: same, decimals: 2 }

/** Money is typed in currency units and kept in cents; rates (per cubic inch) keep fractions of a cent. */
const moneyMeasures = new Map<string, Measure>()
export function moneyMeasure(currency: string, decimals = 2): Measure {
  const code = /^[A-Za-z]{3}$/.test(currency.trim()) ? currency.trim().toUpperCase() : ''
  const key = `${code}|${decimals}`
  let measure = moneyMeasures.get(key)
  if (!measure) {
    const fromShown = decimals <= 2 ? (amount: number) => Math.round(amount * 100) : (amount: number) => Number((amount * 100).toFixed(decimals))
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

export function formatTemperature(celsius: number, units: UnitSystem): string {
  return units === 'metric' ? `${Math.round(celsius)} °C` : `${Math.round(cToF(celsius))} °F`
}

export function formatRate(celsiusPerHour: number, units: UnitSystem): string {
  return units === 'metric' ? `${Math.round(celsiusPerHour)} °C per hour` : `${Math.round(rateCToF(celsiusPerHour))} °F per hour`
}

export function formatLitres(litres: number): string {
  return `${trimmed(litres, 1)} L`
}

/** Litres always (the unit space is sold in), with cubic feet beside them for imperial readers. */
export function formatSpace(litres: number, units: UnitSystem): string {
  if (units === 'metric') return formatLitres(litres)
  return `${formatLitres(litres)} (${trimmed(CUBIC_FEET.toShown(litres), 2)} cu ft)`
}

/**
 * The shared schemas speak SI ("more than 0 mm", "at least 100 °C"); on an imperial form the same
 * message is shown in the units the host typed.
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
