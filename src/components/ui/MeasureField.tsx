import { useEffect, useRef, useState, type ReactNode } from 'react'
import { useController, type Control, type FieldValues, type Path } from 'react-hook-form'
import { localiseMessage, parseShown, shownText, type Measure, type UnitSystem } from '../../lib/units'
import { Field, TextInput } from './Field'

interface MeasureFieldProps<T extends FieldValues> {
  control: Control<T>
  name: Path<T>
  label: string
  measure: Measure
  /** The schemas' messages speak SI; the form's own errors are shown in these units. */
  units: UnitSystem
  /** A message worked out elsewhere (a form that checks itself on every change); it wins over the form's own error. */
  error?: string
  hint?: ReactNode
  className?: string
  disabled?: boolean
  /** The value kept when the field is emptied: undefined for "not given", null to clear a stored one. */
  empty?: undefined | null
}

const sameNumber = (a: unknown, b: unknown) =>
  a === b || (typeof a === 'number' && typeof b === 'number' && Number.isNaN(a) && Number.isNaN(b))

/**
 * A number typed in the units on screen and kept in the form in SI (or cents). The field keeps its
 * own text while it is typed ("12." stays "12.") and is rewritten only when the value or the units
 * change from elsewhere (a reset, a demo kiln, the unit switch).
 */
export function MeasureField<T extends FieldValues>({
  control,
  name,
  label,
  measure,
  units,
  error,
  hint,
  className,
  disabled,
  empty,
}: MeasureFieldProps<T>) {
  const { field, fieldState } = useController({ control, name })
  const value = field.value as unknown
  const [text, setText] = useState(() => shownText(value as number | undefined, measure))
  const typed = useRef({ value, measure })

  useEffect(() => {
    const last = typed.current
    if (last.measure !== measure || !sameNumber(last.value, value)) {
      setText(shownText(value as number | undefined, measure))
      typed.current = { value, measure }
    }
  }, [value, measure])

  const own = fieldState.error?.message
  const message = error ?? (own ? localiseMessage(own, units) : undefined)
  return (
    <Field label={measure.suffix ? `${label} (${measure.suffix})` : label} hint={hint} error={message} className={className}>
      {(a11y) => (
        <TextInput
          {...a11y}
          ref={field.ref}
          name={field.name}
          // A ruler's reading needs the slash and the space that a phone's decimal pad lacks.
          inputMode={measure.fractions ? 'text' : 'decimal'}
          autoComplete="off"
          disabled={disabled}
          value={text}
          onBlur={field.onBlur}
          onChange={(event) => {
            const next = event.target.value
            setText(next)
            const shown = parseShown(next, measure)
            const stored = shown === undefined ? empty : Number.isNaN(shown) ? shown : measure.fromShown(shown)
            typed.current = { value: stored, measure }
            field.onChange(stored)
          }}
        />
      )}
    </Field>
  )
}
