import { useState, type ReactNode } from 'react'
import { Button } from '../../../components/ui/Button'
import { Field, TextInput } from '../../../components/ui/Field'

interface DeskSearchProps {
  /** Names the search for a screen reader, e.g. "Find studios". */
  label: string
  fieldLabel: string
  placeholder: string
  words: string
  onSearch: (words: string) => void
  /** The filters beside the words. */
  children?: ReactNode
}

/** Words to look for, sent when asked (Enter or the button), with the list's filters beside them. */
export function DeskSearch({ label, fieldLabel, placeholder, words, onSearch, children }: DeskSearchProps) {
  const [typed, setTyped] = useState(words)
  return (
    <form
      role="search"
      aria-label={label}
      className="flex flex-wrap items-end gap-3"
      onSubmit={(event) => {
        event.preventDefault()
        onSearch(typed.trim())
      }}
    >
      <Field label={fieldLabel} className="min-w-56 flex-1">
        {(a11y) => <TextInput {...a11y} type="search" value={typed} onChange={(e) => setTyped(e.target.value)} placeholder={placeholder} />}
      </Field>
      {children}
      <Button type="submit" variant="secondary">
        Search
      </Button>
    </form>
  )
}
