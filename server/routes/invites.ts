import { Router } from 'express'
import { inviteAcceptSchema } from '../../shared/schemas/studios'
import { requireAuth } from '../auth/guards'
import type { AppContext } from '../context'
import { validateBody } from '../http/validate'
import { acceptInvite, describeInvite } from '../services/crew'

export function invitesRouter(ctx: AppContext) {
  const router = Router()

  // Open: the join page shows which studio and address a link is for before anyone signs in.
  router.post('/invites/lookup', validateBody(inviteAcceptSchema), async (req, res) => {
    res.json(await describeInvite(ctx, req.body.token))
  })

  router.post('/invites/accept', requireAuth, validateBody(inviteAcceptSchema), async (req, res) => {
    res.json(await ctx.db.transaction((manager) => acceptInvite(manager, req.user!, req.body.token)))
  })

  return router
}
