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
  it('marks the session cookie Secure when the public address is https', async () => {
    // The TLS terminator in front says the request came in over https.
    const res = await fetch(`${tls.url}/api/auth/csrf`, { headers: { 'X-Forwarded-Proto': 'https' } })
    const cookie = res.headers.getSetCookie().find((c) => c.startsWith('cw.sid='))!
    expect(cookie).toMatch(/; Secure/i)
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
  })
})
