// The API objects the stand-in keeps, in Stripe's wire shape. Each type picks its fields from the stripe
// SDK's own type definitions, so a misspelt field or a wrong value type fails the typecheck.
import { randomBytes } from 'node:crypto'
import type Stripe from 'stripe'

export type SessionObject = Pick<
  Stripe.Checkout.Session,
  | 'id'
  | 'object'
  | 'after_expiration'
  | 'allow_promotion_codes'
  | 'allowed_payment_method_types'
  | 'amount_subtotal'
  | 'amount_total'
  | 'billing_address_collection'
  | 'cancel_url'
  | 'client_reference_id'
  | 'client_secret'
  | 'consent'
  | 'consent_collection'
  | 'created'
  | 'currency'
  | 'custom_fields'
  | 'customer'
  | 'customer_creation'
  | 'customer_details'
  | 'customer_email'
  | 'discounts'
  | 'expires_at'
  | 'invoice'
  | 'livemode'
  | 'locale'
  | 'metadata'
  | 'mode'
  | 'payment_intent'
  | 'payment_link'
  | 'payment_method_collection'
  | 'payment_method_types'
  | 'payment_status'
  | 'recovered_from'
  | 'setup_intent'
  | 'shipping_address_collection'
  | 'shipping_cost'
  | 'shipping_options'
  | 'status'
  | 'submit_type'
  | 'subscription'
  | 'success_url'
  | 'total_details'
  | 'ui_mode'
  | 'url'
>

export type PaymentIntentObject = Pick<
  Stripe.PaymentIntent,
  | 'id'
  | 'object'
  | 'amount'
  | 'amount_capturable'
  | 'amount_received'
  | 'application'
  | 'application_fee_amount'
  | 'automatic_payment_methods'
  | 'canceled_at'
  | 'cancellation_reason'
  | 'capture_method'
  | 'client_secret'
  | 'confirmation_method'
  | 'created'
  | 'currency'
  | 'customer'
  | 'description'
  | 'last_payment_error'
  | 'latest_charge'
  | 'livemode'
  | 'metadata'
  | 'next_action'
  | 'on_behalf_of'
  | 'payment_method'
  | 'payment_method_types'
  | 'processing'
  | 'receipt_email'
  | 'review'
  | 'setup_future_usage'
  | 'shipping'
  | 'source'
  | 'statement_descriptor'
  | 'statement_descriptor_suffix'
  | 'status'
  | 'transfer_group'
>

export type CardDetails = Pick<
  Stripe.Charge.PaymentMethodDetails.Card,
  'brand' | 'country' | 'exp_month' | 'exp_year' | 'funding' | 'last4'
>

export type ChargeObject = Pick<
  Stripe.Charge,
  | 'id'
  | 'object'
  | 'amount'
  | 'amount_captured'
  | 'amount_refunded'
  | 'application'
  | 'application_fee'
  | 'application_fee_amount'
  | 'balance_transaction'
  | 'billing_details'
  | 'captured'
  | 'created'
  | 'currency'
  | 'customer'
  | 'description'
  | 'disputed'
  | 'failure_code'
  | 'failure_message'
  | 'livemode'
  | 'metadata'
  | 'outcome'
  | 'paid'
  | 'payment_intent'
  | 'payment_method'
  | 'receipt_email'
  | 'receipt_url'
  | 'refunded'
  | 'status'
  | 'transfer_group'
> & { payment_method_details: { type: 'card'; card: CardDetails } }

export type CustomerObject = Pick<Stripe.Customer, 'id' | 'object' | 'created' | 'description' | 'email' | 'livemode' | 'metadata' | 'name'>

export type PaymentMethodObject = Pick<
  Stripe.PaymentMethod,
  'id' | 'object' | 'billing_details' | 'created' | 'customer' | 'livemode' | 'metadata' | 'type'
> & { card: CardDetails }

export type RefundObject = Pick<
  Stripe.Refund,
  | 'id'
  | 'object'
  | 'amount'
  | 'balance_transaction'
  | 'charge'
  | 'created'
  | 'currency'
  | 'metadata'
  | 'payment_intent'
  | 'reason'
  | 'receipt_number'
  | 'source_transfer_reversal'
  | 'status'
  | 'transfer_reversal'
>

export type LineItemObject = Pick<
  Stripe.LineItem,
  'id' | 'object' | 'amount_discount' | 'amount_subtotal' | 'amount_tax' | 'amount_total' | 'currency' | 'description' | 'quantity'
> & {
  price: Pick<
    Stripe.Price,
    | 'id'
    | 'object'
    | 'active'
    | 'billing_scheme'
    | 'created'
    | 'currency'
    | 'livemode'
    | 'lookup_key'
    | 'metadata'
    | 'nickname'
    | 'product'
    | 'recurring'
    | 'tax_behavior'
    | 'tiers_mode'
    | 'transform_quantity'
    | 'type'
    | 'unit_amount'
  > & { unit_amount_decimal: string } // a decimal string on the wire; the SDK types it as its Decimal class
}

export type AccountObject = Pick<
  Stripe.Account,
  | 'id'
  | 'object'
  | 'business_profile'
  | 'business_type'
  | 'capabilities'
  | 'charges_enabled'
  | 'country'
  | 'created'
  | 'default_currency'
  | 'details_submitted'
  | 'email'
  | 'metadata'
  | 'payouts_enabled'
  | 'requirements'
  | 'tos_acceptance'
  | 'type'
> & { external_accounts: { object: 'list'; data: BankAccountObject[]; has_more: false; url: string } }

export type BankAccountObject = Pick<
  Stripe.BankAccount,
  | 'id'
  | 'object'
  | 'account_holder_name'
  | 'account_holder_type'
  | 'bank_name'
  | 'country'
  | 'currency'
  | 'last4'
  | 'routing_number'
  | 'status'
> & { account: string; default_for_currency: boolean }

export type AccountLinkObject = Pick<Stripe.AccountLink, 'object' | 'created' | 'expires_at' | 'url'>

export type TransferReversalObject = Pick<
  Stripe.TransferReversal,
  | 'id'
  | 'object'
  | 'amount'
  | 'balance_transaction'
  | 'created'
  | 'currency'
  | 'destination_payment_refund'
  | 'metadata'
  | 'source_refund'
  | 'transfer'
>

export type TransferObject = Pick<
  Stripe.Transfer,
  | 'id'
  | 'object'
  | 'amount'
  | 'amount_reversed'
  | 'balance_transaction'
  | 'created'
  | 'currency'
  | 'description'
  | 'destination'
  | 'destination_payment'
  | 'livemode'
  | 'metadata'
  | 'reversed'
  | 'source_transaction'
  | 'source_type'
  | 'transfer_group'
> & { reversals: { object: 'list'; data: TransferReversalObject[]; has_more: false; total_count: number; url: string } }

export type BalanceTransactionObject = Pick<
  Stripe.BalanceTransaction,
  | 'id'
  | 'object'
  | 'amount'
  | 'available_on'
  | 'created'
  | 'currency'
  | 'description'
  | 'exchange_rate'
  | 'fee'
  | 'fee_details'
  | 'net'
  | 'reporting_category'
  | 'source'
  | 'status'
  | 'type'
>

export type PayoutObject = Pick<
  Stripe.Payout,
  | 'id'
  | 'object'
  | 'amount'
  | 'arrival_date'
  | 'automatic'
  | 'balance_transaction'
  | 'created'
  | 'currency'
  | 'description'
  | 'destination'
  | 'failure_balance_transaction'
  | 'failure_code'
  | 'failure_message'
  | 'livemode'
  | 'metadata'
  | 'method'
  | 'source_type'
  | 'statement_descriptor'
  | 'status'
  | 'type'
>

// The event types the app's endpoints are subscribed to; the stand-in sends no others. Events about a
// connected account (its updates, its payouts) carry `account` and go to the Connect endpoint.
export type WebhookEventType =
  | 'checkout.session.completed'
  | 'checkout.session.expired'
  | 'payment_intent.succeeded'
  | 'payment_intent.payment_failed'
  | 'charge.refunded'
  | 'account.updated'
  | 'transfer.created'
  | 'transfer.reversed'
  | 'payout.created'
  | 'payout.paid'
  | 'payout.failed'

export type EventDataObject = SessionObject | PaymentIntentObject | ChargeObject | AccountObject | TransferObject | PayoutObject

export type EventObject = Pick<Stripe.Event, 'id' | 'object' | 'api_version' | 'created' | 'livemode' | 'pending_webhooks' | 'request'> & {
  type: WebhookEventType
  account?: string
  data: { object: EventDataObject; previous_attributes?: Record<string, unknown> }
}

const BASE62 = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz'

function base62(length: number): string {
  const bytes = randomBytes(length)
  let text = ''
  for (const byte of bytes) text += BASE62[byte % 62]
  return text
}

// Id prefixes and lengths as Stripe's test-mode ids look (e.g. `cs_test_` + 58, `pi_` + 24), from memory.
export const newId = {
  checkoutSession: () => `cs_test_${base62(58)}`,
  paymentIntent: () => `pi_${base62(24)}`,
  charge: () => `ch_${base62(24)}`,
  refund: () => `re_${base62(24)}`,
  event: () => `evt_${base62(24)}`,
  paymentMethod: () => `pm_${base62(24)}`,
  customer: () => `cus_${base62(14)}`,
  balanceTransaction: () => `txn_${base62(24)}`,
  lineItem: () => `li_${base62(24)}`,
  price: () => `price_${base62(24)}`,
  product: () => `prod_${base62(14)}`,
  request: () => `req_${base62(14)}`,
  account: () => `acct_1${base62(15)}`,
  accountLink: () => base62(32),
  bankAccount: () => `ba_${base62(24)}`,
  transfer: () => `tr_${base62(24)}`,
  transferReversal: () => `trr_${base62(24)}`,
  destinationPayment: () => `py_${base62(24)}`,
  payout: () => `po_${base62(24)}`,
  secret: () => base62(24),
}
