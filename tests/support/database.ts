import { randomBytes } from 'node:crypto'
import pg from 'pg'
import { inject } from 'vitest'
import { withDatabase } from './database-url'

/** A fresh database cloned from the migrated template; `drop()` removes it. */
export async function createTestDatabase(): Promise<{ url: string; drop(): Promise<void> }> {
  const adminUrl = inject('pgAdminUrl')
  const template = inject('templateDatabase')
  const name = `cw_test_${randomBytes(6).toString('hex')}`
  const admin = new pg.Client({ connectionString: adminUrl })
  await admin.connect()
  // Cloning needs the template to have no other sessions; a retry covers a concurrent clone.
  for (let attempt = 0; ; attempt++) {
    try {
      await admin.query(`CREATE DATABASE ${name} TEMPLATE ${template}`)
      break
    } catch (error) {
      if (attempt > 20) throw error
      await new Promise((r) => setTimeout(r, 100 + Math.random() * 200))
    }
  }
  await admin.end()
  return {
    url: withDatabase(adminUrl, name),
    async drop() {
      const c = new pg.Client({ connectionString: adminUrl })
      await c.connect()
      await c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`)
      await c.end()
    },
  }
}
