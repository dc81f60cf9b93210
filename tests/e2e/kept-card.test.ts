// A card kept at the deposit, in the browser: the potter ticks "Keep this card" before paying the
// deposit, the Stripe stand-in's page says the card is kept, the ask then names the card; when the studio
// claims for a glaze run, the potter pays the claim with the kept card in one confirmed step, and can
// forget the card afterwards. The ask's page and the incident page pass axe and fit a phone.
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { CARD_SUCCEEDS } from '../support/checkout'
import { checkInAll } from '../support/money'
import { createPerson, type Person } from '../support/people'
import { readableAtBothWidths } from '../support/readability'
import { launchBrowser, openSignedIn } from '../support/browser'
import { draftAndSend, mug } from '../support/request-fixtures'
import { publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let browser: Browser
const contexts: BrowserContext[] = []
let owner: Person
let potter: Person
let firingId = ''
let requestId = ''

beforeAll(async () => {
  app = await startTestApp({ serveClient: true, stripe: true })
  browser = await launchBrowser()
  owner = await createPerson(app, 'host', 'Greta Saltmarsh')
  potter = await createPerson(app, 'potter', 'Milo Runnyglaze')
  firingId = (await publishedStudio(owner.session, `Saltmarsh Kilns ${Date.now() % 10_000}`)).firingId
  requestId = (await draftAndSend(potter.session, firingId, [mug({ quantity: 1 })])).id
  const accepted = await owner.session.post(`/api/requests/${requestId}/accept`)
  if (accepted.status !== 200) throw new Error(`accept: ${accepted.status} ${JSON.stringify(accepted.body)}`)
  // A ceiling for a busy machine: a throwaway database, the server, the stand-in and the browser start here.
}, 300_000)

afterAll(async () => {
  for (const context of contexts) await context.close().catch(() => undefined)
  await browser?.close()
  await app?.close()
})

const signedInPage = async (person: Person) => (await openSignedIn(browser, app.url, contexts, person.email)).page

async function payOnHostedPage(page: Page) {
  await page.locator('#cardNumber').fill(CARD_SUCCEEDS)
  await page.locator('#expiry').fill('12 / 34')
  await page.locator('#cvc').fill('123')
  await page.locator('#cardholderName').fill('Milo Runnyglaze')
  await page.locator('#postalCode').fill('97214')
  await page.locator('button[type="submit"]').click()
}

describe('a card kept at the deposit', () => {
  it('is kept when the potter asks, pays an accepted damage claim in one confirmed step, and can be forgotten', async () => {
    const page = await signedInPage(potter)
    const askPath = `/requests/${requestId}`
    await page.goto(askPath)
    await page.getByLabel(/Keep this card for a damage claim on this ask/).check()
    await page.getByRole('button', { name: /^Pay the deposit/ }).click()
    await page.waitForURL((url) => url.pathname.startsWith('/checkout/'))
    await expect.poll(() => page.getByTestId('keeps-card').count()).toBe(1)
    await payOnHostedPage(page)
    await page.waitForURL((url) => url.pathname === askPath)
    await expect.poll(() => page.getByTestId('kept-card').textContent(), { timeout: 60_000 }).toContain('Visa ending 4242')
    const askReadable = await readableAtBothWidths(page)
    expect(askReadable.problems).toEqual([])
    expect(askReadable.overflow).toBeLessThanOrEqual(1)

    // The studio tags and checks the piece in, then claims for a glaze run that ground a shelf.
    const tagged = await owner.session.post(`/api/requests/${requestId}/pieces`, {
      pieceIndex: 0,
      checks: { sound: true, 'clean-foot': true },
    })
    await checkInAll(owner.session, requestId, [1])
    const incident = await owner.session.post(`/api/firings/${firingId}/incidents`, {
      kind: 'glaze-run',
      shelfDamage: true,
      pieceTags: [tagged.body.piece.tag],
    })
    expect(incident.status, JSON.stringify(incident.body)).toBe(201)
    const claim = await owner.session.post(`/api/incidents/${incident.body.id}/claims`, { chargeKind: 'shelf-ground', amountCents: 2000 })
    expect(claim.status).toBe(201)

    await page.goto(`/incidents/${incident.body.id}`)
    await page.getByRole('button', { name: 'Pay $20.00 with the kept card' }).click()
    const dialog = page.getByRole('dialog')
    await expect.poll(() => dialog.textContent()).toContain('Visa ending 4242')
    await dialog.getByRole('button', { name: 'Pay with Visa ending 4242' }).click()
    await expect.poll(() => page.getByTestId('claim').textContent()).toContain('Paid')
    expect(await page.getByRole('button', { name: /Pay on a checkout page/ }).count()).toBe(0)
    const incidentReadable = await readableAtBothWidths(page)
    expect(incidentReadable.problems).toEqual([])
    expect(incidentReadable.overflow).toBeLessThanOrEqual(1)

    await page.goto(askPath)
    await expect.poll(() => page.locator('[data-testid="ledger-line"][data-kind="claim"]').textContent()).toContain('$20.00')
    await page.getByRole('button', { name: 'Forget this card' }).click()
    await page.getByRole('dialog').getByRole('button', { name: 'Forget it' }).click()
    await expect.poll(() => page.getByTestId('kept-card').count()).toBe(0)
  })
})
