import { useQuery } from '@tanstack/react-query'
import type { RequestRow } from '../../../../shared/api/requests'
import { api } from '../../../lib/api'
import { studioKeys } from './keys'

/** How many sent requests wait for the studio's answer, per firing (the requests pages show them). */
export function useWaitingRequests(studioId: string) {
  return useQuery({
    // A request list like any other, so every change to a request refreshes these counts too.
    queryKey: studioKeys.requests.list({ as: 'studio', studioId, state: 'sent' }),
    queryFn: () => api<{ requests: RequestRow[] }>(`/api/requests?as=studio&studioId=${studioId}&state=sent`).then((r) => r.requests),
    select: (requests: RequestRow[]) => {
      const perFiring = new Map<string, number>()
      for (const request of requests) perFiring.set(request.firing.id, (perFiring.get(request.firing.id) ?? 0) + 1)
      return { total: requests.length, perFiring }
    },
  })
}
