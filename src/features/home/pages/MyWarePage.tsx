import { ButtonLink } from '../../../components/ui/Button'
import { EmptyState, PageHeader } from '../../../components/ui/Card'
import { useMe } from '../../auth/api/auth'

/** The potter's home. */
export function MyWarePage() {
  const me = useMe()
  return (
    <>
      <PageHeader title="My ware" lead={`Welcome, ${me.data?.displayName ?? ''}. Your firing requests and their progress live here.`} />
      <EmptyState title="No ware in a firing yet" action={<ButtonLink to="/planner">Check a piece against a kiln</ButtonLink>}>
        Describe a piece in the firing planner to see whether a kiln can take it, what schedule it needs and what it would cost.
      </EmptyState>
    </>
  )
}
