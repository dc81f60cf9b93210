import { Link } from 'react-router-dom'
import type { NoticeJson } from '../../../../shared/api/notices'

const when = (iso: string) => new Date(iso).toLocaleString([], { month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit' })

/** Notices, newest first; an unread one is marked, and opening it marks it read. */
export function NoticeList({ items, onOpen }: { items: NoticeJson[]; onOpen: (notice: NoticeJson) => void }) {
  if (!items.length) return <p className="px-1 py-3 text-sm text-slip-600">Nothing new. Changes to your ware and firings show here.</p>
  return (
    <ul className="divide-y divide-slip-100" data-testid="notice-list">
      {items.map((notice) => (
        <li key={notice.id} data-testid="notice" data-kind={notice.kind} data-read={notice.read}>
          <Link
            to={notice.path}
            onClick={() => onOpen(notice)}
            className={`block px-1 py-2.5 hover:bg-slip-50 focus-visible:bg-slip-50 ${notice.read ? '' : 'border-l-4 border-clay-500 pl-2'}`}
          >
            <span className={`block text-sm ${notice.read ? 'text-slip-700' : 'font-semibold text-slip-900'}`}>{notice.title}</span>
            {notice.body && <span className="mt-0.5 line-clamp-2 block text-xs text-slip-600">{notice.body}</span>}
            <span className="mt-0.5 block text-xs text-slip-600">{when(notice.at)}</span>
          </Link>
        </li>
      ))}
    </ul>
  )
}
