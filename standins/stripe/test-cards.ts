// Stripe's documented test card numbers (docs.stripe.com/testing, from memory) and the checks Stripe's
// payment form makes before a card reaches the bank: a number passing the Luhn check, an expiry not in
// the past, a CVC of the right length.

export type CardBrand = 'visa' | 'mastercard' | 'amex' | 'discover' | 'unknown'

export type CardOutcome =
  { result: 'succeeded' } | { result: 'declined'; code: string; declineCode: string; message: string; sellerMessage: string }

interface TestCard {
  funding: 'credit' | 'debit'
  outcome: CardOutcome
  /** What a payment made without the cardholder present (`off_session`) meets, where it differs. */
  offSession?: CardOutcome
}

const succeeds: CardOutcome = { result: 'succeeded' }

function declined(code: string, declineCode: string, message: string): CardOutcome {
  const sellerMessage =
    declineCode === 'generic_decline'
      ? 'The bank did not return any further details with this decline.'
      : `The bank returned the decline code \`${declineCode}\`.`
  return { result: 'declined', code, declineCode, message, sellerMessage }
}

// Messages are the ones Stripe shows the customer for each decline code (from memory).
const TEST_CARDS: Record<string, TestCard> = {
  '4242424242424242': { funding: 'credit', outcome: succeeds },
  '4000056655665556': { funding: 'debit', outcome: succeeds },
  '5555555555554444': { funding: 'credit', outcome: succeeds },
  '378282246310005': { funding: 'credit', outcome: succeeds },
  '6011111111111117': { funding: 'credit', outcome: succeeds },
  // Asks for authentication on every payment: the hosted page stands for the cardholder passing the
  // challenge, and a payment off-session is refused for want of it.
  '4000002760003184': {
    funding: 'credit',
    outcome: succeeds,
    offSession: declined(
      'authentication_required',
      'authentication_required',
      'Your card was declined. This transaction requires authentication.',
    ),
  },
  '4000000000000002': { funding: 'credit', outcome: declined('card_declined', 'generic_decline', 'Your card was declined.') },
  '4000000000009995': {
    funding: 'credit',
    outcome: declined('card_declined', 'insufficient_funds', 'Your card has insufficient funds.'),
  },
  '4000000000009987': { funding: 'credit', outcome: declined('card_declined', 'lost_card', 'Your card was declined.') },
  '4000000000009979': { funding: 'credit', outcome: declined('card_declined', 'stolen_card', 'Your card was declined.') },
  '4000000000000069': { funding: 'credit', outcome: declined('expired_card', 'expired_card', 'Your card has expired.') },
  '4000000000000127': {
    funding: 'credit',
    outcome: declined('incorrect_cvc', 'incorrect_cvc', "Your card's security code is incorrect."),
  },
  '4000000000000119': {
    funding: 'credit',
    outcome: declined('processing_error', 'processing_error', 'An error occurred while processing your card. Try again in a little bit.'),
  },
}

// A number that passes Luhn but is not a test card is treated as a real card, which test mode declines.
const LIVE_CARD_IN_TEST_MODE = declined(
  'card_declined',
  'test_mode_live_card',
  'Your card was declined. Your request was in test mode, but used a non test card. For a list of valid test cards, visit: https://stripe.com/docs/testing.',
)

// The Luhn (mod 10) check digit algorithm, ISO/IEC 7812-1 Annex B.
export function passesLuhn(digits: string): boolean {
  if (!/^\d+$/.test(digits)) return false
  let sum = 0
  for (let index = 0; index < digits.length; index++) {
    let digit = Number(digits[digits.length - 1 - index])
    if (index % 2 === 1) {
      digit *= 2
      if (digit > 9) digit -= 9
    }
    sum += digit
  }
  return sum % 10 === 0
}

// Issuer prefixes per ISO/IEC 7812 ranges as the card networks publish them (common practice).
export function cardBrand(digits: string): CardBrand {
  if (/^4/.test(digits)) return 'visa'
  if (/^(5[1-5]|2[2-7])/.test(digits)) return 'mastercard'
  if (/^3[47]/.test(digits)) return 'amex'
  if (/^(6011|65|64[4-9])/.test(digits)) return 'discover'
  return 'unknown'
}

export interface CardEntry {
  number: string
  expiry: string
  cvc: string
  postalCode: string
}

export interface CheckedCard {
  number: string
  brand: CardBrand
  funding: 'credit' | 'debit'
  last4: string
  expMonth: number
  expYear: number
  outcome: CardOutcome
  offSession: CardOutcome
}

export type CardCheck = { ok: true; card: CheckedCard } | { ok: false; field: keyof CardEntry; code: string; message: string }

// What the form refuses before submitting, with the codes Stripe uses for the same faults.
export function checkCardEntry(entry: CardEntry, today: Date): CardCheck {
  const number = entry.number.replace(/[\s-]/g, '')
  if (number.length < 12 || number.length > 19 || !passesLuhn(number)) {
    return { ok: false, field: 'number', code: 'incorrect_number', message: 'Your card number is incorrect.' }
  }
  const expiry = /^\s*(\d{1,2})\s*\/\s*(\d{2}|\d{4})\s*$/.exec(entry.expiry)
  if (!expiry || Number(expiry[1]) < 1 || Number(expiry[1]) > 12) {
    return { ok: false, field: 'expiry', code: 'invalid_expiry_month', message: "Your card's expiration date is incomplete." }
  }
  const expMonth = Number(expiry[1])
  const expYear = expiry[2].length === 2 ? 2000 + Number(expiry[2]) : Number(expiry[2])
  const thisMonth = today.getUTCFullYear() * 12 + today.getUTCMonth() + 1
  if (expYear * 12 + expMonth < thisMonth) {
    return { ok: false, field: 'expiry', code: 'invalid_expiry_year', message: "Your card's expiration year is in the past." }
  }
  const brand = cardBrand(number)
  const cvcLength = brand === 'amex' ? 4 : 3
  if (!new RegExp(`^\\d{${cvcLength}}$`).test(entry.cvc.trim())) {
    return { ok: false, field: 'cvc', code: 'invalid_cvc', message: "Your card's security code is incomplete." }
  }
  if (!/^[A-Za-z0-9][A-Za-z0-9 -]{1,9}$/.test(entry.postalCode.trim())) {
    return { ok: false, field: 'postalCode', code: 'incomplete_zip', message: 'Your postal code is incomplete.' }
  }
  const known = TEST_CARDS[number]
  return {
    ok: true,
    card: {
      number,
      brand,
      funding: known?.funding ?? 'credit',
      last4: number.slice(-4),
      expMonth,
      expYear,
      outcome: known?.outcome ?? LIVE_CARD_IN_TEST_MODE,
      offSession: known?.offSession ?? known?.outcome ?? LIVE_CARD_IN_TEST_MODE,
    },
  }
}

// Stripe's test PaymentMethods for server-side payments (docs.stripe.com/testing, from memory): each
// stands for one of the test cards above.
const TEST_PAYMENT_METHODS: Record<string, string> = {
  pm_card_visa: '4242424242424242',
  pm_card_mastercard: '5555555555554444',
  pm_card_chargeDeclined: '4000000000000002',
  pm_card_chargeDeclinedInsufficientFunds: '4000000000009995',
  pm_card_authenticationRequired: '4000002760003184',
}

/** The card a test PaymentMethod id stands for, or null for an id that is not one of them. */
export function testPaymentMethod(id: string): CheckedCard | null {
  const number = TEST_PAYMENT_METHODS[id]
  if (!number) return null
  const card = TEST_CARDS[number]
  return {
    number,
    brand: cardBrand(number),
    funding: card.funding,
    last4: number.slice(-4),
    expMonth: 12,
    expYear: 2034,
    outcome: card.outcome,
    offSession: card.offSession ?? card.outcome,
  }
}
