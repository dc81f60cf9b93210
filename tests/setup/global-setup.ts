// Once per test run: a throwaway PostgreSQL cluster on a free loopback port (or the server named by
// TEST_PG_ADMIN_URL), and a template database with every migration applied. Each test file clones
// the template, so files run in parallel on their own data.
import pg from 'pg'
import type { TestProject } from 'vitest/node'
import { throwawayCluster } from '../../scripts/lib/postgres.mjs'
import { freePort } from '../../scripts/lib/system.mjs'
import { createDataSource } from '../../server/db/data-source'
import { migrateQueue } from '../../server/jobs/worker'
import { loadConfig } from '../../server/config'
import { silentLogger } from '../../server/context'
import { withDatabase } from '../support/database-url'

declare module 'vitest' {
  export interface ProvidedContext {
    pgAdminUrl: string
    templateDatabase: string
  }
}

interface SharedDatabase {
  adminUrl: string
  templateDatabase: string
  users: number
  close: () => Promise<void>
}

// The integration and end-to-end projects each call this setup; they share one cluster and template,
// kept on globalThis (the setup module may be loaded once per project) and removed by the last user.
const shared = globalThis as typeof globalThis & { conewrightTestDatabase?: Promise<SharedDatabase> }

async function startDatabase(): Promise<SharedDatabase> {
  let adminUrl = process.env.TEST_PG_ADMIN_URL
  let remove: (() => void) | null = null
  if (!adminUrl) {
    const throwaway = throwawayCluster(await freePort())
    throwaway.cluster.start()
    remove = throwaway.remove
    adminUrl = throwaway.cluster.url('postgres')
  }

  const templateDatabase = `cw_template_${process.pid}`
  const admin = new pg.Client({ connectionString: adminUrl })
  await admin.connect()
  await admin.query(`DROP DATABASE IF EXISTS ${templateDatabase}`)
  await admin.query(`CREATE DATABASE ${templateDatabase}`)

  const templateUrl = withDatabase(adminUrl, templateDatabase)
  const db = createDataSource(templateUrl, { poolSize: 2 })
  await db.initialize()
  await db.runMigrations()
  await migrateQueue({ db, config: loadConfig({}, { databaseUrl: templateUrl }), log: silentLogger })
  await db.destroy()

  return {
    adminUrl,
    templateDatabase,
    users: 0,
    close: async () => {
      await admin.query(`DROP DATABASE IF EXISTS ${templateDatabase} WITH (FORCE)`).catch(() => {})
      await admin.end()
      remove?.()
    },
  }
}

export default async function setup(project: TestProject) {
  shared.conewrightTestDatabase ??= startDatabase()
  const database = await shared.conewrightTestDatabase
  database.users++
  project.provide('pgAdminUrl', database.adminUrl)
  project.provide('templateDatabase', database.templateDatabase)

  return async () => {
    if (--database.users > 0) return
    shared.conewrightTestDatabase = undefined
    await database.close()
  }
}
