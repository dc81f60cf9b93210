import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import { api } from '../../../lib/api'
import { authKeys } from '../../auth/api/auth'
import { studioKeys } from './keys'
import type { CrewInvite, CrewMember, InviteDetails } from './types'

export function useCrew(studioId: string | undefined) {
  return useQuery({
    queryKey: studioKeys.studios.crew(studioId ?? ''),
    queryFn: () => api<{ members: CrewMember[]; invites: CrewInvite[] }>(`/api/studios/${studioId}/crew`),
    enabled: Boolean(studioId),
  })
}

export function useInviteCrew(studioId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (body: { email: string }) => api<{ email: string }>(`/api/studios/${studioId}/invites`, { method: 'POST', body }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: studioKeys.studios.crew(studioId) }),
  })
}

export function useWithdrawInvite(studioId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (inviteId: string) => api(`/api/studios/${studioId}/invites/${inviteId}`, { method: 'DELETE' }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: studioKeys.studios.crew(studioId) }),
  })
}

export function useRemoveCrewMember(studioId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (memberId: string) => api(`/api/studios/${studioId}/crew/${memberId}`, { method: 'DELETE' }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: studioKeys.studios.crew(studioId) }),
  })
}

/** What an invitation link is for; asked without signing in. */
export function useInviteLookup(token: string | null) {
  return useQuery({
    queryKey: studioKeys.studios.invite(token ?? ''),
    queryFn: () => api<InviteDetails>('/api/invites/lookup', { method: 'POST', body: { token } }),
    enabled: Boolean(token && token.length >= 10),
    staleTime: Infinity,
  })
}

/** Joins the signed-in person to the studio; their own account (its studio list) changes. */
export function useAcceptInvite() {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (token: string) => api<{ studioId: string }>('/api/invites/accept', { method: 'POST', body: { token } }),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: authKeys.me }),
        queryClient.invalidateQueries({ queryKey: studioKeys.studios.mine() }),
      ]),
  })
}
