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

/** Turns anything thrown in a route into the one error shape; only the unexpected are 500s. */
export function errorHandler(log: (message: string, error: unknown) => void): ErrorRequestHandler {
  return (error: unknown, req, res, _next) => {
    if (res.headersSent) return
    const send = (status: number, code: string, message: string, fields?: FieldErrors, extra?: object) =>
      res.status(status).json({ error: { code, message, ...(fields ? { fields } : {}), ...extra } })

    if (error instanceof HttpError) return send(error.status, error.code, error.message, error.fields, error.extra)
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
    log(`unhandled error on ${req.method} ${req.originalUrl}`, error)
    return send(500, 'internal', 'Something went wrong on our side. Nothing was changed; please try again.')
  }
}
