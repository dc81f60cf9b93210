// How API answers travel: JSON above 1 KB is compressed, small answers go as they are, and reads
// carry an ETag and `private, no-cache`, so a browser asks again every time and an unchanged answer
// costs a 304 without a body. Header semantics per RFC 9110 (conditional requests, content coding)
// and RFC 9111 (no-cache, private).
import { request } from 'node:http'
import { gunzipSync } from 'node:zlib'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { API_COMPRESSION_MIN_BYTES } from '../../server/http/api-responses'
import { HttpSession } from '../support/http-client'
import { createPerson, type Person } from '../support/people'
import { firingBody, publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let owner: Person
let ids: { studioId: string; kilnId: string; firingId: string }

const days = (n: number) => new Date(Date.now() + n * 24 * 3600_000).toISOString()

beforeAll(async () => {
  app = await startTestApp({ worker: false })
  owner = await createPerson(app, 'host', 'Ilse Marchetti')
  ids = await publishedStudio(owner.session, 'Marchetti Kiln Yard')
  // Enough firings for the list to pass the compression threshold.
  for (let week = 1; week <= 5; week++) {
    const reply = await owner.session.post(
      `/api/kilns/${ids.kilnId}/firings`,
      firingBody({ dropOffBy: days(7 * week), firingDate: days(7 * week + 2), readyBy: days(7 * week + 4) }),
    )
    expect(reply.status).toBe(201)
  }
})

afterAll(async () => {
  await app?.close()
})

/**
 * A plain GET with exactly the headers given; the raw body, not decoded. (fetch would add
 * `Cache-Control: no-cache` to a request carrying If-None-Match, as the Fetch standard says for
 * hand-made conditional requests, and that rightly forbids a 304; a browser revalidating its own
 * cached copy sends no such header.)
 */
async function rawGet(path: string, headers: Record<string, string> = {}) {
  return new Promise<{ status: number; headers: Record<string, string | string[] | undefined>; body: Buffer }>((resolve, reject) => {
    const req = request(app.url + path, { headers }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) }))
    })
    req.on('error', reject)
    req.end()
  })
}

describe('reads are revalidated by ETag', () => {
  it('answers a repeat of the public studio page with 304 until the studio changes', async () => {
    const anyone = new HttpSession(app.url)
    const first = await anyone.get(`/api/studios/${ids.studioId}`)
    expect(first.status).toBe(200)
    const etag = first.headers.get('etag')
    expect(etag).toBeTruthy()
    expect(first.headers.get('cache-control')).toBe('private, no-cache')

    const repeat = await rawGet(`/api/studios/${ids.studioId}`, { 'If-None-Match': etag! })
    expect(repeat.status).toBe(304)
    expect(repeat.body.length).toBe(0)

    const changed = await owner.session.patch(`/api/studios/${ids.studioId}`, { dropOffHours: 'Saturdays 9–12, side door' })
    expect(changed.status).toBe(200)
    const fresh = await rawGet(`/api/studios/${ids.studioId}`, { 'If-None-Match': etag! })
    expect(fresh.status).toBe(200)
    expect(JSON.parse(fresh.body.toString('utf8')).dropOffHours).toBe('Saturdays 9–12, side door')
    expect(fresh.headers.etag).not.toBe(etag)
  })

  it('does the same for the studio’s firing list', async () => {
    const anyone = new HttpSession(app.url)
    const first = await anyone.get(`/api/studios/${ids.studioId}/firings`)
    expect(first.status).toBe(200)
    expect(first.body.firings.length).toBe(6)
    const etag = first.headers.get('etag')!
    const repeat = await rawGet(`/api/studios/${ids.studioId}/firings`, { 'If-None-Match': etag })
    expect(repeat.status).toBe(304)

    const added = await owner.session.post(
      `/api/kilns/${ids.kilnId}/firings`,
      firingBody({ dropOffBy: days(50), firingDate: days(52), readyBy: days(54) }),
    )
    expect(added.status).toBe(201)
    const fresh = await rawGet(`/api/studios/${ids.studioId}/firings`, { 'If-None-Match': etag })
    expect(fresh.status).toBe(200)
    expect(JSON.parse(fresh.body.toString('utf8')).firings.length).toBe(7)
  })

  it('revalidates a member’s own reads too, with the answer kept private', async () => {
    const first = await owner.session.get(`/api/studios/${ids.studioId}`)
    expect(first.headers.get('cache-control')).toBe('private, no-cache')
    const repeat = await rawGet(`/api/studios/${ids.studioId}`, {
      Cookie: owner.session.cookieHeader(),
      'If-None-Match': first.headers.get('etag')!,
    })
    expect(repeat.status).toBe(304)
    // The public sees less of the studio than its owner: the same URL, a different answer.
    const publicCopy = await rawGet(`/api/studios/${ids.studioId}`, { 'If-None-Match': first.headers.get('etag')! })
    expect(publicCopy.status).toBe(200)
  })
})

describe('compression of JSON answers', () => {
  it('compresses an answer above the threshold with the encoding the client accepts', async () => {
    const plain = await rawGet(`/api/studios/${ids.studioId}/firings`, { 'Accept-Encoding': 'identity' })
    expect(plain.headers['content-encoding']).toBeUndefined()
    expect(plain.body.length).toBeGreaterThan(API_COMPRESSION_MIN_BYTES)

    const gzipped = await rawGet(`/api/studios/${ids.studioId}/firings`, { 'Accept-Encoding': 'gzip' })
    expect(gzipped.headers['content-encoding']).toBe('gzip')
    expect(gzipped.headers.vary).toMatch(/Accept-Encoding/i)
    expect(gzipped.body.length).toBeLessThan(plain.body.length)
    expect(JSON.parse(gunzipSync(gzipped.body).toString('utf8'))).toEqual(JSON.parse(plain.body.toString('utf8')))

    const brotli = await rawGet(`/api/studios/${ids.studioId}/firings`, { 'Accept-Encoding': 'br, gzip' })
    expect(brotli.headers['content-encoding']).toBe('br')
  })

  it('sends small answers as they are', async () => {
    const health = await rawGet('/api/meta', { 'Accept-Encoding': 'gzip, br' })
    expect(health.status).toBe(200)
    expect(health.body.length).toBeLessThan(API_COMPRESSION_MIN_BYTES)
    expect(health.headers['content-encoding']).toBeUndefined()
  })

  it('keeps error answers in their shape, compressed or not', async () => {
    const missing = await rawGet('/api/studios/00000000-0000-4000-8000-000000000000', { 'Accept-Encoding': 'gzip' })
    expect(missing.status).toBe(404)
    const body = missing.headers['content-encoding'] === 'gzip' ? gunzipSync(missing.body) : missing.body
    expect(JSON.parse(body.toString('utf8'))).toMatchObject({ error: { code: expect.any(String), message: expect.any(String) } })
  })
})
