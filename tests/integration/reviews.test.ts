// The answers after pickup through the API: given once per side through the request door, kept from the
// other side until both have answered or the window closes, then published together; the studio's
// public page, its search score and the potter's record read published answers only. The window (21
// days after pickup) and the Bayesian score are this product's own rules (shared/reviews.ts).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ReviewsAfterPickup1796174002687 } from '../../server/db/migrations/1796174002687-ReviewsAfterPickup'
import { Notice } from '../../server/entities/Notice'
import { OutboundMail } from '../../server/entities/OutboundMail'
import { Review } from '../../server/entities/Review'
import { fireAgainScore } from '../../shared/reviews'
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
  owner = await createPerson(app, 'host', 'Ravi Owner')
  potter = await createPerson(app, 'potter', 'Sol Potter')
  ids = await publishedStudio(owner.session, 'Answering Studio')
}, 60_000)

afterAll(async () => {
  await app?.close()
})

const potterAnswers = {
  loading: 'yes',
  resultsAsLogged: 'partly',
  turnaround: 'yes',
  communication: 'no',
  fireAgain: true,
  note: 'Loaded with care; the log said cone 6 and the witness cone agreed.',
}
const studioAnswers = { asDeclared: 'yes', cleanAndDry: 'partly', onTime: 'yes', note: 'Two feet needed wiping.' }

/** Ware taken all the way to pickup: paid, checked in, fired, results posted, balance taken, handed over. */
async function pickedUp(): Promise<string> {
  const firing = await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody())
  const firingId = firing.body.firings[0].id as string
  const sent = await sendAndPayDeposit(app, owner.session, potter.session, firingId, [mug()])
  await owner.session.post(`/api/requests/${sent.id}/check-in`, { pieces: [{ pieceIndex: 0, received: 4 }] })
  for (const status of ['loading', 'firing', 'cooling', 'unloaded'])
    expect((await owner.session.post(`/api/firings/${firingId}/stage`, { status, confirm: true })).status).toBe(200)
  await owner.session.post(`/api/requests/${sent.id}/results`, { outcomes: [{ pieceIndex: 0, outcome: 'fine' }] })
  await owner.session.post(`/api/requests/${sent.id}/ready`)
  await owner.session.post(`/api/requests/${sent.id}/balance/counter`, { note: 'Cash at pickup' })
  expect((await owner.session.post(`/api/requests/${sent.id}/collected`)).status).toBe(200)
  return sent.id
}

const view = async (who: Person, id: string) => (await who.session.get(`/api/requests/${id}`)).body
const publicPage = async () => (await new HttpSession(app.url).get(`/api/studios/${ids.studioId}/reviews`)).body

describe('answers after pickup', () => {
  let id: string

  it('opens only once the ware has been picked up', async () => {
    const sent = await sendAndPayDeposit(app, owner.session, potter.session, ids.firingId, [mug({ quantity: 1 })])
    const early = await potter.session.post(`/api/requests/${sent.id}/review`, potterAnswers)
    expect(early.status).toBe(409)
    expect(early.body.error.code).toBe('bad-state-change')
  }, 90_000)

  it('keeps the potter’s answers from the studio and the public until the studio answers too', async () => {
    id = await pickedUp()
    expect((await view(potter, id)).actions).toContain('rate')
    const given = await potter.session.post(`/api/requests/${id}/review`, potterAnswers)
    expect(given.status, JSON.stringify(given.body)).toBe(200)
    expect(given.body.ofStudio).toMatchObject({ loading: 'yes', fireAgain: true, publishedAt: null })

    const seenByStudio = (await view(owner, id)).reviews
    expect(seenByStudio.ofStudio).toBeNull()
    expect(seenByStudio.answered).toEqual({ potter: true, studio: false })
    expect(new Date(seenByStudio.closesAt).getTime()).toBeGreaterThan(Date.now() + 20 * 86_400_000)
    expect((await view(potter, id)).reviews.ofStudio).toMatchObject({ communication: 'no' })
    expect((await publicPage()).reviews.some((r: { note: string }) => r.note === potterAnswers.note)).toBe(false)

    // The studio hears that an answer waits, not what it says.
    const notice = await app.ctx.db.getRepository(Notice).findOneByOrFail({ requestId: id, kind: 'review-given' })
    expect(notice.body).not.toContain('witness cone')
    const mail = await app.ctx.db.getRepository(OutboundMail).findOneByOrFail({ template: 'review-given', toAddress: owner.email })
    expect(mail.bodyText).not.toContain('witness cone')
  }, 120_000)

  it('takes one answer per side, final once given', async () => {
    const again = await potter.session.post(`/api/requests/${id}/review`, { ...potterAnswers, communication: 'yes' })
    expect(again.status).toBe(409)
    expect(again.body.error.code).toBe('already-answered')
    expect(await app.ctx.db.getRepository(Review).countBy({ requestId: id, side: 'potter' })).toBe(1)
    expect((await view(potter, id)).reviews.ofStudio.communication).toBe('no')
    expect((await view(potter, id)).actions).not.toContain('rate')
  })

  it('refuses answers that are not the side’s own, or not yes, partly or no', async () => {
    const wrongSide = await owner.session.post(`/api/requests/${id}/review`, potterAnswers)
    expect(wrongSide.status).toBe(400)
    expect(Object.keys(wrongSide.body.error.fields)).toEqual(['asDeclared', 'cleanAndDry', 'onTime'])
    const stars = await owner.session.post(`/api/requests/${id}/review`, { asDeclared: 5, cleanAndDry: 'yes', onTime: 'yes' })
    expect(stars.status).toBe(400)
    const admin = await createPerson(app, 'admin', 'Desk Person')
    expect((await admin.session.post(`/api/requests/${id}/review`, studioAnswers)).status).toBe(403)
  })

  it('publishes both once the studio answers, to each other and on the studio’s page', async () => {
    const given = await owner.session.post(`/api/requests/${id}/review`, studioAnswers)
    expect(given.status, JSON.stringify(given.body)).toBe(200)
    const potterView = (await view(potter, id)).reviews
    expect(potterView.ofPotter).toMatchObject({ asDeclared: 'yes', cleanAndDry: 'partly', onTime: 'yes' })
    expect(potterView.ofPotter.publishedAt).not.toBeNull()
    expect((await view(owner, id)).reviews.ofStudio).toMatchObject({ communication: 'no', note: potterAnswers.note })
    const page = await publicPage()
    expect(page.reviews[0]).toMatchObject({ author: 'Sol', fireAgain: true, resultsAsLogged: 'partly', note: potterAnswers.note })
    expect(page.summary).toMatchObject({
      count: 1,
      fireAgain: 1,
      questions: { loading: { yes: 1, partly: 0, no: 0 }, communication: { yes: 0, partly: 0, no: 1 } },
    })
    expect((await app.ctx.db.getRepository(Notice).findBy({ requestId: id, kind: 'reviews-published' })).length).toBeGreaterThan(0)
  })

  it('ranks the studio in search by the published answers only', async () => {
    // Hand-worked: one potter of one would fire again, smoothed toward 0.7 weighted as five answers.
    const expected = fireAgainScore(1, 1)
    await expect
      .poll(
        async () =>
          (await app.ctx.db.query(`SELECT DISTINCT rating_score FROM search_documents WHERE studio_id = $1`, [ids.studioId])).map(
            (r: { rating_score: number | null }) => r.rating_score,
          ),
        { timeout: 30_000 },
      )
      .toEqual([expected])
    const search = await new HttpSession(app.url).get(`/api/search?place=97214&sort=rating`)
    const hit = search.body.hits.find((h: { studio: { id: string } }) => h.studio.id === ids.studioId)
    expect(hit.reviews).toEqual({ fireAgain: 1, count: 1 })
  })

  it('shows studios the potter’s record from the studios’ published answers', async () => {
    const another = await sendAndPayDeposit(app, owner.session, potter.session, ids.firingId, [mug({ quantity: 1 })])
    const record = (await view(owner, another.id)).potter.record
    expect(record.reviews).toMatchObject({ count: 1, asDeclared: { yes: 1 }, cleanAndDry: { partly: 1 }, onTime: { yes: 1 } })
  }, 90_000)

  it('publishes what one side gave when the window closes, and takes no answer after it', async () => {
    const lone = await pickedUp()
    expect((await owner.session.post(`/api/requests/${lone}/review`, studioAnswers)).status).toBe(200)
    expect((await view(potter, lone)).reviews.ofPotter).toBeNull()
    // Three weeks and a day on: the pickup was 22 days ago and the publish job is due.
    await app.ctx.db.query(
      `UPDATE request_events SET at = now() - interval '22 days' WHERE request_id = $1 AND to_state IN ('collected', 'disputed')`,
      [lone],
    )
    await app.ctx.db.query(`UPDATE reviews SET closes_at = now() - interval '1 day' WHERE request_id = $1`, [lone])
    await app.ctx.db.query(`UPDATE graphile_worker._private_jobs SET run_at = now() WHERE key = $1`, [`publish-reviews:${lone}`])
    await expect.poll(async () => (await view(potter, lone)).reviews.ofPotter?.onTime ?? null, { timeout: 30_000 }).toBe('yes')
    expect((await view(potter, lone)).actions).not.toContain('rate')
    const late = await potter.session.post(`/api/requests/${lone}/review`, potterAnswers)
    expect(late.status).toBe(409)
    expect(late.body.error.code).toBe('review-window-closed')
    expect((await view(potter, lone)).timeline.at(-1).reason).toBe('The window for answers closed: the answers given are published')
  }, 150_000)
})

describe('the migration from star ratings', () => {
  it('turns stars into answers, publishes them as they were, and moves the studio’s replies into the thread', async () => {
    const runner = app.ctx.db.createQueryRunner()
    const migration = new ReviewsAfterPickup1796174002687()
    const requestId = (await app.ctx.db.query(`SELECT request_id FROM reviews WHERE side = 'potter' LIMIT 1`))[0].request_id
    try {
      await migration.down(runner)
      await app.ctx.db.query(`DELETE FROM ratings`)
      await app.ctx.db.query(
        `INSERT INTO ratings (request_id, direction, studio_id, potter_id, author_id, stars, care, communication, results, text, studio_reply, studio_reply_at, created_at)
         VALUES ($1, 'potter-rates-studio', $2, $3, $3, 4, 2, NULL, 3, 'Good kiln, rough unloading', 'Sorry about the chip.', now() - interval '2 days', now() - interval '3 days')`,
        [requestId, ids.studioId, potter.id],
      )
      await app.ctx.db.query(
        `INSERT INTO ratings (request_id, direction, studio_id, potter_id, author_id, stars, as_declared, on_time, text, created_at)
         VALUES ($1, 'studio-rates-potter', $2, $3, $4, 2, 5, NULL, '', now() - interval '3 days')`,
        [requestId, ids.studioId, potter.id, owner.id],
      )
      await migration.up(runner)
    } finally {
      await runner.release()
    }
    const [mine, theirs] = ['potter', 'studio'].map((side) =>
      app.ctx.db.getRepository(Review).findOneByOrFail({ requestId, side: side as 'potter' | 'studio' }),
    )
    // Stars: 4–5 yes, 3 partly, 1–2 no; an unrated aspect takes the overall; fire again when the overall was 4 or 5.
    expect(await mine).toMatchObject({
      loading: 'no',
      resultsAsLogged: 'partly',
      turnaround: 'yes',
      communication: 'yes',
      fireAgain: true,
      note: 'Good kiln, rough unloading',
    })
    expect(await theirs).toMatchObject({ asDeclared: 'yes', cleanAndDry: 'no', onTime: 'no', fireAgain: null })
    expect((await mine).publishedAt).not.toBeNull()
    expect(await app.ctx.db.query(`SELECT to_regclass('ratings') AS still`)).toEqual([{ still: null }])
    const thread = (await owner.session.get(`/api/requests/${requestId}/messages`)).body
    expect(JSON.stringify(thread)).toContain('Sorry about the chip.')
  })
})
