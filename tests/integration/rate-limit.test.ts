import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { HttpSession } from '../support/http-client'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp

beforeAll(async () => {
  app = await startTestApp({
    worker: false,
    config: { rateLimits: { authPerIpPer15Min: 8, authPerAccountPer15Min: 3, openApiPerIpPerMin: 300 } },
  })
})
afterAll(async () => {
  await app?.close()
})

describe('sign-in rate limits', () => {
  it('pauses an account from one address after repeated failures with 429, whatever the session', async () => {
    const email = 'target@example.test'
    const statuses: number[] = []
    for (let i = 0; i < 4; i++) statuses.push((await new HttpSession(app.url).signIn(email, `wrong-${i}`)).status)
    expect(statuses).toEqual([401, 401, 401, 429])
    const reply = await new HttpSession(app.url).signIn(email, 'wrong-again')
    expect(reply.status).toBe(429)
    expect(reply.body.error.code).toBe('sign-in-paused')
  })

  it('limits registration attempts for one address', async () => {
    // A fresh app, so the sign-in attempts above do not count against this address's IP.
    const fresh = await startTestApp({
      worker: false,
      config: { rateLimits: { authPerIpPer15Min: 100, authPerAccountPer15Min: 3, openApiPerIpPerMin: 300 } },
    })
    try {
      const statuses: number[] = []
      for (let i = 0; i < 4; i++)
        statuses.push(
          (
            await new HttpSession(fresh.url).post('/api/auth/register', {
              email: 'same.address@example.test',
              // Passes the schema (which runs first and counts nothing), then fails the strength check.
              password: 'aaaaaaaaaa',
              displayName: 'X',
              role: 'potter',
            })
          ).status,
        )
      expect(statuses).toEqual([400, 400, 400, 429])
    } finally {
      await fresh.close()
    }
  })

  it('limits one address (IP) across accounts', async () => {
    const statuses: number[] = []
    // 4 attempts were already spent from this IP by the test above.
    for (let i = 0; i < 5; i++) statuses.push((await new HttpSession(app.url).signIn(`other${i}@example.test`, 'nope-nope')).status)
    expect(statuses.filter((s) => s === 429).length).toBeGreaterThan(0)
    expect(statuses.at(-1)).toBe(429)
  })
})
