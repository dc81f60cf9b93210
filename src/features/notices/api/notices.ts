// The signed-in person's notices: the same events as the mail, for working the board in the app.
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { NoticeList } from '../../../../shared/api/notices'
import type { NoticesReadBody } from '../../../../shared/schemas/notices'
import { api } from '../../../lib/api'
import { keys } from '../../../lib/queryKeys'

/** How often an open page asks for new notices (and at once when the window regains focus). */
export const NOTICES_REFRESH_MS = 60_000

export function useNotices({ enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: keys.notices,
    queryFn: () => api<NoticeList>('/api/notices'),
    enabled,
    refetchInterval: NOTICES_REFRESH_MS,
  })
}

export function useMarkNoticesRead() {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (body: NoticesReadBody) => api<NoticeList>('/api/notices/read', { method: 'POST', body }),
    onSuccess: (list) => queryClient.setQueryData(keys.notices, list),
  })
}
