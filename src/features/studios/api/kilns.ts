import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { PriceList } from '../../../../shared/firing/quote'
import type { KilnBody, PriceListBody } from '../../../../shared/schemas/studios'
import { api, ApiError } from '../../../lib/api'
import { studioKeys } from './keys'
import type { ExamplePrice, KilnRecord, KilnWithPrices } from './types'

export function useStudioKilns(studioId: string | undefined) {
  return useQuery({
    queryKey: studioKeys.studios.kilns(studioId ?? ''),
    queryFn: () => api<{ kilns: KilnWithPrices[] }>(`/api/studios/${studioId}/kilns`).then((r) => r.kilns),
    enabled: Boolean(studioId),
  })
}

export function useKiln(kilnId: string | undefined) {
  return useQuery({
    queryKey: studioKeys.kilns.detail(kilnId ?? ''),
    queryFn: () => api<KilnRecord>(`/api/kilns/${kilnId}`),
    enabled: Boolean(kilnId),
  })
}

export function useCreateKiln(studioId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (body: KilnBody) => api<KilnRecord>(`/api/studios/${studioId}/kilns`, { method: 'POST', body }),
    onSuccess: (kiln) => {
      queryClient.setQueryData(studioKeys.kilns.detail(kiln.id), kiln)
      return queryClient.invalidateQueries({ queryKey: studioKeys.studios.kilns(studioId) })
    },
  })
}

export function useUpdateKiln(kilnId: string, studioId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (body: Partial<KilnBody> | Record<string, unknown>) => api<KilnRecord>(`/api/kilns/${kilnId}`, { method: 'PATCH', body }),
    onSuccess: (kiln) => {
      queryClient.setQueryData(studioKeys.kilns.detail(kilnId), kiln)
      return queryClient.invalidateQueries({ queryKey: studioKeys.studios.kilns(studioId) })
    },
  })
}

/** Deletes a kiln that never fired; one with history is retired instead (the server decides). */
export function useRemoveKiln(kilnId: string, studioId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: async (): Promise<'deleted' | 'retired'> => {
      const answer = await api<{ retired: true } | undefined>(`/api/kilns/${kilnId}`, { method: 'DELETE' })
      return answer?.retired ? 'retired' : 'deleted'
    },
    onSuccess: (outcome) => {
      if (outcome === 'deleted') queryClient.removeQueries({ queryKey: studioKeys.kilns.detail(kilnId) })
      else queryClient.invalidateQueries({ queryKey: studioKeys.kilns.detail(kilnId), exact: true })
      return queryClient.invalidateQueries({ queryKey: studioKeys.studios.kilns(studioId) })
    },
  })
}

export interface PriceListAnswer {
  priceList: PriceList
  examplePrices: ExamplePrice[]
}

/** The kiln's price list, or null when the studio has not set one yet. */
export function usePriceList(kilnId: string | undefined) {
  return useQuery({
    queryKey: studioKeys.kilns.priceList(kilnId ?? ''),
    queryFn: async () => {
      try {
        return await api<PriceListAnswer>(`/api/kilns/${kilnId}/price-list`)
      } catch (error) {
        if (error instanceof ApiError && error.status === 404 && error.code === 'not-found') return null
        throw error
      }
    },
    enabled: Boolean(kilnId),
  })
}

export function useSavePriceList(kilnId: string, studioId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (body: PriceListBody) => api<PriceListAnswer>(`/api/kilns/${kilnId}/price-list`, { method: 'PUT', body }),
    onSuccess: (answer) => {
      queryClient.setQueryData(studioKeys.kilns.priceList(kilnId), answer)
      return queryClient.invalidateQueries({ queryKey: studioKeys.studios.kilns(studioId) })
    },
  })
}
