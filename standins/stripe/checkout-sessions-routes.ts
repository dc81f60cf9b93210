// /v1/checkout/sessions: create (mode=payment with inline price_data), retrieve, list line items, expire.
import type { CheckoutSessionInput, LineItemInput, TestModeAccount } from './account'
import type { ApiRoutes } from './api'
import { isKnownCurrency } from './currency'
import { invalidRequest, resourceMissing } from './errors'
import { expandObject } from './expand'
import type { FormParams } from './form-params'

const SUBMIT_TYPES = ['auto', 'book', 'donate', 'pay', 'subscribe'] as const

function readLineItem(item: FormParams, index: number): LineItemInput {
  const priceId = item.string('price')
  if (priceId !== undefined) {
    // The stand-in keeps no price catalogue, so a saved price id is unknown here just as a wrong one is.
    throw resourceMissing('price', priceId, `line_items[${index}][price]`)
  }
  const priceData = item.object('price_data', { required: true }) as FormParams
  const currency = (priceData.string('currency', { required: true }) as string).toLowerCase()
  if (!isKnownCurrency(currency)) {
    throw invalidRequest(`Invalid currency: ${currency}.`, { param: priceData.path('currency') })
  }
  const productId = priceData.string('product')
  if (productId !== undefined) throw resourceMissing('product', productId, priceData.path('product'))
  const product = priceData.object('product_data', { required: true }) as FormParams
  const name = product.string('name', { required: true }) as string
  const description = product.string('description') ?? null
  product.metadata()
  const unitAmount = priceData.integer('unit_amount', { required: true, min: 0 }) as number
  const quantity = item.integer('quantity', { required: true, min: 1 }) as number
  return { name, description, currency, unitAmount, quantity }
}

function readSessionParams(params: FormParams): CheckoutSessionInput {
  // `mode` is optional in the API version the SDK pins; a session without recurring items is a payment.
  const mode = params.oneOf('mode', ['payment', 'setup', 'subscription'] as const) ?? 'payment'
  if (mode !== 'payment') {
    throw invalidRequest('The local Stripe stand-in supports only `mode=payment` Checkout Sessions.', { param: 'mode' })
  }
  // `hosted` is the name older API versions use for `hosted_page`.
  params.oneOf('ui_mode', ['hosted_page', 'hosted'] as const)
  // The SDK's pinned API version replaced `payment_method_types` with `allowed_payment_method_types`.
  const allowedTypes = params.stringList('allowed_payment_method_types')
  allowedTypes?.forEach((type, index) => {
    if (type !== 'card') {
      throw invalidRequest(`The local Stripe stand-in takes cards only; \`${type}\` is not available.`, {
        param: `allowed_payment_method_types[${index}]`,
      })
    }
  })
  const lineItems = (params.list('line_items', { required: true }) as FormParams[]).map(readLineItem)
  const intentData = params.object('payment_intent_data')
  return {
    lineItems,
    allowedPaymentMethodTypes: allowedTypes ?? null,
    successUrl: params.url('success_url') ?? null,
    cancelUrl: params.url('cancel_url') ?? null,
    metadata: params.metadata() ?? {},
    clientReferenceId: params.string('client_reference_id', { maxLength: 200 }) ?? null,
    customerEmail: params.email('customer_email') ?? null,
    customer: params.string('customer') ?? null,
    submitType: params.oneOf('submit_type', SUBMIT_TYPES) ?? null,
    paymentIntentData: {
      metadata: intentData?.metadata() ?? {},
      description: intentData?.string('description', { maxLength: 1000 }) ?? null,
      receiptEmail: intentData?.email('receipt_email') ?? null,
      transferGroup: intentData?.string('transfer_group', { maxLength: 5000 }) ?? null,
      setupFutureUsage: intentData?.oneOf('setup_future_usage', ['on_session', 'off_session'] as const) ?? null,
    },
    expiresAt: params.integer('expires_at') ?? null,
  }
}

export function registerCheckoutSessionRoutes(routes: ApiRoutes, account: TestModeAccount): void {
  routes.post('/checkout/sessions', ({ params }) => {
    const input = readSessionParams(params)
    const expand = params.stringList('expand')
    params.finish()
    return expandObject(account, account.createCheckoutSession(input), expand)
  })

  routes.get('/checkout/sessions/:id', ({ params, pathId }) => {
    const expand = params.stringList('expand')
    params.finish()
    return expandObject(account, account.session(pathId), expand)
  })

  routes.get('/checkout/sessions/:id/line_items', ({ params, pathId }) => {
    params.integer('limit')
    params.string('starting_after')
    params.string('ending_before')
    params.finish()
    return {
      object: 'list',
      data: account.lineItems(pathId),
      has_more: false,
      url: `/v1/checkout/sessions/${pathId}/line_items`,
    }
  })

  routes.post('/checkout/sessions/:id/expire', ({ params, pathId, context }) => {
    const expand = params.stringList('expand')
    params.finish()
    return expandObject(account, account.expireSession(pathId, context), expand)
  })
}
