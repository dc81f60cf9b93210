import 'reflect-metadata'
import { DataSource } from 'typeorm'
import { entities } from './entities'
import { migrations } from './migrations'

/** The one way the server, the CLI and the tests reach PostgreSQL. */
export function createDataSource(url: string, options: { poolSize?: number; applicationName?: string } = {}) {
  return new DataSource({
    type: 'postgres',
    url,
    entities,
    migrations,
    migrationsTableName: 'typeorm_migrations',
    migrationsTransactionMode: 'each',
    synchronize: false,
    uuidExtension: 'pgcrypto',
    logging: ['error'],
    poolSize: options.poolSize ?? 20,
    applicationName: options.applicationName ?? 'conewright',
  })
}
