import { existsSync } from 'node:fs'
import path from 'node:path'
import { chromium, type Browser, type BrowserContext, type BrowserContextOptions, type Page } from 'playwright-core'
import { repoRoot } from '../../server/config'

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

/** Fails the test on any uncaught page error, so a broken page cannot pass by luck. */
export function watchPageErrors(page: Page): string[] {
  const errors: string[] = []
  page.on('pageerror', (error) => errors.push(error.message))
  return errors
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
