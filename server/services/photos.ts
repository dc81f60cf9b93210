// Photos of ware: taken in only when their bytes say they are images, re-encoded (which drops any
// payload riding along and every piece of metadata, GPS included), thumbnailed, and stored under
// random names in the storage directory. Served only to those who may see the request, and on the
// studio's public page only when the potter opts in.
import { fileTypeFromBuffer } from 'file-type'
import { randomBytes } from 'node:crypto'
import { mkdir, readFile, writeFile } from 'node:fs/promises'
import path from 'node:path'
import sharp, { type Metadata, type Sharp } from 'sharp'
import type { EntityManager } from 'typeorm'
import type { AppContext } from '../context'
import { Photo, type PhotoKind } from '../entities/Photo'
import type { User } from '../entities/User'
import { badRequest, forbidden, HttpError, notFound } from '../http/errors'
import { isUuid } from '../http/validate'
import { loadRequest, viewerOf } from './request-context'

export const PHOTO_LIMITS = {
  /** Per file, as uploaded. */
  maxBytes: 12 * 1024 * 1024,
  maxFiles: 8,
  /** Decoded size limit: a small file can unpack into a huge image (a "pixel bomb"). */
  maxPixels: 40_000_000,
  /** Stored photos are scaled to fit this box; thumbnails to the smaller one. */
  maxSide: 2400,
  thumbSide: 480,
}

const ACCEPTED = new Set(['image/jpeg', 'image/png', 'image/webp', 'image/gif', 'image/avif', 'image/tiff'])

export interface UploadedFile {
  originalname: string
  buffer: Buffer
  size: number
}

function photoDir(ctx: AppContext) {
  return path.join(ctx.config.storageDir, 'photos')
}

/** Who may add which kind of photo: the potter shows their ware; the studio records the rest. */
function mayUpload(side: 'potter' | 'studio' | 'admin', kind: PhotoKind) {
  if (side === 'admin') return true
  return side === 'potter' ? kind === 'ware' : kind !== 'ware'
}

/** Decodes, re-encodes and stores one image; refuses anything that is not really one. */
async function storeImage(ctx: AppContext, file: UploadedFile) {
  const type = await fileTypeFromBuffer(file.buffer)
  if (!type || !ACCEPTED.has(type.mime)) {
    throw badRequest(
      `“${path.basename(file.originalname).slice(0, 80)}” is not a photo we can take (JPEG, PNG, WebP, GIF, AVIF or TIFF).`,
      { photos: 'Not an image.' },
      'not-an-image',
    )
  }
  let image: Sharp
  let meta: Metadata
  try {
    image = sharp(file.buffer, { limitInputPixels: PHOTO_LIMITS.maxPixels, failOn: 'error' })
    meta = await image.metadata()
  } catch (error) {
    const tooBig = /pixel limit/i.test(String((error as Error).message))
    throw badRequest(
      tooBig ? 'That image is too large in pixels. Send one under 40 megapixels.' : 'That image is damaged and cannot be read.',
      { photos: tooBig ? 'Too many pixels.' : 'Unreadable image.' },
      tooBig ? 'image-too-large' : 'bad-image',
    )
  }
  if ((meta.width ?? 0) * (meta.height ?? 0) > PHOTO_LIMITS.maxPixels) {
    throw badRequest('That image is too large in pixels. Send one under 40 megapixels.', { photos: 'Too many pixels.' }, 'image-too-large')
  }
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
  const name = randomBytes(16).toString('hex')
  await mkdir(photoDir(ctx), { recursive: true })
  await writeFile(path.join(photoDir(ctx), `${name}.jpg`), full.data, { flag: 'wx' })
  await writeFile(path.join(photoDir(ctx), `${name}.thumb.jpg`), thumb, { flag: 'wx' })
  return {
    storageKey: `${name}.jpg`,
    thumbKey: `${name}.thumb.jpg`,
    width: full.info.width,
    height: full.info.height,
    bytes: full.data.length,
  }
}

export async function addPhotos(ctx: AppContext, user: User, requestId: string, kind: PhotoKind, files: UploadedFile[]) {
  if (!files.length) throw badRequest('Choose at least one photo.', { photos: 'No file was sent.' }, 'no-files')
  const rc = await loadRequest(ctx.db.manager, requestId)
  const viewer = await viewerOf(ctx.db.manager, rc, user)
  if (!mayUpload(viewer.side, kind))
    throw forbidden(
      viewer.side === 'potter'
        ? 'Potters add photos of their ware; the studio posts check-in and result photos.'
        : 'The studio posts check-in and result photos; the potter adds photos of the ware.',
    )
  // Every file is checked before any is kept, so a bad one in a batch stores nothing.
  const stored = []
  for (const file of files) stored.push(await storeImage(ctx, file))
  const saved = await ctx.db
    .getRepository(Photo)
    .save(stored.map((s) => ({ ...s, requestId, kind, pieceId: null, uploadedBy: user.id, publicOptIn: false })))
  return saved.map(photoJson)
}

export function photoJson(photo: Photo) {
  return {
    id: photo.id,
    kind: photo.kind,
    width: photo.width,
    height: photo.height,
    public: photo.publicOptIn,
    pieceId: photo.pieceId,
    url: `/api/photos/${photo.id}`,
    thumbUrl: `/api/photos/${photo.id}/thumb`,
    at: photo.createdAt.toISOString(),
  }
}

export async function requestPhotos(manager: EntityManager, requestId: string) {
  return (await manager.getRepository(Photo).find({ where: { requestId }, order: { createdAt: 'ASC' } })).map(photoJson)
}

/** The bytes of a photo for someone allowed to see it; a 404 for anyone else, as if it were not there. */
export async function readPhoto(ctx: AppContext, user: User | undefined, photoId: string, size: 'full' | 'thumb') {
  if (!isUuid(photoId)) throw notFound('That photo')
  const photo = await ctx.db.getRepository(Photo).findOne({ where: { id: photoId } })
  if (!photo) throw notFound('That photo')
  const publicResult = photo.kind === 'result' && photo.publicOptIn
  if (!publicResult) {
    if (!user) throw notFound('That photo')
    const rc = await loadRequest(ctx.db.manager, photo.requestId)
    await viewerOf(ctx.db.manager, rc, user)
  }
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
