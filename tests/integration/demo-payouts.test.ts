// The demo's money, made through the Stripe stand-in after the seed: the community studio has finished
// onboarding and its collected past firing is transferred less the fee; the gas works has not onboarded
// and its money page shows what it is owed; the ledger balances over the whole demo, and running the
// demo's money step again changes nothing.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { marketplaceFee } from '../../shared/payouts'
import { seedDemoPayouts } from '../../server/db/demo-payouts'
import { DEMO_PASSWORD, seedDemo } from '../../server/db/seed'
import { HttpSession } from '../support/http-client'
import { checkLedgers } from '../support/ledger'
import { moneyQuiet } from '../support/money'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
const FEE = { percentBp: 1_000, minimumCents: 100 }

beforeAll(async () => {
  app = await startTestApp({ stripe: true, config: { marketplaceFee: { percent: 10, minimumCents: 100 }, payoutHoldHours: 0 } })
  await seedDemo(app.ctx)
  await seedDemoPayouts(app.ctx)
  await moneyQuiet(app)
}, 240_000)

afterAll(async () => {
  await app?.close()
})

async function signedIn(email: string) {
  const session = new HttpSession(app.url)
  expect((await session.signIn(email, DEMO_PASSWORD)).status).toBe(200)
  return session
}

async function moneyOf(email: string, studio: string) {
  const session = await signedIn(email)
  const [{ id }] = await app.ctx.db.query(`SELECT id FROM studios WHERE name = $1`, [studio])
  return (await session.get(`/api/studios/${id}/payouts`)).body
}

describe('the demo’s money', () => {
  it('has the community studio onboarded and its collected past firings transferred, less the fee', async () => {
    const money = await moneyOf('marisol.okafor@demo.conewright.test', 'Alder Street Clay Commons')
    expect(money.account.state).toBe('ready')
    type Earning = { state: string; grossCents: number; atCounterCents: number; potterName: string }
    // Wren's mugs, paid by card; Theo's jars, paid at the counter, with the incident's cleaning fee paid by card.
    const byCard = money.firings.find((f: Earning) => f.state === 'collected' && f.potterName === 'Wren Alvarado')
    const fee = marketplaceFee(byCard.grossCents, FEE)
    expect(byCard).toMatchObject({ stage: 'earned', feeCents: fee, transferredCents: byCard.grossCents - fee, pendingCents: 0 })
    const jars = money.firings.find((f: Earning) => f.state === 'collected' && f.potterName === 'Theo Marsh')
    const claimFee = marketplaceFee(4500, FEE)
    expect(jars).toMatchObject({ stage: 'earned', feeCents: claimFee, transferredCents: 4500 - claimFee, pendingCents: 0 })
    // One transfer from each charge (the mugs' deposit and balance, the jars' claim): source_transaction
    // ties a transfer to a single charge.
    expect(money.transfers).toHaveLength(3)
    expect(money.transfers.reduce((n: number, t: { amountCents: number }) => n + t.amountCents, 0)).toBe(
      byCard.grossCents - fee + 4500 - claimFee,
    )
    expect(money.months.length).toBeGreaterThan(0)
  })

  it('shows the community studio’s people its incident: a blowout read as water smoking, with a photo and the cleaning fee paid', async () => {
    const crew = await signedIn('marisol.okafor@demo.conewright.test')
    const [{ id }] = await app.ctx.db.query(`SELECT id FROM studios WHERE name = 'Alder Street Clay Commons'`)
    const history = (await crew.get(`/api/studios/${id}/incidents`)).body
    expect(history.rows).toEqual([expect.objectContaining({ kilnName: 'Big Ten', phase: 'water-smoking', count: 1 })])
    const incident = (await crew.get(`/api/incidents/${history.incidents[0].id}`)).body
    expect(incident).toMatchObject({ kind: 'blowout', logged: true, potterName: 'Theo Marsh' })
    expect(incident.diagnosis.phase).toBe('water-smoking')
    expect(incident.photos).toHaveLength(1)
    expect(incident.claims).toEqual([expect.objectContaining({ chargeKind: 'kiln-cleaning', amountCents: 4500, status: 'paid' })])
  })

  it('shows the gas works, not onboarded, what it is owed for its collected firing', async () => {
    const money = await moneyOf('gideon.achterberg@demo.conewright.test', 'Fernhollow Gas Works')
    expect(money.account.state).toBe('none')
    const past = money.firings.find((f: { state: string }) => f.state === 'collected')
    const fee = marketplaceFee(past.grossCents, FEE)
    expect(past).toMatchObject({ transferredCents: 0, pendingCents: past.grossCents - fee, stageWords: 'Waiting for your payout account' })
    expect(money.balance.owedCents).toBe(past.grossCents - fee)
    expect(money.transfers).toEqual([])
  })

  it('balances, per request and in total, and agrees with what Stripe holds', async () => {
    const { requests, total } = await checkLedgers(app)
    // Deposits at the counter, the two card-paid past firings.
    expect(requests.length).toBeGreaterThanOrEqual(4)
    expect(total.transferredCents).toBeGreaterThan(0)
    expect(total.heldCents).toBeGreaterThan(0)
  })

  it('is made once: running the money step again adds nothing', async () => {
    const before = await app.ctx.db.query(
      `SELECT (SELECT count(*) FROM ledger_entries)::int AS ledger, (SELECT count(*) FROM studio_transfers)::int AS transfers, (SELECT count(*) FROM payout_accounts)::int AS accounts`,
    )
    await seedDemoPayouts(app.ctx)
    await moneyQuiet(app)
    const after = await app.ctx.db.query(
      `SELECT (SELECT count(*) FROM ledger_entries)::int AS ledger, (SELECT count(*) FROM studio_transfers)::int AS transfers, (SELECT count(*) FROM payout_accounts)::int AS accounts`,
    )
    expect(after).toEqual(before)
  })
})
