import { Router } from 'express'
import { noticesReadSchema } from '../../shared/schemas/notices'
import { requireAuth } from '../auth/guards'
import type { AppContext } from '../context'
import { validateBody } from '../http/validate'
import { listNotices, markNoticesRead } from '../services/notices'

/** A person's notices: the same events as the mail, for working the board without reading mail. */
export function noticesRouter(ctx: AppContext) {
  const router = Router()

  router.get('/notices', requireAuth, async (req, res) => {
    res.json(await listNotices(ctx.db.manager, req.user!.id))
  })

  router.post('/notices/read', requireAuth, validateBody(noticesReadSchema), async (req, res) => {
    res.json(await markNoticesRead(ctx.db.manager, req.user!.id, req.body))
  })

  return router
}
