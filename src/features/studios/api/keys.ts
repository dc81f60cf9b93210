// The studio feature reads the shared key tree (src/lib/queryKeys.ts), so a firing fetched here and
// on a request page is one cache entry.
export { keys as studioKeys, type FiringWindow } from '../../../lib/queryKeys'
