// In a real browser against the real server and the Stripe stand-in: a new studio's owner opens the
// money page, sets up payouts on the stand-in's hosted onboarding page with its succeeding test values
// and comes back to payouts on; a potter pays the deposit and the balance on the hosted checkout page;
// the owner marks the ware collected and the money page shows the transfer, less the marketplace's
// fee; a desk refund after the transfer shows the part taken back. A crew member is shown none of it.
import type { Browser, BrowserContext, Locator, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, openSignedIn } from '../support/browser'
import { CARD_SUCCEEDS } from '../support/checkout'
import { checkInAll, fireThrough, moneyQuiet, resultsAndReady } from '../support/money'
import { createPerson, type Person } from '../support/people'
import { draftAndSend, mug } from '../support/request-fixtures'
import { publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let browser: Browser
const contexts: BrowserContext[] = []
let owner: Person
let crew: Person
let potter: Person
let admin: Person
let studioId = ''
let firingId = ''
let requestId = ''
let ownerPage: Page
let ownerErrors: string[] = []
let potterPage: Page
let potterErrors: string[] = []
const STUDIO_NAME = `Heronsgate Kilns ${Date.now() % 10_000}`

// Four of the fixture's mugs (tests/support/request-fixtures.ts), each 100 × 90 × 115 mm: 1 035 000 mm³
// = 63.16 in³ (1 in = 25.4 mm exactly, NIST SP 811), 252.6 ¢ at the fixture's 4 ¢ per cubic inch, so
// each costs the fixture's 300 ¢ minimum: 1 200 ¢ in all. The fee configured here is 10 % with a
// 100 ¢ minimum: 10 % of 1 200 ¢ is 120 ¢, and the studio's share is 1 080 ¢. A desk refund of 400 ¢
// leaves 800 ¢ kept, whose 10 % (80 ¢) is under the minimum, so the fee becomes 100 ¢, the share
// 700 ¢, and 1 080 − 700 = 380 ¢ is taken back from the transfer.
const TOTAL = 1_200
const FEE = 120
const REFUND = 400
const FEE_AFTER_REFUND = 100
const SHARE_AFTER_REFUND = TOTAL - REFUND - FEE_AFTER_REFUND

// A ceiling for a busy machine: states are polled until they hold or this passes.
const WAIT = { timeout: 60_000 }
const dollars = (cents: number) => new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' }).format(cents / 100)

beforeAll(async () => {
  app = await startTestApp({
    serveClient: true,
    stripe: true,
    config: { marketplaceFee: { percent: 10, minimumCents: 100 }, payoutHoldHours: 0 },
  })
  browser = await launchBrowser()
  owner = await createPerson(app, 'host', 'Ada Winterbourne')
  crew = await createPerson(app, 'crew', 'Pim Rask')
  potter = await createPerson(app, 'potter', 'Lena Thorsby')
  admin = await createPerson(app, 'admin', 'Desk Keeper')
  ;({ studioId, firingId } = await publishedStudio(owner.session, STUDIO_NAME))
  const sent = await draftAndSend(potter.session, firingId, [mug({ quantity: 4 })])
  requestId = sent.id
  const accepted = await owner.session.post(`/api/requests/${requestId}/accept`)
  if (accepted.status !== 200) throw new Error(`accept: ${accepted.status} ${JSON.stringify(accepted.body)}`)
  // A ceiling for a busy machine: a throwaway database, the server, the stand-in and the browser start here.
}, 300_000)

afterAll(async () => {
  for (const context of contexts) await context.close().catch(() => undefined)
  await browser?.close()
  await app?.close()
})

const signedInPage = (email: string, home: string) => openSignedIn(browser, app.url, contexts, email, { home })

/** Fills the stand-in's hosted checkout form as a person would and submits it. */
async function payOnHostedPage(page: Page) {
  await page.waitForURL((url) => url.pathname.startsWith('/checkout/'))
  const email = page.locator('#email')
  if (await email.isEditable()) await email.fill('potter@example.test')
  await page.locator('#cardNumber').fill(CARD_SUCCEEDS)
  await page.locator('#expiry').fill('12 / 34')
  await page.locator('#cvc').fill('123')
  await page.locator('#cardholderName').fill('Lena Thorsby')
  await page.locator('#postalCode').fill('97214')
  await page.locator('button[type="submit"]').click()
}

const stateOf = (page: Page) => page.getByTestId('request-state').first().getAttribute('data-state')
const centsOf = (page: Page, testId: string) => page.getByTestId(testId).first().getAttribute('data-cents')

async function sumOf(lines: Locator, attribute: string) {
  let sum = 0
  for (const line of await lines.all()) sum += Number(await line.getAttribute(attribute))
  return sum
}

async function openMoneyPage() {
  await ownerPage.goto(`/studios/${studioId}/money`)
  await ownerPage.getByTestId('payout-state').waitFor()
}

describe('a new studio is paid through its money page', () => {
  it('the owner sets up payouts on Stripe’s hosted page and comes back to payouts on', async () => {
    ;({ page: ownerPage, errors: ownerErrors } = await signedInPage(owner.email, '/kiln-room'))
    await ownerPage.goto(`/studios/${studioId}/edit`)
    await ownerPage.getByRole('link', { name: 'Money', exact: true }).click()
    await ownerPage.waitForURL(`**/studios/${studioId}/money`)
    await expect.poll(() => ownerPage.getByTestId('payout-state').getAttribute('data-state'), WAIT).toBe('none')

    await ownerPage.getByRole('button', { name: 'Set up payouts with Stripe' }).click()
    await ownerPage.waitForURL((url) => url.pathname.startsWith('/connect/onboarding/'))
    // Stripe's Connect test values (from memory; the stand-in's page lists them): this date of birth
    // verifies, and this routing and account number are the test bank account that pays out.
    await ownerPage.locator('#firstName').fill('Ada')
    await ownerPage.locator('#lastName').fill('Winterbourne')
    await ownerPage.locator('#dob').fill('1901-01-01')
    await ownerPage.locator('#ssnLast4').fill('0000')
    await ownerPage.locator('#addressLine1').fill('address_full_match')
    await ownerPage.locator('#postalCode').fill('97214')
    await ownerPage.locator('#routingNumber').fill('110000000')
    await ownerPage.locator('#accountNumber').fill('000123456789')
    await ownerPage.locator('#tosAccepted').check()
    await ownerPage.locator('button[type="submit"]').click()

    await ownerPage.waitForURL((url) => url.pathname === `/studios/${studioId}/money` && url.searchParams.get('onboarding') === 'return')
    await expect.poll(() => ownerPage.getByTestId('payout-state').getAttribute('data-state'), WAIT).toBe('ready')
    expect(await ownerPage.getByRole('button', { name: 'Set up payouts with Stripe' }).count()).toBe(0)
    expect(await ownerPage.getByTestId('transfer-line').count()).toBe(0)
    expect(ownerErrors).toEqual([])
  })

  it('the potter pays the deposit and then the balance on the hosted checkout page', async () => {
    ;({ page: potterPage, errors: potterErrors } = await signedInPage(potter.email, '/my-ware'))
    await potterPage.goto(`/requests/${requestId}`)
    await expect.poll(() => stateOf(potterPage), WAIT).toBe('accepted')
    await potterPage.getByRole('button', { name: /^Pay the deposit/ }).click()
    await payOnHostedPage(potterPage)
    await potterPage.waitForURL((url) => url.pathname === `/requests/${requestId}` && url.searchParams.get('paid') === 'deposit')
    await expect.poll(() => stateOf(potterPage), WAIT).toBe('deposit_paid')

    // Drop-off, the firing and the results, which other tests walk through in the browser.
    await checkInAll(owner.session, requestId, [4])
    await fireThrough(owner.session, firingId)
    await resultsAndReady(owner.session, requestId)

    await potterPage.goto(`/requests/${requestId}`)
    await expect.poll(() => stateOf(potterPage), WAIT).toBe('ready')
    const owed = await potterPage.getByTestId('owed').getAttribute('data-owed-cents')
    expect(Number(owed)).toBeGreaterThan(0)
    await potterPage.getByRole('button', { name: `Pay the balance · ${dollars(Number(owed))}` }).click()
    await payOnHostedPage(potterPage)
    await potterPage.waitForURL((url) => url.pathname === `/requests/${requestId}` && url.searchParams.get('paid') === 'balance')
    await expect.poll(() => potterPage.getByTestId('owed').getAttribute('data-owed-cents'), WAIT).toBe('0')
    const paid = await potter.session.get(`/api/requests/${requestId}`)
    expect(paid.body.price.paidInCents).toBe(TOTAL)
    expect(potterErrors).toEqual([])
  })

  it('the owner marks the ware collected and sees the transfer, less the fee', async () => {
    await openMoneyPage()
    // Paid but not collected: what was paid waits for pickup (the fee is taken once it is earned),
    // nothing is transferred yet.
    await expect.poll(() => centsOf(ownerPage, 'balance-waiting'), WAIT).toBe(String(TOTAL))
    expect(await centsOf(ownerPage, 'balance-transferred')).toBe('0')

    await ownerPage.goto(`/requests/${requestId}`)
    await expect.poll(() => stateOf(ownerPage), WAIT).toBe('ready')
    await ownerPage.getByRole('button', { name: 'Picked up…', exact: true }).click()
    await ownerPage.getByRole('dialog').getByRole('button', { name: 'Yes, picked up' }).click()
    await expect.poll(() => stateOf(ownerPage), WAIT).toBe('collected')
    await moneyQuiet(app)

    await openMoneyPage()
    // One transfer from each charge, deposit and balance (source_transaction ties a transfer to one charge).
    const transfers = ownerPage.getByTestId('transfer-line')
    await expect.poll(() => transfers.count(), WAIT).toBe(2)
    expect(await sumOf(transfers, 'data-cents')).toBe(TOTAL - FEE)
    expect(await transfers.first().textContent()).toContain('for Lena Thorsby’s firing')
    expect(await centsOf(ownerPage, 'balance-transferred')).toBe(String(TOTAL - FEE))
    expect(await centsOf(ownerPage, 'balance-fee')).toBe(String(FEE))
    expect(await centsOf(ownerPage, 'balance-owed')).toBe('0')
    const line = ownerPage.getByTestId('earning-line')
    expect(await line.getAttribute('data-request-id')).toBe(requestId)
    expect(await line.getByTestId('earning-transferred').getAttribute('data-cents')).toBe(String(TOTAL - FEE))
    expect(ownerErrors).toEqual([])
  })

  it('a desk refund after the transfer shows the part taken back from it', async () => {
    const refund = await admin.session.post(`/api/admin/requests/${requestId}/refund`, { amountCents: REFUND, reason: 'Two mugs crazed' })
    // Accepted: the refund itself is a job, and moneyQuiet waits for it and the reversal it causes.
    expect(refund.status).toBe(202)
    await moneyQuiet(app)

    await openMoneyPage()
    const transfers = ownerPage.getByTestId('transfer-line')
    await expect.poll(() => sumOf(transfers, 'data-reversed-cents'), WAIT).toBe(TOTAL - FEE - SHARE_AFTER_REFUND)
    expect(await ownerPage.getByText(/taken back on .* for a refund/).count()).toBeGreaterThan(0)
    expect(await centsOf(ownerPage, 'balance-transferred')).toBe(String(SHARE_AFTER_REFUND))
    expect(await centsOf(ownerPage, 'balance-fee')).toBe(String(FEE_AFTER_REFUND))
    expect(ownerErrors).toEqual([])
  })

  it('shows crew none of it', async () => {
    // Joining by invitation has its own tests; here the crew member is simply on the studio.
    await app.ctx.db.query(`INSERT INTO studio_members (studio_id, user_id, role) VALUES ($1, $2, 'crew')`, [studioId, crew.id])
    const { page } = await signedInPage(crew.email, '/kiln-room')
    await page.goto(`/studios/${studioId}/money`)
    await page.getByText('Only the studio’s owner sees its money').waitFor()
    expect(await page.getByTestId('payout-state').count()).toBe(0)
    expect((await crew.session.get(`/api/studios/${studioId}/payouts`)).status).toBe(403)
  })
})
