// Conversions between the SI units kept inside (°C, mm, litres, g) and the US units the trade often
// shows. Exact definitions (NIST SP 811): 1 in = 25.4 mm, 1 lb = 453.59237 g, t/°F = 1.8·t/°C + 32.

export const MM_PER_INCH = 25.4
export const GRAMS_PER_POUND = 453.59237
/** 1 in³ = 25.4³ mm³ = 16 387.064 mm³ = 0.016387064 L, exact. */
export const LITRES_PER_CUBIC_INCH = (MM_PER_INCH * MM_PER_INCH * MM_PER_INCH) / 1_000_000
export const MM3_PER_LITRE = 1_000_000

export function cToF(celsius: number): number {
  return celsius * 1.8 + 32
}

export function fToC(fahrenheit: number): number {
  return (fahrenheit - 32) / 1.8
}

/** A rate (or any temperature difference) converts by 9/5 alone: there is no offset in a difference. */
export function rateCToF(celsiusPerHour: number): number {
  return celsiusPerHour * 1.8
}

export function rateFToC(fahrenheitPerHour: number): number {
  return fahrenheitPerHour / 1.8
}

export function mmToIn(mm: number): number {
  return mm / MM_PER_INCH
}

export function inToMm(inches: number): number {
  return inches * MM_PER_INCH
}

export function litresToCubicInches(litres: number): number {
  return litres / LITRES_PER_CUBIC_INCH
}

export function cubicInchesToLitres(cubicInches: number): number {
  return cubicInches * LITRES_PER_CUBIC_INCH
}

export function gToLb(grams: number): number {
  return grams / GRAMS_PER_POUND
}

export function lbToG(pounds: number): number {
  return pounds * GRAMS_PER_POUND
}
