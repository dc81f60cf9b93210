// Sessions are stored only when there is something to keep (a signed-in person), so strangers cannot
// fill the table; expired rows are pruned; CSRF tokens still guard every change without one.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { HttpSession } from '../support/http-client'
import { createPerson, type Person } from '../support/people'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let potter: Person

beforeAll(async () => {
  app = await startTestApp({ worker: false })
  potter = await createPerson(app, 'potter', 'Session Potter')
})
afterAll(async () => {
  await app?.close()
})

const sessionRows = async () => Number((await app.ctx.db.query(`SELECT count(*) AS n FROM session`))[0].n)

describe('sessions', () => {
  it('stores no row for cookie-less token fetches, failed sign-ins or a stranger signing out', async () => {
    const before = await sessionRows()
    for (let i = 0; i < 40; i++) {
      const res = await fetch(`${app.url}/api/auth/csrf`)
      expect(res.status).toBe(200)
      expect((await res.json()).token).toMatch(/^[A-Za-z0-9_-]{20,}$/)
    }
    const stranger = new HttpSession(app.url)
    expect((await stranger.signIn(potter.email, 'not-the-password')).status).toBe(401)
    expect((await stranger.post('/api/auth/logout')).status).toBe(204)
    expect((await stranger.get('/api/auth/me')).status).toBe(401)
    expect(await sessionRows()).toBe(before)
  })

  it('stores one row when someone signs in, and drops it when they sign out', async () => {
    const before = await sessionRows()
    const session = new HttpSession(app.url)
    expect((await session.signIn(potter.email, 'test-person-long-passphrase')).status).toBe(200)
    expect(await sessionRows()).toBe(before + 1)
    expect((await session.post('/api/auth/logout')).status).toBe(204)
    expect(await sessionRows()).toBe(before)
  })

  it('prunes expired rows when the app starts', async () => {
    await app.ctx.db.query(
      `INSERT INTO session (sid, sess, expire) VALUES ('stale-one', '{"cookie":{}}', now() - interval '1 day'), ('fresh-one', '{"cookie":{}}', now() + interval '1 day')`,
    )
    const second = createApp(app.ctx)
    try {
      await expect
        .poll(
          async () =>
            (await app.ctx.db.query(`SELECT sid FROM session WHERE sid LIKE '%-one' ORDER BY sid`)).map((r: { sid: string }) => r.sid),
          { timeout: 15_000 },
        )
        .toEqual(['fresh-one'])
    } finally {
      second.close()
    }
  })
})

describe('CSRF tokens without a stored session', () => {
  it('refuses a token that belongs to another browser’s cookie', async () => {
    const mine = new HttpSession(app.url)
    const theirs = new HttpSession(app.url)
    const theirToken = await theirs.fetchCsrf()
    await mine.fetchCsrf()
    const reply = await mine.post('/api/auth/login', { email: potter.email, password: 'x' }, { headers: { 'X-CSRF-Token': theirToken } })
    expect(reply.status).toBe(403)
    expect(reply.body.error.code).toBe('csrf-invalid')
  })

  it('refuses a token without its cookie', async () => {
    const token = await new HttpSession(app.url).fetchCsrf()
    const bare = await fetch(`${app.url}/api/auth/login`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': token },
      body: JSON.stringify({ email: potter.email, password: 'x' }),
    })
    expect(bare.status).toBe(403)
  })

  it('binds the token to the session once signed in: one fetched before no longer works after', async () => {
    const session = new HttpSession(app.url)
    const before = await session.fetchCsrf()
    expect((await session.signIn(potter.email, 'test-person-long-passphrase')).status).toBe(200)
    const reply = await session.request('PATCH', '/api/auth/me', { displayName: 'Changed' }, { headers: { 'X-CSRF-Token': before } })
    expect(reply.status).toBe(403)
    const fresh = await session.request(
      'PATCH',
      '/api/auth/me',
      { displayName: 'Changed' },
      { headers: { 'X-CSRF-Token': await session.fetchCsrf() } },
    )
    expect(fresh.status).toBe(200)
  })
})
