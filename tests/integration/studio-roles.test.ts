// Who may change what in a studio: every write route, tried by the owner, a crew member, another
// host, a potter and a visitor. The owner may do everything; crew run firings but not prices, kiln
// limits, policies or members; outsiders get nothing (403 on a published studio they can see).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { StudioMember } from '../../server/entities/StudioMember'
import { HttpSession } from '../support/http-client'
import { createPerson, type Person } from '../support/people'
import { electricKiln, firingBody, publishedStudio, volumePriceList } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

type Role = 'owner' | 'crew' | 'otherHost' | 'potter' | 'anonymous' | 'admin'
const ROLES: Role[] = ['owner', 'crew', 'otherHost', 'potter', 'anonymous']

let app: TestApp
let people: Record<Exclude<Role, 'anonymous'>, Person>
let ids: { studioId: string; kilnId: string; firingId: string }

const session = (role: Role) => (role === 'anonymous' ? new HttpSession(app.url) : people[role].session)

beforeAll(async () => {
  app = await startTestApp({ worker: false })
  people = {
    owner: await createPerson(app, 'host', 'Owner Olsen'),
    crew: await createPerson(app, 'crew', 'Crew Castro'),
    otherHost: await createPerson(app, 'host', 'Other Host'),
    potter: await createPerson(app, 'potter', 'Potter Pham'),
    admin: await createPerson(app, 'admin', 'Desk Admin'),
  }
  ids = await publishedStudio(people.owner.session)
  await app.ctx.db.getRepository(StudioMember).save({ studioId: ids.studioId, userId: people.crew.id, role: 'crew' })
})

afterAll(async () => {
  await app?.close()
})

async function freshFiring() {
  const reply = await people.owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody())
  return reply.body.firings[0].id as string
}

async function freshCrewMember() {
  const extra = await createPerson(app, 'crew')
  const member = await app.ctx.db.getRepository(StudioMember).save({ studioId: ids.studioId, userId: extra.id, role: 'crew' })
  return member.id
}

async function freshInvite() {
  const email = `invitee.${Math.random().toString(36).slice(2)}@example.test`
  await people.owner.session.post(`/api/studios/${ids.studioId}/invites`, { email })
  const [row] = await app.ctx.db.query(`SELECT id FROM auth_tokens WHERE purpose = 'crew-invite' AND data->>'email' = $1`, [email])
  return row.id as string
}

interface WriteRoute {
  name: string
  method: 'POST' | 'PATCH' | 'PUT' | 'DELETE'
  path: () => Promise<string> | string
  body?: unknown
  expect: Record<Role, number>
}

const refused = { otherHost: 403, potter: 403, anonymous: 401 } as const

const ROUTES: WriteRoute[] = [
  {
    name: 'create a studio',
    method: 'POST',
    path: () => '/api/studios',
    body: { name: 'Another Studio', postalCode: '97214' },
    expect: { owner: 201, crew: 403, otherHost: 201, potter: 403, anonymous: 401, admin: 201 },
  },
  {
    name: 'edit the studio and its policies',
    method: 'PATCH',
    path: () => `/api/studios/${ids.studioId}`,
    body: { description: 'Now with two kilns.' },
    expect: { owner: 200, crew: 403, ...refused, admin: 200 },
  },
  // The owner may ask, but a studio with firing history is unpublished rather than deleted.
  {
    name: 'delete the studio',
    method: 'DELETE',
    path: () => `/api/studios/${ids.studioId}`,
    expect: { owner: 409, crew: 403, ...refused, admin: 409 },
  },
  {
    name: 'add a kiln',
    method: 'POST',
    path: () => `/api/studios/${ids.studioId}/kilns`,
    body: electricKiln,
    expect: { owner: 201, crew: 403, ...refused, admin: 201 },
  },
  {
    name: 'change a kiln’s limits',
    method: 'PATCH',
    path: () => `/api/kilns/${ids.kilnId}`,
    body: { maxCone: '8' },
    expect: { owner: 200, crew: 403, ...refused, admin: 200 },
  },
  {
    name: 'remove a kiln with firings coming',
    method: 'DELETE',
    path: () => `/api/kilns/${ids.kilnId}`,
    expect: { owner: 409, crew: 403, ...refused, admin: 409 },
  },
  {
    name: 'set the price list',
    method: 'PUT',
    path: () => `/api/kilns/${ids.kilnId}/price-list`,
    body: volumePriceList,
    expect: { owner: 200, crew: 403, ...refused, admin: 200 },
  },
  {
    name: 'post a firing',
    method: 'POST',
    path: () => `/api/kilns/${ids.kilnId}/firings`,
    body: firingBody(),
    expect: { owner: 201, crew: 201, ...refused, admin: 201 },
  },
  {
    name: 'change a firing’s layers on sale',
    method: 'PATCH',
    path: async () => `/api/firings/${await freshFiring()}`,
    body: { layersOnSale: 2 },
    expect: { owner: 200, crew: 200, ...refused, admin: 200 },
  },
  {
    name: 'move a firing’s stage',
    method: 'POST',
    path: async () => `/api/firings/${await freshFiring()}/stage`,
    body: { status: 'closed', confirm: true },
    expect: { owner: 200, crew: 200, ...refused, admin: 200 },
  },
  {
    name: 'undo a firing’s last stage move',
    method: 'POST',
    path: async () => {
      const firingId = await freshFiring()
      await session('owner').post(`/api/firings/${firingId}/stage`, { status: 'closed', confirm: true })
      return `/api/firings/${firingId}/undo`
    },
    expect: { owner: 200, crew: 200, ...refused, admin: 200 },
  },
  {
    name: 'cancel a firing',
    method: 'POST',
    path: async () => `/api/firings/${await freshFiring()}/cancel`,
    body: { reason: 'Element burned out' },
    expect: { owner: 200, crew: 200, ...refused, admin: 200 },
  },
  {
    name: 'invite crew',
    method: 'POST',
    path: () => `/api/studios/${ids.studioId}/invites`,
    body: { email: 'new.hand@example.test' },
    expect: { owner: 202, crew: 403, ...refused, admin: 202 },
  },
  {
    name: 'remove a crew member',
    method: 'DELETE',
    path: async () => `/api/studios/${ids.studioId}/crew/${await freshCrewMember()}`,
    expect: { owner: 204, crew: 403, ...refused, admin: 204 },
  },
  {
    name: 'withdraw an invitation',
    method: 'DELETE',
    path: async () => `/api/studios/${ids.studioId}/invites/${await freshInvite()}`,
    expect: { owner: 204, crew: 403, ...refused, admin: 204 },
  },
  {
    name: 'verify a studio',
    method: 'POST',
    path: () => `/api/studios/${ids.studioId}/verify`,
    body: { verified: true },
    expect: { owner: 403, crew: 403, otherHost: 403, potter: 403, anonymous: 401, admin: 200 },
  },
]

describe.each(ROUTES)('$method to $name', (route) => {
  it.each([...ROLES, 'admin' as Role])('as %s', async (role) => {
    // Firing routes act on a fresh firing so one role's change does not decide the next one's answer.
    const path = await route.path()
    const reply = await session(role).request(route.method, path, route.body)
    expect(reply.status, JSON.stringify(reply.body)).toBe(route.expect[role])
    if (reply.status >= 400) expect(reply.body.error).toMatchObject({ code: expect.any(String), message: expect.any(String) })
  })
})

describe('a draft studio', () => {
  it('is invisible to everyone but its own people, and refuses writes from outside with 404', async () => {
    const draft = await people.owner.session.post('/api/studios', { name: 'Hidden Draft', postalCode: '97214' })
    const id = draft.body.id
    expect((await people.owner.session.get(`/api/studios/${id}`)).status).toBe(200)
    for (const role of ['otherHost', 'potter', 'anonymous'] as Role[]) {
      expect((await session(role).get(`/api/studios/${id}`)).status).toBe(404)
      expect((await session(role).get(`/api/studios/${id}/kilns`)).status).toBe(404)
    }
    expect((await people.otherHost.session.patch(`/api/studios/${id}`, { name: 'Mine now' })).status).toBe(404)
  })
})

describe('what the public sees', () => {
  it('shows a published studio without its street address, and the address to its people', async () => {
    const publicView = await new HttpSession(app.url).get(`/api/studios/${ids.studioId}`)
    expect(publicView.status).toBe(200)
    expect(publicView.body).toMatchObject({ id: ids.studioId, published: true, lat: expect.any(Number), lng: expect.any(Number) })
    expect(publicView.body).not.toHaveProperty('address')
    expect(publicView.body).not.toHaveProperty('myRole')
    const ownerView = await people.owner.session.get(`/api/studios/${ids.studioId}`)
    expect(ownerView.body.myRole).toBe('owner')
    expect(ownerView.body).toHaveProperty('address')
  })

  it('lists published studios for everyone and the caller’s own with ?mine=true', async () => {
    const list = await new HttpSession(app.url).get('/api/studios')
    expect(list.body.studios.map((s: { id: string }) => s.id)).toContain(ids.studioId)
    const mine = await people.crew.session.get('/api/studios?mine=true')
    expect(mine.body.studios).toEqual([expect.objectContaining({ id: ids.studioId, myRole: 'crew' })])
  })
})
