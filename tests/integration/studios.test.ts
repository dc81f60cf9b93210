import ICAL from 'ical.js'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { FiringRequest } from '../../server/entities/FiringRequest'
import { OutboundMail } from '../../server/entities/OutboundMail'
import { StudioMember } from '../../server/entities/StudioMember'
import { HttpSession } from '../support/http-client'
import { createPerson, type Person } from '../support/people'
import { electricKiln, firingBody, publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let owner: Person
let potter: Person
let ids: { studioId: string; kilnId: string; firingId: string }

beforeAll(async () => {
  app = await startTestApp({ worker: false })
  owner = await createPerson(app, 'host', 'Rosa Lindqvist')
  potter = await createPerson(app, 'potter', 'Sam Okoro')
  ids = await publishedStudio(owner.session, 'Lindqvist Kilnworks')
})

afterAll(async () => {
  await app?.close()
})

describe('creating a studio from a postcode', () => {
  it('places a draft studio on the map from {name, postalCode} alone', async () => {
    const reply = await owner.session.post('/api/studios', { name: 'Postcode Pottery', postalCode: '97214' })
    expect(reply.status).toBe(201)
    // ZIP 97214 (Portland, Oregon) lies near 45.51 N, 122.64 W: US Census ZCTA gazetteer, from memory.
    expect(reply.body.lat).toBeCloseTo(45.51, 1)
    expect(reply.body.lng).toBeCloseTo(-122.64, 1)
    expect(reply.body).toMatchObject({ published: false, timezone: 'America/Los_Angeles', city: 'Portland', region: 'OR', myRole: 'owner' })
  })

  it('also takes {name, address}', async () => {
    const reply = await owner.session.post('/api/studios', { name: 'Address Pottery', address: '10815 SE Main St, Milwaukie, OR 97222' })
    expect(reply.status).toBe(201)
    expect(reply.body.address).toBe('10815 SE Main St, Milwaukie, OR 97222')
  })

  it('answers an unknown postcode with 400 on the field', async () => {
    const reply = await owner.session.post('/api/studios', { name: 'Nowhere Pottery', postalCode: '00000' })
    expect(reply.status).toBe(400)
    expect(reply.body.error.fields.postalCode).toMatch(/postal code/i)
  })

  it('moves the pin when the host drags it, and sets the zone from the new place', async () => {
    const created = await owner.session.post('/api/studios', { name: 'Pin Pottery', postalCode: '97214' })
    // A point in Boise, Idaho (about 43.6 N, 116.2 W), which keeps Mountain time.
    const moved = await owner.session.patch(`/api/studios/${created.body.id}`, { lat: 43.615, lng: -116.2023 })
    expect(moved.status).toBe(200)
    expect(moved.body).toMatchObject({ lat: 43.615, lng: -116.2023, timezone: 'America/Boise' })
  })
})

describe('bad input gets 400 with field messages', () => {
  const kilnWith = (change: Record<string, unknown>) => ({ ...electricKiln, ...change })

  it.each([
    ['a reversed cone range', kilnWith({ minCone: '10', maxCone: '04' }), 'maxCone'],
    ['a negative size', kilnWith({ interior: { shape: 'round', diameterMm: -5, heightMm: 600 } }), 'interior.diameterMm'],
    ['an unknown cone', kilnWith({ maxCone: 'cone 99' }), 'maxCone'],
    ['a missing atmosphere', kilnWith({ atmospheres: [] }), 'atmospheres'],
  ])('a kiln with %s', async (_what, body, field) => {
    const reply = await owner.session.post(`/api/studios/${ids.studioId}/kilns`, body)
    expect(reply.status).toBe(400)
    expect(reply.body.error.fields[field]).toBeTruthy()
  })

  it('a kiln change that would reverse the stored range', async () => {
    const reply = await owner.session.patch(`/api/kilns/${ids.kilnId}`, { minCone: '11' })
    expect(reply.status).toBe(400)
    expect(reply.body.error.fields.maxCone).toMatch(/coolest cone/)
  })

  it.each([
    ['drop-off after the firing date', firingBody({ dropOffBy: new Date(Date.now() + 9 * 86400_000).toISOString() }), 'dropOffBy'],
    ['an unknown cone', firingBody({ cone: '15' }), 'cone'],
    ['a cone the kiln cannot reach', firingBody({ cone: '12' }), 'cone'],
    ['an atmosphere the kiln lacks', firingBody({ atmosphere: 'reduction' }), 'atmosphere'],
    ['no layers on sale', firingBody({ layersOnSale: 0 }), 'layersOnSale'],
    ['more layers than the kiln’s shelves make', firingBody({ layersOnSale: 40 }), 'layersOnSale'],
  ])('a firing with %s', async (_what, body, field) => {
    const reply = await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, body)
    expect(reply.status).toBe(400)
    expect(reply.body.error.fields[field]).toBeTruthy()
  })

  it('a price list with no price for its model', async () => {
    const reply = await owner.session.put(`/api/kilns/${ids.kilnId}/price-list`, {
      currency: 'USD',
      model: 'shelf',
      deposit: { percent: 20 },
    })
    expect(reply.status).toBe(400)
    expect(reply.body.error.fields.shelfCents).toBeTruthy()
  })
})

describe('pricing by the layer', () => {
  it('keeps a per-layer price list and gives it back as written', async () => {
    const before = await owner.session.get(`/api/kilns/${ids.kilnId}/price-list`)
    const layer = { currency: 'USD', model: 'layer', layerCents: 4000, deposit: { percent: 20 } }
    const put = await owner.session.put(`/api/kilns/${ids.kilnId}/price-list`, layer)
    expect(put.status).toBe(200)
    const read = await owner.session.get(`/api/kilns/${ids.kilnId}/price-list`)
    expect(read.body.priceList).toMatchObject({ model: 'layer', layerCents: 4000 })
    // The later tests quote against the kiln's first price list.
    if (before.status === 200)
      expect((await owner.session.put(`/api/kilns/${ids.kilnId}/price-list`, before.body.priceList)).status).toBe(200)
  })
})

describe('the database refuses what must never hold', () => {
  it.each([
    ['a reversed cone range', `UPDATE kilns SET min_cone = '10', max_cone = '04' WHERE id = $1`],
    ['a cone that does not exist', `UPDATE kilns SET max_cone = '99' WHERE id = $1`],
    ['a negative height', `UPDATE kilns SET height_mm = -1 WHERE id = $1`],
  ])('on kilns: %s', async (_what, sql) => {
    await expect(app.ctx.db.query(sql, [ids.kilnId])).rejects.toThrow(/violates check constraint/)
  })

  it.each([
    ['no layers on sale', `UPDATE firings SET layers_on_sale = 0 WHERE id = $1`],
    ['drop-off after the firing', `UPDATE firings SET drop_off_by = firing_date + interval '1 day' WHERE id = $1`],
  ])('on firings: %s', async (_what, sql) => {
    await expect(app.ctx.db.query(sql, [ids.firingId])).rejects.toThrow(/violates check constraint/)
  })
})

describe('space left in a firing', () => {
  // A 500 mm platter on the test kiln's 660 mm round shelves: no second one fits beside it, so each
  // takes a layer of its own.
  const platter = { label: 'Platter', quantity: 1, heightMm: 60, widthMm: 500, depthMm: 500, round: true }
  async function addRequest(firingId: string, state: FiringRequest['state']) {
    return app.ctx.db.getRepository(FiringRequest).save({
      firingId,
      potterId: potter.id,
      state,
      pieces: [platter],
      volumeL: 12,
      verdict: 'ok',
      findings: [],
      acknowledgedWarnings: [],
      quote: null,
    })
  }

  it('is what the load plan still takes: ware taken on has its place; sent, declined and withdrawn hold none', async () => {
    const firing = (await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody())).body.firings[0]
    const before = (await new HttpSession(app.url).get(`/api/firings/${firing.id}`)).body.space
    const held = [await addRequest(firing.id, 'accepted'), await addRequest(firing.id, 'deposit_paid')]
    for (const state of ['sent', 'declined', 'withdrawn'] as const) await addRequest(firing.id, state)
    const after = (await new HttpSession(app.url).get(`/api/firings/${firing.id}`)).body.space
    expect(before).toMatchObject({ shelvesTaken: 0, layersUsed: 0 })
    expect(after.layersUsed).toBe(2)
    expect(after.shelvesTaken).toBeGreaterThan(0)
    expect(after.shelvesTotal).toBe(before.shelvesTotal)
    const plan = (await owner.session.get(`/api/firings/${firing.id}/load-plan`)).body
    const placed = plan.layers.flatMap((l: { shelves: { pieces: { requestId: string }[] }[] }) => l.shelves.flatMap((s) => s.pieces))
    expect(placed.map((p: { requestId: string }) => p.requestId).sort()).toEqual(held.map((r) => r.id).sort())
    expect(plan.unplaced).toEqual([])
  })

  it('cannot be offered in fewer layers than the ware taken on already fills', async () => {
    const firing = (await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody())).body.firings[0]
    await addRequest(firing.id, 'accepted')
    await addRequest(firing.id, 'accepted')
    const reply = await owner.session.patch(`/api/firings/${firing.id}`, { layersOnSale: 1 })
    expect(reply.status).toBe(409)
    expect(reply.body.error.code).toBe('layers-below-held')
    expect((await owner.session.patch(`/api/firings/${firing.id}`, { layersOnSale: 2 })).status).toBe(200)
  })
})

describe('repeating a firing', () => {
  it('makes a series at the same local hour every N weeks, across a daylight-saving change', async () => {
    // 9 am Friday 5 March 2027 in Portland, every 2 weeks, 3 times: the clocks go forward on
    // 14 March 2027 (US rule: second Sunday in March), so the UTC hour changes but the local one must not.
    const body = firingBody({
      dropOffBy: '2027-03-03T18:00:00-08:00',
      firingDate: '2027-03-05T09:00:00-08:00',
      readyBy: '2027-03-08T12:00:00-08:00',
      repeat: { everyWeeks: 2, times: 3 },
    })
    const reply = await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, body)
    expect(reply.status).toBe(201)
    const firings = reply.body.firings as { firingDate: string; seriesId: string }[]
    expect(firings).toHaveLength(3)
    expect(new Set(firings.map((f) => f.seriesId)).size).toBe(1)
    const local = firings.map((f) =>
      new Intl.DateTimeFormat('en-US', {
        timeZone: 'America/Los_Angeles',
        weekday: 'short',
        month: 'numeric',
        day: 'numeric',
        hour: 'numeric',
      }).format(new Date(f.firingDate)),
    )
    expect(local).toEqual(['Fri, 3/5, 9 AM', 'Fri, 3/19, 9 AM', 'Fri, 4/2, 9 AM'])
    expect(firings.map((f) => f.firingDate)).toEqual(['2027-03-05T17:00:00.000Z', '2027-03-19T16:00:00.000Z', '2027-04-02T16:00:00.000Z'])
  })
})

describe('firing status', () => {
  it('moves only along the allowed path; a forbidden move is a 409 naming the allowed ones', async () => {
    const firing = (await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody())).body.firings[0]
    const jump = await owner.session.post(`/api/firings/${firing.id}/stage`, { status: 'cooling' })
    expect(jump.status).toBe(409)
    expect(jump.body.error.allowed).toEqual(['full', 'closed', 'loading', 'cancelled'])
    for (const status of ['loading', 'firing', 'cooling', 'unloaded']) {
      expect((await owner.session.post(`/api/firings/${firing.id}/stage`, { status, confirm: true })).body.status).toBe(status)
    }
    const cancel = await owner.session.post(`/api/firings/${firing.id}/cancel`, { reason: 'Too late' })
    expect(cancel.status).toBe(409)
  })

  it('cancelling tells every potter holding space, by mail, and cancels their requests', async () => {
    const firing = (await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody())).body.firings[0]
    const request = await app.ctx.db.getRepository(FiringRequest).save({
      firingId: firing.id,
      potterId: potter.id,
      state: 'accepted',
      pieces: [],
      volumeL: 5,
      verdict: 'ok',
      findings: [],
      acknowledgedWarnings: [],
      quote: null,
    })
    const reply = await owner.session.post(`/api/firings/${firing.id}/cancel`, { reason: 'The kiln lost an element' })
    expect(reply.status).toBe(200)
    expect(reply.body).toMatchObject({ status: 'cancelled', cancelledReason: 'The kiln lost an element', cancelledRequests: 1 })
    expect((await app.ctx.db.getRepository(FiringRequest).findOneByOrFail({ id: request.id })).state).toBe('cancelled')
    const mails = await app.ctx.db.getRepository(OutboundMail).find({ where: { template: 'firing-cancelled', toAddress: potter.email } })
    expect(mails).toHaveLength(1)
    expect(mails[0].bodyText).toContain('The kiln lost an element')
    expect((await new HttpSession(app.url).get(`/api/firings/${firing.id}`)).status).toBe(404)
  })
})

describe('the calendar feed', () => {
  it('parses with a general-purpose iCalendar parser and lists each firing with its drop-off deadline', async () => {
    const res = await fetch(`${app.url}/api/studios/${ids.studioId}/calendar.ics`)
    expect(res.headers.get('content-type')).toMatch(/^text\/calendar/)
    const calendar = new ICAL.Component(ICAL.parse(await res.text()))
    const events = calendar.getAllSubcomponents('vevent').map((e) => new ICAL.Event(e))
    const firings = (await new HttpSession(app.url).get(`/api/studios/${ids.studioId}/firings`)).body.firings as {
      id: string
      firingDate: string
      dropOffBy: string
    }[]
    expect(events).toHaveLength(firings.length * 2)
    // iCalendar DATE-TIME values carry whole seconds (RFC 5545 §3.3.5).
    const toSecond = (iso: string) => new Date(Math.floor(Date.parse(iso) / 1000) * 1000).toISOString()
    for (const firing of firings) {
      const main = events.find((e) => e.uid.startsWith(`firing-${firing.id}@`))!
      expect(main.summary).toMatch(/^cone 6 oxidation glaze firing — /)
      expect(main.startDate.toJSDate().toISOString()).toBe(toSecond(firing.firingDate))
      const dropOff = events.find((e) => e.uid.startsWith(`dropoff-${firing.id}@`))!
      expect(dropOff.startDate.toJSDate().toISOString()).toBe(toSecond(firing.dropOffBy))
    }
  })

  it('is not served for a draft studio', async () => {
    const draft = await owner.session.post('/api/studios', { name: 'Draft Feed', postalCode: '97214' })
    expect((await fetch(`${app.url}/api/studios/${draft.body.id}/calendar.ics`)).status).toBe(404)
  })
})

describe('crew invitations', () => {
  async function inviteLink(email: string) {
    await owner.session.post(`/api/studios/${ids.studioId}/invites`, { email })
    const mail = await app.ctx.db
      .getRepository(OutboundMail)
      .findOneOrFail({ where: { template: 'crew-invite', toAddress: email }, order: { createdAt: 'DESC' } })
    return new URL(mail.bodyText.match(/https?:\/\/\S+join-studio\?token=\S+/)![0]).searchParams.get('token')!
  }

  it('lets a person with no account register through the link and join as crew', async () => {
    const email = `newcrew.${Date.now()}@example.test`
    const token = await inviteLink(email)
    const lookup = await new HttpSession(app.url).post('/api/invites/lookup', { token })
    expect(lookup.body).toMatchObject({ studioId: ids.studioId, studioName: 'Lindqvist Kilnworks', email })
    const session = new HttpSession(app.url)
    const registered = await session.post('/api/auth/register', {
      email,
      password: 'glost-firing-at-dawn-again',
      displayName: 'Ty Brennan',
      role: 'potter',
      inviteToken: token,
    })
    expect(registered.status).toBe(201)
    expect(registered.body).toMatchObject({ role: 'crew', emailVerified: true, studios: [{ id: ids.studioId, role: 'crew' }] })
    // One use only.
    expect((await new HttpSession(app.url).post('/api/invites/lookup', { token })).status).toBe(400)
    // Crew run the firings, but the price list is the owner's.
    expect((await session.post(`/api/firings/${ids.firingId}/stage`, { status: 'closed', confirm: true })).status).toBe(200)
    expect(
      (await session.put(`/api/kilns/${ids.kilnId}/price-list`, { currency: 'USD', model: 'kiln', kilnCents: 1, deposit: { percent: 0 } }))
        .status,
    ).toBe(403)
  })

  it('joins an existing account that signs in with the invited address, and no other', async () => {
    const invitee = await createPerson(app, 'potter', 'Existing Ida')
    const token = await inviteLink(invitee.email)
    const stranger = await createPerson(app, 'potter', 'Stranger Stu')
    const wrong = await stranger.session.post('/api/invites/accept', { token })
    expect(wrong.status).toBe(403)
    expect(wrong.body.error.code).toBe('invite-for-other')
    const right = await invitee.session.post('/api/invites/accept', { token })
    expect(right.status).toBe(200)
    expect(await app.ctx.db.getRepository(StudioMember).findOneBy({ studioId: ids.studioId, userId: invitee.id })).toMatchObject({
      role: 'crew',
    })
  })

  it('shows members and open invitations to the owner, who can remove crew', async () => {
    const email = `pending.${Date.now()}@example.test`
    await owner.session.post(`/api/studios/${ids.studioId}/invites`, { email })
    const crew = await owner.session.get(`/api/studios/${ids.studioId}/crew`)
    expect(crew.body.members.some((m: { role: string }) => m.role === 'owner')).toBe(true)
    expect(crew.body.invites.map((i: { email: string }) => i.email)).toContain(email)
    const member = crew.body.members.find((m: { role: string }) => m.role === 'crew')
    expect((await owner.session.delete(`/api/studios/${ids.studioId}/crew/${member.id}`)).status).toBe(204)
    const ownerRow = crew.body.members.find((m: { role: string }) => m.role === 'owner')
    expect((await owner.session.delete(`/api/studios/${ids.studioId}/crew/${ownerRow.id}`)).status).toBe(409)
  })
})

describe('kilns and their prices in public', () => {
  it('lists kilns with limits by the firing-science names, price list and example prices', async () => {
    const reply = await new HttpSession(app.url).get(`/api/studios/${ids.studioId}/kilns`)
    const kiln = reply.body.kilns.find((k: { id: string }) => k.id === ids.kilnId)
    expect(kiln).toMatchObject({
      kind: 'electric',
      atmospheres: ['oxidation'],
      interior: { shape: 'round', diameterMm: 711, heightMm: 686 },
      minCone: '022',
      maxCone: '10',
      priceList: { model: 'volume', centsPerCubicInch: 4 },
    })
    // Mug 102 × 89 × 114 mm = 1 034 892 mm³ = 63.15 in³ (÷ 16 387.064 mm³ per in³, NIST SP 811) × 4 ¢ = 253 ¢,
    // raised to the 300 ¢ minimum per piece.
    expect(kiln.examplePrices[0]).toMatchObject({ label: expect.stringMatching(/^Mug/), quote: { totalCents: 300, currency: 'USD' } })
  })
})
