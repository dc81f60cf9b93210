import { useQuery } from '@tanstack/react-query'
import { api } from './api'

/** Facts about this installation the client needs: where caught mail is, which basemap to draw. */
export interface SiteMeta {
  mailInboxUrl: string | null
  tileUrl: string | null
  /** A PMTiles vector basemap (a path here or an absolute URL); drawn before `tileUrl`. */
  basemapPmtilesUrl: string | null
}

export function useSiteMeta() {
  return useQuery({ queryKey: ['meta'], queryFn: () => api<SiteMeta>('/api/meta'), staleTime: Infinity })
}
