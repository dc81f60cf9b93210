import { ChoiceSwitch } from '../../../components/ui/ChoiceSwitch'
import type { UnitSystem } from '../../../lib/units'

const CHOICES: readonly { value: UnitSystem; label: string }[] = [
  { value: 'imperial', label: 'in · °F' },
  { value: 'metric', label: 'mm · °C' },
]

/** Which units the form shows; what is stored stays SI either way. */
export function UnitSwitch({ value, onChange }: { value: UnitSystem; onChange: (units: UnitSystem) => void }) {
  return <ChoiceSwitch legend="Units" value={value} choices={CHOICES} onChange={onChange} />
}
