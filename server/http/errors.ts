import type { ErrorRequestHandler, RequestHandler } from 'express'
import { ZodError } from 'zod'

export type FieldErrors = Record<string, string>

/** An error the client is meant to see: status, a stable code, a plain-words message. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: FieldErrors,
    /** Extra keys merged into the error body, e.g. `allowed` next states or ware-check `findings`. */
    readonly extra?: Record<string, unknown>,
  ) {
    super(message)
  }
}

export const badRequest = (message: string, fields?: FieldErrors, code = 'invalid-input') => new HttpError(400, code, message, fields)
export const unauthorized = (message = 'Sign in first.') => new HttpError(401, 'not-signed-in', message)
export const forbidden = (message = 'You are not allowed to do that.', code = 'forbidden') => new HttpError(403, code, message)
export const notFound = (what = 'That') => new HttpError(404, 'not-found', `${what} was not found.`)
export const conflict = (message: string, code = 'conflict', extra?: Record<string, unknown>) =>
  new HttpError(409, code, message, undefined, extra)

export function fieldErrorsFrom(error: ZodError): FieldErrors {
  const fields: FieldErrors = {}
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_'
    fields[key] ??= issue.message
  }
  return fields
}

export const notFoundApi: RequestHandler = (req, _res, next) => {
  next(new HttpError(404, 'no-such-route', `There is no ${req.method} ${req.path} in the API.`))
}

interface BodyParserError extends Error {
  type?: string
  status?: number
  code?: string
}

/** How long a client should wait before trying again while the database is out of reach. */
export const DATABASE_RETRY_AFTER_S = 10

const CONNECTION_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'EHOSTUNREACH',
  'ENETUNREACH',
  'ENOTFOUND',
  'EAI_AGAIN',
])
const CONNECTION_MESSAGES =
  /Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error|Connection ended unexpectedly|the database system is (starting up|shutting down|in recovery mode)/i

/** The error (or the driver error inside it) of a database that cannot be reached, or is going away. */
export function isDatabaseUnavailable(error: unknown): boolean {
  for (const e of [error, (error as { driverError?: unknown } | null)?.driverError]) {
    if (!e || typeof e !== 'object') continue
    const code = String((e as { code?: unknown }).code ?? '')
    // Class 08: connection exceptions; 57P01-57P03: the server shutting down or not yet accepting; 53300: too many connections.
    if (CONNECTION_CODES.has(code) || code.startsWith('08') || /^57P0[123]$/.test(code) || code === '53300') return true
    if (e instanceof Error && CONNECTION_MESSAGES.test(e.message)) return true
    if (e instanceof AggregateError && e.errors.some(isDatabaseUnavailable)) return true
  }
  return false
}

/**
 * PostgreSQL refused a value as data (class 22: a NUL, an unpaired surrogate in JSON, a malformed uuid,
 * a number out of range). Only input can cause that, so it is the client's 400; but the schema should
 * have caught it first, so it is also logged.
 */
function isRefusedData(error: unknown): boolean {
  return sqlState(error).startsWith('22')
}

/** A constraint refused the change (class 23): two changes met, or a check the code should have made first. */
function isConstraintConflict(error: unknown): boolean {
  return sqlState(error).startsWith('23')
}

const sqlState = (error: unknown) => String((error as { driverError?: { code?: unknown } } | null)?.driverError?.code ?? '')

export interface ErrorHandlerHooks {
  /** Called for every request answered 503 because the database is out of reach. */
  databaseDown?: (error: unknown) => void
  /** Called when the database refused what the code let through (a value, or a change against a constraint). */
  refusedByDatabase?: (message: string, error: unknown) => void
}

/** Turns anything thrown in a route into the one error shape; only the unexpected are 500s. */
export function errorHandler(log: (message: string, error: unknown) => void, hooks: ErrorHandlerHooks = {}): ErrorRequestHandler {
  return (error: unknown, req, res, _next) => {
    if (res.headersSent) return
    const send = (status: number, code: string, message: string, fields?: FieldErrors, extra?: object) =>
      res.status(status).json({ error: { code, message, ...(fields ? { fields } : {}), ...extra } })

    if (error instanceof HttpError) {
      const retryAfter = error.extra?.retryAfterSeconds
      if (typeof retryAfter === 'number') res.set('Retry-After', String(retryAfter))
      return send(error.status, error.code, error.message, error.fields, error.extra)
    }
    if (error instanceof ZodError) return send(400, 'invalid-input', 'Some fields need fixing.', fieldErrorsFrom(error))
    const e = error as BodyParserError
    if (e?.type === 'entity.parse.failed') return send(400, 'malformed-json', 'The request body is not valid JSON.')
    if (e?.type === 'entity.too.large') return send(413, 'body-too-large', 'The request body is too large.')
    if (e?.type === 'encoding.unsupported' || e?.type === 'charset.unsupported')
      return send(415, 'unsupported-encoding', 'The request body uses an encoding we do not accept.')
    if (e?.code === 'EBADCSRFTOKEN')
      return send(403, 'csrf-invalid', 'Your session token is missing or out of date. Reload the page and try again.')
    if (typeof e?.status === 'number' && e.status >= 400 && e.status < 500)
      return send(e.status, 'bad-request', e.message || 'The request could not be understood.')
    if (isDatabaseUnavailable(error)) {
      hooks.databaseDown?.(error)
      res.set('Retry-After', String(DATABASE_RETRY_AFTER_S))
      return send(503, 'database-unavailable', 'Conewright cannot reach its database just now. Nothing was changed; try again in a minute.')
    }
    if (isRefusedData(error)) {
      ;(hooks.refusedByDatabase ?? log)(`input reached the database unvalidated on ${req.method} ${req.path}`, error)
      return send(400, 'invalid-input', 'Some of what was sent cannot be stored. Check the fields and try again.')
    }
    if (isConstraintConflict(error)) {
      ;(hooks.refusedByDatabase ?? log)(`a constraint refused a change on ${req.method} ${req.path}, unchecked by the code`, error)
      return send(409, 'conflict', 'That change clashes with another made at the same time. Reload and try again.')
    }
    log(`unhandled error on ${req.method} ${req.originalUrl}`, error)
    return send(500, 'internal', 'Something went wrong on our side. Nothing was changed; please try again.')
  }
}
