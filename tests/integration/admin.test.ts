import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { HttpSession } from '../support/http-client'
import { createPerson, PERSON_PASSWORD, type Person } from '../support/people'
import { publishedStudio } from '../support/studio-fixtures'
import { draftAndSend, mug } from '../support/request-fixtures'
import { OutboundMail } from '../../server/entities/OutboundMail'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let admin: Person
let host: Person
let studioId: string
let firingId: string

beforeAll(async () => {
  app = await startTestApp({ worker: false })
  admin = await createPerson(app, 'admin', 'Desk Admin')
  host = await createPerson(app, 'host', 'Unverified Host')
  const ids = await publishedStudio(host.session, 'Needs A Look')
  studioId = ids.studioId
  firingId = ids.firingId
})
afterAll(async () => {
  await app?.close()
})

describe('the front desk', () => {
  it('is for admins only', async () => {
    expect((await host.session.get('/api/admin/studios')).status).toBe(403)
    expect((await new HttpSession(app.url).get('/api/admin/users')).status).toBe(401)
  })

  it('lists published studios waiting for verification first, and verifies them', async () => {
    const list = (await admin.session.get('/api/admin/studios')).body.studios
    expect(list[0]).toMatchObject({
      id: studioId,
      published: true,
      verified: false,
      owners: [{ name: 'Unverified Host', email: host.email }],
    })
    expect((await admin.session.post(`/api/studios/${studioId}/verify`, { verified: true })).body.verified).toBe(true)
    expect((await new HttpSession(app.url).get(`/api/studios/${studioId}`)).body.verified).toBe(true)
  })

  it('suspends an account, ending its sessions and refusing sign-in, and restores it', async () => {
    const target = await createPerson(app, 'potter', 'Spammy Sam')
    expect((await target.session.get('/api/auth/me')).status).toBe(200)
    const found = (await admin.session.get(`/api/admin/users?q=${encodeURIComponent('Spammy')}`)).body.users
    expect(found.map((u: { id: string }) => u.id)).toEqual([target.id])
    expect((await admin.session.post(`/api/admin/users/${target.id}/suspend`, { suspended: true })).status).toBe(200)
    expect((await target.session.get('/api/auth/me')).status).toBe(401)
    const again = await new HttpSession(app.url).signIn(target.email, PERSON_PASSWORD)
    expect(again.status).toBe(403)
    expect(again.body.error.code).toBe('suspended')
    await admin.session.post(`/api/admin/users/${target.id}/suspend`, { suspended: false })
    expect((await new HttpSession(app.url).signIn(target.email, PERSON_PASSWORD)).status).toBe(200)
  })

  it('does not let an admin suspend their own account', async () => {
    expect((await admin.session.post(`/api/admin/users/${admin.id}/suspend`, { suspended: true })).status).toBe(400)
  })
})

describe('disputes', () => {
  it('lets either side raise one once the ware is fired, and the desk refund up to what was paid', async () => {
    const potter = await createPerson(app, 'potter', 'Unhappy Una')
    const sent = await draftAndSend(potter.session, firingId, [mug()])
    // Not yet fired: no dispute.
    expect((await potter.session.post(`/api/requests/${sent.id}/dispute`, { reason: 'Too early to say' })).status).toBe(409)
    // The way to "fired" is walked elsewhere (pickup tests); here the record is set there directly, with a
    // deposit taken at the counter.
    await app.ctx.db.query(`UPDATE firing_requests SET state = 'fired' WHERE id = $1`, [sent.id])
    await app.ctx.db.query(
      `INSERT INTO ledger_entries (request_id, direction, kind, amount_cents, currency, note) VALUES ($1, 'in', 'counter', 500, 'USD', 'Deposit at the counter')`,
      [sent.id],
    )
    const disputed = await potter.session.post(`/api/requests/${sent.id}/dispute`, { reason: 'Two mugs came back stuck to the shelf' })
    expect(disputed.body.state).toBe('disputed')
    const mails = await app.ctx.db.getRepository(OutboundMail).findBy({ template: 'disputed', toAddress: host.email })
    expect(mails.some((m) => m.bodyText.includes('stuck to the shelf'))).toBe(true)
    const list = (await admin.session.get('/api/admin/disputes')).body.requests
    expect(list.map((r: { id: string }) => r.id)).toContain(sent.id)
    const tooMuch = await admin.session.post(`/api/admin/requests/${sent.id}/refund`, { amountCents: 501, reason: 'Goodwill' })
    expect(tooMuch.status).toBe(400)
    expect(
      (await admin.session.post(`/api/admin/requests/${sent.id}/refund`, { amountCents: 250, reason: 'Half for the stuck mugs' })).status,
    ).toBe(202)
    const timeline = (await admin.session.get(`/api/requests/${sent.id}`)).body.timeline
    expect(timeline.at(-1).reason).toMatch(/Refund of 250 cents by the desk/)
    expect((await host.session.post(`/api/admin/requests/${sent.id}/refund`, { amountCents: 1, reason: 'Me' })).status).toBe(403)
  })
})
