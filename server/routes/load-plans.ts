import { Router } from 'express'
import { z } from 'zod'
import { loadPlanSchema } from '../../shared/schemas/pieces'
import { text } from '../../shared/schemas/text'
import { requireStudioMember, studioOfFiring } from '../auth/studio-access'
import type { AppContext } from '../context'
import { validateBody, validateQuery } from '../http/validate'
import { firingLoadPlan, saveLoadPlan } from '../services/load-plan'
import { labelsHtml } from '../services/labels'

const labelsQuery = z.object({
  tag: text().trim().min(8).max(12).optional(),
  request: z.uuid({ error: 'Name the request by its id.' }).optional(),
})

/** A firing's load, its crew's edits and its tag labels: the studio's people only. */
export function loadPlansRouter(ctx: AppContext) {
  const router = Router()
  const crew = requireStudioMember(ctx, ['owner', 'crew'], studioOfFiring(ctx))

  router.get('/firings/:id/load-plan', crew, async (req, res) => {
    res.json(await firingLoadPlan(ctx, String(req.params.id)))
  })

  router.put('/firings/:id/load-plan', crew, validateBody(loadPlanSchema), async (req, res) => {
    res.json(await saveLoadPlan(ctx, req.user!, String(req.params.id), req.body.placements))
  })

  // A page made for printing (a sheet of labels, or one label with ?tag=), each with its QR code.
  router.get('/firings/:id/labels.html', crew, validateQuery(labelsQuery), async (req, res) => {
    const query = res.locals.query as z.infer<typeof labelsQuery>
    res
      .type('html')
      .set('Cache-Control', 'no-store')
      .send(await labelsHtml(ctx, String(req.params.id), query))
  })

  return router
}
