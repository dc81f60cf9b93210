// The firing planner in a real browser against the real server, as a visitor: pick a demo kiln, put
// in a greenware piece, see the wet-greenware block come and go, the curve drawn, and °C on request.
import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, openPage } from '../support/browser'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let browser: Browser

beforeAll(async () => {
  app = await startTestApp({ worker: false, serveClient: true })
  browser = await launchBrowser()
})

afterAll(async () => {
  await browser?.close()
  await app?.close()
})

const newPage = () => openPage(browser, app.url)

describe('the firing planner', () => {
  it('blocks wet greenware until it is marked bone dry, draws the curve and switches to °C', async () => {
    const { page, errors } = await newPage()
    await page.goto('/planner')
    await page.getByRole('heading', { name: 'Firing planner' }).waitFor()

    await page.getByLabel('Start from a demo kiln').selectOption({ label: 'Small test kiln, 9 in box, to cone 6' })
    const kiln = page.getByRole('region', { name: 'Kiln' })
    // 9 in inside, as the demo kiln says, shown in inches for a visitor.
    expect(await kiln.getByLabel('Inside width (in)').inputValue()).toBe('9')

    const firing = page.getByRole('region', { name: 'Firing' })
    // A single firing takes raw greenware to its final cone in one go.
    await firing.getByLabel('Firing', { exact: true }).selectOption('single')
    await firing.getByLabel('Cone').fill('6')

    const piece = page.getByRole('group', { name: 'Piece 1' })
    await piece.getByLabel('Glazed').uncheck()
    await piece.getByLabel('State').selectOption('greenware')

    const wet = page.locator('[data-finding="wet-greenware"]')
    await wet.waitFor()
    expect(await wet.textContent()).toContain('is not marked bone dry')
    expect(await page.getByTestId('verdict').getAttribute('data-verdict')).toBe('block')
    expect(await page.getByTestId('verdict').textContent()).toContain('Blocked')
    // The server, asked once typing stops, says the same.
    await page.locator('[data-testid="server-verdict"][data-verdict="block"]').waitFor()

    await piece.getByLabel(/Bone dry/).check()
    await wet.waitFor({ state: 'detached' })
    expect(await page.getByTestId('verdict').getAttribute('data-verdict')).toBe('ok')
    await page.locator('[data-testid="server-verdict"][data-verdict="ok"]').waitFor()

    await page.locator('[data-testid="firing-curve"] svg.recharts-surface').waitFor()
    expect(await page.locator('[data-testid="firing-curve"] .recharts-line path').count()).toBeGreaterThan(0)
    expect(await page.getByTestId('peak-temperature').textContent()).toMatch(/^\d+ °F$/)

    // The radios are drawn as a switch; a pointer clicks the visible choice, as a person would.
    await page.getByText('°C', { exact: true }).click()
    expect(await page.getByRole('radio', { name: '°C', exact: true }).isChecked()).toBe(true)
    // Orton's temperature-equivalent chart, self-supporting cones: cone 6 bends at 1222 °C when the last
    // 100 °C are climbed at 60 °C/h, the rate this plan sets the cone at.
    expect(await page.getByTestId('peak-temperature').textContent()).toBe('1222 °C')
    expect(await page.getByTestId('predicted-cone').textContent()).toBe('cone 6')
    expect(errors).toEqual([])
  })

  it('never breaks on half-typed input: the field says what is wrong and the check waits', async () => {
    const { page, errors } = await newPage()
    await page.goto('/planner')
    const piece = page.getByRole('group', { name: 'Piece 1' })
    const height = piece.getByLabel('Height (in)')
    await height.fill('')
    await piece.getByText('Enter the height in inches').waitFor()
    expect(await page.getByTestId('verdict').getAttribute('data-verdict')).toBe('incomplete')
    await height.fill('4.')
    await piece.getByText('Enter the height in inches').waitFor({ state: 'detached' })
    expect(await height.inputValue()).toBe('4.')
    expect(await page.getByTestId('verdict').getAttribute('data-verdict')).toBe('ok')

    await page.getByText('mm · °C', { exact: true }).click()
    // 4 in = 101.6 mm exactly (NIST SP 811).
    expect(await piece.getByLabel('Height (mm)').inputValue()).toBe('101.6')
    expect(errors).toEqual([])
  })
})

describe('inches as a potter writes them', () => {
  it('takes a wall of 3/8 in, 1 1/2 and 1-1/2, shows it back to the sixteenth and refuses what no ruler reads', async () => {
    const { page, errors } = await newPage()
    await page.goto('/planner')
    const piece = page.getByRole('group', { name: 'Piece 1' })
    const wall = piece.getByLabel('Wall thickness (in)')
    await wall.fill('3/8')
    await expect.poll(() => page.getByTestId('verdict').getAttribute('data-verdict')).toBe('ok')
    expect(await piece.getByText('Enter the wall thickness').count()).toBe(0)

    await page.getByText('mm · °C', { exact: true }).click()
    // 3/8 in = 9.525 mm (1 in = 25.4 mm exactly, NIST SP 811), written to the tenth.
    expect(await piece.getByLabel('Wall thickness (mm)').inputValue()).toBe('9.5')
    await page.getByText('in · °F', { exact: true }).click()
    // 9.5 mm is 0.374 in, nearest the 3/8 mark.
    expect(await wall.inputValue()).toBe('3/8')

    const height = piece.getByLabel('Height (in)')
    for (const typed of ['1 1/2', '1-1/2', '1½']) {
      await height.fill(typed)
      await expect.poll(() => page.getByTestId('verdict').getAttribute('data-verdict')).toBe('ok')
      expect(await piece.getByText('Enter the height').count()).toBe(0)
    }
    await height.fill('3/0')
    await piece.getByText('Enter the height in inches, like 4.5 or 3/8.').waitFor()
    expect(await page.getByTestId('verdict').getAttribute('data-verdict')).toBe('incomplete')
    expect(errors).toEqual([])
  })
})

describe('lustre and raku in the planner', () => {
  it('plans a raku firing: a fast climb, ware pulled hot, and the outdoor and protective-gear caution', async () => {
    const { page, errors } = await newPage()
    await page.goto('/planner')
    await page.getByLabel('Start from a demo kiln').selectOption({ label: 'Raku kiln, fibre-lined, gas, to cone 04' })
    const firing = page.getByRole('region', { name: 'Firing' })
    await firing.getByLabel('Firing', { exact: true }).selectOption('raku')
    await firing.getByLabel('Cone').fill('06')
    const piece = page.getByRole('group', { name: 'Piece 1' })
    await piece.getByLabel('Clay body').selectOption('raku')
    await piece.getByLabel('Clay matures from cone').fill('010')
    await piece.getByLabel('Clay rated to cone').fill('04')
    await piece.getByLabel('Glaze from cone').fill('07')
    await piece.getByLabel('Glaze to cone').fill('05')

    const safety = page.locator('[data-finding="firing-safety"]')
    await safety.waitFor()
    expect(await safety.textContent()).toMatch(/outdoors/)
    expect(await page.getByTestId('verdict').getAttribute('data-verdict')).toBe('ok')
    await page.locator('[data-testid="firing-curve"] svg.recharts-surface').waitFor()
    await page.getByRole('cell', { name: 'Pulled hot (cools outside the kiln)' }).waitFor()

    // The same pot in stoneware is refused: only a raku body survives being pulled hot.
    await piece.getByLabel('Clay body').selectOption('stoneware')
    await page.locator('[data-finding="raku-body"]').waitFor()
    expect(await page.getByTestId('verdict').getAttribute('data-verdict')).toBe('block')
    expect(errors).toEqual([])
  })

  it('plans a lustre firing on glaze-fired ware at cone 018, vented through the burnout', async () => {
    const { page, errors } = await newPage()
    await page.goto('/planner')
    await page.getByLabel('Start from a demo kiln').selectOption({ label: 'Electric top-loader, 7 cu ft, to cone 10' })
    const firing = page.getByRole('region', { name: 'Firing' })
    await firing.getByLabel('Firing', { exact: true }).selectOption('lustre')
    await firing.getByLabel('Cone').fill('018')
    const piece = page.getByRole('group', { name: 'Piece 1' })

    // Bisque is not glazed ware: lustre goes over a fired glaze.
    await page.locator('[data-finding="lustre-ware"]').waitFor()
    await piece.getByLabel('State').selectOption('glazed')
    await page.locator('[data-finding="lustre-ware"]').waitFor({ state: 'detached' })
    expect(await page.locator('[data-finding="firing-safety"]').textContent()).toMatch(/fumes/)
    expect(await page.getByTestId('verdict').getAttribute('data-verdict')).toBe('ok')
    await page.getByText('°C', { exact: true }).click()
    // Chart, 60 °C/h column: cone 018 bends at 715 °C.
    expect(await page.getByTestId('peak-temperature').textContent()).toBe('715 °C')
    expect(await page.getByTestId('predicted-cone').textContent()).toBe('cone 018')
    expect(errors).toEqual([])
  })
})
