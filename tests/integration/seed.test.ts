import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { seedDemo, DEMO_PASSWORD } from '../../server/db/seed'
import { firingLoadPlan } from '../../server/services/load-plan'
import { HttpSession } from '../support/http-client'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp

beforeAll(async () => {
  app = await startTestApp({ worker: false })
})
afterAll(async () => {
  await app?.close()
})

const counts = async () =>
  (
    await app.ctx.db.query(
      `SELECT (SELECT count(*) FROM users)::int AS users, (SELECT count(*) FROM studios)::int AS studios, (SELECT count(*) FROM kilns)::int AS kilns,
            (SELECT count(*) FROM firings)::int AS firings, (SELECT count(*) FROM firing_requests)::int AS requests, (SELECT count(*) FROM reviews WHERE published_at IS NOT NULL)::int AS reviews`,
    )
  )[0]

describe('the demo data', () => {
  it('seeds forty studios with kilns, firings eight weeks ahead, requests and both sides’ answers after a pickup, and adds nothing the second time', async () => {
    await seedDemo(app.ctx)
    const first = await counts()
    expect(first.studios).toBe(40)
    expect(first.kilns).toBeGreaterThanOrEqual(40)
    expect(first.requests).toBeGreaterThanOrEqual(5)
    expect(first.reviews).toBe(2)
    await seedDemo(app.ctx)
    expect(await counts()).toEqual(first)
  }, 120_000)

  it('lets the documented demo accounts sign in, each to their own studio', async () => {
    const owner = new HttpSession(app.url)
    const reply = await owner.signIn('marisol.okafor@demo.conewright.test', DEMO_PASSWORD)
    expect(reply.status).toBe(200)
    expect(reply.body.studios).toEqual([expect.objectContaining({ name: 'Alder Street Clay Commons', role: 'owner' })])
    const crew = await new HttpSession(app.url).signIn('dev.ramanathan@demo.conewright.test', DEMO_PASSWORD)
    expect(crew.body).toMatchObject({
      role: 'crew',
      studios: [expect.objectContaining({ name: 'Alder Street Clay Commons', role: 'crew' })],
    })
  })

  it('has a glaze firing whose ware is checked in as tagged pieces, every one planned on the shelves', async () => {
    const rows: { firing_id: string; tags: string[] }[] = await app.ctx.db.query(
      `SELECT r.firing_id, array_agg(p.tag) AS tags FROM pieces p JOIN firing_requests r ON r.id = p.request_id
       JOIN firings f ON f.id = r.firing_id WHERE f.kind = 'glaze' AND p.status = 'in-load' GROUP BY r.firing_id`,
    )
    expect(rows.length).toBeGreaterThan(0)
    const plan = await firingLoadPlan(app.ctx, rows[0].firing_id)
    const placed = plan.layers.flatMap((l) => l.shelves.flatMap((s) => s.pieces.map((p) => p.tag)))
    expect(placed).toEqual(expect.arrayContaining(rows[0].tags))
    expect(plan.unplaced).toEqual([])
  })
})
