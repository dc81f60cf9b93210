// Currency rules Stripe applies to amounts in the smallest currency unit (cents for USD, yen for JPY).

// ISO 4217 codes as the runtime's Intl data lists them.
const ISO_CURRENCIES = new Set(Intl.supportedValuesOf('currency').map((code) => code.toLowerCase()))

export function isKnownCurrency(code: string): boolean {
  return ISO_CURRENCIES.has(code.toLowerCase())
}

// Minor-unit digits from ISO 4217 via Intl (2 for USD, 0 for JPY).
function minorDigits(currency: string): number {
  return (
    new Intl.NumberFormat('en-US', { style: 'currency', currency: currency.toUpperCase() }).resolvedOptions().maximumFractionDigits ?? 2
  )
}

export function formatAmount(amount: number, currency: string): string {
  const digits = minorDigits(currency)
  return new Intl.NumberFormat('en-US', { style: 'currency', currency: currency.toUpperCase() }).format(amount / 10 ** digits)
}

// Stripe's minimum charge amounts per settlement currency ("Minimum and maximum charge amounts" in
// Stripe's docs, from memory), in the smallest unit. Currencies not listed get no minimum here.
const MINIMUM_CHARGE: Record<string, number> = {
  usd: 50,
  eur: 50,
  gbp: 30,
  cad: 50,
  aud: 50,
  nzd: 50,
  chf: 50,
  sgd: 50,
  jpy: 50,
  dkk: 250,
  nok: 300,
  sek: 300,
  mxn: 1000,
}

// Stripe's largest amount for a single charge, eight digits in the smallest unit (from memory).
export const MAXIMUM_CHARGE = 99_999_999

export function minimumCharge(currency: string): number {
  return MINIMUM_CHARGE[currency.toLowerCase()] ?? 1
}
