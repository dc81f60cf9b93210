// Generates a migration from the difference between the entities and the committed migrations:
// starts a throwaway cluster, applies the migrations so far, asks the TypeORM CLI for the rest.
import { spawnSync } from 'node:child_process'
import path from 'node:path'
import { throwawayCluster } from '../../scripts/lib/postgres.mjs'
import { freePort } from '../../scripts/lib/system.mjs'
import { repoRoot } from '../config'
import { createDataSource } from '../db/data-source'

const name = process.argv[2]
if (!name || !/^[A-Z][A-Za-z0-9]+$/.test(name)) {
  console.error('usage: npm run migration:generate -- MigrationName   (PascalCase)')
  process.exit(2)
}

const { cluster, remove } = throwawayCluster(await freePort())
try {
  cluster.start()
  const url = cluster.url('postgres')
  const dataSource = createDataSource(url)
  await dataSource.initialize()
  await dataSource.runMigrations()
  await dataSource.destroy()
  const result = spawnSync(
    process.execPath,
    [
      '--import',
      'tsx',
      path.join(repoRoot, 'node_modules/typeorm/cli.js'),
      'migration:generate',
      '-d',
      path.join(repoRoot, 'server/db/cli-data-source.ts'),
      '--pretty',
      path.join(repoRoot, 'server/db/migrations', name),
    ],
    { stdio: 'inherit', env: { ...process.env, DATABASE_URL: url }, cwd: repoRoot },
  )
  if (result.status === 0) console.log(`Now add the new class to server/db/migrations.ts.`)
  process.exitCode = result.status ?? 1
} finally {
  remove()
}
