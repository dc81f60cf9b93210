// npm run bench:web — what the main pages cost a potter on a phone: JavaScript and total bytes
// transferred (as sent, compressed) and first and largest contentful paint, on an emulated mid-range
// phone (4× CPU slowdown, 1.6 Mbit/s down, 150 ms latency, through the DevTools protocol), each beside
// the same figures for a bare static HTML page served by the same server in the same run (the floor).
//
// Starts what `npm start` starts, on free ports and over a throwaway PostgreSQL cluster with the demo
// data: the local stand-ins and the server, serving the built client (built first when its sources
// changed). Each page is opened RUNS times in a fresh browser context (an empty cache), and the
// median is printed; then once more in the same context, as a repeat visit.
import { spawn, type ChildProcess } from 'node:child_process'
import { cpSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import readline from 'node:readline'
import pg from 'pg'
import { chromium, type Browser, type BrowserContext, type CDPSession, type Page } from 'playwright-core'
import { buildClient } from '../scripts/lib/client-build.mjs'
import { throwawayCluster } from '../scripts/lib/postgres.mjs'
import { freePort } from '../scripts/lib/system.mjs'
import { repoRoot } from '../server/config'

const RUNS = Number(process.env.BENCH_RUNS ?? 3)
/** The phone: Chrome DevTools' throttling figures as the issue gives them. */
const PHONE = { cpuSlowdown: 4, downBytesPerSecond: 1_600_000 / 8, upBytesPerSecond: 750_000 / 8, latencyMs: 150 }
/** A mid-range Android phone's screen (412 × 823 CSS pixels at 1.75: Lighthouse's mobile default, from memory). */
const SCREEN = { width: 412, height: 823, deviceScaleFactor: 1.75 }
const TARGETS: Record<string, { jsKb: number; lcpMs: number }> = {
  landing: { jsKb: 150, lcpMs: 2500 },
  search: { jsKb: 250, lcpMs: 4000 },
}
/** A page has settled when nothing new has been asked for this long after it showed what it is for. */
const QUIET_MS = 1500
const DEMO_POTTER = { email: 'wren.alvarado@demo.conewright.test', password: 'glaze-and-fire-demo' }

const FLOOR_HTML = `<!doctype html>
<html lang="en">
  <head>
    <meta charset="UTF-8" />
    <meta name="viewport" content="width=device-width, initial-scale=1.0" />
    <title>Floor</title>
  </head>
  <body>
    <h1>The floor</h1>
    <p>A bare static page from the same server: what any page costs before it does anything.</p>
  </body>
</html>
`

interface PageSpec {
  name: string
  path: string
  /** What shows that the page is there for its reader. */
  ready: string[]
  signedIn?: boolean
}

interface Figures {
  jsBytes: number
  totalBytes: number
  /** Bytes asked for once the page began prefetching the next pages' code, while idle. */
  laterBytes: number
  requests: number
  fcpMs: number
  lcpMs: number
}

const children: ChildProcess[] = []
process.on('exit', () => children.forEach((c) => c.kill('SIGTERM')))

async function stopAll() {
  await Promise.all(
    children.map((c) =>
      c.exitCode !== null || c.signalCode !== null
        ? Promise.resolve()
        : new Promise((resolve) => {
            c.once('exit', resolve)
            c.kill('SIGTERM')
          }),
    ),
  )
}

/** Starts a child under tsx; resolves with the rest of the first line of its output containing `readyText`. */
function start(script: string, env: Record<string, string>, readyText: string): Promise<string> {
  const child = spawn(process.execPath, ['--import', 'tsx', script], {
    cwd: repoRoot,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'inherit'],
  })
  children.push(child)
  return new Promise((resolve, reject) => {
    readline.createInterface({ input: child.stdout! }).on('line', (line) => {
      const at = line.indexOf(readyText)
      if (at >= 0) resolve(line.slice(at + readyText.length))
    })
    child.once('exit', (code) => reject(new Error(`${script} exited with ${code}`)))
  })
}

async function waitFor(check: () => Promise<boolean>, what: string, timeoutMs = 300_000) {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    if (await check().catch(() => false)) return
    await new Promise((r) => setTimeout(r, 500))
  }
  throw new Error(`timed out waiting for ${what}`)
}

/** Bytes on the wire per request (headers and compressed body, as DevTools counts "transferred"). */
function watchNetwork(cdp: CDPSession) {
  const requests = new Map<string, { url: string; type: string; startedAt: number; bytes: number; done: boolean }>()
  cdp.on('Network.requestWillBeSent', (e) => {
    if (!requests.has(e.requestId))
      requests.set(e.requestId, { url: e.request.url, type: e.type ?? 'Other', startedAt: e.wallTime * 1000, bytes: 0, done: false })
  })
  cdp.on('Network.loadingFinished', (e) => {
    const r = requests.get(e.requestId)
    if (r) Object.assign(r, { bytes: e.encodedDataLength, done: true })
  })
  cdp.on('Network.loadingFailed', (e) => {
    const r = requests.get(e.requestId)
    if (r) r.done = true
  })
  return {
    requests,
    /** Resolves once no request has been in flight or started for QUIET_MS. */
    async quiet() {
      let quietSince = Date.now()
      let seen = requests.size
      const giveUpAt = Date.now() + 60_000
      while (Date.now() - quietSince < QUIET_MS) {
        if (Date.now() > giveUpAt) {
          const open = [...requests.values()].filter((r) => !r.done).map((r) => r.url)
          throw new Error(`the page never went quiet; still loading: ${open.join(', ') || 'nothing (new requests kept starting)'}`)
        }
        await new Promise((r) => setTimeout(r, 100))
        if (requests.size !== seen || [...requests.values()].some((r) => !r.done)) {
          seen = requests.size
          quietSince = Date.now()
        }
      }
    },
  }
}

async function emulatePhone(page: Page): Promise<CDPSession> {
  const cdp = await page.context().newCDPSession(page)
  await cdp.send('Network.enable')
  await cdp.send('Network.emulateNetworkConditions', {
    offline: false,
    latency: PHONE.latencyMs,
    downloadThroughput: PHONE.downBytesPerSecond,
    uploadThroughput: PHONE.upBytesPerSecond,
  })
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: PHONE.cpuSlowdown })
  return cdp
}

const PAINT_WATCH = () => {
  const w = window as unknown as { __lcp: number; __lcpElement: string }
  w.__lcp = NaN
  new PerformanceObserver((list) => {
    for (const entry of list.getEntries() as (PerformanceEntry & { element?: Element })[]) {
      w.__lcp = entry.startTime
      w.__lcpElement = `${entry.element?.tagName ?? '?'} "${(entry.element?.textContent ?? '').slice(0, 40)}"`
    }
  }).observe({ type: 'largest-contentful-paint', buffered: true })
}

/** Opens the page in `page`, waits until it is ready and the network is quiet, and reads its figures. */
async function measure(page: Page, cdp: CDPSession, base: string, spec: PageSpec): Promise<Figures> {
  const network = watchNetwork(cdp)
  const errors: string[] = []
  page.on('pageerror', (error) => errors.push(error.message))
  page.on('console', (message) => {
    if (message.type() === 'error') errors.push(message.text())
  })
  await page.goto(base + spec.path, { waitUntil: 'commit', timeout: 120_000 })
  try {
    for (const selector of spec.ready) await page.locator(selector).first().waitFor({ state: 'visible', timeout: 60_000 })
    // A prerendered page shows its heading before its scripts are in: wait for them too.
    await page.waitForFunction(() => document.readyState === 'complete', undefined, { timeout: 60_000 })
  } catch (error) {
    throw new Error(`${spec.path} never showed ${spec.ready.join(' and ')}; page errors: ${errors.join(' | ') || 'none'}`, { cause: error })
  }
  const readyAt = Date.now()
  await network.quiet()
  const paints = await page.evaluate(() => ({
    // When the page began prefetching the next pages' code (src/app/prefetch.ts), on the wall clock.
    prefetchAt: performance.timeOrigin + (performance.getEntriesByName('conewright:prefetch')[0]?.startTime ?? Infinity),
    fcp: performance.getEntriesByName('first-contentful-paint')[0]?.startTime ?? NaN,
    lcp: (window as unknown as { __lcp: number }).__lcp,
    lcpElement: (window as unknown as { __lcpElement: string }).__lcpElement,
  }))
  let jsBytes = 0
  let totalBytes = 0
  let laterBytes = 0
  if (process.env.BENCH_VERBOSE) {
    const first = Math.min(...[...network.requests.values()].map((r) => r.startedAt))
    console.log(`  ${spec.path}: ready at +${readyAt - first} ms, FCP ${ms(paints.fcp)}, LCP ${ms(paints.lcp)} (${paints.lcpElement})`)
    for (const r of network.requests.values())
      console.log(
        `    +${String(r.startedAt - first).padStart(5)} ms ${r.type.padEnd(10)} ${kb(r.bytes).padStart(7)} kB ${r.url.replace(base, '')}`,
      )
  }
  for (const r of network.requests.values()) {
    if (r.startedAt >= paints.prefetchAt) {
      laterBytes += r.bytes
      continue
    }
    totalBytes += r.bytes
    if (r.type === 'Script') jsBytes += r.bytes
  }
  return { jsBytes, totalBytes, laterBytes, requests: network.requests.size, fcpMs: paints.fcp, lcpMs: paints.lcp }
}

async function newPhoneContext(browser: Browser, base: string, spec: PageSpec): Promise<BrowserContext> {
  const context = await browser.newContext({
    baseURL: base,
    viewport: SCREEN,
    deviceScaleFactor: SCREEN.deviceScaleFactor,
    isMobile: true,
    hasTouch: true,
  })
  await context.addInitScript(PAINT_WATCH)
  if (spec.signedIn) {
    const csrf = (await (await context.request.get('/api/auth/csrf')).json()) as { token: string }
    const signIn = await context.request.post('/api/auth/login', { data: DEMO_POTTER, headers: { 'X-CSRF-Token': csrf.token } })
    if (!signIn.ok()) throw new Error(`could not sign in the demo potter: ${signIn.status()}`)
  }
  return context
}

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b)
  return sorted[Math.floor(sorted.length / 2)]
}

function medianFigures(runs: Figures[]): Figures {
  const keys = Object.keys(runs[0]) as (keyof Figures)[]
  return Object.fromEntries(keys.map((k) => [k, median(runs.map((r) => r[k]))])) as unknown as Figures
}

const kb = (bytes: number) => (bytes / 1000).toFixed(1)
const ms = (value: number) => (Number.isNaN(value) ? '—' : value.toFixed(0))

async function main() {
  buildClient()
  // The served copy of the client, with the floor page beside it; the checkout's dist stays as built.
  const clientDir = mkdtempSync(path.join(os.tmpdir(), 'conewright-bench-client-'))
  cpSync(path.join(repoRoot, 'dist/client'), clientDir, { recursive: true })
  writeFileSync(path.join(clientDir, 'floor.html'), FLOOR_HTML)

  const throwaway = throwawayCluster(await freePort())
  let browser: Browser | null = null
  try {
    throwaway.cluster.start()
    const admin = new pg.Client({ connectionString: throwaway.cluster.url('postgres') })
    await admin.connect()
    await admin.query('CREATE DATABASE conewright')
    await admin.end()

    const port = await freePort()
    const base = `http://127.0.0.1:${port}`
    const standIns = JSON.parse(
      await start(
        'standins/main.ts',
        {
          MAIL_SMTP_PORT: String(await freePort()),
          MAIL_WEB_PORT: String(await freePort()),
          SEARCH_PORT: String(await freePort()),
          STRIPE_PORT: String(await freePort()),
          APP_WEBHOOK_URL: `${base}/api/webhooks/stripe`,
        },
        'STANDINS ',
      ),
    ) as Record<string, string>
    console.log('starting the server over a throwaway database with the demo data…')
    await start(
      'server/main.ts',
      {
        ...standIns,
        DATABASE_URL: throwaway.cluster.url('conewright'),
        PORT: String(port),
        SEED_DEMO: 'true',
        NODE_ENV: 'production',
        CLIENT_DIR: clientDir,
      },
      'listening on ',
    )
    const searchPath = '/api/search?place=Portland,%20OR&perPage=20'
    await waitFor(async () => {
      const res = (await (await fetch(base + searchPath)).json()) as { degraded: boolean; total: number }
      return !res.degraded && res.total > 0
    }, 'the search index')
    const found = (await (await fetch(base + searchPath)).json()) as { hits: { studio: { id: string } }[] }
    const studioId = found.hits[0].studio.id

    browser = await chromium.launch({
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
    const potter = await newPhoneContext(browser, base, { name: '', path: '', ready: [], signedIn: true })
    const requests = (await (await potter.request.get('/api/requests')).json()) as { requests?: { id: string }[] } | { id: string }[]
    const requestId = (Array.isArray(requests) ? requests : (requests.requests ?? []))[0]?.id
    await potter.close()
    if (!requestId) throw new Error('the demo potter has no requests')

    const pages: PageSpec[] = [
      { name: 'floor', path: '/floor.html', ready: ['h1'] },
      { name: 'landing', path: '/', ready: ['h1'] },
      {
        name: 'search',
        path: '/find?place=Portland%2C%20OR&view=map',
        ready: ['[data-testid="result-total"]', '[data-basemap-ready="true"]'],
      },
      { name: 'studio', path: `/studios/${studioId}`, ready: ['h1', '[data-basemap-ready="true"]'] },
      { name: 'request', path: `/requests/${requestId}`, ready: ['h1'], signedIn: true },
    ]

    console.log(
      `\n${RUNS} cold runs per page (median), then one repeat visit. Phone: ${PHONE.cpuSlowdown}× CPU slowdown, ` +
        `${(PHONE.downBytesPerSecond * 8) / 1e6} Mbit/s down, ${PHONE.latencyMs} ms latency, ${SCREEN.width}×${SCREEN.height} screen.\n`,
    )
    const header = `${'page'.padEnd(9)} ${'path'.padEnd(34)} ${'JS kB'.padStart(7)} ${'total kB'.padStart(9)} ${'reqs'.padStart(5)} ${'FCP ms'.padStart(7)} ${'LCP ms'.padStart(7)} ${'prefetched kB'.padStart(14)}   ${'repeat: kB'.padStart(10)} ${'LCP ms'.padStart(7)}`
    console.log(header)
    const results: Record<string, Figures> = {}
    for (const spec of pages) {
      const runs: Figures[] = []
      let repeat: Figures | null = null
      for (let i = 0; i < RUNS; i++) {
        const context = await newPhoneContext(browser, base, spec)
        const page = await context.newPage()
        // The browser's process for the site is started first: the figures are the page's, not
        // the cost of Chromium starting a renderer, which a phone's browser has running already.
        await page.goto(base + '/api/health')
        const cdp = await emulatePhone(page)
        runs.push(await measure(page, cdp, base, spec))
        if (i === RUNS - 1) repeat = await measure(page, cdp, base, spec)
        await context.close()
      }
      const f = (results[spec.name] = medianFigures(runs))
      console.log(
        `${spec.name.padEnd(9)} ${(spec.path.length > 34 ? spec.path.slice(0, 31) + '…' : spec.path).padEnd(34)} ${kb(f.jsBytes).padStart(7)} ${kb(f.totalBytes).padStart(9)} ${String(f.requests).padStart(5)} ${ms(f.fcpMs).padStart(7)} ${ms(f.lcpMs).padStart(7)} ${kb(f.laterBytes).padStart(14)}   ${kb(repeat!.totalBytes).padStart(10)} ${ms(repeat!.lcpMs).padStart(7)}`,
      )
    }

    const floor = results.floor
    console.log(
      `\nbeside the floor (a bare static page: ${kb(floor.totalBytes)} kB, FCP ${ms(floor.fcpMs)} ms, LCP ${ms(floor.lcpMs)} ms):`,
    )
    for (const spec of pages.slice(1)) {
      const f = results[spec.name]
      console.log(
        `  ${spec.name.padEnd(9)} +${kb(f.totalBytes - floor.totalBytes)} kB, FCP +${ms(f.fcpMs - floor.fcpMs)} ms, LCP +${ms(f.lcpMs - floor.lcpMs)} ms`,
      )
    }

    console.log('\ntargets (compressed JavaScript, largest contentful paint on the phone):')
    let missed = 0
    for (const [name, target] of Object.entries(TARGETS)) {
      const f = results[name]
      const jsOk = f.jsBytes / 1000 <= target.jsKb
      const lcpOk = f.lcpMs <= target.lcpMs
      if (!jsOk || !lcpOk) missed++
      console.log(
        `  ${name.padEnd(9)} JS ${kb(f.jsBytes)} kB ≤ ${target.jsKb} kB: ${jsOk ? 'meets' : 'MISSES'}; LCP ${ms(f.lcpMs)} ms ≤ ${target.lcpMs} ms: ${lcpOk ? 'meets' : 'MISSES'}`,
      )
    }
    if (missed) process.exitCode = 1
  } finally {
    await browser?.close()
    await stopAll()
    throwaway.remove()
    rmSync(clientDir, { recursive: true, force: true })
  }
}

main().catch((error) => {
  console.error(error)
  process.exitCode = 1
})
