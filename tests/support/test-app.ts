import { mkdtempSync, rmSync } from 'node:fs'
import type { AddressInfo } from 'node:net'
import os from 'node:os'
import path from 'node:path'
import type { Server } from 'node:http'
import type { Express } from 'express'
import type { Runner } from 'graphile-worker'
import { freePort } from '../../scripts/lib/system.mjs'
import { createApp } from '../../server/app'
import { loadConfig, type ConfigOverrides } from '../../server/config'
import { silentLogger, type AppContext, type Logger } from '../../server/context'
import { createDataSource } from '../../server/db/data-source'
import { startWorker } from '../../server/jobs/worker'
import { startMailCatcher, type MailCatcher } from '../../standins/mail-catcher'
import { startSearchEngine, type RunningSearchEngine } from '../../standins/search-engine/server'
import { startStripeStandIn, type StripeStandIn } from '../../standins/stripe/standin'
import { createTestDatabase } from './database'

export interface TestApp {
  url: string
  /** The Express app itself, for tests that walk its routes. */
  express: Express
  ctx: AppContext
  mail: MailCatcher | null
  search: RunningSearchEngine | null
  stripe: StripeStandIn | null
  close(): Promise<void>
}

/**
 * The real server on a random loopback port over its own cloned database, with the queue worker
 * and (when asked) a mail catcher. Nothing is mocked.
 */
export async function startTestApp(
  options: {
    mail?: boolean
    search?: boolean
    stripe?: boolean
    worker?: boolean
    config?: ConfigOverrides
    serveClient?: boolean
    /** Where the app logs; silent unless TEST_LOG is set. */
    log?: Logger
  } = {},
): Promise<TestApp> {
  const database = await createTestDatabase()
  const mail = options.mail ? await startMailCatcher({ smtpPort: await freePort(), webPort: await freePort() }) : null
  const search = options.search ? await startSearchEngine({ port: 0, masterKey: 'test-search-key' }) : null
  const stripe = options.stripe
    ? await startStripeStandIn({
        port: 0,
        secretKey: 'sk_test_conewright_tests',
        webhookSecret: 'whsec_conewright_tests',
        connectWebhookSecret: 'whsec_conewright_tests_connect',
        webhookRetry: { baseDelayMs: 100 },
      })
    : null
  const storageDir = mkdtempSync(path.join(os.tmpdir(), 'conewright-storage-'))
  const config = loadConfig(
    {},
    {
      databaseUrl: database.url,
      smtpUrl: mail?.smtpUrl ?? 'smtp://127.0.0.1:9',
      mailInboxUrl: mail?.webUrl ?? null,
      // Without a search engine, searches take the PostgreSQL path (port 9 answers nothing).
      meiliHost: search?.url ?? 'http://127.0.0.1:9',
      meiliApiKey: 'test-search-key',
      stripeSecretKey: 'sk_test_conewright_tests',
      stripeWebhookSecret: 'whsec_conewright_tests',
      stripeConnectWebhookSecret: 'whsec_conewright_tests_connect',
      // Without the stand-in, Stripe calls go to a port that answers nothing.
      stripeApiBase: stripe?.url ?? 'http://127.0.0.1:9',
      serveClient: options.serveClient ?? false,
      storageDir,
      workerConcurrency: 2,
      ...options.config,
    },
  )
  const db = createDataSource(database.url, { poolSize: 10, applicationName: 'conewright-test' })
  await db.initialize()
  const ctx: AppContext = { config, db, log: options.log ?? (process.env.TEST_LOG ? { ...console, warn: console.warn } : silentLogger) }
  const worker: Runner | null = options.worker === false ? null : await startWorker(ctx)
  const { app, close } = createApp(ctx)
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s))
  })
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
  if (!options.config?.publicUrl) config.publicUrl = url
  stripe?.setWebhookUrl(`${url}/api/webhooks/stripe`)
  stripe?.setConnectWebhookUrl(`${url}/api/webhooks/stripe-connect`)
  const testApp: TestApp = {
    url,
    express: app,
    ctx,
    mail,
    search,
    stripe,
    async close() {
      server.closeAllConnections()
      await new Promise((r) => server.close(r))
      await worker?.stop()
      close()
      await db.destroy()
      await mail?.close()
      // A test may have restarted the engine: close the one running now.
      await testApp.search?.close()
      await stripe?.close()
      await database.drop()
      rmSync(storageDir, { recursive: true, force: true })
    },
  }
  return testApp
}
