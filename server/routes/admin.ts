import { Router } from 'express'
import { requireRole } from '../auth/guards'
import type { AppContext } from '../context'
import { requireUuidParams, validateBody, validateQuery } from '../http/validate'
import {
  deskAccountsQuerySchema,
  deskStudiosQuerySchema,
  suspendSchema,
  type DeskAccountsQuery,
  type DeskStudiosQuery,
} from '../../shared/schemas/admin'
import { adminRefundSchema } from '../../shared/schemas/requests'
import { deskDisputes, deskStudios, deskUsers, setSuspended } from '../services/admin'
import { adminRefund } from '../services/requests'
import { disputeSettleSchema } from '../../shared/schemas/payouts'
import { settleDispute } from '../services/payouts'

/** The marketplace desk: studios to verify, accounts to suspend or restore, disputes to settle. Admins only. */
export function adminRouter(ctx: AppContext) {
  const router = Router()
  const admin = requireRole('admin')

  router.get('/admin/studios', admin, validateQuery(deskStudiosQuerySchema), async (_req, res) => {
    res.json(await deskStudios(ctx.db.manager, res.locals.query as DeskStudiosQuery))
  })

  router.get('/admin/users', admin, validateQuery(deskAccountsQuerySchema), async (req, res) => {
    res.json(await deskUsers(ctx.db.manager, req.user!, res.locals.query as DeskAccountsQuery))
  })

  router.post('/admin/users/:id/suspend', admin, requireUuidParams('id'), validateBody(suspendSchema), async (req, res) => {
    await setSuspended(ctx, req.user!.id, String(req.params.id), req.body.suspended)
    res.json({ id: String(req.params.id), suspended: req.body.suspended })
  })

  router.get('/admin/disputes', admin, async (req, res) => {
    res.json({ requests: await deskDisputes(ctx.db.manager, req.user!) })
  })

  router.post('/admin/requests/:id/refund', admin, requireUuidParams('id'), validateBody(adminRefundSchema), async (req, res) => {
    await adminRefund(ctx, req.user!, String(req.params.id), req.body.amountCents, req.body.reason)
    res.status(202).json({ queued: true })
  })

  // Settling a dispute releases what the studio keeps (after any refund above) and tells both sides.
  router.post('/admin/requests/:id/settle', admin, requireUuidParams('id'), validateBody(disputeSettleSchema), async (req, res) => {
    await settleDispute(ctx, req.user!, String(req.params.id), req.body.note)
    res.json({ settled: true })
  })

  return router
}
