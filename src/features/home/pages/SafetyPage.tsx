import { PageHeader } from '../../../components/ui/Card'
import { SafetyNote } from '../../../components/SafetyNote'

export function SafetyPage() {
  return (
    <>
      <PageHeader title="Firing safety" lead="Conewright does the arithmetic; the kiln, the room and the wiring are yours to keep safe." />
      <SafetyNote className="max-w-3xl text-sm" full />
    </>
  )
}
