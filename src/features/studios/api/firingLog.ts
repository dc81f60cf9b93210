// One firing as its studio works it: the firing itself, its log and the requests in it. Status moves
// go through useUpdateFiring, which refreshes all three.
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { FiringLogBody } from '../../../../shared/schemas/pickup'
import type { RequestRow } from '../../../../shared/api/requests'
import type { FiringLogRecord } from '../../../components/firing/FiringLog'
import { api } from '../../../lib/api'
import { studioKeys } from './keys'
import type { FiringRecord } from './types'

export function useFiring(firingId: string) {
  return useQuery({
    queryKey: studioKeys.firings.detail(firingId),
    queryFn: () => api<FiringRecord>(`/api/firings/${firingId}`),
  })
}

/** The log, or null before anything is written (the server answers an empty shell then). */
export function useFiringLog(firingId: string) {
  return useQuery({
    queryKey: studioKeys.firings.log(firingId),
    queryFn: async () => {
      const log = await api<FiringLogRecord | { witnessCones: []; coneCheck: null }>(`/api/firings/${firingId}/log`)
      return 'updatedAt' in log ? log : null
    },
  })
}

export function useSaveFiringLog(firingId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (body: FiringLogBody) => api<FiringLogRecord>(`/api/firings/${firingId}/log`, { method: 'PUT', body }),
    onSuccess: (log) => queryClient.setQueryData(studioKeys.firings.log(firingId), log),
  })
}

/** A request in the firing, as the log page lists them: the request list's rows, cached as that list. */
export type FiringRequestLine = RequestRow

export function useFiringRequests(firingId: string) {
  const filter = { as: 'studio' as const, firingId }
  return useQuery({
    queryKey: studioKeys.requests.list(filter),
    queryFn: () => api<{ requests: RequestRow[] }>(`/api/requests?as=studio&firingId=${firingId}`).then((r) => r.requests),
  })
}
