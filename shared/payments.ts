// Rules about taking money that both sides read: the card processor's smallest charge, and the
// deposit a studio asks given its quote. Stripe refuses charges under its minimum (USD and CAD:
// 50 cents, Stripe's documented minimum charge amounts), so a smaller deposit is rounded up to it
// (never past the whole price), and a smaller balance is paid at the counter.

const MINIMUM_CHARGE_CENTS: Record<string, number> = { USD: 50, CAD: 50, EUR: 50, GBP: 30, AUD: 50, NZD: 50 }

export function minimumOnlineCharge(currency: string): number {
  return MINIMUM_CHARGE_CENTS[currency.toUpperCase()] ?? 50
}

/** Whether an amount can be paid through the card processor at all. */
export function payableOnline(amountCents: number, currency: string): boolean {
  return amountCents >= minimumOnlineCharge(currency)
}

/**
 * The deposit to ask: the quote's deposit, rounded up to the processor's minimum when it is smaller
 * (the studio's terms allow no charge the processor refuses), but never more than the whole price.
 */
export function depositToAsk(depositCents: number, totalCents: number, currency: string): number {
  if (depositCents <= 0) return 0
  return Math.min(totalCents, Math.max(depositCents, minimumOnlineCharge(currency)))
}

const CARD_BRANDS: Record<string, string> = {
  visa: 'Visa',
  mastercard: 'Mastercard',
  amex: 'American Express',
  discover: 'Discover',
  diners: 'Diners Club',
  jcb: 'JCB',
  unionpay: 'UnionPay',
}

/** A card as people name it on a receipt: "Visa ending 4242". */
export function cardLabel(brand: string | null, last4: string | null): string {
  const name = (brand && CARD_BRANDS[brand]) ?? 'Card'
  return last4 ? `${name} ending ${last4}` : name
}
