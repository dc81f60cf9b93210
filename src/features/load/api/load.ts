// A firing's load plan and pieces by their tags: read, the crew's moves saved (the server re-checks
// the whole plan), and a piece's result posted at unloading.
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { LoadPlanJson, PieceView } from '../../../../shared/api/load'
import type { LoadPlanBody, PieceResultBody } from '../../../../shared/schemas/pieces'
import { api } from '../../../lib/api'
import { keys } from '../../../lib/queryKeys'

export type { LoadPlanJson, PieceView }

export function useLoadPlan(firingId: string) {
  return useQuery({
    queryKey: keys.firings.load(firingId),
    queryFn: () => api<LoadPlanJson>(`/api/firings/${firingId}/load-plan`),
    enabled: Boolean(firingId),
    refetchOnMount: 'always',
  })
}

/** Saves the crew's placements; the answer is the plan as the server re-planned it around them. */
export function useSaveLoadPlan(firingId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (body: LoadPlanBody) => api<LoadPlanJson>(`/api/firings/${firingId}/load-plan`, { method: 'PUT', body }),
    onSuccess: (plan) => {
      queryClient.setQueryData(keys.firings.load(firingId), plan)
      void queryClient.invalidateQueries({ queryKey: keys.pieces.all })
    },
  })
}

export function usePiece(tag: string) {
  return useQuery({
    queryKey: keys.pieces.detail(tag),
    queryFn: () => api<PieceView>(`/api/pieces/${encodeURIComponent(tag)}`),
    enabled: Boolean(tag),
    retry: false,
  })
}

/** A piece's result: the piece, its request (counts, results) and its firing's load read again. */
export function usePostPieceResult(tag: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (body: PieceResultBody) => api<PieceView>(`/api/pieces/${encodeURIComponent(tag)}/result`, { method: 'POST', body }),
    onSuccess: (piece) => {
      queryClient.setQueryData(keys.pieces.detail(piece.tag), piece)
      void queryClient.invalidateQueries({ queryKey: keys.requests.detail(piece.request.id) })
      void queryClient.invalidateQueries({ queryKey: keys.requests.lists() })
      void queryClient.invalidateQueries({ queryKey: keys.firings.load(piece.firing.id) })
    },
  })
}

/** Holds a piece back before loading, or takes it in again. */
export function useHoldPiece(tag: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (change: { hold: true; reason: string } | { hold: false }) =>
      change.hold
        ? api<PieceView>(`/api/pieces/${encodeURIComponent(tag)}/hold`, { method: 'POST', body: { reason: change.reason } })
        : api<PieceView>(`/api/pieces/${encodeURIComponent(tag)}/release`, { method: 'POST' }),
    onSuccess: (piece) => {
      queryClient.setQueryData(keys.pieces.detail(piece.tag), piece)
      void queryClient.invalidateQueries({ queryKey: keys.requests.detail(piece.request.id) })
      void queryClient.invalidateQueries({ queryKey: keys.firings.load(piece.firing.id) })
    },
  })
}
