import { useQuery } from '@tanstack/react-query'
import { api } from '../../../lib/api'
import { studioKeys } from './keys'

/** How many sent requests wait for the studio's answer, per firing (the requests pages show them). */
export function useWaitingRequests(studioId: string) {
  return useQuery({
    queryKey: [...studioKeys.detail(studioId), 'waiting-requests'],
    queryFn: async () => {
      const { requests } = await api<{ requests: { firing: { id: string } }[] }>(`/api/requests?as=studio&studioId=${studioId}&state=sent`)
      const perFiring = new Map<string, number>()
      for (const request of requests) perFiring.set(request.firing.id, (perFiring.get(request.firing.id) ?? 0) + 1)
      return { total: requests.length, perFiring }
    },
  })
}
