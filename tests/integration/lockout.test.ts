// Lockout throttles the guessing, not the owner: wrong passwords count per account and address, an
// address is slowed before it is paused, and when guesses come from many addresses the owner gets in
// through a one-time link mailed to the account's own address. Addresses are set with
// X-Forwarded-For, which the app trusts from loopback (TRUST_PROXY), as behind a load balancer.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { slowdownMs } from '../../server/auth/sign-in-guard'
import { HttpSession } from '../support/http-client'
import { linkIn, waitForMail } from '../support/mailbox'
import { createPerson, PERSON_PASSWORD, type Person } from '../support/people'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let owner: Person

beforeAll(async () => {
  app = await startTestApp({
    mail: true,
    config: { rateLimits: { authPerIpPer15Min: 1000, authPerAccountPer15Min: 5, authAccountWidePer15Min: 12 } },
  })
  owner = await createPerson(app, 'potter', 'Guarded Potter')
})
afterAll(async () => {
  await app?.close()
})

const from = (address: string) => ({ headers: { 'X-Forwarded-For': address } })
const attempt = (email: string, password: string, address: string) =>
  new HttpSession(app.url).post('/api/auth/login', { email, password }, from(address))

describe('wrong passwords from one address', () => {
  it('pause that address after the limit, while the owner signs in from another', async () => {
    const statuses: number[] = []
    for (let i = 0; i < 6; i++) statuses.push((await attempt(owner.email, `wrong-guess-${i}`, '203.0.113.5')).status)
    expect(statuses).toEqual([401, 401, 401, 401, 401, 429])
    const paused = await attempt(owner.email, PERSON_PASSWORD, '203.0.113.5')
    expect(paused.status).toBe(429)
    expect(paused.body.error.code).toBe('sign-in-paused')
    expect(Number(paused.headers.get('retry-after'))).toBeGreaterThan(0)
    // The owner, elsewhere, is not the one locked out.
    expect((await attempt(owner.email, PERSON_PASSWORD, '198.51.100.7')).status).toBe(200)
  })

  it('slow that address down before the pause', async () => {
    const other = await createPerson(app, 'potter', 'Slowed Potter')
    for (let i = 0; i < 3; i++) await attempt(other.email, `wrong-${i}`, '203.0.113.9')
    const started = Date.now()
    expect((await attempt(other.email, 'wrong-again', '203.0.113.9')).status).toBe(401)
    // A lower bound only: the wait cannot be skipped, however fast or slow the machine.
    expect(Date.now() - started).toBeGreaterThanOrEqual(slowdownMs(3, 5))
    // The right password from that address still works before the pause, and starts its count afresh.
    const pairCount = async () =>
      (await app.ctx.db.query(`SELECT hits FROM rate_limit_counters WHERE key = $1`, [`sign-in:pair:${other.email}|203.0.113.9`]))[0]
        ?.hits ?? 0
    expect(await pairCount()).toBe(4)
    expect((await attempt(other.email, PERSON_PASSWORD, '203.0.113.9')).status).toBe(200)
    expect(await pairCount()).toBe(0)
  })
})

describe('guesses spread over many addresses', () => {
  it('pause password sign-in for the account; a mailed one-time link lets the owner in', async () => {
    const target = await createPerson(app, 'potter', 'Targeted Potter')
    for (let i = 0; i < 12; i++) expect((await attempt(target.email, `spray-${i}`, `192.0.2.${i + 1}`)).status).toBe(401)
    const refused = await attempt(target.email, PERSON_PASSWORD, '198.51.100.20')
    expect(refused.status).toBe(429)
    expect(refused.body.error).toMatchObject({ code: 'account-protected', signInLink: true })

    const browser = new HttpSession(app.url)
    const asked = new Date()
    expect((await browser.post('/api/auth/sign-in-link', { email: target.email }, from('198.51.100.20'))).status).toBe(202)
    const mail = await waitForMail(app.mail!.webUrl, { to: target.email, subject: 'sign-in link', after: asked })
    const link = new URL(linkIn(mail, '/sign-in?link='))
    const signedIn = await browser.post('/api/auth/sign-in-link/confirm', { token: link.searchParams.get('link') }, from('198.51.100.20'))
    expect(signedIn.status).toBe(200)
    expect(signedIn.body.email).toBe(target.email)
    expect((await browser.get('/api/auth/me')).body.email).toBe(target.email)
    // The link works once.
    const again = await new HttpSession(app.url).post('/api/auth/sign-in-link/confirm', { token: link.searchParams.get('link') })
    expect(again.status).toBe(400)
  })

  it('answers a link request for an unknown address as for a known one, and mails nothing', async () => {
    const reply = await new HttpSession(app.url).post('/api/auth/sign-in-link', { email: 'nobody.here@example.test' })
    expect(reply.status).toBe(202)
    expect(await app.ctx.db.query(`SELECT 1 FROM outbound_mail WHERE to_address = 'nobody.here@example.test'`)).toEqual([])
  })
})
