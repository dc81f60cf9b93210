import { Router } from 'express'
import { pieceHoldSchema, pieceResultSchema, pieceTagSchema } from '../../shared/schemas/pieces'
import { requireAuth } from '../auth/guards'
import type { AppContext } from '../context'
import { requireUuidParams, validateBody } from '../http/validate'
import { holdPiece, postPieceResult, releasePiece, showPiece, tagPiece } from '../services/pieces'

/** Pieces by their tags: opened by whoever may see their request; tagged, held back and given results by the studio. */
export function piecesRouter(ctx: AppContext) {
  const router = Router()

  router.post('/requests/:id/pieces', requireAuth, requireUuidParams('id'), validateBody(pieceTagSchema), async (req, res) => {
    res.status(201).json(await tagPiece(ctx, req.user!, String(req.params.id), req.body))
  })

  // A tag as typed or scanned: any case, with or without its dash.
  router.get('/pieces/:tag', requireAuth, async (req, res) => {
    res.json(await showPiece(ctx, req.user!, String(req.params.tag)))
  })

  router.post('/pieces/:tag/hold', requireAuth, validateBody(pieceHoldSchema), async (req, res) => {
    res.json(await holdPiece(ctx, req.user!, String(req.params.tag), req.body))
  })

  router.post('/pieces/:tag/release', requireAuth, async (req, res) => {
    res.json(await releasePiece(ctx, req.user!, String(req.params.tag)))
  })

  router.post('/pieces/:tag/result', requireAuth, validateBody(pieceResultSchema), async (req, res) => {
    res.json(await postPieceResult(ctx, req.user!, String(req.params.tag), req.body))
  })

  return router
}
