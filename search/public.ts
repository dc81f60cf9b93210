// The search folder's one entry: what the server may use. Everything behind it depends only on
// shared/ and on what the caller hands in (engine settings, rows, a pg pool).
export { ensureFiringsIndex, firingsIndex, firingsIndexCreatedAt, forgetFiringsIndex, searchClient, type EngineConfig } from './client'
export { firingDocument, type FiringDocument, type FiringFacts } from './documents'
export { replaceAllDocuments, writeStudioDocuments } from './engine-writes'
export { searchPostgres, searchStudiosPostgres } from './fallback'
export { distanceKm, engineFilter, engineSort, sqlQuery, type FiringSearch } from './query'
export { FIRING_FACETS, FIRINGS_INDEX, FIRINGS_INDEX_SETTINGS } from './settings'
