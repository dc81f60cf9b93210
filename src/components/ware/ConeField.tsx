import type { FieldValues, Path, UseFormRegister } from 'react-hook-form'
import { CONES } from '../../../shared/firing/cones'
import { Field, TextInput } from '../ui/Field'

const CONE_LIST_ID = 'cone-suggestions'

interface ConeFieldProps<T extends FieldValues> {
  register: UseFormRegister<T>
  name: Path<T>
  label: string
  error?: string
}

/** A cone as people write it ("6", "06", "^6", "cone 04"), with the table's cones offered as they type. */
export function ConeField<T extends FieldValues>({ register, name, label, error }: ConeFieldProps<T>) {
  return (
    <Field label={label} error={error}>
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
