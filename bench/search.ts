// npm run bench:search — latency and throughput of a typical filtered geo search, through the
// engine and through the PostgreSQL fallback, each beside /api/health measured in the same run.
// Needs the bench data: npm run seed:bench -- --studios 5000 --firings 20000
//
// Runs the search stand-in and the server as child processes (as in production, the engine is not in
// the server's process) over the local cluster, and load from autocannon in this process.
import autocannon from 'autocannon'
import { spawn, type ChildProcess } from 'node:child_process'
import readline from 'node:readline'
import { persistentCluster } from '../scripts/lib/postgres.mjs'
import { freePort } from '../scripts/lib/system.mjs'
import { repoRoot } from '../server/config'

const DURATION_S = Number(process.env.BENCH_SECONDS ?? 10)
const QUERY = '/api/search?place=Portland,%20OR&radiusKm=80&cone=6&atmosphere=oxidation&fitsHeightMm=250&sort=distance&perPage=20'
const TARGETS = { p95At8Ms: 50, rpsAt32: 400 }

const children: ChildProcess[] = []
/** Stops every child and waits for them, so the database is not stopped under a running server. */
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
process.on('exit', () => children.forEach((c) => c.kill('SIGTERM')))

/** Starts a child; resolves with the rest of the first line starting with `readyLine`. */
function start(args: string[], env: Record<string, string>, readyLine: string, nodeFlags: string[] = []): Promise<string> {
  const child = spawn(process.execPath, [...nodeFlags, '--import', 'tsx', ...args], {
    cwd: repoRoot,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'inherit'],
  })
  children.push(child)
  return new Promise((resolve, reject) => {
    const lines = readline.createInterface({ input: child.stdout! })
    lines.on('line', (line) => {
      const at = line.indexOf(readyLine)
      if (at >= 0) resolve(line.slice(at + readyLine.length))
    })
    child.once('exit', (code) => reject(new Error(`${args.join(' ')} exited with ${code}`)))
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

interface Figures {
  p50: number
  p95: number
  p99: number
  rps: number
  errors: number
}

async function load(url: string, connections: number, seconds = DURATION_S): Promise<Figures> {
  const latencies: number[] = []
  let errors = 0
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({ url, connections, duration: seconds, pipelining: 1 }, (error, done) =>
      error ? reject(error) : resolve(done),
    )
    instance.on('response', (_client, statusCode, _bytes, responseTime) => {
      latencies.push(responseTime)
      if (statusCode !== 200) errors++
    })
  })
  latencies.sort((a, b) => a - b)
  const at = (q: number) => latencies[Math.min(latencies.length - 1, Math.floor(q * latencies.length))] ?? NaN
  return { p50: at(0.5), p95: at(0.95), p99: at(0.99), rps: result.requests.average, errors: errors + result.errors + result.timeouts }
}

const row = (label: string, f: Figures) =>
  `${label.padEnd(34)} ${f.p50.toFixed(1).padStart(7)} ${f.p95.toFixed(1).padStart(7)} ${f.p99.toFixed(1).padStart(7)} ${f.rps.toFixed(0).padStart(8)} ${String(f.errors).padStart(7)}`

async function main() {
  const { cluster, password } = persistentCluster(Number(process.env.PG_PORT ?? 54610))
  const wasRunning = cluster.isRunning()
  if (!wasRunning) cluster.start()
  const databaseUrl = process.env.DATABASE_URL ?? cluster.url('conewright', password)
  try {
    const { default: pg } = await import('pg')
    const client = new pg.Client({ connectionString: databaseUrl })
    await client.connect()
    const [{ count }] = (await client.query(`SELECT count(*)::int AS count FROM studios WHERE name LIKE 'Bench studio %'`)).rows
    if (!count) {
      console.error('No bench data. Run: npm run seed:bench -- --studios 5000 --firings 20000')
      process.exitCode = 1
      await client.end()
      return
    }
    // The server rebuilds the index on start; search jobs left over from earlier runs would only race it.
    await client.query(
      `DELETE FROM graphile_worker._private_jobs WHERE task_id IN (SELECT id FROM graphile_worker._private_tasks WHERE identifier LIKE 'search-%')`,
    )
    await client.end()

    const searchKey = 'bench-search-key'
    const searchPort = await freePort()
    const standIns = JSON.parse(
      await start(
        ['standins/main.ts'],
        { SMTP_URL: 'smtp://127.0.0.1:9', SEARCH_PORT: String(searchPort), MEILI_API_KEY: searchKey },
        'STANDINS ',
      ),
    )
    const port = await freePort()
    const base = `http://127.0.0.1:${port}`
    console.log('starting the server; it rebuilds the search index from PostgreSQL first…')
    const rebuilt = start(
      ['server/main.ts'],
      {
        DATABASE_URL: databaseUrl,
        PORT: String(port),
        MEILI_HOST: standIns.MEILI_HOST,
        MEILI_API_KEY: searchKey,
        SMTP_URL: 'smtp://127.0.0.1:9',
        SEED_DEMO: 'false',
        SERVE_CLIENT: 'false',
        RATE_LIMIT_OPEN_API_PER_IP: '100000000',
        NODE_ENV: 'production',
      },
      'search index rebuilt: ',
      process.env.BENCH_PROFILE ? ['--cpu-prof', '--cpu-prof-dir=var/profiles'] : [],
    )
    const documents = await rebuilt
    await waitFor(async () => (await fetch(`${base}/api/health`)).ok, 'the server')
    const sample = (await (await fetch(`${base}${QUERY}`)).json()) as { total: number; degraded: boolean }
    if (sample.degraded) throw new Error('the engine did not answer after the rebuild')
    console.log(`index holds ${documents}; the bench query matches ${sample.total}. ${DURATION_S} s per run.\n`)

    // A short untimed run first, so the measured runs see warmed-up JIT code and caches on both sides.
    await load(`${base}${QUERY}`, 8, 3)
    await load(`${base}/api/health`, 8, 2)

    const header = `${'run'.padEnd(34)} ${'p50 ms'.padStart(7)} ${'p95 ms'.padStart(7)} ${'p99 ms'.padStart(7)} ${'req/s'.padStart(8)} ${'errors'.padStart(7)}`
    console.log(header)
    const results: Record<string, Figures> = {}
    for (const connections of [8, 32]) {
      results[`health-${connections}`] = await load(`${base}/api/health`, connections)
      console.log(row(`/api/health, ${connections} connections`, results[`health-${connections}`]))
      results[`engine-${connections}`] = await load(`${base}${QUERY}`, connections)
      console.log(row(`search via engine, ${connections} conn.`, results[`engine-${connections}`]))
    }

    // Take the engine away: every search now answers from PostgreSQL.
    children[0].kill('SIGTERM')
    await new Promise((resolve) => children[0].once('exit', resolve))
    await waitFor(async () => ((await (await fetch(`${base}${QUERY}`)).json()) as { degraded: boolean }).degraded, 'the fallback')
    await load(`${base}${QUERY}`, 8, 3)
    for (const connections of [8, 32]) {
      results[`pg-health-${connections}`] = await load(`${base}/api/health`, connections)
      console.log(row(`/api/health, ${connections} connections`, results[`pg-health-${connections}`]))
      results[`pg-${connections}`] = await load(`${base}${QUERY}`, connections)
      console.log(row(`search via PostgreSQL, ${connections} conn.`, results[`pg-${connections}`]))
    }

    console.log(`\ntargets: p95 ≤ ${TARGETS.p95At8Ms} ms at 8 connections, ≥ ${TARGETS.rpsAt32} req/s at 32 connections, on either path`)
    for (const path of ['engine', 'pg']) {
      const p95 = results[`${path}-8`].p95
      const rps = results[`${path}-32`].rps
      const name = path === 'engine' ? 'engine' : 'PostgreSQL fallback'
      console.log(
        `  ${name.padEnd(20)} p95 at 8: ${p95.toFixed(1)} ms (${p95 <= TARGETS.p95At8Ms ? 'meets' : 'misses'}), req/s at 32: ${rps.toFixed(0)} (${rps >= TARGETS.rpsAt32 ? 'meets' : 'misses'})`,
      )
    }
  } finally {
    await stopAll()
    if (!wasRunning) cluster.stop()
  }
}

main().catch((error) => {
  console.error(error)
  process.exitCode = 1
})
