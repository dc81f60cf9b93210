import type { RequestHandler } from 'express'
import type { ZodType } from 'zod'
import { HttpError, fieldErrorsFrom } from './errors'

/** Parses `req.body` with a shared schema; the route then reads the parsed value from `req.body`. */
export function validateBody(schema: ZodType): RequestHandler {
  return (req, _res, next) => {
    const result = schema.safeParse(req.body ?? {})
    if (!result.success) {
      return next(new HttpError(400, 'invalid-input', 'Some fields need fixing.', fieldErrorsFrom(result.error)))
    }
    req.body = result.data
    next()
  }
}

/** Parses the query string; the parsed value is left on `res.locals.query`. */
export function validateQuery(schema: ZodType): RequestHandler {
  return (req, res, next) => {
    const result = schema.safeParse(req.query)
    if (!result.success) {
      return next(new HttpError(400, 'invalid-query', 'Some search options need fixing.', fieldErrorsFrom(result.error)))
    }
    res.locals.query = result.data
    next()
  }
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i

/** Ids are uuids; anything else cannot name a record, so it is looked up nowhere. */
export function isUuid(value: unknown): value is string {
  return typeof value === 'string' && UUID.test(value)
}

/** Route ids are uuids; anything else cannot exist, so it is a 404 rather than a database error. */
export function requireUuidParams(...names: string[]): RequestHandler {
  return (req, _res, next) => {
    for (const name of names) {
      if (!isUuid(req.params[name])) return next(new HttpError(404, 'not-found', 'That was not found.'))
    }
    next()
  }
}
