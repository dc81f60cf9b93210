// What a request is made against: the firing, its kiln and price list, the studio and its other
// firings (for a proposed move). Read-only here; the studio feature edits them.
import { useQuery } from '@tanstack/react-query'
import { api, ApiError } from '../../../lib/api'
import { requestKeys } from './keys'
import type { FiringRecord, KilnRecord, PriceListAnswer, StudioRecord } from './types'

export function useFiring(firingId: string | undefined) {
  return useQuery({
    queryKey: requestKeys.firings.detail(firingId ?? ''),
    queryFn: () => api<FiringRecord>(`/api/firings/${firingId}`),
    enabled: Boolean(firingId),
  })
}

export function useKiln(kilnId: string | undefined) {
  return useQuery({
    queryKey: requestKeys.kilns.detail(kilnId ?? ''),
    queryFn: () => api<KilnRecord>(`/api/kilns/${kilnId}`),
    enabled: Boolean(kilnId),
  })
}

/** The kiln's price list, or null when the studio has not set one (prices on request). */
export function usePriceList(kilnId: string | undefined) {
  return useQuery({
    queryKey: requestKeys.kilns.priceList(kilnId ?? ''),
    queryFn: async () => {
      try {
        return (await api<PriceListAnswer>(`/api/kilns/${kilnId}/price-list`)).priceList
      } catch (error) {
        if (error instanceof ApiError && error.status === 404) return null
        throw error
      }
    },
    enabled: Boolean(kilnId),
  })
}

export function useStudio(studioId: string | undefined) {
  return useQuery({
    queryKey: requestKeys.studios.detail(studioId ?? ''),
    queryFn: () => api<StudioRecord>(`/api/studios/${studioId}`),
    enabled: Boolean(studioId),
  })
}

/** The studio's coming firings (members see every status; the page keeps the open ones). */
export function useStudioFirings(studioId: string | undefined, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: requestKeys.studios.firingsIn(studioId ?? '', { from: 'upcoming' }),
    queryFn: () =>
      api<{ firings: FiringRecord[] }>(`/api/studios/${studioId}/firings?from=${encodeURIComponent(new Date().toISOString())}`).then(
        (r) => r.firings,
      ),
    enabled: Boolean(studioId) && enabled,
  })
}
