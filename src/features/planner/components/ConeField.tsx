import type { FieldPathByValue, UseFormRegister } from 'react-hook-form'
import { CONES } from '../../../../shared/firing/cones'
import { Field, TextInput } from '../../../components/ui/Field'
import type { FieldMessages, PlannerValues } from '../plannerForm'

const CONE_LIST_ID = 'planner-cones'

type ConePath = FieldPathByValue<PlannerValues, string>

/** A cone as people write it ("6", "06", "^6", "cone 04"), with the table's cones offered as they type. */
export function ConeField({ register, name, label, messages }: { register: UseFormRegister<PlannerValues>; name: ConePath; label: string; messages: FieldMessages }) {
  return (
    <Field label={label} error={messages[name]}>
      {(a11y) => <TextInput {...a11y} list={CONE_LIST_ID} autoComplete="off" spellCheck={false} {...register(name)} />}
    </Field>
  )
}

/** The suggestions every ConeField points at; rendered once on the page. */
export function ConeSuggestions() {
  return (
    <datalist id={CONE_LIST_ID}>
      {CONES.map((cone) => (
        <option key={cone} value={cone} />
      ))}
    </datalist>
  )
}
