import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { HttpSession } from '../support/http-client'
import { createPerson, PERSON_PASSWORD, type Person } from '../support/people'
import { publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let admin: Person
let host: Person
let studioId: string

beforeAll(async () => {
  app = await startTestApp({ worker: false })
  admin = await createPerson(app, 'admin', 'Desk Admin')
  host = await createPerson(app, 'host', 'Unverified Host')
  studioId = (await publishedStudio(host.session, 'Needs A Look')).studioId
}, 60_000)
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
    expect(list[0]).toMatchObject({ id: studioId, published: true, verified: false, owners: [{ name: 'Unverified Host', email: host.email }] })
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
