import { rateLimit, type Options, type Store, type ClientRateLimitInfo } from 'express-rate-limit'
import type { Request } from 'express'
import type { DataSource } from 'typeorm'

/**
 * A rate-limit store in PostgreSQL, so every server process behind a load balancer counts the same
 * hits. One upsert per request: the window restarts when it has run out.
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
    const rows: { hits: number; reset_at: Date }[] = await this.db.query(
      `INSERT INTO rate_limit_counters (key, hits, reset_at)
       VALUES ($1, 1, now() + make_interval(secs => $2 / 1000.0))
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN rate_limit_counters.reset_at <= now() THEN 1 ELSE rate_limit_counters.hits + 1 END,
         reset_at = CASE WHEN rate_limit_counters.reset_at <= now() THEN EXCLUDED.reset_at ELSE rate_limit_counters.reset_at END
       RETURNING hits, reset_at`,
      [this.prefix + key, this.windowMs],
    )
    return { totalHits: rows[0].hits, resetTime: new Date(rows[0].reset_at) }
  }

  async decrement(key: string) {
    await this.db.query(`UPDATE rate_limit_counters SET hits = greatest(hits - 1, 0) WHERE key = $1`, [this.prefix + key])
  }

  async resetKey(key: string) {
    await this.db.query(`DELETE FROM rate_limit_counters WHERE key = $1`, [this.prefix + key])
  }
}

const tooMany = {
  error: { code: 'rate-limited', message: 'Too many attempts. Wait a few minutes and try again.' },
}

export function makeLimiter(
  db: DataSource,
  name: string,
  {
    limit,
    windowMs,
    key,
    onlyFailures = false,
  }: { limit: number; windowMs: number; key?: (req: Request) => string | null; onlyFailures?: boolean },
) {
  return rateLimit({
    windowMs,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new PostgresRateLimitStore(db, `${name}:`),
    message: tooMany,
    // Account lock-out counts failed attempts only, so the owner signing in is never the one locked out.
    skipSuccessfulRequests: onlyFailures,
    // A per-account limiter counts nothing for a request that names no account.
    ...(key ? { skip: (req: Request) => key(req) === null, keyGenerator: (req: Request) => key(req) ?? '' } : {}),
  })
}

/** The account a sign-in or reset request is about, normalised as the schema normalises it. */
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
