/** Submits the Stripe stand-in's hosted payment form as a browser would, without following the redirect. */
export interface CardForm {
  cardNumber: string
  expiry?: string
  cvc?: string
  postalCode?: string
  email?: string
}

export async function submitCard(sessionUrl: string, card: CardForm): Promise<{ status: number; location: string | null; html: string }> {
  const response = await fetch(sessionUrl, {
    method: 'POST',
    headers: { 'Content-Type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({
      email: card.email ?? 'potter@example.com',
      cardNumber: card.cardNumber,
      expiry: card.expiry ?? '12 / 34',
      cvc: card.cvc ?? '123',
      cardholderName: 'Test Potter',
      postalCode: card.postalCode ?? '97201',
    }),
    redirect: 'manual',
  })
  return { status: response.status, location: response.headers.get('location'), html: await response.text() }
}

// Test card numbers from Stripe's testing docs (docs.stripe.com/testing).
export const CARD_SUCCEEDS = '4242 4242 4242 4242'
export const CARD_DECLINED = '4000 0000 0000 0002'
export const CARD_INSUFFICIENT_FUNDS = '4000 0000 0000 9995'
/** Asks for authentication on every payment, so it cannot be charged off-session (Stripe testing docs, from memory). */
export const CARD_ALWAYS_AUTHENTICATES = '4000 0027 6000 3184'
