// Entry for the TypeORM CLI (used by `npm run migration:generate`).
import { createDataSource } from './data-source'

if (!process.env.DATABASE_URL) throw new Error('DATABASE_URL must be set for the TypeORM CLI')
export default createDataSource(process.env.DATABASE_URL, { applicationName: 'conewright-cli' })
