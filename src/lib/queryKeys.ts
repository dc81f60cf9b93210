// One query-key tree per resource, shared by every feature: a firing is cached once, under
// `firings/<id>`, whichever page fetched it; a change invalidates exactly the branches it touched.
// Features that keep data of their own (search results) keep their own small factories beside this.

/** Which of a studio's firings to fetch: instants as ISO strings, open-ended when left out. */
export interface FiringWindow {
  from?: string
  to?: string
  includeCancelled?: boolean
}

export interface RequestFilter {
  as?: 'potter' | 'studio'
  studioId?: string
  firingId?: string
  state?: string
}

export const keys = {
  me: ['me'] as const,
  notices: ['notices'] as const,
  requests: {
    all: ['requests'] as const,
    lists: () => ['requests', 'list'] as const,
    list: (filter: RequestFilter) => ['requests', 'list', filter] as const,
    detail: (id: string) => ['requests', 'detail', id] as const,
    messages: (id: string) => ['requests', 'detail', id, 'messages'] as const,
  },
  firings: {
    all: ['firings'] as const,
    detail: (id: string) => ['firings', id] as const,
    log: (id: string) => ['firings', id, 'log'] as const,
    /** The firing's load plan: layers, shelves and the pieces on them. */
    load: (id: string) => ['firings', id, 'load'] as const,
  },
  /** A piece opened by its tag (the tag as printed, K4XR-7M2H). */
  pieces: {
    all: ['pieces'] as const,
    detail: (tag: string) => ['pieces', tag] as const,
  },
  incidents: {
    all: ['incidents'] as const,
    detail: (id: string) => ['incidents', 'detail', id] as const,
    ofFiring: (firingId: string) => ['incidents', 'firing', firingId] as const,
    ofStudio: (studioId: string) => ['incidents', 'studio', studioId] as const,
    potterRecord: (requestId: string) => ['incidents', 'potter-record', requestId] as const,
    desk: () => ['incidents', 'desk'] as const,
  },
  kilns: {
    detail: (id: string) => ['kilns', id] as const,
    priceList: (id: string) => ['kilns', id, 'price-list'] as const,
  },
  desk: {
    all: ['desk'] as const,
    studios: () => ['desk', 'studios'] as const,
    studioPage: (query: object) => ['desk', 'studios', query] as const,
    accounts: () => ['desk', 'accounts'] as const,
    accountPage: (query: object) => ['desk', 'accounts', query] as const,
    disputes: () => ['desk', 'disputes'] as const,
  },
  studios: {
    all: ['studios'] as const,
    mine: () => ['studios', 'mine'] as const,
    detail: (id: string) => ['studios', 'detail', id] as const,
    kilns: (id: string) => ['studios', 'detail', id, 'kilns'] as const,
    /** Every list of the studio's firings, whatever the window. */
    firings: (id: string) => ['studios', 'detail', id, 'firings'] as const,
    firingsIn: (id: string, window: FiringWindow) => ['studios', 'detail', id, 'firings', window] as const,
    crew: (id: string) => ['studios', 'detail', id, 'crew'] as const,
    /** The owner's money page: payout account, balance, transfers, earnings. */
    payouts: (id: string) => ['studios', 'detail', id, 'payouts'] as const,
    reviews: (id: string) => ['studios', 'detail', id, 'reviews'] as const,
    photos: (id: string) => ['studios', 'detail', id, 'photos'] as const,
    waiting: (id: string) => ['studios', 'detail', id, 'waiting-requests'] as const,
    invite: (token: string) => ['studios', 'invite', token] as const,
  },
}
