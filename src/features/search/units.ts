// The search page's edges: piece sizes typed in inches or millimetres, distances in miles or
// kilometres, space in litres or cubic feet. Inside, everything is SI. Lengths and volumes are written
// and read as on every other page (src/lib/units.ts).

import type { UnitSystem } from '../../../shared/schemas/auth'
import { inToMm } from '../../../shared/firing/units'
import { INCHES, MILLIMETRES, parseShown, shownText } from '../../lib/units'

export type { UnitSystem }

/** The international mile, 1 609.344 m exactly (NIST SP 811, appendix B). */
export const KM_PER_MILE = 1.609344

const trimmed = (value: number, decimals: number) => String(Number(value.toFixed(decimals)))

export const lengthSuffix = (units: UnitSystem) => (units === 'metric' ? 'mm' : 'in')

/**
 * A typed length as the millimetres the query carries: a tenth of a millimetre is finer than any
 * piece is measured, and keeps 24 in as 609.6 rather than a run of digits. Inches take a ruler's
 * fractions (3/8, 1 1/2). Text that is not a number is passed on as typed, so the shared schema can
 * say what is wrong with it.
 */
export function typedLengthToMm(text: string, units: UnitSystem): string | undefined {
  const shown = parseShown(text, { fractions: units !== 'metric' })
  if (shown === undefined) return undefined
  if (Number.isNaN(shown)) return text.trim()
  return trimmed(units === 'metric' ? shown : inToMm(shown), 1)
}

/** Millimetres from the URL as the text of a length field in the chosen units (inches to 1/16). */
export function mmToTypedLength(mm: string | undefined, units: UnitSystem): string {
  if (mm === undefined || mm === '') return ''
  const value = Number(mm)
  if (!Number.isFinite(value)) return mm
  return shownText(value, units === 'metric' ? MILLIMETRES : INCHES)
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
