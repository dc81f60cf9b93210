// For command-line tools: the database named by DATABASE_URL, or else the local cluster `npm start`
// uses (started for the duration of the command when it is not running).
import { persistentCluster } from '../../scripts/lib/postgres.mjs'
import { createDataSource } from '../db/data-source'
import type { DataSource } from 'typeorm'

export async function withDatabase<T>(work: (db: DataSource, url: string) => Promise<T>): Promise<T> {
  let url = process.env.DATABASE_URL
  let stopAfter: (() => void) | null = null
  if (!url) {
    const { cluster, password } = persistentCluster(Number(process.env.PG_PORT ?? 54610))
    if (!cluster.isRunning()) {
      cluster.start()
      stopAfter = () => cluster.stop()
    }
    url = cluster.url('conewright', password)
  }
  const db = createDataSource(url, { poolSize: 4, applicationName: 'conewright-cli' })
  try {
    await db.initialize()
    await db.runMigrations()
    return await work(db, url)
  } finally {
    if (db.isInitialized) await db.destroy()
    stopAfter?.()
  }
}
