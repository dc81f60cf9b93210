// The PostgreSQL answer to a search, used when the engine is unreachable: same filters, same order,
// same response shape, from the search_documents table, in one statement (hits, total and facet
// counts from one pass over the matching rows).
import { createHash } from 'node:crypto'
import type { Pool } from 'pg'
import type { FiringDocument } from './documents'
import { sqlQuery, type FiringSearch } from './query'
import { FIRING_FACETS } from './settings'

const FACET_COLUMN: Record<(typeof FIRING_FACETS)[number], string> = {
  atmosphere: 'atmosphere',
  kind: 'kind',
  cone: 'cone',
  kilnKind: 'kiln_kind',
}

/**
 * Runs on the pool directly as a named (prepared) statement: the text depends only on which filters
 * are used, so each shape is planned once per connection instead of on every search.
 */
export async function searchPostgres(pool: Pool, search: FiringSearch) {
  const { where, params, distance, distanceWhere, orderBy } = sqlQuery(search)
  const offset = (search.page - 1) * search.perPage
  const facetJson = FIRING_FACETS.map(
    (facet) =>
      `'${facet}', (SELECT coalesce(json_object_agg(value, n), '{}'::json) FROM (SELECT ${FACET_COLUMN[facet]} AS value, count(*) AS n FROM hits GROUP BY 1) f)`,
  ).join(', ')
  const text = `WITH hits AS MATERIALIZED (
       SELECT * FROM (
         SELECT firing_id, atmosphere, kind, cone, kiln_kind, drop_off_by_ts, firing_date_ts, price_example_cents, rating_score, ${distance ?? 'NULL::float8'} AS dist
         FROM search_documents WHERE ${where}
       ) candidates ${distanceWhere ? `WHERE ${distanceWhere}` : ''}
     ),
     page AS (SELECT firing_id, row_number() OVER (ORDER BY ${orderBy}) AS ord FROM hits ORDER BY ${orderBy} LIMIT ${search.perPage} OFFSET ${offset})
     SELECT
       (SELECT json_agg(json_build_object('document', d.document) ORDER BY p.ord) FROM page p JOIN search_documents d ON d.firing_id = p.firing_id) AS page,
       (SELECT count(*)::int FROM hits) AS total,
       json_build_object(${facetJson}) AS facets`
  const name = `search-${createHash('sha1').update(text).digest('hex').slice(0, 16)}`
  const { rows } = await pool.query<{
    page: { document: FiringDocument }[] | null
    total: number
    facets: Record<string, Record<string, number>>
  }>({ name, text, values: params })
  const row = rows[0]
  return { documents: (row.page ?? []).map((r) => r.document), total: row.total, facets: row.facets }
}

/**
 * The board's question over search_documents: a page of studios, each ranked by its best firing in
 * the search's order, and up to `perStudio` firings of each, in one statement.
 */
export async function searchStudiosPostgres(pool: Pool, search: FiringSearch, perStudio: number) {
  const { where, params, distance, distanceWhere, orderBy } = sqlQuery(search)
  const offset = (search.page - 1) * search.perPage
  const facetJson = FIRING_FACETS.map(
    (facet) =>
      `'${facet}', (SELECT coalesce(json_object_agg(value, n), '{}'::json) FROM (SELECT ${FACET_COLUMN[facet]} AS value, count(*) AS n FROM hits GROUP BY 1) f)`,
  ).join(', ')
  const text = `WITH hits AS MATERIALIZED (
       SELECT * FROM (
         SELECT firing_id, studio_id, atmosphere, kind, cone, kiln_kind, drop_off_by_ts, firing_date_ts, price_example_cents, rating_score, ${distance ?? 'NULL::float8'} AS dist
         FROM search_documents WHERE ${where}
       ) candidates ${distanceWhere ? `WHERE ${distanceWhere}` : ''}
     ),
     ranked AS MATERIALIZED (SELECT firing_id, studio_id, row_number() OVER (ORDER BY ${orderBy}, firing_id) AS ord FROM hits),
     studio_ranks AS (SELECT studio_id, min(ord) AS best, count(*)::int AS n FROM ranked GROUP BY studio_id),
     page AS (SELECT studio_id, best, n FROM studio_ranks ORDER BY best LIMIT ${search.perPage} OFFSET ${offset}),
     shown AS (
       SELECT r.firing_id, r.ord FROM (SELECT ranked.*, row_number() OVER (PARTITION BY ranked.studio_id ORDER BY ranked.ord) AS nth FROM ranked JOIN page USING (studio_id)) r
       WHERE r.nth <= ${perStudio}
     )
     SELECT
       (SELECT json_agg(json_build_object('studioId', p.studio_id, 'count', p.n) ORDER BY p.best) FROM page p) AS studios,
       (SELECT json_agg(d.document ORDER BY s.ord) FROM shown s JOIN search_documents d ON d.firing_id = s.firing_id) AS firings,
       (SELECT count(*)::int FROM studio_ranks) AS total,
       (SELECT count(*)::int FROM hits) AS firing_total,
       json_build_object(${facetJson}) AS facets`
  const name = `board-${createHash('sha1').update(text).digest('hex').slice(0, 16)}`
  const { rows } = await pool.query<{
    studios: { studioId: string; count: number }[] | null
    firings: FiringDocument[] | null
    total: number
    firing_total: number
    facets: Record<string, Record<string, number>>
  }>({ name, text, values: params })
  const row = rows[0]
  const studios = row.studios ?? []
  return {
    studioIds: studios.map((s) => s.studioId),
    counts: new Map(studios.map((s) => [s.studioId, s.count])),
    documents: row.firings ?? [],
    total: row.total,
    firingTotal: row.firing_total,
    facets: row.facets,
  }
}
