// Input that once made the server answer 500: NUL characters and unpaired surrogates in text fields,
// broken multipart and JSON bodies, malformed ids in paths, hostile query strings, and a rate limiter
// that wrote what the client sent before it was checked. Each is now a 4xx in the error shape.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { HttpSession } from '../support/http-client'
import { createPerson, type Person } from '../support/people'
import { draftAndSend, mug } from '../support/request-fixtures'
import { firingBody, publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let owner: Person
let potter: Person
let admin: Person
let ids: { studioId: string; kilnId: string; firingId: string }
let requestId: string

const NUL = 'Kiln\u0000room'
const LONE_HIGH = 'Mug \ud800'
const LONE_LOW = '\udfff bowl'

beforeAll(async () => {
  app = await startTestApp({ worker: false })
  owner = await createPerson(app, 'host', 'Hostile Owner')
  potter = await createPerson(app, 'potter', 'Hostile Potter')
  admin = await createPerson(app, 'admin', 'Hostile Admin')
  ids = await publishedStudio(owner.session, 'Hostile Input Pottery')
  requestId = (await draftAndSend(potter.session, ids.firingId, [mug()])).id
}, 60_000)

afterAll(async () => {
  await app?.close()
})

function expectFieldError(reply: { status: number; body: { error?: { code: string; fields?: Record<string, string> } } }, field: string) {
  expect(reply.status, JSON.stringify(reply.body)).toBe(400)
  expect(reply.body.error?.fields?.[field], JSON.stringify(reply.body)).toMatch(/character/i)
}

describe('NUL and unpaired surrogates in text', () => {
  it('refuses them in names, notes, messages and reasons with a field error', async () => {
    const s = owner.session
    expectFieldError(await s.post('/api/studios', { name: NUL, postalCode: '97214' }), 'name')
    expectFieldError(await s.patch(`/api/studios/${ids.studioId}`, { description: NUL }), 'description')
    expectFieldError(await s.patch(`/api/kilns/${ids.kilnId}`, { notes: NUL }), 'notes')
    expectFieldError(await s.post(`/api/kilns/${ids.kilnId}/firings`, firingBody({ notes: LONE_HIGH })), 'notes')
    expectFieldError(await s.post(`/api/firings/${ids.firingId}/cancel`, { reason: `Power cut ${LONE_LOW}` }), 'reason')
    expectFieldError(await s.post(`/api/requests/${requestId}/decline`, { reason: NUL }), 'reason')
    expectFieldError(await potter.session.post(`/api/requests/${requestId}/messages`, { body: NUL }), 'body')
    expectFieldError(await potter.session.patch('/api/auth/me', { displayName: LONE_HIGH }), 'displayName')
  })

  it('refuses them in piece labels and request notes, which are kept as JSON', async () => {
    const p = potter.session
    expectFieldError(await p.post(`/api/firings/${ids.firingId}/requests`, { pieces: [mug({ label: LONE_HIGH })] }), 'pieces.0.label')
    expectFieldError(await p.post(`/api/firings/${ids.firingId}/requests`, { pieces: [mug({ label: NUL })] }), 'pieces.0.label')
    expectFieldError(await p.post(`/api/firings/${ids.firingId}/requests`, { pieces: [mug()], notes: LONE_LOW }), 'notes')
    expectFieldError(await p.post('/api/ware-checks', { firingId: ids.firingId, pieces: [mug({ label: LONE_LOW })] }), 'pieces.0.label')
  })

  it('refuses them in e-mail addresses, before any account or counter is touched', async () => {
    const anyone = new HttpSession(app.url)
    const keys = async () =>
      ((await app.ctx.db.query(`SELECT key FROM rate_limit_counters ORDER BY key`)) as { key: string }[]).map((c) => c.key)
    const before = await keys()
    expectFieldError(await anyone.post('/api/auth/login', { email: `a\u0000b@example.test`, password: 'whatever-long' }), 'email')
    expectFieldError(
      await anyone.post('/api/auth/register', {
        email: `new\u0000@example.test`,
        password: 'a-long-new-password',
        displayName: 'N',
        role: 'potter',
      }),
      'email',
    )
    expectFieldError(await anyone.post('/api/auth/password-reset/request', { email: `x\ud800@example.test` }), 'email')
    expectFieldError(await owner.session.post(`/api/studios/${ids.studioId}/invites`, { email: `crew\u0000@example.test` }), 'email')
    // The per-address counter (keyed by IP) counts the attempts; nothing keyed by what was sent is written.
    expect(await keys()).toEqual(before)
  })

  it('keeps ordinary text with emoji and accents as it was written', async () => {
    const reply = await potter.session.post(`/api/requests/${requestId}/messages`, { body: 'Glaze “Celadon” 🏺 — ready Thursday? Ça va.' })
    expect(reply.status, JSON.stringify(reply.body)).toBe(201)
    expect(reply.body.body).toBe('Glaze “Celadon” 🏺 — ready Thursday? Ça va.')
  })
})

describe('malformed ids in paths', () => {
  it('answers 404 for a studio, crew member or invitation named by something that is not an id', async () => {
    expect((await admin.session.post('/api/studios/not-a-uuid/verify', { verified: true })).status).toBe(404)
    expect((await owner.session.delete(`/api/studios/${ids.studioId}/crew/not-a-uuid`)).status).toBe(404)
    expect((await owner.session.delete(`/api/studios/${ids.studioId}/invites/1%20OR%201=1`)).status).toBe(404)
    expect((await owner.session.delete(`/api/studios/${ids.studioId}/invites/%00`)).status).toBe(404)
    expect((await potter.session.patch('/api/photos/nope', { public: true })).status).toBe(404)
    expect((await admin.session.post('/api/admin/users/12/suspend', { suspended: true })).status).toBe(404)
  })
})

describe('hostile query strings', () => {
  it('refuses a NUL in the admin user search with a field error', async () => {
    const reply = await admin.session.get('/api/admin/users?q=%00')
    expect(reply.status).toBe(400)
    expect(reply.body.error.fields.q).toMatch(/character/i)
  })

  it('refuses a NUL in search words and place names', async () => {
    expect((await new HttpSession(app.url).get('/api/search?q=%00')).status).toBe(400)
    expect((await new HttpSession(app.url).get('/api/places?q=97%00214')).status).toBe(400)
  })
})

describe('edits that race', () => {
  it('keeps a price list whole when two edits switch its deposit between percent and fixed at once', async () => {
    const bodies = Array.from({ length: 24 }, (_, i) => ({
      currency: 'USD',
      model: 'volume',
      centsPerCubicInch: 4,
      deposit: i % 2 ? { percent: 10 + i } : { fixedCents: 500 + i },
    }))
    const replies = await Promise.all(bodies.map((body) => owner.session.put(`/api/kilns/${ids.kilnId}/price-list`, body)))
    expect(replies.map((r) => r.status)).toEqual(replies.map(() => 200))
  })
})

describe('broken bodies', () => {
  const multipart = (session: HttpSession, body: string, contentType: string) =>
    session.request('POST', `/api/requests/${requestId}/photos`, undefined, { raw: body, headers: { 'Content-Type': contentType } })

  it('answers a truncated or malformed multipart body with 400', async () => {
    const truncated = [
      '--XyZ',
      'Content-Disposition: form-data; name="kind"',
      '',
      'ware',
      '--XyZ',
      'Content-Disposition: form-data; name="photos"; filename="a.jpg"',
      'Content-Type: image/jpeg',
      '',
      '\xff\xd8\xff',
    ].join('\r\n')
    for (const [body, type] of [
      [truncated, 'multipart/form-data; boundary=XyZ'],
      ['--XyZ\r\nthis is not a part header\r\n\r\n', 'multipart/form-data; boundary=XyZ'],
      ['anything', 'multipart/form-data'],
      ['--XyZ--', 'multipart/form-data; boundary=XyZ; charset=nonsense'],
    ]) {
      const reply = await multipart(potter.session, body, type)
      expect(reply.status, `${type}: ${JSON.stringify(reply.body)}`).toBe(400)
      expect(reply.body.error.code).toMatch(/^upload-|^invalid-input$/)
    }
  })

  it('answers a NUL in a file name or form field with 400, not 500', async () => {
    const form = new FormData()
    form.append('kind', 'wa\u0000re')
    form.append('photos', new Blob([new Uint8Array([0xff, 0xd8, 0xff])], { type: 'image/jpeg' }), 'evil\u0000.jpg')
    const reply = await potter.session.request('POST', `/api/requests/${requestId}/photos`, undefined, { raw: form })
    expect(reply.status).toBe(400)
  })

  it('answers malformed, truncated and oversized JSON with 400 and 413', async () => {
    const send = (raw: string, type = 'application/json') =>
      potter.session.request('POST', `/api/requests/${requestId}/messages`, undefined, { raw, headers: { 'Content-Type': type } })
    expect((await send('{"body": "half')).status).toBe(400)
    expect((await send('{"body": "\\ud800"}')).status).toBe(400)
    expect((await send('[[[[[[[[[[')).status).toBe(400)
    expect((await send('{"body":"x"}', 'application/json; charset=latin1')).status).toBe(415)
    expect((await send(JSON.stringify({ body: 'x'.repeat(1_100_000) }))).status).toBe(413)
  })
})
