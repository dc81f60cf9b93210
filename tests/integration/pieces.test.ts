// Pieces at drop-off through the API: each piece tagged against the studio's checklist, one held back
// alone with the potter told, opened by its tag by those who may see the request, placed in the
// firing's load plan, and printed on labels with a QR code.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { OutboundMail } from '../../server/entities/OutboundMail'
import { createPerson, type Person } from '../support/people'
import { mug, sendAndPayDeposit } from '../support/request-fixtures'
import { publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let owner: Person
let potter: Person
let stranger: Person
let ids: { studioId: string; kilnId: string; firingId: string }
let requestId: string
const tags: string[] = []
let heldTag: string

beforeAll(async () => {
  app = await startTestApp({ stripe: true })
  owner = await createPerson(app, 'host', 'Ines Owner')
  potter = await createPerson(app, 'potter', 'Theo Potter')
  stranger = await createPerson(app, 'potter', 'Wren Elsewhere')
  ids = await publishedStudio(owner.session, 'Tag Studio')
  requestId = (await sendAndPayDeposit(app, owner.session, potter.session, ids.firingId, [mug({ quantity: 3 })])).id
}, 120_000)

afterAll(async () => {
  await app?.close()
})

// A glazed mug answers the usual checklist's "sound" and "clean foot" items (bone dry is for greenware).
const passes = { sound: true, 'clean-foot': true }

describe('tagging at drop-off', () => {
  it('asks every checklist item that applies to the piece, and no other', async () => {
    const missing = await owner.session.post(`/api/requests/${requestId}/pieces`, { pieceIndex: 0, checks: { sound: true } })
    expect(missing.status).toBe(400)
    expect(missing.body.error.fields['checks.clean-foot']).toBeTruthy()
    const extra = await owner.session.post(`/api/requests/${requestId}/pieces`, { pieceIndex: 0, checks: { ...passes, 'bone-dry': true } })
    expect(extra.status).toBe(400)
    expect(extra.body.error.fields['checks.bone-dry']).toBeTruthy()
  })

  it('gives each piece its own tag, and holds back only the one that fails, telling the potter', async () => {
    for (let i = 0; i < 2; i++) {
      const reply = await owner.session.post(`/api/requests/${requestId}/pieces`, { pieceIndex: 0, checks: passes })
      expect(reply.status).toBe(201)
      expect(reply.body.piece).toMatchObject({ status: 'in-load', copy: i + 1, of: 3 })
      expect(reply.body.piece.tag).toMatch(/^[023456789HKMRTWXY]{4}-[023456789HKMRTWXY]{4}$/)
      tags.push(reply.body.piece.tag)
    }
    const failed = await owner.session.post(`/api/requests/${requestId}/pieces`, {
      pieceIndex: 0,
      checks: { sound: true, 'clean-foot': false },
    })
    expect(failed.status).toBe(201)
    expect(failed.body.piece.status).toBe('held')
    expect(failed.body.piece.hold.reason).toMatch(/Foot clean/)
    heldTag = failed.body.piece.tag
    expect(new Set([...tags, heldTag]).size).toBe(3)
    expect(failed.body.pieces.map((p: { status: string }) => p.status)).toEqual(['in-load', 'in-load', 'held'])
    const mails = await app.ctx.db.getRepository(OutboundMail).findBy({ template: 'piece-held', toAddress: potter.email })
    expect(mails.some((m) => m.bodyText.includes(heldTag))).toBe(true)
    // The request goes on: only that piece is held.
    expect((await potter.session.get(`/api/requests/${requestId}`)).body.state).toBe('deposit_paid')
  })

  it('refuses a fourth piece of a line of three', async () => {
    const reply = await owner.session.post(`/api/requests/${requestId}/pieces`, { pieceIndex: 0, checks: passes })
    expect(reply.status).toBe(409)
    expect(reply.body.error.code).toBe('all-tagged')
  })
})

describe('a piece opened by its tag', () => {
  it('shows its potter whose it is, which firing and where it sits, typed in any case without the dash', async () => {
    const typed = tags[0].replace('-', '').toLowerCase()
    const reply = await potter.session.get(`/api/pieces/${typed}`)
    expect(reply.status).toBe(200)
    expect(reply.body).toMatchObject({ tag: tags[0], viewer: 'potter', firing: { id: ids.firingId }, request: { id: requestId } })
    expect(reply.body.place).toMatchObject({ layer: expect.any(Number), shelf: expect.any(Number) })
  })

  it('is not found for someone with no standing on the request, and a misread code says so', async () => {
    expect((await stranger.session.get(`/api/pieces/${tags[0]}`)).status).toBe(404)
    const misread = await owner.session.get('/api/pieces/ABCD-EFGH')
    expect(misread.status).toBe(400)
    expect(misread.body.error.code).toBe('bad-tag')
  })
})

describe('the load plan', () => {
  it('places the pieces taken in, with their tags, and lists the held one apart', async () => {
    const reply = await owner.session.get(`/api/firings/${ids.firingId}/load-plan`)
    expect(reply.status).toBe(200)
    const placed = reply.body.layers.flatMap((l: { shelves: { pieces: { tag: string | null }[] }[] }) => l.shelves.flatMap((s) => s.pieces))
    expect(placed.map((p: { tag: string | null }) => p.tag).sort()).toEqual([...tags].sort())
    expect(reply.body.held.map((p: { tag: string }) => p.tag)).toEqual([heldTag])
    expect(reply.body.unplaced).toEqual([])
  })

  it('is the studio’s: a potter cannot read it', async () => {
    expect((await potter.session.get(`/api/firings/${ids.firingId}/load-plan`)).status).toBeGreaterThanOrEqual(403)
  })

  it('refuses a crew edit that puts a piece over the shelf’s edge, and keeps one that stands', async () => {
    const plan = (await owner.session.get(`/api/firings/${ids.firingId}/load-plan`)).body
    const piece = plan.layers[0].shelves[0].pieces[0]
    const off = await owner.session.put(`/api/firings/${ids.firingId}/load-plan`, {
      placements: [{ key: piece.key, layer: 0, shelf: 0, x: 4000, y: 0, rotation: 0 }],
    })
    expect(off.status).toBe(400)
    expect(off.body.error.code).toBe('plan-invalid')
    const kept = await owner.session.put(`/api/firings/${ids.firingId}/load-plan`, {
      placements: [{ key: piece.key, layer: 0, shelf: 0, x: 0, y: 0, rotation: 0 }],
    })
    expect(kept.status).toBe(200)
    const moved = kept.body.layers[0].shelves[0].pieces.find((p: { key: string }) => p.key === piece.key)
    expect(moved).toMatchObject({ x: 0, y: 0, pinned: true })
  })
})

describe('labels', () => {
  it('prints a sheet with a QR code, the tag and the potter for every piece in the load', async () => {
    const reply = await owner.session.get(`/api/firings/${ids.firingId}/labels.html`)
    expect(reply.status).toBe(200)
    const html = String(reply.body)
    for (const tag of tags) expect(html).toContain(tag)
    expect(html).toContain('Theo Potter')
    expect(html).toMatch(/<svg[^>]*aria-label="QR code for/)
    expect(html).toContain('@media print')
  })

  it('prints a single label by its tag', async () => {
    const reply = await owner.session.get(`/api/firings/${ids.firingId}/labels.html?tag=${tags[1]}`)
    expect(reply.status).toBe(200)
    expect(String(reply.body)).toContain(tags[1])
    expect(String(reply.body)).not.toContain(tags[0])
  })
})
