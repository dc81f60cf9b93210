import { Router } from 'express'
import { ratingReplySchema, ratingSchema } from '../../shared/schemas/pickup'
import { requireAuth } from '../auth/guards'
import { allowStudioReader, studioFromParam } from '../auth/studio-access'
import type { AppContext } from '../context'
import { requireUuidParams, validateBody } from '../http/validate'
import { publicStudioPhotos } from '../services/photos'
import { rateRequest, replyToRating, studioRatingsPage } from '../services/ratings'

export function ratingsRouter(ctx: AppContext) {
  const router = Router()
  const id = requireUuidParams('id')

  router.post('/requests/:id/rating', requireAuth, id, validateBody(ratingSchema), async (req, res) => {
    res.json(await rateRequest(ctx, req.user!, String(req.params.id), req.body))
  })

  router.post('/requests/:id/rating/reply', requireAuth, id, validateBody(ratingReplySchema), async (req, res) => {
    res.json(await replyToRating(ctx, req.user!, String(req.params.id), req.body.text))
  })

  // Public for published studios, like the rest of their page.
  router.get('/studios/:id/ratings', allowStudioReader(ctx, studioFromParam(ctx)), async (_req, res) => {
    res.json(await studioRatingsPage(ctx.db.manager, res.locals.studioId))
  })

  // Result photos that potters chose to show on the studio's page.
  router.get('/studios/:id/photos', allowStudioReader(ctx, studioFromParam(ctx)), async (_req, res) => {
    res.json({ photos: await publicStudioPhotos(ctx.db.manager, res.locals.studioId) })
  })

  return router
}
