import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { OutboundMail } from '../../server/entities/OutboundMail'
import { AuthToken } from '../../server/entities/AuthToken'
import { HttpSession } from '../support/http-client'
import { linkIn, waitForMail } from '../support/mailbox'
import { startTestApp, type TestApp } from '../support/test-app'

const STRONG = 'quiet-lichen-under-ash-glaze'

let app: TestApp
let counter = 0
const newEmail = () => `person${++counter}-${Date.now()}@example.test`

async function register(session: HttpSession, overrides: Record<string, unknown> = {}) {
  return session.post('/api/auth/register', {
    email: newEmail(),
    password: STRONG,
    displayName: 'June Fielding',
    role: 'potter',
    ...overrides,
  })
}

beforeAll(async () => {
  app = await startTestApp({ mail: true })
})
afterAll(async () => {
  await app?.close()
})

describe('registration', () => {
  it('creates a potter, signs them in and sets a hardened session cookie', async () => {
    const session = new HttpSession(app.url)
    const email = newEmail()
    const reply = await register(session, { email: email.toUpperCase() })
    expect(reply.status).toBe(201)
    expect(reply.body).toMatchObject({ email, displayName: 'June Fielding', role: 'potter', emailVerified: false })
    expect(reply.body.passwordHash).toBeUndefined()
    const cookie = reply.setCookies.find((c) => c.startsWith('cw.sid='))!
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
    // Served over plain http here, so the cookie must not be Secure or the browser would drop it.
    expect(cookie).not.toMatch(/Secure/i)
    const me = await session.get('/api/auth/me')
    expect(me.status).toBe(200)
    expect(me.body.email).toBe(email)
  })

  it('stores the password as a bcrypt hash with cost 12 or more', async () => {
    const session = new HttpSession(app.url)
    const reply = await register(session)
    const [row] = await app.ctx.db.query('SELECT password_hash FROM users WHERE id = $1', [reply.body.id])
    // bcrypt's modular-crypt format: $2a$/$2b$, two-digit cost, 53 characters of salt and hash.
    const match = /^\$2[aby]\$(\d\d)\$.{53}$/.exec(row.password_hash)
    expect(match).not.toBeNull()
    expect(Number(match![1])).toBeGreaterThanOrEqual(12)
  })

  it('refuses a guessable password with a reason on the field', async () => {
    const reply = await register(new HttpSession(app.url), { password: 'password1234' })
    expect(reply.status).toBe(400)
    expect(reply.body.error.code).toBe('weak-password')
    expect(reply.body.error.fields.password).toMatch(/\w/)
  })

  it('refuses a second account on the same address', async () => {
    const email = newEmail()
    expect((await register(new HttpSession(app.url), { email })).status).toBe(201)
    const again = await register(new HttpSession(app.url), { email })
    expect(again.status).toBe(409)
    expect(again.body.error.code).toBe('email-taken')
  })

  it('answers missing fields, wrong types and a bad role with 400 and field messages', async () => {
    const session = new HttpSession(app.url)
    const missing = await session.post('/api/auth/register', {})
    expect(missing.status).toBe(400)
    expect(Object.keys(missing.body.error.fields).sort()).toEqual(['displayName', 'email', 'password', 'role'])
    const wrongTypes = await session.post('/api/auth/register', { email: 42, password: ['x'], displayName: {}, role: 'admin' })
    expect(wrongTypes.status).toBe(400)
    expect(wrongTypes.body.error.fields.role).toBeTruthy()
    expect(wrongTypes.body.error.fields.email).toBeTruthy()
  })

  it('answers malformed JSON with 400 and an oversized body with 413, never 500', async () => {
    const session = new HttpSession(app.url)
    await session.fetchCsrf()
    const malformed = await session.request('POST', '/api/auth/register', undefined, {
      raw: '{"email": "a@b.test",',
      headers: { 'Content-Type': 'application/json' },
    })
    expect(malformed.status).toBe(400)
    expect(malformed.body.error.code).toBe('malformed-json')
    const huge = await session.request('POST', '/api/auth/register', undefined, {
      raw: JSON.stringify({ email: 'a@b.test', displayName: 'x'.repeat(2_000_000) }),
      headers: { 'Content-Type': 'application/json' },
    })
    expect(huge.status).toBe(413)
    expect(huge.body.error.code).toBe('body-too-large')
  })
})

describe('sign-in and sign-out', () => {
  it('signs in with the right pair, regenerating the session id', async () => {
    const email = newEmail()
    const first = new HttpSession(app.url)
    await register(first, { email })
    const session = new HttpSession(app.url)
    // A visitor has no session until there is something to keep; each sign-in starts a new one.
    await session.fetchCsrf()
    expect(session.cookies.get('cw.sid')).toBeUndefined()
    expect((await session.signIn(email, STRONG)).status).toBe(200)
    const before = session.cookies.get('cw.sid')
    expect(before).toBeTruthy()
    const reply = await session.signIn(email, STRONG)
    expect(reply.status).toBe(200)
    expect(reply.body.email).toBe(email)
    expect(session.cookies.get('cw.sid')).not.toBe(before)
  })

  it('answers a wrong password and an unknown address alike with 401', async () => {
    const email = newEmail()
    await register(new HttpSession(app.url), { email })
    const wrong = await new HttpSession(app.url).signIn(email, 'not-the-password-at-all')
    const unknown = await new HttpSession(app.url).signIn(newEmail(), STRONG)
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    expect(wrong.body).toEqual(unknown.body)
  })

  it('signs out with 204, after which /me is 401', async () => {
    const session = new HttpSession(app.url)
    await register(session)
    expect((await session.post('/api/auth/logout')).status).toBe(204)
    expect((await session.get('/api/auth/me')).status).toBe(401)
  })

  it('answers /me for a visitor with 401 in the error shape', async () => {
    const reply = await new HttpSession(app.url).get('/api/auth/me')
    expect(reply.status).toBe(401)
    expect(reply.body.error).toMatchObject({ code: 'not-signed-in', message: expect.any(String) })
  })
})

describe('CSRF protection', () => {
  it('refuses a change without the token, and with a wrong one, with 403', async () => {
    const session = new HttpSession(app.url)
    const without = await session.post('/api/auth/login', { email: 'a@b.test', password: 'x' }, { csrf: false })
    expect(without.status).toBe(403)
    expect(without.body.error.code).toBe('csrf-invalid')
    await session.fetchCsrf()
    const wrong = await session.post('/api/auth/login', { email: 'a@b.test', password: 'x' }, { headers: { 'X-CSRF-Token': 'forged' } })
    expect(wrong.status).toBe(403)
  })
})

describe('e-mail verification', () => {
  it('mails a single-use link that confirms the address', async () => {
    const session = new HttpSession(app.url)
    const email = newEmail()
    await register(session, { email })
    const mail = await waitForMail(app.mail!.webUrl, { to: email, subject: 'Confirm' })
    expect(mail.html).toContain('Confirm my address')
    const token = new URL(linkIn(mail, '/verify-email')).searchParams.get('token')!
    expect((await session.post('/api/auth/verify-email', { token })).status).toBe(204)
    expect((await session.get('/api/auth/me')).body.emailVerified).toBe(true)
    const reuse = await session.post('/api/auth/verify-email', { token })
    expect(reuse.status).toBe(400)
    expect(reuse.body.error.code).toBe('bad-token')
  })

  it('stores only a hash of the token', async () => {
    const session = new HttpSession(app.url)
    const email = newEmail()
    const reply = await register(session, { email })
    const mail = await waitForMail(app.mail!.webUrl, { to: email, subject: 'Confirm' })
    const token = new URL(linkIn(mail, '/verify-email')).searchParams.get('token')!
    const rows = await app.ctx.db.getRepository(AuthToken).find({ where: { userId: reply.body.id } })
    expect(rows.length).toBe(1)
    expect(rows[0].tokenHash).not.toContain(token)
    expect(JSON.stringify(rows[0])).not.toContain(token)
  })
})

describe('password reset', () => {
  it('answers 202 for known and unknown addresses alike, mailing only the known one', async () => {
    const email = newEmail()
    await register(new HttpSession(app.url), { email })
    const unknown = newEmail()
    const a = await new HttpSession(app.url).post('/api/auth/password-reset/request', { email })
    const b = await new HttpSession(app.url).post('/api/auth/password-reset/request', { email: unknown })
    expect(a.status).toBe(202)
    expect(b.status).toBe(202)
    expect(a.body).toEqual(b.body)
    const mails = await app.ctx.db.getRepository(OutboundMail).find({ where: { template: 'password-reset' } })
    expect(mails.some((m) => m.toAddress === email)).toBe(true)
    expect(mails.some((m) => m.toAddress === unknown)).toBe(false)
  })

  it('sets a new password through the mailed link; the old one stops working and the link is spent', async () => {
    const email = newEmail()
    await register(new HttpSession(app.url), { email })
    const requestedAt = new Date()
    await new HttpSession(app.url).post('/api/auth/password-reset/request', { email })
    const mail = await waitForMail(app.mail!.webUrl, { to: email, subject: 'new Conewright password', after: requestedAt })
    const token = new URL(linkIn(mail, '/reset-password')).searchParams.get('token')!
    const newPassword = 'saggar-of-sawdust-and-copper'
    const session = new HttpSession(app.url)
    expect((await session.post('/api/auth/password-reset/confirm', { token, password: newPassword })).status).toBe(204)
    expect((await new HttpSession(app.url).signIn(email, STRONG)).status).toBe(401)
    expect((await new HttpSession(app.url).signIn(email, newPassword)).status).toBe(200)
    const again = await session.post('/api/auth/password-reset/confirm', { token, password: 'another-long-passphrase-here' })
    expect(again.status).toBe(400)
  })

  it('refuses an expired link', async () => {
    const email = newEmail()
    await register(new HttpSession(app.url), { email })
    const requestedAt = new Date()
    await new HttpSession(app.url).post('/api/auth/password-reset/request', { email })
    const mail = await waitForMail(app.mail!.webUrl, { to: email, subject: 'new Conewright password', after: requestedAt })
    const token = new URL(linkIn(mail, '/reset-password')).searchParams.get('token')!
    await app.ctx.db.query(`UPDATE auth_tokens SET expires_at = now() - interval '1 minute' WHERE purpose = 'password-reset'`)
    const reply = await new HttpSession(app.url).post('/api/auth/password-reset/confirm', {
      token,
      password: 'kiln-sitter-and-a-long-soak',
    })
    expect(reply.status).toBe(400)
    expect(reply.body.error.code).toBe('bad-token')
  })
})
