import { keepPreviousData, useQuery } from '@tanstack/react-query'
import type { Place } from '../../../../shared/schemas/places'
import type { SearchResponse } from '../../../../shared/schemas/search'
import { api } from '../../../lib/api'
import { apiQueryString, searchString, type SearchState } from '../searchState'
import { searchKeys } from './keys'

/**
 * Open firings for a search. While the next answer loads, the last one stays on screen
 * (`isPlaceholderData`), so the list and the map do not blink empty between pages.
 */
export function useFiringSearch(state: SearchState, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: searchKeys.results(searchString(state)),
    queryFn: ({ signal }) => api<SearchResponse>(`/api/search?${apiQueryString(state)}`, { signal }),
    placeholderData: keepPreviousData,
    enabled,
  })
}

/** Towns and postcodes that complete what the potter has typed. */
export function usePlaceSuggestions(text: string) {
  const q = text.trim()
  return useQuery<Place[]>({
    queryKey: searchKeys.places(q.toLowerCase()),
    queryFn: ({ signal }) =>
      api<{ places: Place[] }>(`/api/places?${new URLSearchParams({ q, limit: '6' })}`, { signal }).then((r) => r.places),
    enabled: q.length >= 2,
    staleTime: 5 * 60_000,
    placeholderData: keepPreviousData,
  })
}
