// A local stand-in for the part of the Stripe API the app uses, for development and tests on loopback.
// The app reaches it only through the official `stripe` SDK (`host`, `port`, `protocol: 'http'`), so the
// same code talks to real Stripe when it is configured. It keeps all state in memory: one test-mode
// account per running stand-in, emptied when it stops.
//
// What it serves:
//   POST /v1/checkout/sessions, GET /v1/checkout/sessions/:id, GET /v1/checkout/sessions/:id/line_items,
//   POST /v1/checkout/sessions/:id/expire, GET /v1/payment_intents/:id, GET /v1/charges/:id,
//   POST /v1/refunds, GET /v1/refunds/:id, GET /v1/events/:id,
//   and the hosted test payment page at /checkout/:sessionId (see hosted-checkout.ts).
// Webhooks: checkout.session.completed, checkout.session.expired, payment_intent.succeeded,
// payment_intent.payment_failed, charge.refunded, signed with `webhookSecret`.
import type { AddressInfo } from 'node:net'
import type { Server } from 'node:http'
import express from 'express'
import { TestModeAccount } from './account'
import { createApiRouter, type LoggedApiRequest } from './api'
import { registerCheckoutSessionRoutes } from './checkout-sessions-routes'
import { CHECKOUT_PAGE_PATH, createHostedCheckoutRouter } from './hosted-checkout'
import type { EventObject } from './objects'
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
}

// How often lapsed sessions are expired without waiting for someone to read them.
const EXPIRY_SWEEP_MS = 1_000

export async function startStripeStandIn(options: StripeStandInOptions): Promise<StripeStandIn> {
  const host = options.host ?? '127.0.0.1'
  const now = options.now ?? Date.now
  let observedApiVersion: string | null = null
  let publicUrl = options.publicUrl?.replace(/\/$/, '') ?? ''
  const log: LoggedApiRequest[] = []

  const dispatcher = new WebhookDispatcher({
    url: options.webhookUrl,
    secret: options.webhookSecret,
    policy: { ...DEFAULT_RETRY_POLICY, ...options.webhookRetry },
    onSettled: (eventId, delivered) => {
      if (delivered) account.markDelivered(eventId)
    },
  })
  const account = new TestModeAccount({
    now,
    checkoutPageUrl: (sessionId) => `${publicUrl}${CHECKOUT_PAGE_PATH}/${sessionId}`,
    eventApiVersion: () => options.apiVersion ?? observedApiVersion,
    endpointCount: () => dispatcher.endpointCount,
    raise: (event) => dispatcher.deliver(event),
  })

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
      register: (routes) => {
        registerCheckoutSessionRoutes(routes, account)
        registerPaymentRoutes(routes, account)
      },
    }),
  )
  app.use(CHECKOUT_PAGE_PATH, createHostedCheckoutRouter(account, now))

  const server = await new Promise<Server>((resolve, reject) => {
    const listening = app.listen(options.port ?? 0, host, (error?: Error) => (error ? reject(error) : resolve(listening)))
  })
  const port = (server.address() as AddressInfo).port
  const url = `http://${host.includes(':') ? `[${host}]` : host}:${port}`
  if (!publicUrl) publicUrl = url

  const sweep = setInterval(() => account.expireDue(), EXPIRY_SWEEP_MS)
  sweep.unref()

  return {
    url,
    port,
    setWebhookUrl: (webhookUrl) => dispatcher.setUrl(webhookUrl),
    deliveries: () => dispatcher.deliveries(),
    idle: () => dispatcher.idle(),
    events: () => structuredClone(account.allEvents()),
    requests: () => structuredClone(log),
    expireDueSessions: () => account.expireDue(),
    close: async () => {
      clearInterval(sweep)
      await dispatcher.close()
      await new Promise<void>((resolve, reject) => {
        server.close((error) => (error ? reject(error) : resolve()))
        server.closeAllConnections()
      })
    },
  }
}
