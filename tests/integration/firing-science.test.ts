// The second pass of the firing science through the API and the database: the firing log's curve
// (stored readings, the cone from their heat work, flags where it ran faster than the plan), log times
// refused in the future or before loading, lustre and raku firings, cooling profiles, what a shelf
// carries, and the migration that turned `onCookie` into `support`.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { PieceSupport1796167700000 } from '../../server/db/migrations/1796167700000-PieceSupport'
import { FiringRequest } from '../../server/entities/FiringRequest'
import { createPerson, type Person } from '../support/people'
import { mug, sendAndPayDeposit } from '../support/request-fixtures'
import { electricKiln, firingBody, publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let owner: Person
let potter: Person
let ids: { studioId: string; kilnId: string; firingId: string }

beforeAll(async () => {
  app = await startTestApp({ stripe: true })
  owner = await createPerson(app, 'host', 'Ines Brandt')
  potter = await createPerson(app, 'potter', 'Tomas Reyes')
  ids = await publishedStudio(owner.session, 'Brandt Clayworks')
})

afterAll(async () => {
  await app?.close()
})

const hoursAgo = (hours: number) => new Date(Date.now() - hours * 3_600_000).toISOString()

/** A steady 60 °C/h climb to 1222 °C read every half hour, ending `endHoursAgo` hours ago: chart cone 6. */
function steadyReadings(endHoursAgo: number) {
  const minutes = ((1222 - 20) / 60) * 60
  const start = Date.now() - endHoursAgo * 3_600_000 - minutes * 60_000
  const readings = []
  for (let m = 0; m <= minutes; m += 30) readings.push({ at: new Date(start + m * 60_000).toISOString(), tempC: 20 + m })
  readings.push({ at: new Date(start + minutes * 60_000).toISOString(), tempC: 1222 })
  return readings
}

describe('the firing log’s curve', () => {
  it('stores the readings and answers the cone of their heat work, with no flags for a curve within the plan', async () => {
    const readings = steadyReadings(2)
    const reply = await owner.session.put(`/api/firings/${ids.firingId}/log`, {
      loadedAt: hoursAgo(30),
      startedAt: readings[0].at,
      readings,
      witnessCones: [
        { cone: '5', bend: 'touching', position: 'Top' },
        { cone: '6', bend: 'three-oclock', position: 'Top' },
        { cone: '6', bend: 'bending', position: 'Bottom' },
        { cone: '5', bend: 'three-oclock', position: 'Bottom' },
      ],
    })
    expect(reply.status, JSON.stringify(reply.body)).toBe(200)
    expect(reply.body.readings).toHaveLength(readings.length)
    // Chart (60 °C/h column): cone 6 at 1222 °C.
    expect(reply.body.curve).toMatchObject({ cone: '6', peakC: 1222, flags: [] })
    expect(reply.body.coneCheck).toMatchObject({ fromCurve: '6', fromCones: '5', coldSpotReached: false })
    expect(reply.body.coneCheck.coolest.position).toBe('Bottom')
    expect(reply.body.plan.length).toBeGreaterThan(3)
    const again = await owner.session.get(`/api/firings/${ids.firingId}/log`)
    expect(again.body.readings).toEqual(reply.body.readings)
  })

  it('flags a climb through quartz far faster than the plan', async () => {
    const start = Date.now() - 20 * 3_600_000
    const at = (minute: number) => new Date(start + minute * 60_000).toISOString()
    const reply = await owner.session.put(`/api/firings/${ids.firingId}/log`, {
      loadedAt: hoursAgo(21),
      readings: [
        { at: at(0), tempC: 20 },
        { at: at(300), tempC: 530 },
        // 530 → 630 °C in 20 minutes: 300 °C/h through the quartz inversion.
        { at: at(320), tempC: 630 },
      ],
    })
    expect(reply.status, JSON.stringify(reply.body)).toBe(200)
    const quartz = reply.body.curve.flags.find((flag: { zone: string }) => flag.zone === 'quartz-heating')
    expect(quartz.rateCPerHour).toBeCloseTo(300, 6)
  })

  it('refuses times in the future and readings from before loading, with field messages (400, never 500)', async () => {
    const future = await owner.session.put(`/api/firings/${ids.firingId}/log`, { loadedAt: hoursAgo(5), offAt: hoursAgo(-3) })
    expect(future.status).toBe(400)
    expect(future.body.error.fields.offAt).toMatch(/future/)

    const early = await owner.session.put(`/api/firings/${ids.firingId}/log`, {
      loadedAt: hoursAgo(5),
      readings: [
        { at: hoursAgo(6), tempC: 20 },
        { at: hoursAgo(4), tempC: 200 },
      ],
    })
    expect(early.status).toBe(400)
    expect(early.body.error.fields['readings.0.at']).toMatch(/before the kiln was loaded/)
    expect(early.body.error.fields.readings).toMatch(/Reading 1/)

    const aheadReading = await owner.session.put(`/api/firings/${ids.firingId}/log`, {
      loadedAt: hoursAgo(5),
      readings: [{ at: hoursAgo(-1), tempC: 200 }],
    })
    expect(aheadReading.status).toBe(400)
    expect(aheadReading.body.error.fields['readings.0.at']).toMatch(/future/)

    const unloaded = await owner.session.put(`/api/firings/${ids.firingId}/log`, { readings: [{ at: hoursAgo(1), tempC: 200 }] })
    expect(unloaded.status).toBe(400)
    expect(unloaded.body.error.fields.loadedAt).toMatch(/loaded/)

    const garbage = await owner.session.put(`/api/firings/${ids.firingId}/log`, {
      loadedAt: hoursAgo(5),
      readings: [{ at: 'yesterday', tempC: 'hot' }],
    })
    expect(garbage.status).toBe(400)
  })
})

describe('lustre and raku firings, cooling profiles and shelf loads', () => {
  it('posts a lustre firing and a raku firing, and keeps a firing’s cooling profile', async () => {
    const lustre = await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody({ kind: 'lustre', cone: '018' }))
    expect(lustre.status, JSON.stringify(lustre.body)).toBe(201)
    expect(lustre.body.firings[0]).toMatchObject({ kind: 'lustre', cone: '018', cooling: 'natural' })
    const glaze = await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody({ cooling: 'glaze-development' }))
    expect(glaze.body.firings[0].cooling).toBe('glaze-development')
    const bad = await owner.session.post(`/api/kilns/${ids.kilnId}/firings`, firingBody({ cooling: 'fast' }))
    expect(bad.status).toBe(400)
    expect(bad.body.error.fields.cooling).toBeTruthy()

    const raku = await owner.session.post(`/api/studios/${ids.studioId}/kilns`, {
      ...electricKiln,
      name: 'Raku barrel',
      kind: 'raku',
      atmospheres: ['oxidation', 'reduction'],
      maxCone: '04',
      maxTempC: 1100,
      maxRampCPerHour: 600,
      controlledCooling: false,
    })
    expect(raku.status, JSON.stringify(raku.body)).toBe(201)
    const rakuFiring = await owner.session.post(`/api/kilns/${raku.body.id}/firings`, firingBody({ kind: 'raku', cone: '06' }))
    expect(rakuFiring.status, JSON.stringify(rakuFiring.body)).toBe(201)
    expect(rakuFiring.body.firings[0].kind).toBe('raku')
  })

  it('keeps what a shelf carries, clears it with null, and checks heavy ware against it', async () => {
    const set = await owner.session.patch(`/api/kilns/${ids.kilnId}`, { shelfLoadKg: 10 })
    expect(set.status, JSON.stringify(set.body)).toBe(200)
    expect(set.body.shelfLoadKg).toBe(10)
    const check = await potter.session.post('/api/ware-checks', { firingId: ids.firingId, pieces: [mug({ weightG: 12_000, quantity: 1 })] })
    expect(check.status, JSON.stringify(check.body)).toBe(200)
    expect(check.body.findings.map((f: { code: string }) => f.code)).toContain('shelf-overweight')
    const cleared = await owner.session.patch(`/api/kilns/${ids.kilnId}`, { shelfLoadKg: null })
    expect(cleared.body.shelfLoadKg).toBeUndefined()
    const refused = await owner.session.patch(`/api/kilns/${ids.kilnId}`, { shelfLoadKg: -2 })
    expect(refused.status).toBe(400)
  })
})

describe('the migration from onCookie to support', () => {
  it('turns onCookie true into support cookie and leaves other pieces on the shelf', async () => {
    const sent = await sendAndPayDeposit(app, owner.session, potter.session, ids.firingId, [mug()])
    const repo = app.ctx.db.getRepository(FiringRequest)
    const legacy = [
      { ...mug(), glaze: { minCone: '5', maxCone: '7', runny: true, onCookie: true } },
      { ...mug(), glaze: { minCone: '5', maxCone: '7', onCookie: false } },
      { ...mug(), glaze: undefined },
    ]
    await app.ctx.db.query(`UPDATE firing_requests SET pieces = $2::jsonb WHERE id = $1`, [sent.id, JSON.stringify(legacy)])
    const runner = app.ctx.db.createQueryRunner()
    try {
      await new PieceSupport1796167700000().up(runner)
    } finally {
      await runner.release()
    }
    const pieces = (await repo.findOneByOrFail({ id: sent.id })).pieces
    expect(pieces[0].glaze).toEqual({ minCone: '5', maxCone: '7', runny: true, support: 'cookie' })
    expect(pieces[1].glaze).toEqual({ minCone: '5', maxCone: '7', support: 'none' })
    expect(pieces[2].glaze).toBeUndefined()
  })
})
