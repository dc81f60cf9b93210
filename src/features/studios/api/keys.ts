// One key factory for the studio feature. Everything under a studio's detail key belongs to that
// studio, so a change to its firings can invalidate exactly `firings(studioId)`.

export const studioKeys = {
  all: ['studios'] as const,
  mine: () => ['studios', 'mine'] as const,
  detail: (studioId: string) => ['studios', 'detail', studioId] as const,
  kilns: (studioId: string) => ['studios', 'detail', studioId, 'kilns'] as const,
  firings: (studioId: string) => ['studios', 'detail', studioId, 'firings'] as const,
  firingsIn: (studioId: string, window: FiringWindow) => ['studios', 'detail', studioId, 'firings', window] as const,
  crew: (studioId: string) => ['studios', 'detail', studioId, 'crew'] as const,
  ratings: (studioId: string) => ['studios', 'detail', studioId, 'ratings'] as const,
  photos: (studioId: string) => ['studios', 'detail', studioId, 'photos'] as const,
  firing: (firingId: string) => ['studios', 'firing', firingId] as const,
  firingLog: (firingId: string) => ['studios', 'firing', firingId, 'log'] as const,
  firingRequests: (firingId: string) => ['studios', 'firing', firingId, 'requests'] as const,
  kiln: (kilnId: string) => ['studios', 'kiln', kilnId] as const,
  priceList: (kilnId: string) => ['studios', 'kiln', kilnId, 'price-list'] as const,
  invite: (token: string) => ['studios', 'invite', token] as const,
}

/** Which of a studio's firings to fetch: instants as ISO strings, open-ended when left out. */
export interface FiringWindow {
  from?: string
  to?: string
  includeCancelled?: boolean
}
