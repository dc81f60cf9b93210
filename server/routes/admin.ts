import { Router } from 'express'
import { z } from 'zod'
import { text } from '../../shared/schemas/text'
import { requireRole } from '../auth/guards'
import type { AppContext } from '../context'
import { requireUuidParams, validateBody, validateQuery } from '../http/validate'
import { adminRefundSchema } from '../../shared/schemas/requests'
import { deskDisputes, deskStudios, deskUsers, setSuspended } from '../services/admin'
import { adminRefund } from '../services/requests'

const usersQuery = z.object({ q: text().trim().max(120).optional() })

/** The marketplace desk: studios to verify, and accounts to suspend or restore. Admins only. */
export function adminRouter(ctx: AppContext) {
  const router = Router()
  const admin = requireRole('admin')

  router.get('/admin/studios', admin, async (_req, res) => {
    res.json({ studios: await deskStudios(ctx.db.manager) })
  })

  router.get('/admin/users', admin, validateQuery(usersQuery), async (_req, res) => {
    const { q } = res.locals.query as z.infer<typeof usersQuery>
    res.json({ users: await deskUsers(ctx.db.manager, q) })
  })

  router.post(
    '/admin/users/:id/suspend',
    admin,
    requireUuidParams('id'),
    validateBody(z.object({ suspended: z.boolean() })),
    async (req, res) => {
      await setSuspended(ctx, req.user!.id, String(req.params.id), req.body.suspended)
      res.json({ id: String(req.params.id), suspended: req.body.suspended })
    },
  )

  router.get('/admin/disputes', admin, async (req, res) => {
    res.json({ requests: await deskDisputes(ctx.db.manager, req.user!) })
  })

  router.post('/admin/requests/:id/refund', admin, requireUuidParams('id'), validateBody(adminRefundSchema), async (req, res) => {
    await adminRefund(ctx, req.user!, String(req.params.id), req.body.amountCents, req.body.reason)
    res.status(202).json({ queued: true })
  })

  return router
}
