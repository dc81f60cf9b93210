// Helpers for tests that follow money: a studio onboarded on the stand-in's hosted page, a request
// walked from a paid deposit to collection, and waiting until the money jobs have all run.
import Stripe from 'stripe'
import { CARD_SUCCEEDS, submitCard } from './checkout'
import type { HttpSession } from './http-client'
import { submitOnboarding, VERIFIED_PERSON, type OnboardingValues } from './onboarding'
import type { TestApp } from './test-app'
import { waitUntil } from './wait'

const MONEY_TASKS = ['refund-payment', 'pay-studio', 'open-checkout', 'expire-checkouts']

/**
 * Waits until no refund or payout job is due or running and the stand-in has delivered its webhooks.
 * `heldToo` brings forward the jobs a stage move held back for its undo window. A job that keeps
 * failing fails the wait, with its error.
 */
export async function moneyQuiet(app: TestApp, { heldToo = false } = {}) {
  if (heldToo) {
    await app.ctx.db.query(
      `UPDATE graphile_worker._private_jobs j SET run_at = now() FROM graphile_worker._private_tasks t
       WHERE t.id = j.task_id AND t.identifier = ANY($1) AND j.run_at > now() AND j.attempts = 0`,
      [MONEY_TASKS],
    )
  }
  await waitUntil(
    async () => {
      await app.stripe?.idle()
      const rows: { due: number; failing: string | null }[] = await app.ctx.db.query(
        `SELECT count(*) FILTER (WHERE run_at <= now() OR locked_at IS NOT NULL)::int AS due,
                max(last_error) FILTER (WHERE attempts > 0) AS failing
         FROM graphile_worker.jobs WHERE task_identifier = ANY($1) AND attempts < max_attempts`,
        [MONEY_TASKS],
      )
      if (rows[0].failing) throw new Error(`a money job failed: ${rows[0].failing}`)
      return rows[0].due === 0
    },
    { what: 'the money jobs to run', interval: 150 },
  )
  await app.stripe?.idle()
}

/** The studio's owner starts onboarding and fills the stand-in's hosted page; resolves once the app knows. */
export async function onboard(app: TestApp, owner: HttpSession, studioId: string, values: OnboardingValues = VERIFIED_PERSON) {
  const start = await owner.post(`/api/studios/${studioId}/payouts/onboarding`)
  if (start.status !== 200) throw new Error(`onboarding: ${start.status} ${JSON.stringify(start.body)}`)
  const filled = await submitOnboarding(start.body.url, values)
  if (filled.status !== 303) throw new Error(`onboarding page answered ${filled.status}`)
  await app.stripe?.idle()
  return filled
}

/** The SDK on the test app's stand-in, for reading what Stripe holds. */
export function stripeOf(app: TestApp): Stripe {
  const url = new URL(app.ctx.config.stripeApiBase!)
  return new Stripe(app.ctx.config.stripeSecretKey, { host: url.hostname, port: url.port, protocol: 'http', maxNetworkRetries: 0 })
}

async function ok(reply: Promise<{ status: number; body: unknown }>, what: string) {
  const answer = await reply
  if (answer.status !== 200) throw new Error(`${what}: ${answer.status} ${JSON.stringify(answer.body)}`)
  return answer.body as Record<string, unknown>
}

/** Checks in every declared piece, as received. */
export async function checkInAll(studio: HttpSession, requestId: string, quantities: number[]) {
  await ok(
    studio.post(`/api/requests/${requestId}/check-in`, { pieces: quantities.map((received, pieceIndex) => ({ pieceIndex, received })) }),
    'check-in',
  )
}

/** Moves a firing through its stages up to unloading (its received ware is then fired). */
export async function fireThrough(studio: HttpSession, firingId: string) {
  for (const status of ['closed', 'loading', 'firing', 'cooling', 'unloaded']) {
    await ok(studio.post(`/api/firings/${firingId}/stage`, { status, confirm: true }), `stage ${status}`)
  }
}

/** Posts results and marks the ware ready. */
export async function resultsAndReady(studio: HttpSession, requestId: string) {
  await ok(studio.post(`/api/requests/${requestId}/results`, { outcomes: [{ pieceIndex: 0, outcome: 'fine' }] }), 'results')
  await ok(studio.post(`/api/requests/${requestId}/ready`), 'ready')
}

/** The potter pays the balance on the hosted page; resolves once the webhook has booked it. */
export async function payBalanceOnline(app: TestApp, potter: HttpSession, requestId: string) {
  const balance = await ok(potter.post(`/api/requests/${requestId}/balance`), 'balance')
  const paid = await submitCard(balance.checkoutUrl as string, { cardNumber: CARD_SUCCEEDS })
  if (paid.status !== 303) throw new Error(`hosted page answered ${paid.status}`)
  await waitUntil(async () => (await potter.get(`/api/requests/${requestId}`)).body.price.balanceOwedCents === 0, {
    what: 'the balance webhook',
  })
}

export async function collected(studio: HttpSession, requestId: string) {
  await ok(studio.post(`/api/requests/${requestId}/collected`), 'collected')
}
