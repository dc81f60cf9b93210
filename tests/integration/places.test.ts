import express from 'express'
import type { Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { errorHandler } from '../../server/http/errors'
import { placesRouter } from '../../server/routes/places'
import { startTestApp, type TestApp } from '../support/test-app'

const LIMIT_PER_MINUTE = 12

let app: TestApp
let baseUrl: string
let ownServer: Server | null = null

beforeAll(async () => {
  app = await startTestApp({
    worker: false,
    config: { rateLimits: { authPerIpPer15Min: 100, authPerAccountPer15Min: 10, openApiPerIpPerMin: LIMIT_PER_MINUTE } },
  })
  baseUrl = app.url
  // Until the router is mounted in the app, serve it the same way over the same context.
  const probe = await fetch(`${app.url}/api/places?q=97214`)
  if (probe.status === 404) {
    const own = express()
    own.use('/api', placesRouter(app.ctx))
    own.use(errorHandler(app.ctx.log.error))
    ownServer = await new Promise<Server>((resolve) => {
      const server = own.listen(0, '127.0.0.1', () => resolve(server))
    })
    baseUrl = `http://127.0.0.1:${(ownServer.address() as AddressInfo).port}`
  }
})
afterAll(async () => {
  if (ownServer) await new Promise((resolve) => ownServer!.close(resolve))
  await app?.close()
})

const get = async (query: string) => {
  const res = await fetch(`${baseUrl}/api/places${query}`)
  return { status: res.status, body: await res.json() }
}

describe('GET /api/places', () => {
  it('resolves a ZIP code to its place first', async () => {
    const { status, body } = await get('?q=97214')
    expect(status).toBe(200)
    expect(body.places[0]).toMatchObject({
      postalCode: '97214',
      city: 'Portland',
      region: 'OR',
      country: 'US',
      timezone: 'America/Los_Angeles',
    })
  })

  it('resolves a full address to the place of its ZIP', async () => {
    const { body } = await get(`?q=${encodeURIComponent('1421 SE Belmont St, Portland, OR 97214')}`)
    expect(body.places).toHaveLength(1)
    expect(body.places[0].postalCode).toBe('97214')
  })

  it('completes a town prefix within the asked limit', async () => {
    const { body } = await get('?q=portl&limit=3')
    expect(body.places).toHaveLength(3)
    expect(body.places[0].label).toBe('Portland, OR')
  })

  it('answers an unknown place with an empty list', async () => {
    const { status, body } = await get('?q=Nowhere%20Special')
    expect(status).toBe(200)
    expect(body.places).toEqual([])
  })

  it('refuses a missing or overlong query with a field message', async () => {
    const missing = await get('')
    expect(missing.status).toBe(400)
    expect(missing.body.error.code).toBe('invalid-query')
    expect(missing.body.error.fields.q).toBeTruthy()

    const overlong = await get(`?q=${'a'.repeat(121)}`)
    expect(overlong.status).toBe(400)
    expect(overlong.body.error.fields.q).toMatch(/120/)

    const badLimit = await get('?q=port&limit=0')
    expect(badLimit.status).toBe(400)
    expect(badLimit.body.error.fields.limit).toBeTruthy()
  })

  it('rate-limits one address per minute', async () => {
    const statuses: number[] = []
    for (let i = 0; i < LIMIT_PER_MINUTE + 1; i++) statuses.push((await get('?q=boise')).status)
    expect(statuses.at(-1)).toBe(429)
    const { body } = await get('?q=boise')
    expect(body.error.code).toBe('rate-limited')
  })
})
