// /v1/payment_intents, /v1/charges, /v1/refunds and /v1/events: the reads the app makes after a
// payment, and refunds against a succeeded payment.
import type { TestModeAccount } from './account'
import type { ApiRoutes } from './api'
import { expandObject } from './expand'

const REFUND_REASONS = ['duplicate', 'fraudulent', 'requested_by_customer'] as const

export function registerPaymentRoutes(routes: ApiRoutes, account: TestModeAccount): void {
  routes.get('/payment_intents/:id', ({ params, pathId }) => {
    const expand = params.stringList('expand')
    params.finish()
    return expandObject(account, account.paymentIntent(pathId), expand)
  })

  routes.get('/charges/:id', ({ params, pathId }) => {
    const expand = params.stringList('expand')
    params.finish()
    return expandObject(account, account.charge(pathId), expand)
  })

  routes.post('/refunds', ({ params, context }) => {
    const input = {
      paymentIntent: params.string('payment_intent') ?? null,
      charge: params.string('charge') ?? null,
      amount: params.integer('amount', { min: 1 }) ?? null,
      metadata: params.metadata() ?? {},
      reason: params.oneOf('reason', REFUND_REASONS) ?? null,
    }
    const expand = params.stringList('expand')
    params.finish()
    return expandObject(account, account.createRefund(input, context), expand)
  })

  routes.get('/refunds/:id', ({ params, pathId }) => {
    const expand = params.stringList('expand')
    params.finish()
    return expandObject(account, account.refund(pathId), expand)
  })

  routes.get('/events/:id', ({ params, pathId }) => {
    params.finish()
    return account.event(pathId)
  })
}
