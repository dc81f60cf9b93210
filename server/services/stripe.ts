import Stripe from 'stripe'
import type { Config } from '../config'

const clients = new Map<string, Stripe>()

/**
 * The Stripe SDK, pointed at STRIPE_API_BASE when it is set (the local stand-in in development and
 * tests) and at Stripe itself otherwise. The address is the only difference: no code path knows
 * which one it is talking to.
 */
export function stripeFor(config: Pick<Config, 'stripeSecretKey' | 'stripeApiBase'>): Stripe {
  const key = `${config.stripeSecretKey}|${config.stripeApiBase ?? ''}`
  let client = clients.get(key)
  if (!client) {
    const base = config.stripeApiBase ? new URL(config.stripeApiBase) : null
    client = new Stripe(config.stripeSecretKey, {
      ...(base
        ? {
            host: base.hostname,
            port: Number(base.port || (base.protocol === 'https:' ? 443 : 80)),
            protocol: base.protocol === 'https:' ? 'https' : 'http',
          }
        : {}),
      maxNetworkRetries: 2,
      timeout: 15_000,
      appInfo: { name: 'Conewright' },
    })
    clients.set(key, client)
  }
  return client
}
