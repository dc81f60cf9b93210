import { EmptyState, PageHeader } from '../../../components/ui/Card'
import { ButtonLink } from '../../../components/ui/Button'
import { useMe } from '../../auth/api/auth'

/** The host's and crew's home. */
export function KilnRoomPage() {
  const me = useMe()
  return (
    <>
      <PageHeader title="Kiln room" lead={`Welcome, ${me.data?.displayName ?? ''}. Your studio's firings, requests and ware on the shelves.`} />
      <EmptyState title="No studio yet" action={<ButtonLink to="/planner" variant="secondary">Open the firing planner</ButtonLink>}>
        Your studios, kilns and firing calendar appear here.
      </EmptyState>
    </>
  )
}
