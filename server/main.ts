// The server process: migrate, seed (when asked), start the queue worker, serve. Configured only by
// its environment; `npm start` sets that environment for the local stand-ins.
import type { Server } from 'node:http'
import { createApp } from './app'
import { isLocalDevelopment, loadConfig, secretProblems } from './config'
import { consoleLogger, type AppContext } from './context'
import { createDataSource } from './db/data-source'
import { seedDemoPayouts } from './db/demo-payouts'
import { seedDemo } from './db/seed'
import { migrateQueue, startWorker } from './jobs/worker'
import { warmGazetteer } from './services/gazetteer'
import { enqueueReindex } from './services/search-sync'
import { engineRebuildStarted } from './services/search'

const log = consoleLogger()
const config = loadConfig()
// Secrets with public defaults would let anyone sign a session cookie or a webhook: refuse to serve.
const problems = secretProblems(config)
if (problems.length) {
  for (const problem of problems) log.error(`refusing to start: ${problem}`)
  process.exit(1)
}
if (isLocalDevelopment(config)) log.info('local development: secrets not set are the fixed local ones, fit only for this machine')
const db = createDataSource(config.databaseUrl)
await db.initialize()
const ctx: AppContext = { config, db, log }

if (process.env.MIGRATE !== 'false') {
  const applied = await db.runMigrations()
  if (applied.length) log.info(`applied ${applied.length} migration(s)`)
}
await migrateQueue(ctx)
if (process.env.SEED_DEMO === 'true') {
  await seedDemo(ctx)
  log.info('demo data is in place')
}

// The engine's copy is derived: rebuild it from PostgreSQL on every start (the local stand-in starts empty).
await db.transaction((manager) => enqueueReindex(manager))
// Until the rebuild has run, this process answers searches from PostgreSQL's copy, which is current.
if (config.runWorker) engineRebuildStarted()
// Load the place data now rather than on the first request that needs it.
warmGazetteer()
const worker = config.runWorker ? await startWorker(ctx) : null
const { app, close } = createApp(ctx)
const server: Server = app.listen(config.port, config.host, () => {
  log.info(`listening on http://${config.host}:${config.port} (public address ${config.publicUrl})`)
  // The demo's card payments and the community studio's onboarding go through Stripe, whose
  // webhooks need this server listening.
  if (process.env.SEED_DEMO === 'true')
    seedDemoPayouts(ctx).then(
      () => log.info('demo payouts are in place'),
      (error) => log.warn('the demo payouts could not be made', error),
    )
})

let stopping = false
async function shutdown(signal: string) {
  if (stopping) return
  stopping = true
  log.info(`${signal}: stopping`)
  server.close()
  server.closeAllConnections()
  await worker?.stop()
  close()
  await db.destroy()
  process.exit(0)
}
process.on('SIGTERM', () => void shutdown('SIGTERM'))
process.on('SIGINT', () => void shutdown('SIGINT'))
