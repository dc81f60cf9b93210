import { useEffect, useRef, useState, type ReactNode } from 'react'
import { useController, type Control, type FieldPathByValue } from 'react-hook-form'
import { Field, TextInput } from '../../../components/ui/Field'
import type { FieldMessages, NumberDraft, PlannerValues } from '../plannerForm'
import { parseShown, shownText, type Measure } from '../units'

export type NumberPath = FieldPathByValue<PlannerValues, NumberDraft>

const sameNumber = (a: NumberDraft, b: NumberDraft) => a === b || (typeof a === 'number' && typeof b === 'number' && Number.isNaN(a) && Number.isNaN(b))

interface MeasureFieldProps {
  control: Control<PlannerValues>
  name: NumberPath
  label: string
  measure: Measure
  messages: FieldMessages
  hint?: ReactNode
  className?: string
}

/**
 * A number typed in the units on screen and kept in the form in SI. The field keeps its own text
 * while it is typed ("12." stays "12."), and is written afresh only when the value or the units
 * change from elsewhere (a demo kiln, the unit switch).
 */
export function MeasureField({ control, name, label, measure, messages, hint, className }: MeasureFieldProps) {
  const { field } = useController({ control, name })
  const value = field.value as NumberDraft
  const [text, setText] = useState(() => shownText(value, measure))
  const typed = useRef({ value, measure })

  useEffect(() => {
    const last = typed.current
    if (last.measure !== measure || !sameNumber(last.value, value)) {
      setText(shownText(value, measure))
      typed.current = { value, measure }
    }
  }, [value, measure])

  return (
    <Field label={measure.suffix ? `${label} (${measure.suffix})` : label} hint={hint} error={messages[name]} className={className}>
      {(a11y) => (
        <TextInput
          {...a11y}
          ref={field.ref}
          name={field.name}
          inputMode="decimal"
          autoComplete="off"
          value={text}
          onBlur={field.onBlur}
          onChange={(event) => {
            const next = event.target.value
            setText(next)
            const shown = parseShown(next)
            const stored = shown === undefined || Number.isNaN(shown) ? shown : measure.fromShown(shown)
            typed.current = { value: stored, measure }
            field.onChange(stored)
          }}
        />
      )}
    </Field>
  )
}
