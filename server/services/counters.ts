// Counters in PostgreSQL (the rate_limit_counters table), shared by every server process: how many
// times something happened in a window that restarts once it has run out. The sign-in limits, the
// mail allowances and the photo budget all count here.
import type { EntityManager } from 'typeorm'

export interface Count {
  hits: number
  resetAt: Date
}

/** Adds `by` to a counter (starting a new window if the last one ran out) and returns the total. */
export async function countHit(manager: Pick<EntityManager, 'query'>, key: string, windowMs: number, by = 1): Promise<Count> {
  const rows: { hits: number; reset_at: Date }[] = await manager.query(
    `INSERT INTO rate_limit_counters (key, hits, reset_at)
     VALUES ($1, $3, now() + make_interval(secs => $2 / 1000.0))
     ON CONFLICT (key) DO UPDATE SET
       hits = CASE WHEN rate_limit_counters.reset_at <= now() THEN $3 ELSE rate_limit_counters.hits + $3 END,
       reset_at = CASE WHEN rate_limit_counters.reset_at <= now() THEN EXCLUDED.reset_at ELSE rate_limit_counters.reset_at END
     RETURNING hits, reset_at`,
    [key, windowMs, by],
  )
  return { hits: Number(rows[0].hits), resetAt: new Date(rows[0].reset_at) }
}

/** The counter as it stands; zero once its window has run out. */
export async function readCount(manager: Pick<EntityManager, 'query'>, key: string): Promise<Count> {
  const rows: { hits: number; reset_at: Date }[] = await manager.query(
    `SELECT hits, reset_at FROM rate_limit_counters WHERE key = $1 AND reset_at > now()`,
    [key],
  )
  return rows.length ? { hits: Number(rows[0].hits), resetAt: new Date(rows[0].reset_at) } : { hits: 0, resetAt: new Date() }
}

export async function clearCount(manager: Pick<EntityManager, 'query'>, key: string) {
  await manager.query(`DELETE FROM rate_limit_counters WHERE key = $1`, [key])
}

export const secondsUntil = (when: Date) => Math.max(1, Math.ceil((when.getTime() - Date.now()) / 1000))
