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
  /** Typed and shown as a ruler reads (3/8, 1 1/2), to the nearest 1/16. */
  fractions?: boolean
}

const same = (value: number) => value
const CUBIC_INCHES_PER_CUBIC_FOOT = 12 * 12 * 12

export const INCHES: Measure = { suffix: 'in', toShown: mmToIn, fromShown: inToMm, decimals: 2, fractions: true }
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

/** A ruler's finest common mark. */
export const INCH_STEP = 16

const greatestDivisor = (a: number, b: number): number => (b === 0 ? a : greatestDivisor(b, a % b))

/** Inches as a ruler reads them, to the nearest 1/16: 0.375 → "3/8", 1.5 → "1 1/2", 4 → "4". */
export function inchesText(inches: number): string {
  const sixteenths = Math.round(Math.abs(inches) * INCH_STEP)
  const whole = Math.floor(sixteenths / INCH_STEP)
  const part = sixteenths % INCH_STEP
  const sign = inches < 0 && sixteenths > 0 ? '-' : ''
  if (part === 0) return `${sign}${whole}`
  const divisor = greatestDivisor(part, INCH_STEP)
  const fraction = `${part / divisor}/${INCH_STEP / divisor}`
  return `${sign}${whole > 0 ? `${whole} ` : ''}${fraction}`
}

/** A number as it goes into a field: rounded to the measure's decimals (or 1/16 in), no trailing zeros. */
export function shownText(stored: number | null | undefined, measure: Measure): string {
  if (stored === undefined || stored === null || !Number.isFinite(stored)) return ''
  if (measure.fractions) return inchesText(measure.toShown(stored))
  return String(Number(measure.toShown(stored).toFixed(measure.decimals)))
}

// The vulgar-fraction characters a phone keyboard or a pasted spec may carry (Unicode's Number Forms).
const UNICODE_FRACTIONS: Record<string, string> = {
  '½': '1/2',
  '⅓': '1/3',
  '⅔': '2/3',
  '¼': '1/4',
  '¾': '3/4',
  '⅕': '1/5',
  '⅖': '2/5',
  '⅗': '3/5',
  '⅘': '4/5',
  '⅙': '1/6',
  '⅚': '5/6',
  '⅛': '1/8',
  '⅜': '3/8',
  '⅝': '5/8',
  '⅞': '7/8',
}
const DECIMAL = /^[-+]?(\d+\.?\d*|\.\d+)$/
// "3/8", "1 1/2", "1-1/2" (the hyphen a machinist writes), "1½" once the glyph is spelled out.
const MIXED = /^([-+]?)(?:(\d+)(?:\s+|-))?(\d+)\/(\d+)$/

/**
 * What a field's text means: undefined when empty, NaN when it is not a number (the schema says so).
 * With `fractions`, a ruler's reading is a number too: 3/8, 1 1/2, 1-1/2, 1½.
 */
export function parseShown(text: string, { fractions = false }: { fractions?: boolean } = {}): number | undefined {
  const trimmed = text.trim().replace(',', '.')
  if (trimmed === '') return undefined
  if (DECIMAL.test(trimmed)) return Number(trimmed)
  if (!fractions) return Number.NaN
  const spelled = trimmed.replace(/\s*([½⅓⅔¼¾⅕⅖⅗⅘⅙⅚⅛⅜⅝⅞])/g, (_, glyph: string) => ` ${UNICODE_FRACTIONS[glyph]}`).trim()
  const mixed = MIXED.exec(spelled.replace(/\s*\/\s*/g, '/'))
  if (!mixed) return Number.NaN
  const [, sign, whole, numerator, denominator] = mixed
  if (Number(denominator) === 0) return Number.NaN
  const value = Number(whole ?? 0) + Number(numerator) / Number(denominator)
  return sign === '-' ? -value : value
}

const trimmed = (value: number, decimals: number) => String(Number(value.toFixed(decimals)))

/** Millimetres for metric readers; inches to the nearest 1/16 for imperial ones. */
export function formatLength(mm: number, units: UnitSystem): string {
  return units === 'metric' ? `${Math.round(mm)} mm` : `${inchesText(mmToIn(mm))} in`
}

export function formatTemperature(celsius: number, scale: TemperatureScale): string {
  return scale === 'C' ? `${Math.round(celsius)} °C` : `${Math.round(cToF(celsius))} °F`
}

export function formatRate(celsiusPerHour: number, scale: TemperatureScale): string {
  return scale === 'C' ? `${Math.round(celsiusPerHour)} °C/h` : `${Math.round(rateCToF(celsiusPerHour))} °F/h`
}

/**
 * Every volume on every page in one unit per system: litres for metric readers, cubic feet for imperial
 * ones (the unit kilns are sold and spoken of in, common practice), with more decimals for the small
 * amounts one potter's ware takes.
 */
export function formatVolume(litres: number, units: UnitSystem): string {
  if (units === 'metric') return `${trimmed(litres, 1)} L`
  const cubicFeet = litresToCubicInches(litres) / CUBIC_INCHES_PER_CUBIC_FOOT
  return `${trimmed(cubicFeet, cubicFeet >= 10 ? 0 : cubicFeet >= 1 ? 1 : 2)} cu ft`
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
    .replace(/(-?\d[\d ]*(?:\.\d+)?) mm\b/g, (_, n: string) => `${inchesText(mmToIn(Number(n.replace(/ /g, ''))))} in`)
    .replace(/ in millimetres\./g, ' in inches, like 4.5 or 3/8.')
    .replace(/ in millimetres/g, ' in inches')
}
