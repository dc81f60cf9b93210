// The search index: which attributes are searched, filtered and sorted on, and how hits rank.
import type { Settings } from 'meilisearch'

export const FIRINGS_INDEX = 'firings'

export const FIRINGS_INDEX_SETTINGS: Settings = {
  searchableAttributes: ['studioName', 'studioCity', 'kilnName', 'notes', 'studioRegion'],
  filterableAttributes: [
    // id and studioId: the sync deletes a studio's stale documents by filter.
    'id',
    '_geo',
    'studioId',
    'cone',
    'coneRank',
    'atmosphere',
    'kind',
    'kilnKind',
    'dropOffByTs',
    'firingDateTs',
    'spaceLeftShelves',
    'roomTallestMm',
    'usableHeightMm',
    'shelfShape',
    'shelfDiameterMm',
    'shelfWidthMm',
    'shelfDepthMm',
    'verified',
  ],
  sortableAttributes: ['_geo', 'dropOffByTs', 'firingDateTs', 'priceExampleCents', 'ratingScore', 'spaceLeftShelves'],
  // Meilisearch's default order, with the requested sort ahead of the finer text rules: a potter who
  // asks for "nearest" or "soonest" means it, once the words match.
  rankingRules: ['words', 'sort', 'typo', 'proximity', 'attribute', 'exactness'],
  pagination: { maxTotalHits: 5000 },
}

/** Facets the page shows counts for. */
export const FIRING_FACETS = ['atmosphere', 'kind', 'cone', 'kilnKind'] as const
