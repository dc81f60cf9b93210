import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startTestApp, type TestApp } from '../support/test-app'

let tls: TestApp

beforeAll(async () => {
  tls = await startTestApp({ worker: false, config: { publicUrl: 'https://kilns.example.test', secureCookies: true } })
})
afterAll(async () => {
  await tls?.close()
})

describe('cookies behind TLS', () => {
  it('marks the CSRF and session cookies Secure when the public address is https', async () => {
    // The TLS terminator in front says the request came in over https.
    const https = { 'X-Forwarded-Proto': 'https' }
    const csrf = await fetch(`${tls.url}/api/auth/csrf`, { headers: https })
    const csrfCookie = csrf.headers.getSetCookie().find((c) => c.startsWith('cw.csrf='))!
    const { token } = await csrf.json()
    const registered = await fetch(`${tls.url}/api/auth/register`, {
      method: 'POST',
      headers: { ...https, 'Content-Type': 'application/json', 'X-CSRF-Token': token, Cookie: csrfCookie.split(';')[0] },
      body: JSON.stringify({
        email: 'tls.potter@example.test',
        password: 'kiln-shelf-wadding-cone',
        displayName: 'TLS Potter',
        role: 'potter',
      }),
    })
    expect(registered.status).toBe(201)
    const sessionCookie = registered.headers.getSetCookie().find((c) => c.startsWith('cw.sid='))!
    for (const cookie of [csrfCookie, sessionCookie]) {
      expect(cookie).toMatch(/; Secure/i)
      expect(cookie).toMatch(/HttpOnly/i)
      expect(cookie).toMatch(/SameSite=Lax/i)
    }
  })
})
