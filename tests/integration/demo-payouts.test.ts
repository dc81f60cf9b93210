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
  it('has the community studio onboarded and its collected past firing transferred, less the fee', async () => {
    const money = await moneyOf('marisol.okafor@demo.conewright.test', 'Alder Street Clay Commons')
    expect(money.account.state).toBe('ready')
    const past = money.firings.find((f: { state: string; grossCents: number }) => f.state === 'collected' && f.grossCents > 0)
    const fee = marketplaceFee(past.grossCents, FEE)
    expect(past).toMatchObject({ stage: 'earned', feeCents: fee, transferredCents: past.grossCents - fee, pendingCents: 0 })
    // One transfer from each of its two charges (deposit and balance): source_transaction ties a
    // transfer to a single charge.
    expect(money.transfers).toHaveLength(2)
    expect(money.transfers.reduce((n: number, t: { amountCents: number }) => n + t.amountCents, 0)).toBe(past.grossCents - fee)
    expect(money.months.length).toBeGreaterThan(0)
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
