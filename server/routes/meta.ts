import { Router } from 'express'
import type { AppContext } from '../context'

export function metaRouter(ctx: AppContext) {
  const router = Router()

  // Open: what the client needs to know about this installation.
  router.get('/meta', (_req, res) => {
    res.json({ mailInboxUrl: ctx.config.mailInboxUrl, tileUrl: ctx.config.tileUrl })
  })

  return router
}
