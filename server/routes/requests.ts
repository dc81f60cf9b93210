import { Router } from 'express'
import { z } from 'zod'
import {
  messageSchema,
  requestCreateSchema,
  requestDeclineSchema,
  requestMoveSchema,
  requestPatchSchema,
  requestSendSchema,
  requestWithdrawSchema,
  depositSchema,
  disputeSchema,
} from '../../shared/schemas/requests'
import { REQUEST_STATES } from '../../shared/workflow/request-states'
import { requireAuth, requireRole } from '../auth/guards'
import type { AppContext } from '../context'
import { conflict } from '../http/errors'
import { requireUuidParams, validateBody, validateQuery } from '../http/validate'
import { listMessages, postMessage } from '../services/messages'
import { forgetKeptCard } from '../services/kept-cards'
import { checkoutFor } from '../services/payments'
import { listRequests, showRequest, type RequestListQuery } from '../services/request-views'
import {
  acceptRequest,
  answerMove,
  createDraft,
  declineRequest,
  disputeRequest,
  proposeMove,
  sendRequest,
  updateDraft,
  withdrawRequest,
} from '../services/requests'

const listQuery = z.object({
  firingId: z.uuid().optional(),
  studioId: z.uuid().optional(),
  state: z.enum(REQUEST_STATES).optional(),
  as: z.enum(['potter', 'studio']).optional(),
})

export function requestsRouter(ctx: AppContext) {
  const router = Router()
  const id = requireUuidParams('id')

  const show = (requestId: string, user: Express.User) => showRequest(ctx.db.manager, requestId, user)

  router.post('/firings/:id/requests', requireRole('potter'), id, validateBody(requestCreateSchema), async (req, res) => {
    const requestId = await createDraft(ctx, req.user!, String(req.params.id), req.body)
    res.status(201).json(await show(requestId, req.user!))
  })

  // Mine: a potter's own requests, and for studio people the requests to their studios.
  router.get('/requests', requireAuth, validateQuery(listQuery), async (req, res) => {
    const q = res.locals.query as RequestListQuery
    res.json({ requests: await listRequests(ctx.db.manager, req.user!, q) })
  })

  router.get('/requests/:id', requireAuth, id, async (req, res) => {
    res.json(await show(String(req.params.id), req.user!))
  })

  router.patch('/requests/:id', requireAuth, id, validateBody(requestPatchSchema), async (req, res) => {
    await updateDraft(ctx, req.user!, String(req.params.id), req.body)
    res.json(await show(String(req.params.id), req.user!))
  })

  router.post('/requests/:id/send', requireAuth, id, validateBody(requestSendSchema), async (req, res) => {
    await sendRequest(ctx, req.user!, String(req.params.id), req.body)
    res.json(await show(String(req.params.id), req.user!))
  })

  router.post('/requests/:id/accept', requireAuth, id, async (req, res) => {
    await acceptRequest(ctx, req.user!, String(req.params.id))
    res.json(await show(String(req.params.id), req.user!))
  })

  router.post('/requests/:id/decline', requireAuth, id, validateBody(requestDeclineSchema), async (req, res) => {
    await declineRequest(ctx, req.user!, String(req.params.id), req.body.reason)
    res.json(await show(String(req.params.id), req.user!))
  })

  router.post('/requests/:id/move', requireAuth, id, validateBody(requestMoveSchema), async (req, res) => {
    await proposeMove(ctx, req.user!, String(req.params.id), req.body.firingId)
    res.json(await show(String(req.params.id), req.user!))
  })

  router.post('/requests/:id/move/:answer', requireAuth, id, async (req, res) => {
    const answer = String(req.params.answer)
    if (answer !== 'accept' && answer !== 'refuse') throw conflict('Answer a move with accept or refuse.', 'bad-answer')
    await answerMove(ctx, req.user!, String(req.params.id), answer === 'accept')
    res.json(await show(String(req.params.id), req.user!))
  })

  router.post('/requests/:id/withdraw', requireAuth, id, validateBody(requestWithdrawSchema), async (req, res) => {
    await withdrawRequest(ctx, req.user!, String(req.params.id), req.body.reason)
    res.json(await show(String(req.params.id), req.user!))
  })

  router.post('/requests/:id/dispute', requireAuth, id, validateBody(disputeSchema), async (req, res) => {
    await disputeRequest(ctx, req.user!, String(req.params.id), req.body.reason)
    res.json(await show(String(req.params.id), req.user!))
  })

  router.post('/requests/:id/deposit', requireAuth, id, validateBody(depositSchema), async (req, res) => {
    const payment = await checkoutFor(ctx, req.user!, String(req.params.id), 'deposit', { keepCard: req.body.keepCard })
    res.json({ checkoutUrl: payment.checkoutUrl, amountCents: payment.amountCents, expiresAt: payment.expiresAt.toISOString() })
  })

  router.delete('/requests/:id/kept-card', requireAuth, id, async (req, res) => {
    await forgetKeptCard(ctx, req.user!, String(req.params.id))
    res.json(await show(String(req.params.id), req.user!))
  })

  router.get('/requests/:id/messages', requireAuth, id, async (req, res) => {
    res.json({ messages: await listMessages(ctx, req.user!, String(req.params.id)) })
  })

  router.post('/requests/:id/messages', requireAuth, id, validateBody(messageSchema), async (req, res) => {
    res.status(201).json(await postMessage(ctx, req.user!, String(req.params.id), req.body.body))
  })

  return router
}
