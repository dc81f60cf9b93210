// Readable everywhere: every main page, signed out and in each role, checked in Chromium with axe-core
// (the engine injected into the page, no network) for serious and critical violations of WCAG 2.1 A/AA,
// tabbed through for a visible focus ring on every control, searched for photos without alt text, and
// measured at a phone's 390 × 844 for sideways scrolling. The pages run over the demo data plus one
// disputed request with every kind of evidence, so the request page, the firing log and the front desk
// show their fullest state.
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_PASSWORD, seedDemo } from '../../server/db/seed'
import { launchBrowser, openPage } from '../support/browser'
import { disputedRequest } from '../support/dispute-fixture'
import { HttpSession } from '../support/http-client'
import { seriousViolations, settled, sidewaysOverflow } from '../support/readability'
import { startTestApp, type TestApp } from '../support/test-app'

const POTTER = 'wren.alvarado@demo.conewright.test'
const OWNER = 'marisol.okafor@demo.conewright.test'
const CREW = 'dev.ramanathan@demo.conewright.test'
const ADMIN = 'admin@demo.conewright.test'

let app: TestApp
let browser: Browser
const contexts: BrowserContext[] = []
const ids = { studio: '', kiln: '', openFiring: '', request: '', loggedFiring: '' }

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
  const kilns = (await owner.get(`/api/studios/${ids.studio}/kilns`)).body.kilns as { id: string; name: string }[]
  ids.kiln = kilns.find((k) => k.name === 'Big Ten')!.id
  const firings = (await owner.get(`/api/kilns/${ids.kiln}/firings`)).body.firings as { id: string; status: string }[]
  ids.openFiring = firings.find((f) => f.status === 'open')!.id
  const disputed = await disputedRequest(owner, potter, ids.kiln)
  ids.request = disputed.requestId
  ids.loggedFiring = disputed.firingId
}, 180_000)

afterAll(async () => {
  for (const context of contexts) await context.close().catch(() => undefined)
  await browser?.close()
  await app?.close()
})

/**
 * Tabs through the page (up to `stops` controls) and names every control that takes keyboard focus
 * without drawing an outline or a ring around itself.
 */
async function focusWithoutRing(page: Page, stops = 60): Promise<string[]> {
  await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur())
  const missing: string[] = []
  const seen = new Set<string>()
  for (let i = 0; i < stops; i++) {
    await page.keyboard.press('Tab')
    const focused = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement | null
      if (!el || el === document.body) return null
      const style = getComputedStyle(el)
      const ring = (style.outlineStyle !== 'none' && parseFloat(style.outlineWidth) >= 1) || style.boxShadow !== 'none'
      const path: string[] = []
      for (let node: Element | null = el; node && node !== document.body; node = node.parentElement)
        path.unshift(`${node.tagName}${node.parentElement ? [...node.parentElement.children].indexOf(node) : ''}`)
      const name = (el.getAttribute('aria-label') ?? el.textContent ?? '').trim().slice(0, 40)
      return { key: path.join('/'), label: `${el.tagName.toLowerCase()} "${name}"`, ring }
    })
    if (!focused || seen.has(focused.key)) break
    seen.add(focused.key)
    if (!focused.ring) missing.push(`no focus ring on ${focused.label}`)
  }
  return missing
}

/** Photos (map tiles aside) without words for a screen reader. */
const photosWithoutAlt = (page: Page) =>
  page.evaluate(() =>
    [...document.querySelectorAll('main img:not(.leaflet-tile)')]
      .filter((img) => !(img.getAttribute('alt') ?? '').trim())
      .map((img) => `photo without alt text: ${img.getAttribute('src')}`),
  )

async function roleContext(email: string | null) {
  const { page, errors, context } = await openPage(browser, app.url)
  contexts.push(context)
  if (email) {
    await page.goto('/sign-in')
    await page.getByLabel('E-mail').fill(email)
    await page.getByLabel('Password').fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'))
  }
  return { page, errors }
}

/** Opens each page wide and then at 390 × 844; returns what axe found and what overflowed, per page. */
async function checkPages(email: string | null, paths: () => string[]) {
  const { page, errors } = await roleContext(email)
  const found: Record<string, string[]> = {}
  for (const path of paths()) {
    await page.setViewportSize({ width: 1280, height: 900 })
    await page.goto(path)
    await settled(page)
    const wide = await seriousViolations(page)
    const unfocused = await focusWithoutRing(page)
    const unnamed = await photosWithoutAlt(page)
    await page.setViewportSize({ width: 390, height: 844 })
    await settled(page)
    const narrow = await seriousViolations(page)
    const overflow = await sidewaysOverflow(page)
    const problems = [...new Set([...wide, ...narrow, ...unfocused, ...unnamed])]
    if (overflow > 0) problems.push(`scrolls ${overflow} px sideways at 390 px`)
    found[path] = problems
  }
  expect(errors).toEqual([])
  return found
}

/** A ceiling for a busy machine: each set opens up to ten pages at two widths and tabs through them. */
const PAGE_SET_CEILING = 480_000

const clean = (found: Record<string, string[]>) => Object.fromEntries(Object.keys(found).map((path) => [path, []]))

describe('every main page is readable and fits a phone', () => {
  it(
    'signed out: landing, find, planner, sign-in, join, safety and a public studio page',
    async () => {
      const found = await checkPages(null, () => ['/', '/find', '/planner', '/sign-in', '/join', '/safety', `/studios/${ids.studio}`])
      expect(found).toEqual(clean(found))
    },
    PAGE_SET_CEILING,
  )

  it(
    'as a potter: my ware, the request, compose, notices, find and the studio page',
    async () => {
      const found = await checkPages(POTTER, () => [
        '/my-ware',
        `/requests/${ids.request}`,
        `/firings/${ids.openFiring}/request`,
        '/notices',
        '/find',
        `/studios/${ids.studio}`,
      ])
      expect(found).toEqual(clean(found))
    },
    PAGE_SET_CEILING,
  )

  it(
    'as a studio owner: kiln room, calendar, kiln editor, crew, firing log, inbox, the request and notices',
    async () => {
      const found = await checkPages(OWNER, () => [
        '/kiln-room',
        `/studios/${ids.studio}/calendar`,
        `/kilns/${ids.kiln}/edit`,
        `/studios/${ids.studio}/crew`,
        `/firings/${ids.loggedFiring}/log`,
        `/studios/${ids.studio}/requests`,
        `/requests/${ids.request}`,
        '/notices',
      ])
      expect(found).toEqual(clean(found))
    },
    PAGE_SET_CEILING,
  )

  it(
    'as crew: kiln room, calendar, firing log, inbox, the request and notices',
    async () => {
      const found = await checkPages(CREW, () => [
        '/kiln-room',
        `/studios/${ids.studio}/calendar`,
        `/firings/${ids.loggedFiring}/log`,
        `/studios/${ids.studio}/requests`,
        `/requests/${ids.request}`,
        '/notices',
      ])
      expect(found).toEqual(clean(found))
    },
    PAGE_SET_CEILING,
  )

  it(
    'as an admin: the front desk, the disputed request, notices and the planner',
    async () => {
      const found = await checkPages(ADMIN, () => ['/front-desk', `/requests/${ids.request}`, '/notices', '/planner'])
      expect(found).toEqual(clean(found))
    },
    PAGE_SET_CEILING,
  )
})
