// Incidents and damage claims through the API: an incident reported on a logged firing with the failed
// piece and a neighbour's hurt piece named by tag, its diagnosis read from what was seen and the log,
// who may see and report it, bad input refused field by field, a claim held to the studio's terms, paid
// through the Stripe stand-in into the ask's ledger (the ledger invariant holding with the studio paid
// its share), and a contested claim decided by the front desk.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEFAULT_DAMAGE_CHARGES } from '../../shared/claims'
import { CARD_SUCCEEDS, submitCard } from '../support/checkout'
import { clayPhoto } from '../support/dispute-fixture'
import type { HttpSession } from '../support/http-client'
import { checkLedgers } from '../support/ledger'
import { checkInAll, collected, fireThrough, moneyQuiet, onboard, payBalanceOnline, resultsAndReady } from '../support/money'
import { createPerson, type Person } from '../support/people'
import { mug, sendAndPayDeposit } from '../support/request-fixtures'
import { publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'
import { waitUntil } from '../support/wait'

let app: TestApp
let owner: Person
let crew: Person
let potter: Person
let neighbour: Person
let stranger: Person
let admin: Person
let ids: { studioId: string; kilnId: string; firingId: string }
let requestId: string
let neighbourRequestId: string
let tag: string
let neighbourTag: string
let incidentId: string

const passes = { sound: true, 'clean-foot': true }
const hoursAgo = (hours: number) => new Date(Date.now() - hours * 3_600_000).toISOString()

async function tagOne(studio: HttpSession, request: string) {
  const reply = await studio.post(`/api/requests/${request}/pieces`, { pieceIndex: 0, checks: passes })
  if (reply.status !== 201) throw new Error(`tag: ${reply.status} ${JSON.stringify(reply.body)}`)
  return reply.body.piece.tag as string
}

/**
 * A log that climbs to 200 °C at 400 °C/h (the plan for this kiln allows 100 °C/h through water
 * smoking), then steadily at 40 °C/h to 1185 °C with a 10 minute hold, and cools at 20 °C/h: slower
 * than the plan everywhere else.
 */
function fastEarlyClimb(endHoursAgo: number) {
  const points: [minute: number, tempC: number][] = [[0, 20]]
  const to = (tempC: number, rateCPerHour: number) => {
    const [minute, from] = points[points.length - 1]
    points.push([minute + (Math.abs(tempC - from) / rateCPerHour) * 60, tempC])
  }
  to(200, 400)
  to(1185, 40)
  points.push([points[points.length - 1][0] + 10, 1185])
  to(30, 20)
  const total = points[points.length - 1][0]
  const start = Date.now() - endHoursAgo * 3_600_000 - total * 60_000
  return points.map(([minute, tempC]) => ({ at: new Date(start + minute * 60_000).toISOString(), tempC }))
}

async function photo(session: HttpSession, incident: string) {
  const form = new FormData()
  form.append('photos', new Blob([new Uint8Array(await clayPhoto())], { type: 'image/jpeg' }), 'kiln.jpg')
  return session.request('POST', `/api/incidents/${incident}/photos`, undefined, { raw: form })
}

beforeAll(async () => {
  app = await startTestApp({ stripe: true, config: { marketplaceFee: { percent: 10, minimumCents: 100 }, payoutHoldHours: 0 } })
  owner = await createPerson(app, 'host', 'Maren Kiln')
  crew = await createPerson(app, 'host', 'Ola Crew')
  potter = await createPerson(app, 'potter', 'Ravi Thickwall')
  neighbour = await createPerson(app, 'potter', 'June Nextshelf')
  stranger = await createPerson(app, 'potter', 'Ada Elsewhere')
  admin = await createPerson(app, 'admin', 'Desk Person')
  ids = await publishedStudio(owner.session, 'Incident Studio')
  await app.ctx.db.query(`INSERT INTO studio_members (studio_id, user_id, role) VALUES ($1, $2, 'crew')`, [ids.studioId, crew.id])
  requestId = (await sendAndPayDeposit(app, owner.session, potter.session, ids.firingId, [mug({ quantity: 1 })])).id
  neighbourRequestId = (await sendAndPayDeposit(app, owner.session, neighbour.session, ids.firingId, [mug({ quantity: 1 })])).id
  tag = await tagOne(owner.session, requestId)
  neighbourTag = await tagOne(owner.session, neighbourRequestId)
  await checkInAll(owner.session, requestId, [1])
  await checkInAll(owner.session, neighbourRequestId, [1])
  const readings = fastEarlyClimb(2)
  const log = await owner.session.put(`/api/firings/${ids.firingId}/log`, { loadedAt: hoursAgo(120), startedAt: readings[0].at, readings })
  if (log.status !== 200) throw new Error(`log: ${log.status} ${JSON.stringify(log.body)}`)
}, 180_000)

afterAll(async () => {
  await app?.close()
})

describe('reporting an incident', () => {
  it('refuses bad input field by field, never a 500', async () => {
    const badKind = await owner.session.post(`/api/firings/${ids.firingId}/incidents`, { kind: 'explosion', pieceTags: [tag] })
    expect(badKind.status).toBe(400)
    expect(badKind.body.error.fields.kind).toBeTruthy()
    const notATag = await owner.session.post(`/api/firings/${ids.firingId}/incidents`, { kind: 'blowout', pieceTags: ['hello'] })
    expect(notATag.status).toBe(400)
    expect(notATag.body.error.fields['pieceTags.0']).toBeTruthy()
    const noPiece = await owner.session.post(`/api/firings/${ids.firingId}/incidents`, { kind: 'blowout' })
    expect(noPiece.status).toBe(400)
    expect(noPiece.body.error.fields.pieceTags).toBeTruthy()
    const twoAsks = await owner.session.post(`/api/firings/${ids.firingId}/incidents`, { kind: 'blowout', pieceTags: [tag, neighbourTag] })
    expect(twoAsks.status).toBe(400)
  })

  it('is refused to someone with no ware in the firing, as if the firing were not there', async () => {
    const reply = await stranger.session.post(`/api/firings/${ids.firingId}/incidents`, { kind: 'blowout', requestId })
    expect(reply.status).toBe(404)
  })

  it('records a blowout named by tag, reads it as water smoking from the fast early climb, and tells the potters', async () => {
    const reply = await crew.session.post(`/api/firings/${ids.firingId}/incidents`, {
      kind: 'blowout',
      shards: true,
      whereInKiln: 'Middle shelf, back',
      note: 'Shards across the middle shelf.',
      pieceTags: [tag],
      hurtTags: [neighbourTag],
    })
    expect(reply.status, JSON.stringify(reply.body)).toBe(201)
    incidentId = reply.body.id
    expect(reply.body).toMatchObject({ requestId, kind: 'blowout', neighboursHit: true, logged: true, reportedBy: 'studio' })
    expect(reply.body.pieces).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ tag, role: 'failed', potterName: 'Ravi Thickwall' }),
        expect.objectContaining({ tag: neighbourTag, role: 'hurt', potterName: 'June Nextshelf' }),
      ]),
    )
    // Common practice: a burst with shards after a fast climb below 200 °C is steam (water smoking).
    expect(reply.body.diagnosis.phase).toBe('water-smoking')
    expect(reply.body.diagnosis.confidence).toBe('high')
    expect(reply.body.diagnosis.reasons.join(' ')).toMatch(/climbed faster than planned/)
    expect(reply.body.diagnosis.advice.some((a: { for: string }) => a.for === 'studio')).toBe(true)

    const timeline = (await potter.session.get(`/api/requests/${requestId}`)).body.timeline as { reason: string }[]
    expect(timeline.some((t) => /Incident reported: blew apart/.test(t.reason))).toBe(true)
    const kinds = async (person: Person) =>
      ((await app.ctx.db.query(`SELECT kind FROM notices WHERE user_id = $1`, [person.id])) as { kind: string }[]).map((n) => n.kind)
    expect(await kinds(potter)).toContain('incident-reported')
    expect(await kinds(neighbour)).toContain('ware-hurt')
  })

  it('takes photos from the studio, shows them to the hurt neighbour, and sends the neighbour the links', async () => {
    const added = await photo(owner.session, incidentId)
    expect(added.status, JSON.stringify(added.body)).toBe(201)
    const photoId = added.body.photos[0].id
    expect((await neighbour.session.get(`/api/photos/${photoId}`)).status).toBe(200)
    expect((await stranger.session.get(`/api/photos/${photoId}`)).status).toBe(404)
    const neighbourSees = await neighbour.session.get(`/api/incidents/${incidentId}`)
    expect(neighbourSees.status).toBe(200)
    expect(neighbourSees.body.viewerSide).toBe('neighbour')
    expect(neighbourSees.body.photos).toHaveLength(1)
    expect(neighbourSees.body.claims).toEqual([])
    const mails: { body_text: string }[] = await app.ctx.db.query(
      `SELECT m.* FROM outbound_mail m JOIN users u ON u.email = m.to_address WHERE u.id = $1 AND m.template = 'ware-hurt'`,
      [neighbour.id],
    )
    expect(JSON.stringify(mails)).toContain(`/api/photos/${photoId}`)
    // The ask's own photos stay apart from the incident's.
    expect((await potter.session.get(`/api/requests/${requestId}`)).body.photos).toEqual([])
  })

  it('lists the firing’s incidents to each side as far as they may see', async () => {
    expect((await owner.session.get(`/api/firings/${ids.firingId}/incidents`)).body.incidents).toHaveLength(1)
    expect((await neighbour.session.get(`/api/firings/${ids.firingId}/incidents`)).body.incidents).toHaveLength(1)
    expect((await stranger.session.get(`/api/firings/${ids.firingId}/incidents`)).status).toBe(404)
    expect((await stranger.session.get(`/api/incidents/${incidentId}`)).status).toBe(404)
  })
})

describe('a damage claim', () => {
  let claimId: string

  it('is raised by the studio’s owner only, within the terms', async () => {
    const body = { chargeKind: 'kiln-cleaning', amountCents: 4500, note: 'Vacuumed shards out of two elements.' }
    expect((await crew.session.post(`/api/incidents/${incidentId}/claims`, body)).status).toBe(403)
    expect((await potter.session.post(`/api/incidents/${incidentId}/claims`, body)).status).toBe(403)
    expect((await neighbour.session.post(`/api/incidents/${incidentId}/claims`, body)).status).toBe(404)
    const over = await owner.session.post(`/api/incidents/${incidentId}/claims`, {
      ...body,
      amountCents: DEFAULT_DAMAGE_CHARGES['kiln-cleaning'] + 1,
    })
    expect(over.status).toBe(400)
    expect(over.body.error.fields.amountCents).toMatch(/at most 60\.00/)
    expect((await owner.session.post(`/api/incidents/${incidentId}/claims`, { ...body, chargeKind: 'gold' })).status).toBe(400)
    const raised = await owner.session.post(`/api/incidents/${incidentId}/claims`, body)
    expect(raised.status, JSON.stringify(raised.body)).toBe(201)
    claimId = raised.body.id
    expect(raised.body).toMatchObject({ status: 'raised', amountCents: 4500, currency: 'USD' })
    expect((await owner.session.post(`/api/incidents/${incidentId}/claims`, body)).status).toBe(409)
    const seen = (await potter.session.get(`/api/incidents/${incidentId}`)).body.claims[0]
    expect(seen.actions).toEqual(['pay', 'contest'])
  })

  it('is paid by the potter alone, through a checkout page, into the ask’s ledger', async () => {
    expect((await owner.session.post(`/api/claims/${claimId}/accept`)).status).toBe(403)
    expect((await stranger.session.post(`/api/claims/${claimId}/accept`)).status).toBe(404)
    // Leaving the checkout page and pressing Pay again opens another page but notes the agreement once.
    expect((await potter.session.post(`/api/claims/${claimId}/accept`)).status).toBe(200)
    const accepted = await potter.session.post(`/api/claims/${claimId}/accept`)
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
    const agreed = (await potter.session.get(`/api/requests/${requestId}`)).body.timeline.filter((t: { reason: string }) =>
      t.reason.startsWith('The potter agreed to pay the damage claim'),
    )
    expect(agreed).toHaveLength(1)
    const paid = await submitCard(accepted.body.checkoutUrl, { cardNumber: CARD_SUCCEEDS })
    expect(paid.status).toBe(303)
    await waitUntil(async () => (await potter.session.get(`/api/incidents/${incidentId}`)).body.claims[0].status === 'paid', {
      what: 'the claim webhook',
    })
    const view = (await potter.session.get(`/api/requests/${requestId}`)).body
    expect(view.ledger.some((e: { kind: string; amountCents: number }) => e.kind === 'claim' && e.amountCents === 4500)).toBe(true)
    // The claim is not toward the firing's price: nothing of it counts as paid toward the ware.
    expect(view.price.balanceOwedCents).toBeGreaterThan(0)
    expect((await potter.session.post(`/api/claims/${claimId}/contest`, { reason: 'Changed my mind about it.' })).status).toBe(409)
  })

  it('pays the studio its share with the ask’s money once the ware is collected, the ledger balancing', async () => {
    await onboard(app, owner.session, ids.studioId)
    await fireThrough(owner.session, ids.firingId)
    for (const id of [requestId, neighbourRequestId]) {
      await resultsAndReady(owner.session, id)
      await payBalanceOnline(app, id === requestId ? potter.session : neighbour.session, id)
      await collected(owner.session, id)
    }
    await moneyQuiet(app, { heldToo: true })
    const report = await checkLedgers(app)
    const ledger = report.requests.find((r) => r.requestId === requestId)!.ledger
    // 10 % fee (the test's rule) on everything kept online, the claim's 45.00 with it.
    const paidOnline = ledger.keptOnlineCents
    expect(ledger.paidInCents).toBe(paidOnline)
    expect(ledger.feeCents).toBe(Math.round(paidOnline * 0.1))
    expect(ledger.transferredCents).toBe(paidOnline - ledger.feeCents)
  })
})

describe('a contested claim', () => {
  it('goes to the front desk, which upholds or waives it; only the desk decides', async () => {
    const crack = await owner.session.post(`/api/firings/${ids.firingId}/incidents`, {
      kind: 'crack',
      crackEdge: 'sharp',
      shelfDamage: true,
      pieceTags: [tag],
    })
    expect(crack.status, JSON.stringify(crack.body)).toBe(201)
    const claim = await owner.session.post(`/api/incidents/${crack.body.id}/claims`, { chargeKind: 'shelf-ground', amountCents: 2000 })
    expect(claim.status).toBe(201)
    const contested = await potter.session.post(`/api/claims/${claim.body.id}/contest`, {
      reason: 'The crack is a cooling dunt, not my clay.',
    })
    expect(contested.status, JSON.stringify(contested.body)).toBe(200)
    expect(contested.body.status).toBe('contested')
    expect((await potter.session.post(`/api/claims/${claim.body.id}/contest`, { reason: 'x' })).status).toBe(400)
    expect((await potter.session.post(`/api/claims/${claim.body.id}/accept`)).status).toBe(409)

    const desk = await admin.session.get('/api/admin/claims')
    expect(desk.body.claims.map((c: { id: string }) => c.id)).toContain(claim.body.id)
    expect((await owner.session.get('/api/admin/claims')).status).toBe(403)
    expect((await owner.session.post(`/api/admin/claims/${claim.body.id}/decide`, { decision: 'waive' })).status).toBe(403)
    expect((await admin.session.post(`/api/admin/claims/${claim.body.id}/decide`, { decision: 'maybe' })).status).toBe(400)
    const waived = await admin.session.post(`/api/admin/claims/${claim.body.id}/decide`, {
      decision: 'waive',
      note: 'The log shows a fast cool through 220 °C.',
    })
    expect(waived.status, JSON.stringify(waived.body)).toBe(200)
    expect(waived.body.status).toBe('waived')
    const studioMails: { template: string }[] = await app.ctx.db.query(
      `SELECT m.template FROM outbound_mail m JOIN users u ON u.email = m.to_address WHERE u.id = $1`,
      [owner.id],
    )
    expect(studioMails.map((m) => m.template)).toEqual(expect.arrayContaining(['claim-contested', 'claim-decided', 'claim-paid']))
  })
})

describe('learning from incidents', () => {
  it('counts the studio’s incidents by kiln, firing kind and phase for its people only', async () => {
    const history = await crew.session.get(`/api/studios/${ids.studioId}/incidents`)
    expect(history.status).toBe(200)
    expect(history.body.incidents).toHaveLength(2)
    expect(history.body.rows.find((r: { phase: string }) => r.phase === 'water-smoking')).toMatchObject({ count: 1 })
    expect((await potter.session.get(`/api/studios/${ids.studioId}/incidents`)).status).toBe(403)
  })

  it('shows the potter’s record to a studio deciding on their ask, and to no one else', async () => {
    const record = await owner.session.get(`/api/requests/${requestId}/potter-record`)
    expect(record.status).toBe(200)
    expect(record.body).toMatchObject({ count: 2, claimsPaid: 1, claimsWaived: 1 })
    expect((await neighbour.session.get(`/api/requests/${requestId}/potter-record`)).status).toBe(404)
  })
})

describe('the studio’s own damage charges, and a claim upheld at the front desk', () => {
  const charges = { 'kiln-cleaning': 5000, 'shelf-ground': 0, 'shelf-replaced': 7000, 'other-ware': 20000 }
  let crackId: string
  let claimId: string
  const mailsTo = async (person: Person, template: string, containing: string) =>
    (
      (await app.ctx.db.query(
        `SELECT m.body_text FROM outbound_mail m JOIN users u ON u.email = m.to_address WHERE u.id = $1 AND m.template = $2`,
        [person.id, template],
      )) as { body_text: string }[]
    ).filter((m) => m.body_text.includes(containing))
  const noticesOf = async (person: Person, kind: string) =>
    (
      (await app.ctx.db.query(`SELECT count(*)::int AS n FROM notices WHERE user_id = $1 AND kind = $2`, [person.id, kind])) as {
        n: number
      }[]
    )[0].n

  it('saves the charges through the studio’s terms, refusing bad ones by the field and keeping what was stored', async () => {
    const before = (await owner.session.get(`/api/studios/${ids.studioId}`)).body
    const saved = await owner.session.patch(`/api/studios/${ids.studioId}`, { policies: { ...before.policies, damageCharges: charges } })
    expect(saved.status, JSON.stringify(saved.body)).toBe(200)
    expect(saved.body.policies.damageCharges).toEqual(charges)
    // Potters agree to a version of the terms; new charges are a new version.
    expect(saved.body.policiesVersion).toBe(before.policiesVersion + 1)

    for (const [kind, cents] of [
      ['kiln-cleaning', -100],
      ['shelf-replaced', 70.5],
      ['other-ware', 1_000_001],
      ['shelf-ground', '20'],
    ] as const) {
      const refused = await owner.session.patch(`/api/studios/${ids.studioId}`, {
        policies: { ...before.policies, damageCharges: { ...charges, [kind]: cents } },
      })
      expect(refused.status, `${kind} = ${cents}`).toBe(400)
      expect(Object.keys(refused.body.error.fields)).toEqual([`policies.damageCharges.${kind}`])
    }
    const after = (await owner.session.get(`/api/studios/${ids.studioId}`)).body
    expect(after.policies.damageCharges).toEqual(charges)
    expect(after.policiesVersion).toBe(saved.body.policiesVersion)
    expect((await crew.session.patch(`/api/studios/${ids.studioId}`, { policies: { ...before.policies } })).status).toBe(403)
  })

  it('holds a claim to the saved charges: a cent over is refused as over the terms, the cap itself is taken', async () => {
    const crack = await crew.session.post(`/api/firings/${ids.firingId}/incidents`, {
      kind: 'crack',
      crackEdge: 'sharp',
      shelfDamage: true,
      whereInKiln: 'Bottom shelf, front',
      pieceTags: [tag],
    })
    expect(crack.status, JSON.stringify(crack.body)).toBe(201)
    crackId = crack.body.id
    expect(crack.body.damageCharges).toEqual(charges)
    expect(crack.body.claimCurrency).toBe('USD')

    const over = await owner.session.post(`/api/incidents/${crackId}/claims`, { chargeKind: 'shelf-replaced', amountCents: 7001 })
    expect(over.status).toBe(400)
    expect(over.body.error.code).toBe('over-terms')
    expect(over.body.error.fields.amountCents).toMatch(/at most 70\.00/)
    // A charge of 0 is one the studio does not make.
    const none = await owner.session.post(`/api/incidents/${crackId}/claims`, { chargeKind: 'shelf-ground', amountCents: 100 })
    expect(none.status).toBe(400)
    expect(none.body.error.code).toBe('over-terms')
    const atCap = await owner.session.post(`/api/incidents/${crackId}/claims`, {
      chargeKind: 'shelf-replaced',
      amountCents: 7000,
      note: 'The bottom shelf cracked through under the piece.',
    })
    expect(atCap.status, JSON.stringify(atCap.body)).toBe(201)
    claimId = atCap.body.id
    expect(atCap.body).toMatchObject({ status: 'raised', amountCents: 7000, currency: 'USD' })
  })

  it('is contested, upheld by the front desk alone, both sides told, and then paid by the potter into the ledger', async () => {
    // Only a contested claim is the desk's to decide.
    const early = await admin.session.post(`/api/admin/claims/${claimId}/decide`, { decision: 'uphold' })
    expect(early.status).toBe(409)
    expect(early.body.error.code).toBe('bad-claim-state')

    const contested = await potter.session.post(`/api/claims/${claimId}/contest`, {
      reason: 'The shelf was cracked before my piece went on it.',
    })
    expect(contested.status, JSON.stringify(contested.body)).toBe(200)
    expect((await owner.session.post(`/api/admin/claims/${claimId}/decide`, { decision: 'uphold' })).status).toBe(403)
    expect((await potter.session.post(`/api/admin/claims/${claimId}/decide`, { decision: 'uphold' })).status).toBe(403)
    expect((await admin.session.get(`/api/admin/claims`)).body.claims.map((c: { id: string }) => c.id)).toContain(claimId)

    const noticesBefore = { potter: await noticesOf(potter, 'claim-decided'), studio: await noticesOf(owner, 'claim-decided') }
    const deskNote = 'The photos show glaze run onto the shelf from this piece.'
    const upheld = await admin.session.post(`/api/admin/claims/${claimId}/decide`, { decision: 'uphold', note: deskNote })
    expect(upheld.status, JSON.stringify(upheld.body)).toBe(200)
    expect(upheld.body).toMatchObject({ status: 'upheld', deskNote })
    expect((await admin.session.post(`/api/admin/claims/${claimId}/decide`, { decision: 'waive' })).status).toBe(409)
    expect((await admin.session.get(`/api/admin/claims`)).body.claims.map((c: { id: string }) => c.id)).not.toContain(claimId)

    expect(await noticesOf(potter, 'claim-decided')).toBe(noticesBefore.potter + 1)
    expect(await noticesOf(owner, 'claim-decided')).toBe(noticesBefore.studio + 1)
    for (const [who, person] of [
      ['potter', potter],
      ['studio', owner],
    ] as const) {
      const mails = await mailsTo(person, 'claim-decided', deskNote)
      expect(mails, who).toHaveLength(1)
      expect(mails[0].body_text).toContain('upheld')
    }

    const potterSees = (await potter.session.get(`/api/incidents/${crackId}`)).body.claims.find((c: { id: string }) => c.id === claimId)
    expect(potterSees).toMatchObject({ status: 'upheld', actions: ['pay'], deskNote })
    const studioSees = (await owner.session.get(`/api/incidents/${crackId}`)).body.claims.find((c: { id: string }) => c.id === claimId)
    expect(studioSees).toMatchObject({ status: 'upheld', actions: [] })
    expect((await potter.session.post(`/api/claims/${claimId}/contest`, { reason: 'Still not my piece, I say.' })).status).toBe(409)
    expect((await owner.session.post(`/api/claims/${claimId}/accept`)).status).toBe(403)

    const accepted = await potter.session.post(`/api/claims/${claimId}/accept`)
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
    const paid = await submitCard(accepted.body.checkoutUrl, { cardNumber: CARD_SUCCEEDS })
    expect(paid.status).toBe(303)
    await waitUntil(
      async () =>
        (await potter.session.get(`/api/incidents/${crackId}`)).body.claims.find((c: { id: string }) => c.id === claimId).status === 'paid',
      { what: 'the upheld claim’s webhook' },
    )
    expect(await mailsTo(owner, 'claim-paid', '70.00')).toHaveLength(1)

    const view = (await potter.session.get(`/api/requests/${requestId}`)).body
    expect(view.ledger.filter((e: { kind: string; amountCents: number }) => e.kind === 'claim' && e.amountCents === 7000)).toHaveLength(1)
    const reasons = (view.timeline as { reason: string }[]).map((t) => t.reason)
    const order = [
      /^Damage claim raised: shelf replaced, \$70\.00/,
      /^The potter contested the damage claim; it goes to the front desk: The shelf was cracked before/,
      /^The front desk upheld the damage claim: The photos show glaze run/,
      /^The potter agreed to pay the damage claim \(\$70\.00\)/,
      /^Damage claim paid through Stripe: \$70\.00/,
    ].map((pattern) => reasons.findIndex((r) => pattern.test(r)))
    expect(
      order.every((at) => at >= 0),
      JSON.stringify(reasons),
    ).toBe(true)
    expect([...order].sort((a, b) => a - b)).toEqual(order)

    // The ask was collected before: the claim's share is earned at once and the ledger still balances.
    await moneyQuiet(app, { heldToo: true })
    await checkLedgers(app)
    const record = await owner.session.get(`/api/requests/${requestId}/potter-record`)
    expect(record.body).toMatchObject({ count: 3, claimsPaid: 2, claimsWaived: 1 })
  })
})
