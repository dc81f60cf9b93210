import { useQuery } from '@tanstack/react-query'
import type { StudioReviewsJson } from '../../../../shared/api/studios'
import { api } from '../../../lib/api'
import { studioKeys } from './keys'

export type { StudioReviewsJson as StudioReviewsPage }

export interface PublicPhoto {
  id: string
  width: number
  height: number
  url: string
  thumbUrl: string
  at: string
}

/** Result photos potters chose to show on the studio's page. */
export function useStudioPhotos(studioId: string) {
  return useQuery({
    queryKey: studioKeys.studios.photos(studioId),
    queryFn: () => api<{ photos: PublicPhoto[] }>(`/api/studios/${studioId}/photos`),
  })
}

/** Potters' published answers about a studio, newest first, with the tallies and who would fire there again. */
export function useStudioReviews(studioId: string) {
  return useQuery({
    queryKey: studioKeys.studios.reviews(studioId),
    queryFn: () => api<StudioReviewsJson>(`/api/studios/${studioId}/reviews`),
  })
}
