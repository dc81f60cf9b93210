// From drop-off to pickup: check-in, the changed price, results, ready, the balance, pickup, the
// answers after pickup and photos. Every change that answers with the request puts it in the cache;
// the rest refetch the request they touched.
import { useMutation, useQueryClient } from '@tanstack/react-query'
import type { z } from 'zod'
import type { checkInSchema, resultsSchema, reviewSchema } from '../../../../shared/schemas/pickup'
import type { PieceTagged } from '../../../../shared/api/load'
import type { PieceTagBody } from '../../../../shared/schemas/pieces'
import type { PhotoRecord } from '../../../components/photos/photoTypes'
import { api } from '../../../lib/api'
import { requestKeys } from './keys'
import { useRequestChange, useRequestChanged } from './requests'
import type { CheckInOutcome, RequestReviews, RequestView } from './types'

export type CheckInBody = z.infer<typeof checkInSchema>
export type ResultsBody = z.infer<typeof resultsSchema>
export type ReviewBody = z.input<typeof reviewSchema>

/** The check-in's answer is kept under this key, so the page can show the findings after the form has gone. */
export const checkInMutationKey = (id: string) => ['requests', 'detail', id, 'check-in'] as const

export function useCheckIn(id: string) {
  const changed = useRequestChanged()
  return useMutation({
    mutationKey: checkInMutationKey(id),
    mutationFn: (body: CheckInBody) => api<CheckInOutcome>(`/api/requests/${id}/check-in`, { method: 'POST', body }),
    onSuccess: (outcome) => {
      void changed(outcome.request, outcome.request)
    },
  })
}

export function useConfirmPrice() {
  return useRequestChange((id: string) => api<RequestView>(`/api/requests/${id}/confirm-price`, { method: 'POST' }))
}

/** Turning the measured price down withdraws the request; everything paid comes back. */
export function useDeclinePrice() {
  return useRequestChange((id: string) => api<RequestView>(`/api/requests/${id}/price/decline`, { method: 'POST' }))
}

/** The studio marks money taken at its counter as handed back. */
export function useMarkHandedBack() {
  return useRequestChange(({ id, refundId }: { id: string; refundId: string }) =>
    api<RequestView>(`/api/requests/${id}/counter-refunds/${refundId}/paid`, { method: 'POST' }),
  )
}

export function usePostResults() {
  return useRequestChange(({ id, body }: { id: string; body: ResultsBody }) =>
    api<RequestView>(`/api/requests/${id}/results`, { method: 'POST', body }),
  )
}

export function useMarkReady() {
  return useRequestChange((id: string) => api<RequestView>(`/api/requests/${id}/ready`, { method: 'POST' }))
}

/** Money taken at the studio's counter: what is owed now, unless a smaller amount is given. */
export function useCounterPayment() {
  return useRequestChange(({ id, amountCents, note }: { id: string; amountCents?: number; note?: string }) =>
    api<RequestView>(`/api/requests/${id}/balance/counter`, {
      method: 'POST',
      body: { ...(amountCents ? { amountCents } : {}), ...(note ? { note } : {}) },
    }),
  )
}

export function useMarkCollected() {
  return useRequestChange((id: string) => api<RequestView>(`/api/requests/${id}/collected`, { method: 'POST' }))
}

/**
 * Gives this side's answers after pickup. Publishing can follow at once (the other side had answered),
 * so the studio's public answers are read again too.
 */
export function useGiveReview() {
  const queryClient = useQueryClient()
  const changed = useRequestChanged()
  return useMutation({
    mutationFn: ({ view, body }: { view: RequestView; body: ReviewBody }) =>
      api<RequestReviews>(`/api/requests/${view.id}/review`, { method: 'POST', body }),
    onSuccess: (_answer, { view }) =>
      Promise.all([changed(view), queryClient.invalidateQueries({ queryKey: requestKeys.studios.reviews(view.studio.id) })]),
  })
}

/** The potter lets a result photo show on the studio's public page, or takes it back. */
export function useSetPhotoPublic(requestId: string) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: ({ photoId, shown }: { photoId: string; shown: boolean }) =>
      api<PhotoRecord>(`/api/photos/${photoId}`, { method: 'PATCH', body: { public: shown } }),
    onSuccess: (photo) =>
      queryClient.setQueryData<RequestView>(requestKeys.requests.detail(requestId), (view) =>
        view ? { ...view, photos: view.photos.map((p) => (p.id === photo.id ? photo : p)) } : view,
      ),
  })
}

/**
 * After an upload: the request's photos are read again, and again every two seconds while the
 * server is still preparing large ones (for at most a minute).
 */
export function useRefreshPhotos(requestId: string) {
  const queryClient = useQueryClient()
  return async () => {
    for (let round = 0; round < 30; round++) {
      await queryClient.invalidateQueries({ queryKey: requestKeys.requests.detail(requestId), exact: true })
      const view = queryClient.getQueryData<{ photos: PhotoRecord[] }>(requestKeys.requests.detail(requestId))
      if (!view?.photos.some((photo) => photo.processing)) return
      await new Promise((resolve) => setTimeout(resolve, 2000))
    }
  }
}

/**
 * One piece tagged at drop-off against the studio's checklist: the request (its pieces, a held piece's
 * note) and the firing's load are read again.
 */
export function useTagPiece(view: Pick<RequestView, 'id' | 'firing'>) {
  const queryClient = useQueryClient()
  const changed = useRequestChanged()
  return useMutation({
    mutationFn: (body: PieceTagBody) => api<PieceTagged>(`/api/requests/${view.id}/pieces`, { method: 'POST', body }),
    onSuccess: () => Promise.all([changed(view), queryClient.invalidateQueries({ queryKey: requestKeys.firings.load(view.firing.id) })]),
  })
}
