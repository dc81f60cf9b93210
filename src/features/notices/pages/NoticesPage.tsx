import { Button } from '../../../components/ui/Button'
import { Card } from '../../../components/ui/Card'
import { Spinner } from '../../../components/ui/Spinner'
import { Alert } from '../../../components/ui/Alert'
import { useMarkNoticesRead, useNotices } from '../api/notices'
import { NoticeList } from '../components/NoticeList'

/** /notices: everything that happened to the person's requests and firings, newest first. */
export function NoticesPage() {
  const notices = useNotices()
  const markRead = useMarkNoticesRead()
  if (notices.isPending) return <Spinner label="Loading your notices…" />
  if (notices.isError)
    return (
      <Alert tone="danger" title="Could not load your notices">
        <Button size="sm" variant="secondary" onClick={() => notices.refetch()}>
          Try again
        </Button>
      </Alert>
    )
  return (
    <section className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="text-2xl font-bold tracking-tight">Notices</h1>
        {notices.data.unread > 0 && (
          <Button variant="secondary" size="sm" busy={markRead.isPending} onClick={() => markRead.mutate({ all: true })}>
            Mark all {notices.data.unread} read
          </Button>
        )}
      </div>
      <Card>
        <NoticeList items={notices.data.items} onOpen={(notice) => !notice.read && markRead.mutate({ ids: [notice.id] })} />
      </Card>
    </section>
  )
}
