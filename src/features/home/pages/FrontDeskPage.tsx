import { EmptyState, PageHeader } from '../../../components/ui/Card'

/** The marketplace admin's home. */
export function FrontDeskPage() {
  return (
    <>
      <PageHeader title="Front desk" lead="Verify studios, settle disputes, refund and suspend." />
      <EmptyState title="Nothing waiting">Studios asking for verification and open disputes appear here.</EmptyState>
    </>
  )
}
