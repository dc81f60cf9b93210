// Webhook timestamps are checked both ways. Stripe signs `${t}.${payload}` with HMAC-SHA256 under the
// endpoint's secret and allows 300 seconds of difference (Stripe docs, "Check the webhook signatures":
// the default tolerance is five minutes); its SDK checks only the past side.
import { createHmac } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp

beforeAll(async () => {
  app = await startTestApp({ worker: false })
})
afterAll(async () => {
  await app?.close()
})

const hmac = (t: number, payload: string) => createHmac('sha256', 'whsec_conewright_tests').update(`${t}.${payload}`).digest('hex')
const now = () => Math.floor(Date.now() / 1000)
let n = 0
const event = () => JSON.stringify({ id: `evt_time_${++n}_${Date.now()}`, object: 'event', type: 'customer.created', data: { object: {} } })
const post = async (payload: string, signature: string) =>
  (
    await fetch(`${app.url}/api/webhooks/stripe`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', 'Stripe-Signature': signature },
      body: payload,
    })
  ).status

describe('webhook timestamps', () => {
  it('takes a correctly signed event stamped now, or within the tolerance either side', async () => {
    for (const t of [now(), now() - 290, now() + 290]) {
      const payload = event()
      expect(await post(payload, `t=${t},v1=${hmac(t, payload)}`)).toBe(200)
    }
  })

  it('refuses a correctly signed event stamped an hour in the future, or an hour ago', async () => {
    const refused: string[] = []
    for (const t of [now() + 3600, now() + 400, now() - 3600]) {
      const payload = event()
      refused.push(JSON.parse(payload).id)
      expect(await post(payload, `t=${t},v1=${hmac(t, payload)}`), `t = now ${t - now() > 0 ? '+' : ''}${t - now()} s`).toBe(400)
    }
    expect(await app.ctx.db.query(`SELECT id FROM stripe_events WHERE id = ANY($1)`, [refused])).toEqual([])
  })

  it('refuses a header that carries a second timestamp from the future beside a current one', async () => {
    const future = now() + 3600
    const payload = event()
    expect(await post(payload, `t=${now()},t=${future},v1=${hmac(future, payload)}`)).toBe(400)
  })
})
