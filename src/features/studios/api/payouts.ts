import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { StudioPayoutsJson } from '../../../../shared/api/payouts'
import { api } from '../../../lib/api'
import { studioKeys } from './keys'

/** The studio's money: payout account, balance, transfers, bank payouts, each firing and month. Owner only. */
export function useStudioPayouts(studioId: string) {
  return useQuery({
    queryKey: studioKeys.studios.payouts(studioId),
    queryFn: () => api<StudioPayoutsJson>(`/api/studios/${studioId}/payouts`),
  })
}

/** Opens Stripe's hosted onboarding for the studio's payout account: the browser goes there. */
export function useStartOnboarding(studioId: string) {
  return useMutation({
    mutationFn: () => api<{ url: string }>(`/api/studios/${studioId}/payouts/onboarding`, { method: 'POST' }),
    onSuccess: ({ url }) => window.location.assign(url),
  })
}

/** Back from onboarding: asks Stripe for the account as it is now and shows the result. */
export function useRefreshPayouts(studioId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: () => api<StudioPayoutsJson>(`/api/studios/${studioId}/payouts/refresh`, { method: 'POST' }),
    onSuccess: (fresh) => queryClient.setQueryData(studioKeys.studios.payouts(studioId), fresh),
  })
}

export const statementUrl = (studioId: string, period: string) => `/api/studios/${studioId}/statements/${period}.csv`
