// Making good to potters whose pieces an incident hurt, through the API: a free refire promised (a
// record, on the hurt ask's timeline, the potter told by notice and mail), a credit refunded through the
// Stripe stand-in on the hurt potter's own ask after the studio was already paid its share (a ledger
// refund line naming the incident, the studio's share taken back, the ledger invariant holding), a
// credit owed back at the counter for money taken there, and who may do it, how often, how much.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { checkLedgers } from '../support/ledger'
import { waitForMail } from '../support/mailbox'
import { checkInAll, collected, fireThrough, moneyQuiet, onboard, payBalanceOnline, resultsAndReady } from '../support/money'
import type { HttpSession } from '../support/http-client'
import { createPerson, type Person } from '../support/people'
import { draftAndSend, mug, sendAndPayDeposit } from '../support/request-fixtures'
import { firingBody, publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let owner: Person
let crew: Person
let potter: Person
let neighbour: Person
let counterNeighbour: Person
let stranger: Person
let ids: { studioId: string; kilnId: string; firingId: string }
let comingFiringId: string
let requestId: string
let neighbourRequestId: string
let counterRequestId: string
let tag: string
let neighbourTags: string[]
let counterTag: string
let incidentId: string

const passes = { sound: true, 'clean-foot': true }
const days = (n: number) => new Date(Date.now() + n * 24 * 3_600_000).toISOString()

async function ok(reply: Promise<{ status: number; body: any }>, what: string, status = 200) {
  const answer = await reply
  if (answer.status !== status) throw new Error(`${what}: ${answer.status} ${JSON.stringify(answer.body)}`)
  return answer.body
}

async function tagAll(studio: HttpSession, request: string, count: number) {
  const tags: string[] = []
  for (let n = 0; n < count; n++)
    tags.push((await ok(studio.post(`/api/requests/${request}/pieces`, { pieceIndex: 0, checks: passes }), 'tag', 201)).piece.tag)
  return tags
}

const timelineOf = async (session: HttpSession, request: string) =>
  ((await session.get(`/api/requests/${request}`)).body.timeline as { reason: string }[]).map((t) => t.reason)

const noticeKinds = async (person: Person) =>
  ((await app.ctx.db.query(`SELECT kind FROM notices WHERE user_id = $1`, [person.id])) as { kind: string }[]).map((n) => n.kind)

beforeAll(async () => {
  app = await startTestApp({
    stripe: true,
    mail: true,
    config: { marketplaceFee: { percent: 10, minimumCents: 100 }, payoutHoldHours: 0 },
  })
  owner = await createPerson(app, 'host', 'Maren Kiln')
  crew = await createPerson(app, 'host', 'Ola Crew')
  potter = await createPerson(app, 'potter', 'Ravi Thickwall')
  neighbour = await createPerson(app, 'potter', 'June Nextshelf')
  counterNeighbour = await createPerson(app, 'potter', 'Pia Cashpaid')
  stranger = await createPerson(app, 'potter', 'Ada Elsewhere')
  ids = await publishedStudio(owner.session, 'Remedy Studio')
  await app.ctx.db.query(`INSERT INTO studio_members (studio_id, user_id, role) VALUES ($1, $2, 'crew')`, [ids.studioId, crew.id])
  const coming = await ok(
    owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody({ dropOffBy: days(20), firingDate: days(22), readyBy: days(25) })),
    'coming firing',
    201,
  )
  comingFiringId = coming.firings[0].id

  requestId = (await sendAndPayDeposit(app, owner.session, potter.session, ids.firingId, [mug({ quantity: 1 })])).id
  neighbourRequestId = (await sendAndPayDeposit(app, owner.session, neighbour.session, ids.firingId, [mug({ quantity: 2 })])).id
  // The third potter pays everything at the studio's counter: a credit cannot go back to a card.
  counterRequestId = (await draftAndSend(counterNeighbour.session, ids.firingId, [mug({ quantity: 1 })])).id
  await ok(owner.session.post(`/api/requests/${counterRequestId}/accept`), 'accept')
  await ok(owner.session.post(`/api/requests/${counterRequestId}/balance/counter`, {}), 'deposit at the counter')

  tag = (await tagAll(owner.session, requestId, 1))[0]
  neighbourTags = await tagAll(owner.session, neighbourRequestId, 2)
  counterTag = (await tagAll(owner.session, counterRequestId, 1))[0]
  await checkInAll(owner.session, requestId, [1])
  await checkInAll(owner.session, neighbourRequestId, [2])
  await checkInAll(owner.session, counterRequestId, [1])

  const incident = await ok(
    crew.session.post(`/api/firings/${ids.firingId}/incidents`, {
      kind: 'blowout',
      shards: true,
      note: 'Shards across the middle shelf.',
      pieceTags: [tag],
      hurtTags: [neighbourTags[0], counterTag],
    }),
    'incident',
    201,
  )
  incidentId = incident.id
}, 180_000)

afterAll(async () => {
  await app?.close()
})

describe('who may make good', () => {
  it('is the studio’s owner alone: crew and potters are refused, strangers do not see the incident', async () => {
    const body = { requestId: neighbourRequestId, kind: 'refire', tags: [neighbourTags[0]] }
    expect((await crew.session.post(`/api/incidents/${incidentId}/remedies`, body)).status).toBe(403)
    expect((await potter.session.post(`/api/incidents/${incidentId}/remedies`, body)).status).toBe(403)
    expect((await neighbour.session.post(`/api/incidents/${incidentId}/remedies`, body)).status).toBe(403)
    expect((await stranger.session.post(`/api/incidents/${incidentId}/remedies`, body)).status).toBe(404)
    const crewView = (await crew.session.get(`/api/incidents/${incidentId}`)).body
    expect(crewView).toMatchObject({ canMakeGood: false, hurtAsks: [], comingFirings: [] })
  })

  it('refuses bad input field by field, never a 500', async () => {
    const post = (body: Record<string, unknown>) => owner.session.post(`/api/incidents/${incidentId}/remedies`, body)
    const badKind = await post({ requestId: neighbourRequestId, kind: 'apology' })
    expect(badKind.status).toBe(400)
    expect(badKind.body.error.fields.kind).toBeTruthy()
    const noAmount = await post({ requestId: neighbourRequestId, kind: 'credit' })
    expect(noAmount.status).toBe(400)
    expect(noAmount.body.error.fields.amountCents).toBeTruthy()
    const noTags = await post({ requestId: neighbourRequestId, kind: 'refire' })
    expect(noTags.status).toBe(400)
    expect(noTags.body.error.fields.tags).toBeTruthy()
    // The failed potter's own ask had nothing hurt: there is nothing to make good on it.
    const notHurt = await post({ requestId, kind: 'refire', tags: [tag] })
    expect(notHurt.status).toBe(400)
    expect(notHurt.body.error.fields.requestId).toBeTruthy()
    // Of the neighbour's two pieces only the first was named as hurt.
    const unhurtPiece = await post({ requestId: neighbourRequestId, kind: 'refire', tags: [neighbourTags[1]] })
    expect(unhurtPiece.status).toBe(400)
    expect(unhurtPiece.body.error.fields['tags.0']).toBeTruthy()
    const notComing = await post({ requestId: neighbourRequestId, kind: 'refire', tags: [neighbourTags[0]], firingId: ids.firingId })
    expect(notComing.status).toBe(400)
    expect(notComing.body.error.fields.firingId).toBeTruthy()
  })

  it('refuses a credit before the ware is picked up: the balance would ask for it again', async () => {
    const early = await owner.session.post(`/api/incidents/${incidentId}/remedies`, {
      requestId: neighbourRequestId,
      kind: 'credit',
      amountCents: 100,
    })
    expect(early.status).toBe(409)
    expect(early.body.error.code).toBe('not-picked-up')
    const view = (await owner.session.get(`/api/incidents/${incidentId}`)).body
    expect(view.hurtAsks.find((a: { requestId: string }) => a.requestId === neighbourRequestId).creditBlocked).toMatch(/picked up/)
  })
})

describe('a free refire', () => {
  it('is recorded with its pieces and firing, on the hurt ask’s timeline, and the potter is told by notice and mail', async () => {
    const promised = await owner.session.post(`/api/incidents/${incidentId}/remedies`, {
      requestId: neighbourRequestId,
      kind: 'refire',
      tags: [neighbourTags[0].toLowerCase()],
      firingId: comingFiringId,
      note: 'Same glaze, our cost.',
    })
    expect(promised.status, JSON.stringify(promised.body)).toBe(201)
    expect(promised.body).toMatchObject({
      kind: 'refire',
      requestId: neighbourRequestId,
      potterName: 'June Nextshelf',
      pieceTags: [neighbourTags[0]],
      targetFiring: { id: comingFiringId, kilnName: 'Test electric' },
      amountCents: null,
    })
    const rows: { piece_tags: string[]; target_firing_id: string }[] = await app.ctx.db.query(
      `SELECT piece_tags, target_firing_id FROM incident_remedies WHERE id = $1`,
      [promised.body.id],
    )
    expect(rows[0]).toEqual({ piece_tags: [neighbourTags[0]], target_firing_id: comingFiringId })
    expect((await timelineOf(neighbour.session, neighbourRequestId)).some((r) => r.startsWith('Free refire promised'))).toBe(true)
    expect(await noticeKinds(neighbour)).toContain('remedy-refire')
    const mail = await waitForMail(app.mail!.webUrl, { to: neighbour.email, subject: 'refire your hurt pieces free' })
    expect(mail.text).toContain(neighbourTags[0])
    expect(mail.text).toContain('Same glaze, our cost.')
  })

  it('is given once per hurt ask: a second is a conflict', async () => {
    const again = await owner.session.post(`/api/incidents/${incidentId}/remedies`, {
      requestId: neighbourRequestId,
      kind: 'refire',
      tags: [neighbourTags[0]],
    })
    expect(again.status).toBe(409)
    expect(again.body.error.code).toBe('remedy-given')
  })

  it('is shown to the potter it concerns and the studio, not to the other potters', async () => {
    const seen = async (person: Person) => (await person.session.get(`/api/incidents/${incidentId}`)).body
    expect((await seen(neighbour)).remedies).toHaveLength(1)
    expect((await seen(counterNeighbour)).remedies).toEqual([])
    expect((await seen(potter)).remedies).toEqual([])
    // The firing's list of incidents (on each ask's page) carries the same, as far as each may see.
    const listed = async (person: Person) =>
      ((await person.session.get(`/api/firings/${ids.firingId}/incidents`)).body.incidents as { remedies: unknown[] }[])[0].remedies
    expect(await listed(neighbour)).toHaveLength(1)
    expect(await listed(counterNeighbour)).toEqual([])
    expect(await listed(crew)).toHaveLength(1)
    const studio = await seen(owner)
    expect(studio.remedies).toHaveLength(1)
    expect(studio.canMakeGood).toBe(true)
    expect(studio.comingFirings.map((f: { id: string }) => f.id)).toContain(comingFiringId)
    expect(studio.comingFirings.map((f: { id: string }) => f.id)).not.toContain(ids.firingId)
    const hurt = studio.hurtAsks.find((a: { requestId: string }) => a.requestId === neighbourRequestId)
    expect(hurt).toMatchObject({ potterName: 'June Nextshelf', given: ['refire'] })
    expect(hurt.pieces.map((p: { tag: string }) => p.tag)).toEqual([neighbourTags[0]])
  })
})

describe('a credit', () => {
  beforeAll(async () => {
    // The studio is paid its share of each ask at pickup (no hold in this test), before any credit.
    await onboard(app, owner.session, ids.studioId)
    await fireThrough(owner.session, ids.firingId)
    for (const [id, session] of [
      [requestId, potter.session],
      [neighbourRequestId, neighbour.session],
    ] as const) {
      await resultsAndReady(owner.session, id)
      await payBalanceOnline(app, session, id)
      await collected(owner.session, id)
    }
    await resultsAndReady(owner.session, counterRequestId)
    await ok(owner.session.post(`/api/requests/${counterRequestId}/balance/counter`, {}), 'balance at the counter')
    await collected(owner.session, counterRequestId)
    await moneyQuiet(app, { heldToo: true })
  }, 180_000)

  it('is at most what the potter paid on the ask and has not had back', async () => {
    const paid = (await neighbour.session.get(`/api/requests/${neighbourRequestId}`)).body.price.netPaidCents as number
    expect(paid).toBeGreaterThan(0)
    const over = await owner.session.post(`/api/incidents/${incidentId}/remedies`, {
      requestId: neighbourRequestId,
      kind: 'credit',
      amountCents: paid + 1,
    })
    expect(over.status).toBe(400)
    expect(over.body.error.fields.amountCents).toMatch(/At most/)
  })

  it('is refunded through Stripe on the hurt ask, booked as a refund naming the incident, the studio’s share taken back', async () => {
    const before = (await checkLedgers(app)).requests.find((r) => r.requestId === neighbourRequestId)!.ledger
    expect(before.transferredCents).toBeGreaterThan(0)
    const given = await owner.session.post(`/api/incidents/${incidentId}/remedies`, {
      requestId: neighbourRequestId,
      kind: 'credit',
      amountCents: 500,
      note: 'For the chipped rim.',
    })
    expect(given.status, JSON.stringify(given.body)).toBe(201)
    expect(given.body).toMatchObject({ kind: 'credit', amountCents: 500, onlineCents: 500, counterCents: 0, currency: 'USD' })
    await moneyQuiet(app)

    const refunds: { amount_cents: number; note: string; stripe_refund_id: string }[] = await app.ctx.db.query(
      `SELECT amount_cents, note, stripe_refund_id FROM ledger_entries WHERE request_id = $1 AND kind = 'refund'`,
      [neighbourRequestId],
    )
    // The refund job splits it over the ask's payments, newest first: one ledger line per Stripe refund.
    expect(refunds.reduce((n, r) => n + r.amount_cents, 0)).toBe(500)
    for (const refund of refunds) {
      expect(refund.note).toContain(incidentId)
      expect(refund.stripe_refund_id).toMatch(/^re_/)
    }
    expect(
      (await timelineOf(owner.session, neighbourRequestId)).some((r) => r.startsWith('Credit for ware hurt in an incident: $5.00')),
    ).toBe(true)
    expect(await noticeKinds(neighbour)).toContain('remedy-credit')
    expect(await noticeKinds(owner)).toContain('remedy-credit')
    const mail = await waitForMail(app.mail!.webUrl, { to: neighbour.email, subject: 'credits $5.00' })
    expect(mail.text).toContain('goes back to the card you paid with')

    // The ledger balances with Stripe's own record, and the studio keeps its share of what was kept:
    // 10 % fee (the test's rule) on what stayed online, the rest transferred.
    const after = (await checkLedgers(app)).requests.find((r) => r.requestId === neighbourRequestId)!.ledger
    expect(after.keptOnlineCents).toBe(before.keptOnlineCents - 500)
    expect(after.feeCents).toBe(Math.max(100, Math.round(after.keptOnlineCents * 0.1)))
    expect(after.transferredCents).toBe(after.keptOnlineCents - after.feeCents)
    expect(after.transferredCents).toBeLessThan(before.transferredCents)
  })

  it('is given once per hurt ask: a second is a conflict', async () => {
    const again = await owner.session.post(`/api/incidents/${incidentId}/remedies`, {
      requestId: neighbourRequestId,
      kind: 'credit',
      amountCents: 100,
    })
    expect(again.status).toBe(409)
    expect(again.body.error.code).toBe('remedy-given')
  })

  it('on money taken at the counter is owed back there, and the studio marks it handed back', async () => {
    const given = await owner.session.post(`/api/incidents/${incidentId}/remedies`, {
      requestId: counterRequestId,
      kind: 'credit',
      amountCents: 300,
    })
    expect(given.status, JSON.stringify(given.body)).toBe(201)
    expect(given.body).toMatchObject({ onlineCents: 0, counterCents: 300 })
    const view = (await owner.session.get(`/api/requests/${counterRequestId}`)).body
    expect(view.actions).toContain('hand-back')
    const due = view.counterRefunds.find((r: { amountCents: number; paidAt: string | null }) => r.amountCents === 300 && !r.paidAt)
    expect(due).toBeTruthy()
    const reasons: { reason: string }[] = await app.ctx.db.query(`SELECT reason FROM counter_refunds WHERE id = $1`, [due.id])
    expect(reasons[0].reason).toContain(incidentId)
    await ok(owner.session.post(`/api/requests/${counterRequestId}/counter-refunds/${due.id}/paid`), 'hand back')
    const mail = await waitForMail(app.mail!.webUrl, { to: counterNeighbour.email, subject: 'credits $3.00' })
    expect(mail.text).toContain('handed back there')
    await moneyQuiet(app)
    const ledger = (await checkLedgers(app)).requests.find((r) => r.requestId === counterRequestId)!.ledger
    expect(ledger.refundedCents).toBe(300)
  })
})
