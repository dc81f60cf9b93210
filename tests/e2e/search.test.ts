// Finding a firing in a real browser against the real server and the search engine stand-in: a
// potter searches near Portland for cone 10 reduction, sees only those firings in the list and on
// the map, narrows by a piece's height, goes back to the earlier search, and opens a studio.
import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startSearchEngine } from '../../standins/search-engine/server'
import { launchBrowser, openPage } from '../support/browser'
import { createPerson, PERSON_PASSWORD, type Person } from '../support/people'
import { HttpSession } from '../support/http-client'
import { electricKiln } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'
import { waitUntil } from '../support/wait'

let app: TestApp
let browser: Browser
let host: Person
let potter: Person
const studios: Record<string, string> = {}
const days = (n: number) => new Date(Date.now() + n * 86400_000)

const gasKiln = (heightMm: number) => ({
  kind: 'gas',
  atmospheres: ['reduction', 'oxidation'],
  interior: { shape: 'box', widthMm: 900, depthMm: 900, heightMm },
  minCone: '010',
  maxCone: '12',
  maxTempC: 1340,
  maxRampCPerHour: 200,
  preheatHold: true,
  controlledCooling: false,
})
async function studioWithKiln(
  name: string,
  postalCode: string,
  kiln: Record<string, unknown>,
  firings: { cone: string; atmosphere: string; dropInDays: number }[],
) {
  const studio = await host.session.post('/api/studios', { name, postalCode })
  if (studio.status !== 201) throw new Error(JSON.stringify(studio.body))
  studios[name] = studio.body.id
  const created = await host.session.post(`/api/studios/${studio.body.id}/kilns`, { shelfCount: 4, ...kiln, name: `${name} kiln` })
  if (created.status !== 201) throw new Error(JSON.stringify(created.body))
  await host.session.put(`/api/kilns/${created.body.id}/price-list`, {
    currency: 'USD',
    model: 'volume',
    centsPerCubicInch: 5,
    deposit: { percent: 25 },
  })
  for (const { dropInDays, ...firing } of firings) {
    const reply = await host.session.post(`/api/kilns/${created.body.id}/firings`, {
      kind: 'glaze',
      ...firing,
      dropOffBy: days(dropInDays).toISOString(),
      firingDate: days(dropInDays + 2).toISOString(),
      readyBy: days(dropInDays + 4).toISOString(),
    })
    if (reply.status !== 201) throw new Error(JSON.stringify(reply.body))
  }
  await host.session.patch(`/api/studios/${studio.body.id}`, { published: true })
}

beforeAll(async () => {
  app = await startTestApp({ serveClient: true, search: true })
  host = await createPerson(app, 'host', 'Search Host')
  potter = await createPerson(app, 'potter', 'Wren Achterberg')
  // Distances from the gazetteer's Portland, OR (45.5149, -122.6567), by geolib: 97214 1.6 km,
  // 97045 Oregon City 20.9 km, 97030 Gresham 18.4 km, 97124 Hillsboro 24.1 km, 98101 Seattle 235 km.
  // Usable height is the interior less about 65 mm for posts, a shelf and the lid, as checkWare has it:
  // Alder's 500 mm kiln takes 435 mm (17.1 in), the 1067 mm kilns take 1002 mm (39.4 in).
  await studioWithKiln('Alder Street Clay', '97214', gasKiln(500), [{ cone: '10', atmosphere: 'reduction', dropInDays: 5 }])
  await studioWithKiln('Fernhill Kilns', '97124', gasKiln(1067), [
    { cone: '10', atmosphere: 'reduction', dropInDays: 6 },
    { cone: '10', atmosphere: 'oxidation', dropInDays: 9 },
  ])
  await studioWithKiln('Willamette Falls Pottery', '97045', gasKiln(1067), [{ cone: '10', atmosphere: 'reduction', dropInDays: 7 }])
  await studioWithKiln('Gresham Glaze Works', '97030', electricKiln, [{ cone: '6', atmosphere: 'oxidation', dropInDays: 4 }])
  await studioWithKiln('Puget Sound Fire', '98101', gasKiln(1067), [{ cone: '10', atmosphere: 'reduction', dropInDays: 8 }])
  const anyone = new HttpSession(app.url)
  await waitUntil(async () => (await anyone.get('/api/search?perPage=50')).body.total === 6, { what: 'the index to hold the six firings' })
  browser = await launchBrowser()
})

afterAll(async () => {
  await browser?.close()
  await app?.close()
})

const newPage = () => openPage(browser, app.url, { timezoneId: 'America/Los_Angeles', locale: 'en-US' })

async function signInAsPotter(page: Page) {
  await page.goto('/sign-in')
  await page.getByLabel('E-mail').fill(potter.email)
  await page.getByLabel('Password').fill(PERSON_PASSWORD)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL('**/my-ware')
}

/** What the page shows once the answer for the URL is in (not the last one kept while loading). */
async function shown(page: Page) {
  await page.locator('section[aria-labelledby="results-heading"][aria-busy="false"]').waitFor()
  const results = page.getByTestId('search-result')
  return {
    count: await results.count(),
    studios: await results.evaluateAll((items) => items.map((li) => li.querySelector('h3 a')?.textContent ?? '')),
    cones: await page.getByTestId('result-cone').evaluateAll((els) => els.map((el) => el.getAttribute('data-value'))),
    atmospheres: await page.getByTestId('result-atmosphere').evaluateAll((els) => els.map((el) => el.getAttribute('data-value'))),
    markers: await page.locator('[data-testid="basemap"] .leaflet-marker-icon').count(),
  }
}

const names = (list: string[]) => [...list].sort()

describe('finding a firing', () => {
  it('near a place for cone 10 reduction, narrowed by height, back again, and on to a studio', async () => {
    const { page, errors } = await newPage()
    await signInAsPotter(page)
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Find a firing' }).click()
    await page.waitForURL('**/find')
    await page.getByRole('heading', { name: 'Find a firing' }).waitFor()
    await page.locator('[data-testid="basemap"][data-basemap-ready="true"]').waitFor()

    // The place, picked from the suggestions with the keyboard.
    const place = page.getByRole('combobox', { name: 'Place' })
    await place.fill('Portland, OR')
    await page.getByRole('option', { name: 'Portland, OR', exact: true }).waitFor()
    await place.press('ArrowDown')
    await place.press('Enter')
    await page.waitForURL((url) => url.searchParams.get('place') === 'Portland, OR')

    await page.getByLabel('Cone', { exact: true }).selectOption('10')
    await page.waitForURL((url) => url.searchParams.get('cone') === '10')
    await page.getByLabel('Atmosphere').selectOption('reduction')
    await page.waitForURL((url) => url.searchParams.get('atmosphere') === 'reduction')

    const expected = ['Alder Street Clay', 'Fernhill Kilns', 'Willamette Falls Pottery']
    // Markers are added to the cluster layer in chunks: wait for the map to hold them all.
    await expect.poll(async () => (await shown(page)).markers, { timeout: 60_000 }).toBe(expected.length)
    const near = await shown(page)
    expect(names(near.studios)).toEqual(expected)
    expect(near.cones).toEqual(expected.map(() => '10'))
    expect(near.atmospheres).toEqual(expected.map(() => 'reduction'))
    // One pin per studio, titled with its name; at this zoom none share a cluster.
    const titles = await page
      .locator('[data-testid="basemap"] .leaflet-marker-icon')
      .evaluateAll((els) => els.map((el) => el.getAttribute('title') ?? ''))
    expect(names(titles)).toEqual(expected)
    expect(await page.getByText('Search this area').count()).toBe(0)

    // A result picked in the list lights up its pin, and a pin picked on the map its result.
    const fernhill = page.getByTestId('search-result').filter({ hasText: 'Fernhill Kilns' })
    await fernhill.getByRole('button', { name: 'Show on the map' }).click()
    await expect.poll(() => page.locator('.leaflet-marker-icon[title="Fernhill Kilns"]').textContent()).toContain('Fernhill Kilns')
    expect(await fernhill.getAttribute('data-selected')).toBe('true')
    await page.locator('.leaflet-marker-icon[title="Alder Street Clay"]').click()
    await expect
      .poll(() => page.getByTestId('search-result').filter({ hasText: 'Alder Street Clay' }).getAttribute('data-selected'))
      .toBe('true')
    expect(await fernhill.getAttribute('data-selected')).toBe('false')

    // A 24 in piece (609.6 mm, at 25.4 mm to the inch, NIST SP 811) is too tall for Alder's 17.1 in.
    expect(await page.getByRole('radio', { name: 'in · mi' }).isChecked()).toBe(true)
    await page.getByLabel('Height (in)').fill('24')
    await page.getByLabel('Height (in)').press('Enter')
    await page.waitForURL((url) => url.searchParams.get('fitsHeightMm') === '609.6')
    const fits = ['Fernhill Kilns', 'Willamette Falls Pottery']
    await expect.poll(async () => names((await shown(page)).studios)).toEqual(fits)
    await expect.poll(async () => (await shown(page)).markers, { timeout: 60_000 }).toBe(fits.length)
    const url = new URL(page.url())
    expect(Object.fromEntries(url.searchParams)).toEqual({
      place: 'Portland, OR',
      cone: '10',
      atmosphere: 'reduction',
      fitsHeightMm: '609.6',
    })

    // The back button brings the search before the height back, fields and all.
    await page.goBack()
    await page.waitForURL((u) => !u.searchParams.has('fitsHeightMm') && u.searchParams.get('cone') === '10')
    await expect.poll(async () => names((await shown(page)).studios)).toEqual(expected)
    expect(await page.getByLabel('Height (in)').inputValue()).toBe('')
    await page.goForward()
    await page.waitForURL((u) => u.searchParams.get('fitsHeightMm') === '609.6')
    await expect.poll(async () => names((await shown(page)).studios)).toEqual(fits)
    expect(await page.getByLabel('Height (in)').inputValue()).toBe('24')

    // The same link opened afresh is the same search.
    const { page: shared } = await newPage()
    await shared.goto(page.url())
    await expect.poll(async () => names((await shown(shared)).studios)).toEqual(fits)
    await shared.context().close()

    expect(errors).toEqual([])
    // The studio's own page is its feature's to test; here the link must lead there.
    await page.getByTestId('search-result').filter({ hasText: 'Fernhill Kilns' }).getByTestId('result-studio-link').click()
    await page.waitForURL(`**/studios/${studios['Fernhill Kilns']}`)
  })

  it('offers "Search this area" once the map is moved by hand, and searches around its centre', async () => {
    const { page, errors } = await newPage()
    await page.goto(`/find?${new URLSearchParams({ place: 'Portland, OR', cone: '10' })}`)
    await expect.poll(async () => (await shown(page)).markers, { timeout: 60_000 }).toBeGreaterThan(0)
    expect(await page.getByText('Search this area').count()).toBe(0)

    const map = page.getByTestId('basemap')
    await map.scrollIntoViewIfNeeded()
    const box = (await map.boundingBox())!
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2)
    await page.mouse.down()
    await page.mouse.move(box.x + box.width / 2 - 120, box.y + box.height / 2 + 40, { steps: 8 })
    await page.mouse.up()
    await page.getByRole('button', { name: 'Search this area' }).click()
    await page.waitForURL((url) => url.searchParams.has('near'))
    const params = new URL(page.url()).searchParams
    expect(params.has('place')).toBe(false)
    expect(params.get('cone')).toBe('10')
    const [lat, lng] = params.get('near')!.split(',').map(Number)
    // Still around Portland: the drag moved the view a few kilometres, not off the region.
    expect(lat).toBeGreaterThan(44.5)
    expect(lat).toBeLessThan(46.5)
    expect(lng).toBeGreaterThan(-123.5)
    expect(Number(params.get('radiusKm'))).toBeGreaterThan(1)
    await page.getByTestId('map-area-note').waitFor()
    expect(await page.getByText('Search this area').count()).toBe(0)
    expect(errors).toEqual([])
  })

  it('names an unknown place under the place field, and offers a way out of an empty search', async () => {
    const { page, errors } = await newPage()
    await page.goto(`/find?${new URLSearchParams({ place: 'Nowheresville ZZ' })}`)
    const place = page.getByRole('combobox', { name: 'Place' })
    await expect.poll(() => place.getAttribute('aria-invalid')).toBe('true')
    const describedBy = (await place.getAttribute('aria-describedby'))!.split(' ')
    const message = await page.locator(`[id="${describedBy.find((id) => id.endsWith('-error'))}"]`).textContent()
    expect(message).toContain('Nowheresville ZZ')
    await page.getByTestId('search-error').waitFor()

    // No one fires to cone 14 here; dropping the cone is one click away.
    await page.goto(`/find?${new URLSearchParams({ place: 'Portland, OR', cone: '14' })}`)
    await page.getByText('No firings match — try a wider distance or another cone').waitFor()
    await page.getByRole('link', { name: 'Any cone' }).click()
    await page.waitForURL((url) => !url.searchParams.has('cone'))
    // Within the usual reach of Portland: all but Seattle.
    await expect.poll(async () => (await shown(page)).count).toBe(5)
    expect(errors).toEqual([])
  })

  it('says so when search runs on the backup with the engine down', async () => {
    const { state, port } = app.search!
    await app.search!.close()
    try {
      const { page, errors } = await newPage()
      await page.goto(`/find?${new URLSearchParams({ place: 'Portland, OR', cone: '10', atmosphere: 'reduction' })}`)
      await page.getByText('Search is running on a backup; results may be incomplete.').waitFor()
      // The backup answers the same question the same way.
      await expect
        .poll(async () => names((await shown(page)).studios))
        .toEqual(['Alder Street Clay', 'Fernhill Kilns', 'Willamette Falls Pottery'])
      expect(errors).toEqual([])
    } finally {
      app.search = await startSearchEngine({ port, masterKey: 'test-search-key', state })
    }
  })
})
