import { Router } from 'express'
import { payoutActionSchema, payoutQuerySchema } from '../../shared/schemas/payouts'
import { requireStudioMember, studioFromParam } from '../auth/studio-access'
import type { AppContext } from '../context'
import { forbidden } from '../http/errors'
import { validateBody, validateQuery } from '../http/validate'
import { statementCsv, studioPayouts } from '../services/earnings'
import { refreshAccount, startOnboarding } from '../services/payouts'

/** A studio's money: its payout account, what it is owed and has had, its statements. The owner's alone. */
export function payoutsRouter(ctx: AppContext) {
  const router = Router()
  const owner = requireStudioMember(ctx, ['owner'], studioFromParam(ctx))

  // The owner goes to Stripe's hosted onboarding with this link; the desk does not onboard for them.
  router.post('/studios/:id/payouts/onboarding', owner, validateBody(payoutActionSchema), async (req, res) => {
    if (req.user!.role === 'admin') throw forbidden('The studio’s owner connects its payout account.', 'studio-role')
    res.json(await startOnboarding(ctx, res.locals.studioId, req.user!))
  })

  // Back from onboarding: ask Stripe for the account as it is now rather than wait for its webhook.
  router.post('/studios/:id/payouts/refresh', owner, validateBody(payoutActionSchema), async (_req, res) => {
    await refreshAccount(ctx, res.locals.studioId)
    res.json(await studioPayouts(ctx.db.manager, ctx.config, res.locals.studioId))
  })

  router.get('/studios/:id/payouts', owner, validateQuery(payoutQuerySchema), async (_req, res) => {
    res.json(await studioPayouts(ctx.db.manager, ctx.config, res.locals.studioId))
  })

  router.get('/studios/:id/statements/:period.csv', owner, validateQuery(payoutQuerySchema), async (req, res) => {
    const { filename, body } = await statementCsv(ctx.db.manager, ctx.config, res.locals.studioId, String(req.params.period))
    res.type('text/csv; charset=utf-8').set('Content-Disposition', `attachment; filename="${filename}"`).send(body)
  })

  return router
}
