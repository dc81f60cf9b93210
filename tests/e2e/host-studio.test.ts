// In a real browser against the real server: a new studio owner sets up a studio by ZIP code, describes an
// electric kiln in inches and °F, prices it, posts a firing in the studio's own time zone, sets its damage
// charges, publishes, and a signed-out visitor sees the firing with its space left and the charges. Then the
// owner invites crew by mail; the invitee registers through the mailed link, moves the firing on, and finds
// the prices closed to them.
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { EXAMPLE_MUG } from '../../shared/firing/examples'
import { launchBrowser, openPage } from '../support/browser'
import { linkIn, waitForMail } from '../support/mailbox'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let browser: Browser
const PASSWORD = 'wadding-under-every-foot'
const STUDIO_ZONE = 'America/Los_Angeles'
const contexts: BrowserContext[] = []

beforeAll(async () => {
  app = await startTestApp({ mail: true, serveClient: true })
  browser = await launchBrowser()
})

afterAll(async () => {
  for (const context of contexts) await context.close().catch(() => undefined)
  await browser?.close()
  await app?.close()
})

// The browser runs in Tokyo on purpose: what the owner types and what potters read must be Portland
// time, whatever zone the device is in.
async function newPage() {
  const opened = await openPage(browser, app.url, { timezoneId: 'Asia/Tokyo' })
  contexts.push(opened.context)
  return opened
}

/** The calendar day `days` from now in the studio's zone, as a datetime-local value at that hour. */
function studioLocal(days: number, hour: string): string {
  const day = new Intl.DateTimeFormat('en-CA', { timeZone: STUDIO_ZONE, year: 'numeric', month: '2-digit', day: '2-digit' }).format(
    new Date(Date.now() + days * 86_400_000),
  )
  return `${day}T${hour}`
}

// Exact definitions (NIST SP 811): 1 in = 25.4 mm, 1 ft = 12 in; t/°C = (t/°F − 32) / 1.8.
const MM_PER_INCH = 25.4
/** Two layers of the round kiln on sale: one round shelf each, so two shelves of space. */
const LAYERS_ON_SALE = 2

let studioId = ''
let kilnId = ''
let studioName = ''
let owner: Page

describe('a studio owner sets up a studio and crew in the browser', () => {
  it('registers, creates a studio by ZIP 97214, adds a kiln, posts a firing, publishes; a visitor sees the space left', async () => {
    const { page, errors } = await newPage()
    owner = page
    const email = `owner.${Date.now()}@example.test`
    studioName = `Alder Street Clay ${Date.now() % 10_000}`

    await page.goto('/join')
    await page.getByText('I fire kilns').click()
    await page.getByLabel('Your name').fill('Rosa Delacroix')
    await page.getByLabel('E-mail').fill(email)
    await page.getByLabel('Password').fill(PASSWORD)
    await page.getByRole('button', { name: 'Make my account' }).click()
    await page.waitForURL('**/kiln-room')

    await page.getByRole('heading', { name: 'Set up your studio' }).waitFor()
    await page.getByLabel('Studio name').fill(studioName)
    await page.getByLabel('Postal code').fill('97214')
    await page.getByRole('button', { name: 'Set up the studio' }).click()
    await page.getByRole('heading', { name: studioName }).waitFor()
    // ZIP 97214 is in Portland, Oregon (US Census ZCTA gazetteer; from memory), on Pacific time.
    expect(await page.getByTestId('studio-panel').textContent()).toContain('Portland')
    // The zone is named as people say it (Unicode CLDR's generic name), never by its database id.
    expect(await page.getByTestId('studio-panel').textContent()).toContain('Pacific Time')
    expect(await page.getByTestId('studio-panel').textContent()).not.toContain(STUDIO_ZONE)

    await page.getByRole('link', { name: 'Add a kiln' }).first().click()
    await page.waitForURL('**/kilns/new')
    studioId = page.url().split('/studios/')[1].split('/')[0]
    const kilnForm = page.getByRole('form', { name: 'Kiln' })
    await kilnForm.getByLabel('Name').fill('Big electric')
    await kilnForm.getByLabel('Inside diameter (in)').fill('28')
    await kilnForm.getByLabel('Inside height (in)').fill('27')
    await kilnForm.getByLabel('Shelves').fill('6')
    await kilnForm.getByLabel('Hottest cone').fill('10')
    await kilnForm.getByLabel('Top temperature (°F)').fill('2350')
    await kilnForm.getByLabel('Fastest climb (°F/h)').fill('540')
    // A cone range typed backwards is refused next to the field by the shared schema, before sending.
    await kilnForm.getByLabel('Coolest cone').fill('12')
    await kilnForm.getByRole('button', { name: 'Add the kiln' }).click()
    await kilnForm.getByText('The coolest cone must not be hotter than the hottest cone.').waitFor()
    await kilnForm.getByLabel('Coolest cone').fill('022')
    await kilnForm.getByRole('button', { name: 'Add the kiln' }).click()
    await page.waitForURL(/\/kilns\/[0-9a-f-]{36}$/)
    kilnId = page.url().split('/kilns/')[1]
    expect(await page.getByTestId('kiln-limits').textContent()).toContain('Electric, oxidation, cone 022 to 10, 28 in across × 27 in tall')

    // Stored SI: 28 in = 711.2 mm, 2350 °F = 1287.8 °C, 540 °F/h = 300 °C/h (NIST SP 811 definitions).
    const stored = await page.evaluate(async (id) => (await fetch(`/api/kilns/${id}`)).json(), kilnId)
    expect(stored.interior.diameterMm).toBeCloseTo(28 * MM_PER_INCH, 6)
    expect(stored.maxTempC).toBeCloseTo((2350 - 32) / 1.8, 6)
    expect(stored.maxRampCPerHour).toBeCloseTo(540 / 1.8, 6)

    // Volume pricing at 4 ¢ per cubic inch of each piece's bounding box; the example quote follows the field.
    const prices = page.getByRole('form', { name: 'Price list' })
    await prices.getByLabel('Price per cubic inch (USD)').fill('0.04')
    const mugCubicInches = (EXAMPLE_MUG.heightMm * EXAMPLE_MUG.widthMm * EXAMPLE_MUG.depthMm) / MM_PER_INCH ** 3
    const mugTotal = `$${(Math.floor(mugCubicInches * 4 + 0.5) / 100).toFixed(2)}`
    await prices.getByTestId('example-total').first().getByText(mugTotal).waitFor()
    await prices.getByRole('button', { name: 'Save prices' }).click()
    await prices.getByText('Prices saved.').waitFor()

    await page.getByRole('navigation', { name: 'Studio' }).getByRole('link', { name: 'Kiln room' }).click()
    await page.waitForURL('**/kiln-room')
    await page.getByRole('button', { name: 'Post a firing' }).first().click()
    const firingForm = page.getByRole('form', { name: 'New firing' })
    await firingForm.getByLabel('Kind of firing').selectOption('glaze')
    await firingForm.getByLabel('Cone').selectOption('6')
    await firingForm.getByLabel(/^Drop-off closes/).fill(studioLocal(5, '12:00'))
    await firingForm.getByLabel(/^Firing starts/).fill(studioLocal(7, '18:00'))
    await firingForm.getByLabel(/^Ready for pickup/).fill(studioLocal(10, '12:00'))
    await firingForm.getByLabel('Layers on sale').fill(String(LAYERS_ON_SALE))
    await firingForm.getByRole('button', { name: 'Post the firing' }).click()
    await firingForm.waitFor({ state: 'detached' })
    const hostRow = page.getByTestId('firing-row')
    await hostRow.waitFor()
    expect(await hostRow.getByTestId('space-left').textContent()).toContain(`${LAYERS_ON_SALE} shelves left`)

    await page.getByRole('link', { name: 'Edit studio' }).click()
    await page.waitForURL(`**/studios/${studioId}/edit`)
    await page.getByLabel('Drop-off hours').fill('Tue–Sat 10 am–6 pm, side door')
    await page.getByLabel(/^Published/).check()
    await page.getByLabel('Earthenware').check()
    await page.getByRole('button', { name: 'Save settings' }).click()
    await page.getByText('Saved.').waitFor()
    // Damage charges left at the defaults shown (shared/claims.ts) stay the defaults, not a copy of them.
    const before = await page.evaluate(async (id) => (await fetch(`/api/studios/${id}`)).json(), studioId)
    expect(before.policies.clayBodies).toContain('earthenware')
    expect(before.policies.damageCharges).toBeUndefined()

    // Typed in dollars and cents; a refused save keeps everything typed.
    const cleaning = page.getByLabel('Kiln cleaning after a blowout (USD)')
    expect(await cleaning.inputValue()).toBe('60')
    await page.getByLabel('Shelf replaced (USD)').fill('0')
    await cleaning.fill('-5')
    await page.getByRole('button', { name: 'Save settings' }).click()
    await page.getByText('At least 0.').waitFor()
    expect(await page.getByLabel('Shelf replaced (USD)').inputValue()).toBe('0')
    await cleaning.fill('75.50')
    await page.getByRole('button', { name: 'Save settings' }).click()
    await page.getByText('Saved.').waitFor()
    const terms = await page.evaluate(async (id) => (await fetch(`/api/studios/${id}`)).json(), studioId)
    expect(terms.policies.damageCharges).toEqual({ 'kiln-cleaning': 7550, 'shelf-ground': 2500, 'shelf-replaced': 0, 'other-ware': 15000 })

    const visitor = await newPage()
    await visitor.page.goto(`/studios/${studioId}`)
    await visitor.page.getByRole('heading', { name: studioName, level: 1 }).waitFor()
    const row = visitor.page.getByTestId('firing-row')
    await row.waitFor()
    expect(await row.count()).toBe(1)
    expect(await row.getByTestId('space-left').textContent()).toContain(`${LAYERS_ON_SALE} shelves left`)
    // 6 pm typed as Portland time reads 6 pm Portland time, though both browsers sit in Tokyo.
    expect(await row.textContent()).toMatch(/6:00\sPM P[DS]T/)
    expect(await row.textContent()).toContain('Glaze, cone 6 oxidation')
    expect(await visitor.page.getByTestId('kiln-limits').textContent()).toContain('cone 022 to 10')
    expect(await visitor.page.getByTestId('example-price').first().textContent()).toContain(mugTotal)
    expect(await visitor.page.getByTestId('calendar-subscribe').getAttribute('href')).toMatch(
      new RegExp(`^webcal://.+/api/studios/${studioId}/calendar\\.ics$`),
    )
    expect(await visitor.page.getByText('Tue–Sat 10 am–6 pm, side door').isVisible()).toBe(true)
    const charges = await visitor.page.getByTestId('damage-charges').textContent()
    expect(charges).toContain('Kiln cleaning after a blowout: up to $75.50')
    expect(charges).toContain('Shelf ground clean: up to $25.00')
    expect(charges).toContain('Shelf replaced: no charge')
    expect(errors).toEqual([])
    expect(visitor.errors).toEqual([])
  })

  it('invites crew by mail; the invitee registers through the link, moves the firing on, and cannot change prices', async () => {
    expect(studioId).not.toBe('')
    const crewEmail = `crew.${Date.now()}@example.test`
    const invitedAt = new Date()
    await owner.goto(`/studios/${studioId}/crew`)
    const inviteForm = owner.getByRole('form', { name: 'Invite crew' })
    await inviteForm.getByLabel('Their e-mail').fill(crewEmail)
    await inviteForm.getByRole('button', { name: 'Send invitation' }).click()
    await inviteForm.getByText('Invitation sent').waitFor()
    await owner.getByTestId('crew-invite').filter({ hasText: crewEmail }).waitFor()

    const mail = await waitForMail(app.mail!.webUrl, { to: crewEmail, subject: 'crew of', after: invitedAt })
    const { page, errors } = await newPage()
    await page.goto(linkIn(mail, '/join-studio'))
    await page.getByTestId('invite-studio').getByText(studioName).waitFor()
    expect(await page.getByTestId('invite-email').textContent()).toBe(crewEmail)
    await page.getByLabel('Your name').fill('Theo Marchetti')
    await page.getByLabel('Password').fill(PASSWORD)
    await page.getByRole('button', { name: 'Make my account and join' }).click()
    await page.waitForURL('**/kiln-room')
    const panel = page.getByTestId('studio-panel')
    await panel.getByRole('heading', { name: studioName }).waitFor()
    expect(await panel.getByText('Crew', { exact: true }).count()).toBeGreaterThan(0)

    await panel
      .getByTestId('firing-row')
      .getByRole('button', { name: /^Manage/ })
      .click()
    const dialog = page.getByRole('dialog')
    await dialog.getByRole('button', { name: 'Stop taking ware' }).click()
    await dialog.locator('[data-testid="firing-status"][data-status="closed"]').waitFor()
    await dialog.getByRole('button', { name: 'Close' }).click()
    await panel.locator('[data-testid="firing-status"][data-status="closed"]').waitFor()

    await panel.getByRole('link', { name: 'Big electric' }).click()
    await page.waitForURL(`**/kilns/${kilnId}`)
    const fields = page.getByTestId('price-list-fields')
    await page.getByText('Prices are the owner’s to set').waitFor()
    expect(await fields.getAttribute('data-read-only')).toBe('true')
    expect(await page.getByLabel('Price per cubic inch (USD)').isDisabled()).toBe(true)
    expect(await page.getByRole('button', { name: 'Save prices' }).count()).toBe(0)

    // The read-only form is a courtesy; the server is the guard. Crew asking anyway are refused.
    const refusal = await page.evaluate(async (id) => {
      const { token } = (await (await fetch('/api/auth/csrf')).json()) as { token: string }
      const res = await fetch(`/api/kilns/${id}/price-list`, {
        method: 'PUT',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': token },
        body: JSON.stringify({ currency: 'USD', model: 'kiln', kilnCents: 1, deposit: { percent: 0 } }),
      })
      return { status: res.status, body: (await res.json()) as { error: { code: string } } }
    }, kilnId)
    expect(refusal.status).toBe(403)
    expect(refusal.body.error.code).toBe('studio-role')

    await owner.reload()
    await owner.getByTestId('crew-member').filter({ hasText: 'Theo Marchetti' }).waitFor()
    expect(await owner.getByTestId('crew-invite').filter({ hasText: crewEmail }).count()).toBe(0)
    expect(errors).toEqual([])
  })
})
