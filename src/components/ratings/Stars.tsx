import { useId } from 'react'

const STARS = [1, 2, 3, 4, 5] as const

/** A rating read out as stars, with the number for screen readers and for anyone counting. */
export function StarsShown({ value, className = '' }: { value: number; className?: string }) {
  const whole = Math.round(value)
  return (
    <span className={`inline-flex items-center gap-1 ${className}`} data-testid="stars" data-stars={value}>
      <span aria-hidden className="tracking-tight text-ember-500">
        {STARS.map((n) => (n <= whole ? '★' : '☆')).join('')}
      </span>
      <span className="sr-only">{`${value} out of 5`}</span>
    </span>
  )
}

interface StarInputProps {
  label: string
  value: number | undefined
  onChange: (stars: number) => void
  error?: string
  hint?: string
}

/**
 * One to five stars as a group of radio buttons: the arrow keys move along them, and each says its
 * number aloud.
 */
export function StarInput({ label, value, onChange, error, hint }: StarInputProps) {
  const name = useId()
  const describedBy = `${name}-about`
  return (
    <fieldset className="space-y-1" aria-describedby={hint || error ? describedBy : undefined}>
      <legend className="text-sm font-medium text-slip-800">{label}</legend>
      <div className="flex gap-0.5">
        {STARS.map((n) => (
          <label key={n} className="cursor-pointer">
            <input
              type="radio"
              name={name}
              value={n}
              checked={value === n}
              onChange={() => onChange(n)}
              className="peer sr-only"
              aria-label={`${n} ${n === 1 ? 'star' : 'stars'}`}
            />
            <span
              aria-hidden
              className={`block rounded-control px-1 text-2xl leading-none peer-focus-visible:outline-2 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-clay-500 ${
                value !== undefined && n <= value ? 'text-ember-500' : 'text-slip-300 hover:text-ember-300'
              }`}
            >
              ★
            </span>
          </label>
        ))}
      </div>
      {(error || hint) && (
        <p
          id={describedBy}
          className={`text-xs ${error ? 'font-medium text-danger-700' : 'text-slip-500'}`}
          role={error ? 'alert' : undefined}
        >
          {error ?? hint}
        </p>
      )}
    </fieldset>
  )
}
