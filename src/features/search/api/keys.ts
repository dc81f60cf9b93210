// One key factory for finding a firing: results are keyed by the normalised query string, so two
// spellings of the same search share one cache entry.

export const searchKeys = {
  all: ['search'] as const,
  results: (query: string) => ['search', 'results', query] as const,
  board: (query: string) => ['search', 'board', query] as const,
  places: (text: string) => ['search', 'places', text] as const,
}
