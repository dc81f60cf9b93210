// CSRF tokens that need no stored session: a signed double-submit cookie (OWASP's "signed double
// submit cookie", bound to the session once there is one). A visitor who only fetches a token gets a
// random cookie and an HMAC of it, and nothing is written to the database; a signed-in visitor's token
// is also bound to their session id, so a token obtained before signing in stops working after.
import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto'
import type { Request, RequestHandler, Response } from 'express'
import type { Config } from '../config'

const COOKIE = 'cw.csrf'
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS'])

function cookieValue(req: Request): string | null {
  for (const part of (req.headers.cookie ?? '').split(';')) {
    const eq = part.indexOf('=')
    if (eq > 0 && part.slice(0, eq).trim() === COOKIE) {
      const value = part.slice(eq + 1).trim()
      return /^[A-Za-z0-9_-]{20,100}$/.test(value) ? value : null
    }
  }
  return null
}

export function csrfTokens(config: Pick<Config, 'sessionSecret' | 'secureCookies'>) {
  const sign = (req: Request, nonce: string) =>
    createHmac('sha256', config.sessionSecret)
      .update(`${nonce}.${req.user ? req.sessionID : ''}`)
      .digest('base64url')

  /** GET /api/auth/csrf: the token for this browser (and session), setting the cookie when it has none. */
  const issue: RequestHandler = (req, res: Response) => {
    let nonce = cookieValue(req)
    if (!nonce) {
      nonce = randomBytes(24).toString('base64url')
      res.cookie(COOKIE, nonce, { httpOnly: true, sameSite: 'lax', secure: config.secureCookies, path: '/' })
    }
    res.set('Cache-Control', 'no-store').json({ token: sign(req, nonce) })
  }

  /** Every change carries the token in X-CSRF-Token, matching this browser's cookie (and session). */
  const protect: RequestHandler = (req, _res, next) => {
    if (SAFE_METHODS.has(req.method)) return next()
    const given = req.get('x-csrf-token') ?? ''
    const nonce = cookieValue(req)
    const expected = nonce ? Buffer.from(sign(req, nonce)) : null
    const received = Buffer.from(given)
    const ok = expected !== null && received.length === expected.length && timingSafeEqual(received, expected)
    next(ok ? undefined : Object.assign(new Error('bad csrf token'), { code: 'EBADCSRFTOKEN' }))
  }

  return { issue, protect }
}
