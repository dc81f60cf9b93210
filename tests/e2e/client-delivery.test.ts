// How the built client reaches a browser: the build's brotli and gzip copies sent with the right
// Content-Encoding and Vary, hashed files cached for a year as immutable, the HTML revalidated, no
// source map anywhere a browser can fetch it, the landing and search pages drawn into their HTML,
// and the search page fetching only the basemap cells around the place searched. Header semantics
// per RFC 9110 (content coding, Vary) and RFC 9111 with RFC 8246 (immutable).
import type { Browser } from 'playwright-core'
import { readdirSync, readFileSync } from 'node:fs'
import { request } from 'node:http'
import path from 'node:path'
import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { repoRoot } from '../../server/config'
import { HttpSession } from '../support/http-client'
import { launchBrowser, openPage } from '../support/browser'
import { createPerson } from '../support/people'
import { publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'
import { waitUntil } from '../support/wait'

const clientDir = path.join(repoRoot, 'dist/client')
const YEAR_IMMUTABLE = /^public, max-age=31536000, immutable$/

let app: TestApp
let browser: Browser

beforeAll(async () => {
  app = await startTestApp({ serveClient: true, search: true })
  const host = await createPerson(app, 'host', 'Odile Brannigan')
  // A studio at 97214 (Portland, Oregon), so a search there has an answer and the map goes to it.
  await publishedStudio(host.session, 'Brannigan Kiln Shed')
  const anyone = new HttpSession(app.url)
  await waitUntil(async () => (await anyone.get('/api/search?perPage=5')).body.total >= 1, { what: 'the index to hold the firing' })
  browser = await launchBrowser()
})

afterAll(async () => {
  await browser?.close()
  await app?.close()
})

/** A GET with exactly these headers; the body as sent, not decoded. */
function rawGet(urlPath: string, headers: Record<string, string> = {}) {
  return new Promise<{ status: number; headers: Record<string, string | string[] | undefined>; body: Buffer }>((resolve, reject) => {
    const req = request(app.url + urlPath, { headers }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) }))
    })
    req.on('error', reject)
    req.end()
  })
}

function filesUnder(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? filesUnder(path.join(dir, e.name)) : [path.join(dir, e.name)],
  )
}

const shellHtml = () => readFileSync(path.join(clientDir, 'index.html'), 'utf8')
const mainScript = () => /<script type="module" crossorigin src="(\/assets\/[^"]+\.js)"/.exec(shellHtml())![1]
const mainStylesheet = () => /<link rel="stylesheet" crossorigin href="(\/assets\/[^"]+\.css)"/.exec(shellHtml())![1]

describe('hashed files', () => {
  it('go as brotli to a browser that takes it, as gzip to one that takes only that, plain otherwise: the same bytes', async () => {
    for (const file of [mainScript(), mainStylesheet()]) {
      const onDisk = readFileSync(path.join(clientDir, file))
      const br = await rawGet(file, { 'Accept-Encoding': 'gzip, deflate, br' })
      expect(br.status).toBe(200)
      expect(br.headers['content-encoding']).toBe('br')
      expect(br.headers['content-type']).toMatch(file.endsWith('.js') ? /^text\/javascript/ : /^text\/css/)
      expect(br.headers.vary).toMatch(/Accept-Encoding/)
      expect(br.headers['cache-control']).toMatch(YEAR_IMMUTABLE)
      expect(br.body.length).toBeLessThan(onDisk.length / 2)
      expect(brotliDecompressSync(br.body).equals(onDisk)).toBe(true)

      const gz = await rawGet(file, { 'Accept-Encoding': 'gzip' })
      expect(gz.headers['content-encoding']).toBe('gzip')
      expect(gunzipSync(gz.body).equals(onDisk)).toBe(true)

      const plain = await rawGet(file, { 'Accept-Encoding': 'identity' })
      expect(plain.headers['content-encoding']).toBeUndefined()
      expect(plain.headers.vary).toMatch(/Accept-Encoding/)
      expect(plain.body.equals(onDisk)).toBe(true)
    }
  })

  it('answer a repeat with 304 by ETag', async () => {
    const first = await rawGet(mainScript(), { 'Accept-Encoding': 'br' })
    const again = await rawGet(mainScript(), { 'Accept-Encoding': 'br', 'If-None-Match': String(first.headers.etag) })
    expect(again.status).toBe(304)
  })

  it('include fonts, cached the same way (woff2 is compressed already, so it goes as it is)', async () => {
    const font = /href="(\/assets\/dm-sans-latin-400-normal-[\w-]+\.woff2)"/.exec(shellHtml())![1]
    const reply = await rawGet(font, { 'Accept-Encoding': 'gzip, br' })
    expect(reply.status).toBe(200)
    expect(reply.headers['content-type']).toBe('font/woff2')
    expect(reply.headers['content-encoding']).toBeUndefined()
    expect(reply.headers['cache-control']).toMatch(YEAR_IMMUTABLE)
  })

  it('that do not exist get a plain 404, not the page', async () => {
    const reply = await rawGet('/assets/index-doesnotexist.js')
    expect(reply.status).toBe(404)
    expect(reply.headers['content-type']).not.toMatch(/html/)
  })
})

describe('the HTML', () => {
  it('is asked for again on every visit, and compressed', async () => {
    const reply = await rawGet('/requests/anything', { 'Accept-Encoding': 'br', Cookie: 'cw.sid=someone' })
    expect(reply.status).toBe(200)
    expect(reply.headers['cache-control']).toBe('no-cache')
    expect(reply.headers['content-type']).toMatch(/^text\/html/)
    expect(brotliDecompressSync(reply.body).toString('utf8')).toBe(shellHtml())
  })

  it('of the landing page comes drawn for visitors, and plain for someone with a session (who is sent on)', async () => {
    const visitor = await rawGet('/', { 'Accept-Encoding': 'identity' })
    expect(visitor.headers.vary).toMatch(/Cookie/)
    const drawn = visitor.body.toString('utf8')
    expect(drawn).toContain('data-prerendered="/"')
    expect(drawn).toContain('The right kiln for your ware, nearby.')
    // The stylesheet is inlined: the first paint waits for nothing else.
    expect(drawn).toMatch(/<style>[^<]*--color-clay-600/)

    const member = await rawGet('/', { 'Accept-Encoding': 'identity', Cookie: 'cw.sid=s%3Asomething' })
    expect(member.body.toString('utf8')).toBe(shellHtml())
  })

  it('of the search page carries its heading', async () => {
    const reply = await rawGet('/find?place=Portland%2C%20OR', { 'Accept-Encoding': 'identity' })
    expect(reply.body.toString('utf8')).toMatch(/<h1[^>]*>Find a firing<\/h1>/)
  })
})

describe('source maps', () => {
  it('are kept out of the public folder and no script points to one', () => {
    const files = filesUnder(clientDir)
    expect(files.filter((f) => f.endsWith('.map'))).toEqual([])
    for (const file of files.filter((f) => f.endsWith('.js'))) expect(readFileSync(file, 'utf8')).not.toMatch(/sourceMappingURL/)
  })

  it('are not served, whatever the path', async () => {
    for (const urlPath of [`${mainScript()}.map`, '/assets/index.js.map', '/../sourcemaps/assets/x.js.map', '/%2e%2e/sourcemaps/x.map']) {
      const reply = await rawGet(urlPath)
      expect(reply.status, urlPath).toBe(404)
      expect(reply.headers['content-type'], urlPath).not.toMatch(/html|json|javascript/)
    }
  })
})

describe('in Chromium', () => {
  it('the landing page arrives compressed, takes over the drawn page without errors, and asks for no map', async () => {
    const { page, errors, context } = await openPage(browser, app.url)
    const encodings = new Map<string, string | undefined>()
    page.on('response', (response) => encodings.set(new URL(response.url()).pathname, response.headers()['content-encoding']))
    const hydrationProblems: string[] = []
    page.on('console', (message) => {
      if (/hydrat/i.test(message.text())) hydrationProblems.push(message.text())
    })
    await page.goto('/')
    await page.getByRole('heading', { name: 'The right kiln for your ware, nearby.' }).waitFor()
    await page.getByRole('link', { name: 'Sign in' }).waitFor()
    await expect.poll(() => encodings.has(mainScript())).toBe(true)
    expect(encodings.get(mainScript())).toMatch(/^(br|gzip)$/)
    expect([...encodings.keys()].filter((p) => p.endsWith('.map') || p.includes('basemap') || /markers|leaflet/i.test(p))).toEqual([])
    // Hydration found the drawn page as the scripts would draw it.
    expect(hydrationProblems).toEqual([])
    expect(errors).toEqual([])
    await context.close()
  })

  it('the search page’s map view fetches only the basemap cells around the place searched, compressed', async () => {
    const { page, errors, context } = await openPage(browser, app.url, { viewport: { width: 412, height: 823 } })
    const cells: { path: string; encoding?: string; cache?: string }[] = []
    page.on('response', (response) => {
      const url = new URL(response.url())
      if (url.pathname.includes('/basemap-'))
        cells.push({ path: url.pathname, encoding: response.headers()['content-encoding'], cache: response.headers()['cache-control'] })
    })
    await page.goto('/find?place=Portland%2C%20OR&view=map')
    await page.getByTestId('result-total').waitFor()
    await page.locator('[data-testid="basemap"][data-basemap-ready="true"]').waitFor()
    // Portland lies in the 4° cell from 124° W to 120° W, 42° N to 46° N: column 14, row 33 (see the
    // basemap unit tests); the map of the answer shows the town, not the world.
    expect(cells.map((c) => c.path.split('/').slice(-2).join('/'))).toEqual(['local/14_33.json'])
    expect(cells[0].encoding).toMatch(/^(br|gzip)$/)
    expect(cells[0].cache).toMatch(YEAR_IMMUTABLE)
    expect(errors).toEqual([])
    await context.close()
  })
})
