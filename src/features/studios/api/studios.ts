import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { StudioCreateBody, StudioPatchBody } from '../../../../shared/schemas/studios'
import { api } from '../../../lib/api'
import { studioKeys } from './keys'
import type { MemberStudio, Studio } from './types'

/** The signed-in person's studios, drafts included, each with their role in it. */
export function useMyStudios() {
  return useQuery({
    queryKey: studioKeys.studios.mine(),
    queryFn: () => api<{ studios: MemberStudio[] }>('/api/studios?mine=true').then((r) => r.studios),
  })
}

/** A studio as the caller may see it: the public side, or the member side for its own people. */
export function useStudio(studioId: string | undefined) {
  return useQuery({
    queryKey: studioKeys.studios.detail(studioId ?? ''),
    queryFn: () => api<Studio>(`/api/studios/${studioId}`),
    enabled: Boolean(studioId),
  })
}

export function useCreateStudio() {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (body: StudioCreateBody) => api<MemberStudio>('/api/studios', { method: 'POST', body }),
    onSuccess: (studio) => {
      queryClient.setQueryData(studioKeys.studios.detail(studio.id), studio)
      return queryClient.invalidateQueries({ queryKey: studioKeys.studios.mine() })
    },
  })
}

export function useUpdateStudio(studioId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (body: StudioPatchBody) => api<MemberStudio>(`/api/studios/${studioId}`, { method: 'PATCH', body }),
    onSuccess: (studio) => {
      queryClient.setQueryData(studioKeys.studios.detail(studioId), studio)
      return queryClient.invalidateQueries({ queryKey: studioKeys.studios.mine() })
    },
  })
}
