// Contract tests for the stand-in's Stripe Connect part, through the official `stripe` SDK as the app
// drives it: Express accounts, account links, transfers with `source_transaction`, reversals, balance
// transactions and payouts, and the events they raise.
//
// "Connect API contract" uses only the SDK and is written to pass unchanged against real Stripe test
// mode (STRIPE_SECRET_KEY sk_test_… and STRIPE_API_BASE set, as for the payment contract tests); the
// hosted onboarding page, the Connect webhooks and the state file are the stand-in's own and run only
// against it. Expected values come from Stripe's API reference (docs.stripe.com/api/accounts,
// /account_links, /transfers, /transfer_reversals, /balance_transactions, /payouts) and Connect guides;
// where a detail is from memory the comment says so.
import { randomUUID } from 'node:crypto'
import { mkdtempSync, rmSync } from 'node:fs'
import { createServer, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import os from 'node:os'
import path from 'node:path'
import Stripe from 'stripe'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startStripeStandIn, type StripeStandIn } from '../../standins/stripe/standin'
import { submitOnboarding, VERIFIED_PERSON } from '../support/onboarding'

const REAL_KEY = process.env.STRIPE_SECRET_KEY
const REAL_BASE = process.env.STRIPE_API_BASE
const againstRealStripe = Boolean(REAL_KEY && REAL_BASE)
if (againstRealStripe && !REAL_KEY?.startsWith('sk_test_')) {
  throw new Error('The Stripe contract tests run only with a test-mode key (sk_test_…).')
}

const STANDIN_KEY = 'sk_test_standin_connect_0001'
const WEBHOOK_SECRET = 'whsec_standin_connect_platform'
const CONNECT_SECRET = 'whsec_standin_connect_accounts'
// example.com is reserved for documentation (RFC 2606).
const RETURN_URL = 'https://example.com/studios/s-1/money?onboarding=return'
const REFRESH_URL = 'https://example.com/studios/s-1/money?onboarding=refresh'

function sdkFor(base: string, key: string): Stripe {
  const url = new URL(base)
  const protocol = url.protocol === 'https:' ? 'https' : 'http'
  return new Stripe(key, { host: url.hostname, port: url.port || (protocol === 'https' ? 443 : 80), protocol, maxNetworkRetries: 0 })
}

async function caught(promise: Promise<unknown>): Promise<Stripe.errors.StripeError> {
  try {
    await promise
  } catch (error) {
    return error as Stripe.errors.StripeError
  }
  throw new Error('expected the call to fail')
}

const expressAccount = (name = 'Alder Test Studio'): Stripe.AccountCreateParams => ({
  type: 'express',
  country: 'US',
  email: 'owner@example.com',
  business_profile: { name, product_description: 'Contract kiln firing' },
  capabilities: { transfers: { requested: true } },
  metadata: { studioId: 's-1' },
})

/** A card payment made server-side with Stripe's test PaymentMethod `pm_card_visa` (testing docs). */
async function paidCharge(stripe: Stripe, amount: number, transferGroup: string) {
  const intent = await stripe.paymentIntents.create({
    amount,
    currency: 'usd',
    payment_method: 'pm_card_visa',
    allowed_payment_method_types: ['card'],
    confirm: true,
    transfer_group: transferGroup,
  })
  return { intent, chargeId: intent.latest_charge as string }
}

describe('Connect API contract (stand-in, or real Stripe test mode when configured)', () => {
  let standIn: StripeStandIn | undefined
  let stripe: Stripe

  beforeAll(async () => {
    if (againstRealStripe) stripe = sdkFor(REAL_BASE as string, REAL_KEY as string)
    else {
      standIn = await startStripeStandIn({ webhookSecret: WEBHOOK_SECRET, secretKey: STANDIN_KEY })
      stripe = sdkFor(standIn.url, STANDIN_KEY)
    }
  })

  afterAll(async () => {
    await standIn?.close()
  })

  it('creates an Express account that cannot take transfers until onboarding is done', async () => {
    const account = await stripe.accounts.create(expressAccount())

    expect(account.id).toMatch(/^acct_/)
    expect(account.object).toBe('account')
    expect(account.type).toBe('express')
    expect(account.country).toBe('US')
    expect(account.metadata).toEqual({ studioId: 's-1' })
    expect(account.details_submitted).toBe(false)
    expect(account.payouts_enabled).toBe(false)
    // The transfers capability is requested but not active before onboarding (Connect capabilities guide).
    expect(account.capabilities?.transfers).not.toBe('active')
    expect(account.requirements?.currently_due?.length).toBeGreaterThan(0)
    expect(account.requirements?.currently_due).toContain('external_account')

    const again = await stripe.accounts.retrieve(account.id)
    expect(again.id).toBe(account.id)
  })

  it('makes a one-time onboarding link with an https or local url that expires within minutes', async () => {
    const account = await stripe.accounts.create(expressAccount())
    const link = await stripe.accountLinks.create({
      account: account.id,
      type: 'account_onboarding',
      refresh_url: REFRESH_URL,
      return_url: RETURN_URL,
    })

    expect(link.object).toBe('account_link')
    expect(link.url).toMatch(/^https?:\/\//)
    // Account links expire a few minutes after they are made (Connect onboarding docs; 300 s from memory).
    expect(link.expires_at - link.created).toBeGreaterThan(0)
    expect(link.expires_at - link.created).toBeLessThanOrEqual(15 * 60)
  })

  it('refuses an account link for an account that does not exist', async () => {
    const error = await caught(
      stripe.accountLinks.create({
        account: 'acct_1DoesNotExist00',
        type: 'account_onboarding',
        refresh_url: REFRESH_URL,
        return_url: RETURN_URL,
      }),
    )
    expect(error).toBeInstanceOf(Stripe.errors.StripeError)
    expect(error.statusCode).toBeGreaterThanOrEqual(400)
  })

  it('answers 404 resource_missing for an account, a transfer and a payout that do not exist', async () => {
    const account = await caught(stripe.accounts.retrieve('acct_1DoesNotExist00'))
    const transfer = await caught(stripe.transfers.retrieve('tr_doesnotexist000000000000'))
    for (const error of [account, transfer]) {
      expect(error.statusCode).toBeGreaterThanOrEqual(400)
      expect(error.type).toBe('StripeInvalidRequestError')
    }
    expect(transfer.statusCode).toBe(404)
    expect(transfer.code).toBe('resource_missing')
  })

  it('refuses a transfer to an account whose transfers capability is not active', async () => {
    const account = await stripe.accounts.create(expressAccount())
    const { chargeId } = await paidCharge(stripe, 5000, `contract-${randomUUID()}`)
    const error = await caught(
      stripe.transfers.create({ amount: 1000, currency: 'usd', destination: account.id, source_transaction: chargeId }),
    )

    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    expect(error.statusCode).toBe(400)
    // Stripe's code for this refusal (error codes reference, from memory).
    expect(error.code).toBe('insufficient_capabilities_for_transfer')
  })

  it('pays server-side with pm_card_visa: the charge carries the transfer group', async () => {
    const group = `contract-${randomUUID()}`
    const { intent, chargeId } = await paidCharge(stripe, 2500, group)

    expect(intent.status).toBe('succeeded')
    expect(intent.transfer_group).toBe(group)
    const charge = await stripe.charges.retrieve(chargeId)
    expect(charge.status).toBe('succeeded')
    expect(charge.amount).toBe(2500)
    expect(charge.transfer_group).toBe(group)
  })

  it('declines pm_card_chargeDeclined with a 402 card error', async () => {
    const error = await caught(
      stripe.paymentIntents.create({
        amount: 2500,
        currency: 'usd',
        payment_method: 'pm_card_chargeDeclined',
        allowed_payment_method_types: ['card'],
        confirm: true,
      }),
    )
    expect(error).toBeInstanceOf(Stripe.errors.StripeCardError)
    expect(error.statusCode).toBe(402)
    expect(error.code).toBe('card_declined')
  })

  it('lists the platform balance and its balance transactions, newest first', async () => {
    const { chargeId } = await paidCharge(stripe, 1800, `contract-${randomUUID()}`)
    const charge = await stripe.charges.retrieve(chargeId)
    const balance = await stripe.balance.retrieve()
    expect(balance.object).toBe('balance')
    expect(Array.isArray(balance.available)).toBe(true)

    const entry = await stripe.balanceTransactions.retrieve(charge.balance_transaction as string)
    expect(entry.object).toBe('balance_transaction')
    expect(entry.type).toBe('charge')
    expect(entry.amount).toBe(1800)
    expect(entry.source).toBe(chargeId)
    // net is amount less fee (Balance Transaction object reference).
    expect(entry.net).toBe(entry.amount - entry.fee)
  })
})

// Verifies each delivery with the SDK as the app's two endpoints must, each with its own secret.
interface Endpoint {
  url: string
  events: Stripe.Event[]
  rejected: number
  close(): Promise<void>
}

async function startEndpoint(stripe: Stripe, secret: string): Promise<Endpoint> {
  const endpoint: Endpoint = { url: '', events: [], rejected: 0, close: () => new Promise((resolve) => server.close(() => resolve())) }
  const server: Server = createServer((req, res) => {
    const chunks: Buffer[] = []
    req.on('data', (chunk: Buffer) => chunks.push(chunk))
    req.on('end', () => {
      try {
        endpoint.events.push(
          stripe.webhooks.constructEvent(Buffer.concat(chunks).toString('utf8'), String(req.headers['stripe-signature']), secret),
        )
        res.writeHead(200).end()
      } catch {
        endpoint.rejected += 1
        res.writeHead(400).end()
      }
    })
  })
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve))
  endpoint.url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/hook`
  return endpoint
}

describe.skipIf(againstRealStripe)('hosted onboarding, transfers, payouts and events (stand-in only)', () => {
  let clock = Date.UTC(2026, 4, 4, 9, 0, 0)
  let standIn: StripeStandIn
  let stripe: Stripe
  let platform: Endpoint
  let connect: Endpoint

  beforeAll(async () => {
    standIn = await startStripeStandIn({
      webhookSecret: WEBHOOK_SECRET,
      connectWebhookSecret: CONNECT_SECRET,
      secretKey: STANDIN_KEY,
      webhookRetry: { baseDelayMs: 20 },
      now: () => clock,
    })
    stripe = sdkFor(standIn.url, STANDIN_KEY)
    platform = await startEndpoint(stripe, WEBHOOK_SECRET)
    connect = await startEndpoint(stripe, CONNECT_SECRET)
    standIn.setWebhookUrl(platform.url)
    standIn.setConnectWebhookUrl(connect.url)
  })

  afterAll(async () => {
    await standIn.close()
    await platform.close()
    await connect.close()
  })

  async function onboarded(values = VERIFIED_PERSON) {
    const account = await stripe.accounts.create(expressAccount())
    const link = await stripe.accountLinks.create({
      account: account.id,
      type: 'account_onboarding',
      refresh_url: REFRESH_URL,
      return_url: RETURN_URL,
    })
    const answer = await submitOnboarding(link.url, values)
    return { account, link, answer }
  }

  it('serves a page marked as a local test page that lists the test values', async () => {
    const account = await stripe.accounts.create(expressAccount('Fernhollow Test'))
    const link = await stripe.accountLinks.create({
      account: account.id,
      type: 'account_onboarding',
      refresh_url: REFRESH_URL,
      return_url: RETURN_URL,
    })
    const page = await fetch(link.url)
    const html = await page.text()
    expect(page.status).toBe(200)
    expect(html).toContain('Local test onboarding page')
    expect(html).toContain('Fernhollow Test')
    expect(html).toContain('1901-01-01')
    expect(html).toContain('name="routingNumber"')
  })

  it('verifies with the succeeding test values: transfers active, payouts on, account.updated to the Connect endpoint', async () => {
    const { account, answer } = await onboarded()
    expect(answer.status).toBe(303)
    expect(answer.location).toBe(RETURN_URL)

    const after = await stripe.accounts.retrieve(account.id)
    expect(after.details_submitted).toBe(true)
    expect(after.payouts_enabled).toBe(true)
    expect(after.capabilities?.transfers).toBe('active')
    expect(after.requirements?.currently_due).toEqual([])
    expect(after.requirements?.disabled_reason).toBeNull()

    await standIn.idle()
    const updated = connect.events.filter((e) => e.type === 'account.updated' && e.account === account.id)
    expect(updated).toHaveLength(1)
    expect((updated[0].data.object as Stripe.Account).payouts_enabled).toBe(true)
    // The event says what changed (Event object reference, previous_attributes).
    expect(updated[0].data.previous_attributes).toMatchObject({ payouts_enabled: false })
    expect(platform.events.some((e) => e.type === 'account.updated')).toBe(false)
    expect(connect.rejected + platform.rejected).toBe(0)
  })

  it('asks for an identity document after another date of birth, and verifies once the test document is given', async () => {
    const { account, link } = await onboarded({ ...VERIFIED_PERSON, dob: '1984-06-15' })
    const first = await stripe.accounts.retrieve(account.id)
    expect(first.details_submitted).toBe(true)
    expect(first.capabilities?.transfers).toBe('inactive')
    expect(first.requirements?.currently_due).toEqual(['individual.verification.document'])

    // The link worked once: opening it again goes to refresh_url, where the platform makes a new one.
    const reused = await fetch(link.url, { redirect: 'manual' })
    expect(reused.status).toBe(303)
    expect(reused.headers.get('location')).toBe(REFRESH_URL)

    const update = await stripe.accountLinks.create({
      account: account.id,
      type: 'account_update',
      refresh_url: REFRESH_URL,
      return_url: RETURN_URL,
    })
    const failed = await submitOnboarding(update.url, { document: 'file_identity_document_failure' })
    expect(failed.status).toBe(303)
    expect((await stripe.accounts.retrieve(account.id)).requirements?.errors?.[0]?.requirement).toBe('individual.verification.document')

    const retry = await stripe.accountLinks.create({
      account: account.id,
      type: 'account_update',
      refresh_url: REFRESH_URL,
      return_url: RETURN_URL,
    })
    await submitOnboarding(retry.url, { document: 'file_identity_document_success' })
    const verified = await stripe.accounts.retrieve(account.id)
    expect(verified.capabilities?.transfers).toBe('active')
    expect(verified.requirements?.currently_due).toEqual([])
  })

  it('refuses a listed person (1900-01-01): rejected, no transfers, no payouts', async () => {
    const { account } = await onboarded({ ...VERIFIED_PERSON, dob: '1900-01-01' })
    const after = await stripe.accounts.retrieve(account.id)
    expect(after.requirements?.disabled_reason).toBe('rejected.listed')
    expect(after.payouts_enabled).toBe(false)
    expect(after.capabilities?.transfers).toBe('inactive')
  })

  it('keeps the form and names the fault when a field is wrong', async () => {
    const account = await stripe.accounts.create(expressAccount())
    const link = await stripe.accountLinks.create({
      account: account.id,
      type: 'account_onboarding',
      refresh_url: REFRESH_URL,
      return_url: RETURN_URL,
    })
    const answer = await submitOnboarding(link.url, { ...VERIFIED_PERSON, routingNumber: '021000021' })
    expect(answer.status).toBe(400)
    expect(answer.html).toContain('110000000')
    expect((await stripe.accounts.retrieve(account.id)).details_submitted).toBe(false)
  })

  it('transfers from a charge with source_transaction, never past what is left of it, and reverses part', async () => {
    const { account } = await onboarded()
    const group = `request:${randomUUID()}`
    const { chargeId } = await paidCharge(stripe, 10_000, group)

    const transfer = await stripe.transfers.create(
      {
        amount: 9_000,
        currency: 'usd',
        destination: account.id,
        source_transaction: chargeId,
        transfer_group: group,
        metadata: { requestId: 'r-1' },
      },
      { idempotencyKey: `transfer-${group}` },
    )
    expect(transfer.id).toMatch(/^tr_/)
    expect(transfer.amount).toBe(9_000)
    expect(transfer.destination).toBe(account.id)
    expect(transfer.source_transaction).toBe(chargeId)
    expect(transfer.transfer_group).toBe(group)
    expect(transfer.destination_payment).toMatch(/^py_/)
    const replay = await stripe.transfers.create(
      {
        amount: 9_000,
        currency: 'usd',
        destination: account.id,
        source_transaction: chargeId,
        transfer_group: group,
        metadata: { requestId: 'r-1' },
      },
      { idempotencyKey: `transfer-${group}` },
    )
    expect(replay.id).toBe(transfer.id)

    const overrun = await caught(
      stripe.transfers.create({ amount: 1_001, currency: 'usd', destination: account.id, source_transaction: chargeId }),
    )
    expect(overrun).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    expect(overrun.statusCode).toBe(400)

    const reversal = await stripe.transfers.createReversal(transfer.id, { amount: 4_500, metadata: { reason: 'refund' } })
    expect(reversal.id).toMatch(/^trr_/)
    expect(reversal.object).toBe('transfer_reversal')
    expect(reversal.amount).toBe(4_500)
    expect(reversal.transfer).toBe(transfer.id)
    const after = await stripe.transfers.retrieve(transfer.id)
    expect(after.amount_reversed).toBe(4_500)
    expect(after.reversed).toBe(false)
    expect(after.reversals.data.map((r) => r.id)).toEqual([reversal.id])
    const tooMuch = await caught(stripe.transfers.createReversal(transfer.id, { amount: 4_501 }))
    expect(tooMuch.statusCode).toBe(400)

    const listed = await stripe.transfers.list({ transfer_group: group })
    expect(listed.data.map((t) => t.id)).toEqual([transfer.id])

    await standIn.idle()
    expect(
      platform.events.filter((e) => e.type === 'transfer.created' && (e.data.object as Stripe.Transfer).id === transfer.id),
    ).toHaveLength(1)
    const reversed = platform.events.filter((e) => e.type === 'transfer.reversed' && (e.data.object as Stripe.Transfer).id === transfer.id)
    expect(reversed.map((e) => (e.data.object as Stripe.Transfer).amount_reversed)).toEqual([4_500])
  })

  it('books both sides in balance transactions, the connected account read with the Stripe-Account header', async () => {
    const { account } = await onboarded()
    const { chargeId } = await paidCharge(stripe, 6_000, `request:${randomUUID()}`)
    const transfer = await stripe.transfers.create({
      amount: 5_400,
      currency: 'usd',
      destination: account.id,
      source_transaction: chargeId,
    })

    const platformEntry = await stripe.balanceTransactions.retrieve(transfer.balance_transaction as string)
    expect(platformEntry).toMatchObject({ type: 'transfer', amount: -5_400, source: transfer.id })
    const theirs = await stripe.balanceTransactions.list({ limit: 10 }, { stripeAccount: account.id })
    expect(theirs.data.map((t) => [t.type, t.amount])).toEqual([['payment', 5_400]])
    const balance = await stripe.balance.retrieve({}, { stripeAccount: account.id })
    expect(balance.available.find((b) => b.currency === 'usd')?.amount).toBe(5_400)
  })

  it('pays an account’s balance out to its bank, and lands it when the arrival date passes', async () => {
    const { account } = await onboarded()
    const { chargeId } = await paidCharge(stripe, 3_000, `request:${randomUUID()}`)
    await stripe.transfers.create({ amount: 2_700, currency: 'usd', destination: account.id, source_transaction: chargeId })
    standIn.runPayouts()

    const payouts = await stripe.payouts.list({}, { stripeAccount: account.id })
    expect(payouts.data).toHaveLength(1)
    expect(payouts.data[0]).toMatchObject({ object: 'payout', amount: 2_700, currency: 'usd', status: 'in_transit', automatic: true })
    expect((await stripe.balance.retrieve({}, { stripeAccount: account.id })).available[0].amount).toBe(0)

    clock += 25 * 3600_000
    standIn.runPayouts()
    expect((await stripe.payouts.retrieve(payouts.data[0].id, {}, { stripeAccount: account.id })).status).toBe('paid')
    await standIn.idle()
    const events = connect.events.filter((e) => e.account === account.id && e.type.startsWith('payout.')).map((e) => e.type)
    expect(events).toEqual(['payout.created', 'payout.paid'])
  })

  it('fails a payout to the closed test account and asks for another bank account', async () => {
    const { account } = await onboarded({ ...VERIFIED_PERSON, accountNumber: '000111111116' })
    const { chargeId } = await paidCharge(stripe, 2_000, `request:${randomUUID()}`)
    await stripe.transfers.create({ amount: 1_800, currency: 'usd', destination: account.id, source_transaction: chargeId })
    standIn.runPayouts()
    clock += 25 * 3600_000
    standIn.runPayouts()

    const [payout] = (await stripe.payouts.list({}, { stripeAccount: account.id })).data
    expect(payout).toMatchObject({ status: 'failed', failure_code: 'account_closed' })
    const after = await stripe.accounts.retrieve(account.id)
    expect(after.payouts_enabled).toBe(false)
    expect(after.requirements?.currently_due).toEqual(['external_account'])
    // The money went back to the account's balance.
    expect((await stripe.balance.retrieve({}, { stripeAccount: account.id })).available[0].amount).toBe(1_800)
  })

  it('keeps its test-mode account in the state file between runs', async () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'stripe-standin-'))
    const stateFile = path.join(dir, 'state.json')
    try {
      const first = await startStripeStandIn({ webhookSecret: WEBHOOK_SECRET, secretKey: STANDIN_KEY, stateFile })
      const sdk = sdkFor(first.url, STANDIN_KEY)
      const account = await sdk.accounts.create(expressAccount())
      const { chargeId } = await paidCharge(sdk, 4_000, 'request:kept')
      await first.close()

      const second = await startStripeStandIn({ webhookSecret: WEBHOOK_SECRET, secretKey: STANDIN_KEY, stateFile })
      const again = sdkFor(second.url, STANDIN_KEY)
      expect((await again.accounts.retrieve(account.id)).id).toBe(account.id)
      expect((await again.charges.retrieve(chargeId)).amount).toBe(4_000)
      const refund = await again.refunds.create({ charge: chargeId, amount: 1_000 })
      expect(refund.amount).toBe(1_000)
      await second.close()
    } finally {
      rmSync(dir, { recursive: true, force: true })
    }
  })
})
