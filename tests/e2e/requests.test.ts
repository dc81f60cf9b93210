// In a real browser against the real server, the Stripe stand-in and the mail catcher: a visitor
// finds a firing on a studio's page, signs in, describes a mug under a runny glaze (a warning, not a
// block), acknowledges the warning, agrees to the studio's terms and asks. The studio owner takes it
// on from the kiln room's inbox; the potter pays the deposit on the stand-in's test payment page with
// Stripe's succeeding test card, and both sides see the space held with its ledger line. A second
// potter's declined card leaves their ware taken on and unpaid.
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { CARD_DECLINED, CARD_SUCCEEDS } from '../support/checkout'
import { waitForMail } from '../support/mailbox'
import { createPerson, PERSON_PASSWORD, type Person } from '../support/people'
import { draftAndSend, mug, runnyMug } from '../support/request-fixtures'
import { publishedStudio } from '../support/studio-fixtures'
import { launchBrowser, openPage } from '../support/browser'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let browser: Browser
const contexts: BrowserContext[] = []
let host: Person
let potter: Person
let secondPotter: Person
let studioId = ''
let firingId = ''
const STUDIO_NAME = `Kettle Pond Clay ${Date.now() % 10_000}`
const STUDIO_ADDRESS = '2150 SE Alder St, Portland, OR 97214'

beforeAll(async () => {
  app = await startTestApp({ mail: true, serveClient: true, stripe: true })
  browser = await launchBrowser()
  host = await createPerson(app, 'host', 'Rosa Delacroix')
  potter = await createPerson(app, 'potter', 'Hazel Quist')
  secondPotter = await createPerson(app, 'potter', 'Ivo Brandt')
  // The first potter reads and types millimetres, so the fixture's sizes go in as they are.
  await potter.session.patch('/api/auth/me', { unitSystem: 'metric' })
  ;({ studioId, firingId } = await publishedStudio(host.session, STUDIO_NAME))
  // A street address with its pin, so no geocoding is asked for; potters see it once accepted.
  const placed = await host.session.patch(`/api/studios/${studioId}`, { address: STUDIO_ADDRESS, lat: 45.5163, lng: -122.6467 })
  if (placed.status !== 200) throw new Error(`address: ${placed.status} ${JSON.stringify(placed.body)}`)
})

afterAll(async () => {
  for (const context of contexts) await context.close().catch(() => undefined)
  await browser?.close()
  await app?.close()
})

async function newPage() {
  const opened = await openPage(browser, app.url)
  contexts.push(opened.context)
  return opened
}

async function signIn(page: Page, email: string) {
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(PERSON_PASSWORD)
  await page.getByRole('button', { name: 'Sign in' }).click()
}

/** Fills the stand-in's hosted form as a person would and submits it. */
async function payOnHostedPage(page: Page, cardNumber: string) {
  await page.waitForURL((url) => url.pathname.startsWith('/checkout/'))
  // The session carries the potter's e-mail, so the page shows it read-only.
  const email = page.locator('#email')
  if (await email.isEditable()) await email.fill('potter@example.test')
  await page.locator('#cardNumber').fill(cardNumber)
  await page.locator('#expiry').fill('12 / 34')
  await page.locator('#cvc').fill('123')
  await page.locator('#cardholderName').fill('Test Potter')
  await page.locator('#postalCode').fill('97214')
  await page.locator('button[type="submit"]').click()
}

const stateOf = (page: Page) => page.getByTestId('request-state').first().getAttribute('data-state')

// Stripe's test cards (docs.stripe.com/testing): 4242… succeeds, 4000 0000 0000 0002 is declined.
// The runny mug (tests/support/request-fixtures.ts): 100 × 90 × 115 mm, one piece. Its bounding box is
// 1 035 000 mm³ = 63.16 in³ (1 in = 25.4 mm exactly, NIST SP 811). At the fixture's 4 ¢ per cubic inch
// that is 252.6 ¢, under the fixture's 300 ¢ minimum per piece, so the piece costs the minimum; the
// deposit is the fixture's 25 % of it.
const MUG_MM3 = 100 * 90 * 115
const MM3_PER_CUBIC_INCH = 25.4 ** 3
const VOLUME_CENTS = (MUG_MM3 / MM3_PER_CUBIC_INCH) * 4
const TOTAL_CENTS = Math.max(300, Math.round(VOLUME_CENTS))
const DEPOSIT_CENTS = Math.round(TOTAL_CENTS * 0.25)
const dollars = (cents: number) => `$${(cents / 100).toFixed(2)}`

let requestId = ''
let hostPage: Page

describe('a firing request in the browser', () => {
  it('a visitor finds the firing, signs in, describes a runny-glazed mug, acknowledges the warning and sends', async () => {
    expect(VOLUME_CENTS).toBeLessThan(300)
    const { page, errors } = await newPage()
    await page.goto(`/studios/${studioId}`)
    const row = page.locator(`[data-testid="firing-row"][data-firing-id="${firingId}"]`)
    await row.getByRole('link', { name: /Ask for space/ }).click()
    await page.waitForURL('**/sign-in?next=**')
    await signIn(page, potter.email)
    await page.waitForURL(`**/firings/${firingId}/request`)
    await page.getByRole('heading', { name: `Ask for space at ${STUDIO_NAME}` }).waitFor()
    expect(await page.getByTestId('firing-summary').textContent()).toContain('cone 6 oxidation')

    const fixture = runnyMug()
    const piece = page.getByRole('group', { name: 'Piece 1' })
    await piece.getByLabel('Label', { exact: true }).fill(fixture.label as string)
    await piece.getByLabel('How many', { exact: true }).fill(String(fixture.quantity))
    await piece.getByLabel('Round', { exact: true }).uncheck()
    await piece.getByLabel('Height (mm)').fill(String(fixture.heightMm))
    await piece.getByLabel('Width (mm)').fill(String(fixture.widthMm))
    await piece.getByLabel('Depth (mm)').fill(String(fixture.depthMm))
    await piece.getByLabel('Wall thickness (mm)').fill(String(fixture.wallThicknessMm))
    await piece.getByLabel('Clay matures from cone').fill('5')
    await piece.getByLabel('Clay rated to cone').fill('10')
    await piece.getByLabel('Glaze from cone').fill('5')
    await piece.getByLabel('Glaze to cone').fill('10')
    await piece.getByLabel('Runny glaze').check()

    // A runny glaze asks for a catch tray or cookie under the pot: a warning, not a block (common practice).
    await expect.poll(() => page.getByTestId('verdict').getAttribute('data-verdict')).toBe('warn')
    expect(await page.locator('[data-finding="runny-glaze-tray"]').count()).toBe(1)
    const quote = await page.getByTestId('quote').textContent()
    expect(quote).toContain(dollars(TOTAL_CENTS))
    expect(quote).toContain(dollars(DEPOSIT_CENTS))
    // Space is counted in shelves of the kiln, as the load plan takes them.
    expect(await page.getByTestId('space-needed').textContent()).toMatch(/^\d+(\.\d)? (shelf|shelves)$/)

    await page.getByRole('button', { name: 'Save draft' }).click()
    await page.getByText('Draft saved').waitFor()
    expect(page.url()).toContain('draft=')

    await page.getByRole('button', { name: 'Send…' }).click()
    const dialog = page.getByRole('dialog', { name: 'Ask the studio' })
    const send = dialog.getByRole('button', { name: `Send to ${STUDIO_NAME}` })
    await dialog.getByTestId('warning-to-acknowledge').first().waitFor()
    expect(await send.isDisabled()).toBe(true)
    const warnings = dialog.getByTestId('warning-to-acknowledge')
    expect(await warnings.count()).toBe(1)
    expect(await warnings.first().getAttribute('data-code')).toBe('runny-glaze-tray')
    for (let index = 0; index < (await warnings.count()); index++) await warnings.nth(index).getByRole('checkbox').check()
    expect(await send.isDisabled()).toBe(true)
    await dialog.getByLabel(`I agree to ${STUDIO_NAME}’s terms`).check()
    await send.click()

    await page.waitForURL(/\/requests\/[0-9a-f-]{36}$/)
    requestId = page.url().split('/requests/')[1]
    await expect.poll(() => stateOf(page)).toBe('sent')
    expect(await page.getByTestId('acknowledged-warnings').count()).toBe(1)
    expect(await page.getByTestId('studio-address').count()).toBe(0)

    const view = await potter.session.get(`/api/requests/${requestId}`)
    expect(view.body.acknowledgedWarnings).toEqual(['runny-glaze-tray'])
    expect(view.body.quote.totalCents).toBe(TOTAL_CENTS)
    expect(view.body.quote.depositCents).toBe(DEPOSIT_CENTS)
    await waitForMail(app.mail!.webUrl, { to: host.email, subject: 'asks for space' })

    await page.goto('/my-ware')
    const mine = page.locator(`[data-testid="my-request"][data-request-id="${requestId}"]`)
    expect(await mine.getByTestId('next-step').textContent()).toBe('Waiting for the studio')
    expect(errors).toEqual([])
  })

  it('the studio owner sees the ask waiting in the kiln room and takes it on from the firing’s inbox', async () => {
    const { page, errors } = await newPage()
    hostPage = page
    await page.goto('/sign-in')
    await signIn(page, host.email)
    await page.waitForURL('**/kiln-room')
    const waiting = page.getByTestId('waiting-requests')
    expect(await waiting.textContent()).toBe('1 ask waiting')
    await waiting.click()
    await page.waitForURL(`**/firings/${firingId}/requests`)

    const row = page.locator(`[data-testid="inbox-request"][data-request-id="${requestId}"]`)
    expect(await row.getByTestId('potter-record').textContent()).toContain('Hazel Quist')
    await row.getByRole('button', { name: 'Take it on…' }).click()
    // Taking it on says what it does before it does it: the space held and the deposit asked, by when.
    const effects = page.getByTestId('accept-effects')
    expect(await effects.textContent()).toMatch(/is held for it/)
    expect(await effects.textContent()).toContain(`deposit of ${dollars(DEPOSIT_CENTS)}`)
    await page.getByRole('dialog').getByRole('button', { name: 'Take it on', exact: true }).click()
    await expect.poll(() => row.getAttribute('data-state')).toBe('accepted')
    await waitForMail(app.mail!.webUrl, { to: potter.email, subject: 'Taken on' })
    expect(errors).toEqual([])
  })

  it('the potter pays the deposit with 4242 on the payment page; both sides see the space held with the ledger line', async () => {
    const { page, errors } = await newPage()
    await page.goto(`/requests/${requestId}`)
    await page.waitForURL('**/sign-in?next=**')
    await signIn(page, potter.email)
    await page.waitForURL(`**/requests/${requestId}`)
    await expect.poll(() => stateOf(page)).toBe('accepted')
    expect(await page.getByTestId('studio-address').textContent()).toBe(STUDIO_ADDRESS)
    await page.getByRole('button', { name: /^Pay the deposit/ }).click()
    await payOnHostedPage(page, CARD_SUCCEEDS)

    await page.waitForURL((url) => url.pathname === `/requests/${requestId}` && url.searchParams.get('paid') === 'deposit')
    await expect.poll(() => stateOf(page), { timeout: 60_000 }).toBe('deposit_paid')
    expect(await page.getByTestId('request-state').first().textContent()).toBe('Space held')
    const line = page.getByTestId('ledger-line')
    expect(await line.count()).toBe(1)
    expect(await line.first().getAttribute('data-kind')).toBe('deposit')
    expect(await line.first().textContent()).toContain(dollars(DEPOSIT_CENTS))

    await hostPage.goto(`/requests/${requestId}`)
    await expect.poll(() => stateOf(hostPage)).toBe('deposit_paid')
    expect(await hostPage.getByTestId('request-state').first().textContent()).toBe('Space held')
    expect(await hostPage.getByTestId('ledger-line').first().textContent()).toContain(dollars(DEPOSIT_CENTS))

    await waitForMail(app.mail!.webUrl, { to: potter.email, subject: 'Receipt:' })
    await waitForMail(app.mail!.webUrl, { to: host.email, subject: 'Paid:' })
    expect(errors).toEqual([])
  })

  it('a second potter’s declined card shows a clear error on the payment page and leaves their ware taken on and unpaid', async () => {
    const sent = await draftAndSend(secondPotter.session, firingId, [mug()])
    const accepted = await host.session.post(`/api/requests/${sent.id}/accept`)
    expect(accepted.status).toBe(200)

    const { page, errors } = await newPage()
    await page.goto('/sign-in')
    await signIn(page, secondPotter.email)
    await page.waitForURL('**/my-ware')
    const mine = page.locator(`[data-testid="my-request"][data-request-id="${sent.id}"]`)
    expect(await mine.getByTestId('next-step').textContent()).toMatch(/^Pay the deposit by /)
    await mine.getByRole('link').first().click()
    await page.waitForURL(`**/requests/${sent.id}`)
    await page.getByRole('button', { name: /^Pay the deposit/ }).click()
    await payOnHostedPage(page, CARD_DECLINED)

    const refusal = page.getByRole('alert')
    await refusal.waitFor()
    expect(await refusal.textContent()).toContain('Your card was declined.')
    expect(page.url()).toContain('/checkout/')

    await page.getByRole('link', { name: 'Cancel and go back' }).click()
    await page.waitForURL((url) => url.pathname === `/requests/${sent.id}` && url.searchParams.get('unpaid') === 'deposit')
    await page.getByText('The payment was not completed').waitFor()
    expect(await stateOf(page)).toBe('accepted')
    expect(await page.getByTestId('request-state').first().textContent()).toBe('Taken on')
    expect(await page.getByTestId('ledger-empty').count()).toBe(1)
    // The decline reaches the app by webhook; the page shows the card's message once it has.
    await expect
      .poll(
        async () => {
          await page.reload()
          await page.getByTestId('request-state').first().waitFor()
          return page.getByText('Your card was declined', { exact: false }).count()
        },
        { timeout: 60_000 },
      )
      .toBeGreaterThan(0)

    const view = await secondPotter.session.get(`/api/requests/${sent.id}`)
    expect(view.body.state).toBe('accepted')
    expect(view.body.ledger).toEqual([])
    expect(errors).toEqual([])
  })
})
