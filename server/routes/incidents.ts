import { Router, type Request, type Response } from 'express'
import { z } from 'zod'
import {
  claimBodySchema,
  claimContestSchema,
  claimDecisionSchema,
  claimPaySchema,
  incidentBodySchema,
  remedyBodySchema,
} from '../../shared/schemas/incidents'
import { requireAuth, requireRole } from '../auth/guards'
import { requireStudioMember, studioFromParam } from '../auth/studio-access'
import type { AppContext } from '../context'
import { requireUuidParams, validateBody } from '../http/validate'
import { acceptClaim, contestClaim, decideClaim, deskClaims, raiseClaim } from '../services/claims'
import {
  addIncidentPhotos,
  firingIncidents,
  incidentJson,
  potterIncidentRecord,
  reportIncident,
  studioIncidentHistory,
} from '../services/incidents'
import { makeGood } from '../services/remedies'
import { receivePhotos } from './photos'

/** An incident's photos carry no other field. */
const noFields = z.object({})

export function incidentsRouter(ctx: AppContext) {
  const router = Router()
  const id = requireUuidParams('id')

  router.post('/firings/:id/incidents', requireAuth, id, validateBody(incidentBodySchema), async (req, res) => {
    res.status(201).json(await reportIncident(ctx, req.user!, String(req.params.id), req.body))
  })

  router.get('/firings/:id/incidents', requireAuth, id, async (req, res) => {
    res.json({ incidents: await firingIncidents(ctx, req.user!, String(req.params.id)) })
  })

  router.get('/incidents/:id', requireAuth, id, async (req, res) => {
    res.json(await incidentJson(ctx, req.user!, String(req.params.id)))
  })

  router.post(
    '/incidents/:id/photos',
    requireAuth,
    id,
    receivePhotos(noFields),
    validateBody(noFields),
    async (req: Request, res: Response) => {
      const files = (req.files as Express.Multer.File[] | undefined) ?? []
      res.status(201).json({ photos: await addIncidentPhotos(ctx, req.user!, String(req.params.id), files) })
    },
  )

  router.post('/incidents/:id/claims', requireAuth, id, validateBody(claimBodySchema), async (req, res) => {
    res.status(201).json(await raiseClaim(ctx, req.user!, String(req.params.id), req.body))
  })

  router.post('/incidents/:id/remedies', requireAuth, id, validateBody(remedyBodySchema), async (req, res) => {
    res.status(201).json(await makeGood(ctx, req.user!, String(req.params.id), req.body))
  })

  router.post('/claims/:id/accept', requireAuth, id, validateBody(claimPaySchema), async (req, res) => {
    res.json(await acceptClaim(ctx, req.user!, String(req.params.id), req.body))
  })

  router.post('/claims/:id/contest', requireAuth, id, validateBody(claimContestSchema), async (req, res) => {
    res.json(await contestClaim(ctx, req.user!, String(req.params.id), req.body.reason))
  })

  router.get('/admin/claims', requireRole('admin'), async (_req, res) => {
    res.json({ claims: await deskClaims(ctx) })
  })

  router.post('/admin/claims/:id/decide', requireRole('admin'), id, validateBody(claimDecisionSchema), async (req, res) => {
    res.json(await decideClaim(ctx, req.user!, String(req.params.id), req.body))
  })

  router.get('/studios/:id/incidents', requireStudioMember(ctx, ['owner', 'crew'], studioFromParam(ctx)), async (req, res) => {
    res.json(await studioIncidentHistory(ctx, String(req.params.id)))
  })

  router.get('/requests/:id/potter-record', requireAuth, id, async (req, res) => {
    res.json(await potterIncidentRecord(ctx, req.user!, String(req.params.id)))
  })

  return router
}
