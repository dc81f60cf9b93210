import { Router, type ErrorRequestHandler, type Request, type Response } from 'express'
import multer from 'multer'
import { z } from 'zod'
import { photoPatchSchema } from '../../shared/schemas/pickup'
import { requireAuth } from '../auth/guards'
import type { AppContext } from '../context'
import { badRequest, HttpError } from '../http/errors'
import { requireUuidParams, validateBody } from '../http/validate'
import { addPhotos, PHOTO_LIMITS, readPhoto, setPhotoPublic } from '../services/photos'

const kindSchema = z.object({
  kind: z.enum(['ware', 'check-in', 'result', 'refusal'], { error: 'Say what the photos show: ware, check-in, result or refusal.' }),
})

// Files are held in memory only until they are checked and re-encoded; nothing the client names is
// used as a path.
const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: PHOTO_LIMITS.maxBytes, files: PHOTO_LIMITS.maxFiles, fields: 10, parts: PHOTO_LIMITS.maxFiles + 10 },
})

const uploadErrors: ErrorRequestHandler = (error, _req, _res, next) => {
  if (error instanceof multer.MulterError) {
    const messages: Record<string, [number, string]> = {
      LIMIT_FILE_SIZE: [413, `Each photo must be under ${PHOTO_LIMITS.maxBytes / 1024 / 1024} MB.`],
      LIMIT_FILE_COUNT: [400, `Send at most ${PHOTO_LIMITS.maxFiles} photos at once.`],
      LIMIT_UNEXPECTED_FILE: [400, 'Send the photos in the field named “photos”.'],
    }
    const [status, message] = messages[error.code] ?? [400, 'The upload could not be read.']
    return next(new HttpError(status, `upload-${error.code.toLowerCase().replace(/_/g, '-')}`, message, { photos: message }))
  }
  next(error)
}

export function photosRouter(ctx: AppContext) {
  const router = Router()
  const id = requireUuidParams('id')

  router.post(
    '/requests/:id/photos',
    requireAuth,
    id,
    upload.array('photos', PHOTO_LIMITS.maxFiles),
    uploadErrors,
    async (req: Request, res: Response) => {
      const parsed = kindSchema.safeParse(req.body)
      if (!parsed.success) throw badRequest('Say what the photos show.', { kind: parsed.error.issues[0].message })
      const files = (req.files as Express.Multer.File[] | undefined) ?? []
      res.status(201).json({ photos: await addPhotos(ctx, req.user!, String(req.params.id), parsed.data.kind, files) })
    },
  )

  for (const [path, size] of [
    ['/photos/:id', 'full'],
    ['/photos/:id/thumb', 'thumb'],
  ] as const) {
    router.get(path, async (req, res) => {
      const { bytes, isPublic } = await readPhoto(ctx, req.user, String(req.params.id), size)
      res
        .set({
          'Content-Type': 'image/jpeg',
          'Cache-Control': isPublic ? 'public, max-age=3600' : 'private, max-age=300',
          'Content-Disposition': 'inline',
        })
        .send(bytes)
    })
  }

  router.patch('/photos/:id', requireAuth, id, validateBody(photoPatchSchema), async (req, res) => {
    res.json(await setPhotoPublic(ctx, req.user!, String(req.params.id), req.body.public))
  })

  return router
}
