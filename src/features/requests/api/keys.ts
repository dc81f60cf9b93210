// One key factory for the requests feature. A request's detail and its messages sit under its own
// key, lists under `lists`, so a change to one request can invalidate exactly what shows it.
import type { RequestFilter } from './types'

export const requestKeys = {
  all: ['requests'] as const,
  lists: () => ['requests', 'list'] as const,
  list: (filter: RequestFilter) => ['requests', 'list', filter] as const,
  detail: (id: string) => ['requests', 'detail', id] as const,
  messages: (id: string) => ['requests', 'detail', id, 'messages'] as const,
  firing: (firingId: string) => ['requests', 'firing', firingId] as const,
  kiln: (kilnId: string) => ['requests', 'kiln', kilnId] as const,
  priceList: (kilnId: string) => ['requests', 'kiln', kilnId, 'price-list'] as const,
  studio: (studioId: string) => ['requests', 'studio', studioId] as const,
  studioFirings: (studioId: string) => ['requests', 'studio', studioId, 'firings'] as const,
}
