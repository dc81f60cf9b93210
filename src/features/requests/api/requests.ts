import { useMutation, useQuery, useQueryClient, type Query } from '@tanstack/react-query'
import type { Piece } from '../../../../shared/firing/check'
import { api } from '../../../lib/api'
import { requestKeys } from './keys'
import type { RequestFilter, RequestMessage, RequestRow, RequestView } from './types'

function listPath(filter: RequestFilter): string {
  const query = new URLSearchParams()
  for (const [key, value] of Object.entries(filter)) if (value) query.set(key, value)
  const qs = query.toString()
  return `/api/requests${qs ? `?${qs}` : ''}`
}

export function useRequests(filter: RequestFilter, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: requestKeys.requests.list(filter),
    queryFn: () => api<{ requests: RequestRow[] }>(listPath(filter)).then((r) => r.requests),
    enabled,
  })
}

/** Milliseconds until the next refetch, or false; decided from the request on hand. */
export type RequestPolling = (view: RequestView | undefined) => number | false

export function useRequest(id: string | undefined, polling?: RequestPolling) {
  return useQuery({
    queryKey: requestKeys.requests.detail(id ?? ''),
    queryFn: () => api<RequestView>(`/api/requests/${id}`),
    enabled: Boolean(id),
    // Other pages move requests along (a firing unloaded moves every request in it): coming back
    // to one shows the cached copy and asks again at once.
    refetchOnMount: 'always',
    refetchInterval: polling ? (query: Query<RequestView>) => polling(query.state.data) : undefined,
  })
}

/**
 * What a change to one request touches: the request itself, every request list, its firing (space
 * held or freed), the studio's firing lists, and the notices it wrote.
 */
export function useRequestChanged() {
  const queryClient = useQueryClient()
  return async (view: Pick<RequestView, 'id' | 'firing'>, full?: RequestView) => {
    if (full) {
      // A read of the request begun before the change would land after it and put the old view back
      // (buttons of the state before, on a busy phone): it is cancelled before the new view goes in.
      await queryClient.cancelQueries({ queryKey: requestKeys.requests.detail(view.id), exact: true })
      queryClient.setQueryData(requestKeys.requests.detail(view.id), full)
    }
    return Promise.all([
      full ? null : queryClient.invalidateQueries({ queryKey: requestKeys.requests.detail(view.id), exact: true }),
      queryClient.invalidateQueries({ queryKey: requestKeys.requests.lists() }),
      queryClient.invalidateQueries({ queryKey: requestKeys.firings.detail(view.firing.id), exact: true }),
      queryClient.invalidateQueries({ queryKey: requestKeys.studios.firings(view.firing.studioId) }),
      queryClient.invalidateQueries({ queryKey: requestKeys.notices }),
    ])
  }
}

/**
 * Every change answers with the request as it now stands: it replaces the cached one at once, and
 * what it touched refreshes in the background (the caller's own onSuccess must not wait on that: the
 * new state may already have taken the caller off the screen).
 */
export function useRequestChange<TVariables>(request: (variables: TVariables) => Promise<RequestView>) {
  const changed = useRequestChanged()
  return useMutation({
    mutationFn: request,
    onSuccess: (view) => {
      void changed(view, view)
    },
  })
}

export interface DraftBody {
  pieces: Piece[]
  notes: string
}

/** Creates the draft the first time, then saves over it. */
export function useSaveDraft(firingId: string) {
  return useRequestChange(({ id, body }: { id: string | null; body: DraftBody }) =>
    id
      ? api<RequestView>(`/api/requests/${id}`, { method: 'PATCH', body })
      : api<RequestView>(`/api/firings/${firingId}/requests`, { method: 'POST', body }),
  )
}

export function useSendRequest() {
  return useRequestChange(({ id, acknowledged, policiesVersion }: { id: string; acknowledged: string[]; policiesVersion: number }) =>
    api<RequestView>(`/api/requests/${id}/send`, { method: 'POST', body: { acknowledged, agreePolicies: true, policiesVersion } }),
  )
}

export function useAcceptRequest() {
  return useRequestChange((id: string) => api<RequestView>(`/api/requests/${id}/accept`, { method: 'POST' }))
}

/** Declines a sent request; on an accepted or paid one it cancels it, refunding the potter in full. */
export function useDeclineRequest() {
  return useRequestChange(({ id, reason }: { id: string; reason: string }) =>
    api<RequestView>(`/api/requests/${id}/decline`, { method: 'POST', body: { reason } }),
  )
}

export function useProposeMove() {
  return useRequestChange(({ id, firingId }: { id: string; firingId: string }) =>
    api<RequestView>(`/api/requests/${id}/move`, { method: 'POST', body: { firingId } }),
  )
}

export function useAnswerMove() {
  return useRequestChange(({ id, accept }: { id: string; accept: boolean }) =>
    api<RequestView>(`/api/requests/${id}/move/${accept ? 'accept' : 'refuse'}`, { method: 'POST' }),
  )
}

export function useWithdrawRequest() {
  return useRequestChange(({ id, reason }: { id: string; reason?: string }) =>
    api<RequestView>(`/api/requests/${id}/withdraw`, { method: 'POST', body: reason ? { reason } : {} }),
  )
}

/** Opens (or reuses) the hosted checkout for the deposit or the balance; the page then leaves for it. */
export function useOpenCheckout() {
  return useMutation({
    mutationFn: ({ id, purpose, keepCard = false }: { id: string; purpose: 'deposit' | 'balance'; keepCard?: boolean }) =>
      api<{ checkoutUrl: string; expiresAt: string }>(`/api/requests/${id}/${purpose}`, {
        method: 'POST',
        body: purpose === 'deposit' ? { keepCard } : undefined,
      }),
  })
}

/** Forgets the card kept at the deposit: it is detached at Stripe and never charged again. */
export function useForgetKeptCard() {
  return useRequestChange(({ id }: { id: string }) => api<RequestView>(`/api/requests/${id}/kept-card`, { method: 'DELETE' }))
}

/** How often an open thread asks for new messages. */
export const THREAD_REFRESH_MS = 10_000

export function useMessages(id: string) {
  return useQuery({
    queryKey: requestKeys.requests.messages(id),
    queryFn: () => api<{ messages: RequestMessage[] }>(`/api/requests/${id}/messages`).then((r) => r.messages),
    refetchInterval: THREAD_REFRESH_MS,
  })
}

export function usePostMessage(id: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (body: string) => api(`/api/requests/${id}/messages`, { method: 'POST', body: { body } }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: requestKeys.requests.messages(id) }),
  })
}
