// The search engine leaving and coming back, with its data or empty (a restart of the engine): the
// app notices within 30 seconds, re-creates the index and its settings when they are missing,
// rebuilds or replays what the engine lacks, leaves degraded mode, and logs one line each way per
// outage rather than one per search.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Logger } from '../../server/context'
import { FIRINGS_INDEX_SETTINGS } from '../../search/public'
import { startSearchEngine } from '../../standins/search-engine/server'
import { HttpSession } from '../support/http-client'
import { createPerson } from '../support/people'
import { publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'
import { waitUntil } from '../support/wait'

let app: TestApp
const lines: string[] = []
const log: Logger = {
  info: (m) => lines.push(`info ${m}`),
  warn: (m) => lines.push(`warn ${m}`),
  error: (m, e) => lines.push(`error ${m} ${(e as Error)?.stack ?? ''}`),
}

const search = async () => (await new HttpSession(app.url).get('/api/search?perPage=50')).body as { total: number; degraded: boolean }
const engineLines = () => lines.filter((l) => /search engine|queue/.test(l))

beforeAll(async () => {
  app = await startTestApp({ search: true, log })
  const owner = await createPerson(app, 'host', 'Recovery Owner')
  await publishedStudio(owner.session, 'Recovery Pottery')
  await publishedStudio(owner.session, 'Second Recovery Pottery')
  await waitUntil(async () => (await search()).total === 2, { timeout: 30_000, what: 'the index to hold both firings' })
}, 60_000)
afterAll(async () => {
  await app?.close()
})

describe('the search engine comes back empty', () => {
  it('is noticed within 30 s: index and settings re-created, rebuilt from PostgreSQL, degraded mode left', async () => {
    expect(await search()).toMatchObject({ total: 2, degraded: false })
    const { port } = app.search!
    await app.search!.close()
    lines.length = 0
    for (let i = 0; i < 20; i++) expect(await search()).toMatchObject({ total: 2, degraded: true })
    // A restart of the engine: the same address, nothing in it.
    app.search = await startSearchEngine({ port, masterKey: 'test-search-key' })
    await expect
      .poll(async () => await search(), { timeout: 30_000, interval: 500 })
      .toEqual(expect.objectContaining({ total: 2, degraded: false }))
    const settings = await fetch(`${app.search.url}/indexes/firings/settings`, { headers: { Authorization: 'Bearer test-search-key' } })
    expect((await settings.json()).filterableAttributes).toEqual(
      expect.arrayContaining(FIRINGS_INDEX_SETTINGS.filterableAttributes as string[]),
    )
    // One line when it went, one when it was back; none per search, no stack traces.
    expect(engineLines().filter((l) => /unreachable/.test(l))).toHaveLength(1)
    expect(engineLines().filter((l) => /is back/.test(l))).toHaveLength(1)
    expect(lines.filter((l) => l.startsWith('error'))).toEqual([])
  }, 90_000)
})
