import type { EntityManager } from 'typeorm'
import { bayesianScore, type RatingSummary } from '../../shared/ratings'

/** Each studio's potter ratings as mean, count and ranking score; studios with none are absent. */
export async function studioRatings(manager: EntityManager, studioIds: string[]): Promise<Map<string, RatingSummary>> {
  const result = new Map<string, RatingSummary>()
  if (!studioIds.length) return result
  const rows: { studio_id: string; total: number; count: number }[] = await manager.query(
    `SELECT studio_id, sum(stars)::float8 AS total, count(*)::int AS count FROM ratings
     WHERE direction = 'potter-rates-studio' AND studio_id = ANY($1::uuid[]) GROUP BY studio_id`,
    [studioIds],
  )
  for (const row of rows)
    result.set(row.studio_id, { mean: row.total / row.count, count: row.count, score: bayesianScore(row.total, row.count) })
  return result
}
