import { forwardRef, useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react'

const control =
  'block w-full rounded-control border bg-white px-3 py-2 text-sm text-slip-900 placeholder:text-slip-500 focus-ring focus:border-clay-600 disabled:bg-slip-100'
const controlClass = (invalid: boolean) => `${control} ${invalid ? 'border-danger-500' : 'border-slip-300'}`

interface FieldProps {
  label: ReactNode
  hint?: ReactNode
  error?: string
  children: (props: { id: string; 'aria-invalid': boolean; 'aria-describedby'?: string }) => ReactNode
  className?: string
}

/** A label, the control, a hint and the error, wired for screen readers. */
export function Field({ label, hint, error, children, className = '' }: FieldProps) {
  const id = useId()
  const describedBy = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ') || undefined
  return (
    <div className={`space-y-1 ${className}`}>
      <label htmlFor={id} className="block text-sm font-medium text-slip-800">
        {label}
      </label>
      {children({ id, 'aria-invalid': Boolean(error), 'aria-describedby': describedBy })}
      {hint && !error && (
        <p id={`${id}-hint`} className="text-xs text-slip-500">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${id}-error`} className="text-xs font-medium text-danger-700" role="alert">
          {error}
        </p>
      )}
    </div>
  )
}

type InputProps = InputHTMLAttributes<HTMLInputElement> & { invalid?: boolean }

export const TextInput = forwardRef<HTMLInputElement, InputProps>(function TextInput({ invalid = false, className = '', ...rest }, ref) {
  return <input ref={ref} className={`${controlClass(invalid || rest['aria-invalid'] === true)} ${className}`} {...rest} />
})

type SelectProps = SelectHTMLAttributes<HTMLSelectElement> & { invalid?: boolean }

export const Select = forwardRef<HTMLSelectElement, SelectProps>(function Select({ invalid = false, className = '', ...rest }, ref) {
  return <select ref={ref} className={`${controlClass(invalid || rest['aria-invalid'] === true)} ${className}`} {...rest} />
})

type TextAreaProps = TextareaHTMLAttributes<HTMLTextAreaElement> & { invalid?: boolean }

export const TextArea = forwardRef<HTMLTextAreaElement, TextAreaProps>(function TextArea(
  { invalid = false, className = '', ...rest },
  ref,
) {
  return <textarea ref={ref} className={`${controlClass(invalid || rest['aria-invalid'] === true)} ${className}`} {...rest} />
})

export function Checkbox({ label, ...rest }: InputHTMLAttributes<HTMLInputElement> & { label: ReactNode }) {
  return (
    <label className="flex items-start gap-2 text-sm text-slip-800">
      <input type="checkbox" className="focus-ring mt-0.5 size-4 rounded border-slip-300 accent-clay-600" {...rest} />
      <span>{label}</span>
    </label>
  )
}
