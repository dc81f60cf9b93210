import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { FiringCreateBody, FiringPatchBody } from '../../../../shared/schemas/studios'
import { api } from '../../../lib/api'
import { studioKeys, type FiringWindow } from './keys'
import type { FiringRecord } from './types'

/** A studio's firings in a window; members see every status, the public the upcoming open ones. */
export function useStudioFirings(studioId: string | undefined, window: FiringWindow) {
  return useQuery({
    queryKey: studioKeys.firingsIn(studioId ?? '', window),
    queryFn: () => {
      const query = new URLSearchParams()
      if (window.from) query.set('from', window.from)
      if (window.to) query.set('to', window.to)
      if (window.includeCancelled) query.set('includeCancelled', 'true')
      const qs = query.toString()
      return api<{ firings: FiringRecord[] }>(`/api/studios/${studioId}/firings${qs ? `?${qs}` : ''}`).then((r) => r.firings)
    },
    enabled: Boolean(studioId),
    placeholderData: keepPreviousData,
  })
}

/** One firing, or a series of them ("repeat"); the server answers with every firing it made. */
export function useCreateFirings(studioId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: ({ kilnId, body }: { kilnId: string; body: FiringCreateBody }) =>
      api<{ firings: FiringRecord[] }>(`/api/kilns/${kilnId}/firings`, { method: 'POST', body }).then((r) => r.firings),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: studioKeys.firings(studioId) }),
  })
}

export function useUpdateFiring(studioId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: ({ firingId, body }: { firingId: string; body: FiringPatchBody }) =>
      api<FiringRecord>(`/api/firings/${firingId}`, { method: 'PATCH', body }),
    // A status move can move every request in the firing (loading lapses no-shows, unloading fires the rest).
    onSuccess: (firing) => {
      queryClient.setQueryData(studioKeys.firing(firing.id), firing)
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: studioKeys.firings(studioId) }),
        queryClient.invalidateQueries({ queryKey: studioKeys.firingRequests(firing.id) }),
      ])
    },
  })
}

export function useCancelFiring(studioId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: ({ firingId, reason }: { firingId: string; reason: string }) =>
      api<FiringRecord & { cancelledRequests: number }>(`/api/firings/${firingId}/cancel`, { method: 'POST', body: { reason } }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: studioKeys.firings(studioId) }),
  })
}
