import { useEffect, useRef, useState, type ReactNode } from 'react'
import { useController, type Control, type FieldValues, type Path } from 'react-hook-form'
import { Field, TextInput } from '../../../components/ui/Field'
import { formatDateTime } from '../../../../shared/dates'
import { isoToZonedInput, zonedInputToIso } from '../zonedTime'

interface ZonedDateTimeFieldProps<T extends FieldValues> {
  control: Control<T>
  name: Path<T>
  label: string
  /** The studio's zone: what is typed is wall-clock time there, whatever the browser's zone. */
  zone: string
  hint?: ReactNode
}

/**
 * A date and time typed in the studio's zone and kept in the form as an ISO instant ('' until complete);
 * once complete, the hint reads it back with the zone's name for that date (PST or PDT).
 */
export function ZonedDateTimeField<T extends FieldValues>({ control, name, label, zone, hint }: ZonedDateTimeFieldProps<T>) {
  const { field, fieldState } = useController({ control, name })
  const value = (field.value as string | undefined) ?? ''
  const [text, setText] = useState(() => (value ? isoToZonedInput(value, zone) : ''))
  const typed = useRef({ value, zone })

  useEffect(() => {
    if (typed.current.value !== value || typed.current.zone !== zone) {
      setText(value ? isoToZonedInput(value, zone) : '')
      typed.current = { value, zone }
    }
  }, [value, zone])

  return (
    <Field label={label} hint={value ? formatDateTime(value, zone) : hint} error={fieldState.error?.message}>
      {(a11y) => (
        <TextInput
          {...a11y}
          ref={field.ref}
          name={field.name}
          type="datetime-local"
          value={text}
          onBlur={field.onBlur}
          onChange={(event) => {
            setText(event.target.value)
            const iso = zonedInputToIso(event.target.value, zone) ?? ''
            typed.current = { value: iso, zone }
            field.onChange(iso)
          }}
        />
      )}
    </Field>
  )
}
