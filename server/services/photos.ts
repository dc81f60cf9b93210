// Photos of ware: taken in only when their bytes say they are images, re-encoded (which drops any
// payload riding along and every piece of metadata, GPS included), thumbnailed, and stored under
// random names in the storage directory. Served only to those who may see the request, and on the
// studio's public page only when the potter opts in.
import { fileTypeFromBuffer } from 'file-type'
import { randomBytes } from 'node:crypto'
import { mkdir, readFile, rm, writeFile } from 'node:fs/promises'
import path from 'node:path'
import sharp, { type Metadata, type Sharp } from 'sharp'
import { IsNull, type EntityManager } from 'typeorm'
import type { AppContext } from '../context'
import { Photo, type PhotoKind } from '../entities/Photo'
import type { User } from '../entities/User'
import { badRequest, forbidden, HttpError, notFound } from '../http/errors'
import { isUuid } from '../http/validate'
import { enqueueJob } from '../jobs/queue'
import { countHit, secondsUntil } from './counters'
import { incidentViewerOf, loadIncident } from './incident-access'
import { loadRequest, viewerOf } from './request-context'

export const PHOTO_LIMITS = {
  /** Per file, as uploaded. */
  maxBytes: 12 * 1024 * 1024,
  maxFiles: 8,
  /** Decoded size limit: a small file can unpack into a huge image (a "pixel bomb"). */
  maxPixels: 40_000_000,
  /** Decoded pixels in one request, all files together. */
  maxPixelsPerRequest: 100_000_000,
  /** Decoded pixels one person may send in a minute. */
  userPixelsPerMinute: 200_000_000,
  /** A batch up to this many pixels is re-encoded while the request waits; a bigger one by the queue. */
  inlinePixels: 16_000_000,
  /** Stored photos are scaled to fit this box; thumbnails to the smaller one. */
  maxSide: 2400,
  thumbSide: 480,
}

export const PROCESS_PHOTO_TASK = 'process-photo'

const ACCEPTED = new Set(['image/jpeg', 'image/png', 'image/webp', 'image/gif', 'image/avif', 'image/tiff'])

export interface UploadedFile {
  originalname: string
  buffer: Buffer
  size: number
}

function photoDir(ctx: AppContext) {
  return path.join(ctx.config.storageDir, 'photos')
}

/** Raw uploads waiting for the queue to re-encode them: private, deleted once done. */
function incomingDir(ctx: AppContext) {
  return path.join(ctx.config.storageDir, 'photos-incoming')
}

/** Who may add which kind of photo: the potter shows their ware; the studio records the rest. */
function mayUpload(side: 'potter' | 'studio' | 'admin', kind: PhotoKind) {
  if (side === 'admin' || kind === 'incident') return true
  return side === 'potter' ? kind === 'ware' : kind !== 'ware'
}

const tooManyPixels = () =>
  badRequest('That image is too large in pixels. Send one under 40 megapixels.', { photos: 'Too many pixels.' }, 'image-too-large')

/**
 * Checks one file without decoding it: its bytes say it is an image we take, and its header gives
 * a size within the limit. Cheap, so every file of a batch is checked before any work is done.
 */
async function inspect(file: UploadedFile): Promise<{ file: UploadedFile; pixels: number }> {
  const type = await fileTypeFromBuffer(file.buffer)
  if (!type || !ACCEPTED.has(type.mime)) {
    throw badRequest(
      `“${path.basename(file.originalname).slice(0, 80)}” is not a photo we can take (JPEG, PNG, WebP, GIF, AVIF or TIFF).`,
      { photos: 'Not an image.' },
      'not-an-image',
    )
  }
  let meta: Metadata
  try {
    meta = await sharp(file.buffer, { limitInputPixels: PHOTO_LIMITS.maxPixels, failOn: 'error' }).metadata()
  } catch (error) {
    if (/pixel limit/i.test(String((error as Error).message))) throw tooManyPixels()
    throw badRequest('That image is damaged and cannot be read.', { photos: 'Unreadable image.' }, 'bad-image')
  }
  const pixels = (meta.width ?? 0) * (meta.height ?? 0) * Math.max(1, meta.pages ?? 1)
  if (pixels > PHOTO_LIMITS.maxPixels) throw tooManyPixels()
  return { file, pixels }
}

/** Decodes and re-encodes: the stored photo and its thumbnail, with no metadata. */
async function encode(bytes: Buffer) {
  let image: Sharp
  try {
    image = sharp(bytes, { limitInputPixels: PHOTO_LIMITS.maxPixels, failOn: 'error' })
    // rotate() applies the EXIF orientation before the metadata (EXIF, GPS, XMP, ICC) is dropped:
    // sharp writes none of it unless asked to keep it.
    const base = image.rotate()
    const full = await base
      .clone()
      .resize({ width: PHOTO_LIMITS.maxSide, height: PHOTO_LIMITS.maxSide, fit: 'inside', withoutEnlargement: true })
      .jpeg({ quality: 85, mozjpeg: true })
      .toBuffer({ resolveWithObject: true })
    const thumb = await base
      .clone()
      .resize({ width: PHOTO_LIMITS.thumbSide, height: PHOTO_LIMITS.thumbSide, fit: 'inside', withoutEnlargement: true })
      .jpeg({ quality: 78 })
      .toBuffer()
    return { full: full.data, thumb, width: full.info.width, height: full.info.height }
  } catch {
    throw badRequest('That image is damaged and cannot be read.', { photos: 'Unreadable image.' }, 'bad-image')
  }
}

/** Counts the batch's pixels against the person's minute; over it, the upload waits. */
async function takePixelBudget(ctx: AppContext, userId: string, pixels: number) {
  // Kilopixels, so a busy minute stays well inside the counter's integer.
  const { hits, resetAt } = await countHit(ctx.db, `photo-pixels:${userId}`, 60_000, Math.ceil(pixels / 1000))
  if (hits * 1000 > PHOTO_LIMITS.userPixelsPerMinute) {
    throw new HttpError(
      429,
      'upload-budget',
      'You have sent a lot of large photos in the last minute. Wait a moment and send the rest.',
      { photos: 'Too many pixels this minute.' },
      { retryAfterSeconds: secondsUntil(resetAt) },
    )
  }
}

/** Removes what a refused or failed batch wrote, so nothing is left behind. */
async function removeAll(files: string[]) {
  await Promise.all(files.map((file) => rm(file, { force: true })))
}

/** Stores photos on a request; an incident's photos (kind 'incident') name the incident too. */
export async function addPhotos(
  ctx: AppContext,
  user: User,
  requestId: string,
  kind: PhotoKind,
  files: UploadedFile[],
  incidentId: string | null = null,
) {
  if ((kind === 'incident') !== (incidentId !== null)) throw badRequest('Incident photos are added on the incident.', { kind: 'Not here.' })
  if (!files.length) throw badRequest('Choose at least one photo.', { photos: 'No file was sent.' }, 'no-files')
  const rc = await loadRequest(ctx.db.manager, requestId)
  const viewer = await viewerOf(ctx.db.manager, rc, user)
  if (!mayUpload(viewer.side, kind))
    throw forbidden(
      viewer.side === 'potter'
        ? 'Potters add photos of their ware; the studio posts drop-off and result photos.'
        : 'The studio posts drop-off and result photos; the potter adds photos of the ware.',
    )
  // Every file is checked before anything is decoded or written, so a bad one in a batch stores nothing.
  const inspected = []
  for (const file of files) inspected.push(await inspect(file))
  const pixels = inspected.reduce((n, i) => n + i.pixels, 0)
  if (pixels > PHOTO_LIMITS.maxPixelsPerRequest) {
    const message = `Those photos are too large together. Send them in smaller batches (up to ${PHOTO_LIMITS.maxPixelsPerRequest / 1_000_000} megapixels at once).`
    throw new HttpError(413, 'upload-too-many-pixels', message, { photos: message })
  }
  await takePixelBudget(ctx, user.id, pixels)

  const heavy = pixels > PHOTO_LIMITS.inlinePixels
  const written: string[] = []
  try {
    const rows: Pick<Photo, 'storageKey' | 'thumbKey' | 'width' | 'height' | 'bytes' | 'processing'>[] = []
    if (!heavy) {
      const encoded = []
      for (const { file } of inspected) encoded.push(await encode(file.buffer))
      await mkdir(photoDir(ctx), { recursive: true })
      for (const e of encoded) {
        const name = randomBytes(16).toString('hex')
        for (const [file, bytes] of [
          [`${name}.jpg`, e.full],
          [`${name}.thumb.jpg`, e.thumb],
        ] as const) {
          await writeFile(path.join(photoDir(ctx), file), bytes, { flag: 'wx' })
          written.push(path.join(photoDir(ctx), file))
        }
        rows.push({
          storageKey: `${name}.jpg`,
          thumbKey: `${name}.thumb.jpg`,
          width: e.width,
          height: e.height,
          bytes: e.full.length,
          processing: false,
        })
      }
    } else {
      // Heavy work goes to the queue (one image at a time, in the "photos" queue); the upload is kept
      // raw and private until then, and the photo is listed as being prepared.
      await mkdir(incomingDir(ctx), { recursive: true })
      for (const { file } of inspected) {
        const name = randomBytes(16).toString('hex')
        await writeFile(path.join(incomingDir(ctx), name), file.buffer, { flag: 'wx' })
        written.push(path.join(incomingDir(ctx), name))
        const meta = await sharp(file.buffer).metadata()
        rows.push({
          storageKey: `${name}.jpg`,
          thumbKey: `${name}.thumb.jpg`,
          width: meta.width ?? 0,
          height: meta.height ?? 0,
          bytes: file.size,
          processing: true,
        })
      }
    }
    const saved = await ctx.db.transaction(async (manager) => {
      const photos = await manager
        .getRepository(Photo)
        .save(rows.map((r) => ({ ...r, requestId, kind, pieceId: null, incidentId, uploadedBy: user.id, publicOptIn: false })))
      for (const photo of photos.filter((p) => p.processing))
        await enqueueJob(manager, PROCESS_PHOTO_TASK, { photoId: photo.id }, { queueName: 'photos', maxAttempts: 5 })
      return photos
    })
    return saved.map(photoJson)
  } catch (error) {
    await removeAll(written)
    throw error
  }
}

/** The queue's half of a heavy upload: re-encode, store, mark ready, drop the raw bytes. */
export async function processPhoto(ctx: AppContext, photoId: string) {
  const photo = await ctx.db.getRepository(Photo).findOne({ where: { id: photoId } })
  if (!photo?.processing) return
  const name = path.basename(photo.storageKey, '.jpg')
  const raw = path.join(incomingDir(ctx), name)
  const bytes = await readFile(raw).catch(() => null)
  const encoded = bytes ? await encode(bytes).catch(() => null) : null
  if (!encoded) {
    // Its header passed, its pixels did not: the photo cannot be shown, so it is not kept.
    ctx.log.warn(`photo ${photo.id} could not be re-encoded; removed`)
    await ctx.db.getRepository(Photo).delete(photo.id)
    await rm(raw, { force: true })
    return
  }
  await mkdir(photoDir(ctx), { recursive: true })
  await writeFile(path.join(photoDir(ctx), photo.storageKey), encoded.full)
  await writeFile(path.join(photoDir(ctx), photo.thumbKey), encoded.thumb)
  await ctx.db
    .getRepository(Photo)
    .update(photo.id, { processing: false, width: encoded.width, height: encoded.height, bytes: encoded.full.length })
  await rm(raw, { force: true })
}

export function photoJson(photo: Photo) {
  return {
    id: photo.id,
    kind: photo.kind,
    width: photo.width,
    height: photo.height,
    public: photo.publicOptIn,
    pieceId: photo.pieceId,
    /** Still being prepared by the queue; the image is served once this is false. */
    processing: photo.processing,
    url: `/api/photos/${photo.id}`,
    thumbUrl: `/api/photos/${photo.id}/thumb`,
    at: photo.createdAt.toISOString(),
  }
}

/** The ask's own photos; an incident's photos are shown with the incident. */
export async function requestPhotos(manager: EntityManager, requestId: string) {
  return (await manager.getRepository(Photo).find({ where: { requestId, incidentId: IsNull() }, order: { createdAt: 'ASC' } })).map(
    photoJson,
  )
}

/** The bytes of a photo for someone allowed to see it; a 404 for anyone else, as if it were not there. */
export async function readPhoto(ctx: AppContext, user: User | undefined, photoId: string, size: 'full' | 'thumb') {
  if (!isUuid(photoId)) throw notFound('That photo')
  const photo = await ctx.db.getRepository(Photo).findOne({ where: { id: photoId } })
  if (!photo) throw notFound('That photo')
  const publicResult = photo.kind === 'result' && photo.publicOptIn
  if (!publicResult) {
    if (!user) throw notFound('That photo')
    if (photo.incidentId) {
      // A potter whose piece was hurt sees the incident's photos without seeing the other potter's ask.
      await incidentViewerOf(ctx.db.manager, await loadIncident(ctx.db.manager, photo.incidentId), user)
    } else {
      const rc = await loadRequest(ctx.db.manager, photo.requestId)
      await viewerOf(ctx.db.manager, rc, user)
    }
  }
  if (photo.processing)
    throw new HttpError(409, 'photo-processing', 'That photo is still being prepared. Try again in a moment.', undefined, {
      retryAfterSeconds: 2,
    })
  const key = size === 'thumb' ? photo.thumbKey : photo.storageKey
  // Keys are ours (random hex), but the path is still confined to the photo directory.
  const file = path.join(photoDir(ctx), path.basename(key))
  try {
    return { bytes: await readFile(file), isPublic: publicResult }
  } catch {
    throw new HttpError(410, 'photo-gone', 'That photo is no longer stored.')
  }
}

/** The potter lets a result photo show on the studio's public page, or takes it back. */
export async function setPhotoPublic(ctx: AppContext, user: User, photoId: string, isPublic: boolean) {
  const photo = await ctx.db.getRepository(Photo).findOne({ where: { id: photoId } })
  if (!photo) throw notFound('That photo')
  const rc = await loadRequest(ctx.db.manager, photo.requestId)
  const viewer = await viewerOf(ctx.db.manager, rc, user)
  if (viewer.side !== 'potter' && viewer.side !== 'admin')
    throw forbidden('Only the potter decides whether their results are shown in public.')
  if (photo.kind !== 'result') throw badRequest('Only result photos can be shown in public.', { public: 'Not a result photo.' })
  await ctx.db.getRepository(Photo).update(photo.id, { publicOptIn: isPublic })
  return photoJson({ ...photo, publicOptIn: isPublic })
}

/** Result photos potters chose to show, for a studio's public page. */
export async function publicStudioPhotos(manager: EntityManager, studioId: string, limit = 24) {
  const rows: Photo[] = await manager
    .getRepository(Photo)
    .createQueryBuilder('p')
    .innerJoin('firing_requests', 'r', 'r.id = p.request_id')
    .innerJoin('firings', 'f', 'f.id = r.firing_id')
    .innerJoin('kilns', 'k', 'k.id = f.kiln_id')
    .where('k.studio_id = :studioId', { studioId })
    .andWhere(`p.kind = 'result' AND p.public_opt_in`)
    .orderBy('p.createdAt', 'DESC')
    .limit(limit)
    .getMany()
  return rows.map(photoJson)
}
