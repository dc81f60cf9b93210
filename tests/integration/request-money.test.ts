// Space and money: the capacity race, the deposit through the Stripe SDK and its webhooks (signature,
// replay, reordering), the deposit hold running out, and refunds under the studio's terms.
import { createHmac } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { refundUnderTerms } from '../../shared/refunds'
import { expireDepositHold } from '../../server/services/requests'
import { FiringRequest } from '../../server/entities/FiringRequest'
import { LedgerEntry } from '../../server/entities/LedgerEntry'
import { OutboundMail } from '../../server/entities/OutboundMail'
import { CARD_DECLINED, CARD_SUCCEEDS, submitCard } from '../support/checkout'
import { HttpSession } from '../support/http-client'
import { createPerson, type Person } from '../support/people'
import { draftAndSend, mug, sendAndPayDeposit } from '../support/request-fixtures'
import { firingBody, publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let owner: Person
let potter: Person
let ids: { studioId: string; kilnId: string; firingId: string }

beforeAll(async () => {
  app = await startTestApp({ stripe: true })
  owner = await createPerson(app, 'host', 'Hal Host')
  potter = await createPerson(app, 'potter', 'Ivy Potter')
  ids = await publishedStudio(owner.session, 'Money Studio')
})

afterAll(async () => {
  await app?.close()
})

const state = async (id: string) => (await app.ctx.db.getRepository(FiringRequest).findOneByOrFail({ id })).state

const paidRequest = (firingId = ids.firingId) => sendAndPayDeposit(app, owner.session, potter.session, firingId)

describe('capacity is never oversold', () => {
  it('with 50 accepts racing for the last space, exactly the space there is gets accepted', async () => {
    // 50 requests of one mug each (100 × 90 × 115 mm) into a firing offering one layer (one 660 mm round
    // shelf): fewer than 50 fit, and every one taken on must have its place in the load plan.
    const firing = (await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody({ layersOnSale: 1 }))).body.firings[0]
    const requests = []
    for (let i = 0; i < 50; i++) requests.push(await draftAndSend(potter.session, firing.id, [mug({ quantity: 1 })]))
    const replies = await Promise.all(requests.map((r) => owner.session.post(`/api/requests/${r.id}/accept`)))
    const accepted = replies.filter((r) => r.status === 200)
    const refused = replies.filter((r) => r.status === 409)
    expect(accepted.length).toBeGreaterThan(0)
    expect(refused).toHaveLength(50 - accepted.length)
    expect(refused.length).toBeGreaterThan(0)
    expect(refused.every((r) => r.body.error.code === 'no-space')).toBe(true)
    const plan = (await owner.session.get(`/api/firings/${firing.id}/load-plan`)).body
    const placed = plan.layers.flatMap((l: { shelves: { pieces: unknown[] }[] }) => l.shelves.flatMap((s) => s.pieces))
    expect(placed).toHaveLength(accepted.length)
    expect(plan.layers).toHaveLength(1)
    expect(plan.unplaced).toEqual([])
    expect(plan.problems).toEqual([])
    // Asked again once the race is over, a refused one is still refused: the load is full.
    const retry = await owner.session.post(`/api/requests/${requests[replies.findIndex((r) => r.status === 409)].id}/accept`)
    expect(retry.status).toBe(409)
  }, 300_000)
})

describe('the deposit', () => {
  it('is paid on the hosted page with 4242…; the webhook marks it paid, books the ledger and mails both sides', async () => {
    const sent = await paidRequest()
    const view = (await potter.session.get(`/api/requests/${sent.id}`)).body
    expect(view.state).toBe('deposit_paid')
    expect(view.ledger).toEqual([
      expect.objectContaining({
        direction: 'in',
        kind: 'deposit',
        amountCents: sent.quote.depositCents,
        currency: 'USD',
        stripeSessionId: expect.stringMatching(/^cs_test_/),
        stripePaymentIntentId: expect.stringMatching(/^pi_/),
      }),
    ])
    const mails = await app.ctx.db.getRepository(OutboundMail).findBy({ template: 'payment-received' })
    expect(
      mails
        .filter((m) => m.bodyText.includes(sent.id))
        .map((m) => m.toAddress)
        .sort(),
    ).toEqual([owner.email, potter.email].sort())
  })

  it('stays unpaid after a declined card, with the reason on the request', async () => {
    const sent = await draftAndSend(potter.session, ids.firingId, [mug({ quantity: 1 })])
    await owner.session.post(`/api/requests/${sent.id}/accept`)
    const deposit = await potter.session.post(`/api/requests/${sent.id}/deposit`)
    const declined = await submitCard(deposit.body.checkoutUrl, { cardNumber: CARD_DECLINED })
    expect(declined.status).toBe(402)
    await app.stripe!.idle()
    await expect
      .poll(async () => (await potter.session.get(`/api/requests/${sent.id}`)).body.payments[0].failureMessage, { timeout: 60_000 })
      .toMatch(/declined/i)
    expect(await state(sent.id)).toBe('accepted')
    expect((await potter.session.get(`/api/requests/${sent.id}`)).body.ledger).toEqual([])
  })

  it('uses the same open checkout page when asked twice', async () => {
    const sent = await draftAndSend(potter.session, ids.firingId, [mug({ quantity: 1 })])
    await owner.session.post(`/api/requests/${sent.id}/accept`)
    const a = await potter.session.post(`/api/requests/${sent.id}/deposit`)
    const b = await potter.session.post(`/api/requests/${sent.id}/deposit`)
    expect(a.body.checkoutUrl).toBe(b.body.checkoutUrl)
  })
})

describe('webhooks', () => {
  const sign = (payload: string, secret = 'whsec_conewright_tests', t = Math.floor(Date.now() / 1000)) =>
    `t=${t},v1=${createHmac('sha256', secret).update(`${t}.${payload}`).digest('hex')}`
  const post = (payload: string, signature?: string) =>
    fetch(`${app.url}/api/webhooks/stripe`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', ...(signature ? { 'Stripe-Signature': signature } : {}) },
      body: payload,
    })

  it('rejects a missing or wrong signature with 400 and changes nothing', async () => {
    const payload = JSON.stringify({ id: 'evt_forged', object: 'event', type: 'checkout.session.completed', data: { object: {} } })
    expect((await post(payload)).status).toBe(400)
    expect((await post(payload, sign(payload, 'whsec_someone_else'))).status).toBe(400)
    expect((await post(payload, sign(payload + ' '))).status).toBe(400)
    expect(await app.ctx.db.query(`SELECT 1 FROM stripe_events WHERE id = 'evt_forged'`)).toEqual([])
  })

  it('handles a replayed event once: the ledger books the deposit a single time', async () => {
    const sent = await paidRequest()
    const events = app
      .stripe!.events()
      .filter(
        (e) =>
          e.type === 'checkout.session.completed' &&
          (e.data.object as { metadata?: { requestId?: string } }).metadata?.requestId === sent.id,
      )
    expect(events).toHaveLength(1)
    const payload = JSON.stringify(events[0])
    for (let i = 0; i < 3; i++) {
      const replay = await post(payload, sign(payload))
      expect(replay.status).toBe(200)
      expect((await replay.json()).duplicate).toBe(true)
    }
    expect(await app.ctx.db.getRepository(LedgerEntry).countBy({ requestId: sent.id, direction: 'in' })).toBe(1)
  })

  it('copes with events out of order: a late completion after the hold was released is refunded in full', async () => {
    const sent = await draftAndSend(potter.session, ids.firingId, [mug({ quantity: 1 })])
    await owner.session.post(`/api/requests/${sent.id}/accept`)
    const deposit = await potter.session.post(`/api/requests/${sent.id}/deposit`)
    // The potter pays at Stripe, but the completion reaches Conewright only after the hold ran out: its
    // webhook waits on a lock the test holds on the event table while the hold lapses. (Paying after the
    // lapse instead would race the queued expiry of the checkout page, which Stripe would then refuse.)
    const holder = app.ctx.db.createQueryRunner()
    await holder.connect()
    await holder.startTransaction()
    try {
      await holder.query('LOCK TABLE stripe_events IN EXCLUSIVE MODE')
      expect((await submitCard(deposit.body.checkoutUrl, { cardNumber: CARD_SUCCEEDS })).status).toBe(303)
      await app.ctx.db.query(`UPDATE firing_requests SET deposit_due_at = now() - interval '1 minute' WHERE id = $1`, [sent.id])
      expect(await expireDepositHold(app.ctx, sent.id)).toBe(true)
      expect(await state(sent.id)).toBe('lapsed')
    } finally {
      await holder.rollbackTransaction()
      await holder.release()
    }
    await app.stripe!.idle()
    await expect
      .poll(
        async () => {
          const ledger = (await potter.session.get(`/api/requests/${sent.id}`)).body.ledger as { direction: string; amountCents: number }[]
          return ledger.map((l) => `${l.direction}:${l.amountCents}`)
        },
        { timeout: 60_000 },
      )
      .toEqual([`in:${sent.quote.depositCents}`, `out:${sent.quote.depositCents}`])
    expect(await state(sent.id)).toBe('lapsed')
  })
})

describe('the deposit hold', () => {
  it('releases the space of an unpaid accepted request when it runs out, and tells both sides', async () => {
    const firing = (await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody())).body.firings[0]
    const sent = await draftAndSend(potter.session, firing.id, [mug()])
    await owner.session.post(`/api/requests/${sent.id}/accept`)
    expect((await new HttpSession(app.url).get(`/api/firings/${firing.id}`)).body.space.shelvesTaken).toBeGreaterThan(0)
    // Not yet due: nothing happens.
    expect(await expireDepositHold(app.ctx, sent.id)).toBe(false)
    // The queued job, brought forward to now, releases it.
    await app.ctx.db.query(`UPDATE firing_requests SET deposit_due_at = now() - interval '1 second' WHERE id = $1`, [sent.id])
    await app.ctx.db.query(`UPDATE graphile_worker._private_jobs SET run_at = now() WHERE key = $1`, [`deposit-expiry:${sent.id}`])
    await expect.poll(() => state(sent.id), { timeout: 60_000 }).toBe('lapsed')
    expect((await new HttpSession(app.url).get(`/api/firings/${firing.id}`)).body.space.shelvesTaken).toBe(0)
    const mails = (await app.ctx.db.getRepository(OutboundMail).findBy({ template: 'lapsed' })).filter((m) => m.bodyText.includes(sent.id))
    expect(mails.map((m) => m.toAddress).sort()).toEqual([owner.email, potter.email].sort())
    const view = (await potter.session.get(`/api/requests/${sent.id}`)).body
    expect(view.timeline.at(-1)).toMatchObject({ to: 'lapsed', by: 'Conewright' })
  })
})

describe('refunds', () => {
  const terms = { fullRefundDaysBefore: 7, laterRefundPercent: 50 }
  const firingDate = new Date('2027-03-20T17:00:00Z')

  it.each([
    // Exactly N days before still counts as "until N days before": full refund.
    ['8 days before', '2027-03-12T17:00:00Z', 2500],
    ['exactly 7 days before', '2027-03-13T17:00:00Z', 2500],
    ['one second later', '2027-03-13T17:00:01Z', 1250],
    ['the day before', '2027-03-19T17:00:00Z', 1250],
  ])('of a 25.00 deposit withdrawn %s (at %s) is %i cents', (_when, now, cents) => {
    expect(refundUnderTerms(2500, firingDate, terms, new Date(now)).refundCents).toBe(cents)
  })

  it('rounds a percentage share half up to the cent', () => {
    // 33 % of 1.55 = 0.5115 → 0.51; of 1.50 = 0.495 → 0.50.
    expect(
      refundUnderTerms(155, firingDate, { fullRefundDaysBefore: 0, laterRefundPercent: 33 }, new Date('2027-03-20T18:00:00Z')).refundCents,
    ).toBe(51)
    expect(
      refundUnderTerms(150, firingDate, { fullRefundDaysBefore: 0, laterRefundPercent: 33 }, new Date('2027-03-20T18:00:00Z')).refundCents,
    ).toBe(50)
  })

  it('refunds a withdrawal under the studio’s terms, through Stripe, into the ledger', async () => {
    // The fixture firing is 7 days out; push the full-refund window past it so the later share applies.
    await owner.session.patch(`/api/studios/${ids.studioId}`, {
      policies: {
        clayBodies: ['stoneware'],
        wareRequirements: 'Bisqued',
        cancellation: { fullRefundDaysBefore: 30, laterRefundPercent: 40 },
        depositHoldHours: 48,
      },
    })
    const sent = await paidRequest()
    const withdrawn = await potter.session.post(`/api/requests/${sent.id}/withdraw`, { reason: 'Cracked in the bisque' })
    expect(withdrawn.body.state).toBe('withdrawn')
    const expected = Math.floor((sent.quote.depositCents * 40) / 100 + 0.5)
    await expect
      .poll(
        async () =>
          (await potter.session.get(`/api/requests/${sent.id}`)).body.ledger
            .filter((l: { direction: string }) => l.direction === 'out')
            .map((l: { amountCents: number; stripeRefundId: string }) => [l.amountCents, l.stripeRefundId.slice(0, 3)]),
        { timeout: 60_000 },
      )
      .toEqual([[expected, 're_']])
    await expect
      .poll(
        async () =>
          (await app.ctx.db.getRepository(OutboundMail).findBy({ template: 'refunded', toAddress: potter.email })).some((m) =>
            m.bodyText.includes(sent.id),
          ),
        { timeout: 60_000 },
      )
      .toBe(true)
  })

  it('refunds in full when the studio calls off a paid request', async () => {
    const sent = await paidRequest()
    const cancelled = await owner.session.post(`/api/requests/${sent.id}/decline`, { reason: 'Our kiln needs new elements' })
    expect(cancelled.body.state).toBe('cancelled')
    await expect
      .poll(async () => (await potter.session.get(`/api/requests/${sent.id}`)).body.price, { timeout: 60_000 })
      .toMatchObject({ paidInCents: sent.quote.depositCents, refundedCents: sent.quote.depositCents, netPaidCents: 0 })
  })

  it('refunds in full when the studio cancels the firing', async () => {
    const firing = (await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody())).body.firings[0]
    const sent = await paidRequest(firing.id)
    await owner.session.post(`/api/firings/${firing.id}/cancel`, { reason: 'Power cut for the week' })
    expect(await state(sent.id)).toBe('cancelled')
    await expect
      .poll(async () => (await potter.session.get(`/api/requests/${sent.id}`)).body.price.refundedCents, { timeout: 60_000 })
      .toBe(sent.quote.depositCents)
  })
})

describe('the SDK talks to the stand-in as it would to Stripe', () => {
  it('sends every call to Stripe’s own paths with idempotency keys', async () => {
    const calls = app.stripe!.requests()
    expect(calls.length).toBeGreaterThan(0)
    for (const call of calls)
      expect(call.path).toMatch(/^\/v1\/(checkout\/sessions|refunds|payment_intents|charges|events|transfers|accounts|account_links)(\/|$)/)
    const creates = calls.filter((c) => c.method === 'POST' && (c.path === '/v1/checkout/sessions' || c.path === '/v1/refunds'))
    expect(creates.length).toBeGreaterThan(0)
    expect(creates.every((c) => typeof c.idempotencyKey === 'string' && c.idempotencyKey.length > 0)).toBe(true)
  })
})
