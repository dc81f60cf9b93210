// The `/v1` API: Bearer-key authentication, form-encoded parameters, `Idempotency-Key` replay, and
// every failure answered in Stripe's error envelope. Each route is written as guard → params → handler
// in its resource file; this module runs them in that order.
import express, { type Request, type Response, type Router } from 'express'
import type { RequestContext } from './account'
import { StripeApiError, type StripeErrorBody } from './errors'
import { FormParams, parseForm, type FormNode } from './form-params'
import { newId } from './objects'

export interface ApiCall {
  params: FormParams
  pathId: string
  /** Every path parameter by name (`/transfers/:id/reversals/:reversal`). */
  path: Record<string, string>
  context: RequestContext
  /** The connected account named in the `Stripe-Account` header: the call acts as that account. */
  stripeAccount: string | null
}

export type ApiHandler = (call: ApiCall) => object

export interface ApiRoutes {
  get(path: string, handler: ApiHandler): void
  post(path: string, handler: ApiHandler): void
}

/** One API request as the stand-in saw it, for tests that check what the app sent. */
export interface LoggedApiRequest {
  method: string
  path: string
  params: FormNode
  idempotencyKey: string | null
  status: number
  requestId: string
}

export interface StoredResponse {
  method: string
  path: string
  fingerprint: string
  status: number
  body: string
  requestId: string
  storedAt: number
}

// Stripe keeps an idempotency key's result for at least 24 hours (idempotent requests docs).
const IDEMPOTENCY_RETENTION_MS = 24 * 60 * 60 * 1000
const IDEMPOTENCY_KEY_MAX_LENGTH = 255

function sendJson(res: Response, status: number, body: string): void {
  res.status(status).type('application/json').send(body)
}

function errorJson(body: StripeErrorBody): string {
  return JSON.stringify({ error: body }, null, 2)
}

// Param order does not change what a request means, so the comparison sorts keys.
function fingerprint(node: FormNode): string {
  const sorted = (value: FormNode | string): unknown =>
    typeof value === 'string'
      ? value
      : Object.fromEntries(
          Object.keys(value)
            .sort()
            .map((key) => [key, sorted(value[key])]),
        )
  return JSON.stringify(sorted(node))
}

function maskKey(key: string): string {
  const prefix = /^(sk|rk|pk)_(test|live)_/.exec(key)?.[0] ?? ''
  const visible = key.slice(-4)
  return `${prefix}${'*'.repeat(Math.max(0, key.length - prefix.length - 4))}${visible}`
}

function presentedKey(req: Request): string | null {
  const header = req.get('authorization')
  if (!header) return null
  const bearer = /^Bearer\s+(.+)$/i.exec(header)
  if (bearer) return bearer[1].trim()
  // Stripe also takes the key as the Basic-auth user name with an empty password.
  const basic = /^Basic\s+(.+)$/i.exec(header)
  if (basic) return Buffer.from(basic[1], 'base64').toString('utf8').split(':')[0]
  return null
}

// Stripe's answers to a reused key: too long, first used on another endpoint, or with other parameters.
function idempotencyRefusal(
  key: string,
  earlier: StoredResponse | undefined,
  method: string,
  path: string,
  params: FormNode,
): StripeErrorBody | null {
  if (key.length > IDEMPOTENCY_KEY_MAX_LENGTH) {
    return {
      type: 'invalid_request_error',
      message: `Invalid Idempotency-Key: must be at most ${IDEMPOTENCY_KEY_MAX_LENGTH} characters`,
      param: 'Idempotency-Key',
    }
  }
  if (!earlier) return null
  const retry = `Try using a key other than '${key}' if you meant to execute a different request.`
  if (earlier.method !== method || earlier.path !== path) {
    return {
      type: 'idempotency_error',
      message: `Keys for idempotent requests can only be used for the same endpoint they were first used for ('${earlier.method} ${earlier.path}' vs '${method} ${path}'). ${retry}`,
    }
  }
  if (earlier.fingerprint !== fingerprint(params)) {
    return {
      type: 'idempotency_error',
      message: `Keys for idempotent requests can only be used with the same parameters they were first used with. ${retry}`,
    }
  }
  return null
}

export function createApiRouter(options: {
  secretKey: string | undefined
  now: () => number
  onApiVersion: (version: string) => void
  log: LoggedApiRequest[]
  register: (routes: ApiRoutes) => void
  /** Kept by the caller so it can be saved with the rest of the stand-in's state. */
  stored?: Map<string, StoredResponse>
  /** Called after every request that may have changed something. */
  onChange?: () => void
}): Router {
  const router = express.Router()
  const stored = options.stored ?? new Map<string, StoredResponse>()
  router.use(express.text({ type: () => true, limit: '1mb' }))

  const authError = (key: string | null): StripeErrorBody | null => {
    if (key === null || key === '') {
      return {
        type: 'invalid_request_error',
        message:
          "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').",
      }
    }
    const accepted = options.secretKey !== undefined ? key === options.secretKey : /^sk_test_[A-Za-z0-9_]{8,}$/.test(key)
    if (!accepted) return { type: 'invalid_request_error', message: `Invalid API Key provided: ${maskKey(key)}` }
    return null
  }

  const run = (method: 'GET' | 'POST', handler: ApiHandler) => (req: Request, res: Response) => {
    const requestId = newId.request()
    const idempotencyKey = method === 'POST' ? (req.get('idempotency-key') ?? null) : null
    const rawParams = method === 'POST' ? (typeof req.body === 'string' ? req.body : '') : (req.originalUrl.split('?')[1] ?? '')
    const params = parseForm(rawParams)
    const version = req.get('stripe-version')
    res.set('Request-Id', requestId)
    if (version) {
      res.set('Stripe-Version', version)
      options.onApiVersion(version)
    }
    if (idempotencyKey !== null) res.set('Idempotency-Key', idempotencyKey)
    const path = req.baseUrl + req.path
    const respond = (status: number, body: string) => {
      options.log.push({ method, path, params, idempotencyKey, status, requestId })
      sendJson(res, status, body)
    }

    const apiKey = presentedKey(req)
    const refused = authError(apiKey)
    if (refused) {
      res.set('WWW-Authenticate', 'Bearer realm="Stripe"')
      respond(401, errorJson(refused))
      return
    }

    const stripeAccount = req.get('stripe-account') ?? null
    // Keys are scoped to the account a request acts as, as Stripe scopes them.
    const storeKey = idempotencyKey === null ? null : `${apiKey} ${stripeAccount ?? ''} ${idempotencyKey}`
    if (idempotencyKey !== null && storeKey !== null) {
      const earlier = stored.get(storeKey)
      if (earlier && options.now() - earlier.storedAt > IDEMPOTENCY_RETENTION_MS) stored.delete(storeKey)
      const refusal = idempotencyRefusal(idempotencyKey, stored.get(storeKey), method, path, params)
      if (refusal) {
        respond(400, errorJson(refusal))
        return
      }
      const replay = stored.get(storeKey)
      if (replay) {
        res.set('Idempotent-Replayed', 'true')
        res.set('Original-Request', replay.requestId)
        respond(replay.status, replay.body)
        return
      }
    }

    let status = 200
    let body: string
    try {
      const result = handler({
        params: new FormParams(params),
        pathId: String(req.params.id ?? ''),
        path: Object.fromEntries(Object.entries(req.params).map(([name, value]) => [name, String(value)])),
        context: { requestId, idempotencyKey },
        stripeAccount,
      })
      body = JSON.stringify(result, null, 2)
    } catch (error) {
      if (error instanceof StripeApiError) {
        status = error.status
        body = errorJson(error.body)
      } else {
        // A fault in the stand-in itself: say so loudly rather than let it pass for a Stripe answer.
        console.error('Stripe stand-in failed on', method, path, error)
        status = 500
        body = errorJson({ type: 'api_error', message: 'An unknown error occurred in the Stripe stand-in.' })
      }
    }
    // Stripe saves a result once the endpoint began executing; requests refused as invalid are not saved,
    // so the key can be used again with corrected parameters.
    const executed = status < 400 || status === 402 || status >= 500
    if (storeKey && executed) {
      stored.set(storeKey, { method, path, fingerprint: fingerprint(params), status, body, requestId, storedAt: options.now() })
    }
    respond(status, body)
    if (method === 'POST') options.onChange?.()
  }

  options.register({
    get: (path, handler) => router.get(path, run('GET', handler)),
    post: (path, handler) => router.post(path, run('POST', handler)),
  })

  router.use((req: Request, res: Response) => {
    sendJson(
      res,
      404,
      errorJson({
        type: 'invalid_request_error',
        message: `Unrecognized request URL (${req.method}: ${req.baseUrl}${req.path}).`,
      }),
    )
  })
  return router
}
