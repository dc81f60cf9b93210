// With a hold configured (PAYOUT_HOLD_HOURS, 48 here), the studio's share is not transferred at
// collection: the request waits in the hold, its payout run is queued for the end of it, and once the
// hold has passed the share goes out, less the fee (10 % with a $1.00 minimum, set here).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { marketplaceFee } from '../../shared/payouts'
import { checkLedgers } from '../support/ledger'
import { checkInAll, collected, fireThrough, moneyQuiet, onboard, payBalanceOnline, resultsAndReady } from '../support/money'
import { createPerson, type Person } from '../support/people'
import { mug, sendAndPayDeposit } from '../support/request-fixtures'
import { publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let owner: Person
let potter: Person
const HOLD_HOURS = 48
const FEE = { percentBp: 1_000, minimumCents: 100 }

beforeAll(async () => {
  app = await startTestApp({ stripe: true, config: { marketplaceFee: { percent: 10, minimumCents: 100 }, payoutHoldHours: HOLD_HOURS } })
  owner = await createPerson(app, 'host', 'Hold Owner')
  potter = await createPerson(app, 'potter', 'Hold Potter')
})

afterAll(async () => {
  await app?.close()
})

describe('a configured hold after collection', () => {
  it('keeps the share until the hold has passed, then transfers it less the fee', async () => {
    const ids = await publishedStudio(owner.session, 'Hold Studio')
    await onboard(app, owner.session, ids.studioId)
    const sent = await sendAndPayDeposit(app, owner.session, potter.session, ids.firingId, [mug()])
    await checkInAll(owner.session, sent.id, [4])
    await fireThrough(owner.session, ids.firingId)
    await resultsAndReady(owner.session, sent.id)
    await payBalanceOnline(app, potter.session, sent.id)
    const collectedAt = Date.now()
    await collected(owner.session, sent.id)
    await moneyQuiet(app)

    const money = async () => (await owner.session.get(`/api/studios/${ids.studioId}/payouts`)).body
    const held = (await money()).firings.find((f: { requestId: string }) => f.requestId === sent.id)
    const fee = marketplaceFee(held.grossCents, FEE)
    // In the hold nothing is earned yet, so no fee is taken: all that was paid waits with the marketplace.
    expect(held).toMatchObject({ stage: 'hold', transferredCents: 0, feeCents: 0, pendingCents: held.grossCents })
    const [row] = await app.ctx.db.query(`SELECT release_at FROM request_payouts WHERE request_id = $1`, [sent.id])
    const holdMs = new Date(row.release_at).getTime() - collectedAt
    expect(holdMs).toBeGreaterThan((HOLD_HOURS - 1) * 3600_000)
    expect(holdMs).toBeLessThan((HOLD_HOURS + 1) * 3600_000)

    // The hold passes: its end moved to now, and the queued payout run brought forward to now.
    await app.ctx.db.query(`UPDATE request_payouts SET release_at = now() WHERE request_id = $1`, [sent.id])
    await moneyQuiet(app, { heldToo: true })
    const paid = (await money()).firings.find((f: { requestId: string }) => f.requestId === sent.id)
    expect(paid).toMatchObject({ stage: 'earned', transferredCents: paid.grossCents - fee, pendingCents: 0 })
    await checkLedgers(app)
  })
})
