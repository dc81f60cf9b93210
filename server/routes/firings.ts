import { Router } from 'express'
import { firingCancelSchema, firingPatchSchema } from '../../shared/schemas/studios'
import { allowStudioReader, requireStudioMember, studioOfFiring } from '../auth/studio-access'
import type { AppContext } from '../context'
import { notFound } from '../http/errors'
import { validateBody } from '../http/validate'
import { cancelFiring, firingsJson, getFiring, updateFiring } from '../services/firings'

export function firingsRouter(ctx: AppContext) {
  const router = Router()
  const firing = studioOfFiring(ctx)
  const reader = allowStudioReader(ctx, firing)
  const member = requireStudioMember(ctx, ['owner', 'crew'], firing)

  router.get('/firings/:id', reader, async (req, res) => {
    const found = await getFiring(ctx.db.manager, String(req.params.id))
    if (found.status === 'cancelled' && !res.locals.studioRole) throw notFound('That firing')
    const [json] = await firingsJson(ctx.db.manager, [found], res.locals.studioId)
    res.json(json)
  })

  // Crew run the board: dates, space and status are theirs to change as well as the owner's.
  router.patch('/firings/:id', member, validateBody(firingPatchSchema), async (req, res) => {
    const updated = await updateFiring(ctx, String(req.params.id), req.body, req.user!.id)
    const [json] = await firingsJson(ctx.db.manager, [updated], res.locals.studioId)
    res.json(json)
  })

  router.post('/firings/:id/cancel', member, validateBody(firingCancelSchema), async (req, res) => {
    const { firing: cancelled, requestIds } = await cancelFiring(ctx, String(req.params.id), req.body.reason, req.user!.id)
    const [json] = await firingsJson(ctx.db.manager, [cancelled], res.locals.studioId)
    res.json({ ...json, cancelledRequests: requestIds.length })
  })

  return router
}
