// npm run search:reindex — rebuilds the search index from PostgreSQL: the search_documents table and
// the engine at MEILI_HOST (the local stand-in runs while `npm start` does).
import { reindexAll } from '../services/search-sync'
import { loadConfig } from '../config'
import { consoleLogger } from '../context'
import { withDatabase } from './local-database'

await withDatabase(async (db, url) => {
  const config = loadConfig(process.env, { databaseUrl: url })
  const started = Date.now()
  try {
    const { studios, documents } = await reindexAll({ config, db, log: consoleLogger('reindex') }, (done, total) => {
      if (done === total || done % 100 === 0) process.stdout.write(`\r  studios ${done}/${total}`)
    })
    process.stdout.write('\n')
    console.log(`Indexed ${documents} open firings of ${studios} published studios in ${((Date.now() - started) / 1000).toFixed(1)} s.`)
  } catch (error) {
    console.error(`\nThe search engine at ${config.meiliHost} did not take the index: ${(error as Error).message}`)
    console.error('Start it (npm start runs the local one) or set MEILI_HOST and MEILI_API_KEY, then run this again.')
    process.exitCode = 1
  }
})
