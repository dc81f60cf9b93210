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
  type EventObject,
  type LineItemObject,
  type PaymentIntentObject,
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
  submitType: SessionObject['submit_type']
  paymentIntentData: {
    metadata: Record<string, string>
    description: string | null
    receiptEmail: string | null
    transferGroup: string | null
  }
  expiresAt: number | null
}

/** A PaymentIntent made and confirmed through the API with one of Stripe's test PaymentMethods (`pm_card_visa`). */
export interface PaymentIntentInput {
  amount: number
  currency: string
  paymentMethod: string
  metadata: Record<string, string>
  description: string | null
  receiptEmail: string | null
  transferGroup: string | null
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

interface SessionRecord {
  session: SessionObject
  lineItems: LineItemObject[]
  paymentIntentData: CheckoutSessionInput['paymentIntentData']
}

// The hosted page asks for the postal code only, as Stripe's does for most card countries.
function postalAddress(customer: CustomerEntry) {
  return { city: null, country: null, line1: null, line2: null, postal_code: customer.postalCode, state: null }
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
    billing_details: {
      address: postalAddress(customer),
      email: customer.email,
      name: customer.name || null,
      phone: null,
      tax_id: null,
    },
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
    payment_method_details: {
      type: 'card',
      card: {
        brand: card.brand,
        country: 'US',
        exp_month: card.expMonth,
        exp_year: card.expYear,
        funding: card.funding,
        last4: card.last4,
      },
    },
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
}

export class TestModeAccount {
  private sessions = new Map<string, SessionRecord>()
  private paymentIntents = new Map<string, PaymentIntentObject>()
  private charges = new Map<string, ChargeObject>()
  private refunds = new Map<string, RefundObject>()

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
    }
  }

  restore(state: PlatformSnapshot): void {
    this.sessions = new Map(state.sessions)
    this.paymentIntents = new Map(state.paymentIntents)
    this.charges = new Map(state.charges)
    this.refunds = new Map(state.refunds)
  }

  private seconds(): number {
    return Math.floor(this.now() / 1000)
  }

  createCheckoutSession(input: CheckoutSessionInput): SessionObject {
    const created = this.seconds()
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
      customer: null,
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
    const paymentMethod = newId.paymentMethod()
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
    const card = testPaymentMethod(input.paymentMethod)
    if (!card) throw resourceMissing('payment_method', input.paymentMethod, 'payment_method')
    const intent = this.newIntent({
      amount: input.amount,
      currency: input.currency,
      description: input.description,
      metadata: input.metadata,
      receiptEmail: input.receiptEmail,
      transferGroup: input.transferGroup,
    })
    const charge = chargeForAttempt(
      intent,
      card,
      { email: input.receiptEmail ?? '', name: '', postalCode: '' },
      input.paymentMethod,
      this.seconds(),
    )
    this.charges.set(charge.id, charge)
    intent.latest_charge = charge.id
    if (card.outcome.result === 'declined') {
      intent.status = 'requires_payment_method'
      intent.last_payment_error = {
        charge: charge.id,
        code: card.outcome.code as NonNullable<PaymentIntentObject['last_payment_error']>['code'],
        decline_code: card.outcome.declineCode,
        message: card.outcome.message,
        type: 'card_error',
      }
      this.events.emit('payment_intent.payment_failed', intent, context)
      throw new StripeApiError(402, {
        type: 'card_error',
        code: card.outcome.code,
        decline_code: card.outcome.declineCode,
        message: card.outcome.message,
      })
    }
    this.succeed(intent, charge, input.paymentMethod)
    this.events.emit('payment_intent.succeeded', intent, context)
    return intent
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

  private newIntent(input: Omit<PaymentIntentInput, 'paymentMethod'>): PaymentIntentObject {
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
