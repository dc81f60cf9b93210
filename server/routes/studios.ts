import { Router } from 'express'
import { z } from 'zod'
import { checklistSchema } from '../../shared/schemas/pieces'
import { crewInviteSchema, kilnBodySchema, studioCreateSchema, studioPatchSchema } from '../../shared/schemas/studios'
import { requireRole } from '../auth/guards'
import { unauthorized } from '../http/errors'
import { allowStudioReader, requireStudioMember, studioFromParam } from '../auth/studio-access'
import type { AppContext } from '../context'
import { requireUuidParams, validateBody, validateQuery } from '../http/validate'
import { studioCalendar } from '../services/calendar'
import { inviteCrew, listCrew, removeCrewMember, revokeInvite } from '../services/crew'
import { firingsJson, listStudioFirings } from '../services/firings'
import { createKiln, examplePrices, getPriceList, kilnJson, listKilns } from '../services/kilns'
import {
  createStudio,
  deleteStudio,
  getStudio,
  listMyStudios,
  listPublishedStudios,
  setVerified,
  setDropOffChecklist,
  studioJson,
  updateStudio,
} from '../services/studios'

const firingRangeQuery = z.object({
  from: z.iso.datetime({ offset: true }).optional(),
  to: z.iso.datetime({ offset: true }).optional(),
  includeCancelled: z.enum(['true', 'false']).optional(),
})

export function studiosRouter(ctx: AppContext) {
  const router = Router()
  const studio = studioFromParam(ctx)
  const owner = requireStudioMember(ctx, ['owner'], studio)
  const reader = allowStudioReader(ctx, studio)

  // Public: published studios. `?mine=true`: the caller's own studios, drafts included.
  router.get('/studios', async (req, res) => {
    if (req.query.mine === 'true') {
      if (!req.user) throw unauthorized()
      const mine = await listMyStudios(ctx, req.user.id)
      return res.json({ studios: mine.map(({ studio: s, role }) => studioJson(s, role)) })
    }
    res.json({ studios: (await listPublishedStudios(ctx)).map((s) => studioJson(s, null)) })
  })

  router.post('/studios', requireRole('host'), validateBody(studioCreateSchema), async (req, res) => {
    const created = await createStudio(ctx, req.user!, req.body)
    res.status(201).json(studioJson(created, 'owner'))
  })

  router.get('/studios/:id', reader, async (req, res) => {
    res.json(studioJson(await getStudio(ctx.db.manager, res.locals.studioId), res.locals.studioRole))
  })

  router.patch('/studios/:id', owner, validateBody(studioPatchSchema), async (req, res) => {
    res.json(studioJson(await updateStudio(ctx, res.locals.studioId, req.body), 'owner'))
  })

  // The owner sets what the crew checks on every piece at drop-off.
  router.put('/studios/:id/checklist', owner, validateBody(checklistSchema), async (req, res) => {
    res.json(studioJson(await setDropOffChecklist(ctx, res.locals.studioId, req.body.items), 'owner'))
  })

  router.delete('/studios/:id', owner, async (_req, res) => {
    await deleteStudio(ctx, res.locals.studioId)
    res.status(204).end()
  })

  router.post(
    '/studios/:id/verify',
    requireRole('admin'),
    requireUuidParams('id'),
    validateBody(z.object({ verified: z.boolean() })),
    async (req, res) => {
      res.json(studioJson(await setVerified(ctx, String(req.params.id), req.body.verified), 'owner'))
    },
  )

  // Kilns with their price lists and example prices: what a potter compares.
  router.get('/studios/:id/kilns', reader, async (_req, res) => {
    const isMember = res.locals.studioRole !== null
    const kilns = await listKilns(ctx.db.manager, res.locals.studioId, { includeRetired: isMember })
    const out = []
    for (const kiln of kilns) {
      const priceList = await getPriceList(ctx.db.manager, kiln.id)
      out.push({ ...kilnJson(kiln), priceList, examplePrices: priceList ? examplePrices(kiln, priceList) : [] })
    }
    res.json({ kilns: out })
  })

  router.post('/studios/:id/kilns', owner, validateBody(kilnBodySchema), async (req, res) => {
    res.status(201).json(kilnJson(await createKiln(ctx, res.locals.studioId, req.body)))
  })

  // Every firing of the studio in a window; the public sees the upcoming ones that are not cancelled.
  router.get('/studios/:id/firings', reader, validateQuery(firingRangeQuery), async (_req, res) => {
    const q = res.locals.query as z.infer<typeof firingRangeQuery>
    const isMember = res.locals.studioRole !== null
    const firings = await listStudioFirings(ctx.db.manager, res.locals.studioId, {
      from: q.from ? new Date(q.from) : isMember ? undefined : new Date(),
      to: q.to ? new Date(q.to) : undefined,
      includeCancelled: isMember && q.includeCancelled === 'true',
    })
    res.json({ firings: await firingsJson(ctx.db.manager, firings, res.locals.studioId) })
  })

  router.get('/studios/:id/calendar.ics', reader, async (_req, res) => {
    const body = await studioCalendar(ctx, await getStudio(ctx.db.manager, res.locals.studioId))
    res.type('text/calendar; charset=utf-8').set('Content-Disposition', 'inline; filename="firings.ics"').send(body)
  })

  router.get('/studios/:id/crew', owner, async (_req, res) => {
    res.json(await listCrew(ctx, res.locals.studioId))
  })

  router.post('/studios/:id/invites', owner, validateBody(crewInviteSchema), async (req, res) => {
    res.status(202).json(await inviteCrew(ctx, res.locals.studioId, req.user!, req.body.email))
  })

  router.delete('/studios/:id/invites/:inviteId', owner, requireUuidParams('inviteId'), async (req, res) => {
    await revokeInvite(ctx, res.locals.studioId, String(req.params.inviteId))
    res.status(204).end()
  })

  router.delete('/studios/:id/crew/:memberId', owner, requireUuidParams('memberId'), async (req, res) => {
    await removeCrewMember(ctx, res.locals.studioId, String(req.params.memberId))
    res.status(204).end()
  })

  return router
}
