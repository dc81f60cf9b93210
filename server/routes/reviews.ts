import { Router } from 'express'
import { reviewSchema } from '../../shared/schemas/pickup'
import { requireAuth } from '../auth/guards'
import { allowStudioReader, studioFromParam } from '../auth/studio-access'
import type { AppContext } from '../context'
import { requireUuidParams, validateBody } from '../http/validate'
import { publicStudioPhotos } from '../services/photos'
import { giveReview, studioReviewsPage } from '../services/reviews'

export function reviewsRouter(ctx: AppContext) {
  const router = Router()
  const id = requireUuidParams('id')

  // Either side's answers after pickup; the door checks the side, the state and the window.
  router.post('/requests/:id/review', requireAuth, id, validateBody(reviewSchema), async (req, res) => {
    res.json(await giveReview(ctx, req.user!, String(req.params.id), req.body))
  })

  // Public for published studios, like the rest of their page: published answers only.
  router.get('/studios/:id/reviews', allowStudioReader(ctx, studioFromParam(ctx)), async (_req, res) => {
    res.json(await studioReviewsPage(ctx.db.manager, res.locals.studioId))
  })

  // Result photos that potters chose to show on the studio's page.
  router.get('/studios/:id/photos', allowStudioReader(ctx, studioFromParam(ctx)), async (_req, res) => {
    res.json({ photos: await publicStudioPhotos(ctx.db.manager, res.locals.studioId) })
  })

  return router
}
