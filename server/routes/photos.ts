import { Router, type Request, type RequestHandler, type Response } from 'express'
import multer from 'multer'
import { z, type ZodType } from 'zod'
import { photoPatchSchema } from '../../shared/schemas/pickup'
import { requireAuth } from '../auth/guards'
import type { AppContext } from '../context'
import { HttpError } from '../http/errors'
import { describeValidation, requireUuidParams, validateBody } from '../http/validate'
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

/** Multer's refusals and busboy's parse failures (truncated, malformed or boundary-less bodies) as 4xx. */
function uploadError(error: unknown): HttpError {
  if (error instanceof multer.MulterError) {
    const messages: Record<string, [number, string]> = {
      LIMIT_FILE_SIZE: [413, `Each photo must be under ${PHOTO_LIMITS.maxBytes / 1024 / 1024} MB.`],
      LIMIT_FILE_COUNT: [400, `Send at most ${PHOTO_LIMITS.maxFiles} photos at once.`],
      LIMIT_UNEXPECTED_FILE: [400, 'Send the photos in the field named “photos”.'],
    }
    const [status, message] = messages[error.code] ?? [400, 'The upload could not be read.']
    return new HttpError(status, `upload-${error.code.toLowerCase().replace(/_/g, '-')}`, message, { photos: message })
  }
  const message = 'The upload could not be read: it was cut short or is not a well-formed form. Send the photos again.'
  return new HttpError(400, 'upload-malformed', message, { photos: message })
}

/** Receives the photos; anything multer or its parser refuses becomes a 4xx in the one error shape. */
export function receivePhotos(schema: ZodType): RequestHandler {
  return describeValidation(
    (req, res, next) =>
      upload.array('photos', PHOTO_LIMITS.maxFiles)(req, res, (error?: unknown) => next(error ? uploadError(error) : undefined)),
    { where: 'multipart', schema, fileField: 'photos' },
  )
}

export function photosRouter(ctx: AppContext) {
  const router = Router()
  const id = requireUuidParams('id')

  router.post(
    '/requests/:id/photos',
    requireAuth,
    id,
    receivePhotos(kindSchema),
    validateBody(kindSchema),
    async (req: Request, res: Response) => {
      const files = (req.files as Express.Multer.File[] | undefined) ?? []
      res.status(201).json({ photos: await addPhotos(ctx, req.user!, String(req.params.id), req.body.kind, files) })
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
