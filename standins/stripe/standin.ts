// A local stand-in for the part of the Stripe API the app uses, for development and tests on loopback.
// The app reaches it only through the official `stripe` SDK (`host`, `port`, `protocol: 'http'`), so the
// same code talks to real Stripe when it is configured. It keeps all state in memory: one test-mode
// account per running stand-in, emptied when it stops.
//
// What it serves:
//   POST /v1/checkout/sessions, GET /v1/checkout/sessions/:id, GET /v1/checkout/sessions/:id/line_items,
//   POST /v1/checkout/sessions/:id/expire, POST /v1/payment_intents (confirmed with a test
//   PaymentMethod), GET /v1/payment_intents/:id, GET /v1/charges/:id, POST /v1/refunds,
//   GET /v1/refunds/:id, GET /v1/events/:id;
//   Connect: POST /v1/accounts, GET /v1/accounts/:id, POST /v1/account_links, POST|GET /v1/transfers,
//   GET /v1/transfers/:id, POST|GET /v1/transfers/:id/reversals, GET /v1/balance,
//   GET /v1/balance_transactions(/:id), GET /v1/payouts(/:id) (the last four also as a connected
//   account, with the Stripe-Account header);
//   the hosted test payment page at /checkout/:sessionId (hosted-checkout.ts) and the hosted test
//   onboarding page at /connect/onboarding/:token (hosted-onboarding.ts).
// Webhooks to the platform endpoint: checkout.session.completed, checkout.session.expired,
// payment_intent.succeeded, payment_intent.payment_failed, charge.refunded, transfer.created,
// transfer.reversed; to the Connect endpoint: account.updated, payout.created, payout.paid,
// payout.failed. Each signed with its endpoint's secret.
import { existsSync, readFileSync, renameSync, writeFileSync } from 'node:fs'
import type { AddressInfo } from 'node:net'
import type { Server } from 'node:http'
import express from 'express'
import { TestModeAccount, type PlatformSnapshot } from './account'
import { createApiRouter, type LoggedApiRequest, type StoredResponse } from './api'
import { BalanceBook } from './balances'
import { registerCheckoutSessionRoutes } from './checkout-sessions-routes'
import { ConnectBook, type ConnectSnapshot } from './connect'
import { registerConnectRoutes } from './connect-routes'
import { EventLog } from './events'
import { CHECKOUT_PAGE_PATH, createHostedCheckoutRouter } from './hosted-checkout'
import { createHostedOnboardingRouter, ONBOARDING_PAGE_PATH } from './hosted-onboarding'
import type { BalanceTransactionObject, EventObject } from './objects'
import { registerPaymentRoutes } from './payments-routes'
import { DEFAULT_RETRY_POLICY, WebhookDispatcher, type WebhookDelivery, type WebhookRetryPolicy } from './webhooks'

export interface StripeStandInOptions {
  /** Interface to listen on; loopback by default. */
  host?: string
  /** 0 picks a free port. */
  port?: number
  /** When set, only this key is accepted; otherwise any well-formed `sk_test_…` key is. */
  secretKey?: string
  /** Where events are POSTed; none are sent until one is set (see `setWebhookUrl`). */
  webhookUrl?: string
  /** The endpoint's signing secret (`whsec_…`), as the app passes it to `stripe.webhooks.constructEvent`. */
  webhookSecret: string
  /** Where events about connected accounts are POSTed (the platform's Connect endpoint); none until set. */
  connectWebhookUrl?: string
  /** The Connect endpoint's signing secret; the platform endpoint's when left out. */
  connectWebhookSecret?: string
  /**
   * A JSON file the test-mode account is kept in between runs (`npm start` sets one), as Stripe keeps
   * an account's objects; without it everything is in memory and gone when the stand-in stops.
   */
  stateFile?: string
  /** Base URL of the hosted payment page as the customer's browser reaches it; defaults to the listening URL. */
  publicUrl?: string
  /** Webhook retry timing; defaults to 200 ms doubling, 8 attempts, 5 s per attempt. */
  webhookRetry?: Partial<WebhookRetryPolicy>
  /** `api_version` written on events; defaults to the `Stripe-Version` the SDK last sent. */
  apiVersion?: string
  /** Clock in milliseconds for `created` and `expires_at`, so a test can move time on. */
  now?: () => number
}

export interface StripeStandIn {
  url: string
  port: number
  close(): Promise<void>
  setWebhookUrl(url: string): void
  setConnectWebhookUrl(url: string): void
  /** Every webhook delivery so far with its attempts. */
  deliveries(): WebhookDelivery[]
  /** Resolves once no delivery is pending (each has been answered 2xx or has used up its attempts). */
  idle(): Promise<void>
  /** Every event raised so far, oldest first, as `GET /v1/events/:id` returns them. */
  events(): EventObject[]
  /** Every API request received, for tests that check what the app sent. */
  requests(): LoggedApiRequest[]
  /** Expires every open session whose `expires_at` has passed on the stand-in's clock. */
  expireDueSessions(): void
  /** Runs the automatic payout schedule now (it also runs every second). */
  runPayouts(): void
}

// How often lapsed sessions are expired, and payouts made and landed, without waiting for a request.
const SWEEP_MS = 1_000

interface SavedState {
  version: 1
  platform: PlatformSnapshot
  connect: ConnectSnapshot
  balances: [string, BalanceTransactionObject[]][]
  events: EventObject[]
  idempotency: [string, StoredResponse][]
}

export async function startStripeStandIn(options: StripeStandInOptions): Promise<StripeStandIn> {
  const host = options.host ?? '127.0.0.1'
  const now = options.now ?? Date.now
  let observedApiVersion: string | null = null
  let publicUrl = options.publicUrl?.replace(/\/$/, '') ?? ''
  const log: LoggedApiRequest[] = []

  const dispatcher = new WebhookDispatcher({
    url: options.webhookUrl,
    secret: options.webhookSecret,
    connectUrl: options.connectWebhookUrl,
    connectSecret: options.connectWebhookSecret,
    policy: { ...DEFAULT_RETRY_POLICY, ...options.webhookRetry },
    onSettled: (eventId, delivered) => {
      if (delivered) events.markDelivered(eventId)
    },
  })
  const events = new EventLog({
    now,
    apiVersion: () => options.apiVersion ?? observedApiVersion,
    endpointCount: (connect) => dispatcher.endpointCount(connect),
    deliver: (event) => dispatcher.deliver(event),
  })
  const book = new BalanceBook(now)
  const account = new TestModeAccount({
    now,
    checkoutPageUrl: (sessionId) => `${publicUrl}${CHECKOUT_PAGE_PATH}/${sessionId}`,
    events,
    book,
  })
  const connect = new ConnectBook({
    now,
    platform: account,
    book,
    events,
    onboardingPageUrl: (token) => `${publicUrl}${ONBOARDING_PAGE_PATH}/${token}`,
  })
  const idempotency = new Map<string, StoredResponse>()

  const state = options.stateFile
  if (state && existsSync(state)) {
    const saved = JSON.parse(readFileSync(state, 'utf8')) as SavedState
    account.restore(saved.platform)
    connect.restore(saved.connect)
    book.restore(saved.balances)
    events.restore(saved.events)
    for (const [key, response] of saved.idempotency) idempotency.set(key, response)
  }
  const save = () => {
    if (!state) return
    const saved: SavedState = {
      version: 1,
      platform: account.snapshot(),
      connect: connect.snapshot(),
      balances: book.snapshot(),
      events: events.snapshot(),
      idempotency: [...idempotency],
    }
    writeFileSync(`${state}.tmp`, JSON.stringify(saved))
    renameSync(`${state}.tmp`, state)
  }
  let saveTimer: NodeJS.Timeout | null = null
  const changed = () => {
    if (!state || saveTimer) return
    saveTimer = setTimeout(() => {
      saveTimer = null
      save()
    }, 200)
  }

  const app = express()
  app.disable('x-powered-by')
  // Stripe sends no ETag, and a 304 would hide a changed object from the SDK.
  app.set('etag', false)
  app.use(
    '/v1',
    createApiRouter({
      secretKey: options.secretKey,
      now,
      onApiVersion: (version) => {
        observedApiVersion = version
      },
      log,
      stored: idempotency,
      onChange: changed,
      register: (routes) => {
        registerCheckoutSessionRoutes(routes, account)
        registerPaymentRoutes(routes, account)
        registerConnectRoutes(routes, connect, book)
      },
    }),
  )
  app.use(CHECKOUT_PAGE_PATH, createHostedCheckoutRouter(account, now, changed))
  app.use(ONBOARDING_PAGE_PATH, createHostedOnboardingRouter(connect, changed))

  const server = await new Promise<Server>((resolve, reject) => {
    const listening = app.listen(options.port ?? 0, host, (error?: Error) => (error ? reject(error) : resolve(listening)))
  })
  const port = (server.address() as AddressInfo).port
  const url = `http://${host.includes(':') ? `[${host}]` : host}:${port}`
  if (!publicUrl) publicUrl = url

  const sweep = setInterval(() => {
    const before = events.all().length
    account.expireDue()
    connect.runPayouts()
    if (events.all().length !== before) changed()
  }, SWEEP_MS)
  sweep.unref()

  return {
    url,
    port,
    setWebhookUrl: (webhookUrl) => dispatcher.setUrl(webhookUrl),
    setConnectWebhookUrl: (webhookUrl) => dispatcher.setConnectUrl(webhookUrl),
    deliveries: () => dispatcher.deliveries(),
    idle: () => dispatcher.idle(),
    events: () => structuredClone(events.all()),
    requests: () => structuredClone(log),
    expireDueSessions: () => account.expireDue(),
    runPayouts: () => connect.runPayouts(),
    close: async () => {
      clearInterval(sweep)
      if (saveTimer) clearTimeout(saveTimer)
      save()
      await dispatcher.close()
      await new Promise<void>((resolve, reject) => {
        server.close((error) => (error ? reject(error) : resolve()))
        server.closeAllConnections()
      })
    },
  }
}
