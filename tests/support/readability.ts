// What the readable-everywhere checks measure in a page: axe-core's serious and critical findings (the
// engine injected into the page, no network) and how far the page scrolls sideways.
import { createRequire } from 'node:module'
import type { Page } from 'playwright-core'
import { expect } from 'vitest'

const AXE_SOURCE: string = (createRequire(import.meta.url)('axe-core') as { source: string }).source

interface Violation {
  id: string
  impact: string | null
  help: string
  nodes: { target: string[]; failureSummary?: string }[]
}

/** axe-core's serious and critical findings against WCAG 2.1 A and AA, in a line each. */
export async function seriousViolations(page: Page): Promise<string[]> {
  // Evaluated through the DevTools protocol, which the page's script-src policy does not govern.
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE)
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (c: Document, o: object) => Promise<{ violations: Violation[] }> } }).axe
    const result = await axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] } })
    return result.violations
  })
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .flatMap((v) =>
      v.nodes.map((n) => `${v.id} (${v.impact}) at ${n.target.join(' ')}: ${n.failureSummary?.split('\n').slice(1).join(' ')}`),
    )
}

/** How far the page scrolls sideways at the current width: 0 when nothing sticks out. */
export const sidewaysOverflow = (page: Page) =>
  page.evaluate(() => {
    const root = document.scrollingElement!
    return root.scrollWidth - root.clientWidth
  })

/** Waits for the page's data: a heading in the main region and no spinner left in it. */
export async function settled(page: Page) {
  await page.locator('main h1').first().waitFor()
  await expect.poll(() => page.locator('main .animate-spin, main [aria-busy="true"]').count()).toBe(0)
}

/** axe at a desk's width and at a phone's, and how far the phone view scrolls sideways; the page is left at the desk's width. */
export async function readableAtBothWidths(page: Page) {
  await page.setViewportSize({ width: 1280, height: 900 })
  await settled(page)
  const wide = await seriousViolations(page)
  await page.setViewportSize({ width: 390, height: 844 })
  await settled(page)
  const narrow = await seriousViolations(page)
  const overflow = await sidewaysOverflow(page)
  await page.setViewportSize({ width: 1280, height: 900 })
  return { problems: [...new Set([...wide, ...narrow])], overflow }
}
