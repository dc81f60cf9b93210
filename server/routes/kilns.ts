import { Router } from 'express'
import { firingCreateSchema, kilnPatchSchema, priceListBodySchema } from '../../shared/schemas/studios'
import { allowStudioReader, requireStudioMember, studioOfKiln } from '../auth/studio-access'
import type { AppContext } from '../context'
import { notFound } from '../http/errors'
import { validateBody } from '../http/validate'
import { createFirings, firingsJson, listKilnFirings } from '../services/firings'
import { examplePrices, getKiln, getPriceList, kilnJson, putPriceList, removeKiln, updateKiln } from '../services/kilns'

export function kilnsRouter(ctx: AppContext) {
  const router = Router()
  const kiln = studioOfKiln(ctx)
  const reader = allowStudioReader(ctx, kiln)
  const owner = requireStudioMember(ctx, ['owner'], kiln)
  const member = requireStudioMember(ctx, ['owner', 'crew'], kiln)

  router.get('/kilns/:id', reader, async (req, res) => {
    const found = await getKiln(ctx.db.manager, String(req.params.id))
    if (found.retiredAt && !res.locals.studioRole) throw notFound('That kiln')
    res.json(kilnJson(found))
  })

  // Limits are the owner's: crew cannot change what the kiln is said to do.
  router.patch('/kilns/:id', owner, validateBody(kilnPatchSchema), async (req, res) => {
    res.json(kilnJson(await updateKiln(ctx, String(req.params.id), req.body)))
  })

  router.delete('/kilns/:id', owner, async (req, res) => {
    const outcome = await removeKiln(ctx, String(req.params.id))
    res.status(outcome === 'deleted' ? 204 : 200).json(outcome === 'retired' ? { retired: true } : undefined)
  })

  router.get('/kilns/:id/price-list', reader, async (req, res) => {
    const found = await getKiln(ctx.db.manager, String(req.params.id))
    const priceList = await getPriceList(ctx.db.manager, found.id)
    if (!priceList) throw notFound('A price list for this kiln')
    res.json({ priceList, examplePrices: examplePrices(found, priceList) })
  })

  router.put('/kilns/:id/price-list', owner, validateBody(priceListBodySchema), async (req, res) => {
    const found = await getKiln(ctx.db.manager, String(req.params.id))
    const priceList = await putPriceList(ctx, found.id, req.body)
    res.json({ priceList, examplePrices: examplePrices(found, priceList) })
  })

  router.get('/kilns/:id/firings', reader, async (req, res) => {
    const firings = await listKilnFirings(ctx.db.manager, String(req.params.id), {
      all: res.locals.studioRole !== null && req.query.all === 'true',
    })
    res.json({ firings: await firingsJson(ctx.db.manager, firings, res.locals.studioId) })
  })

  router.post('/kilns/:id/firings', member, validateBody(firingCreateSchema), async (req, res) => {
    const created = await createFirings(ctx, String(req.params.id), req.body)
    res.status(201).json({ firings: await firingsJson(ctx.db.manager, created, res.locals.studioId) })
  })

  return router
}
