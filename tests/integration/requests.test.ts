// Firing requests through the API: the server's own check on send, who may see and decide, the
// state machine's refusals, and messages.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { OutboundMail } from '../../server/entities/OutboundMail'
import { StudioMember } from '../../server/entities/StudioMember'
import { createPerson, type Person } from '../support/people'
import { draftAndSend, mug, runnyMug, wetBowl } from '../support/request-fixtures'
import { firingBody, publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let owner: Person
let crew: Person
let otherCrew: Person
let potter: Person
let otherPotter: Person
let ids: { studioId: string; kilnId: string; firingId: string }

beforeAll(async () => {
  app = await startTestApp({ stripe: true })
  owner = await createPerson(app, 'host', 'Ada Kiln')
  crew = await createPerson(app, 'crew', 'Bo Crew')
  otherCrew = await createPerson(app, 'crew', 'Cy Elsewhere')
  potter = await createPerson(app, 'potter', 'Dee Potter')
  otherPotter = await createPerson(app, 'potter', 'Eli Potter')
  ids = await publishedStudio(owner.session, 'Request Studio')
  await app.ctx.db.getRepository(StudioMember).save({ studioId: ids.studioId, userId: crew.id, role: 'crew' })
  const other = await publishedStudio((await createPerson(app, 'host', 'Far Host')).session, 'Elsewhere Studio')
  await app.ctx.db.getRepository(StudioMember).save({ studioId: other.studioId, userId: otherCrew.id, role: 'crew' })
}, 180_000)

afterAll(async () => {
  await app?.close()
})

describe('composing and sending', () => {
  it('saves a draft with the server’s findings, quote and volume', async () => {
    const reply = await potter.session.post(`/api/firings/${ids.firingId}/requests`, { pieces: [mug()], notes: 'Four mugs' })
    expect(reply.status).toBe(201)
    expect(reply.body).toMatchObject({
      state: 'draft',
      verdict: 'ok',
      notes: 'Four mugs',
      viewer: 'potter',
      actions: expect.arrayContaining(['send', 'edit']),
    })
    // 4 × 100 × 90 × 115 mm = 4.14 L of bounding box.
    expect(reply.body.volumeL).toBeCloseTo(4.14, 2)
    expect(reply.body.quote.totalCents).toBeGreaterThan(0)
  })

  it('refuses to send blocked ware with a 422 listing the findings, whatever the browser said', async () => {
    const draft = await potter.session.post(`/api/firings/${ids.firingId}/requests`, { pieces: [wetBowl()] })
    expect(draft.body.verdict).toBe('block')
    const sent = await potter.session.post(`/api/requests/${draft.body.id}/send`, {
      acknowledged: [],
      agreePolicies: true,
      policiesVersion: draft.body.studio.policiesVersion,
    })
    expect(sent.status).toBe(422)
    expect(sent.body.error.code).toBe('ware-blocked')
    expect(sent.body.error.findings.map((f: { code: string }) => f.code)).toContain('wet-greenware')
  })

  it('asks for each warning to be acknowledged, and records the acknowledgement and the policies version', async () => {
    const draft = await potter.session.post(`/api/firings/${ids.firingId}/requests`, { pieces: [runnyMug()] })
    const base = { agreePolicies: true, policiesVersion: draft.body.studio.policiesVersion }
    const unacknowledged = await potter.session.post(`/api/requests/${draft.body.id}/send`, { ...base, acknowledged: [] })
    expect(unacknowledged.status).toBe(422)
    expect(unacknowledged.body.error).toMatchObject({ code: 'unacknowledged-warnings', missing: ['runny-glaze-tray'] })
    const sent = await potter.session.post(`/api/requests/${draft.body.id}/send`, { ...base, acknowledged: ['runny-glaze-tray'] })
    expect(sent.status).toBe(200)
    expect(sent.body).toMatchObject({
      state: 'sent',
      acknowledgedWarnings: ['runny-glaze-tray'],
      policiesVersion: draft.body.studio.policiesVersion,
    })
    expect(sent.body.timeline.map((e: { to: string }) => e.to)).toEqual(['draft', 'sent'])
  })

  it('needs the policies agreed, in their current version', async () => {
    const draft = await potter.session.post(`/api/firings/${ids.firingId}/requests`, { pieces: [mug()] })
    const noAgreement = await potter.session.post(`/api/requests/${draft.body.id}/send`, { acknowledged: [], policiesVersion: 1 })
    expect(noAgreement.status).toBe(400)
    expect(noAgreement.body.error.fields.agreePolicies).toBeTruthy()
    const stale = await potter.session.post(`/api/requests/${draft.body.id}/send`, {
      acknowledged: [],
      agreePolicies: true,
      policiesVersion: 999,
    })
    expect(stale.status).toBe(409)
    expect(stale.body.error.code).toBe('policies-changed')
  })

  it('mails the studio’s owner and crew when a request is sent', async () => {
    const sent = await draftAndSend(potter.session, ids.firingId, [mug({ quantity: 1 })])
    const mails = await app.ctx.db.getRepository(OutboundMail).find({ where: { template: 'request-sent' } })
    const to = mails
      .filter((m) => m.bodyText.includes(sent.id))
      .map((m) => m.toAddress)
      .sort()
    expect(to).toEqual([owner.email, crew.email].sort())
  })
})

describe('who may see and decide', () => {
  it('shows a request to its potter and the studio’s people only; anyone else gets 404 as if it did not exist', async () => {
    const sent = await draftAndSend(potter.session, ids.firingId, [mug({ quantity: 1 })])
    expect((await potter.session.get(`/api/requests/${sent.id}`)).status).toBe(200)
    expect((await crew.session.get(`/api/requests/${sent.id}`)).body.potter.record).toBeDefined()
    for (const outsider of [otherPotter, otherCrew]) expect((await outsider.session.get(`/api/requests/${sent.id}`)).status).toBe(404)
    const list = await otherPotter.session.get('/api/requests')
    expect(list.status, JSON.stringify(list.body)).toBe(200)
    expect(list.body.requests.map((r: { id: string }) => r.id)).not.toContain(sent.id)
  })

  it('keeps a draft the potter’s own until it is sent', async () => {
    const draft = await potter.session.post(`/api/firings/${ids.firingId}/requests`, { pieces: [mug()] })
    expect((await owner.session.get(`/api/requests/${draft.body.id}`)).status).toBe(404)
  })

  it('lets the studio’s crew accept, but not crew of another studio, and not the potter their own', async () => {
    const sent = await draftAndSend(potter.session, ids.firingId, [mug({ quantity: 1 })])
    expect((await otherCrew.session.post(`/api/requests/${sent.id}/accept`)).status).toBe(404)
    const own = await potter.session.post(`/api/requests/${sent.id}/accept`)
    expect(own.status).toBe(403)
    expect(own.body.error.code).toBe('not-the-studio')
    const accepted = await crew.session.post(`/api/requests/${sent.id}/accept`)
    expect(accepted.status).toBe(200)
    expect(accepted.body.state).toBe('accepted')
  })

  it('answers a forbidden change with 409 and the states allowed from here', async () => {
    const draft = await potter.session.post(`/api/firings/${ids.firingId}/requests`, { pieces: [mug()] })
    const sent = await draftAndSend(potter.session, ids.firingId, [mug({ quantity: 1 })])
    await owner.session.post(`/api/requests/${sent.id}/decline`, { reason: 'Kiln is full of porcelain' })
    const again = await owner.session.post(`/api/requests/${sent.id}/accept`)
    expect(again.status).toBe(409)
    expect(again.body.error).toMatchObject({ code: 'bad-state-change', state: 'declined' })
    const withdrawDeclined = await potter.session.post(`/api/requests/${sent.id}/withdraw`, {})
    expect(withdrawDeclined.status).toBe(409)
    expect(withdrawDeclined.body.error.allowed).toEqual([])
    const withdrawDraft = await potter.session.post(`/api/requests/${draft.body.id}/withdraw`, {})
    expect(withdrawDraft.status).toBe(409)
    expect(withdrawDraft.body.error.allowed).toEqual(['sent', 'cancelled'])
  })
})

describe('the studio decides', () => {
  it('declines with a reason the potter reads by mail', async () => {
    const sent = await draftAndSend(potter.session, ids.firingId, [mug({ quantity: 1 })])
    const reply = await owner.session.post(`/api/requests/${sent.id}/decline`, { reason: 'We do not fire earthenware slips here' })
    expect(reply.body.state).toBe('declined')
    expect(reply.body.timeline.at(-1)).toMatchObject({ to: 'declined', reason: 'We do not fire earthenware slips here', by: 'Ada Kiln' })
    const mails = await app.ctx.db.getRepository(OutboundMail).findBy({ template: 'request-declined', toAddress: potter.email })
    expect(mails.find((m) => m.bodyText.includes(sent.id))!.bodyText).toContain('We do not fire earthenware slips here')
  })

  it('proposes another firing of the same studio; the potter’s acceptance takes and holds the place there', async () => {
    const later = (
      await owner.session.post(
        `/api/kilns/${ids.kilnId}/firings`,
        firingBody({
          dropOffBy: new Date(Date.now() + 12 * 86400_000).toISOString(),
          firingDate: new Date(Date.now() + 14 * 86400_000).toISOString(),
          readyBy: new Date(Date.now() + 16 * 86400_000).toISOString(),
        }),
      )
    ).body.firings[0]
    const sent = await draftAndSend(potter.session, ids.firingId, [mug({ quantity: 1 })])
    const proposed = await owner.session.post(`/api/requests/${sent.id}/move`, { firingId: later.id })
    expect(proposed.status).toBe(200)
    expect(proposed.body.proposedFiring.id).toBe(later.id)
    const answered = await potter.session.post(`/api/requests/${sent.id}/move/accept`)
    expect(answered.status).toBe(200)
    expect(answered.body).toMatchObject({ state: 'accepted', firing: { id: later.id } })
    // The ware now has its place in the later firing's load.
    expect(answered.body.firing.space.shelvesTaken).toBeGreaterThan(0)
  })

  it('does not move a request to another studio’s firing', async () => {
    const elsewhere = (await otherCrew.session.get('/api/studios?mine=true')).body.studios[0]
    const firings = (await otherCrew.session.get(`/api/studios/${elsewhere.id}/firings`)).body.firings
    const sent = await draftAndSend(potter.session, ids.firingId, [mug({ quantity: 1 })])
    const reply = await owner.session.post(`/api/requests/${sent.id}/move`, { firingId: firings[0].id })
    expect(reply.status).toBe(400)
    expect(reply.body.error.fields.firingId).toBeTruthy()
  })
})

describe('the message thread', () => {
  it('keeps messages from both sides and mails the other side once for a burst', async () => {
    const sent = await draftAndSend(potter.session, ids.firingId, [mug({ quantity: 1 })])
    for (const body of ['Is the glaze on the mugs food safe?', 'It is a cone 6 liner glaze.', 'Thanks!']) {
      expect((await potter.session.post(`/api/requests/${sent.id}/messages`, { body })).status).toBe(201)
    }
    await crew.session.post(`/api/requests/${sent.id}/messages`, { body: 'Yes, and we can slow-cool for you.' })
    const thread = await potter.session.get(`/api/requests/${sent.id}/messages`)
    expect(thread.body.messages.map((m: { side: string }) => m.side)).toEqual(['potter', 'potter', 'potter', 'studio'])
    expect((await otherPotter.session.get(`/api/requests/${sent.id}/messages`)).status).toBe(404)
    // One digest job per side, however many messages: run them now instead of after the delay.
    const jobs = await app.ctx.db.query(`SELECT key FROM graphile_worker._private_jobs WHERE key LIKE $1`, [`messages:${sent.id}:%`])
    expect(jobs.map((j: { key: string }) => j.key).sort()).toEqual([`messages:${sent.id}:potter`, `messages:${sent.id}:studio`])
    await app.ctx.db.query(`UPDATE graphile_worker._private_jobs SET run_at = now() WHERE key LIKE $1`, [`messages:${sent.id}:%`])
    await expect
      .poll(
        async () =>
          (await app.ctx.db.getRepository(OutboundMail).find({ where: { template: 'new-messages' } })).filter((m) =>
            m.bodyText.includes(sent.id),
          ).length,
        { timeout: 60_000 },
      )
      .toBe(3)
    const toOwner = (
      await app.ctx.db.getRepository(OutboundMail).find({ where: { template: 'new-messages', toAddress: owner.email } })
    ).find((m) => m.bodyText.includes(sent.id))!
    expect(toOwner.subject).toMatch(/^3 new messages/)
    expect(toOwner.bodyText).toContain('Is the glaze on the mugs food safe?')
  })
})
