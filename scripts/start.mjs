#!/usr/bin/env node
// `npm start` (and `npm run dev` with --dev): everything on loopback with demo data, from a fresh
// machine. Installs what is missing, starts a private PostgreSQL cluster and the local stand-ins,
// builds the client, runs the server; Ctrl-C stops it all and keeps the data.
import { spawn } from 'node:child_process'
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import path from 'node:path'
import readline from 'node:readline'
import { buildClient } from './lib/client-build.mjs'
import { ensurePostgresInstalled, persistentCluster } from './lib/postgres.mjs'
import { ensureNodeModules, log, portInUse, repoRoot, SetupError } from './lib/system.mjs'

const dev = process.argv.includes('--dev')
const env = process.env
const port = Number(env.PORT ?? 4610)
const pgPort = Number(env.PG_PORT ?? 54610)
const lockFile = path.join(repoRoot, 'var', 'conewright.lock')

const children = new Set()
let cluster = null
let stopping = false

function processAlive(pid) {
  try {
    process.kill(pid, 0)
    return true
  } catch {
    return false
  }
}

function takeLock() {
  mkdirSync(path.dirname(lockFile), { recursive: true })
  if (existsSync(lockFile)) {
    const held = JSON.parse(readFileSync(lockFile, 'utf8'))
    if (held.pid !== process.pid && processAlive(held.pid)) {
      throw new SetupError(
        `Conewright is already running from this checkout (pid ${held.pid}) at ${held.url}.\n` +
          'Stop it with Ctrl-C in its terminal (or `kill ' +
          held.pid +
          '`) before starting another.',
      )
    }
  }
  writeFileSync(lockFile, JSON.stringify({ pid: process.pid, url: `http://127.0.0.1:${port}` }) + '\n')
}

async function ensureDatabase(adminUrl, name) {
  const { default: pg } = await import('pg')
  const client = new pg.Client({ connectionString: adminUrl })
  await client.connect()
  try {
    const found = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [name])
    if (!found.rowCount) {
      log(`creating database ${name}`)
      await client.query(`CREATE DATABASE "${name}"`)
    }
  } finally {
    await client.end()
  }
}

function startChild(name, command, args, extraEnv = {}, { captureStandIns = false } = {}) {
  const child = spawn(command, args, {
    cwd: repoRoot,
    env: { ...env, ...extraEnv },
    stdio: ['ignore', captureStandIns ? 'pipe' : 'inherit', 'inherit'],
  })
  children.add(child)
  child.on('exit', (code, signal) => {
    children.delete(child)
    if (!stopping) {
      log(`${name} stopped unexpectedly (${signal ?? `exit ${code}`}); shutting down`)
      void shutdown(1)
    }
  })
  if (!captureStandIns) return { child }
  const standIns = new Promise((resolve, reject) => {
    const lines = readline.createInterface({ input: child.stdout })
    lines.on('line', (line) => {
      if (line.startsWith('STANDINS ')) resolve(JSON.parse(line.slice('STANDINS '.length)))
      else process.stdout.write(line + '\n')
    })
    child.once('exit', () => reject(new SetupError(`${name} exited before it was ready`)))
  })
  return { child, standIns }
}

async function waitForHealth(url, timeoutMs = 120_000) {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    try {
      const res = await fetch(`${url}/api/health`)
      if (res.ok) return
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 300))
  }
  throw new SetupError(`the server did not answer on ${url}/api/health`)
}

async function shutdown(code = 0) {
  if (stopping) return
  stopping = true
  for (const child of children) child.kill('SIGTERM')
  const deadline = Date.now() + 10_000
  while (children.size && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100))
  for (const child of children) child.kill('SIGKILL')
  if (cluster) {
    log('stopping PostgreSQL (data kept)')
    cluster.stop()
  }
  if (existsSync(lockFile) && JSON.parse(readFileSync(lockFile, 'utf8')).pid === process.pid) rmSync(lockFile)
  process.exit(code)
}

async function main() {
  ensureNodeModules()
  takeLock()
  process.on('SIGINT', () => void shutdown(0))
  process.on('SIGTERM', () => void shutdown(0))

  if (await portInUse(port)) throw new SetupError(`port ${port} is taken; set PORT to another port`)

  let databaseUrl = env.DATABASE_URL
  if (!databaseUrl) {
    ensurePostgresInstalled()
    const persistent = persistentCluster(pgPort)
    cluster = persistent.cluster
    if (cluster.isRunning()) log(`PostgreSQL is already running on 127.0.0.1:${pgPort}; using it`)
    else {
      if (await portInUse(pgPort)) throw new SetupError(`port ${pgPort} is taken; set PG_PORT to another port`)
      log(`starting PostgreSQL on 127.0.0.1:${pgPort}`)
      cluster.start()
    }
    await ensureDatabase(cluster.url('postgres', persistent.password), 'conewright')
    databaseUrl = cluster.url('conewright', persistent.password)
  }

  const tsx = ['--import', 'tsx']
  const standInEnv = {}
  if (!env.SMTP_URL || !env.MEILI_HOST || !env.STRIPE_API_BASE) {
    const apiPort = dev ? port + 1 : port
    const { standIns } = startChild(
      'the local stand-ins',
      process.execPath,
      [...tsx, 'standins/main.ts'],
      {
        APP_WEBHOOK_URL: `http://127.0.0.1:${apiPort}/api/webhooks/stripe`,
        APP_CONNECT_WEBHOOK_URL: `http://127.0.0.1:${apiPort}/api/webhooks/stripe-connect`,
        // The stand-in keeps its test-mode account between runs, as the database keeps the app's side.
        STRIPE_STATE_FILE: env.STRIPE_STATE_FILE ?? path.join(repoRoot, 'var', 'stripe-standin.json'),
      },
      { captureStandIns: true },
    )
    Object.assign(standInEnv, await standIns)
  }

  const serverEnv = {
    DATABASE_URL: databaseUrl,
    SEED_DEMO: env.SEED_DEMO ?? 'true',
    ...standInEnv,
  }

  if (dev) {
    const apiPort = port + 1
    startChild(
      'the API',
      process.execPath,
      [path.join(repoRoot, 'node_modules/tsx/dist/cli.mjs'), 'watch', '--clear-screen=false', 'server/main.ts'],
      {
        ...serverEnv,
        NODE_ENV: 'development',
        PORT: String(apiPort),
        PUBLIC_URL: `http://127.0.0.1:${port}`,
        SERVE_CLIENT: 'false',
      },
    )
    await waitForHealth(`http://127.0.0.1:${apiPort}`)
    startChild('Vite', process.execPath, [path.join(repoRoot, 'node_modules/vite/bin/vite.js'), '--port', String(port), '--strictPort'], {
      API_PORT: String(apiPort),
      VITE_MAIL_INBOX_URL: standInEnv.MAIL_INBOX_URL ?? '',
    })
  } else {
    buildClient()
    startChild('the server', process.execPath, [...tsx, 'server/main.ts'], { ...serverEnv, PORT: String(port) })
    await waitForHealth(`http://127.0.0.1:${port}`)
  }

  log(`Conewright is up at http://127.0.0.1:${port}`)
  if (standInEnv.MAIL_INBOX_URL) log(`caught mail: ${standInEnv.MAIL_INBOX_URL}`)
  log('demo sign-in: see README.md (password glaze-and-fire-demo). Ctrl-C stops everything.')
}

main().catch((error) => {
  if (error instanceof SetupError) process.stderr.write(`[conewright] ${error.message}\n`)
  else console.error(error)
  void shutdown(1)
})
