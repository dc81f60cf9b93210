import type { Request, RequestHandler } from 'express'
import type { AppContext } from '../context'
import { Kiln } from '../entities/Kiln'
import { Studio } from '../entities/Studio'
import { StudioMember, type StudioRole } from '../entities/StudioMember'
import { forbidden, notFound, unauthorized } from '../http/errors'
import { isUuid } from '../http/validate'

/** Finds the studio a route's record belongs to; null when the record does not exist. */
export type StudioResolver = (req: Request) => Promise<string | null>

const param = (req: Request, name: string) => {
  const value = req.params[name]
  return isUuid(value) ? value : null
}

export function studioFromParam(ctx: AppContext, name = 'id'): StudioResolver {
  return async (req) => {
    const id = param(req, name)
    if (!id) return null
    return (await ctx.db.getRepository(Studio).exists({ where: { id } })) ? id : null
  }
}

export function studioOfKiln(ctx: AppContext, name = 'id'): StudioResolver {
  return async (req) => {
    const id = param(req, name)
    if (!id) return null
    const kiln = await ctx.db.getRepository(Kiln).findOne({ where: { id }, select: { id: true, studioId: true } })
    return kiln?.studioId ?? null
  }
}

export function studioOfFiring(ctx: AppContext, name = 'id'): StudioResolver {
  return async (req) => {
    const id = param(req, name)
    if (!id) return null
    const rows: { studio_id: string }[] = await ctx.db.query(
      `SELECT k.studio_id FROM firings f JOIN kilns k ON k.id = f.kiln_id WHERE f.id = $1`,
      [id],
    )
    return rows[0]?.studio_id ?? null
  }
}

/** The caller's role in a studio, or null. Admins count as owners everywhere. */
export async function studioRoleOf(ctx: AppContext, req: Request, studioId: string): Promise<StudioRole | null> {
  if (!req.user) return null
  if (req.user.role === 'admin') return 'owner'
  const member = await ctx.db.getRepository(StudioMember).findOne({ where: { studioId, userId: req.user.id } })
  return member?.role ?? null
}

async function isPublished(ctx: AppContext, studioId: string) {
  return ctx.db.getRepository(Studio).exists({ where: { id: studioId, published: true } })
}

/**
 * The one ownership check for studio resources: signed in, a member of the record's studio, with one
 * of these roles. A record the caller cannot see is a 404, as if it were not there; a published one
 * the caller may see but not change is a 403.
 */
export function requireStudioMember(ctx: AppContext, roles: StudioRole[], resolve: StudioResolver): RequestHandler {
  return async (req, res, next) => {
    if (!req.user) return next(unauthorized())
    const studioId = await resolve(req)
    if (!studioId) return next(notFound())
    const role = await studioRoleOf(ctx, req, studioId)
    if (!role)
      return next((await isPublished(ctx, studioId)) ? forbidden('Only the studio’s own people can do that.', 'not-a-member') : notFound())
    if (!roles.includes(role)) return next(forbidden(`Only the studio’s ${roles.join(' or ')} can do that.`, 'studio-role'))
    res.locals.studioId = studioId
    res.locals.studioRole = role
    next()
  }
}

/**
 * Read access: anyone may read a published studio's public side; members (and admins) read drafts
 * and the private side too. Sets `res.locals.studioRole` (null for the public).
 */
export function allowStudioReader(ctx: AppContext, resolve: StudioResolver): RequestHandler {
  return async (req, res, next) => {
    const studioId = await resolve(req)
    if (!studioId) return next(notFound())
    const role = await studioRoleOf(ctx, req, studioId)
    if (!role && !(await isPublished(ctx, studioId))) return next(notFound())
    res.locals.studioId = studioId
    res.locals.studioRole = role
    next()
  }
}
