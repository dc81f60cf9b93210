// /v1/customers, /v1/payment_methods, /v1/payment_intents, /v1/charges, /v1/refunds and /v1/events:
// the Customer a card is kept for, the reads the app makes after a payment, payments with a kept card,
// and refunds against a succeeded payment.
import type { TestModeAccount } from './account'
import type { ApiRoutes } from './api'
import { isKnownCurrency } from './currency'
import { invalidRequest } from './errors'
import { expandObject } from './expand'

const REFUND_REASONS = ['duplicate', 'fraudulent', 'requested_by_customer'] as const

export function registerPaymentRoutes(routes: ApiRoutes, account: TestModeAccount): void {
  // Server-side payments with a test PaymentMethod; the stand-in confirms at once, so `confirm=true` is required.
  routes.post('/payment_intents', ({ params, context }) => {
    const amount = params.integer('amount', { required: true, min: 1 }) as number
    const currency = (params.string('currency', { required: true }) as string).toLowerCase()
    if (!isKnownCurrency(currency)) throw invalidRequest(`Invalid currency: ${currency}.`, { param: 'currency' })
    const paymentMethod = params.string('payment_method', { required: true }) as string
    const customer = params.string('customer') ?? null
    // `off_session` is a boolean or, in older API versions, `one_off` / `recurring`; any of them means the cardholder is away.
    const offSession = (params.oneOf('off_session', ['true', 'false', 'one_off', 'recurring'] as const) ?? 'false') !== 'false'
    if (params.oneOf('confirm', ['true', 'false'] as const) !== 'true') {
      throw invalidRequest('The local Stripe stand-in makes PaymentIntents with `confirm=true` only.', { param: 'confirm' })
    }
    params.stringList('allowed_payment_method_types')?.forEach((type, index) => {
      if (type !== 'card')
        throw invalidRequest(`The local Stripe stand-in takes cards only; \`${type}\` is not available.`, {
          param: `allowed_payment_method_types[${index}]`,
        })
    })
    const input = {
      amount,
      currency,
      paymentMethod,
      customer,
      offSession,
      metadata: params.metadata() ?? {},
      description: params.string('description', { maxLength: 1000 }) ?? null,
      receiptEmail: params.email('receipt_email') ?? null,
      transferGroup: params.string('transfer_group', { maxLength: 5000 }) ?? null,
    }
    const expand = params.stringList('expand')
    params.finish()
    return expandObject(account, account.createPaymentIntent(input, context), expand)
  })

  routes.post('/customers', ({ params }) => {
    const input = {
      email: params.email('email') ?? null,
      name: params.string('name', { maxLength: 256 }) ?? null,
      description: params.string('description', { maxLength: 350 }) ?? null,
      metadata: params.metadata() ?? {},
    }
    params.finish()
    return account.createCustomer(input)
  })

  routes.get('/customers/:id', ({ params, pathId }) => {
    params.finish()
    return account.customer(pathId)
  })

  routes.get('/payment_methods/:id', ({ params, pathId }) => {
    params.finish()
    return account.paymentMethod(pathId)
  })

  routes.post('/payment_methods/:id/detach', ({ params, pathId }) => {
    params.finish()
    return account.detachPaymentMethod(pathId)
  })

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
