import { Router } from 'express'
import { checkInSchema, counterPaymentSchema, resultsSchema } from '../../shared/schemas/pickup'
import { requireAuth } from '../auth/guards'
import type { AppContext } from '../context'
import { requireUuidParams, validateBody } from '../http/validate'
import {
  checkIn,
  confirmPrice,
  counterPayment,
  declinePrice,
  markCollected,
  markCounterRefundPaid,
  markReady,
  postResults,
} from '../services/pickup'
import { checkoutFor } from '../services/payments'
import { showRequest } from '../services/request-views'

export function pickupRouter(ctx: AppContext) {
  const router = Router()
  const id = requireUuidParams('id')

  const show = (requestId: string, user: Express.User) => showRequest(ctx.db.manager, requestId, user)

  router.post('/requests/:id/check-in', requireAuth, id, validateBody(checkInSchema), async (req, res) => {
    const outcome = await checkIn(ctx, req.user!, String(req.params.id), req.body)
    res.json({ ...outcome, request: await show(String(req.params.id), req.user!) })
  })

  router.post('/requests/:id/confirm-price', requireAuth, id, async (req, res) => {
    await confirmPrice(ctx, req.user!, String(req.params.id))
    res.json(await show(String(req.params.id), req.user!))
  })

  router.post('/requests/:id/price/decline', requireAuth, id, async (req, res) => {
    await declinePrice(ctx, req.user!, String(req.params.id))
    res.json(await show(String(req.params.id), req.user!))
  })

  router.post('/requests/:id/counter-refunds/:refundId/paid', requireAuth, requireUuidParams('id', 'refundId'), async (req, res) => {
    await markCounterRefundPaid(ctx, req.user!, String(req.params.id), String(req.params.refundId))
    res.json(await show(String(req.params.id), req.user!))
  })

  router.post('/requests/:id/results', requireAuth, id, validateBody(resultsSchema), async (req, res) => {
    await postResults(ctx, req.user!, String(req.params.id), req.body)
    res.json(await show(String(req.params.id), req.user!))
  })

  router.post('/requests/:id/ready', requireAuth, id, async (req, res) => {
    await markReady(ctx, req.user!, String(req.params.id))
    res.json(await show(String(req.params.id), req.user!))
  })

  router.post('/requests/:id/balance', requireAuth, id, async (req, res) => {
    const payment = await checkoutFor(ctx, req.user!, String(req.params.id), 'balance')
    res.json({ checkoutUrl: payment.checkoutUrl, amountCents: payment.amountCents, expiresAt: payment.expiresAt.toISOString() })
  })

  router.post('/requests/:id/balance/counter', requireAuth, id, validateBody(counterPaymentSchema), async (req, res) => {
    await counterPayment(ctx, req.user!, String(req.params.id), req.body)
    res.json(await show(String(req.params.id), req.user!))
  })

  router.post('/requests/:id/collected', requireAuth, id, async (req, res) => {
    await markCollected(ctx, req.user!, String(req.params.id))
    res.json(await show(String(req.params.id), req.user!))
  })

  return router
}
