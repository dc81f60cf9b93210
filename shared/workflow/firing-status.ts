// The life of a posted firing, as the studio moves it along. One table of allowed moves, used by the
// server to refuse the rest and by the client to offer only these.

export const FIRING_STATUSES = ['open', 'full', 'closed', 'loading', 'firing', 'cooling', 'unloaded', 'cancelled'] as const
export type FiringStatus = (typeof FIRING_STATUSES)[number]

const NEXT: Record<FiringStatus, readonly FiringStatus[]> = {
  // Taking requests, or not (full: no space on sale; closed: no more requests, e.g. drop-off passed).
  open: ['full', 'closed', 'loading', 'cancelled'],
  full: ['open', 'closed', 'loading', 'cancelled'],
  closed: ['open', 'full', 'loading', 'cancelled'],
  // Once ware goes into the kiln the firing only moves forward.
  loading: ['firing'],
  firing: ['cooling'],
  cooling: ['unloaded'],
  unloaded: [],
  cancelled: [],
}

export function nextFiringStatuses(status: FiringStatus): readonly FiringStatus[] {
  return NEXT[status]
}

export function canMoveFiring(from: FiringStatus, to: FiringStatus): boolean {
  return NEXT[from].includes(to)
}

/** Statuses in which potters may still ask for space. */
export function takesRequests(status: FiringStatus): boolean {
  return status === 'open'
}

/** Statuses after the ware is in the kiln: the firing can no longer be cancelled or moved. */
export function wareIsLoaded(status: FiringStatus): boolean {
  return status === 'loading' || status === 'firing' || status === 'cooling' || status === 'unloaded'
}

export const FIRING_STATUS_LABELS: Record<FiringStatus, string> = {
  open: 'Taking ware',
  full: 'Full',
  closed: 'Not taking ware',
  loading: 'Loading',
  firing: 'Firing',
  cooling: 'Cooling',
  unloaded: 'Unloaded',
  cancelled: 'Called off',
}
