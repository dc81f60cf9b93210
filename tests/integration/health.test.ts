import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { loadConfig } from '../../server/config'
import { silentLogger } from '../../server/context'
import { createDataSource } from '../../server/db/data-source'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp

beforeAll(async () => {
  app = await startTestApp({ worker: false })
})
afterAll(async () => {
  await app?.close()
})

describe('GET /api/health', () => {
  it('says the database is up', async () => {
    const res = await fetch(`${app.url}/api/health`)
    expect(res.status).toBe(200)
    expect(await res.json()).toEqual({ ok: true, db: 'up' })
  })

  it('answers 503 when the database cannot be reached', async () => {
    // A data source pointed at a port nothing listens on.
    const db = createDataSource('postgres://nobody@127.0.0.1:9/none', { poolSize: 1 })
    const config = loadConfig({}, { databaseUrl: 'postgres://nobody@127.0.0.1:9/none' })
    const { app: express, close } = createApp({ config, db, log: silentLogger })
    const server = express.listen(0, '127.0.0.1')
    await new Promise((r) => server.once('listening', r))
    const port = (server.address() as { port: number }).port
    const res = await fetch(`http://127.0.0.1:${port}/api/health`)
    expect(res.status).toBe(503)
    expect(await res.json()).toEqual({ ok: false, db: 'down' })
    server.close()
    close()
  })

  it('answers an unknown API path with 404 in the error shape', async () => {
    const res = await fetch(`${app.url}/api/no-such-thing`)
    expect(res.status).toBe(404)
    expect((await res.json()).error.code).toBe('no-such-route')
  })
})
