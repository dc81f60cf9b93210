import { useId } from 'react'

interface Choice<T extends string> {
  value: T
  label: string
}

/**
 * A small radio group drawn as a segmented switch; arrow keys move between the choices. `stacked` puts
 * the legend above, as a form field's label is.
 */
export function ChoiceSwitch<T extends string>({
  legend,
  value,
  choices,
  onChange,
  layout = 'inline',
}: {
  legend: string
  value: T
  choices: readonly Choice<T>[]
  onChange: (value: T) => void
  layout?: 'inline' | 'stacked'
}) {
  const name = useId()
  const stacked = layout === 'stacked'
  return (
    <fieldset className={stacked ? 'space-y-1' : 'flex items-center gap-2'}>
      <legend className={stacked ? 'text-sm font-medium text-slip-800' : 'float-left mr-2 text-sm text-slip-600'}>{legend}</legend>
      <div className="inline-flex rounded-control border border-slip-300 bg-white p-0.5">
        {choices.map((choice) => (
          <label key={choice.value} className="cursor-pointer">
            <input
              type="radio"
              className="peer sr-only"
              name={name}
              value={choice.value}
              checked={value === choice.value}
              onChange={() => onChange(choice.value)}
            />
            <span className="block rounded-control px-3 py-1.5 text-sm font-medium text-slip-700 peer-checked:bg-clay-600 peer-checked:text-white peer-focus-visible:outline-2 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-clay-500">
              {choice.label}
            </span>
          </label>
        ))}
      </div>
    </fieldset>
  )
}
