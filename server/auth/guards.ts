import type { RequestHandler } from 'express'
import type { UserRole } from '../../shared/schemas/auth'
import { forbidden, unauthorized } from '../http/errors'

export const requireAuth: RequestHandler = (req, _res, next) => {
  next(req.user ? undefined : unauthorized())
}

/** Signed in with one of these account roles (admins pass every role check). */
export function requireRole(...roles: UserRole[]): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) return next(unauthorized())
    if (req.user.role !== 'admin' && !roles.includes(req.user.role)) {
      return next(forbidden('Your account cannot do that.', 'wrong-role'))
    }
    next()
  }
}
