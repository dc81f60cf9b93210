import type { Control, UseFormRegister } from 'react-hook-form'
import type { FieldMessages } from '../../../lib/schemaMessages'
import type { UnitSystem } from '../../../lib/units'
import type { PlannerValues } from '../plannerForm'

/** What every part of the planner form is drawn from. */
export interface FormSectionProps {
  control: Control<PlannerValues>
  register: UseFormRegister<PlannerValues>
  messages: FieldMessages
  units: UnitSystem
}
