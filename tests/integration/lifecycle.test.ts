// One request lifecycle: every change through one door, nothing left hanging, both sides told. Each
// block here is a defect found by working the board end to end, and fails on the code before it.
import { createHmac } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { FiringRequest } from '../../server/entities/FiringRequest'
import { LedgerEntry } from '../../server/entities/LedgerEntry'
import { Notice } from '../../server/entities/Notice'
import { OutboundMail } from '../../server/entities/OutboundMail'
import { cancelFiring, moveFiring, undoFiringMove } from '../../server/services/firing-stages'
import { acceptRequest, sweepStaleRequests } from '../../server/services/requests'
import { CARD_SUCCEEDS, submitCard } from '../support/checkout'
import { createPerson, type Person } from '../support/people'
import { draftAndSend, mug, sendAndPayDeposit } from '../support/request-fixtures'
import { firingBody, publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'
import { User } from '../../server/entities/User'

let app: TestApp
let owner: Person
let crew: Person
let potter: Person
let otherPotter: Person
let admin: Person
let ids: { studioId: string; kilnId: string; firingId: string }

beforeAll(async () => {
  app = await startTestApp({ stripe: true })
  owner = await createPerson(app, 'host', 'Opal Owner')
  potter = await createPerson(app, 'potter', 'Pia Potter')
  otherPotter = await createPerson(app, 'potter', 'Quin Potter')
  admin = await createPerson(app, 'admin', 'Ada Desk')
  ids = await publishedStudio(owner.session, 'Lifecycle Studio')
  crew = await createPerson(app, 'crew', 'Cal Crew')
  await app.ctx.db.query(`INSERT INTO studio_members (studio_id, user_id, role) VALUES ($1, $2, 'crew')`, [ids.studioId, crew.id])
})

afterAll(async () => {
  await app?.close()
})

const freshFiring = async (overrides: Record<string, unknown> = {}) =>
  (await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody(overrides))).body.firings[0] as { id: string }
const state = async (id: string) => (await app.ctx.db.getRepository(FiringRequest).findOneByOrFail({ id })).state
const view = async (who: Person, id: string) => (await who.session.get(`/api/requests/${id}`)).body
const mailsFor = async (template: string, requestId: string) =>
  (await app.ctx.db.getRepository(OutboundMail).findBy({ template })).filter((m) => m.bodyText.includes(requestId))
const noticesOf = async (who: Person) =>
  (await who.session.get('/api/notices')).body as { items: { kind: string; path: string; read: boolean; id: string }[]; unread: number }
const stage = (firingId: string, status: string, confirm = true) =>
  owner.session.post(`/api/firings/${firingId}/stage`, { status, confirm })

describe('nothing left hanging', () => {
  it('lapses a request still waiting for an answer when loading starts, offers no accept, and tells the potter', async () => {
    const firing = await freshFiring()
    const waiting = await draftAndSend(potter.session, firing.id, [mug({ quantity: 1 })])
    expect((await view(owner, waiting.id)).actions).toContain('accept')
    // Loading ahead of the drop-off deadline asks first, naming the date and what will lapse.
    const asked = await stage(firing.id, 'loading', false)
    expect(asked.status).toBe(409)
    expect(asked.body.error.code).toBe('needs-confirmation')
    expect(asked.body.error.message).toMatch(/Drop-off is open until/)
    expect(asked.body.error.message).toMatch(/1 ask still waiting lapses/)
    expect((await stage(firing.id, 'loading')).status).toBe(200)
    expect(await state(waiting.id)).toBe('lapsed')
    const studioView = await view(owner, waiting.id)
    expect(studioView.actions).not.toContain('accept')
    expect(studioView.timeline.at(-1)).toMatchObject({ to: 'lapsed', reason: expect.stringMatching(/Loading started/) })
    expect((await owner.session.post(`/api/requests/${waiting.id}/accept`)).status).toBe(409)
    expect((await noticesOf(potter)).items.some((n) => n.kind === 'lapsed' && n.path === `/requests/${waiting.id}`)).toBe(true)
    // The potter's mail waits out the undo window, then goes.
    expect(await mailsFor('lapsed', waiting.id)).toHaveLength(1)
  })

  it('lapses a request whose deposit is still owed when the firing stops taking ware, refunding what was paid at the counter', async () => {
    const firing = await freshFiring()
    const sent = await draftAndSend(potter.session, firing.id, [mug({ quantity: 2 })])
    await owner.session.post(`/api/requests/${sent.id}/accept`)
    const part = await owner.session.post(`/api/requests/${sent.id}/balance/counter`, { amountCents: 100 })
    expect(part.status).toBe(200)
    expect(part.body.state).toBe('accepted')
    expect((await stage(firing.id, 'closed')).status).toBe(200)
    expect(await state(sent.id)).toBe('lapsed')
    const after = await view(owner, sent.id)
    // Money taken at the counter goes back at the counter: recorded as owed until the studio hands it back.
    expect(after.counterRefunds).toEqual([expect.objectContaining({ amountCents: 100, paidAt: null })])
    expect(after.actions).toContain('hand-back')
    const handed = await owner.session.post(`/api/requests/${sent.id}/counter-refunds/${after.counterRefunds[0].id}/paid`)
    expect(handed.status).toBe(200)
    expect(
      handed.body.ledger.map((l: { kind: string; direction: string; amountCents: number }) => `${l.kind}:${l.direction}:${l.amountCents}`),
    ).toEqual(['counter:in:100', 'counter-refund:out:100'])
    expect(handed.body.price.netPaidCents).toBe(0)
  })

  it('sweeps a request left unanswered past the drop-off deadline', async () => {
    const firing = await freshFiring()
    const sent = await draftAndSend(potter.session, firing.id, [mug({ quantity: 1 })])
    expect(await sweepStaleRequests(app.ctx, new Date(Date.now() + 6 * 86_400_000))).toBeGreaterThanOrEqual(1)
    expect(await state(sent.id)).toBe('lapsed')
    expect((await view(potter, sent.id)).timeline.at(-1).reason).toMatch(/drop-off deadline passed/)
  })
})

describe('one price', () => {
  async function checkedInWithRaise() {
    const firing = await freshFiring()
    const sent = await sendAndPayDeposit(app, owner.session, potter.session, firing.id, [mug({ quantity: 1 })])
    const raised = await owner.session.post(`/api/requests/${sent.id}/check-in`, {
      pieces: [{ pieceIndex: 0, received: 1, measured: { heightMm: 200, widthMm: 180, depthMm: 200 } }],
    })
    expect(raised.status).toBe(200)
    expect(raised.body.needsConfirmation).toBe(true)
    return { sent, raised: raised.body as { priceBeforeCents: number; priceAfterCents: number } }
  }

  it('keeps the deposit as asked and paid, shows the confirmed price in every list, and tells the studio', async () => {
    const { sent, raised } = await checkedInWithRaise()
    const before = await view(potter, sent.id)
    expect(before.price).toMatchObject({ totalCents: raised.priceBeforeCents, depositCents: sent.quote.depositCents, depositAsked: true })
    expect(before.price.pending.totalCents).toBe(raised.priceAfterCents)
    expect(before.actions).toEqual(expect.arrayContaining(['confirm-price', 'decline-price']))
    expect((await noticesOf(potter)).items.some((n) => n.kind === 'price-raised' && n.path === `/requests/${sent.id}`)).toBe(true)

    const confirmed = await potter.session.post(`/api/requests/${sent.id}/confirm-price`)
    expect(confirmed.status).toBe(200)
    expect(confirmed.body.price).toMatchObject({
      totalCents: raised.priceAfterCents,
      depositCents: sent.quote.depositCents,
      pending: null,
      balanceOwedCents: raised.priceAfterCents - sent.quote.depositCents,
    })
    const mine = (await potter.session.get('/api/requests?as=potter')).body.requests.find((r: { id: string }) => r.id === sent.id)
    const inbox = (await owner.session.get(`/api/requests?as=studio&studioId=${ids.studioId}`)).body.requests.find(
      (r: { id: string }) => r.id === sent.id,
    )
    for (const row of [mine, inbox])
      expect(row.price).toMatchObject({ totalCents: raised.priceAfterCents, depositCents: sent.quote.depositCents })
    // To each of the studio's people: the owner and the crew.
    expect((await mailsFor('price-confirmed', sent.id)).map((m) => m.toAddress).sort()).toEqual([owner.email, crew.email].sort())
    expect((await noticesOf(owner)).items.some((n) => n.kind === 'price-confirmed')).toBe(true)
  })

  it('lets the potter turn a raised price down: the request is withdrawn and everything paid comes back', async () => {
    const { sent } = await checkedInWithRaise()
    const declined = await potter.session.post(`/api/requests/${sent.id}/price/decline`)
    expect(declined.status).toBe(200)
    expect(declined.body.state).toBe('withdrawn')
    expect((await mailsFor('price-declined', sent.id)).map((m) => m.toAddress).sort()).toEqual(
      [owner.email, crew.email, potter.email].sort(),
    )
    await expect.poll(async () => (await view(potter, sent.id)).price.refundedCents, { timeout: 60_000 }).toBe(sent.quote.depositCents)
  })

  it('sends a receipt to the potter and a notice to the studio when the balance is paid online', async () => {
    const firing = await freshFiring()
    const sent = await sendAndPayDeposit(app, owner.session, potter.session, firing.id, [mug({ quantity: 1 })])
    await owner.session.post(`/api/requests/${sent.id}/check-in`, { pieces: [{ pieceIndex: 0, received: 1 }] })
    for (const status of ['loading', 'firing', 'cooling', 'unloaded']) expect((await stage(firing.id, status)).status).toBe(200)
    await owner.session.post(`/api/requests/${sent.id}/results`, { outcomes: [{ pieceIndex: 0, outcome: 'fine' }] })
    await owner.session.post(`/api/requests/${sent.id}/ready`)
    const balance = await potter.session.post(`/api/requests/${sent.id}/balance`)
    expect(balance.status).toBe(200)
    await submitCard(balance.body.checkoutUrl, { cardNumber: CARD_SUCCEEDS })
    await expect.poll(async () => (await view(potter, sent.id)).price.balanceOwedCents, { timeout: 60_000 }).toBe(0)
    const receipts = await mailsFor('payment-received', sent.id)
    // One for the deposit and one for the balance, each to the potter and to the studio's two people.
    expect(receipts.filter((m) => m.subject.startsWith('Receipt:')).map((m) => m.toAddress)).toEqual([potter.email, potter.email])
    expect(
      receipts
        .filter((m) => m.subject.includes('toward the balance'))
        .map((m) => m.toAddress)
        .sort(),
    ).toEqual([owner.email, crew.email].sort())
    expect((await noticesOf(owner)).items.some((n) => n.kind === 'payment-received' && n.path === `/requests/${sent.id}`)).toBe(true)
  })
})

describe('counter payments', () => {
  it('never take more than is owed, and the online checkout asks only for what is left', async () => {
    const firing = await freshFiring()
    const sent = await draftAndSend(potter.session, firing.id, [mug({ quantity: 4 })])
    await owner.session.post(`/api/requests/${sent.id}/accept`)
    const deposit = sent.quote.depositCents
    expect((await owner.session.post(`/api/requests/${sent.id}/balance/counter`, { amountCents: deposit - 5 })).status).toBe(200)
    const tooMuch = await owner.session.post(`/api/requests/${sent.id}/balance/counter`, { amountCents: 600 })
    expect(tooMuch.status).toBe(400)
    expect(tooMuch.body.error.fields.amountCents).toMatch(/At most 5 cents/)
    // What is left is under a card's minimum charge: it cannot be paid online, and says so (not a 500).
    const online = await potter.session.post(`/api/requests/${sent.id}/deposit`)
    expect(online.status).toBe(409)
    expect(online.body.error.code).toBe('below-minimum')
    const rest = await owner.session.post(`/api/requests/${sent.id}/balance/counter`, {})
    expect(rest.body.state).toBe('deposit_paid')
    expect(rest.body.price.netPaidCents).toBe(deposit)
  })

  it('asks online for what is left after part of the deposit came in at the counter', async () => {
    const firing = await freshFiring()
    const sent = await draftAndSend(potter.session, firing.id, [mug({ quantity: 4 })])
    await owner.session.post(`/api/requests/${sent.id}/accept`)
    await owner.session.post(`/api/requests/${sent.id}/balance/counter`, { amountCents: 100 })
    const online = await potter.session.post(`/api/requests/${sent.id}/deposit`)
    expect(online.status).toBe(200)
    expect(online.body.amountCents).toBe(sent.quote.depositCents - 100)
  })

  it('rounds a deposit smaller than a card can take up to the card minimum, never past the price', async () => {
    await owner.session.put(`/api/kilns/${ids.kilnId}/price-list`, {
      currency: 'USD',
      model: 'volume',
      centsPerCubicInch: 4,
      minimumPerPieceCents: 300,
      deposit: { percent: 5 },
    })
    try {
      const firing = await freshFiring()
      const sent = await draftAndSend(potter.session, firing.id, [mug({ quantity: 1 })])
      expect(sent.quote.depositCents).toBeLessThan(50)
      const accepted = await owner.session.post(`/api/requests/${sent.id}/accept`)
      expect(accepted.body.price.depositCents).toBe(Math.min(50, sent.quote.totalCents))
      const online = await potter.session.post(`/api/requests/${sent.id}/deposit`)
      expect(online.status).toBe(200)
      expect(online.body.amountCents).toBe(50)
    } finally {
      await owner.session.put(`/api/kilns/${ids.kilnId}/price-list`, {
        currency: 'USD',
        model: 'volume',
        centsPerCubicInch: 4,
        minimumPerPieceCents: 300,
        deposit: { percent: 25 },
      })
    }
  })
})

describe('webhooks trust only what they can check', () => {
  const sign = (payload: string, t = Math.floor(Date.now() / 1000)) =>
    `t=${t},v1=${createHmac('sha256', 'whsec_conewright_tests').update(`${t}.${payload}`).digest('hex')}`
  const post = (payload: string) =>
    fetch(`${app.url}/api/webhooks/stripe`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', 'Stripe-Signature': sign(payload) },
      body: payload,
    })

  async function openDeposit() {
    const firing = await freshFiring()
    const sent = await draftAndSend(potter.session, firing.id, [mug({ quantity: 2 })])
    await owner.session.post(`/api/requests/${sent.id}/accept`)
    const opened = await potter.session.post(`/api/requests/${sent.id}/deposit`)
    const sessionId = new URL(opened.body.checkoutUrl).pathname.split('/').at(-1)!
    return { sent, sessionId, amount: opened.body.amountCents as number }
  }
  const completed = (id: string, object: Record<string, unknown>) =>
    JSON.stringify({
      id,
      object: 'event',
      type: 'checkout.session.completed',
      data: { object: { object: 'checkout.session', payment_status: 'paid', ...object } },
    })

  it('records and flags a payment of another amount or currency, and applies nothing', async () => {
    const { sent, sessionId } = await openDeposit()
    const reply = await post(
      completed(`evt_yen_${sent.id}`, {
        id: sessionId,
        amount_total: 1,
        currency: 'jpy',
        metadata: { requestId: sent.id, purpose: 'deposit' },
      }),
    )
    expect(reply.status).toBe(200)
    expect(await state(sent.id)).toBe('accepted')
    expect(await app.ctx.db.getRepository(LedgerEntry).findBy({ requestId: sent.id })).toEqual([])
    const [event] = await app.ctx.db.query(`SELECT problem FROM stripe_events WHERE id = $1`, [`evt_yen_${sent.id}`])
    expect(event.problem).toMatch(/1 JPY where \d+ USD was asked/)
  })

  it('finds the payment by its own session id: metadata naming another request changes neither', async () => {
    const first = await openDeposit()
    const second = await openDeposit()
    const reply = await post(
      completed(`evt_swap_${first.sent.id}`, {
        id: first.sessionId,
        amount_total: first.amount,
        currency: 'usd',
        metadata: { requestId: second.sent.id, purpose: 'deposit' },
      }),
    )
    expect(reply.status).toBe(200)
    expect(await state(first.sent.id)).toBe('accepted')
    expect(await state(second.sent.id)).toBe('accepted')
  })

  it('answers a malformed signed event with 400 and records it', async () => {
    for (const [id, payload] of [
      ['array', JSON.stringify([{ id: 'evt_in_array' }])],
      ['no-data', JSON.stringify({ id: 'evt_no_data', type: 'checkout.session.completed' })],
      ['null-object', JSON.stringify({ id: 'evt_null_object', type: 'checkout.session.completed', data: { object: null } })],
    ]) {
      const reply = await post(payload)
      expect(reply.status, id).toBe(400)
    }
    expect(
      (await app.ctx.db.query(`SELECT id FROM stripe_events WHERE id IN ('evt_no_data', 'evt_null_object') AND problem IS NOT NULL`))
        .length,
    ).toBe(2)
  })
})

describe('guards for the studio’s clicks', () => {
  it('asks before starting a firing ahead of its posted date, naming the date', async () => {
    const firing = await freshFiring()
    await stage(firing.id, 'loading')
    const early = await stage(firing.id, 'firing', false)
    expect(early.status).toBe(409)
    expect(early.body.error.code).toBe('needs-confirmation')
    expect(early.body.error.message).toMatch(/This firing is posted for .+\. Start it now/)
    expect((await stage(firing.id, 'firing')).body.status).toBe('firing')
  })

  it('undoes the last stage move within ten minutes: the requests go back and nothing was sent', async () => {
    const firing = await freshFiring()
    const sent = await sendAndPayDeposit(app, owner.session, potter.session, firing.id, [mug({ quantity: 1 })])
    await owner.session.post(`/api/requests/${sent.id}/check-in`, { pieces: [{ pieceIndex: 0, received: 1 }] })
    const waiting = await draftAndSend(otherPotter.session, firing.id, [mug({ quantity: 1 })])
    for (const status of ['loading', 'firing', 'cooling']) await stage(firing.id, status)
    expect(await state(waiting.id)).toBe('lapsed')
    const unloaded = await stage(firing.id, 'unloaded')
    expect(unloaded.body.undo).toMatchObject({ from: 'cooling' })
    expect(await state(sent.id)).toBe('fired')
    const undone = await owner.session.post(`/api/firings/${firing.id}/undo`)
    expect(undone.status).toBe(200)
    expect(undone.body.status).toBe('cooling')
    expect(await state(sent.id)).toBe('received')
    expect((await view(potter, sent.id)).timeline.at(-1)).toMatchObject({
      from: 'fired',
      to: 'received',
      reason: expect.stringMatching(/^Undone/),
    })
    // The unloading mail was held back for the window and is gone with the undo.
    expect((await mailsFor('firing-progress', sent.id)).filter((m) => m.subject.startsWith('Unloaded'))).toEqual([])
    // Only the last move can be undone, once.
    expect((await owner.session.post(`/api/firings/${firing.id}/undo`)).status).toBe(409)
  })

  it('refuses an undo once the window has closed', async () => {
    const firing = await freshFiring()
    const actor = await app.ctx.db.getRepository(User).findOneByOrFail({ id: owner.id })
    await moveFiring(app.ctx, actor, firing.id, 'closed', { confirm: true })
    await expect(undoFiringMove(app.ctx, actor, firing.id, new Date(Date.now() + 11 * 60_000))).rejects.toMatchObject({ status: 409 })
  })
})

describe('one policy for who may do what', () => {
  it('offers an admin no request actions, and refuses an admin’s accept', async () => {
    const firing = await freshFiring()
    const sent = await draftAndSend(potter.session, firing.id, [mug({ quantity: 1 })])
    const seen = await view(admin, sent.id)
    expect(seen.viewer).toBe('admin')
    expect(seen.actions).toEqual([])
    expect((await admin.session.post(`/api/requests/${sent.id}/accept`)).status).toBe(403)
    expect((await admin.session.post(`/api/requests/${sent.id}/withdraw`, {})).status).toBe(403)
  })

  it('moves requests through the state machine when a firing is cancelled, with the timeline to show it', async () => {
    const firing = await freshFiring()
    const sent = await draftAndSend(potter.session, firing.id, [mug({ quantity: 1 })])
    await owner.session.post(`/api/requests/${sent.id}/accept`)
    await owner.session.post(`/api/firings/${firing.id}/cancel`, { reason: 'The relay failed' })
    const after = await view(potter, sent.id)
    expect(after.state).toBe('cancelled')
    expect(after.timeline.at(-1)).toMatchObject({ from: 'accepted', to: 'cancelled', reason: 'Firing called off: The relay failed' })
    expect((await noticesOf(potter)).items.some((n) => n.kind === 'firing-cancelled' && n.path === `/requests/${sent.id}`)).toBe(true)
  })

  it('stops asking for answers once both sides have answered', async () => {
    const firing = await freshFiring()
    const sent = await sendAndPayDeposit(app, owner.session, potter.session, firing.id, [mug({ quantity: 1 })])
    await owner.session.post(`/api/requests/${sent.id}/check-in`, { pieces: [{ pieceIndex: 0, received: 1 }] })
    for (const status of ['loading', 'firing', 'cooling', 'unloaded']) await stage(firing.id, status)
    await owner.session.post(`/api/requests/${sent.id}/results`, { outcomes: [{ pieceIndex: 0, outcome: 'fine' }] })
    await owner.session.post(`/api/requests/${sent.id}/ready`)
    await owner.session.post(`/api/requests/${sent.id}/balance/counter`, {})
    await owner.session.post(`/api/requests/${sent.id}/collected`)
    const rowOf = async (who: Person, as: string) =>
      (await who.session.get(`/api/requests?as=${as}`)).body.requests.find((r: { id: string }) => r.id === sent.id)
    expect((await rowOf(potter, 'potter')).actions).toContain('rate')
    expect((await rowOf(owner, 'studio')).actions).toContain('rate')
    const potterAnswers = { loading: 'yes', resultsAsLogged: 'yes', turnaround: 'yes', communication: 'yes', fireAgain: true }
    expect((await potter.session.post(`/api/requests/${sent.id}/review`, potterAnswers)).status).toBe(200)
    expect((await rowOf(potter, 'potter')).actions).not.toContain('rate')
    expect((await rowOf(owner, 'studio')).actions).toContain('rate')
    const studioAnswers = { asDeclared: 'yes', cleanAndDry: 'yes', onTime: 'yes', note: 'Clean feet, on time.' }
    expect((await owner.session.post(`/api/requests/${sent.id}/review`, studioAnswers)).status).toBe(200)
    expect((await rowOf(potter, 'potter')).actions).not.toContain('rate')
    expect((await rowOf(owner, 'studio')).actions).not.toContain('rate')
    expect((await view(potter, sent.id)).actions).not.toContain('rate')
  })
})

describe('notices', () => {
  it('lists newest first with an unread count, and marks some or all read', async () => {
    const before = await noticesOf(potter)
    expect(before.unread).toBeGreaterThan(0)
    const first = before.items[0]
    const some = await potter.session.post('/api/notices/read', { ids: [first.id] })
    expect(some.body.unread).toBe(before.unread - 1)
    expect((await potter.session.post('/api/notices/read', { all: true })).body.unread).toBe(0)
    expect((await potter.session.post('/api/notices/read', { ids: ['not-an-id'] })).status).toBe(400)
    // Another person's notices are not theirs to mark.
    const others = await noticesOf(owner)
    expect(others.unread).toBeGreaterThan(0)
    await potter.session.post('/api/notices/read', { ids: others.items.map((n) => n.id) })
    expect((await noticesOf(owner)).unread).toBe(others.unread)
    expect(await app.ctx.db.getRepository(Notice).countBy({ userId: potter.id })).toBeGreaterThan(0)
  })
})

describe('lock order', () => {
  it('races an accept against the firing’s cancellation 50 times: no 5xx, every request consistent, never oversold', async () => {
    const actor = await app.ctx.db.getRepository(User).findOneByOrFail({ id: owner.id })
    for (let i = 0; i < 50; i++) {
      const firing = await freshFiring({ layersOnSale: 1 })
      const requests = [
        await draftAndSend(potter.session, firing.id, [mug({ quantity: 1 })]),
        await draftAndSend(otherPotter.session, firing.id, [mug({ quantity: 1 })]),
      ]
      const outcomes = await Promise.allSettled([
        ...requests.map((r) => acceptRequest(app.ctx, actor, r.id)),
        cancelFiring(app.ctx, actor, firing.id, 'Race'),
      ])
      for (const outcome of outcomes) {
        if (outcome.status === 'rejected') expect((outcome.reason as { status?: number }).status, String(outcome.reason)).toBeLessThan(500)
      }
      // The cancellation always wins in the end; an accept before it is cancelled with it, one after it is refused.
      for (const r of requests) expect(['cancelled']).toContain(await state(r.id))
      const [{ held }] = await app.ctx.db.query(
        `SELECT coalesce(sum(volume_l), 0)::float8 AS held FROM firing_requests WHERE firing_id = $1 AND state IN ('accepted','deposit_paid')`,
        [firing.id],
      )
      expect(held).toBe(0)
    }
  }, 300_000)
})
