// The firing board's answer: one entry per studio, its upcoming firings as dated chips. Written by
// GET /api/search/board, read by the search page; declared once.
import type { SearchHit, SearchResponse } from '../schemas/search'

export type BoardKiln = SearchHit['kiln']

/** One upcoming firing, as a chip on its studio's card. */
export interface BoardFiring {
  firingId: string
  kilnId: string
  cone: string
  atmosphere: string
  kind: string
  dropOffBy: string
  firingDate: string
  readyBy: string
  /** The load plan's room: shelves free for short ware, all its shelves, and the tallest piece it takes. */
  space: SearchHit['space']
  /** The shared quote for the potter's own piece, when they gave its size and the kiln has a price list. */
  piecePrice: { totalCents: number; currency: string } | null
}

export interface BoardStudio {
  studio: SearchHit['studio']
  distanceKm: number | null
  reviews: SearchHit['reviews']
  /** The kilns of the firings found, each once, in the order their first firing comes. */
  kilns: BoardKiln[]
  /** The firings found, in the search's order, at most FIRINGS_PER_STUDIO of them. */
  firings: BoardFiring[]
  /** Firings that match beyond those shown (on the studio's page). */
  moreFirings: number
  /** The example piece's price at this studio's first priced firing, for comparing studios. */
  priceExample: SearchHit['priceExample']
}

export interface BoardResponse {
  studios: BoardStudio[]
  /** Studios that match: pages count studios. */
  total: number
  /** Firings that match, across all those studios. */
  firingTotal: number
  page: number
  perPage: number
  degraded: boolean
  origin: SearchResponse['origin']
  facets: SearchResponse['facets']
  /** Set when the potter gave their piece's size: the chips' prices are for it. */
  piece: { heightMm: number; widthMm: number; depthMm: number | null } | null
}
