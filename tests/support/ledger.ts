// The ledger check: every cent each potter paid is transferred, kept as the fee, refunded, kept at the
// studio's counter or held, per request and in total; and the app's record agrees with what Stripe
// itself holds (the stand-in, read through the SDK): each request's charges and refunds, the transfers
// in its transfer group, the platform's balance, and each studio's Stripe balance and bank payouts.
import { expect } from 'vitest'
import { ledgerProblems, LEDGER_BUCKETS, sumLedgers, type RequestLedger } from '../../shared/payouts'
import { payoutFactsOf, transferGroupOf, type RequestPayoutFacts } from '../../server/services/payouts'
import { stripeOf } from './money'
import type { TestApp } from './test-app'

export interface LedgerReport {
  requests: RequestPayoutFacts[]
  total: RequestLedger
}

export async function checkLedgers(app: TestApp): Promise<LedgerReport> {
  const manager = app.ctx.db.manager
  const stripe = stripeOf(app)
  const ids: { id: string }[] = await manager.query(
    `SELECT id FROM firing_requests r WHERE EXISTS (SELECT 1 FROM ledger_entries l WHERE l.request_id = r.id)
       OR EXISTS (SELECT 1 FROM studio_transfers t WHERE t.request_id = r.id) ORDER BY id`,
  )
  const requests: RequestPayoutFacts[] = []
  for (const { id } of ids) {
    const facts = (await payoutFactsOf(manager, app.ctx.config, id))!
    requests.push(facts)
    const { ledger } = facts
    expect(ledgerProblems(ledger), `request ${id} (${facts.state}, ${facts.stage}): ${JSON.stringify(ledger)}`).toEqual([])

    // What Stripe charged and refunded for this request's payments.
    const intents: { pi: string }[] = await manager.query(
      `SELECT DISTINCT stripe_payment_intent_id AS pi FROM ledger_entries WHERE request_id = $1 AND kind IN ('deposit', 'balance', 'claim')`,
      [id],
    )
    let charged = 0
    let refunded = 0
    for (const { pi } of intents) {
      const intent = await stripe.paymentIntents.retrieve(pi, { expand: ['latest_charge'] })
      const charge = intent.latest_charge as { amount: number; amount_refunded: number; transfer_group: string | null }
      expect(charge.transfer_group).toBe(transferGroupOf(id))
      charged += charge.amount
      refunded += charge.amount_refunded
    }
    const online = await manager.query(
      `SELECT coalesce(sum(amount_cents) FILTER (WHERE kind IN ('deposit', 'balance', 'claim')), 0)::int AS paid,
              coalesce(sum(amount_cents) FILTER (WHERE kind = 'refund'), 0)::int AS refunded FROM ledger_entries WHERE request_id = $1`,
      [id],
    )
    expect({ charged, refunded }, `Stripe's charges for request ${id}`).toEqual({ charged: online[0].paid, refunded: online[0].refunded })

    // What Stripe transferred from them, net of reversals, and what the platform still holds of them.
    const transfers = await stripe.transfers.list({ transfer_group: transferGroupOf(id), limit: 100 })
    const transferred = transfers.data.reduce((n, t) => n + t.amount - t.amount_reversed, 0)
    expect(transferred, `Stripe's transfers for request ${id}`).toBe(ledger.transferredCents)
    expect(charged - refunded - transferred, `what the platform holds for request ${id}`).toBe(ledger.feeCents + ledger.heldCents)
  }

  const total = sumLedgers(requests.map((r) => r.ledger))
  expect(LEDGER_BUCKETS.reduce((n, bucket) => n + total[bucket], 0)).toBe(total.paidInCents)
  expect(ledgerProblems(total)).toEqual([])

  // The platform's Stripe balance is exactly the fees kept and the money held, over every request.
  const balance = await stripe.balance.retrieve()
  const platform = balance.available.find((b) => b.currency === 'usd')?.amount ?? 0
  expect(platform, 'the platform’s Stripe balance').toBe(total.keptOnlineCents - total.transferredCents)

  // Each studio's Stripe account holds what was transferred to it, less what it paid out to its bank.
  const accounts: { stripe_account_id: string; studio_id: string }[] = await manager.query(
    `SELECT stripe_account_id, studio_id FROM payout_accounts`,
  )
  for (const account of accounts) {
    const [{ sent }] = await manager.query(
      `SELECT (coalesce(sum(t.amount_cents), 0) - coalesce((SELECT sum(r.amount_cents) FROM transfer_reversals r JOIN studio_transfers x ON x.id = r.transfer_id
         WHERE x.stripe_account_id = $1), 0))::int AS sent FROM studio_transfers t WHERE t.stripe_account_id = $1`,
      [account.stripe_account_id],
    )
    // Stripe's payout schedule may pay the account out between two reads: read until a payout list
    // brackets the balance unchanged.
    const paidOutNow = async () =>
      (await stripe.payouts.list({ limit: 100 }, { stripeAccount: account.stripe_account_id })).data
        .filter((p) => p.status !== 'failed' && p.status !== 'canceled')
        .reduce((n, p) => n + p.amount, 0)
    for (;;) {
      const before = await paidOutNow()
      const theirs = await stripe.balance.retrieve({}, { stripeAccount: account.stripe_account_id })
      if ((await paidOutNow()) !== before) continue
      const held = theirs.available.find((b) => b.currency === 'usd')?.amount ?? 0
      expect(held + before, `studio ${account.studio_id}'s Stripe account`).toBe(sent)
      break
    }
  }
  return { requests, total }
}
