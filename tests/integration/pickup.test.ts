// From drop-off to pickup through the API: check-in (and refusal at the door), the firing moving
// its requests along, the log, results, ready, the balance, pickup, and the answers after it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { FiringRequest } from '../../server/entities/FiringRequest'
import { OutboundMail } from '../../server/entities/OutboundMail'
import { CARD_SUCCEEDS, submitCard } from '../support/checkout'
import { HttpSession } from '../support/http-client'
import { createPerson, type Person } from '../support/people'
import { mug, sendAndPayDeposit } from '../support/request-fixtures'
import { firingBody, publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let owner: Person
let potter: Person
let ids: { studioId: string; kilnId: string; firingId: string }

beforeAll(async () => {
  app = await startTestApp({ stripe: true })
  owner = await createPerson(app, 'host', 'Ravi Host')
  potter = await createPerson(app, 'potter', 'Sol Potter')
  ids = await publishedStudio(owner.session, 'Pickup Studio')
})

afterAll(async () => {
  await app?.close()
})

const state = async (id: string) => (await app.ctx.db.getRepository(FiringRequest).findOneByOrFail({ id })).state
const mailsFor = async (template: string, requestId: string) =>
  (await app.ctx.db.getRepository(OutboundMail).findBy({ template })).filter((m) => m.bodyText.includes(requestId))

async function newFiring() {
  return (await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody())).body.firings[0].id as string
}

const paid = (firingId: string, pieces = [mug()]) => sendAndPayDeposit(app, owner.session, potter.session, firingId, pieces)

async function move(firingId: string, ...statuses: string[]) {
  for (const status of statuses) {
    const reply = await owner.session.post(`/api/firings/${firingId}/stage`, { status, confirm: true })
    expect(reply.status, JSON.stringify(reply.body)).toBe(200)
  }
}

describe('the whole way, from drop-off to the answers after pickup', () => {
  it('checks in, fires, posts results, takes the balance, hands back and lets both sides answer', async () => {
    const firingId = await newFiring()
    const sent = await paid(firingId)

    // Drop-off: all four mugs, one chipped.
    const checkedIn = await owner.session.post(`/api/requests/${sent.id}/check-in`, {
      pieces: [{ pieceIndex: 0, received: 4 }],
      conditionNotes: 'One mug has a chipped rim',
    })
    expect(checkedIn.status, JSON.stringify(checkedIn.body)).toBe(200)
    expect(checkedIn.body.request).toMatchObject({
      state: 'received',
      checkIn: { conditionNotes: 'One mug has a chipped rim', refused: false },
    })
    const dropOff = await mailsFor('drop-off', sent.id)
    expect(dropOff).toHaveLength(1)
    expect(dropOff[0].bodyText).toContain('One mug has a chipped rim')
    expect(dropOff[0].bodyText).toContain('4 of 4 received')

    // The firing moves along; its requests follow, and unloading marks the ware fired.
    await move(firingId, 'closed', 'loading', 'firing', 'cooling')
    expect(await state(sent.id)).toBe('received')
    await move(firingId, 'unloaded')
    expect(await state(sent.id)).toBe('fired')
    const timeline = (await potter.session.get(`/api/requests/${sent.id}`)).body.timeline.map((e: { reason: string }) => e.reason)
    expect(timeline).toEqual(
      expect.arrayContaining(['Loaded into the kiln', 'The firing started', 'The kiln is cooling', 'The kiln was unloaded']),
    )

    // The log, seen by every potter in the firing on their request.
    // Log times are in the past (a log records what happened): loaded 40 hours ago, opened 8 hours ago.
    const hoursAgo = (hours: number) => new Date(Date.now() - hours * 3_600_000).toISOString()
    const log = await owner.session.put(`/api/firings/${firingId}/log`, {
      loadedAt: hoursAgo(40),
      startedAt: hoursAgo(38),
      // Orton's self-supporting chart: cone 6 at 1222 °C when the last 100 °C climb at 60 °C/h.
      peakC: 1222,
      finalRateCPerHour: 60,
      holdMinutes: 10,
      offAt: hoursAgo(26),
      openedAt: hoursAgo(8),
      witnessCones: [
        { cone: '5', bend: 'touching' },
        { cone: '6', bend: 'three-oclock' },
        { cone: '7', bend: 'standing' },
      ],
    })
    expect(log.status, JSON.stringify(log.body)).toBe(200)
    // The heat work of a 60 °C/h climb to 1222 °C and a 10-minute hold: cone 6 (the chart's 60 °C/h column).
    expect(log.body).toMatchObject({ totalHours: 12, coneCheck: { fromCones: '6', fromCurve: '6', agree: true, inconsistent: false } })
    expect((await potter.session.get(`/api/requests/${sent.id}`)).body.firingLog.coneCheck.fromCones).toBe('6')

    // Ready needs results first.
    expect((await owner.session.post(`/api/requests/${sent.id}/ready`)).body.error.code).toBe('results-missing')
    const results = await owner.session.post(`/api/requests/${sent.id}/results`, {
      outcomes: [{ pieceIndex: 0, outcome: 'fine', notes: 'Glaze broke nicely over the rims' }],
    })
    expect(results.body.results.outcomes[0].outcome).toBe('fine')
    const ready = await owner.session.post(`/api/requests/${sent.id}/ready`)
    expect(ready.body.state).toBe('ready')
    const owed = sent.quote.totalCents - sent.quote.depositCents
    expect(ready.body.price.balanceOwedCents).toBe(owed)
    const readyMail = await mailsFor('ready', sent.id)
    expect(readyMail[0].bodyText).toContain('Pickup hours')
    expect(readyMail[0].bodyText).toContain(new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' }).format(owed / 100))

    // Collection waits for the balance; the potter pays it on the hosted page.
    expect((await owner.session.post(`/api/requests/${sent.id}/collected`)).body.error.code).toBe('balance-owed')
    const balance = await potter.session.post(`/api/requests/${sent.id}/balance`)
    expect(balance.body.amountCents).toBe(owed)
    await submitCard(balance.body.checkoutUrl, { cardNumber: CARD_SUCCEEDS })
    await expect
      .poll(async () => (await potter.session.get(`/api/requests/${sent.id}`)).body.price.balanceOwedCents, { timeout: 60_000 })
      .toBe(0)
    const ledger = (await potter.session.get(`/api/requests/${sent.id}`)).body.ledger.map(
      (l: { kind: string; amountCents: number }) => `${l.kind}:${l.amountCents}`,
    )
    expect(ledger).toEqual([`deposit:${sent.quote.depositCents}`, `balance:${owed}`])

    const collected = await owner.session.post(`/api/requests/${sent.id}/collected`)
    expect(collected.body.state).toBe('collected')
    const pickup = await mailsFor('pickup', sent.id)
    expect(pickup).toHaveLength(1)
    expect(pickup[0].subject).toMatch(/receipt/)

    // Both sides answer; the studio's page shows the potter's answers.
    const potterAnswers = {
      loading: 'yes',
      resultsAsLogged: 'yes',
      turnaround: 'partly',
      communication: 'yes',
      fireAgain: true,
      note: 'Lovely even heat.',
    }
    expect((await potter.session.post(`/api/requests/${sent.id}/review`, potterAnswers)).status).toBe(200)
    const studioAnswers = { asDeclared: 'yes', cleanAndDry: 'yes', onTime: 'partly', note: 'On time, ware as described.' }
    expect((await owner.session.post(`/api/requests/${sent.id}/review`, studioAnswers)).status).toBe(200)
    const page = await new HttpSession(app.url).get(`/api/studios/${ids.studioId}/reviews`)
    expect(page.body.summary).toMatchObject({ count: 1, fireAgain: 1, questions: { turnaround: { yes: 0, partly: 1, no: 0 } } })
    expect(page.body.reviews[0]).toMatchObject({ loading: 'yes', fireAgain: true, note: 'Lovely even heat.', author: 'Sol' })
  }, 90_000)
})

describe('drop-off', () => {
  it('re-prices measured ware; a higher price waits for the potter to confirm, and the balance follows it', async () => {
    const firingId = await newFiring()
    const sent = await paid(firingId)
    const checkedIn = await owner.session.post(`/api/requests/${sent.id}/check-in`, {
      pieces: [{ pieceIndex: 0, received: 4, measured: { heightMm: 140, widthMm: 100, depthMm: 120 } }],
    })
    expect(checkedIn.body.needsConfirmation).toBe(true)
    expect(checkedIn.body.priceAfterCents).toBeGreaterThan(sent.quote.totalCents)
    expect(checkedIn.body.request.actions).not.toContain('confirm-price')
    const potterView = (await potter.session.get(`/api/requests/${sent.id}`)).body
    expect(potterView.actions).toContain('confirm-price')
    // Until confirmed, the declared price stands.
    expect(potterView.price.balanceOwedCents).toBe(sent.quote.totalCents - sent.quote.depositCents)
    await potter.session.post(`/api/requests/${sent.id}/confirm-price`)
    expect((await potter.session.get(`/api/requests/${sent.id}`)).body.price.balanceOwedCents).toBe(
      checkedIn.body.priceAfterCents - sent.quote.depositCents,
    )
  })

  it('takes a lower price without asking', async () => {
    const firingId = await newFiring()
    const sent = await paid(firingId)
    const checkedIn = await owner.session.post(`/api/requests/${sent.id}/check-in`, { pieces: [{ pieceIndex: 0, received: 2 }] })
    expect(checkedIn.body.needsConfirmation).toBe(false)
    expect(checkedIn.body.priceAfterCents).toBeLessThan(sent.quote.totalCents)
    expect((await potter.session.get(`/api/requests/${sent.id}`)).body.price.balanceOwedCents).toBe(
      Math.max(0, checkedIn.body.priceAfterCents - sent.quote.depositCents),
    )
  })

  it('records ware refused at the door with its reason and handles it under the studio’s terms', async () => {
    const firingId = await newFiring()
    const sent = await paid(firingId)
    const refused = await owner.session.post(`/api/requests/${sent.id}/check-in`, {
      pieces: [],
      refuse: { reason: 'Still damp and cold to the touch' },
    })
    expect(refused.body.refused).toBe(true)
    expect(refused.body.request).toMatchObject({
      state: 'cancelled',
      checkIn: { refused: true, refusedReason: 'Still damp and cold to the touch' },
    })
    expect((await mailsFor('ware-refused', sent.id))[0].bodyText).toContain('Still damp')
  })

  it('lapses ware never dropped off once loading starts', async () => {
    const firingId = await newFiring()
    const sent = await paid(firingId)
    await move(firingId, 'loading')
    expect(await state(sent.id)).toBe('cancelled')
    expect(await mailsFor('no-show', sent.id)).toHaveLength(1)
    expect((await owner.session.get(`/api/requests/${sent.id}`)).body.potter.record.noShows).toBeGreaterThanOrEqual(1)
  })

  it('keeps check-in to the studio', async () => {
    const firingId = await newFiring()
    const sent = await paid(firingId)
    expect((await potter.session.post(`/api/requests/${sent.id}/check-in`, { pieces: [{ pieceIndex: 0, received: 4 }] })).status).toBe(403)
  })
})
