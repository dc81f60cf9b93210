// The search page's edges: piece sizes typed in inches or millimetres, distances in miles or
// kilometres, space in litres (with cubic inches or feet beside them). Inside, everything is SI.

import type { UnitSystem } from '../../../shared/schemas/auth'
import { inToMm, litresToCubicInches, mmToIn } from '../../../shared/firing/units'

export type { UnitSystem }

/** The international mile, 1 609.344 m exactly (NIST SP 811, appendix B). */
export const KM_PER_MILE = 1.609344
const CUBIC_INCHES_PER_CUBIC_FOOT = 12 * 12 * 12

const trimmed = (value: number, decimals: number) => String(Number(value.toFixed(decimals)))

export const lengthSuffix = (units: UnitSystem) => (units === 'metric' ? 'mm' : 'in')

/**
 * A typed length as the millimetres the query carries: a tenth of a millimetre is finer than any
 * piece is measured, and keeps 24 in as 609.6 rather than a run of digits. Text that is not a
 * number is passed on as typed, so the shared schema can say what is wrong with it.
 */
export function typedLengthToMm(text: string, units: UnitSystem): string | undefined {
  const clean = text.trim().replace(',', '.')
  if (clean === '') return undefined
  if (!/^[-+]?(\d+\.?\d*|\.\d+)$/.test(clean)) return text.trim()
  const mm = units === 'metric' ? Number(clean) : inToMm(Number(clean))
  return trimmed(mm, 1)
}

/** Millimetres from the URL as the text of a length field in the chosen units. */
export function mmToTypedLength(mm: string | undefined, units: UnitSystem): string {
  if (mm === undefined || mm === '') return ''
  const value = Number(mm)
  if (!Number.isFinite(value)) return mm
  return units === 'metric' ? trimmed(value, 1) : trimmed(mmToIn(value), 2)
}

export function formatLength(mm: number, units: UnitSystem): string {
  return units === 'metric' ? `${Math.round(mm)} mm` : `${trimmed(mmToIn(mm), 1)} in`
}

export function kmToShownDistance(km: number, units: UnitSystem): number {
  return units === 'metric' ? km : km / KM_PER_MILE
}

export function formatDistance(km: number, units: UnitSystem): string {
  const shown = kmToShownDistance(km, units)
  return `${trimmed(shown, shown < 10 ? 1 : 0)} ${units === 'metric' ? 'km' : 'mi'}`
}

/**
 * Distances offered in the filter, in the reader's units, as the kilometres the query carries. The
 * server's usual reach (80 km, about 50 mi) is the filter's empty choice, so it is not offered twice.
 */
export function distanceChoices(units: UnitSystem): { km: string; label: string }[] {
  const steps = units === 'metric' ? [10, 25, 50, 150, 300, 800] : [5, 10, 25, 100, 250, 500]
  return steps.map((step) => {
    const km = units === 'metric' ? step : step * KM_PER_MILE
    return { km: trimmed(km, 1), label: `Within ${step} ${units === 'metric' ? 'km' : 'mi'}` }
  })
}

/** Litres always (space is sold by volume); imperial readers also get cubic inches, or feet once there is a foot of it. */
export function formatSpace(litres: number, units: UnitSystem): string {
  const inLitres = `${trimmed(litres, 1)} L`
  if (units === 'metric') return inLitres
  const cubicInches = litresToCubicInches(litres)
  return cubicInches < CUBIC_INCHES_PER_CUBIC_FOOT
    ? `${inLitres} (${Math.round(cubicInches)} cu in)`
    : `${inLitres} (${trimmed(cubicInches / CUBIC_INCHES_PER_CUBIC_FOOT, 1)} cu ft)`
}
