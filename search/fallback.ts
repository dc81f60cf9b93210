// The PostgreSQL answer to a search, used when the engine is unreachable: same filters, same order,
// same response shape, from the search_documents table.
import type { EntityManager } from 'typeorm'
import type { FiringDocument } from './documents'
import { sqlQuery, type FiringSearch } from './query'
import { FIRING_FACETS } from './settings'

const FACET_COLUMN: Record<(typeof FIRING_FACETS)[number], string> = {
  atmosphere: 'atmosphere',
  kind: 'kind',
  cone: `document->>'cone'`,
  kilnKind: `document->>'kilnKind'`,
}

export async function searchPostgres(manager: EntityManager, search: FiringSearch) {
  const { where, params, orderBy } = sqlQuery(search)
  const offset = (search.page - 1) * search.perPage
  const rows: { document: FiringDocument }[] = await manager.query(
    `SELECT document FROM search_documents WHERE ${where} ORDER BY ${orderBy} LIMIT ${search.perPage} OFFSET ${offset}`,
    params,
  )
  const facetRows: { facet: string; value: string; count: number }[] = await manager.query(
    [
      `WITH hits AS (SELECT * FROM search_documents WHERE ${where})`,
      `SELECT '__total' AS facet, '' AS value, count(*)::int AS count FROM hits`,
      ...FIRING_FACETS.map((facet) => `UNION ALL SELECT '${facet}', ${FACET_COLUMN[facet]}, count(*)::int FROM hits GROUP BY 2`),
    ].join(' '),
    // The ORDER BY parameters are not used here; only the WHERE ones.
    params.slice(0, countPlaceholders(where)),
  )
  const facets: Record<string, Record<string, number>> = Object.fromEntries(FIRING_FACETS.map((f) => [f, {}]))
  let total = 0
  for (const row of facetRows) {
    if (row.facet === '__total') total = row.count
    else facets[row.facet][row.value] = row.count
  }
  return { documents: rows.map((r) => r.document), total, facets }
}

function countPlaceholders(sql: string): number {
  let max = 0
  for (const match of sql.matchAll(/\$(\d+)/g)) max = Math.max(max, Number(match[1]))
  return max
}
