import type { Control, UseFormRegister } from 'react-hook-form'
import type { FieldMessages, PlannerValues } from '../plannerForm'
import type { UnitSystem } from '../units'

/** What every part of the planner form is drawn from. */
export interface FormSectionProps {
  control: Control<PlannerValues>
  register: UseFormRegister<PlannerValues>
  messages: FieldMessages
  units: UnitSystem
}
