// Password guessing is throttled per account *and* address, so a stranger's wrong guesses pause the
// stranger, not the owner signing in from elsewhere. Wrong guesses from one address first slow that
// address down, then pause it for the window; guesses spread over many addresses pause password
// sign-in for the account as a whole, and then the owner gets in through a mailed one-time link.
import type { AppContext } from '../context'
import { HttpError } from '../http/errors'
import { clearCount, countHit, readCount, secondsUntil } from '../services/counters'

export const SIGN_IN_WINDOW_MS = 15 * 60_000
const SLOWDOWN_BASE_MS = 250
const SLOWDOWN_CAP_MS = 8_000

/**
 * How long to wait before checking a password after this many wrong ones from the same address:
 * nothing for the first half of the pair's allowance, then a doubling wait, capped so an owner who
 * mistyped is never kept long.
 */
export function slowdownMs(failures: number, pairLimit: number): number {
  const after = Math.ceil(pairLimit / 2)
  if (failures < after) return 0
  return Math.min(SLOWDOWN_CAP_MS, SLOWDOWN_BASE_MS * 2 ** (failures - after))
}

const pairKey = (email: string, address: string) => `sign-in:pair:${email}|${address}`
const accountKey = (email: string) => `sign-in:account:${email}`

export function signInGuard(ctx: AppContext) {
  const { authPerAccountPer15Min: pairLimit, authAccountWidePer15Min: accountLimit } = ctx.config.rateLimits
  const paused = (code: string, message: string, resetAt: Date) =>
    new HttpError(429, code, message, undefined, { retryAfterSeconds: secondsUntil(resetAt), signInLink: true })

  return {
    /** Refuses while this pair or this account is paused; otherwise waits out the slowdown. */
    async before(email: string, address: string) {
      const pair = await readCount(ctx.db, pairKey(email, address))
      if (pair.hits >= pairLimit)
        throw paused(
          'sign-in-paused',
          'Too many wrong passwords from here. Wait a few minutes, or have a one-time sign-in link mailed to you.',
          pair.resetAt,
        )
      const account = await readCount(ctx.db, accountKey(email))
      if (account.hits >= accountLimit)
        throw paused(
          'account-protected',
          'Many wrong passwords were tried on this account, so password sign-in is paused for a while. We can mail you a one-time sign-in link.',
          account.resetAt,
        )
      const wait = slowdownMs(pair.hits, pairLimit)
      if (wait) await new Promise((resolve) => setTimeout(resolve, wait))
    },
    async failed(email: string, address: string) {
      await countHit(ctx.db, pairKey(email, address), SIGN_IN_WINDOW_MS)
      await countHit(ctx.db, accountKey(email), SIGN_IN_WINDOW_MS)
    },
    /** The owner is in: their address starts afresh (the account-wide count stays, it is about others). */
    async succeeded(email: string, address: string) {
      await clearCount(ctx.db, pairKey(email, address))
    },
  }
}
