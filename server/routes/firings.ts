import { Router } from 'express'
import { firingCancelSchema, firingMoveSchema, firingPatchSchema } from '../../shared/schemas/studios'
import { allowStudioReader, requireStudioMember, studioOfFiring } from '../auth/studio-access'
import type { AppContext } from '../context'
import { notFound } from '../http/errors'
import { validateBody } from '../http/validate'
import { cancelFiring, moveFiring, undoFiringMove } from '../services/firing-stages'
import { firingsJson, getFiring, updateFiring } from '../services/firings'

export function firingsRouter(ctx: AppContext) {
  const router = Router()
  const firing = studioOfFiring(ctx)
  const reader = allowStudioReader(ctx, firing)
  const member = requireStudioMember(ctx, ['owner', 'crew'], firing)
  const json = async (found: Awaited<ReturnType<typeof getFiring>>, studioId: string) =>
    (await firingsJson(ctx.db.manager, [found], studioId))[0]

  router.get('/firings/:id', reader, async (req, res) => {
    const found = await getFiring(ctx.db.manager, String(req.params.id))
    if (found.status === 'cancelled' && !res.locals.studioRole) throw notFound('That firing')
    res.json(await json(found, res.locals.studioId))
  })

  // Crew run the board: dates, space and stages are theirs to change as well as the owner's.
  router.patch('/firings/:id', member, validateBody(firingPatchSchema), async (req, res) => {
    res.json(await json(await updateFiring(ctx, String(req.params.id), req.body), res.locals.studioId))
  })

  router.post('/firings/:id/stage', member, validateBody(firingMoveSchema), async (req, res) => {
    const { firing: moved } = await moveFiring(ctx, req.user!, String(req.params.id), req.body.status, { confirm: req.body.confirm })
    res.json(await json(moved, res.locals.studioId))
  })

  router.post('/firings/:id/undo', member, async (req, res) => {
    res.json(await json(await undoFiringMove(ctx, req.user!, String(req.params.id)), res.locals.studioId))
  })

  router.post('/firings/:id/cancel', member, validateBody(firingCancelSchema), async (req, res) => {
    const { firing: cancelled, requestIds } = await cancelFiring(ctx, req.user!, String(req.params.id), req.body.reason)
    res.json({ ...(await json(cancelled, res.locals.studioId)), cancelledRequests: requestIds.length })
  })

  return router
}
