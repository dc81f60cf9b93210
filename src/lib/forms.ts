import type { FieldValues, Path, UseFormSetError } from 'react-hook-form'
import { ApiError } from './api'

/**
 * Puts the server's field messages on the form's fields. Returns the message for the form as a whole
 * (the server's, or a general one) so the page can show it above the button.
 */
export function applyServerErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>): string {
  if (error instanceof ApiError) {
    for (const [field, message] of Object.entries(error.fields)) {
      if (field !== '_') setError(field as Path<T>, { type: 'server', message })
    }
    return error.fields._ ?? error.message
  }
  return 'Something went wrong. Please try again.'
}
