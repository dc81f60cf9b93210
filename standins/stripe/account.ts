// One Stripe test-mode account held in memory: checkout sessions, payment intents, charges, refunds and
// the events they raise. Nothing is persisted; a restart of the stand-in starts an empty account, which
// is what a test stand-in wants. The rules here are Stripe's, so the app meets the same refusals locally.
// The `param` of a `resource_missing` error is the path parameter's name in Stripe's OpenAPI spec
// (`/v1/checkout/sessions/{session}`, `/v1/payment_intents/{intent}`, `/v1/refunds/{refund}`).
import type { BalanceBook } from './balances'
import { invalidRequest, resourceMissing, StripeApiError } from './errors'
import { MAXIMUM_CHARGE, formatAmount, minimumCharge } from './currency'
import { CUSTOMER_ACTION, type EventLog, type RequestContext } from './events'
import { testPaymentMethod, type CheckedCard } from './test-cards'
import {
  newId,
  type ChargeObject,
  type CustomerObject,
  type EventObject,
  type LineItemObject,
  type PaymentIntentObject,
  type PaymentMethodObject,
  type RefundObject,
  type SessionObject,
} from './objects'

export type { RequestContext } from './events'

export interface LineItemInput {
  name: string
  description: string | null
  currency: string
  unitAmount: number
  quantity: number
}

export interface CheckoutSessionInput {
  lineItems: LineItemInput[]
  allowedPaymentMethodTypes: string[] | null
  successUrl: string | null
  cancelUrl: string | null
  metadata: Record<string, string>
  clientReferenceId: string | null
  customerEmail: string | null
  /** A Customer the card is attached to when `setup_future_usage` is set. */
  customer: string | null
  submitType: SessionObject['submit_type']
  paymentIntentData: {
    metadata: Record<string, string>
    description: string | null
    receiptEmail: string | null
    transferGroup: string | null
    setupFutureUsage: 'on_session' | 'off_session' | null
  }
  expiresAt: number | null
}

/**
 * A PaymentIntent made and confirmed through the API, with one of Stripe's test PaymentMethods
 * (`pm_card_visa`) or a card saved to a Customer by an earlier payment (`customer` + `off_session`).
 */
export interface PaymentIntentInput {
  amount: number
  currency: string
  paymentMethod: string
  customer: string | null
  offSession: boolean
  metadata: Record<string, string>
  description: string | null
  receiptEmail: string | null
  transferGroup: string | null
}

export interface CustomerInput {
  email: string | null
  name: string | null
  description: string | null
  metadata: Record<string, string>
}

export interface RefundInput {
  paymentIntent: string | null
  charge: string | null
  amount: number | null
  metadata: Record<string, string>
  reason: RefundObject['reason']
}

export interface CustomerEntry {
  email: string
  name: string
  postalCode: string
}

export type PaymentAttempt =
  | { result: 'succeeded'; session: SessionObject; paymentIntent: PaymentIntentObject }
  | { result: 'declined'; session: SessionObject; paymentIntent: PaymentIntentObject; message: string; declineCode: string }

// Stripe lets a Checkout Session live between 30 minutes and 24 hours (Checkout docs, `expires_at`).
const SESSION_MIN_LIFETIME_S = 30 * 60
const SESSION_MAX_LIFETIME_S = 24 * 60 * 60

/** A PaymentMethod made by a payment, with the card it stands for (its outcomes included). */
interface PaymentMethodRecord {
  method: PaymentMethodObject
  card: CheckedCard
}

interface SessionRecord {
  session: SessionObject
  lineItems: LineItemObject[]
  paymentIntentData: CheckoutSessionInput['paymentIntentData']
}

// The hosted page asks for the postal code only, as Stripe's does for most card countries.
function postalAddress(customer: CustomerEntry) {
  return { city: null, country: null, line1: null, line2: null, postal_code: customer.postalCode, state: null }
}

// Who paid, as the hosted page took it down.
function billingDetails(customer: CustomerEntry) {
  return { address: postalAddress(customer), email: customer.email, name: customer.name || null, phone: null, tax_id: null }
}

// The card as charges and PaymentMethods describe it.
function cardDetails(card: CheckedCard) {
  return { brand: card.brand, country: 'US', exp_month: card.expMonth, exp_year: card.expYear, funding: card.funding, last4: card.last4 }
}

// The charge one attempt makes: captured at once when the card succeeds, `failed` with the decline otherwise.
function chargeForAttempt(
  intent: PaymentIntentObject,
  card: CheckedCard,
  customer: CustomerEntry,
  paymentMethod: string,
  created: number,
): ChargeObject {
  const outcome = card.outcome
  return {
    id: newId.charge(),
    object: 'charge',
    amount: intent.amount,
    amount_captured: outcome.result === 'succeeded' ? intent.amount : 0,
    amount_refunded: 0,
    application: null,
    application_fee: null,
    application_fee_amount: null,
    balance_transaction: outcome.result === 'succeeded' ? newId.balanceTransaction() : null,
    billing_details: billingDetails(customer),
    captured: outcome.result === 'succeeded',
    created,
    currency: intent.currency,
    customer: null,
    description: intent.description,
    disputed: false,
    failure_code: outcome.result === 'succeeded' ? null : outcome.code,
    failure_message: outcome.result === 'succeeded' ? null : outcome.message,
    livemode: false,
    metadata: { ...intent.metadata },
    outcome:
      outcome.result === 'succeeded'
        ? {
            advice_code: null,
            network_advice_code: null,
            network_decline_code: null,
            network_status: 'approved_by_network',
            reason: null,
            risk_level: 'normal',
            seller_message: 'Payment complete.',
            type: 'authorized',
          }
        : {
            advice_code: null,
            network_advice_code: null,
            network_decline_code: null,
            network_status: 'declined_by_network',
            reason: outcome.declineCode,
            risk_level: 'normal',
            seller_message: outcome.sellerMessage,
            type: 'issuer_declined',
          },
    paid: outcome.result === 'succeeded',
    payment_intent: intent.id,
    payment_method: paymentMethod,
    payment_method_details: { type: 'card', card: cardDetails(card) },
    receipt_email: intent.receipt_email,
    receipt_url: null,
    refunded: false,
    status: outcome.result === 'succeeded' ? 'succeeded' : 'failed',
    transfer_group: intent.transfer_group,
  }
}

/** What the stand-in keeps of the platform's payments, as plain data for its state file. */
export interface PlatformSnapshot {
  sessions: [string, SessionRecord][]
  paymentIntents: [string, PaymentIntentObject][]
  charges: [string, ChargeObject][]
  refunds: [string, RefundObject][]
  customers?: [string, CustomerObject][]
  paymentMethods?: [string, PaymentMethodRecord][]
}

export class TestModeAccount {
  private sessions = new Map<string, SessionRecord>()
  private paymentIntents = new Map<string, PaymentIntentObject>()
  private charges = new Map<string, ChargeObject>()
  private refunds = new Map<string, RefundObject>()
  private customers = new Map<string, CustomerObject>()
  private paymentMethods = new Map<string, PaymentMethodRecord>()

  private readonly now: () => number
  private readonly checkoutPageUrl: (sessionId: string) => string
  private readonly events: EventLog
  private readonly book: BalanceBook

  constructor(options: { now: () => number; checkoutPageUrl: (sessionId: string) => string; events: EventLog; book: BalanceBook }) {
    this.now = options.now
    this.checkoutPageUrl = options.checkoutPageUrl
    this.events = options.events
    this.book = options.book
  }

  snapshot(): PlatformSnapshot {
    return {
      sessions: [...this.sessions],
      paymentIntents: [...this.paymentIntents],
      charges: [...this.charges],
      refunds: [...this.refunds],
      customers: [...this.customers],
      paymentMethods: [...this.paymentMethods],
    }
  }

  restore(state: PlatformSnapshot): void {
    this.sessions = new Map(state.sessions)
    this.paymentIntents = new Map(state.paymentIntents)
    this.charges = new Map(state.charges)
    this.refunds = new Map(state.refunds)
    // State files written before customers were kept have none.
    this.customers = new Map(state.customers ?? [])
    this.paymentMethods = new Map(state.paymentMethods ?? [])
  }

  private seconds(): number {
    return Math.floor(this.now() / 1000)
  }

  createCustomer(input: CustomerInput): CustomerObject {
    const customer: CustomerObject = {
      id: newId.customer(),
      object: 'customer',
      created: this.seconds(),
      description: input.description,
      email: input.email,
      livemode: false,
      metadata: input.metadata,
      name: input.name,
    }
    this.customers.set(customer.id, customer)
    return customer
  }

  customer(id: string): CustomerObject {
    const customer = this.customers.get(id)
    if (!customer) throw resourceMissing('customer', id, 'customer')
    return customer
  }

  paymentMethod(id: string): PaymentMethodObject {
    const record = this.paymentMethods.get(id)
    if (!record) throw resourceMissing('payment_method', id, 'payment_method')
    return record.method
  }

  detachPaymentMethod(id: string): PaymentMethodObject {
    const method = this.paymentMethod(id)
    if (method.customer === null) {
      // Stripe's refusal to detach a method that is not attached (wording from memory).
      throw invalidRequest('The payment method you provided is not attached to a customer so detachment is impossible.', {
        param: 'payment_method',
      })
    }
    method.customer = null
    return method
  }

  createCheckoutSession(input: CheckoutSessionInput): SessionObject {
    const created = this.seconds()
    if (input.customer !== null) {
      // Stripe takes either an existing Customer or an address for a new one, not both (wording from memory).
      if (input.customerEmail !== null) {
        throw invalidRequest('You may only specify one of these parameters: customer, customer_email.', { param: 'customer' })
      }
      this.customer(input.customer)
    }
    const currency = input.lineItems[0].currency
    input.lineItems.forEach((item, index) => {
      if (item.currency !== currency) {
        throw invalidRequest('All `line_items` must use the same currency.', {
          param: `line_items[${index}][price_data][currency]`,
        })
      }
    })
    const amountTotal = input.lineItems.reduce((sum, item) => sum + item.unitAmount * item.quantity, 0)
    if (amountTotal < minimumCharge(currency)) {
      throw invalidRequest(
        `The Checkout Session's total amount due must add up to at least ${formatAmount(minimumCharge(currency), currency)} ${currency}`,
        { code: 'amount_too_small' },
      )
    }
    if (amountTotal > MAXIMUM_CHARGE) {
      throw invalidRequest(`Amount must be no more than ${formatAmount(MAXIMUM_CHARGE, currency)} ${currency}`, {
        code: 'amount_too_large',
      })
    }
    if (input.expiresAt !== null) {
      if (input.expiresAt < created + SESSION_MIN_LIFETIME_S) {
        throw invalidRequest('The `expires_at` timestamp must be at least 30 minutes from Checkout Session creation.', {
          param: 'expires_at',
        })
      }
      if (input.expiresAt > created + SESSION_MAX_LIFETIME_S) {
        throw invalidRequest('The `expires_at` timestamp must be less than 24 hours from Checkout Session creation.', {
          param: 'expires_at',
        })
      }
    }
    const id = newId.checkoutSession()
    const lineItems = input.lineItems.map((item): LineItemObject => {
      const amount = item.unitAmount * item.quantity
      return {
        id: newId.lineItem(),
        object: 'item',
        amount_discount: 0,
        amount_subtotal: amount,
        amount_tax: 0,
        amount_total: amount,
        currency,
        description: item.name,
        quantity: item.quantity,
        // Inline `price_data` makes a throwaway, inactive price and product, as Stripe does.
        price: {
          id: newId.price(),
          object: 'price',
          active: false,
          billing_scheme: 'per_unit',
          created,
          currency,
          livemode: false,
          lookup_key: null,
          metadata: {},
          nickname: null,
          product: newId.product(),
          recurring: null,
          tax_behavior: 'unspecified',
          tiers_mode: null,
          transform_quantity: null,
          type: 'one_time',
          unit_amount: item.unitAmount,
          unit_amount_decimal: String(item.unitAmount),
        },
      }
    })
    const session: SessionObject = {
      id,
      object: 'checkout.session',
      after_expiration: null,
      allow_promotion_codes: null,
      allowed_payment_method_types: input.allowedPaymentMethodTypes,
      amount_subtotal: amountTotal,
      amount_total: amountTotal,
      billing_address_collection: null,
      cancel_url: input.cancelUrl,
      client_reference_id: input.clientReferenceId,
      client_secret: null,
      consent: null,
      consent_collection: null,
      created,
      currency,
      custom_fields: [],
      customer: input.customer,
      customer_creation: 'if_required',
      customer_details: null,
      customer_email: input.customerEmail,
      discounts: [],
      expires_at: input.expiresAt ?? created + SESSION_MAX_LIFETIME_S,
      invoice: null,
      livemode: false,
      locale: null,
      metadata: input.metadata,
      mode: 'payment',
      // Since API version 2022-08-01 the PaymentIntent is made when the customer submits payment, not here.
      payment_intent: null,
      payment_link: null,
      payment_method_collection: 'if_required',
      payment_method_types: ['card'],
      payment_status: 'unpaid',
      recovered_from: null,
      setup_intent: null,
      shipping_address_collection: null,
      shipping_cost: null,
      shipping_options: [],
      status: 'open',
      submit_type: input.submitType,
      subscription: null,
      success_url: input.successUrl,
      total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
      ui_mode: 'hosted_page',
      url: this.checkoutPageUrl(id),
    }
    this.sessions.set(id, { session, lineItems, paymentIntentData: input.paymentIntentData })
    return session
  }

  private sessionRecord(id: string): SessionRecord {
    this.expireDue()
    const record = this.sessions.get(id)
    if (!record) throw resourceMissing('checkout.session', id, 'session')
    return record
  }

  session(id: string): SessionObject {
    return this.sessionRecord(id).session
  }

  /** What the hosted page needs beyond the session: the Customer's address, and whether the card is kept. */
  checkoutPresets(sessionId: string): { email: string | null; keepsCard: boolean } {
    const { session, paymentIntentData } = this.sessionRecord(sessionId)
    const customer = typeof session.customer === 'string' ? this.customers.get(session.customer) : undefined
    return { email: session.customer_email ?? customer?.email ?? null, keepsCard: paymentIntentData.setupFutureUsage !== null }
  }

  lineItems(sessionId: string): LineItemObject[] {
    return this.sessionRecord(sessionId).lineItems
  }

  expireSession(id: string, context: RequestContext): SessionObject {
    const { session } = this.sessionRecord(id)
    if (session.status !== 'open') {
      // Wording approximated from Stripe's refusal to expire a session that is no longer open.
      throw invalidRequest(
        `Only Checkout Sessions with a status of \`open\` can be expired. This Checkout Session has a status of \`${session.status}\`.`,
        { param: 'session' },
      )
    }
    this.expire(session, context)
    return session
  }

  private expire(session: SessionObject, context: RequestContext): void {
    session.status = 'expired'
    session.url = null
    const intent = session.payment_intent ? this.paymentIntents.get(session.payment_intent as string) : undefined
    if (intent && intent.status === 'requires_payment_method') {
      intent.status = 'canceled'
      intent.canceled_at = this.seconds()
      intent.cancellation_reason = 'abandoned'
    }
    this.events.emit('checkout.session.expired', session, context)
  }

  // Stripe expires an open session once `expires_at` has passed; the stand-in checks on every read and on a timer.
  expireDue(): void {
    const now = this.seconds()
    for (const { session } of this.sessions.values()) {
      if (session.status === 'open' && session.expires_at <= now) this.expire(session, CUSTOMER_ACTION)
    }
  }

  // What submitting the hosted payment page does: confirm the session's PaymentIntent with the card.
  payCheckoutSession(id: string, card: CheckedCard, customer: CustomerEntry): PaymentAttempt {
    const record = this.sessionRecord(id)
    const { session } = record
    if (session.status !== 'open') {
      throw invalidRequest(`This Checkout Session is no longer open (status \`${session.status}\`).`)
    }
    const intent = this.intentFor(record, customer)
    const paymentMethod = this.savePaymentMethod(card, customer)
    const outcome = card.outcome
    const charge = chargeForAttempt(intent, card, customer, paymentMethod, this.seconds())
    this.charges.set(charge.id, charge)
    intent.latest_charge = charge.id

    if (outcome.result === 'declined') {
      intent.status = 'requires_payment_method'
      intent.payment_method = null
      intent.last_payment_error = {
        charge: charge.id,
        code: outcome.code as NonNullable<PaymentIntentObject['last_payment_error']>['code'],
        decline_code: outcome.declineCode,
        doc_url: `https://stripe.com/docs/error-codes/${outcome.code.replaceAll('_', '-')}`,
        message: outcome.message,
        type: 'card_error',
      }
      this.events.emit('payment_intent.payment_failed', intent, CUSTOMER_ACTION)
      return { result: 'declined', session, paymentIntent: intent, message: outcome.message, declineCode: outcome.declineCode }
    }

    this.succeed(intent, charge, paymentMethod)
    // A card paid with `setup_future_usage` is attached to the session's Customer, if it has one
    // (Checkout attaches it then, and leaves it unattached otherwise).
    const futureUsage = record.paymentIntentData.setupFutureUsage
    if (futureUsage && typeof session.customer === 'string') {
      this.paymentMethod(paymentMethod).customer = session.customer
      intent.customer = session.customer
      intent.setup_future_usage = futureUsage
      charge.customer = session.customer
    }
    session.status = 'complete'
    session.payment_status = 'paid'
    session.url = null
    session.customer_details = {
      business_name: null,
      individual_name: null,
      address: postalAddress(customer),
      email: customer.email,
      name: customer.name || null,
      phone: null,
      tax_exempt: 'none',
      tax_ids: [],
    }
    this.events.emit('payment_intent.succeeded', intent, CUSTOMER_ACTION)
    this.events.emit('checkout.session.completed', session, CUSTOMER_ACTION)
    return { result: 'succeeded', session, paymentIntent: intent }
  }

  private succeed(intent: PaymentIntentObject, charge: ChargeObject, paymentMethod: string): void {
    intent.status = 'succeeded'
    intent.amount_received = intent.amount
    intent.payment_method = paymentMethod
    intent.last_payment_error = null
    this.book.add(null, {
      id: charge.balance_transaction as string,
      amount: charge.amount,
      currency: charge.currency,
      type: 'charge',
      source: charge.id,
      description: charge.description,
      reportingCategory: 'charge',
    })
  }

  /**
   * `POST /v1/payment_intents` with `confirm=true` and a test PaymentMethod: the server-side payment
   * Stripe's test mode allows without a payment page. A declined test method answers 402, as Stripe does.
   */
  createPaymentIntent(input: PaymentIntentInput, context: RequestContext): PaymentIntentObject {
    if (input.amount < minimumCharge(input.currency)) {
      throw invalidRequest(`Amount must be at least ${formatAmount(minimumCharge(input.currency), input.currency)} ${input.currency}`, {
        code: 'amount_too_small',
        param: 'amount',
      })
    }
    const card = this.cardForPayment(input)
    const intent = this.newIntent({
      amount: input.amount,
      currency: input.currency,
      description: input.description,
      metadata: input.metadata,
      receiptEmail: input.receiptEmail,
      transferGroup: input.transferGroup,
    })
    intent.customer = input.customer
    const outcome = input.offSession ? card.offSession : card.outcome
    const charge = chargeForAttempt(
      intent,
      { ...card, outcome },
      { email: input.receiptEmail ?? '', name: '', postalCode: '' },
      input.paymentMethod,
      this.seconds(),
    )
    charge.customer = input.customer
    this.charges.set(charge.id, charge)
    intent.latest_charge = charge.id
    if (outcome.result === 'declined') {
      intent.status = 'requires_payment_method'
      intent.last_payment_error = {
        charge: charge.id,
        code: outcome.code as NonNullable<PaymentIntentObject['last_payment_error']>['code'],
        decline_code: outcome.declineCode,
        message: outcome.message,
        type: 'card_error',
      }
      this.events.emit('payment_intent.payment_failed', intent, context)
      throw new StripeApiError(402, {
        type: 'card_error',
        code: outcome.code,
        decline_code: outcome.declineCode,
        message: outcome.message,
        payment_intent: structuredClone(intent),
      })
    }
    this.succeed(intent, charge, input.paymentMethod)
    this.events.emit('payment_intent.succeeded', intent, context)
    return intent
  }

  /**
   * The card a server-side payment charges: a test PaymentMethod stands for its card with any Customer;
   * a saved one must be attached to the Customer named (Stripe's rules; refusals' wording from memory).
   */
  private cardForPayment(input: PaymentIntentInput): CheckedCard {
    if (input.customer !== null) this.customer(input.customer)
    const test = testPaymentMethod(input.paymentMethod)
    if (test) return test
    const saved = this.paymentMethods.get(input.paymentMethod)
    if (!saved) throw resourceMissing('payment_method', input.paymentMethod, 'payment_method')
    if (saved.method.customer === null) {
      throw invalidRequest(
        'The provided PaymentMethod was previously used with a PaymentIntent without Customer attachment, shared with a connected account without Customer attachment, or was detached from a Customer. It may not be used again. To use a PaymentMethod multiple times, you must attach it to a Customer first.',
        { param: 'payment_method' },
      )
    }
    if (saved.method.customer !== input.customer) {
      throw invalidRequest(`The provided PaymentMethod ${input.paymentMethod} does not belong to the Customer given.`, {
        param: 'payment_method',
      })
    }
    return saved.card
  }

  // Every card entered on the hosted page becomes a PaymentMethod, attached to no one until a payment sets it up.
  private savePaymentMethod(card: CheckedCard, customer: CustomerEntry): string {
    const method: PaymentMethodObject = {
      id: newId.paymentMethod(),
      object: 'payment_method',
      billing_details: billingDetails(customer),
      card: cardDetails(card),
      created: this.seconds(),
      customer: null,
      livemode: false,
      metadata: {},
      type: 'card',
    }
    this.paymentMethods.set(method.id, { method, card })
    return method.id
  }

  // A session keeps one PaymentIntent across attempts, so a retry after a decline reuses it.
  private intentFor(record: SessionRecord, customer: CustomerEntry): PaymentIntentObject {
    const { session } = record
    const existing = session.payment_intent ? this.paymentIntents.get(session.payment_intent as string) : undefined
    if (existing) return existing
    const intent = this.newIntent({
      amount: session.amount_total ?? 0,
      currency: session.currency ?? 'usd',
      description: record.paymentIntentData.description,
      metadata: record.paymentIntentData.metadata,
      receiptEmail: record.paymentIntentData.receiptEmail ?? (customer.email || null),
      transferGroup: record.paymentIntentData.transferGroup,
    })
    session.payment_intent = intent.id
    return intent
  }

  private newIntent(input: Omit<PaymentIntentInput, 'paymentMethod' | 'customer' | 'offSession'>): PaymentIntentObject {
    const id = newId.paymentIntent()
    const intent: PaymentIntentObject = {
      id,
      object: 'payment_intent',
      amount: input.amount,
      amount_capturable: 0,
      amount_received: 0,
      application: null,
      application_fee_amount: null,
      automatic_payment_methods: null,
      canceled_at: null,
      cancellation_reason: null,
      capture_method: 'automatic_async',
      client_secret: `${id}_secret_${newId.secret()}`,
      confirmation_method: 'automatic',
      created: this.seconds(),
      currency: input.currency,
      customer: null,
      description: input.description,
      last_payment_error: null,
      latest_charge: null,
      livemode: false,
      metadata: { ...input.metadata },
      next_action: null,
      on_behalf_of: null,
      payment_method: null,
      payment_method_types: ['card'],
      processing: null,
      receipt_email: input.receiptEmail,
      review: null,
      setup_future_usage: null,
      shipping: null,
      source: null,
      statement_descriptor: null,
      statement_descriptor_suffix: null,
      status: 'requires_payment_method',
      transfer_group: input.transferGroup,
    }
    this.paymentIntents.set(id, intent)
    return intent
  }

  paymentIntent(id: string): PaymentIntentObject {
    const intent = this.paymentIntents.get(id)
    if (!intent) throw resourceMissing('payment_intent', id, 'intent')
    return intent
  }

  charge(id: string): ChargeObject {
    const charge = this.charges.get(id)
    if (!charge) throw resourceMissing('charge', id, 'charge')
    return charge
  }

  refund(id: string): RefundObject {
    const refund = this.refunds.get(id)
    if (!refund) throw resourceMissing('refund', id, 'refund')
    return refund
  }

  event(id: string): EventObject {
    const event = this.events.get(id)
    if (!event) throw resourceMissing('event', id, 'id')
    return event
  }

  createRefund(input: RefundInput, context: RequestContext): RefundObject {
    const charge = this.refundableCharge(input)
    const unrefunded = charge.amount - charge.amount_refunded
    if (unrefunded === 0) {
      throw invalidRequest(`Charge ${charge.id} has already been refunded.`, { code: 'charge_already_refunded' })
    }
    const amount = input.amount ?? unrefunded
    if (amount > unrefunded) {
      // Stripe's wording for a refund above what is left on the charge (from memory).
      throw invalidRequest(
        `Refund amount (${formatAmount(amount, charge.currency)}) is greater than unrefunded amount on charge (${formatAmount(unrefunded, charge.currency)})`,
        { param: 'amount' },
      )
    }
    const refund: RefundObject = {
      id: newId.refund(),
      object: 'refund',
      amount,
      balance_transaction: newId.balanceTransaction(),
      charge: charge.id,
      created: this.seconds(),
      currency: charge.currency,
      metadata: input.metadata,
      payment_intent: charge.payment_intent,
      reason: input.reason,
      receipt_number: null,
      source_transfer_reversal: null,
      // Card refunds in test mode succeed at once.
      status: 'succeeded',
      transfer_reversal: null,
    }
    this.refunds.set(refund.id, refund)
    this.book.add(null, {
      id: refund.balance_transaction as string,
      amount: -amount,
      currency: refund.currency,
      type: 'refund',
      source: refund.id,
      reportingCategory: 'refund',
    })
    charge.amount_refunded += amount
    charge.refunded = charge.amount_refunded === charge.amount
    this.events.emit('charge.refunded', charge, context)
    return refund
  }

  private refundableCharge(input: RefundInput): ChargeObject {
    if (input.paymentIntent === null && input.charge === null) {
      throw invalidRequest('One of the following params should be provided for this request: payment_intent or charge.', {
        code: 'parameter_missing',
      })
    }
    let charge: ChargeObject | undefined
    if (input.paymentIntent !== null) {
      const intent = this.paymentIntents.get(input.paymentIntent)
      if (!intent) throw resourceMissing('payment_intent', input.paymentIntent, 'payment_intent')
      const latest = intent.latest_charge ? this.charges.get(intent.latest_charge as string) : undefined
      if (intent.status !== 'succeeded' || !latest || latest.status !== 'succeeded') {
        throw invalidRequest(`This PaymentIntent (${intent.id}) does not have a successful charge to refund.`, {
          param: 'payment_intent',
        })
      }
      charge = latest
    }
    if (input.charge !== null) {
      const named = this.charges.get(input.charge)
      if (!named) throw resourceMissing('charge', input.charge, 'charge')
      if (charge && charge.id !== named.id) {
        throw invalidRequest(`Charge ${named.id} does not belong to PaymentIntent ${input.paymentIntent}.`, { param: 'charge' })
      }
      if (named.status !== 'succeeded') {
        throw invalidRequest(`Charge ${named.id} has not succeeded and cannot be refunded.`, { param: 'charge' })
      }
      charge = named
    }
    return charge as ChargeObject
  }
}
