// The firing board: search hits grouped by studio, one card per studio with its firings as chips.
// Pure, so the server's two search paths (engine and PostgreSQL) group the same way.
import type { BoardFiring, BoardStudio } from '../api/board'
import type { Piece } from '../firing/check'
import { EXAMPLE_MUG } from '../firing/examples'
import type { SearchHit } from '../schemas/search'

/** Chips on one card; eight weeks of a weekly bisque and glaze fit, more are on the studio's page. */
export const FIRINGS_PER_STUDIO = 16

export type BoardHit = SearchHit & { piecePrice: BoardFiring['piecePrice'] }

/**
 * One card per studio, in the order the page of studios came in (each studio ranked by its best
 * firing). `hits` are the firings of those studios in the search's order; `counts` how many match
 * per studio in all, when the caller knows more match than it fetched.
 */
export function groupByStudio(
  studioIds: readonly string[],
  hits: readonly BoardHit[],
  counts: ReadonlyMap<string, number> = new Map(),
): BoardStudio[] {
  const byStudio = new Map<string, BoardHit[]>(studioIds.map((id) => [id, []]))
  for (const hit of hits) byStudio.get(hit.studio.id)?.push(hit)
  const cards: BoardStudio[] = []
  for (const [studioId, found] of byStudio) {
    if (found.length === 0) continue
    const shown = found.slice(0, FIRINGS_PER_STUDIO)
    const kilns = new Map<string, SearchHit['kiln']>()
    for (const hit of found) if (!kilns.has(hit.kiln.id)) kilns.set(hit.kiln.id, hit.kiln)
    const first = found[0]
    cards.push({
      studio: first.studio,
      distanceKm: first.distanceKm,
      reviews: first.reviews,
      kilns: [...kilns.values()],
      firings: shown.map((hit) => ({
        firingId: hit.firingId,
        kilnId: hit.kiln.id,
        cone: hit.cone,
        atmosphere: hit.atmosphere,
        kind: hit.kind,
        dropOffBy: hit.dropOffBy,
        firingDate: hit.firingDate,
        readyBy: hit.readyBy,
        space: hit.space,
        piecePrice: hit.piecePrice,
      })),
      moreFirings: Math.max(0, (counts.get(studioId) ?? found.length) - shown.length),
      priceExample: found.find((hit) => hit.priceExample)?.priceExample ?? null,
    })
  }
  return cards
}

/**
 * The potter's own piece as the search's size filter gives it (one width and no depth is a round
 * piece, as the filter reads it), for the shared quote. Wall and state are the example mug's: only
 * size moves a price, apart from surcharges the potter settles when they ask for space.
 */
export function pieceOfSearch(fits: { heightMm: number | null; widthMm: number | null; depthMm: number | null }): Piece | null {
  if (fits.heightMm === null || fits.widthMm === null) return null
  return {
    ...EXAMPLE_MUG,
    label: 'Your piece',
    heightMm: fits.heightMm,
    widthMm: fits.widthMm,
    depthMm: fits.depthMm ?? fits.widthMm,
    round: fits.depthMm === null,
  }
}
