import express, { Router } from 'express'
import type { AppContext } from '../context'
import { handleStripeEvent, verifyWebhook } from '../services/payments'
import { handleConnectEvent, verifyConnectWebhook } from '../services/payouts'

/**
 * Stripe's webhooks. Mounted before the JSON parser and the CSRF check: the signature is computed
 * over the raw bytes, and the signature is the authentication.
 */
export function webhooksRouter(ctx: AppContext) {
  const router = Router()

  router.post('/webhooks/stripe', express.raw({ type: '*/*', limit: '1mb' }), async (req, res) => {
    const event = verifyWebhook(ctx, req.body as Buffer, req.get('stripe-signature'))
    const outcome = await handleStripeEvent(ctx, event)
    res.json({ received: true, duplicate: outcome === 'duplicate' })
  })

  // The Connect endpoint: events about studios' connected accounts (their state, their bank payouts),
  // signed with that endpoint's own secret.
  router.post('/webhooks/stripe-connect', express.raw({ type: '*/*', limit: '1mb' }), async (req, res) => {
    const event = verifyConnectWebhook(ctx, req.body as Buffer, req.get('stripe-signature'))
    const outcome = await handleConnectEvent(ctx, event)
    res.json({ received: true, duplicate: outcome === 'duplicate' })
  })

  return router
}
