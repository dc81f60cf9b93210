import { existsSync } from 'node:fs'
import path from 'node:path'
import { chromium, type Browser, type BrowserContext, type BrowserContextOptions, type Page } from 'playwright-core'
import { repoRoot } from '../../server/config'
import { PERSON_PASSWORD } from './people'

/** Debian's Chromium, headless, with everything that would reach the network switched off. */
export async function launchBrowser(): Promise<Browser> {
  if (!existsSync(path.join(repoRoot, 'dist/client/index.html'))) {
    throw new Error('dist/client is missing: run the tests with `npm test`, which builds the client first')
  }
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--no-first-run',
      '--disable-sync',
      '--disable-quic',
    ],
  })
}

/** Pages open now, with the API calls that failed on each: what a failed test prints (tests/setup/e2e-failures.ts). */
const watched = new Map<Page, string[]>()

/** Fails the test on any uncaught page error, so a broken page cannot pass by luck. */
export function watchPageErrors(page: Page): string[] {
  const errors: string[] = []
  const refused: string[] = []
  watched.set(page, refused)
  page.on('close', () => watched.delete(page))
  page.on('pageerror', (error) => errors.push(error.message))
  page.on('response', (response) => {
    const url = new URL(response.url())
    if (response.status() >= 400 && url.pathname.startsWith('/api/')) {
      refused.push(`${new Date().toISOString()} ${response.request().method()} ${url.pathname} → ${response.status()}`)
    }
  })
  return errors
}

/** Where each open page stands: its address, the alerts it shows and its refused API calls. */
export async function describeOpenPages(): Promise<string> {
  const parts: string[] = []
  for (const [page, refused] of watched) {
    if (page.isClosed()) continue
    const alerts = await page
      .locator('[role="alert"]')
      .allInnerTexts()
      .catch(() => [])
    parts.push(
      [
        `page ${page.url()}`,
        ...alerts.map((text) => `  alert: ${text.trim()}`),
        ...refused.slice(-10).map((line) => `  api: ${line}`),
      ].join('\n'),
    )
  }
  return parts.join('\n')
}

/** A fresh browser context and page on the app, with page errors collected and a 60 s default wait (a ceiling for a busy machine; every wait is on a state). */
export async function openPage(
  browser: Browser,
  baseURL: string,
  options: BrowserContextOptions = {},
): Promise<{ page: Page; errors: string[]; context: BrowserContext }> {
  const context = await browser.newContext({ baseURL, viewport: { width: 1280, height: 900 }, ...options })
  const page = await context.newPage()
  page.setDefaultTimeout(60_000)
  return { page, errors: watchPageErrors(page), context }
}

/** Signs in through the sign-in form as a person would; resolves once the app has left it (for `home` when given). */
export async function signIn(page: Page, email: string, home?: string) {
  await page.goto('/sign-in')
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(PERSON_PASSWORD)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await (home ? page.waitForURL(`**${home}`) : page.waitForURL((url) => !url.pathname.startsWith('/sign-in')))
}

/** A fresh page on the app with the person signed in; its context joins `contexts`, for closing at the end. */
export async function openSignedIn(
  browser: Browser,
  baseURL: string,
  contexts: BrowserContext[],
  email: string,
  { home, ...options }: BrowserContextOptions & { home?: string } = {},
) {
  const opened = await openPage(browser, baseURL, options)
  contexts.push(opened.context)
  await signIn(opened.page, email, home)
  return opened
}
