import { keepPreviousData, useQuery } from '@tanstack/react-query'
import type { Place } from '../../../../shared/schemas/places'
import type { BoardResponse } from '../../../../shared/api/board'
import { api } from '../../../lib/api'
import { answerKey, apiQueryString, type SearchState } from '../searchState'
import { searchKeys } from './keys'

/**
 * The firing board for a search: studios with their firings as chips. The view is not part of the
 * key, so switching between the board, the weeks and the map asks nothing again.
 */
export function useFiringBoard(state: SearchState, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: searchKeys.board(answerKey(state)),
    queryFn: ({ signal }) => api<BoardResponse>(`/api/search/board?${apiQueryString(state)}`, { signal }),
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
