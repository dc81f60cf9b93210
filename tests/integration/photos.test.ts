// Uploads: only real images are kept, re-encoded without their metadata (EXIF GPS included), stored
// under random names and shown only to those who may see the request.
import { readdir, readFile } from 'node:fs/promises'
import path from 'node:path'
import sharp from 'sharp'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Photo } from '../../server/entities/Photo'
import { StudioMember } from '../../server/entities/StudioMember'
import { startWorker } from '../../server/jobs/worker'
import { HttpSession } from '../support/http-client'
import { createPerson, type Person } from '../support/people'
import { draftAndSend, mug } from '../support/request-fixtures'
import { publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let owner: Person
let crew: Person
let potter: Person
let otherPotter: Person
let admin: Person
let requestId: string
let studioId: string

/** A real JPEG carrying EXIF with a GPS position and a camera name. */
async function jpegWithGps(width = 640, height = 480) {
  return sharp({ create: { width, height, channels: 3, background: { r: 180, g: 90, b: 40 } } })
    .jpeg()
    .withExif({
      IFD0: { Make: 'KilnCam', Model: 'Witness 1', Copyright: 'Studio Secret' },
      // GPS IFD: 45° 30′ N, 122° 40′ W (a point in Portland, Oregon).
      IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '45/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '122/1 40/1 0/1' },
    })
    .toBuffer()
}

async function upload(session: HttpSession, files: { name: string; bytes: Uint8Array; type?: string }[], kind = 'check-in') {
  const form = new FormData()
  form.append('kind', kind)
  for (const f of files) form.append('photos', new Blob([new Uint8Array(f.bytes)], { type: f.type ?? 'image/jpeg' }), f.name)
  return session.request('POST', `/api/requests/${requestId}/photos`, undefined, { raw: form })
}

beforeAll(async () => {
  app = await startTestApp({ worker: false })
  owner = await createPerson(app, 'host', 'Photo Host')
  crew = await createPerson(app, 'crew', 'Photo Crew')
  potter = await createPerson(app, 'potter', 'Photo Potter')
  otherPotter = await createPerson(app, 'potter', 'Nosy Potter')
  admin = await createPerson(app, 'admin', 'Photo Admin')
  const ids = await publishedStudio(owner.session, 'Photo Studio')
  studioId = ids.studioId
  await app.ctx.db.getRepository(StudioMember).save({ studioId: ids.studioId, userId: crew.id, role: 'crew' })
  requestId = (await draftAndSend(potter.session, ids.firingId, [mug()])).id
})

afterAll(async () => {
  await app?.close()
})

describe('what is taken in', () => {
  it('re-encodes a real photo and drops all its metadata, GPS included', async () => {
    const original = await jpegWithGps()
    // The fixture really carries EXIF before upload (read back with sharp, a general-purpose library).
    expect((await sharp(original).metadata()).exif?.length ?? 0).toBeGreaterThan(0)
    const reply = await upload(crew.session, [{ name: 'IMG_0001.jpg', bytes: original }])
    expect(reply.status).toBe(201)
    const stored = await app.ctx.db.getRepository(Photo).findOneByOrFail({ id: reply.body.photos[0].id })
    const bytes = await readFile(path.join(app.ctx.config.storageDir, 'photos', stored.storageKey))
    const meta = await sharp(bytes).metadata()
    expect(meta.format).toBe('jpeg')
    expect(meta.exif).toBeUndefined()
    expect(meta.xmp).toBeUndefined()
    expect(bytes.includes(Buffer.from('KilnCam'))).toBe(false)
    expect(bytes.includes(Buffer.from('Studio Secret'))).toBe(false)
    const thumb = await sharp(await readFile(path.join(app.ctx.config.storageDir, 'photos', stored.thumbKey))).metadata()
    expect(Math.max(thumb.width!, thumb.height!)).toBeLessThanOrEqual(480)
  })

  it('refuses a non-image renamed .jpg, judged by its bytes, not its name or the browser’s claim', async () => {
    const reply = await upload(crew.session, [
      { name: 'kiln.jpg', bytes: new TextEncoder().encode('#!/bin/sh\necho not a photo\n'), type: 'image/jpeg' },
    ])
    expect(reply.status).toBe(400)
    expect(reply.body.error.code).toBe('not-an-image')
  })

  it('keeps only the picture of a polyglot: the script riding after the image is gone', async () => {
    const payload = Buffer.from('<script>alert("owned")</script><?php system($_GET[1]); ?>')
    const polyglot = Buffer.concat([await jpegWithGps(64, 64), payload])
    const reply = await upload(crew.session, [{ name: 'polyglot.jpg', bytes: polyglot }])
    expect(reply.status).toBe(201)
    const stored = await app.ctx.db.getRepository(Photo).findOneByOrFail({ id: reply.body.photos[0].id })
    const bytes = await readFile(path.join(app.ctx.config.storageDir, 'photos', stored.storageKey))
    expect(bytes.includes(Buffer.from('<script>'))).toBe(false)
    expect(bytes.includes(Buffer.from('system('))).toBe(false)
  })

  it('refuses a file over the size limit with 413', async () => {
    const big = new Uint8Array(13 * 1024 * 1024)
    big.set(await jpegWithGps(32, 32))
    const reply = await upload(crew.session, [{ name: 'big.jpg', bytes: big }])
    expect(reply.status).toBe(413)
  })

  it('refuses an image of huge pixel dimensions, however small the file', async () => {
    // 12 000 × 12 000 = 144 megapixels of one colour compresses to a few kilobytes of PNG.
    const bomb = await sharp({
      create: { width: 12_000, height: 12_000, channels: 3, background: { r: 0, g: 0, b: 0 } },
      limitInputPixels: false,
    })
      .png({ compressionLevel: 9 })
      .toBuffer()
    expect(bomb.length).toBeLessThan(2 * 1024 * 1024)
    const reply = await upload(crew.session, [{ name: 'bomb.png', bytes: bomb, type: 'image/png' }])
    expect(reply.status).toBe(400)
    expect(reply.body.error.code).toBe('image-too-large')
  })

  it('never uses the file name as a path', async () => {
    const reply = await upload(crew.session, [{ name: '../../../../etc/cron.d/evil.jpg', bytes: await jpegWithGps(32, 32) }])
    expect(reply.status).toBe(201)
    const stored = await app.ctx.db.getRepository(Photo).findOneByOrFail({ id: reply.body.photos[0].id })
    expect(stored.storageKey).toMatch(/^[0-9a-f]{32}\.jpg$/)
    const names = await readdir(path.join(app.ctx.config.storageDir, 'photos'))
    expect(names.some((n) => n.includes('evil'))).toBe(false)
    expect(JSON.stringify(reply.body)).not.toContain('evil')
  })

  it('refuses too many files at once', async () => {
    const one = await jpegWithGps(16, 16)
    const reply = await upload(
      crew.session,
      Array.from({ length: 9 }, (_, i) => ({ name: `p${i}.jpg`, bytes: one })),
    )
    expect(reply.status).toBe(400)
    expect(reply.body.error.code).toBe('upload-limit-file-count')
  })

  it('keeps potters to photos of their ware and the studio to check-in and result photos', async () => {
    const one = await jpegWithGps(16, 16)
    expect((await upload(potter.session, [{ name: 'a.jpg', bytes: one }], 'check-in')).status).toBe(403)
    expect((await upload(potter.session, [{ name: 'a.jpg', bytes: one }], 'ware')).status).toBe(201)
    expect((await upload(crew.session, [{ name: 'a.jpg', bytes: one }], 'ware')).status).toBe(403)
    expect((await upload(otherPotter.session, [{ name: 'a.jpg', bytes: one }], 'ware')).status).toBe(404)
  })
})

describe('who sees a photo', () => {
  it('shows it to the potter, the studio’s people and admins, and to no one else', async () => {
    const reply = await upload(crew.session, [{ name: 'result.jpg', bytes: await jpegWithGps(64, 64) }], 'result')
    const photo = reply.body.photos[0]
    for (const viewer of [potter, owner, crew, admin]) {
      const full = await viewer.session.get(photo.url)
      expect(full.status).toBe(200)
      expect(full.headers.get('content-type')).toBe('image/jpeg')
      expect((await viewer.session.get(photo.thumbUrl)).status).toBe(200)
    }
    expect((await otherPotter.session.get(photo.url)).status).toBe(404)
    expect((await new HttpSession(app.url).get(photo.thumbUrl)).status).toBe(404)
  })

  it('shows a result photo in public only once the potter opts in', async () => {
    const reply = await upload(crew.session, [{ name: 'result.jpg', bytes: await jpegWithGps(64, 64) }], 'result')
    const photo = reply.body.photos[0]
    expect((await owner.session.patch(`/api/photos/${photo.id}`, { public: true })).status).toBe(403)
    expect((await potter.session.patch(`/api/photos/${photo.id}`, { public: true })).status).toBe(200)
    expect((await new HttpSession(app.url).get(photo.url)).status).toBe(200)
    const shown = await new HttpSession(app.url).get(`/api/studios/${studioId}/photos`)
    expect(shown.body.photos.map((p: { id: string }) => p.id)).toContain(photo.id)
    await potter.session.patch(`/api/photos/${photo.id}`, { public: false })
    expect((await new HttpSession(app.url).get(photo.url)).status).toBe(404)
    expect(
      (await new HttpSession(app.url).get(`/api/studios/${studioId}/photos`)).body.photos.map((p: { id: string }) => p.id),
    ).not.toContain(photo.id)
  })
})

describe('how much work an upload may cause', () => {
  /** A real image of this many pixels that compresses to almost nothing (one colour). */
  const flat = (width: number, height: number) =>
    sharp({ create: { width, height, channels: 3, background: { r: 90, g: 60, b: 40 } }, limitInputPixels: false })
      .png({ compressionLevel: 9 })
      .toBuffer()
  const storedFiles = async () => {
    const names = []
    for (const dir of ['photos', 'photos-incoming'])
      names.push(...(await readdir(path.join(app.ctx.config.storageDir, dir)).catch(() => [] as string[])))
    return names.sort()
  }

  it('leaves nothing behind when one file of a batch is refused', async () => {
    const before = await storedFiles()
    const rows = await app.ctx.db.getRepository(Photo).countBy({ requestId })
    const good = await jpegWithGps(64, 64)
    const reply = await upload(crew.session, [
      { name: 'a.jpg', bytes: good },
      { name: 'b.jpg', bytes: good },
      { name: 'not-a-photo.jpg', bytes: new TextEncoder().encode('just text') },
    ])
    expect(reply.status).toBe(400)
    expect(await storedFiles()).toEqual(before)
    expect(await app.ctx.db.getRepository(Photo).countBy({ requestId })).toBe(rows)
  })

  it('refuses a batch whose images are too large together, before decoding any of them', async () => {
    // Three 6 000 × 6 000 images: 108 megapixels, over the 100 allowed in one request.
    const big = await flat(6000, 6000)
    const reply = await upload(
      crew.session,
      [1, 2, 3].map((i) => ({ name: `big${i}.png`, bytes: big, type: 'image/png' })),
    )
    expect(reply.status).toBe(413)
    expect(reply.body.error.code).toBe('upload-too-many-pixels')
  })

  it('re-encodes a heavy batch off the request path: listed as being prepared, then served', async () => {
    const worker = await startWorker(app.ctx)
    try {
      const big = await flat(5000, 4000)
      const reply = await upload(crew.session, [{ name: 'wide.png', bytes: big, type: 'image/png' }])
      expect(reply.status).toBe(201)
      const photo = reply.body.photos[0]
      expect(photo.processing).toBe(true)
      await expect.poll(async () => (await crew.session.get(photo.thumbUrl)).status, { timeout: 30_000 }).toBe(200)
      const stored = await app.ctx.db.getRepository(Photo).findOneByOrFail({ id: photo.id })
      expect(stored.processing).toBe(false)
      expect(Math.max(stored.width, stored.height)).toBe(2400)
      expect(await readdir(path.join(app.ctx.config.storageDir, 'photos-incoming'))).toEqual([])
    } finally {
      await worker.stop()
    }
  })

  it('limits the pixels one person may send in a minute', async () => {
    const big = await flat(6000, 5000)
    const statuses: number[] = []
    // 30 megapixels a request against 200 a minute: the seventh request is over.
    for (let i = 0; i < 7; i++) statuses.push((await upload(owner.session, [{ name: `p${i}.png`, bytes: big, type: 'image/png' }])).status)
    expect(statuses.slice(0, 6)).toEqual([201, 201, 201, 201, 201, 201])
    expect(statuses[6]).toBe(429)
  })
})
