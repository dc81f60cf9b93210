// Contract tests for the local Stripe stand-in, driven through the official `stripe` SDK the way the app
// drives it (`host`, `port`, `protocol` options, nothing else).
//
// Two groups:
// - "Stripe API contract" uses only the SDK, plus plain HTTP for the raw error envelope. It is written to
//   pass unchanged against real Stripe test mode: with STRIPE_SECRET_KEY (sk_test_…) and STRIPE_API_BASE
//   (e.g. https://api.stripe.com) set, it runs against that instead of the stand-in.
// - "hosted page, webhooks and refunds" pays on the stand-in's hosted test page and receives webhooks on
//   127.0.0.1, which real Stripe cannot do for a local test; it runs against the stand-in only.
//
// Expected values come from Stripe's API reference and docs (docs.stripe.com/api, /testing,
// /webhooks, /api/idempotent_requests); where a detail is from memory the comment says so.
import { randomUUID } from 'node:crypto'
import { createServer, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import Stripe from 'stripe'
import { CARD_ALWAYS_AUTHENTICATES, CARD_DECLINED, CARD_INSUFFICIENT_FUNDS, CARD_SUCCEEDS, submitCard } from '../support/checkout'
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { startStripeStandIn, type StripeStandIn } from '../../standins/stripe/standin'
import { passesLuhn } from '../../standins/stripe/test-cards'

const REAL_KEY = process.env.STRIPE_SECRET_KEY
const REAL_BASE = process.env.STRIPE_API_BASE
const againstRealStripe = Boolean(REAL_KEY && REAL_BASE)
if (againstRealStripe && !REAL_KEY?.startsWith('sk_test_')) {
  throw new Error('The Stripe contract tests run only with a test-mode key (sk_test_…).')
}

const STANDIN_KEY = 'sk_test_standin_contract_0001'
const WEBHOOK_SECRET = 'whsec_standin_contract_0001'

// example.com is reserved for documentation (RFC 2606), so these URLs never reach anyone.
const SUCCESS_URL = 'https://example.com/requests/r-1/deposit?session={CHECKOUT_SESSION_ID}'
const CANCEL_URL = 'https://example.com/requests/r-1'

function sdkFor(base: string, key: string): Stripe {
  const url = new URL(base)
  const protocol = url.protocol === 'https:' ? 'https' : 'http'
  return new Stripe(key, {
    host: url.hostname,
    port: url.port || (protocol === 'https' ? 443 : 80),
    protocol,
    // No silent retries, so each test sees the answer to the one request it made.
    maxNetworkRetries: 0,
  })
}

function depositSession(overrides: Partial<Stripe.Checkout.SessionCreateParams> = {}): Stripe.Checkout.SessionCreateParams {
  return {
    mode: 'payment',
    line_items: [
      {
        quantity: 1,
        price_data: { currency: 'usd', unit_amount: 2500, product_data: { name: 'Deposit: cone 6 oxidation firing' } },
      },
    ],
    success_url: SUCCESS_URL,
    cancel_url: CANCEL_URL,
    client_reference_id: 'r-1',
    customer_email: 'potter@example.com',
    metadata: { requestId: 'r-1', kind: 'deposit' },
    payment_intent_data: { metadata: { requestId: 'r-1' } },
    ...overrides,
  }
}

async function caught(promise: Promise<unknown>): Promise<Stripe.errors.StripeError> {
  try {
    await promise
  } catch (error) {
    return error as Stripe.errors.StripeError
  }
  throw new Error('expected the call to fail')
}

describe('Stripe API contract (stand-in, or real Stripe test mode when configured)', () => {
  let standIn: StripeStandIn | undefined
  let stripe: Stripe
  let apiBase: string

  beforeAll(async () => {
    if (againstRealStripe) {
      apiBase = REAL_BASE as string
      stripe = sdkFor(apiBase, REAL_KEY as string)
    } else {
      standIn = await startStripeStandIn({ webhookSecret: WEBHOOK_SECRET, secretKey: STANDIN_KEY })
      apiBase = standIn.url
      stripe = sdkFor(apiBase, STANDIN_KEY)
    }
  })

  afterAll(async () => {
    await standIn?.close()
  })

  it('creates a payment-mode Checkout Session with the fields of the checkout.session object', async () => {
    const params = depositSession({
      line_items: [
        { quantity: 3, price_data: { currency: 'usd', unit_amount: 800, product_data: { name: 'Shelf space, half shelf' } } },
        { quantity: 1, price_data: { currency: 'usd', unit_amount: 1200, product_data: { name: 'Bisque firing' } } },
      ],
    })
    const session = await stripe.checkout.sessions.create(params)

    const lineTotal = params.line_items!.reduce(
      (sum, item) => sum + (item.price_data!.unit_amount as number) * (item.quantity as number),
      0,
    )
    expect(session.id).toMatch(/^cs_test_[A-Za-z0-9]+$/)
    expect(session.object).toBe('checkout.session')
    expect(session.mode).toBe('payment')
    expect(session.status).toBe('open')
    expect(session.payment_status).toBe('unpaid')
    expect(session.amount_total).toBe(lineTotal)
    expect(session.amount_subtotal).toBe(lineTotal)
    expect(session.currency).toBe('usd')
    expect(session.livemode).toBe(false)
    expect(session.metadata).toEqual({ requestId: 'r-1', kind: 'deposit' })
    expect(session.client_reference_id).toBe('r-1')
    expect(session.customer_email).toBe('potter@example.com')
    expect(session.success_url).toBe(SUCCESS_URL)
    expect(session.cancel_url).toBe(CANCEL_URL)
    expect(session.url).toMatch(/^https?:\/\//)
    // Since API version 2022-08-01 the PaymentIntent is made only when the customer pays (API changelog).
    expect(session.payment_intent).toBeNull()
    // A session expires 24 hours after creation unless expires_at says otherwise (API reference, expires_at).
    expect(session.expires_at - session.created).toBe(24 * 60 * 60)
  })

  it('retrieves the session it created, line items included when expanded', async () => {
    const created = await stripe.checkout.sessions.create(depositSession())
    const retrieved = await stripe.checkout.sessions.retrieve(created.id, { expand: ['line_items'] })

    expect(retrieved.id).toBe(created.id)
    expect(retrieved.amount_total).toBe(created.amount_total)
    expect(retrieved.metadata).toEqual(created.metadata)
    expect(retrieved.line_items?.object).toBe('list')
    expect(retrieved.line_items?.data).toHaveLength(1)
    expect(retrieved.line_items?.data[0].description).toBe('Deposit: cone 6 oxidation firing')
    expect(retrieved.line_items?.data[0].amount_total).toBe(created.amount_total)
  })

  it('expires an open session, then refuses to expire it again', async () => {
    const session = await stripe.checkout.sessions.create(depositSession())
    const expired = await stripe.checkout.sessions.expire(session.id)

    expect(expired.id).toBe(session.id)
    expect(expired.status).toBe('expired')
    expect(expired.payment_status).toBe('unpaid')

    const error = await caught(stripe.checkout.sessions.expire(session.id))
    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    expect(error.statusCode).toBe(400)
  })

  it('refuses expires_at less than 30 minutes after creation (API reference, expires_at)', async () => {
    const soon = Math.floor(Date.now() / 1000) + 5 * 60
    const error = await caught(stripe.checkout.sessions.create(depositSession({ expires_at: soon })))

    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    expect(error.param).toBe('expires_at')
  })

  it('replays the first response for the same Idempotency-Key and the same parameters', async () => {
    const idempotencyKey = `contract-${randomUUID()}`
    const first = await stripe.checkout.sessions.create(depositSession(), { idempotencyKey })
    const second = await stripe.checkout.sessions.create(depositSession(), { idempotencyKey })

    expect(second.id).toBe(first.id)
    expect(second.created).toBe(first.created)
    // Stripe marks a replayed response with this header (idempotent requests docs, from memory).
    expect(second.lastResponse.headers['idempotent-replayed']).toBe('true')
    expect(first.lastResponse.headers['idempotent-replayed']).toBeUndefined()
  })

  it('refuses the same Idempotency-Key with different parameters as an idempotency_error', async () => {
    const idempotencyKey = `contract-${randomUUID()}`
    await stripe.checkout.sessions.create(depositSession(), { idempotencyKey })
    const error = await caught(stripe.checkout.sessions.create(depositSession({ metadata: { requestId: 'r-2' } }), { idempotencyKey }))

    expect(error).toBeInstanceOf(Stripe.errors.StripeIdempotencyError)
    expect(error.rawType).toBe('idempotency_error')
    expect(error.statusCode).toBe(400)
  })

  it('refuses an Idempotency-Key reused on another endpoint as an idempotency_error', async () => {
    const idempotencyKey = `contract-${randomUUID()}`
    await stripe.checkout.sessions.create(depositSession(), { idempotencyKey })
    const error = await caught(stripe.refunds.create({ payment_intent: 'pi_doesnotexist0000000000' }, { idempotencyKey }))

    expect(error).toBeInstanceOf(Stripe.errors.StripeIdempotencyError)
    expect(error.statusCode).toBe(400)
  })

  it('names a missing required parameter with parameter_missing and its bracketed path', async () => {
    const error = await caught(
      stripe.checkout.sessions.create(
        depositSession({
          line_items: [
            {
              quantity: 1,
              price_data: {
                currency: 'usd',
                unit_amount: 2500,
                product_data: { description: 'Glaze firing, cone 6' } as Stripe.Checkout.SessionCreateParams.LineItem.PriceData.ProductData,
              },
            },
          ],
        }),
      ),
    )

    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    expect(error.statusCode).toBe(400)
    expect(error.code).toBe('parameter_missing')
    expect(error.param).toBe('line_items[0][price_data][product_data][name]')
  })

  it('refuses a parameter it does not know with parameter_unknown', async () => {
    const params = { ...depositSession(), kiln_notes: 'cone 6' } as Stripe.Checkout.SessionCreateParams
    const error = await caught(stripe.checkout.sessions.create(params))

    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    expect(error.code).toBe('parameter_unknown')
    expect(error.param).toBe('kiln_notes')
  })

  it('answers 404 resource_missing for ids that do not exist', async () => {
    const session = await caught(stripe.checkout.sessions.retrieve('cs_test_doesnotexist0000000000'))
    const intent = await caught(stripe.paymentIntents.retrieve('pi_doesnotexist0000000000'))
    const refund = await caught(stripe.refunds.retrieve('re_doesnotexist0000000000'))

    for (const error of [session, intent, refund]) {
      expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
      expect(error.statusCode).toBe(404)
      expect(error.code).toBe('resource_missing')
    }
    // The param is the path parameter's name in Stripe's OpenAPI spec.
    expect(session.param).toBe('session')
    expect(intent.param).toBe('intent')
    expect(session.message).toContain('cs_test_doesnotexist0000000000')
  })

  it('refuses a wrong secret key with 401, surfaced as StripeAuthenticationError', async () => {
    const wrong = sdkFor(apiBase, 'sk_test_this_key_was_never_issued_0000')
    const error = await caught(wrong.checkout.sessions.retrieve('cs_test_doesnotexist0000000000'))

    expect(error).toBeInstanceOf(Stripe.errors.StripeAuthenticationError)
    expect(error.statusCode).toBe(401)
    expect(error.message).not.toContain('this_key_was_never_issued')
  })

  it('answers a request with no key, and a bad request, in the {error: {type, code, message, param}} envelope', async () => {
    const anonymous = await fetch(`${apiBase}/v1/checkout/sessions/cs_test_doesnotexist0000000000`)
    const anonymousBody = (await anonymous.json()) as { error: Record<string, unknown> }
    expect(anonymous.status).toBe(401)
    expect(anonymousBody.error.type).toBe('invalid_request_error')
    expect(typeof anonymousBody.error.message).toBe('string')

    // price_data.currency is required by the OpenAPI spec (non-optional in the SDK's SessionCreateParams).
    const key = againstRealStripe ? (REAL_KEY as string) : STANDIN_KEY
    const noCurrency = await fetch(`${apiBase}/v1/checkout/sessions`, {
      method: 'POST',
      headers: { Authorization: `Bearer ${key}`, 'Content-Type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({
        mode: 'payment',
        success_url: 'https://example.com/done',
        'line_items[0][quantity]': '1',
        'line_items[0][price_data][unit_amount]': '2500',
        'line_items[0][price_data][product_data][name]': 'Deposit',
      }),
    })
    const noCurrencyBody = (await noCurrency.json()) as { error: Record<string, unknown> }
    expect(noCurrency.status).toBe(400)
    expect(noCurrencyBody.error).toMatchObject({
      type: 'invalid_request_error',
      code: 'parameter_missing',
      param: 'line_items[0][price_data][currency]',
    })
    expect(noCurrencyBody.error.message).toContain('line_items[0][price_data][currency]')
  })
})

// A tiny webhook endpoint: verifies each delivery with the SDK as the app must, and answers with the
// statuses a test queues (200 once the queue is empty), or holds the answer until released.
interface WebhookReceiver {
  url: string
  verified: Stripe.Event[]
  raw: Array<{ body: string; signature: string }>
  rejected: number
  answers: number[]
  hold: boolean
  release(): void
  close(): Promise<void>
}

async function startReceiver(stripe: Stripe): Promise<WebhookReceiver> {
  const held: Array<() => void> = []
  const receiver: WebhookReceiver = {
    url: '',
    verified: [],
    raw: [],
    rejected: 0,
    answers: [],
    hold: false,
    release: () => {
      receiver.hold = false
      for (const answer of held.splice(0)) answer()
    },
    close: () => new Promise((resolve) => server.close(() => resolve())),
  }
  const server: Server = createServer((req, res) => {
    const chunks: Buffer[] = []
    req.on('data', (chunk: Buffer) => chunks.push(chunk))
    req.on('end', () => {
      const body = Buffer.concat(chunks).toString('utf8')
      const signature = String(req.headers['stripe-signature'] ?? '')
      const answer = () => {
        const status = receiver.answers.shift() ?? 200
        if (status !== 200) {
          res.writeHead(status).end()
          return
        }
        // As the app must: verify on the raw body, and refuse a bad signature with 400.
        try {
          const event = stripe.webhooks.constructEvent(body, signature, WEBHOOK_SECRET)
          receiver.raw.push({ body, signature })
          receiver.verified.push(event)
          res.writeHead(200).end()
        } catch {
          receiver.rejected += 1
          res.writeHead(400).end()
        }
      }
      if (receiver.hold) held.push(answer)
      else answer()
    })
  })
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve))
  receiver.url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/webhooks/stripe`
  return receiver
}

describe.skipIf(againstRealStripe)('hosted page, webhooks and refunds (stand-in only)', () => {
  let standIn: StripeStandIn
  let stripe: Stripe
  let receiver: WebhookReceiver

  beforeAll(async () => {
    standIn = await startStripeStandIn({ webhookSecret: WEBHOOK_SECRET, webhookRetry: { baseDelayMs: 20 } })
    stripe = sdkFor(standIn.url, STANDIN_KEY)
    receiver = await startReceiver(stripe)
    standIn.setWebhookUrl(receiver.url)
  })

  beforeEach(async () => {
    await standIn.idle()
    receiver.verified.length = 0
    receiver.raw.length = 0
    receiver.rejected = 0
    receiver.answers.length = 0
  })

  afterAll(async () => {
    receiver.release()
    await standIn.close()
    await receiver.close()
  })

  const eventsFor = (type: string, objectId: string) =>
    receiver.verified.filter((event) => event.type === type && (event.data.object as { id: string }).id === objectId)

  async function paidSession(): Promise<{ session: Stripe.Checkout.Session; intentId: string }> {
    const session = await stripe.checkout.sessions.create(depositSession())
    const paid = await submitCard(session.url as string, { cardNumber: CARD_SUCCEEDS })
    expect(paid.status).toBe(303)
    const completed = await stripe.checkout.sessions.retrieve(session.id)
    await standIn.idle()
    return { session: completed, intentId: completed.payment_intent as string }
  }

  it('serves a page labelled as a local test page, with the total and a link back to cancel_url', async () => {
    const session = await stripe.checkout.sessions.create(depositSession())
    const page = await fetch(session.url as string)
    const html = await page.text()

    expect(page.status).toBe(200)
    expect(page.headers.get('content-type')).toContain('text/html')
    expect(html).toContain('Local test payment page')
    expect(html).toContain('$25.00')
    expect(html).toContain(`href="${CANCEL_URL}"`)
    expect(html).toContain('name="cardNumber"')
  })

  it('pays with 4242 4242 4242 4242: session complete, payment intent succeeded, 303 to success_url', async () => {
    const session = await stripe.checkout.sessions.create(depositSession())
    const paid = await submitCard(session.url as string, { cardNumber: CARD_SUCCEEDS })

    expect(paid.status).toBe(303)
    // Stripe fills {CHECKOUT_SESSION_ID} in success_url with the session's id (Checkout docs).
    expect(paid.location).toBe(SUCCESS_URL.replace('{CHECKOUT_SESSION_ID}', session.id))

    const completed = await stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent.latest_charge'] })
    expect(completed.status).toBe('complete')
    expect(completed.payment_status).toBe('paid')
    expect(completed.url).toBeNull()
    expect(completed.customer_details?.email).toBe('potter@example.com')
    const intent = completed.payment_intent as Stripe.PaymentIntent
    expect(intent.id).toMatch(/^pi_/)
    expect(intent.status).toBe('succeeded')
    expect(intent.amount).toBe(session.amount_total)
    expect(intent.amount_received).toBe(session.amount_total)
    expect(intent.metadata).toEqual({ requestId: 'r-1' })
    const charge = intent.latest_charge as Stripe.Charge
    expect(charge.id).toMatch(/^ch_/)
    expect(charge.status).toBe('succeeded')
    expect(charge.payment_method_details?.card?.last4).toBe('4242')
    expect(charge.payment_method_details?.card?.brand).toBe('visa')

    const retrieved = await stripe.paymentIntents.retrieve(intent.id)
    expect(retrieved.latest_charge).toBe(charge.id)
  })

  it('sends payment_intent.succeeded and checkout.session.completed, signed so constructEvent accepts them', async () => {
    const { session, intentId } = await paidSession()

    const completed = eventsFor('checkout.session.completed', session.id)
    const succeeded = eventsFor('payment_intent.succeeded', intentId)
    expect(receiver.rejected).toBe(0)
    expect(completed).toHaveLength(1)
    expect(succeeded).toHaveLength(1)
    const event = completed[0]
    expect(event.id).toMatch(/^evt_/)
    expect(event.object).toBe('event')
    expect(event.livemode).toBe(false)
    expect(event.api_version).toBe(Stripe.API_VERSION)
    expect(event.pending_webhooks).toBe(1)
    // The customer paid on the page, not through an API request (Event object reference, `request`).
    expect(event.request).toEqual({ id: null, idempotency_key: null })
    const object = event.data.object as Stripe.Checkout.Session
    expect(object.payment_status).toBe('paid')
    expect(object.metadata).toEqual({ requestId: 'r-1', kind: 'deposit' })
    expect(standIn.events().find((stored) => stored.id === event.id)?.pending_webhooks).toBe(0)
  })

  it('signs as Stripe documents (t=…,v1=hex HMAC-SHA256), so a changed body or a wrong secret fails verification', async () => {
    await paidSession()
    const { body, signature } = receiver.raw[0]

    expect(signature).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/)
    const tampered = body.replace('"livemode": false', '"livemode": true')
    expect(tampered).not.toBe(body)
    expect(() => stripe.webhooks.constructEvent(tampered, signature, WEBHOOK_SECRET)).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    )
    expect(() => stripe.webhooks.constructEvent(body, signature, 'whsec_some_other_endpoint')).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    )
  })

  it('declines 4000 0000 0000 0002 with a clear error; the session stays open and unpaid; payment_failed is sent', async () => {
    const session = await stripe.checkout.sessions.create(depositSession())
    const declined = await submitCard(session.url as string, { cardNumber: CARD_DECLINED })

    expect(declined.status).toBe(402)
    expect(declined.location).toBeNull()
    expect(declined.html).toContain('role="alert"')
    expect(declined.html).toContain('Your card was declined.')

    const after = await stripe.checkout.sessions.retrieve(session.id)
    expect(after.status).toBe('open')
    expect(after.payment_status).toBe('unpaid')
    const intent = await stripe.paymentIntents.retrieve(after.payment_intent as string)
    expect(intent.status).toBe('requires_payment_method')
    expect(intent.amount_received).toBe(0)
    expect(intent.last_payment_error?.code).toBe('card_declined')
    expect(intent.last_payment_error?.decline_code).toBe('generic_decline')

    await standIn.idle()
    expect(eventsFor('payment_intent.payment_failed', intent.id)).toHaveLength(1)
    expect(eventsFor('checkout.session.completed', session.id)).toHaveLength(0)

    // Paying again with a good card reuses the session's payment intent.
    const retried = await submitCard(session.url as string, { cardNumber: CARD_SUCCEEDS })
    expect(retried.status).toBe(303)
    const paid = await stripe.paymentIntents.retrieve(intent.id)
    expect(paid.status).toBe('succeeded')
  })

  it('declines 4000 0000 0000 9995 for insufficient funds', async () => {
    const session = await stripe.checkout.sessions.create(depositSession())
    const declined = await submitCard(session.url as string, { cardNumber: CARD_INSUFFICIENT_FUNDS })

    expect(declined.status).toBe(402)
    expect(declined.html).toContain('Your card has insufficient funds.')
    const after = await stripe.checkout.sessions.retrieve(session.id)
    const intent = await stripe.paymentIntents.retrieve(after.payment_intent as string)
    expect(intent.last_payment_error?.code).toBe('card_declined')
    expect(intent.last_payment_error?.decline_code).toBe('insufficient_funds')
  })

  it('refuses a card number failing the Luhn check before any payment is attempted', async () => {
    // 4242 4242 4242 4241 is Stripe's documented incorrect_number test card.
    const session = await stripe.checkout.sessions.create(depositSession())
    const refused = await submitCard(session.url as string, { cardNumber: '4242 4242 4242 4241' })

    expect(refused.status).toBe(400)
    expect(refused.html).toContain('Your card number is incorrect.')
    const after = await stripe.checkout.sessions.retrieve(session.id)
    expect(after.status).toBe('open')
    expect(after.payment_intent).toBeNull()
    await standIn.idle()
    expect(receiver.verified).toHaveLength(0)
  })

  it('checks card numbers with Luhn: every documented test card passes, the incorrect_number card fails', () => {
    // Numbers from Stripe's testing docs (docs.stripe.com/testing).
    for (const number of ['4242424242424242', '4000000000000002', '4000000000009995', '5555555555554444', '378282246310005']) {
      expect(passesLuhn(number)).toBe(true)
    }
    expect(passesLuhn('4242424242424241')).toBe(false)
  })

  it('retries a delivery the endpoint answers with 500, with backoff, until it answers 2xx', async () => {
    receiver.answers.push(500, 500)
    const session = await stripe.checkout.sessions.create(depositSession())
    await stripe.checkout.sessions.expire(session.id)
    await standIn.idle()

    const delivery = standIn.deliveries().find((entry) => entry.type === 'checkout.session.expired' && entry.status === 'delivered')
    expect(delivery?.attempts.map((attempt) => attempt.status)).toEqual([500, 500, 200])
    const [first, second, third] = delivery!.attempts
    // Base delay 20 ms, doubling: the second wait is at least twice the base.
    expect(second.at - first.at).toBeGreaterThanOrEqual(20)
    expect(third.at - second.at).toBeGreaterThanOrEqual(40)
    expect(eventsFor('checkout.session.expired', session.id)).toHaveLength(1)
  })

  it('answers the API call without waiting for the webhook endpoint', async () => {
    receiver.hold = true
    const session = await stripe.checkout.sessions.create(depositSession())
    const expired = await stripe.checkout.sessions.expire(session.id)

    expect(expired.status).toBe('expired')
    const pending = standIn.deliveries().filter((entry) => entry.status === 'pending')
    expect(pending.map((entry) => entry.type)).toContain('checkout.session.expired')

    receiver.release()
    await standIn.idle()
    expect(eventsFor('checkout.session.expired', session.id)).toHaveLength(1)
  })

  it('shows an expired session as expired on the hosted page and takes no payment there', async () => {
    const session = await stripe.checkout.sessions.create(depositSession())
    await stripe.checkout.sessions.expire(session.id)

    const page = await fetch(session.url as string)
    expect(page.status).toBe(410)
    const attempt = await submitCard(session.url as string, { cardNumber: CARD_SUCCEEDS })
    expect(attempt.status).toBe(410)
    const after = await stripe.checkout.sessions.retrieve(session.id)
    expect(after.payment_status).toBe('unpaid')
  })

  it('refunds part, then the rest, with a charge.refunded event for each', async () => {
    const { session, intentId } = await paidSession()
    const total = session.amount_total as number
    const part = Math.floor(total / 5)

    const partial = await stripe.refunds.create(
      { payment_intent: intentId, amount: part, reason: 'requested_by_customer', metadata: { requestId: 'r-1' } },
      { idempotencyKey: `refund-${session.id}-1` },
    )
    expect(partial.id).toMatch(/^re_/)
    expect(partial.object).toBe('refund')
    expect(partial.status).toBe('succeeded')
    expect(partial.amount).toBe(part)
    expect(partial.payment_intent).toBe(intentId)
    expect(partial.charge).toMatch(/^ch_/)
    expect(partial.metadata).toEqual({ requestId: 'r-1' })

    const rest = await stripe.refunds.create({ payment_intent: intentId })
    expect(rest.amount).toBe(total - part)
    expect((await stripe.refunds.retrieve(rest.id)).amount).toBe(total - part)

    await standIn.idle()
    const refunded = eventsFor('charge.refunded', partial.charge as string).map((event) => event.data.object as Stripe.Charge)
    expect(refunded.map((charge) => charge.amount_refunded)).toEqual([part, total])
    expect(refunded.map((charge) => charge.refunded)).toEqual([false, true])
    const first = eventsFor('charge.refunded', partial.charge as string)[0]
    expect(first.request?.id).toMatch(/^req_/)
    expect(first.request?.idempotency_key).toBe(`refund-${session.id}-1`)
  })

  it('refuses to refund more than is left on the charge, and anything after a full refund', async () => {
    const { session, intentId } = await paidSession()
    const total = session.amount_total as number

    const tooMuch = await caught(stripe.refunds.create({ payment_intent: intentId, amount: total + 1 }))
    expect(tooMuch).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    expect(tooMuch.statusCode).toBe(400)
    expect(tooMuch.param).toBe('amount')

    await stripe.refunds.create({ payment_intent: intentId })
    const again = await caught(stripe.refunds.create({ payment_intent: intentId, amount: 1 }))
    expect(again).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    // Stripe's error code for a charge with nothing left to refund (error codes reference).
    expect(again.code).toBe('charge_already_refunded')
  })

  it('refuses to refund a payment intent that has not succeeded', async () => {
    const session = await stripe.checkout.sessions.create(depositSession())
    await submitCard(session.url as string, { cardNumber: CARD_DECLINED })
    const after = await stripe.checkout.sessions.retrieve(session.id)

    const error = await caught(stripe.refunds.create({ payment_intent: after.payment_intent as string }))
    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    expect(error.param).toBe('payment_intent')
  })

  // Saving a card at checkout and charging it later (docs.stripe.com/payments/checkout/save-and-reuse and
  // the API reference for payment_intent_data.setup_future_usage, off_session and payment_methods/detach).
  async function keptCard(cardNumber: string) {
    const customer = await stripe.customers.create({ email: 'potter@example.com', metadata: { userId: 'u-1' } })
    const { customer_email: _unused, ...rest } = depositSession()
    const session = await stripe.checkout.sessions.create({
      ...rest,
      customer: customer.id,
      payment_intent_data: { metadata: { requestId: 'r-1' }, setup_future_usage: 'off_session' },
    })
    expect((await submitCard(session.url as string, { cardNumber })).status).toBe(303)
    const intent = await stripe.paymentIntents.retrieve((await stripe.checkout.sessions.retrieve(session.id)).payment_intent as string)
    return { customer, intent, methodId: intent.payment_method as string }
  }

  it('attaches a card paid with setup_future_usage to the session’s Customer, and charges it off-session later', async () => {
    const { customer, intent, methodId } = await keptCard(CARD_SUCCEEDS)
    expect(intent.customer).toBe(customer.id)
    expect(intent.setup_future_usage).toBe('off_session')
    const method = await stripe.paymentMethods.retrieve(methodId)
    expect(method.customer).toBe(customer.id)
    expect(method.card?.last4).toBe('4242')
    expect(method.card?.brand).toBe('visa')

    const later = await stripe.paymentIntents.create({
      amount: 6000,
      currency: 'usd',
      customer: customer.id,
      payment_method: methodId,
      off_session: true,
      confirm: true,
      metadata: { claimId: 'c-1' },
    })
    expect(later.status).toBe('succeeded')
    expect(later.customer).toBe(customer.id)
    expect(later.amount_received).toBe(6000)
  })

  it('leaves a card paid without setup_future_usage unattached, and refuses to charge it again', async () => {
    const session = await stripe.checkout.sessions.create(depositSession())
    await submitCard(session.url as string, { cardNumber: CARD_SUCCEEDS })
    const intent = await stripe.paymentIntents.retrieve((await stripe.checkout.sessions.retrieve(session.id)).payment_intent as string)
    expect((await stripe.paymentMethods.retrieve(intent.payment_method as string)).customer).toBeNull()
    const customer = await stripe.customers.create({ email: 'potter@example.com' })
    const error = await caught(
      stripe.paymentIntents.create({
        amount: 6000,
        currency: 'usd',
        customer: customer.id,
        payment_method: intent.payment_method as string,
        off_session: true,
        confirm: true,
      }),
    )
    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    expect(error.param).toBe('payment_method')
  })

  it('refuses both customer and customer_email on one session', async () => {
    const customer = await stripe.customers.create({ email: 'potter@example.com' })
    const error = await caught(stripe.checkout.sessions.create(depositSession({ customer: customer.id })))
    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    expect(error.param).toBe('customer')
  })

  it('declines an off-session payment on a card that always asks for authentication, with authentication_required', async () => {
    const { customer, methodId } = await keptCard(CARD_ALWAYS_AUTHENTICATES)
    const error = await caught(
      stripe.paymentIntents.create({
        amount: 6000,
        currency: 'usd',
        customer: customer.id,
        payment_method: methodId,
        off_session: true,
        confirm: true,
      }),
    )
    expect(error).toBeInstanceOf(Stripe.errors.StripeCardError)
    expect(error.statusCode).toBe(402)
    // Stripe's code for an off-session payment the bank wants the cardholder to authenticate (error codes reference).
    expect(error.code).toBe('authentication_required')
    expect((error.payment_intent as Stripe.PaymentIntent | undefined)?.status).toBe('requires_payment_method')
  })

  it('detaches a kept card, after which it can no longer be charged', async () => {
    const { customer, methodId } = await keptCard(CARD_SUCCEEDS)
    expect((await stripe.paymentMethods.detach(methodId)).customer).toBeNull()
    const error = await caught(
      stripe.paymentIntents.create({
        amount: 6000,
        currency: 'usd',
        customer: customer.id,
        payment_method: methodId,
        off_session: true,
        confirm: true,
      }),
    )
    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    const again = await caught(stripe.paymentMethods.detach(methodId))
    expect(again).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
  })

  it('records what the SDK sent, form-encoded with bracketed keys', async () => {
    const session = await stripe.checkout.sessions.create(depositSession())
    const sent = standIn
      .requests()
      .filter((entry) => entry.method === 'POST' && entry.path === '/v1/checkout/sessions')
      .at(-1)

    expect(sent?.status).toBe(200)
    expect(sent?.params).toMatchObject({
      mode: 'payment',
      metadata: { requestId: 'r-1' },
      payment_intent_data: { metadata: { requestId: 'r-1' } },
      line_items: { 0: { quantity: '1', price_data: { unit_amount: '2500', currency: 'usd' } } },
    })
    // The SDK keys every POST itself (stripe-node's `stripe-node-retry-` keys) when the caller gives none.
    expect(sent?.idempotencyKey).toMatch(/^stripe-node-retry-/)
    expect(session.id).toMatch(/^cs_test_/)
  })
})

describe.skipIf(againstRealStripe)('session expiry on the clock (stand-in only)', () => {
  let clock = Date.UTC(2025, 2, 1, 9, 0, 0)
  let standIn: StripeStandIn
  let stripe: Stripe

  beforeAll(async () => {
    standIn = await startStripeStandIn({ webhookSecret: WEBHOOK_SECRET, now: () => clock })
    stripe = sdkFor(standIn.url, STANDIN_KEY)
  })

  afterAll(async () => {
    await standIn.close()
  })

  it('expires an open session once expires_at has passed, raising checkout.session.expired', async () => {
    const thirtyMinutes = 30 * 60
    const session = await stripe.checkout.sessions.create(depositSession({ expires_at: Math.floor(clock / 1000) + thirtyMinutes }))
    expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('open')

    clock += (thirtyMinutes + 1) * 1000
    standIn.expireDueSessions()

    const after = await stripe.checkout.sessions.retrieve(session.id)
    expect(after.status).toBe('expired')
    const expiredEvents = standIn.events().filter((event) => event.type === 'checkout.session.expired')
    expect(expiredEvents.map((event) => event.data.object.id)).toEqual([session.id])
    // No webhook endpoint was set, so the event is kept but nothing is delivered (pending_webhooks 0).
    expect(expiredEvents[0].pending_webhooks).toBe(0)
    expect(standIn.deliveries()).toHaveLength(0)
  })
})
