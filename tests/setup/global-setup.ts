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

export default async function setup(project: TestProject) {
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

  project.provide('pgAdminUrl', adminUrl)
  project.provide('templateDatabase', templateDatabase)

  return async () => {
    await admin.query(`DROP DATABASE IF EXISTS ${templateDatabase} WITH (FORCE)`).catch(() => {})
    await admin.end()
    remove?.()
  }
}
