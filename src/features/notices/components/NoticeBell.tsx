import { useEffect, useRef, useState } from 'react'
import { Link } from 'react-router-dom'
import { useMarkNoticesRead, useNotices } from '../api/notices'
import { NoticeList } from './NoticeList'

/** The header's notices: the unread count, and the latest few in a panel. */
export function NoticeBell() {
  const notices = useNotices()
  const markRead = useMarkNoticesRead()
  const [open, setOpen] = useState(false)
  const panel = useRef<HTMLDivElement>(null)
  const unread = notices.data?.unread ?? 0

  useEffect(() => {
    if (!open) return
    const close = (event: MouseEvent | KeyboardEvent) => {
      if (event instanceof KeyboardEvent ? event.key === 'Escape' : !panel.current?.contains(event.target as Node)) setOpen(false)
    }
    document.addEventListener('mousedown', close)
    document.addEventListener('keydown', close)
    return () => {
      document.removeEventListener('mousedown', close)
      document.removeEventListener('keydown', close)
    }
  }, [open])

  return (
    <div className="relative" ref={panel}>
      <button
        type="button"
        className="focus-ring relative rounded-control px-3 py-2 text-sm font-medium text-slip-700 hover:bg-slip-100"
        aria-expanded={open}
        aria-haspopup="true"
        data-testid="notice-bell"
        data-unread={unread}
        onClick={() => setOpen((o) => !o)}
      >
        Notices
        {unread > 0 && (
          <span className="ml-1.5 inline-flex min-w-5 items-center justify-center rounded-full bg-clay-600 px-1.5 text-xs font-semibold text-white">
            {unread > 99 ? '99+' : unread}
            <span className="sr-only"> unread</span>
          </span>
        )}
      </button>
      {open && (
        <div
          className="absolute right-0 z-50 mt-1 w-[min(22rem,calc(100vw-2rem))] rounded-card border border-slip-200 bg-white p-2 shadow-card"
          data-testid="notice-panel"
        >
          <div className="flex items-center justify-between gap-2 px-1 pb-1">
            <h2 className="text-sm font-semibold">Notices</h2>
            {unread > 0 && (
              <button
                type="button"
                className="text-xs font-semibold text-clay-700 hover:underline"
                onClick={() => markRead.mutate({ all: true })}
              >
                Mark all read
              </button>
            )}
          </div>
          <NoticeList
            items={(notices.data?.items ?? []).slice(0, 8)}
            onOpen={(notice) => {
              setOpen(false)
              if (!notice.read) markRead.mutate({ ids: [notice.id] })
            }}
          />
          <Link
            to="/notices"
            className="block px-1 pt-2 text-xs font-semibold text-clay-700 hover:underline"
            onClick={() => setOpen(false)}
          >
            See all notices
          </Link>
        </div>
      )}
    </div>
  )
}
