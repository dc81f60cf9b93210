// Stripe Connect in test mode: Express connected accounts and their onboarding links, transfers from
// the platform's balance (tied to a charge with `source_transaction`), transfer reversals, and each
// connected account's automatic payouts to its bank. The rules are Stripe's as its API reference and
// Connect guides describe them; where a detail (a message, a test value) is from memory, it says so.
import type { TestModeAccount } from './account'
import type { BalanceBook } from './balances'
import { formatAmount, isKnownCurrency } from './currency'
import { invalidRequest, resourceMissing, StripeApiError } from './errors'
import { CUSTOMER_ACTION, type EventLog, type RequestContext } from './events'
import {
  newId,
  type AccountLinkObject,
  type AccountObject,
  type BankAccountObject,
  type PayoutObject,
  type TransferObject,
  type TransferReversalObject,
} from './objects'

// Account links are short-lived and work once (Connect onboarding docs); Stripe's lifetime is a few
// minutes (from memory: 300 s).
const LINK_LIFETIME_S = 300
// The stand-in pays an account's balance out a moment after it changes, where Stripe's default
// schedule pays daily; the money reaches the bank a day later.
const PAYOUT_ARRIVAL_S = 24 * 60 * 60

/**
 * Test values of the hosted onboarding page, as Stripe's Connect testing guide gives them (from
 * memory): date of birth 1901-01-01 verifies, 1900-01-01 is refused as a listed person, any other
 * date leaves identity unverified until a document is given; the document `file_identity_document_success`
 * verifies and `file_identity_document_failure` fails; routing number 110000000 with account
 * 000123456789 pays out, 000111111116 is a closed account whose payouts fail.
 */
export const ONBOARDING_TEST_VALUES = {
  dobVerified: '1901-01-01',
  dobRejected: '1900-01-01',
  documentVerified: 'file_identity_document_success',
  documentFailed: 'file_identity_document_failure',
  routingNumber: '110000000',
  accountNumber: '000123456789',
  closedAccountNumber: '000111111116',
} as const

// What a new Express account must give before it may receive transfers (the fields Stripe lists in
// `requirements.currently_due` for an individual in the US, abridged, from memory).
const INITIAL_DUE = [
  'business_type',
  'external_account',
  'individual.address.line1',
  'individual.address.postal_code',
  'individual.dob.day',
  'individual.dob.month',
  'individual.dob.year',
  'individual.first_name',
  'individual.last_name',
  'individual.ssn_last_4',
  'tos_acceptance.date',
  'tos_acceptance.ip',
]
const DOCUMENT_DUE = 'individual.verification.document'

export interface AccountInput {
  type: 'express'
  country: string
  email: string | null
  businessName: string | null
  productDescription: string | null
  transfersRequested: boolean
  metadata: Record<string, string>
  defaultCurrency: string | null
}

export interface AccountLinkInput {
  account: string
  type: 'account_onboarding' | 'account_update'
  refreshUrl: string
  returnUrl: string
}

interface LinkRecord {
  account: string
  type: AccountLinkInput['type']
  refreshUrl: string
  returnUrl: string
  expiresAt: number
  used: boolean
}

interface PayoutRecord {
  account: string
  payout: PayoutObject
}

/** What the person types on the hosted onboarding page. */
export interface OnboardingForm {
  businessType: string
  firstName: string
  lastName: string
  dob: string
  ssnLast4: string
  addressLine1: string
  postalCode: string
  routingNumber: string
  accountNumber: string
  tosAccepted: boolean
  document: string
  ip: string
  userAgent: string
}

export type OnboardingOutcome = { ok: true; returnUrl: string } | { ok: false; field: keyof OnboardingForm; message: string }

export interface TransferInput {
  amount: number
  currency: string
  destination: string
  transferGroup: string | null
  sourceTransaction: string | null
  description: string | null
  metadata: Record<string, string>
}

export interface ConnectSnapshot {
  accounts: [string, AccountObject][]
  links: [string, LinkRecord][]
  transfers: [string, TransferObject][]
  payouts: [string, PayoutRecord][]
}

export class ConnectBook {
  private accounts = new Map<string, AccountObject>()
  private links = new Map<string, LinkRecord>()
  private transfers = new Map<string, TransferObject>()
  private payouts = new Map<string, PayoutRecord>()

  constructor(
    private readonly options: {
      now: () => number
      platform: TestModeAccount
      book: BalanceBook
      events: EventLog
      onboardingPageUrl: (token: string) => string
    },
  ) {}

  private seconds(): number {
    return Math.floor(this.options.now() / 1000)
  }

  snapshot(): ConnectSnapshot {
    return { accounts: [...this.accounts], links: [...this.links], transfers: [...this.transfers], payouts: [...this.payouts] }
  }

  restore(state: ConnectSnapshot): void {
    this.accounts = new Map(state.accounts)
    this.links = new Map(state.links)
    this.transfers = new Map(state.transfers)
    this.payouts = new Map(state.payouts)
  }

  createAccount(input: AccountInput): AccountObject {
    const id = newId.account()
    const account: AccountObject = {
      id,
      object: 'account',
      business_profile: {
        mcc: null,
        minority_owned_business_designation: null,
        name: input.businessName,
        product_description: input.productDescription,
        specified_commercial_transactions_act_url: null,
        support_address: null,
        support_email: null,
        support_phone: null,
        support_url: null,
        url: null,
      },
      business_type: null,
      capabilities: input.transfersRequested ? { transfers: 'inactive' } : {},
      charges_enabled: false,
      country: input.country,
      created: this.seconds(),
      default_currency: input.defaultCurrency ?? (input.country === 'CA' ? 'cad' : 'usd'),
      details_submitted: false,
      email: input.email,
      external_accounts: { object: 'list', data: [], has_more: false, url: `/v1/accounts/${id}/external_accounts` },
      metadata: input.metadata,
      payouts_enabled: false,
      requirements: {
        alternatives: [],
        current_deadline: null,
        currently_due: [...INITIAL_DUE],
        disabled_reason: 'requirements.past_due',
        errors: [],
        eventually_due: [...INITIAL_DUE],
        past_due: [...INITIAL_DUE],
        pending_verification: [],
      },
      tos_acceptance: { date: null, ip: null, user_agent: null },
      type: 'express',
    }
    this.accounts.set(id, account)
    return account
  }

  account(id: string): AccountObject {
    const account = this.accounts.get(id)
    // Stripe answers an account the platform does not control as missing, naming the path parameter.
    if (!account) throw resourceMissing('account', id, 'account')
    return account
  }

  createAccountLink(input: AccountLinkInput): AccountLinkObject {
    const account = this.accounts.get(input.account)
    if (!account) throw resourceMissing('account', input.account, 'account')
    if (input.type === 'account_update' && !account.details_submitted) {
      // Stripe's refusal of an update link before onboarding is done (wording approximated).
      throw invalidRequest('You cannot create `account_update` type Account Links for accounts that have not completed onboarding.', {
        param: 'type',
      })
    }
    const token = newId.accountLink()
    const created = this.seconds()
    this.links.set(token, { ...input, expiresAt: created + LINK_LIFETIME_S, used: false })
    return { object: 'account_link', created, expires_at: created + LINK_LIFETIME_S, url: this.options.onboardingPageUrl(token) }
  }

  /** The link behind an onboarding page address, or why it no longer opens (Stripe sends the person to `refresh_url`). */
  openLink(token: string): { link: LinkRecord; account: AccountObject } | { gone: string | null } {
    const link = this.links.get(token)
    if (!link) return { gone: null }
    if (link.used || link.expiresAt < this.seconds()) return { gone: link.refreshUrl }
    return { link, account: this.account(link.account) }
  }

  /** What the hosted onboarding page asks for this account now: everything, or only what is still due. */
  asksFor(account: AccountObject): 'everything' | 'document' | 'nothing' {
    const due = account.requirements?.currently_due ?? []
    if (!account.details_submitted) return 'everything'
    if (due.includes(DOCUMENT_DUE)) return 'document'
    return 'nothing'
  }

  submitOnboarding(token: string, form: OnboardingForm): OnboardingOutcome {
    const opened = this.openLink(token)
    if ('gone' in opened) return { ok: false, field: 'tosAccepted', message: 'This onboarding link has expired. Go back and start again.' }
    const { link, account } = opened
    const previous = structuredClone({
      requirements: account.requirements,
      capabilities: account.capabilities,
      payouts_enabled: account.payouts_enabled,
      details_submitted: account.details_submitted,
    })
    const asks = this.asksFor(account)
    if (asks === 'everything') {
      const refused = checkEverything(form)
      if (refused) return refused
      this.takeDetails(account, form)
    } else if (asks === 'document') {
      if (!form.document.trim()) return { ok: false, field: 'document', message: 'Give the identity document.' }
      this.takeDocument(account, form.document.trim())
    }
    link.used = true
    this.options.events.emit('account.updated', account, CUSTOMER_ACTION, { account: account.id, previous })
    return { ok: true, returnUrl: link.returnUrl }
  }

  private takeDetails(account: AccountObject, form: OnboardingForm): void {
    account.business_type = form.businessType === 'company' ? 'company' : 'individual'
    account.details_submitted = true
    account.tos_acceptance = { date: this.seconds(), ip: form.ip, user_agent: form.userAgent }
    const bank: BankAccountObject = {
      id: newId.bankAccount(),
      object: 'bank_account',
      account: account.id,
      account_holder_name: `${form.firstName} ${form.lastName}`,
      account_holder_type: account.business_type === 'company' ? 'company' : 'individual',
      bank_name: 'STRIPE TEST BANK',
      country: account.country ?? 'US',
      currency: account.default_currency ?? 'usd',
      default_for_currency: true,
      last4: form.accountNumber.slice(-4),
      routing_number: form.routingNumber,
      status: 'new',
    }
    account.external_accounts.data = [bank]
    if (form.dob === ONBOARDING_TEST_VALUES.dobRejected) {
      this.restrict(account, [], 'rejected.listed')
    } else if (form.dob === ONBOARDING_TEST_VALUES.dobVerified) {
      this.enable(account)
    } else {
      this.restrict(account, [DOCUMENT_DUE], 'requirements.past_due')
    }
  }

  private takeDocument(account: AccountObject, document: string): void {
    if (document === ONBOARDING_TEST_VALUES.documentVerified) {
      this.enable(account)
      return
    }
    this.restrict(account, [DOCUMENT_DUE], 'requirements.past_due', [
      {
        code: 'verification_document_failed_other',
        reason: 'The document could not be verified.',
        requirement: DOCUMENT_DUE,
      },
    ])
  }

  private enable(account: AccountObject): void {
    account.requirements = {
      alternatives: [],
      current_deadline: null,
      currently_due: [],
      disabled_reason: null,
      errors: [],
      eventually_due: [],
      past_due: [],
      pending_verification: [],
    }
    if (account.capabilities && 'transfers' in account.capabilities) account.capabilities.transfers = 'active'
    account.payouts_enabled = true
  }

  private restrict(
    account: AccountObject,
    due: string[],
    reason: NonNullable<NonNullable<AccountObject['requirements']>['disabled_reason']>,
    errors: NonNullable<NonNullable<AccountObject['requirements']>['errors']> = [],
  ): void {
    account.requirements = {
      alternatives: [],
      current_deadline: null,
      currently_due: due,
      disabled_reason: reason,
      errors,
      eventually_due: due,
      past_due: due,
      pending_verification: [],
    }
    if (account.capabilities && 'transfers' in account.capabilities) account.capabilities.transfers = 'inactive'
    account.payouts_enabled = false
  }

  createTransfer(input: TransferInput, context: RequestContext): TransferObject {
    if (!isKnownCurrency(input.currency)) throw invalidRequest(`Invalid currency: ${input.currency}.`, { param: 'currency' })
    const destination = this.accounts.get(input.destination)
    // Wording of Stripe's refusals here is from memory.
    if (!destination)
      throw invalidRequest(`No such destination: '${input.destination}'`, { code: 'resource_missing', param: 'destination' })
    if (destination.capabilities?.transfers !== 'active') {
      throw invalidRequest(
        'Your destination account needs to have at least one of the following capabilities enabled: transfers, crypto_transfers, legacy_payments',
        { code: 'insufficient_capabilities_for_transfer', param: 'destination' },
      )
    }
    if (input.sourceTransaction !== null) {
      const charge = this.options.platform.charge(input.sourceTransaction)
      if (charge.status !== 'succeeded') {
        throw invalidRequest(`The source transaction ${charge.id} has not succeeded.`, { param: 'source_transaction' })
      }
      if (charge.currency !== input.currency) {
        throw invalidRequest(
          `The currency of source_transaction's balance transaction (${charge.currency}) must be the same as the transfer currency (${input.currency}).`,
          {
            param: 'currency',
          },
        )
      }
      const left = charge.amount - charge.amount_refunded - this.transferredFrom(charge.id)
      if (input.amount > left) {
        throw invalidRequest(
          `The transfer amount (${formatAmount(input.amount, input.currency)}) exceeds what is left of source transaction ${charge.id} (${formatAmount(Math.max(0, left), input.currency)}).`,
          { param: 'amount' },
        )
      }
    } else if ((this.options.book.available(null).get(input.currency) ?? 0) < input.amount) {
      throw new StripeApiError(400, {
        type: 'invalid_request_error',
        code: 'balance_insufficient',
        message: 'You have insufficient available funds in your Stripe account. Try adding funds directly to your available balance.',
      })
    }
    const id = newId.transfer()
    const payment = newId.destinationPayment()
    const platformEntry = this.options.book.add(null, {
      amount: -input.amount,
      currency: input.currency,
      type: 'transfer',
      source: id,
      description: input.description,
      reportingCategory: 'transfer',
    })
    this.options.book.add(destination.id, {
      amount: input.amount,
      currency: input.currency,
      type: 'payment',
      source: payment,
      reportingCategory: 'charge',
    })
    const transfer: TransferObject = {
      id,
      object: 'transfer',
      amount: input.amount,
      amount_reversed: 0,
      balance_transaction: platformEntry.id,
      created: this.seconds(),
      currency: input.currency,
      description: input.description,
      destination: destination.id,
      destination_payment: payment,
      livemode: false,
      metadata: input.metadata,
      reversals: { object: 'list', data: [], has_more: false, total_count: 0, url: `/v1/transfers/${id}/reversals` },
      reversed: false,
      source_transaction: input.sourceTransaction,
      source_type: 'card',
      transfer_group: input.transferGroup,
    }
    this.transfers.set(id, transfer)
    this.options.events.emit('transfer.created', transfer, context)
    return transfer
  }

  private transferredFrom(chargeId: string): number {
    let total = 0
    for (const transfer of this.transfers.values()) {
      if (transfer.source_transaction === chargeId) total += transfer.amount - transfer.amount_reversed
    }
    return total
  }

  transfer(id: string): TransferObject {
    const transfer = this.transfers.get(id)
    if (!transfer) throw resourceMissing('transfer', id, 'id')
    return transfer
  }

  /** Newest first, filtered as `GET /v1/transfers` filters. */
  listTransfers(filter: { destination?: string; transferGroup?: string }): TransferObject[] {
    return [...this.transfers.values()]
      .filter(
        (t) =>
          (!filter.destination || t.destination === filter.destination) &&
          (!filter.transferGroup || t.transfer_group === filter.transferGroup),
      )
      .reverse()
  }

  createReversal(
    transferId: string,
    input: { amount: number | null; metadata: Record<string, string>; description: string | null },
    context: RequestContext,
  ) {
    const transfer = this.transfer(transferId)
    const left = transfer.amount - transfer.amount_reversed
    if (left === 0) throw invalidRequest(`Transfer ${transfer.id} has already been fully reversed.`, { param: 'amount' })
    const amount = input.amount ?? left
    if (amount > left) {
      // Stripe's wording for a reversal above what is left (from memory).
      throw invalidRequest(
        `Amount (${formatAmount(amount, transfer.currency)}) is greater than the amount remaining to be reversed (${formatAmount(left, transfer.currency)}).`,
        { param: 'amount' },
      )
    }
    const id = newId.transferReversal()
    const entry = this.options.book.add(null, {
      amount,
      currency: transfer.currency,
      type: 'transfer_refund',
      source: id,
      description: input.description,
      reportingCategory: 'transfer_reversal',
    })
    this.options.book.add(transfer.destination as string, {
      amount: -amount,
      currency: transfer.currency,
      type: 'payment_refund',
      source: id,
      reportingCategory: 'refund',
    })
    const reversal: TransferReversalObject = {
      id,
      object: 'transfer_reversal',
      amount,
      balance_transaction: entry.id,
      created: this.seconds(),
      currency: transfer.currency,
      destination_payment_refund: null,
      metadata: input.metadata,
      source_refund: null,
      transfer: transfer.id,
    }
    transfer.amount_reversed += amount
    transfer.reversed = transfer.amount_reversed === transfer.amount
    transfer.reversals.data = [reversal, ...transfer.reversals.data]
    transfer.reversals.total_count = transfer.reversals.data.length
    this.options.events.emit('transfer.reversed', transfer, context)
    return reversal
  }

  reversal(transferId: string, id: string): TransferReversalObject {
    const found = this.transfer(transferId).reversals.data.find((r) => r.id === id)
    if (!found) throw resourceMissing('transfer_reversal', id, 'id')
    return found
  }

  /** An account's payouts, newest first. */
  listPayouts(account: string): PayoutObject[] {
    return [...this.payouts.values()]
      .filter((p) => p.account === account)
      .map((p) => p.payout)
      .reverse()
  }

  payout(account: string, id: string): PayoutObject {
    const found = this.payouts.get(id)
    if (!found || found.account !== account) throw resourceMissing('payout', id, 'payout')
    return found.payout
  }

  /**
   * The automatic payout schedule: an account that may be paid out, with funds and no payout on its
   * way, sends them to its bank; a payout whose arrival date has passed lands, or fails for a closed
   * test account (which then must give another bank account).
   */
  runPayouts(): void {
    const now = this.seconds()
    for (const { account, payout } of this.payouts.values()) {
      if (payout.status !== 'in_transit' || payout.arrival_date > now) continue
      const target = this.accounts.get(account)!
      const bank = target.external_accounts.data.find((b) => b.id === payout.destination)
      if (bank && bank.last4 === ONBOARDING_TEST_VALUES.closedAccountNumber.slice(-4)) {
        const back = this.options.book.add(account, {
          amount: payout.amount,
          currency: payout.currency,
          type: 'payout_failure',
          source: payout.id,
          reportingCategory: 'payout_reversal',
        })
        Object.assign(payout, {
          status: 'failed',
          failure_code: 'account_closed',
          failure_message: 'The bank account has been closed.',
          failure_balance_transaction: back.id,
        })
        this.options.events.emit('payout.failed', payout, CUSTOMER_ACTION, { account })
        const previous = structuredClone({ requirements: target.requirements, payouts_enabled: target.payouts_enabled })
        bank.status = 'errored'
        this.restrict(target, ['external_account'], 'requirements.past_due')
        if (target.capabilities && 'transfers' in target.capabilities) target.capabilities.transfers = 'active'
        this.options.events.emit('account.updated', target, CUSTOMER_ACTION, { account, previous })
      } else {
        payout.status = 'paid'
        this.options.events.emit('payout.paid', payout, CUSTOMER_ACTION, { account })
      }
    }
    for (const account of this.accounts.values()) {
      if (!account.payouts_enabled) continue
      const bank = account.external_accounts.data.find((b) => b.status !== 'errored')
      if (!bank) continue
      const busy = [...this.payouts.values()].some((p) => p.account === account.id && p.payout.status === 'in_transit')
      if (busy) continue
      for (const [currency, amount] of this.options.book.available(account.id)) {
        if (amount <= 0) continue
        const id = newId.payout()
        const entry = this.options.book.add(account.id, {
          amount: -amount,
          currency,
          type: 'payout',
          source: id,
          reportingCategory: 'payout',
        })
        const payout: PayoutObject = {
          id,
          object: 'payout',
          amount,
          arrival_date: now + PAYOUT_ARRIVAL_S,
          automatic: true,
          balance_transaction: entry.id,
          created: now,
          currency,
          description: 'STRIPE PAYOUT',
          destination: bank.id,
          failure_balance_transaction: null,
          failure_code: null,
          failure_message: null,
          livemode: false,
          metadata: {},
          method: 'standard',
          source_type: 'card',
          statement_descriptor: null,
          status: 'in_transit',
          type: 'bank_account',
        }
        this.payouts.set(id, { account: account.id, payout })
        this.options.events.emit('payout.created', payout, CUSTOMER_ACTION, { account: account.id })
      }
    }
  }
}

function checkEverything(form: OnboardingForm): OnboardingOutcome | null {
  const refuse = (field: keyof OnboardingForm, message: string): OnboardingOutcome => ({ ok: false, field, message })
  if (!form.firstName.trim() || !form.lastName.trim()) return refuse('firstName', 'Give your legal first and last name.')
  if (!/^\d{4}-\d{2}-\d{2}$/.test(form.dob) || Number.isNaN(Date.parse(form.dob)))
    return refuse('dob', 'Give the date of birth as YYYY-MM-DD.')
  if (!/^\d{4}$/.test(form.ssnLast4)) return refuse('ssnLast4', 'Give the last 4 digits of the Social Security number.')
  if (!form.addressLine1.trim() || !/^\d{5}$/.test(form.postalCode.trim()))
    return refuse('addressLine1', 'Give the street address and a 5-digit ZIP code.')
  if (form.routingNumber !== ONBOARDING_TEST_VALUES.routingNumber) {
    return refuse('routingNumber', `Use the test routing number ${ONBOARDING_TEST_VALUES.routingNumber}.`)
  }
  if (form.accountNumber !== ONBOARDING_TEST_VALUES.accountNumber && form.accountNumber !== ONBOARDING_TEST_VALUES.closedAccountNumber) {
    return refuse('accountNumber', `Use the test account number ${ONBOARDING_TEST_VALUES.accountNumber}.`)
  }
  if (!form.tosAccepted) return refuse('tosAccepted', 'Agree to the services agreement to continue.')
  return null
}
