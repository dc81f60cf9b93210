import { Router } from 'express'
import type { AppContext } from '../context'

export function healthRouter(ctx: AppContext) {
  const router = Router()

  // Open to everyone: load balancers and the start script poll it.
  router.get('/health', async (_req, res) => {
    try {
      await ctx.db.query('SELECT 1')
      res.json({ ok: true, db: 'up' })
    } catch {
      res.status(503).json({ ok: false, db: 'down' })
    }
  })

  return router
}
