import { Router } from 'express'
import type { AppContext } from '../context'

export function metaRouter(ctx: AppContext) {
  const router = Router()

  // Open: what the client needs to know about this installation.
  router.get('/meta', (_req, res) => {
    const { mailInboxUrl, tileUrl, basemapPmtilesUrl } = ctx.config
    res.json({ mailInboxUrl, tileUrl, basemapPmtilesUrl })
  })

  return router
}
