import { useQuery } from '@tanstack/react-query'
import { api } from '../../../lib/api'
import { studioKeys } from './keys'

export interface PublicRating {
  stars: number
  care: number | null
  communication: number | null
  results: number | null
  text: string
  /** The potter's first name. */
  author: string
  reply: string | null
  at: string
}

export interface StudioRatingsPage {
  summary: { mean: number | null; count: number; score: number | null }
  ratings: PublicRating[]
}

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

/** Potters' ratings of a studio, newest first, with the mean and how many there are. */
export function useStudioRatings(studioId: string) {
  return useQuery({
    queryKey: studioKeys.studios.ratings(studioId),
    queryFn: () => api<StudioRatingsPage>(`/api/studios/${studioId}/ratings`),
  })
}
