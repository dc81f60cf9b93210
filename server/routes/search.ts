import { Router } from 'express'
import { searchQuerySchema, type SearchQuery } from '../../shared/schemas/search'
import { openRouteLimiter } from '../auth/rate-limit'
import type { AppContext } from '../context'
import { validateQuery } from '../http/validate'
import { searchBoard, searchFirings } from '../services/search'

export function searchRouter(ctx: AppContext) {
  const router = Router()
  const limiter = openRouteLimiter(ctx.config.rateLimits.openApiPerIpPerMin)

  // Open to visitors: finding a firing comes before making an account.
  router.get('/search', limiter, validateQuery(searchQuerySchema), async (_req, res) => {
    res.json(await searchFirings(ctx, res.locals.query as SearchQuery))
  })

  // The same search, one entry per studio with its firings: pages count studios.
  router.get('/search/board', limiter, validateQuery(searchQuerySchema), async (_req, res) => {
    res.json(await searchBoard(ctx, res.locals.query as SearchQuery))
  })

  return router
}
