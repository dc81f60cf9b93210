import { useCallback, useRef, useState } from 'react'
import type { FiringRecord } from '../api/types'

/**
 * The firing a dialog shows, read fresh from the list on every render so a status change shows at
 * once; the last copy stays while the list refetches or no longer holds it (just cancelled).
 */
export function useSelectedFiring(firings: FiringRecord[] | undefined) {
  const [selectedId, setSelectedId] = useState<string | null>(null)
  const last = useRef<FiringRecord | null>(null)
  const fresh = selectedId ? firings?.find((f) => f.id === selectedId) : undefined
  if (fresh) last.current = fresh
  const selected = selectedId ? (fresh ?? (last.current?.id === selectedId ? last.current : null)) : null
  // Stable, so tables can keep their column definitions between renders.
  const open = useCallback((firing: FiringRecord) => {
    last.current = firing
    setSelectedId(firing.id)
  }, [])
  const close = useCallback(() => setSelectedId(null), [])
  return { selected, open, close }
}
