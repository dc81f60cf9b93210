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

describe('the desk pages, searches and filters its long lists on the server', () => {
  const paging: { studioId: string; owner: Person }[] = []
  let draftId: string

  beforeAll(async () => {
    for (let n = 1; n <= 6; n++) {
      const owner = await createPerson(app, 'host', `Paging Owner ${n}`)
      paging.push({ studioId: (await publishedStudio(owner.session, `Paging Studio ${n}`)).studioId, owner })
    }
    const drafter = await createPerson(app, 'host', 'Drafting Dora')
    draftId = (await drafter.session.post('/api/studios', { name: 'Paging Draft', postalCode: '97214' })).body.id
  }, 120_000)

  it('pages studios by name in either order, counting every match', async () => {
    const first = (await admin.session.get('/api/admin/studios?q=Paging%20Studio&sort=name&perPage=5&page=1')).body
    const second = (await admin.session.get('/api/admin/studios?q=Paging%20Studio&sort=name&perPage=5&page=2')).body
    expect(first).toMatchObject({ total: 6, page: 1, perPage: 5 })
    expect(first.studios.map((s: { name: string }) => s.name)).toEqual([1, 2, 3, 4, 5].map((n) => `Paging Studio ${n}`))
    expect(second.studios.map((s: { name: string }) => s.name)).toEqual(['Paging Studio 6'])
    const reversed = (await admin.session.get('/api/admin/studios?q=Paging%20Studio&sort=-name&perPage=5')).body.studios
    expect(reversed[0].name).toBe('Paging Studio 6')
  })

  it("finds a studio by its owner's name, and keeps drafts apart", async () => {
    const byOwner = (await admin.session.get(`/api/admin/studios?q=${encodeURIComponent('Paging Owner 3')}`)).body
    expect(byOwner.studios.map((s: { id: string }) => s.id)).toEqual([paging[2].studioId])
    const drafts = (await admin.session.get('/api/admin/studios?q=Paging&state=draft')).body.studios
    expect(drafts.map((s: { id: string }) => s.id)).toEqual([draftId])
    const waiting = (await admin.session.get('/api/admin/studios?q=Paging&state=waiting&perPage=100')).body.studios
    expect(waiting.map((s: { id: string }) => s.id).sort()).toEqual(paging.map((p) => p.studioId).sort())
  })

  it('matches the pattern characters people type as themselves', async () => {
    // "%" and "_" would match anything in ILIKE; no studio or owner here has either in its name.
    expect((await admin.session.get('/api/admin/studios?q=%25')).body.total).toBe(0)
    expect((await admin.session.get('/api/admin/users?q=_')).body.total).toBe(0)
  })

  it('refuses options it does not know with a 400 naming the field', async () => {
    for (const [query, field] of [
      ['perPage=1000', 'perPage'],
      ['page=0', 'page'],
      ['sort=name%3Bdrop', 'sort'],
      ['state=everything', 'state'],
    ]) {
      const reply = await admin.session.get(`/api/admin/studios?${query}`)
      expect(reply.status, query).toBe(400)
      expect(reply.body.error.code).toBe('invalid-query')
      expect(Object.keys(reply.body.error.fields)).toContain(field)
    }
    const role = await admin.session.get('/api/admin/users?role=wizard')
    expect(role.status).toBe(400)
    expect(Object.keys(role.body.error.fields)).toContain('role')
  })

  it("marks the reader's own account, and filters accounts by kind and state", async () => {
    const admins = (await admin.session.get('/api/admin/users?role=admin')).body
    expect(admins.users.map((u: { id: string; self: boolean }) => [u.id, u.self])).toEqual([[admin.id, true]])
    const hosts = (await admin.session.get('/api/admin/users?role=host&q=Paging%20Owner&perPage=5')).body
    expect(hosts.total).toBe(6)
    expect(hosts.users).toHaveLength(5)
    expect(hosts.users.every((u: { self: boolean; role: string }) => !u.self && u.role === 'host')).toBe(true)
    const target = paging[0].owner
    await admin.session.post(`/api/admin/users/${target.id}/suspend`, { suspended: true })
    const suspended = (await admin.session.get('/api/admin/users?state=suspended&q=Paging')).body.users
    expect(suspended.map((u: { id: string }) => u.id)).toEqual([target.id])
    const active = (await admin.session.get('/api/admin/users?state=active&q=Paging&perPage=100')).body.users
    expect(active.map((u: { id: string }) => u.id)).not.toContain(target.id)
    await admin.session.post(`/api/admin/users/${target.id}/suspend`, { suspended: false })
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
    expect(list.find((r: { id: string }) => r.id === sent.id).dispute).toMatchObject({
      reason: 'Two mugs came back stuck to the shelf',
      raisedBy: 'potter',
      raisedByName: 'Unhappy Una',
    })
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
