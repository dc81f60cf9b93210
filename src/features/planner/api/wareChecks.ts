import { keepPreviousData, useQuery } from '@tanstack/react-query'
import type { WareCheck } from '../../../../shared/firing/check'
import type { PriceList, Quote } from '../../../../shared/firing/quote'
import { api } from '../../../lib/api'
import { useDebouncedValue } from '../hooks/useDebouncedValue'
import type { CheckInput } from '../plannerForm'

/** What POST /api/ware-checks answers: the check, and a quote when a price list was sent. */
export type WareCheckReply = WareCheck & { quote?: Quote }

export type WareCheckRequest = CheckInput & { priceList?: PriceList }

export const wareCheckKeys = {
  all: ['ware-checks'] as const,
  /** Keyed by the request's JSON, so the same inputs are asked once. */
  check: (requestJson: string) => ['ware-checks', 'check', requestJson] as const,
}

export function postWareCheck(request: WareCheckRequest, signal?: AbortSignal) {
  return api<WareCheckReply>('/api/ware-checks', { method: 'POST', body: request, signal })
}

/** Waits this long after the last keystroke before asking the server, so typing does not flood it. */
export const SERVER_CHECK_DELAY_MS = 600

/**
 * The server's answer for the inputs on screen, asked once the form has been still for a moment.
 * The server is the authority; the browser's own check gives the instant answer meanwhile.
 */
export function useServerWareCheck(request: WareCheckRequest | null) {
  const currentJson = request ? JSON.stringify(request) : null
  const requestJson = useDebouncedValue(currentJson, SERVER_CHECK_DELAY_MS)
  const query = useQuery({
    queryKey: wareCheckKeys.check(requestJson ?? ''),
    queryFn: ({ signal }) => postWareCheck(JSON.parse(requestJson!) as WareCheckRequest, signal),
    enabled: requestJson !== null,
    // The answer depends only on the inputs, which are the key.
    staleTime: Infinity,
    placeholderData: keepPreviousData,
  })
  /** True while the answer on hand is for other inputs than those on screen (typing, or asking). */
  const behind = currentJson !== requestJson || query.isPlaceholderData || query.isFetching
  return { query, behind, asking: currentJson !== null }
}
