import { rateLimit, type Options, type Store, type ClientRateLimitInfo } from 'express-rate-limit'
import type { Request } from 'express'
import type { DataSource } from 'typeorm'
import { clearCount, countHit } from '../services/counters'

/**
 * A rate-limit store in PostgreSQL, so every server process behind a load balancer counts the same
 * hits. One upsert per request (services/counters.ts): the window restarts when it has run out.
 */
export class PostgresRateLimitStore implements Store {
  windowMs = 60_000
  prefix: string

  constructor(
    private readonly db: DataSource,
    prefix: string,
  ) {
    this.prefix = prefix
  }

  init(options: Options) {
    this.windowMs = options.windowMs
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const { hits, resetAt } = await countHit(this.db, this.prefix + key, this.windowMs)
    return { totalHits: hits, resetTime: resetAt }
  }

  async decrement(key: string) {
    await this.db.query(`UPDATE rate_limit_counters SET hits = greatest(hits - 1, 0) WHERE key = $1`, [this.prefix + key])
  }

  async resetKey(key: string) {
    await clearCount(this.db, this.prefix + key)
  }
}

const tooMany = {
  error: { code: 'rate-limited', message: 'Too many attempts. Wait a few minutes and try again.' },
}

export function makeLimiter(
  db: DataSource,
  name: string,
  { limit, windowMs, key }: { limit: number; windowMs: number; key?: (req: Request) => string | null },
) {
  return rateLimit({
    windowMs,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new PostgresRateLimitStore(db, `${name}:`),
    message: tooMany,
    // A per-account limiter counts nothing for a request that names no account.
    ...(key ? { skip: (req: Request) => key(req) === null, keyGenerator: (req: Request) => key(req) ?? '' } : {}),
  })
}

/** The account a registration or reset request is about, as the schema (which runs first) normalised it. */
export function accountKey(req: Request): string | null {
  const email = req.body?.email
  return typeof email === 'string' && email.trim() ? email.trim().toLowerCase() : null
}

/**
 * The limiter for open read-mostly routes (search, places, ware checks): counted in this process's
 * memory, so it costs no database round trip on the hottest routes. Behind a load balancer each
 * process counts on its own, which is enough to blunt scraping; the sign-in limits, which guard
 * accounts, are the shared PostgreSQL ones above.
 */
export function openRouteLimiter(limit: number) {
  return rateLimit({ windowMs: 60_000, limit, standardHeaders: 'draft-8', legacyHeaders: false, message: tooMany })
}
