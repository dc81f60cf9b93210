import type { RequestHandler } from 'express'
import type { ZodType } from 'zod'
import { HttpError, fieldErrorsFrom } from './errors'

/**
 * What a validating middleware checks, attached to the middleware itself so that tools walking the
 * router (the fuzz suite) find every route's schema without a list kept by hand.
 */
export interface Validation {
  where: 'body' | 'query' | 'multipart'
  schema: ZodType
  /** For multipart bodies: the field that carries the files. */
  fileField?: string
}

const VALIDATION = Symbol.for('conewright.validation')

export function describeValidation<T extends RequestHandler>(handler: T, validation: Validation): T {
  return Object.assign(handler, { [VALIDATION]: validation })
}

/** The validation a middleware performs, if it is one of ours. */
export function validationOf(handler: unknown): Validation | null {
  return ((handler as Record<symbol, Validation> | null)?.[VALIDATION] as Validation | undefined) ?? null
}

/** Parses `req.body` with a shared schema; the route then reads the parsed value from `req.body`. */
export function validateBody(schema: ZodType): RequestHandler {
  return describeValidation(
    (req, _res, next) => {
      const result = schema.safeParse(req.body ?? {})
      if (!result.success) {
        return next(new HttpError(400, 'invalid-input', 'Some fields need fixing.', fieldErrorsFrom(result.error)))
      }
      req.body = result.data
      next()
    },
    { where: 'body', schema },
  )
}

/** Parses the query string; the parsed value is left on `res.locals.query`. */
export function validateQuery(schema: ZodType): RequestHandler {
  return describeValidation(
    (req, res, next) => {
      const result = schema.safeParse(req.query)
      if (!result.success) {
        return next(new HttpError(400, 'invalid-query', 'Some search options need fixing.', fieldErrorsFrom(result.error)))
      }
      res.locals.query = result.data
      next()
    },
    { where: 'query', schema },
  )
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
