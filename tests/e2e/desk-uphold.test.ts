// The front desk upholds a contested damage claim in the browser: the studio's own charge for a replaced
// shelf is shown beside its claim form, the potter's contest reaches the desk, the desk upholds it with
// a note, the potter is asked to pay and pays with the succeeding test card, and the studio sees the
// claim paid with the desk's word. The setup (studio, ware, firing, incident, claim) goes through the API.
import type { Browser, BrowserContext } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEFAULT_POLICIES } from '../../shared/schemas/studios'
import { launchBrowser, openSignedIn } from '../support/browser'
import { CARD_SUCCEEDS } from '../support/checkout'
import { checkInAll, fireThrough } from '../support/money'
import { createPerson, type Person } from '../support/people'
import { mug, sendAndPayDeposit } from '../support/request-fixtures'
import { publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let browser: Browser
const contexts: BrowserContext[] = []
let owner: Person
let potter: Person
let admin: Person
let incidentPath = ''
let requestId = ''
const SHELF_CAP_CENTS = 8200

beforeAll(async () => {
  app = await startTestApp({ serveClient: true, stripe: true })
  browser = await launchBrowser()
  owner = await createPerson(app, 'host', 'Wendel Saggar')
  potter = await createPerson(app, 'potter', 'Pia Runnyglaze')
  admin = await createPerson(app, 'admin', 'Desk Warden')
  const ids = await publishedStudio(owner.session, `Saggar Yard ${Date.now() % 10_000}`)
  const terms = await owner.session.patch(`/api/studios/${ids.studioId}`, {
    policies: {
      ...DEFAULT_POLICIES,
      damageCharges: { 'kiln-cleaning': 6000, 'shelf-ground': 2500, 'shelf-replaced': SHELF_CAP_CENTS, 'other-ware': 15000 },
    },
  })
  if (terms.status !== 200) throw new Error(`terms: ${terms.status} ${JSON.stringify(terms.body)}`)
  requestId = (await sendAndPayDeposit(app, owner.session, potter.session, ids.firingId, [mug({ quantity: 1 })])).id
  const piece = await owner.session.post(`/api/requests/${requestId}/pieces`, {
    pieceIndex: 0,
    checks: { sound: true, 'clean-foot': true },
  })
  if (piece.status !== 201) throw new Error(`tag: ${piece.status} ${JSON.stringify(piece.body)}`)
  await checkInAll(owner.session, requestId, [1])
  await fireThrough(owner.session, ids.firingId)
  const incident = await owner.session.post(`/api/firings/${ids.firingId}/incidents`, {
    kind: 'glaze-run',
    shelfDamage: true,
    whereInKiln: 'Top shelf, left',
    note: 'Glaze ran off the foot and fused the piece to the shelf.',
    pieceTags: [piece.body.piece.tag],
  })
  if (incident.status !== 201) throw new Error(`incident: ${incident.status} ${JSON.stringify(incident.body)}`)
  incidentPath = `/incidents/${incident.body.id}`
  // A ceiling for a busy machine: a throwaway database, the server, the stand-in and the browser start here.
}, 300_000)

afterAll(async () => {
  for (const context of contexts) await context.close().catch(() => undefined)
  await browser?.close()
  await app?.close()
})

const signedInPage = (person: Person) => openSignedIn(browser, app.url, contexts, person.email)

describe('the front desk upholds a contested claim', () => {
  it('shows the studio’s cap by the claim form; the desk upholds the contested claim; the potter pays it with 4242', async () => {
    const studio = await signedInPage(owner)
    await studio.page.goto(incidentPath)
    const form = studio.page.getByRole('form', { name: 'Claim a damage charge' })
    await form.getByLabel('What for').selectOption({ label: 'Shelf replaced' })
    await form.getByText('Your terms: at most $82.00.').waitFor()
    await form.getByLabel('Amount').fill('82.01')
    await form.getByRole('button', { name: 'Send the claim' }).click()
    await form.getByText('Your terms allow at most 82.00 for this.').waitFor()
    await form.getByLabel('Amount').fill('82')
    await form.getByLabel('Note for the potter').fill('The shelf could not be ground clean; it was replaced.')
    await form.getByRole('button', { name: 'Send the claim' }).click()
    await expect.poll(() => studio.page.getByTestId('claim').textContent()).toContain('Waiting for the potter')

    const mine = await signedInPage(potter)
    await mine.page.goto(incidentPath)
    await mine.page.getByRole('button', { name: 'Contest' }).click()
    await mine.page.getByLabel('Why you contest it').fill('The glaze was tested on a cookie at cone 6; the kiln overfired.')
    await mine.page.getByRole('button', { name: 'Send to the front desk' }).click()
    await expect.poll(() => mine.page.getByTestId('claim').textContent()).toContain('Contested: with the front desk')

    const desk = await signedInPage(admin)
    await desk.page.goto('/front-desk/claims')
    await expect.poll(() => desk.page.getByText('The glaze was tested on a cookie').count()).toBe(1)
    await desk.page.getByLabel('The desk’s note to both sides').fill('The log peaks at the planned cone; the glaze ran on its own.')
    await desk.page.getByRole('button', { name: 'Uphold: the potter pays' }).click()
    await expect.poll(() => desk.page.getByText('No contested claims').count()).toBe(1)

    const told = async (person: Person) =>
      ((await app.ctx.db.query(`SELECT 1 FROM notices WHERE user_id = $1 AND kind = 'claim-decided'`, [person.id])) as unknown[]).length
    await expect.poll(() => told(potter)).toBe(1)
    await expect.poll(() => told(owner)).toBe(1)

    await mine.page.reload()
    const claim = mine.page.getByTestId('claim')
    await expect.poll(() => claim.textContent()).toContain('Upheld by the front desk: to pay')
    expect(await claim.textContent()).toContain('the glaze ran on its own')
    expect(await claim.getByRole('button', { name: 'Contest' }).count()).toBe(0)
    await claim.getByRole('button', { name: 'Pay $82.00 by card' }).click()
    await mine.page.waitForURL((url) => url.pathname.startsWith('/checkout/'))
    const email = mine.page.locator('#email')
    if (await email.isEditable()) await email.fill('potter@example.test')
    await mine.page.locator('#cardNumber').fill(CARD_SUCCEEDS)
    await mine.page.locator('#expiry').fill('12 / 34')
    await mine.page.locator('#cvc').fill('123')
    await mine.page.locator('#cardholderName').fill('Pia Runnyglaze')
    await mine.page.locator('#postalCode').fill('97214')
    await mine.page.locator('button[type="submit"]').click()
    await mine.page.waitForURL((url) => url.pathname === incidentPath)
    await expect.poll(() => mine.page.getByTestId('claim').textContent()).toContain('Paid')

    await studio.page.reload()
    await expect.poll(() => studio.page.getByTestId('claim').textContent()).toContain('Paid')
    expect(await studio.page.getByTestId('claim').textContent()).toContain('the glaze ran on its own')
    const ledger: { amount_cents: number }[] = await app.ctx.db.query(
      `SELECT amount_cents FROM ledger_entries WHERE request_id = $1 AND kind = 'claim'`,
      [requestId],
    )
    expect(ledger).toEqual([{ amount_cents: SHELF_CAP_CENTS }])
    for (const opened of [studio, mine, desk]) expect(opened.errors).toEqual([])
  })
})
