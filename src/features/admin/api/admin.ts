import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { DeskAccountList, DeskDispute, DeskStudioList } from '../../../../shared/api/admin'
import type { RequestMessageJson, RequestView } from '../../../../shared/api/requests'
import type { DeskAccountsQuery, DeskStudiosQuery } from '../../../../shared/schemas/admin'
import { api } from '../../../lib/api'
import { keys } from '../../../lib/queryKeys'

/** The query string of a desk list: only what is set, so the server's defaults speak for the rest. */
export function deskSearch(query: Partial<DeskStudiosQuery> | Partial<DeskAccountsQuery>): string {
  const params = new URLSearchParams()
  for (const [name, value] of Object.entries(query)) if (value !== undefined && value !== '') params.set(name, String(value))
  return params.toString()
}

export function useDeskStudios(query: DeskStudiosQuery) {
  return useQuery({
    queryKey: keys.desk.studioPage(query),
    queryFn: () => api<DeskStudioList>(`/api/admin/studios?${deskSearch(query)}`),
    // The table keeps the last page on screen while the next one loads, so it does not jump.
    placeholderData: keepPreviousData,
  })
}

export function useDeskAccounts(query: DeskAccountsQuery) {
  return useQuery({
    queryKey: keys.desk.accountPage(query),
    queryFn: () => api<DeskAccountList>(`/api/admin/users?${deskSearch(query)}`),
    placeholderData: keepPreviousData,
  })
}

export function useVerifyStudio() {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: ({ id, verified }: { id: string; verified: boolean }) =>
      api(`/api/studios/${id}/verify`, { method: 'POST', body: { verified } }),
    onSuccess: (_answer, { id }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: keys.desk.studios() }),
        queryClient.invalidateQueries({ queryKey: keys.studios.detail(id) }),
      ]),
  })
}

export function useSuspendAccount() {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: ({ id, suspended }: { id: string; suspended: boolean }) =>
      api(`/api/admin/users/${id}/suspend`, { method: 'POST', body: { suspended } }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: keys.desk.accounts() }),
  })
}

export function useDisputes() {
  return useQuery({ queryKey: keys.desk.disputes(), queryFn: () => api<{ requests: DeskDispute[] }>('/api/admin/disputes') })
}

/** The whole record of a disputed request: the desk reads the same view and messages as either side. */
export function useDisputeRecord(id: string | null) {
  const view = useQuery({
    queryKey: keys.requests.detail(id ?? ''),
    queryFn: () => api<RequestView>(`/api/requests/${id}`),
    enabled: id !== null,
  })
  const messages = useQuery({
    queryKey: keys.requests.messages(id ?? ''),
    queryFn: () => api<{ messages: RequestMessageJson[] }>(`/api/requests/${id}/messages`),
    enabled: id !== null,
  })
  return { view, messages }
}

export function useDeskRefund() {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: ({ id, amountCents, reason }: { id: string; amountCents: number; reason: string }) =>
      api(`/api/admin/requests/${id}/refund`, { method: 'POST', body: { amountCents, reason } }),
    onSuccess: (_answer, { id }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: keys.desk.disputes() }),
        queryClient.invalidateQueries({ queryKey: keys.requests.detail(id) }),
      ]),
  })
}
