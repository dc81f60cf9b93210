import { Router } from 'express'
import { firingLogSchema } from '../../shared/schemas/pickup'
import { requireStudioMember, studioOfFiring } from '../auth/studio-access'
import type { AppContext } from '../context'
import { validateBody } from '../http/validate'
import { firingLogJson, putFiringLog } from '../services/firing-log'

/** The firing's log, kept by the studio's people. */
export function firingLogsRouter(ctx: AppContext) {
  const router = Router()
  const firingMember = requireStudioMember(ctx, ['owner', 'crew'], studioOfFiring(ctx))

  router.put('/firings/:id/log', firingMember, validateBody(firingLogSchema), async (req, res) => {
    res.json(await putFiringLog(ctx, req.user!.id, String(req.params.id), req.body))
  })

  router.get('/firings/:id/log', firingMember, async (req, res) => {
    res.json((await firingLogJson(ctx.db.manager, String(req.params.id))) ?? { witnessCones: [], coneCheck: null })
  })

  return router
}
