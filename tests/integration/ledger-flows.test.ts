// The ledger balances after randomized flows (fast-check), run for real through the API, the queue and
// the Stripe stand-in: deposits and balances online and at the counter, prices lowered or raised at
// drop-off (confirmed or turned down), withdrawals on either side of the studio's full-refund boundary,
// a studio calling a request off, ware refused at the door, no-shows, collection, desk refunds after
// the transfer, disputes held or settled; the studio onboarded before, after, or never. After each run
// every cent paid in is transferred, kept as the fee, refunded, kept at the counter or held, per request
// and in total, and Stripe's own record agrees (tests/support/ledger.ts).
//
// LEDGER_FLOW_RUNS sets how many runs (6 by default: each is a whole firing, so a run takes seconds).
import fc from 'fast-check'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { marketplaceFee } from '../../shared/payouts'
import { payoutFactsOf } from '../../server/services/payouts'
import { CARD_SUCCEEDS, submitCard } from '../support/checkout'
import type { HttpSession } from '../support/http-client'
import { checkLedgers } from '../support/ledger'
import { checkInAll, collected, fireThrough, moneyQuiet, onboard, payBalanceOnline, resultsAndReady } from '../support/money'
import { createPerson, type Person } from '../support/people'
import { draftAndSend, mug } from '../support/request-fixtures'
import { publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'
import { waitUntil } from '../support/wait'

let app: TestApp
let potter: Person
let admin: Person
const RULE = { percentBp: 1_000, minimumCents: 100 }

beforeAll(async () => {
  app = await startTestApp({ stripe: true, config: { marketplaceFee: { percent: 10, minimumCents: 100 }, payoutHoldHours: 0 } })
  potter = await createPerson(app, 'potter', 'Flow Potter')
  admin = await createPerson(app, 'admin', 'Flow Desk')
})

afterAll(async () => {
  await app?.close()
})

type AfterPickup = 'none' | 'desk-refund' | 'dispute-refund-settle' | 'dispute-held'
type Path =
  | { kind: 'withdraw' }
  | { kind: 'studio-cancels' }
  | { kind: 'refused' }
  | { kind: 'no-show' }
  | { kind: 'price-declined' }
  | { kind: 'collected'; balance: 'online' | 'counter'; price: 'same' | 'lower' | 'higher'; after: AfterPickup }
  | { kind: 'disputed-before-pickup'; settle: boolean }

interface RequestPlan {
  mugs: number
  deposit: 'online' | 'counter'
  path: Path
  /** The share of what is paid that a desk refund gives back. */
  refundShare: number
}

interface RunPlan {
  onboarding: 'before' | 'after' | 'never'
  /** With the firing a week out: 6 days or fewer refunds in full, 8 or more refunds the later share. */
  fullRefundDays: number
  laterPercent: number
  requests: RequestPlan[]
}

const pathArb: fc.Arbitrary<Path> = fc.oneof(
  fc.constant({ kind: 'withdraw' as const }),
  fc.constant({ kind: 'studio-cancels' as const }),
  fc.constant({ kind: 'refused' as const }),
  fc.constant({ kind: 'no-show' as const }),
  fc.constant({ kind: 'price-declined' as const }),
  fc.record({
    kind: fc.constant('collected' as const),
    balance: fc.constantFrom('online' as const, 'counter' as const),
    price: fc.constantFrom('same' as const, 'lower' as const, 'higher' as const),
    after: fc.constantFrom<AfterPickup>('none', 'desk-refund', 'dispute-refund-settle', 'dispute-held'),
  }),
  fc.record({ kind: fc.constant('disputed-before-pickup' as const), settle: fc.boolean() }),
)

const runArb: fc.Arbitrary<RunPlan> = fc.record({
  onboarding: fc.constantFrom('before' as const, 'after' as const, 'never' as const),
  fullRefundDays: fc.constantFrom(0, 6, 7, 8, 30),
  laterPercent: fc.constantFrom(0, 40, 100),
  requests: fc.array(
    fc.record({
      mugs: fc.integer({ min: 1, max: 5 }),
      deposit: fc.constantFrom('online' as const, 'counter' as const),
      path: pathArb,
      refundShare: fc.double({ min: 0.1, max: 1, noNaN: true }),
    }),
    { minLength: 1, maxLength: 3 },
  ),
})

async function ok(reply: Promise<{ status: number; body: any }>, what: string) {
  const answer = await reply
  if (answer.status >= 300) throw new Error(`${what}: ${answer.status} ${JSON.stringify(answer.body)}`)
  return answer.body
}

async function payDeposit(studio: HttpSession, requestId: string, how: 'online' | 'counter') {
  if (how === 'counter') return ok(studio.post(`/api/requests/${requestId}/balance/counter`, {}), 'deposit at the counter')
  const deposit = await ok(potter.session.post(`/api/requests/${requestId}/deposit`), 'deposit')
  await submitCard(deposit.checkoutUrl, { cardNumber: CARD_SUCCEEDS })
  await waitUntil(async () => (await potter.session.get(`/api/requests/${requestId}`)).body.state === 'deposit_paid', {
    what: 'the deposit webhook',
  })
}

const net = async (requestId: string) => (await potter.session.get(`/api/requests/${requestId}`)).body.price.netPaidCents as number

async function deskRefund(requestId: string, share: number) {
  const amount = Math.floor((await net(requestId)) * share)
  if (amount > 0)
    await ok(
      admin.session.post(`/api/admin/requests/${requestId}/refund`, { amountCents: amount, reason: 'Desk refund in a flow' }),
      'desk refund',
    )
  await moneyQuiet(app)
}

const BIGGER = { heightMm: 150, widthMm: 120, depthMm: 140 }
const SMALLER = { heightMm: 80, widthMm: 80, depthMm: 100 }

async function runFlow(plan: RunPlan, runIndex: number) {
  const owner = await createPerson(app, 'host', `Flow Owner ${runIndex}`)
  const studio = owner.session
  const ids = await publishedStudio(studio, `Flow Studio ${runIndex}`)
  await ok(
    studio.patch(`/api/studios/${ids.studioId}`, {
      policies: {
        clayBodies: ['stoneware'],
        wareRequirements: 'Bisqued',
        cancellation: { fullRefundDaysBefore: plan.fullRefundDays, laterRefundPercent: plan.laterPercent },
        depositHoldHours: 48,
      },
    }),
    'policies',
  )
  if (plan.onboarding === 'before') await onboard(app, studio, ids.studioId)

  const requests: { id: string; plan: RequestPlan; paidBeforeExit?: number }[] = []
  for (const request of plan.requests) {
    const sent = await draftAndSend(potter.session, ids.firingId, [mug({ quantity: request.mugs })])
    await ok(studio.post(`/api/requests/${sent.id}/accept`), 'accept')
    await payDeposit(studio, sent.id, request.deposit)
    requests.push({ id: sent.id, plan: request })
  }

  // Before drop-off: withdrawals and the studio calling off.
  for (const r of requests) {
    if (r.plan.path.kind === 'withdraw') {
      r.paidBeforeExit = await net(r.id)
      await ok(potter.session.post(`/api/requests/${r.id}/withdraw`, { reason: 'Changed plans' }), 'withdraw')
    }
    if (r.plan.path.kind === 'studio-cancels')
      await ok(studio.post(`/api/requests/${r.id}/decline`, { reason: 'Element failure' }), 'call off')
  }

  // Drop-off: refused, or checked in (the measured ware moving the price either way), or never brought.
  for (const r of requests) {
    const path = r.plan.path
    if (path.kind === 'refused') {
      r.paidBeforeExit = await net(r.id)
      await ok(studio.post(`/api/requests/${r.id}/check-in`, { pieces: [], refuse: { reason: 'Glaze on the feet' } }), 'refuse')
    } else if (path.kind === 'price-declined' || (path.kind === 'collected' && path.price === 'higher')) {
      await ok(
        studio.post(`/api/requests/${r.id}/check-in`, { pieces: [{ pieceIndex: 0, received: r.plan.mugs, measured: BIGGER }] }),
        'check-in',
      )
      const answer = path.kind === 'price-declined' ? 'price/decline' : 'confirm-price'
      await ok(potter.session.post(`/api/requests/${r.id}/${answer}`), answer)
    } else if (path.kind === 'collected' && path.price === 'lower') {
      await ok(
        studio.post(`/api/requests/${r.id}/check-in`, { pieces: [{ pieceIndex: 0, received: r.plan.mugs, measured: SMALLER }] }),
        'check-in',
      )
    } else if (path.kind === 'collected' || path.kind === 'disputed-before-pickup') {
      await checkInAll(studio, r.id, [r.plan.mugs])
    } else if (path.kind === 'no-show') {
      r.paidBeforeExit = await net(r.id)
    }
  }

  // The firing: loading turns the absent into no-shows, unloading makes the rest fired.
  await fireThrough(studio, ids.firingId)

  for (const r of requests) {
    const path = r.plan.path
    if (path.kind !== 'collected' && path.kind !== 'disputed-before-pickup') continue
    await resultsAndReady(studio, r.id)
    if (path.kind === 'disputed-before-pickup') {
      await ok(potter.session.post(`/api/requests/${r.id}/dispute`, { reason: 'Two mugs came out cracked' }), 'dispute')
      await deskRefund(r.id, r.plan.refundShare)
      if (path.settle) await ok(admin.session.post(`/api/admin/requests/${r.id}/settle`, { note: 'Settled in a flow' }), 'settle')
      continue
    }
    if (path.balance === 'online') await payBalanceOnline(app, potter.session, r.id)
    else await ok(studio.post(`/api/requests/${r.id}/balance/counter`, {}), 'balance at the counter')
    await collected(studio, r.id)
    await moneyQuiet(app)
    if (path.after === 'desk-refund') await deskRefund(r.id, r.plan.refundShare)
    if (path.after === 'dispute-refund-settle' || path.after === 'dispute-held') {
      await ok(potter.session.post(`/api/requests/${r.id}/dispute`, { reason: 'A glaze ran onto the shelf' }), 'dispute')
      if (path.after === 'dispute-refund-settle') {
        await deskRefund(r.id, r.plan.refundShare)
        await ok(admin.session.post(`/api/admin/requests/${r.id}/settle`, { note: 'Settled in a flow' }), 'settle')
      }
    }
  }

  if (plan.onboarding === 'after') await onboard(app, studio, ids.studioId)
  await moneyQuiet(app, { heldToo: true })
  await moneyQuiet(app)

  // Each request where the plan says it is.
  const firingDay = (await potter.session.get(`/api/requests/${requests[0].id}`)).body.firing.firingDate as string
  const daysOut = (new Date(firingDay).getTime() - Date.now()) / 86_400_000
  for (const r of requests) {
    const facts = (await payoutFactsOf(app.ctx.db.manager, app.ctx.config, r.id))!
    const { ledger } = facts
    const where = `run ${runIndex}, ${JSON.stringify(r.plan)}: ${JSON.stringify(ledger)}`
    const onboarded = plan.onboarding !== 'never'
    const share = ledger.keptOnlineCents - marketplaceFee(ledger.keptOnlineCents, RULE)
    if (facts.stage === 'earned') {
      expect(ledger.feeCents, where).toBe(marketplaceFee(ledger.keptOnlineCents, RULE))
      expect(ledger.transferredCents, where).toBe(onboarded ? share : 0)
      expect(ledger.heldCents, where).toBe(onboarded ? 0 : share)
    }
    if (r.plan.path.kind === 'disputed-before-pickup' && !r.plan.path.settle) {
      expect(facts.stage, where).toBe('dispute')
      expect(ledger.transferredCents, where).toBe(0)
      expect(ledger.heldCents, where).toBe(ledger.keptOnlineCents)
    }
    // Refunds on either side of the studio's full-refund boundary (the exact boundary is left to timing).
    if (r.paidBeforeExit !== undefined && Math.abs(plan.fullRefundDays - daysOut) > 0.5) {
      const full = plan.fullRefundDays < daysOut
      const expected = full ? r.paidBeforeExit : Math.min(r.paidBeforeExit, Math.floor((r.paidBeforeExit * plan.laterPercent) / 100 + 0.5))
      expect(ledger.refundedCents, where).toBe(expected)
    }
    if (r.plan.path.kind === 'studio-cancels' || r.plan.path.kind === 'price-declined')
      expect(ledger.refundedCents, where).toBe(ledger.paidInCents)
  }
  await checkLedgers(app)
}

describe('the ledger after randomized flows', () => {
  it('balances for every flow, per request and in total, and agrees with Stripe', async () => {
    let runIndex = 0
    await fc.assert(
      fc.asyncProperty(runArb, async (plan) => {
        await runFlow(plan, ++runIndex)
      }),
      { numRuns: Number(process.env.LEDGER_FLOW_RUNS ?? 6), endOnFailure: true },
    )
  }, 1_800_000)
})
