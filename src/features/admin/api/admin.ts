import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { UserRole } from '../../../../shared/schemas/auth'
import { api } from '../../../lib/api'

export const adminKeys = {
  all: ['admin'] as const,
  studios: () => ['admin', 'studios'] as const,
  users: (q: string) => ['admin', 'users', q] as const,
}

export interface DeskStudio {
  id: string
  name: string
  city: string
  region: string
  published: boolean
  verified: boolean
  createdAt: string
  kilns: number
  upcomingFirings: number
  owners: { name: string; email: string }[] | null
}

export interface DeskUser {
  id: string
  email: string
  displayName: string
  role: UserRole
  suspended: boolean
  createdAt: string
}

export function useDeskStudios() {
  return useQuery({ queryKey: adminKeys.studios(), queryFn: () => api<{ studios: DeskStudio[] }>('/api/admin/studios') })
}

export function useDeskUsers(q: string) {
  return useQuery({
    queryKey: adminKeys.users(q),
    queryFn: () => api<{ users: DeskUser[] }>(`/api/admin/users?q=${encodeURIComponent(q)}`),
  })
}

export function useVerifyStudio() {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: ({ id, verified }: { id: string; verified: boolean }) =>
      api(`/api/studios/${id}/verify`, { method: 'POST', body: { verified } }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: adminKeys.studios() }),
  })
}

export function useSuspendUser() {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: ({ id, suspended }: { id: string; suspended: boolean }) =>
      api(`/api/admin/users/${id}/suspend`, { method: 'POST', body: { suspended } }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: [...adminKeys.all, 'users'] }),
  })
}

export interface DisputedRequest {
  id: string
  potterName: string
  updatedAt: string
  quote: { totalCents: number; depositCents: number; currency: string } | null
  firing: { firingDate: string; cone: string; atmosphere: string; kind: string; kilnName: string }
  studio: { id: string; name: string; timezone: string }
}

export function useDisputes() {
  return useQuery({ queryKey: [...adminKeys.all, 'disputes'], queryFn: () => api<{ requests: DisputedRequest[] }>('/api/admin/disputes') })
}

export function useDeskRefund() {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: ({ id, amountCents, reason }: { id: string; amountCents: number; reason: string }) =>
      api(`/api/admin/requests/${id}/refund`, { method: 'POST', body: { amountCents, reason } }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: [...adminKeys.all, 'disputes'] }),
  })
}
