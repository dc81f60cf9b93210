// /v1/accounts, /v1/account_links, /v1/transfers (and their reversals), /v1/balance,
// /v1/balance_transactions and /v1/payouts: what a marketplace platform calls to pay its sellers.
import type { BalanceBook } from './balances'
import type { ApiCall, ApiRoutes } from './api'
import type { ConnectBook } from './connect'
import { isKnownCurrency } from './currency'
import { invalidRequest, resourceMissing } from './errors'
import type { FormParams } from './form-params'

interface Identified {
  id: string
}

// Stripe's list envelope with cursor pagination (`limit` 1–100, default 10; `starting_after`).
function page<T extends Identified>(items: T[], params: FormParams, url: string) {
  const limit = params.integer('limit', { min: 1 }) ?? 10
  if (limit > 100) throw invalidRequest('This value must be less than or equal to 100.', { param: 'limit' })
  const after = params.string('starting_after')
  params.string('ending_before')
  let start = 0
  if (after !== undefined) {
    const index = items.findIndex((item) => item.id === after)
    if (index < 0) throw resourceMissing('object', after, 'starting_after')
    start = index + 1
  }
  const data = items.slice(start, start + limit)
  return { object: 'list' as const, data, has_more: start + limit < items.length, url }
}

// Platform-only calls refuse to act as a connected account.
function asPlatform(call: ApiCall, what: string): void {
  if (call.stripeAccount !== null) {
    throw invalidRequest(`The local Stripe stand-in makes ${what} on the platform account only; leave out the Stripe-Account header.`)
  }
}

export function registerConnectRoutes(routes: ApiRoutes, connect: ConnectBook, book: BalanceBook): void {
  routes.post('/accounts', (call) => {
    asPlatform(call, 'connected accounts')
    const { params } = call
    const type = params.oneOf('type', ['express', 'standard', 'custom'] as const, { required: true })
    if (type !== 'express') throw invalidRequest('The local Stripe stand-in makes Express accounts only.', { param: 'type' })
    const country = (params.string('country') ?? 'US').toUpperCase()
    if (!/^[A-Z]{2}$/.test(country)) throw invalidRequest(`Invalid country: ${country}`, { param: 'country' })
    const profile = params.object('business_profile')
    const businessName = profile?.string('name', { maxLength: 5000 }) ?? null
    const productDescription = profile?.string('product_description', { maxLength: 40000 }) ?? null
    profile?.url('url')
    profile?.string('mcc')
    const capabilities = params.object('capabilities')
    const transfers = capabilities?.object('transfers')?.oneOf('requested', ['true', 'false'] as const)
    capabilities?.object('card_payments')?.oneOf('requested', ['true', 'false'] as const)
    params.oneOf('business_type', ['individual', 'company', 'non_profit', 'government_entity'] as const)
    const defaultCurrency = params.string('default_currency')?.toLowerCase() ?? null
    if (defaultCurrency && !isKnownCurrency(defaultCurrency))
      throw invalidRequest(`Invalid currency: ${defaultCurrency}.`, { param: 'default_currency' })
    const input = {
      type,
      country,
      email: params.email('email') ?? null,
      businessName,
      productDescription,
      transfersRequested: transfers === 'true',
      metadata: params.metadata() ?? {},
      defaultCurrency,
    }
    params.stringList('expand')
    params.finish()
    return connect.createAccount(input)
  })

  routes.get('/accounts/:id', ({ params, pathId }) => {
    params.stringList('expand')
    params.finish()
    return connect.account(pathId)
  })

  routes.post('/account_links', (call) => {
    asPlatform(call, 'account links')
    const { params } = call
    const input = {
      account: params.string('account', { required: true }) as string,
      type: params.oneOf('type', ['account_onboarding', 'account_update'] as const, { required: true })!,
      refreshUrl: params.url('refresh_url', { required: true }) as string,
      returnUrl: params.url('return_url', { required: true }) as string,
    }
    params.oneOf('collect', ['currently_due', 'eventually_due'] as const)
    params.object('collection_options')?.oneOf('fields', ['currently_due', 'eventually_due'] as const)
    params.finish()
    return connect.createAccountLink(input)
  })

  routes.post('/transfers', (call) => {
    asPlatform(call, 'transfers')
    const { params, context } = call
    const input = {
      amount: params.integer('amount', { required: true, min: 1 }) as number,
      currency: (params.string('currency', { required: true }) as string).toLowerCase(),
      destination: params.string('destination', { required: true }) as string,
      transferGroup: params.string('transfer_group', { maxLength: 5000 }) ?? null,
      sourceTransaction: params.string('source_transaction') ?? null,
      description: params.string('description', { maxLength: 5000 }) ?? null,
      metadata: params.metadata() ?? {},
    }
    params.stringList('expand')
    params.finish()
    return connect.createTransfer(input, context)
  })

  routes.get('/transfers', (call) => {
    asPlatform(call, 'transfers')
    const { params } = call
    const filter = { destination: params.string('destination'), transferGroup: params.string('transfer_group') }
    const listed = page(connect.listTransfers(filter), params, '/v1/transfers')
    params.stringList('expand')
    params.finish()
    return listed
  })

  routes.get('/transfers/:id', ({ params, pathId }) => {
    params.stringList('expand')
    params.finish()
    return connect.transfer(pathId)
  })

  routes.post('/transfers/:id/reversals', (call) => {
    asPlatform(call, 'transfer reversals')
    const { params, pathId, context } = call
    const input = {
      amount: params.integer('amount', { min: 1 }) ?? null,
      description: params.string('description', { maxLength: 5000 }) ?? null,
      metadata: params.metadata() ?? {},
    }
    params.oneOf('refund_application_fee', ['true', 'false'] as const)
    params.stringList('expand')
    params.finish()
    return connect.createReversal(pathId, input, context)
  })

  routes.get('/transfers/:id/reversals', ({ params, pathId }) => {
    const listed = page(connect.transfer(pathId).reversals.data, params, `/v1/transfers/${pathId}/reversals`)
    params.finish()
    return listed
  })

  routes.get('/transfers/:id/reversals/:reversal', ({ params, path }) => {
    params.stringList('expand')
    params.finish()
    return connect.reversal(path.id, path.reversal)
  })

  routes.get('/balance', ({ params, stripeAccount }) => {
    params.finish()
    if (stripeAccount) connect.account(stripeAccount)
    const available = [...book.available(stripeAccount)].map(([currency, amount]) => ({ amount, currency, source_types: { card: amount } }))
    return {
      object: 'balance',
      available: available.length ? available : [{ amount: 0, currency: 'usd', source_types: { card: 0 } }],
      livemode: false,
      pending: available.map(({ currency }) => ({ amount: 0, currency, source_types: { card: 0 } })),
    }
  })

  routes.get('/balance_transactions', ({ params, stripeAccount }) => {
    if (stripeAccount) connect.account(stripeAccount)
    const filter = { type: params.string('type'), source: params.string('source') }
    params.string('currency')
    params.string('payout')
    const listed = page(book.list(stripeAccount, filter), params, '/v1/balance_transactions')
    params.stringList('expand')
    params.finish()
    return listed
  })

  routes.get('/balance_transactions/:id', ({ params, pathId, stripeAccount }) => {
    params.stringList('expand')
    params.finish()
    const entry = book.get(stripeAccount, pathId)
    if (!entry) throw resourceMissing('balance transaction', pathId, 'id')
    return entry
  })

  routes.get('/payouts', ({ params, stripeAccount }) => {
    if (stripeAccount) connect.account(stripeAccount)
    params.string('status')
    params.string('destination')
    const listed = page(stripeAccount ? connect.listPayouts(stripeAccount) : [], params, '/v1/payouts')
    params.stringList('expand')
    params.finish()
    return listed
  })

  routes.get('/payouts/:id', ({ params, pathId, stripeAccount }) => {
    params.stringList('expand')
    params.finish()
    if (!stripeAccount) throw resourceMissing('payout', pathId, 'payout')
    return connect.payout(stripeAccount, pathId)
  })
}
