// Mail a user can cause to an outside address is limited per sender and per recipient: forty crew
// invitations to one address once sent forty mails.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { MAIL_LIMITS } from '../../server/services/mail-limits'
import { HttpSession } from '../support/http-client'
import { createPerson, type Person } from '../support/people'
import { publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let owner: Person
let studioId: string

beforeAll(async () => {
  app = await startTestApp({ worker: false, config: { rateLimits: { authPerIpPer15Min: 1000 } } })
  owner = await createPerson(app, 'host', 'Inviting Owner')
  studioId = (await publishedStudio(owner.session, 'Invitation Pottery')).studioId
})
afterAll(async () => {
  await app?.close()
})

const mailsTo = async (address: string) =>
  Number((await app.ctx.db.query(`SELECT count(*) AS n FROM outbound_mail WHERE to_address = $1`, [address]))[0].n)

describe('crew invitations', () => {
  it('send one address at most its allowance, however often it is invited', async () => {
    const statuses: number[] = []
    for (let i = 0; i < 40; i++)
      statuses.push((await owner.session.post(`/api/studios/${studioId}/invites`, { email: 'target@example.test' })).status)
    const allowed = MAIL_LIMITS['crew-invite'].perRecipient.limit
    expect(statuses.filter((s) => s === 202)).toHaveLength(allowed)
    expect(statuses.slice(allowed).every((s) => s === 429)).toBe(true)
    expect(await mailsTo('target@example.test')).toBe(allowed)
    const refused = await owner.session.post(`/api/studios/${studioId}/invites`, { email: 'target@example.test' })
    expect(refused.body.error.code).toBe('mail-limit')
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0)
  })

  it('let one sender invite only so many addresses an hour', async () => {
    const { limit } = MAIL_LIMITS['crew-invite'].perSender
    const statuses: number[] = []
    for (let i = 0; i < limit + 5; i++)
      statuses.push((await owner.session.post(`/api/studios/${studioId}/invites`, { email: `crew.${i}@example.test` })).status)
    // The three to target@ above count against this sender too.
    expect(statuses.filter((s) => s === 202).length).toBe(limit - MAIL_LIMITS['crew-invite'].perRecipient.limit)
    expect(statuses.at(-1)).toBe(429)
  })
})

describe('password resets', () => {
  it('mail one address at most its allowance, and say the same for unknown addresses', async () => {
    const { limit } = MAIL_LIMITS['password-reset'].perRecipient
    const ask = (email: string) => new HttpSession(app.url).post('/api/auth/password-reset/request', { email })
    const known = []
    for (let i = 0; i < limit + 2; i++) known.push((await ask(owner.email)).status)
    const unknown = []
    for (let i = 0; i < limit + 2; i++) unknown.push((await ask('no.account@example.test')).status)
    expect(known).toEqual(unknown)
    expect(known.slice(0, limit).every((s) => s === 202)).toBe(true)
    expect(known.at(-1)).toBe(429)
    expect(await mailsTo(owner.email)).toBe(limit)
  })
})
