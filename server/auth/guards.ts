import type { Request, RequestHandler } from 'express'
import type { UserRole } from '../../shared/schemas/auth'
import type { AppContext } from '../context'
import { StudioMember, type StudioRole } from '../entities/StudioMember'
import { forbidden, notFound, unauthorized } from '../http/errors'

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

/** The caller's role in a studio, or null. Admins count as owners everywhere. */
export async function studioRoleOf(ctx: AppContext, req: Request, studioId: string): Promise<StudioRole | null> {
  if (!req.user) return null
  if (req.user.role === 'admin') return 'owner'
  const member = await ctx.db.getRepository(StudioMember).findOne({ where: { studioId, userId: req.user.id } })
  return member?.role ?? null
}

/**
 * The one ownership check for studio resources. `studioIdOf` finds the studio a route's record
 * belongs to (null when the record does not exist). A non-member gets 404, as if nothing were
 * there; a member without the role gets 403.
 */
export function requireStudioMember(
  ctx: AppContext,
  roles: StudioRole[],
  studioIdOf: (req: Request) => Promise<string | null> | string | null = (req) => String(req.params.studioId ?? req.params.id),
): RequestHandler {
  return async (req, res, next) => {
    if (!req.user) return next(unauthorized())
    const studioId = await studioIdOf(req)
    if (!studioId) return next(notFound())
    const role = await studioRoleOf(ctx, req, studioId)
    if (!role) return next(notFound())
    if (!roles.includes(role)) return next(forbidden(`Only the studio's ${roles.join(' or ')} can do that.`, 'studio-role'))
    res.locals.studioId = studioId
    res.locals.studioRole = role
    next()
  }
}
