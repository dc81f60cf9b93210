import { Router } from 'express'
import { z } from 'zod'
import { checkWare, type Firing, type Kiln, type Piece, type WareCheck } from '../../shared/firing/check'
import { quoteRequest, type PriceList, type Quote } from '../../shared/firing/quote'
import { wareCheckBodySchema, type WareCheckBody } from '../../shared/schemas/firing'
import { openRouteLimiter } from '../auth/rate-limit'
import type { AppContext } from '../context'
import { badRequest, notFound } from '../http/errors'
import { validateBody } from '../http/validate'
import { loadFiringForCheck } from '../services/firings'

export type WareCheckReply = WareCheck & { quote?: Quote }

interface CheckSubject {
  kiln: Kiln
  firing: Firing
  priceList: PriceList | null
}

// Firing ids are uuids; anything else cannot name a firing, and must not reach the database as one.
const firingIdSchema = z.uuid()

async function subjectOf(ctx: AppContext, body: WareCheckBody): Promise<CheckSubject> {
  if ('firingId' in body) {
    const found = firingIdSchema.safeParse(body.firingId).success ? await loadFiringForCheck(ctx, body.firingId) : null
    if (!found) throw notFound('That firing')
    return found
  }
  return { kiln: body.kiln, firing: body.firing, priceList: body.priceList ?? null }
}

function quoteFor(subject: CheckSubject, pieces: Piece[]): Quote | undefined {
  if (!subject.priceList) return undefined
  try {
    return quoteRequest(subject.priceList, subject.firing, pieces, subject.kiln)
  } catch (error) {
    // A price list the schema accepts can still be unusable for this kiln (a shelf price with no shelf room).
    if (error instanceof RangeError) throw badRequest(error.message, { priceList: error.message })
    throw error
  }
}

export function wareChecksRouter(ctx: AppContext) {
  const router = Router()
  const perIp = openRouteLimiter(ctx.config.rateLimits.openApiPerIpPerMin)

  // Open to visitors: the planner asks before anyone has an account. The answer is computed, never stored.
  router.post('/ware-checks', perIp, validateBody(wareCheckBodySchema), async (req, res) => {
    const body = req.body as WareCheckBody
    const subject = await subjectOf(ctx, body)
    const check = checkWare(subject.kiln, subject.firing, body.pieces)
    const quote = quoteFor(subject, body.pieces)
    const reply: WareCheckReply = quote ? { ...check, quote } : check
    res.json(reply)
  })

  return router
}
