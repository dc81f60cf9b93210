// Paying studios through the API, the Stripe stand-in and the queue: onboarding on the hosted page and
// the account.updated webhook, who may see and change it, the studio's share transferred at collection
// less the fee (10 % with a $1.00 minimum, set here), a refund after the transfer taking back the
// studio's part, a studio that never onboarded accruing and paid once it does, a dispute holding the
// share until the desk settles it, and the monthly statement.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { marketplaceFee } from '../../shared/payouts'
import { PayoutAccount } from '../../server/entities/PayoutAccount'
import { HttpSession } from '../support/http-client'
import { checkInAll, collected, fireThrough, moneyQuiet, onboard, payBalanceOnline, resultsAndReady, stripeOf } from '../support/money'
import { VERIFIED_PERSON } from '../support/onboarding'
import { createPerson, type Person } from '../support/people'
import { mug, sendAndPayDeposit } from '../support/request-fixtures'
import { firingBody, publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let owner: Person
let crew: Person
let potter: Person
let admin: Person
let ids: { studioId: string; kilnId: string; firingId: string }
const FEE = { percentBp: 1_000, minimumCents: 100 }

beforeAll(async () => {
  app = await startTestApp({ stripe: true, config: { marketplaceFee: { percent: 10, minimumCents: 100 }, payoutHoldHours: 0 } })
  owner = await createPerson(app, 'host', 'Ada Owner')
  potter = await createPerson(app, 'potter', 'Bo Potter')
  admin = await createPerson(app, 'admin', 'Desk Person')
  crew = await createPerson(app, 'crew', 'Cy Crew')
  ids = await publishedStudio(owner.session, 'Payout Studio')
  await app.ctx.db.query(`INSERT INTO studio_members (studio_id, user_id, role) VALUES ($1, $2, 'crew')`, [ids.studioId, crew.id])
})

afterAll(async () => {
  await app?.close()
})

const payouts = async (session: HttpSession, studioId = ids.studioId) => (await session.get(`/api/studios/${studioId}/payouts`)).body

/** A request of four mugs, paid online in full and collected: deposit, check-in, firing, results, balance, pickup. */
async function collectedRequest(studio: HttpSession, firingId: string) {
  const sent = await sendAndPayDeposit(app, studio, potter.session, firingId, [mug()])
  await checkInAll(studio, sent.id, [4])
  await fireThrough(studio, firingId)
  await resultsAndReady(studio, sent.id)
  await payBalanceOnline(app, potter.session, sent.id)
  await collected(studio, sent.id)
  return sent
}

describe('the payout account', () => {
  it('is the owner’s alone: crew get a 403, a potter is not a member, nobody signed out gets in', async () => {
    expect((await crew.session.get(`/api/studios/${ids.studioId}/payouts`)).status).toBe(403)
    expect((await crew.session.post(`/api/studios/${ids.studioId}/payouts/onboarding`)).status).toBe(403)
    expect((await crew.session.get(`/api/studios/${ids.studioId}/statements/2026.csv`)).status).toBe(403)
    expect([403, 404]).toContain((await potter.session.get(`/api/studios/${ids.studioId}/payouts`)).status)
    expect((await new HttpSession(app.url).get(`/api/studios/${ids.studioId}/payouts`)).status).toBe(401)
  })

  it('starts not set up, in plain words', async () => {
    const money = await payouts(owner.session)
    expect(money.account).toMatchObject({ state: 'none', title: 'Payouts are not set up' })
    expect(money.fee).toMatchObject({ percent: 10, minimumCents: 100 })
  })

  it('opens Stripe’s hosted onboarding; the webhook says what is still due; finishing turns payouts on', async () => {
    const start = await owner.session.post(`/api/studios/${ids.studioId}/payouts/onboarding`)
    expect(start.status).toBe(200)
    expect(start.body.url).toMatch(/\/connect\/onboarding\//)
    const row = await app.ctx.db.getRepository(PayoutAccount).findOneByOrFail({ studioId: ids.studioId })
    expect(row.stripeAccountId).toMatch(/^acct_/)
    expect((await payouts(owner.session)).account.state).toBe('incomplete')

    // Another date of birth: Stripe asks for an identity document (stand-in test value).
    await onboard(app, owner.session, ids.studioId, { ...VERIFIED_PERSON, dob: '1980-02-02' })
    await expect.poll(async () => (await payouts(owner.session)).account.state).toBe('needs-info')
    expect((await payouts(owner.session)).account.due).toEqual(['a photo of an identity document'])

    // Asking twice makes no second account.
    await onboard(app, owner.session, ids.studioId, { document: 'file_identity_document_success' })
    await expect.poll(async () => (await payouts(owner.session)).account.state).toBe('ready')
    expect(await app.ctx.db.getRepository(PayoutAccount).countBy({ studioId: ids.studioId })).toBe(1)
    expect((await payouts(owner.session)).account).toMatchObject({ bankLast4: '6789', payoutsEnabled: true })
    expect((await app.ctx.db.getRepository(PayoutAccount).findOneByOrFail({ studioId: ids.studioId })).stripeAccountId).toBe(
      row.stripeAccountId,
    )
  })

  it('refuses a forged Connect webhook and one signed with the platform endpoint’s secret', async () => {
    const body = JSON.stringify({
      id: 'evt_forged_connect',
      object: 'event',
      type: 'account.updated',
      created: 1,
      data: { object: { id: 'acct_1x' } },
    })
    const unsigned = await fetch(`${app.url}/api/webhooks/stripe-connect`, {
      method: 'POST',
      body,
      headers: { 'Content-Type': 'application/json' },
    })
    expect(unsigned.status).toBe(400)
    const stripe = stripeOf(app)
    const platformSigned = stripe.webhooks.generateTestHeaderString({ payload: body, secret: 'whsec_conewright_tests' })
    const wrong = await fetch(`${app.url}/api/webhooks/stripe-connect`, {
      method: 'POST',
      body,
      headers: { 'Content-Type': 'application/json', 'Stripe-Signature': platformSigned },
    })
    expect(wrong.status).toBe(400)
  })
})

describe('money follows the ware', () => {
  let requestId = ''
  let total = 0

  it('transfers the studio’s share at collection, less the fee, from the request’s own charges', async () => {
    const sent = await collectedRequest(owner.session, ids.firingId)
    requestId = sent.id
    total = sent.quote.totalCents
    await moneyQuiet(app)
    const fee = marketplaceFee(total, FEE)
    const money = await payouts(owner.session)
    const row = money.firings.find((f: { requestId: string }) => f.requestId === sent.id)
    expect(row).toMatchObject({
      grossCents: total,
      feeCents: fee,
      netCents: total - fee,
      transferredCents: total - fee,
      pendingCents: 0,
      stage: 'earned',
    })
    expect(
      money.transfers
        .filter((t: { requestId: string }) => t.requestId === sent.id)
        .reduce((n: number, t: { amountCents: number }) => n + t.amountCents, 0),
    ).toBe(total - fee)

    // Stripe's own record agrees: every transfer comes from one of this request's charges, none past it.
    const stripe = stripeOf(app)
    const transfers = await stripe.transfers.list({ transfer_group: `request:${sent.id}` })
    expect(transfers.data.reduce((n, t) => n + t.amount - t.amount_reversed, 0)).toBe(total - fee)
    const account = (await app.ctx.db.getRepository(PayoutAccount).findOneByOrFail({ studioId: ids.studioId })).stripeAccountId
    for (const transfer of transfers.data) {
      expect(transfer.destination).toBe(account)
      const charge = await stripe.charges.retrieve(transfer.source_transaction as string)
      expect(charge.transfer_group).toBe(`request:${sent.id}`)
      expect(transfer.amount).toBeLessThanOrEqual(charge.amount)
    }
    const notices = await app.ctx.db.query(`SELECT user_id FROM notices WHERE request_id = $1 AND kind = 'payout-transferred'`, [sent.id])
    expect(notices.map((n: { user_id: string }) => n.user_id)).toEqual([owner.id])
  })

  it('takes back the studio’s part when the desk refunds after the transfer; the fee shrinks with what was kept', async () => {
    const refund = Math.floor(total / 2)
    const reply = await admin.session.post(`/api/admin/requests/${requestId}/refund`, { amountCents: refund, reason: 'Two mugs cracked' })
    expect(reply.status).toBe(202)
    await moneyQuiet(app)
    const kept = total - refund
    const fee = marketplaceFee(kept, FEE)
    const money = await payouts(owner.session)
    const row = money.firings.find((f: { requestId: string }) => f.requestId === requestId)
    expect(row).toMatchObject({ refundsCents: refund, feeCents: fee, transferredCents: kept - fee, pendingCents: 0 })
    const reversed = money.transfers
      .filter((t: { requestId: string }) => t.requestId === requestId)
      .reduce((n: number, t: { reversedCents: number }) => n + t.reversedCents, 0)
    expect(reversed).toBe(total - marketplaceFee(total, FEE) - (kept - fee))
    const notices = await app.ctx.db.query(`SELECT count(*)::int AS n FROM notices WHERE request_id = $1 AND kind = 'payout-reversed'`, [
      requestId,
    ])
    expect(notices[0].n).toBe(1)
  })

  it('lists the bank payouts Stripe reports for the studio’s account', async () => {
    app.stripe!.runPayouts()
    await app.stripe!.idle()
    await expect.poll(async () => (await payouts(owner.session)).payouts.length).toBeGreaterThan(0)
    expect((await payouts(owner.session)).payouts[0]).toMatchObject({ status: 'in_transit', currency: 'USD' })
  })

  it('writes the month’s statement as CSV, with a total line, and refuses a period that is not one', async () => {
    const month = new Intl.DateTimeFormat('en-CA', { timeZone: 'America/Los_Angeles', year: 'numeric', month: '2-digit' })
      .format(new Date())
      .slice(0, 7)
    const csv = await owner.session.get(`/api/studios/${ids.studioId}/statements/${month}.csv`)
    expect(csv.status).toBe(200)
    expect(csv.headers.get('content-type')).toContain('text/csv')
    expect(csv.headers.get('content-disposition')).toContain(`payout-studio-${month}.csv`)
    const lines = (csv.body as string).trim().split('\r\n')
    expect(lines[0]).toBe(
      'Earned on,Request,Potter,Firing date,Kiln,State,Currency,Paid in,Refunded,Conewright fee,Net,Taken at the counter,Transferred,Still held',
    )
    expect(lines.some((line) => line.includes(requestId))).toBe(true)
    expect(lines.at(-1)).toMatch(/^Total,/)
    const year = await owner.session.get(`/api/studios/${ids.studioId}/statements/${month.slice(0, 4)}.csv`)
    expect((year.body as string).includes(requestId)).toBe(true)
    for (const bad of ['2026-13', 'last-month', '26']) {
      const refused = await owner.session.get(`/api/studios/${ids.studioId}/statements/${bad}.csv`)
      expect(refused.status, bad).toBe(400)
      expect(refused.body.error.fields.period).toBeTruthy()
    }
  })
})

describe('a studio that has not onboarded', () => {
  let other: Person
  let otherIds: { studioId: string; kilnId: string; firingId: string }

  it('is refused nothing, accrues what it earns, and is paid once it onboards', async () => {
    other = await createPerson(app, 'host', 'Dee Late')
    otherIds = await publishedStudio(other.session, 'Late Studio')
    const sent = await collectedRequest(other.session, otherIds.firingId)
    await moneyQuiet(app)
    const fee = marketplaceFee(sent.quote.totalCents, FEE)
    const before = await payouts(other.session, otherIds.studioId)
    expect(before.account.state).toBe('none')
    expect(before.balance.owedCents).toBe(sent.quote.totalCents - fee)
    expect(before.transfers).toEqual([])
    expect(before.firings[0]).toMatchObject({ stageWords: 'Waiting for your payout account', pendingCents: sent.quote.totalCents - fee })
    const waiting = await app.ctx.db.query(`SELECT count(*)::int AS n FROM notices WHERE request_id = $1 AND kind = 'payout-waiting'`, [
      sent.id,
    ])
    expect(waiting[0].n).toBe(1)

    await onboard(app, other.session, otherIds.studioId)
    await expect.poll(async () => (await payouts(other.session, otherIds.studioId)).account.state).toBe('ready')
    await moneyQuiet(app)
    const after = await payouts(other.session, otherIds.studioId)
    expect(after.balance).toMatchObject({ owedCents: 0, transferredCents: sent.quote.totalCents - fee, feeCents: fee })
  })
})

describe('a dispute', () => {
  it('holds the studio’s share until the desk settles it, then sends what the studio keeps', async () => {
    const firing = (await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody())).body.firings[0].id as string
    const sent = await sendAndPayDeposit(app, owner.session, potter.session, firing, [mug()])
    await checkInAll(owner.session, sent.id, [4])
    await fireThrough(owner.session, firing)
    await resultsAndReady(owner.session, sent.id)
    await payBalanceOnline(app, potter.session, sent.id)
    const disputed = await potter.session.post(`/api/requests/${sent.id}/dispute`, {
      reason: 'Glaze ran onto the shelf and took a mug with it',
    })
    expect(disputed.status).toBe(200)
    await moneyQuiet(app)
    const held = (await payouts(owner.session)).firings.find((f: { requestId: string }) => f.requestId === sent.id)
    expect(held).toMatchObject({ stage: 'dispute', transferredCents: 0, pendingCents: sent.quote.totalCents, feeCents: 0 })

    const refund = 1_000
    await admin.session.post(`/api/admin/requests/${sent.id}/refund`, { amountCents: refund, reason: 'One mug lost' })
    await moneyQuiet(app)
    expect((await potter.session.post(`/api/admin/requests/${sent.id}/settle`, { note: 'x' })).status).toBe(403)
    const settled = await admin.session.post(`/api/admin/requests/${sent.id}/settle`, { note: 'One mug refunded; the rest stands' })
    expect(settled.status).toBe(200)
    expect((await admin.session.post(`/api/admin/requests/${sent.id}/settle`, { note: '' })).status).toBe(409)
    await moneyQuiet(app)
    const kept = sent.quote.totalCents - refund
    const row = (await payouts(owner.session)).firings.find((f: { requestId: string }) => f.requestId === sent.id)
    expect(row).toMatchObject({
      stage: 'earned',
      feeCents: marketplaceFee(kept, FEE),
      transferredCents: kept - marketplaceFee(kept, FEE),
      pendingCents: 0,
    })
  })
})
