import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { FiringCreateBody, FiringPatchBody } from '../../../../shared/schemas/studios'
import type { FiringStatus } from '../../../../shared/workflow/firing-status'
import { api } from '../../../lib/api'
import { studioKeys, type FiringWindow } from './keys'
import type { FiringRecord } from './types'

/** A studio's firings in a window; members see every status, the public the upcoming open ones. */
export function useStudioFirings(studioId: string | undefined, window: FiringWindow) {
  return useQuery({
    queryKey: studioKeys.studios.firingsIn(studioId ?? '', window),
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
    onSuccess: () => queryClient.invalidateQueries({ queryKey: studioKeys.studios.firings(studioId) }),
  })
}

/** A firing as it now stands replaces the cached one; every list of the studio's firings refreshes. */
function useFiringChanged(studioId: string) {
  const queryClient = useQueryClient()
  return (firing: FiringRecord, { requestsMoved }: { requestsMoved: boolean }) => {
    queryClient.setQueryData(studioKeys.firings.detail(firing.id), firing)
    return Promise.all([
      queryClient.invalidateQueries({ queryKey: studioKeys.studios.firings(studioId) }),
      // A stage move can move every request in the firing (loading lapses what still waits, unloading
      // fires the rest), and tells people: requests and notices are read again.
      ...(requestsMoved
        ? [
            queryClient.invalidateQueries({ queryKey: studioKeys.requests.all }),
            queryClient.invalidateQueries({ queryKey: studioKeys.notices }),
          ]
        : []),
    ])
  }
}

export function useUpdateFiring(studioId: string) {
  const changed = useFiringChanged(studioId)
  return useMutation({
    mutationFn: ({ firingId, body }: { firingId: string; body: FiringPatchBody }) =>
      api<FiringRecord>(`/api/firings/${firingId}`, { method: 'PATCH', body }),
    onSuccess: (firing) => changed(firing, { requestsMoved: false }),
  })
}

/**
 * Moves a firing to another stage. The server answers 409 `needs-confirmation` with its question (a
 * date ahead, requests that will lapse) until the move is sent again with `confirm`.
 */
export function useMoveFiring(studioId: string) {
  const changed = useFiringChanged(studioId)
  return useMutation({
    mutationFn: ({ firingId, status, confirm }: { firingId: string; status: FiringStatus; confirm?: boolean }) =>
      api<FiringRecord>(`/api/firings/${firingId}/stage`, { method: 'POST', body: { status, ...(confirm ? { confirm } : {}) } }),
    onSuccess: (firing) => changed(firing, { requestsMoved: true }),
  })
}

/** Takes back the last stage move within its undo window. */
export function useUndoFiringMove(studioId: string) {
  const changed = useFiringChanged(studioId)
  return useMutation({
    mutationFn: (firingId: string) => api<FiringRecord>(`/api/firings/${firingId}/undo`, { method: 'POST' }),
    onSuccess: (firing) => changed(firing, { requestsMoved: true }),
  })
}

export function useCancelFiring(studioId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: ({ firingId, reason }: { firingId: string; reason: string }) =>
      api<FiringRecord & { cancelledRequests: number }>(`/api/firings/${firingId}/cancel`, { method: 'POST', body: { reason } }),
    onSuccess: (firing) =>
      Promise.all([
        queryClient.setQueryData(studioKeys.firings.detail(firing.id), firing),
        queryClient.invalidateQueries({ queryKey: studioKeys.studios.firings(studioId) }),
        queryClient.invalidateQueries({ queryKey: studioKeys.requests.all }),
        queryClient.invalidateQueries({ queryKey: studioKeys.notices }),
      ]),
  })
}
