// The front desk in the browser: studios and accounts found, filtered and paged by the server; the
// reader's own account is never offered for suspension (the server refuses it too: see
// tests/integration/admin.test.ts); each dispute shows its reason and opens the whole record. Every tab
// is checked with axe-core and at a phone's 390 × 844 for sideways scrolling.
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_PASSWORD, seedDemo } from '../../server/db/seed'
import { REQUEST_STATE_LABELS } from '../../shared/workflow/request-states'
import { launchBrowser, openPage } from '../support/browser'
import { DISPUTE_REASON, disputedRequest } from '../support/dispute-fixture'
import { HttpSession } from '../support/http-client'
import { readableAtBothWidths, settled } from '../support/readability'
import { startTestApp, type TestApp } from '../support/test-app'

const POTTER = 'wren.alvarado@demo.conewright.test'
const OWNER = 'marisol.okafor@demo.conewright.test'
const ADMIN = 'admin@demo.conewright.test'

let app: TestApp
let browser: Browser
let context: BrowserContext
let page: Page
let errors: string[]
const ids = { studio: '', studioName: '', request: '' }

async function signedIn(email: string) {
  const session = new HttpSession(app.url)
  const reply = await session.signIn(email, DEMO_PASSWORD)
  if (reply.status !== 200) throw new Error(`${email}: ${reply.status}`)
  return session
}

beforeAll(async () => {
  app = await startTestApp({ serveClient: true })
  await seedDemo(app.ctx)
  browser = await launchBrowser()
  const owner = await signedIn(OWNER)
  const potter = await signedIn(POTTER)
  const mine = (await owner.get('/api/auth/me')).body.studios[0]
  ids.studio = mine.id
  ids.studioName = (await owner.get(`/api/studios/${ids.studio}`)).body.name
  const kilns = (await owner.get(`/api/studios/${ids.studio}/kilns`)).body.kilns as { id: string; name: string }[]
  ids.request = (await disputedRequest(owner, potter, kilns.find((k) => k.name === 'Big Ten')!.id)).requestId
  ;({ page, errors, context } = await openPage(browser, app.url))
  await page.goto('/sign-in')
  await page.getByLabel('E-mail').fill(ADMIN)
  await page.getByLabel('Password').fill(DEMO_PASSWORD)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'))
}, 180_000)

afterAll(async () => {
  await context?.close().catch(() => undefined)
  await browser?.close()
  await app?.close()
})

/** axe at the desk's width and a phone's, and how far the phone view scrolls sideways. */
async function search(field: string, words: string) {
  await page.getByLabel(field).fill(words)
  await page.getByLabel(field).press('Enter')
}

const CEILING = 240_000

describe('the front desk', () => {
  it(
    'finds a studio by its owner, in a table the server pages',
    async () => {
      await page.goto('/front-desk')
      await settled(page)
      await page.getByRole('tab', { name: 'Studios' }).click()
      await page.getByTestId('desk-studio').first().waitFor()
      expect(await readableAtBothWidths(page)).toEqual({ problems: [], overflow: 0 })
      await search('Name, town or owner', 'Okafor')
      await expect
        .poll(() => page.getByTestId('desk-studio').evaluateAll((rows) => rows.map((r) => r.getAttribute('data-studio-id'))))
        .toEqual([ids.studio])
      expect(await page.getByTestId('desk-studio').textContent()).toContain(ids.studioName)
      expect(await page.getByTestId('desk-range').textContent()).toBe('1–1 of 1')
    },
    CEILING,
  )

  it(
    "does not offer to suspend the reader's own account, and asks before suspending another",
    async () => {
      await page.getByRole('tab', { name: 'Accounts' }).click()
      await page.getByTestId('desk-account').first().waitFor()
      await search('Name or e-mail', ADMIN)
      const own = page.getByTestId('desk-account')
      await expect.poll(() => own.count()).toBe(1)
      await own.getByTestId('own-account').waitFor()
      expect(await own.getByRole('button').count()).toBe(0)

      await search('Name or e-mail', POTTER)
      const wren = page.locator('[data-testid="desk-account"]', { hasText: 'Wren Alvarado' })
      await wren.getByRole('button', { name: 'Suspend…' }).click()
      const dialog = page.getByRole('dialog')
      await dialog.getByRole('button', { name: 'Suspend the account' }).click()
      await expect.poll(() => wren.getAttribute('data-suspended')).toBe('true')
      expect(await dialog.isVisible()).toBe(false)
      const suspended = await new HttpSession(app.url).signIn(POTTER, DEMO_PASSWORD)
      expect(suspended.status).toBe(403)
      await wren.getByRole('button', { name: 'Restore' }).click()
      await expect.poll(() => wren.getAttribute('data-suspended')).toBe('false')
      expect((await new HttpSession(app.url).signIn(POTTER, DEMO_PASSWORD)).status).toBe(200)

      await search('Name or e-mail', '')
      await expect.poll(() => page.getByTestId('desk-account').count()).toBeGreaterThan(1)
      expect(await readableAtBothWidths(page)).toEqual({ problems: [], overflow: 0 })
    },
    CEILING,
  )

  it(
    "shows a dispute's reason and opens its whole record",
    async () => {
      await page.getByRole('tab', { name: 'Disputes' }).click()
      const dispute = page.locator(`[data-testid="desk-dispute"][data-request-id="${ids.request}"]`)
      await dispute.waitFor()
      expect(await dispute.getByTestId('dispute-reason').textContent()).toContain(DISPUTE_REASON)
      expect(await dispute.getByTestId('dispute-reason').textContent()).toContain('Raised by the potter, Wren Alvarado')
      await dispute.getByRole('button', { name: 'Read the record' }).click()
      const record = page.getByTestId('dispute-record')
      await record.waitFor()
      await settled(page)
      // The fixture's own words, each from a different part of the record.
      expect(await record.getByTestId('evidence-check-in').textContent()).toContain('Both mugs dry and clean-footed at drop-off')
      expect(await record.getByTestId('evidence-results').textContent()).toContain('Stuck to the shelf')
      expect(await record.getByTestId('evidence-messages').textContent()).toContain('The feet were clean when I dropped them off.')
      expect(await record.getByTestId('evidence-messages').textContent()).toContain('We will grind the shelf and look at the log.')
      expect(await record.getByTestId('witness-cone').count()).toBe(3)
      expect(await record.getByTestId('evidence-timeline').textContent()).toContain(REQUEST_STATE_LABELS.disputed)
      const photos = record.getByTestId('evidence-photos').locator('img')
      await expect.poll(() => photos.count()).toBe(3)
      for (const alt of await photos.evaluateAll((imgs) => imgs.map((img) => img.getAttribute('alt') ?? '')))
        expect(alt.trim()).not.toBe('')
      expect(await readableAtBothWidths(page)).toEqual({ problems: [], overflow: 0 })
      expect(errors).toEqual([])
    },
    CEILING,
  )
})
