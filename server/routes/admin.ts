import { Router } from 'express'
import { z } from 'zod'
import { requireRole } from '../auth/guards'
import type { AppContext } from '../context'
import { User } from '../entities/User'
import { badRequest, notFound } from '../http/errors'
import { requireUuidParams, validateBody, validateQuery } from '../http/validate'
import { adminRefundSchema } from '../../shared/schemas/requests'
import { requestRows } from '../services/request-views'
import { adminRefund } from '../services/requests'
import { FiringRequest } from '../entities/FiringRequest'

const usersQuery = z.object({ q: z.string().trim().max(120).optional() })

/** The marketplace desk: studios to verify, and accounts to suspend or restore. Admins only. */
export function adminRouter(ctx: AppContext) {
  const router = Router()
  const admin = requireRole('admin')

  router.get('/admin/studios', admin, async (_req, res) => {
    const rows = await ctx.db.query(
      `SELECT s.id, s.name, s.city, s.region, s.published, s.verified_at IS NOT NULL AS verified, s.created_at AS "createdAt",
              (SELECT count(*)::int FROM kilns k WHERE k.studio_id = s.id AND k.retired_at IS NULL) AS kilns,
              (SELECT count(*)::int FROM firings f JOIN kilns k ON k.id = f.kiln_id WHERE k.studio_id = s.id AND f.firing_date > now()) AS "upcomingFirings",
              (SELECT json_agg(json_build_object('name', u.display_name, 'email', u.email)) FROM studio_members m JOIN users u ON u.id = m.user_id WHERE m.studio_id = s.id AND m.role = 'owner') AS owners
       FROM studios s WHERE s.name NOT LIKE 'Bench studio %' ORDER BY (s.published AND s.verified_at IS NULL) DESC, s.created_at DESC LIMIT 500`,
    )
    res.json({ studios: rows })
  })

  router.get('/admin/users', admin, validateQuery(usersQuery), async (_req, res) => {
    const { q } = res.locals.query as z.infer<typeof usersQuery>
    const rows = await ctx.db.query(
      `SELECT id, email, display_name AS "displayName", role, suspended_at IS NOT NULL AS suspended, created_at AS "createdAt"
       FROM users WHERE ($1::text IS NULL OR email ILIKE '%' || $1 || '%' OR display_name ILIKE '%' || $1 || '%')
       ORDER BY created_at DESC LIMIT 50`,
      [q || null],
    )
    res.json({ users: rows })
  })

  router.post(
    '/admin/users/:id/suspend',
    admin,
    requireUuidParams('id'),
    validateBody(z.object({ suspended: z.boolean() })),
    async (req, res) => {
      const user = await ctx.db.getRepository(User).findOne({ where: { id: String(req.params.id) } })
      if (!user) throw notFound('That account')
      if (user.id === req.user!.id) throw badRequest('You cannot suspend your own account.', { suspended: 'Not your own account.' })
      await ctx.db.transaction(async (manager) => {
        await manager.update(User, user.id, { suspendedAt: req.body.suspended ? new Date() : null })
        // A suspension takes effect at once: the account's sessions end.
        if (req.body.suspended) await manager.query(`DELETE FROM session WHERE sess -> 'passport' ->> 'user' = $1`, [user.id])
      })
      res.json({ id: user.id, suspended: req.body.suspended })
    },
  )

  router.get('/admin/disputes', admin, async (_req, res) => {
    const disputed = await ctx.db
      .getRepository(FiringRequest)
      .find({ where: { state: 'disputed' }, order: { updatedAt: 'DESC' }, take: 100 })
    res.json({ requests: await requestRows(ctx.db.manager, disputed) })
  })

  router.post('/admin/requests/:id/refund', admin, requireUuidParams('id'), validateBody(adminRefundSchema), async (req, res) => {
    await adminRefund(ctx, String(req.params.id), req.body.amountCents, req.body.reason)
    res.status(202).json({ queued: true })
  })

  return router
}
