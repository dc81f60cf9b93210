import { useEffect, useId, useState, type KeyboardEvent, type ReactNode } from 'react'
import { Field, TextInput } from '../../../components/ui/Field'
import { usePlaceSuggestions } from '../api/search'

interface PlaceFieldProps {
  value: string
  onChange: (text: string) => void
  /** A suggestion was picked: search there now. */
  onChoose: (label: string) => void
  error?: string
  hint?: ReactNode
}

/** Waits until typing pauses before asking for suggestions. */
function useSettled(text: string, ms = 200): string {
  const [settled, setSettled] = useState(text)
  useEffect(() => {
    const timer = setTimeout(() => setSettled(text), ms)
    return () => clearTimeout(timer)
  }, [text, ms])
  return settled
}

/**
 * A town or postcode with suggestions from the gazetteer, as an ARIA combobox: arrows move through
 * the suggestions, Enter picks one (or searches what is typed), Escape closes them.
 */
export function PlaceField({ value, onChange, onChoose, error, hint }: PlaceFieldProps) {
  const listId = useId()
  const [open, setOpen] = useState(false)
  const [active, setActive] = useState(-1)
  const settled = useSettled(value)
  const suggestions = usePlaceSuggestions(open ? settled : '')
  const places = open && value.trim().length >= 2 ? (suggestions.data ?? []) : []
  const shown = places.length > 0

  useEffect(() => setActive(-1), [settled])

  const choose = (label: string) => {
    setOpen(false)
    setActive(-1)
    onChange(label)
    onChoose(label)
  }

  const onKeyDown = (event: KeyboardEvent<HTMLInputElement>) => {
    if (event.key === 'ArrowDown' || event.key === 'ArrowUp') {
      event.preventDefault()
      setOpen(true)
      if (!shown) return
      const step = event.key === 'ArrowDown' ? 1 : -1
      const last = places.length - 1
      setActive((index) => (step > 0 ? (index >= last ? 0 : index + 1) : index <= 0 ? last : index - 1))
      return
    }
    if (event.key === 'Escape' && open) {
      event.preventDefault()
      setOpen(false)
      setActive(-1)
      return
    }
    if (event.key === 'Enter' && shown && active >= 0 && active < places.length) {
      event.preventDefault()
      choose(places[active].label)
    }
  }

  return (
    <Field label="Place" hint={hint} error={error}>
      {(control) => (
        <div className="relative">
          <TextInput
            {...control}
            role="combobox"
            aria-autocomplete="list"
            aria-expanded={shown}
            aria-controls={listId}
            aria-activedescendant={shown && active >= 0 && active < places.length ? `${listId}-${active}` : undefined}
            autoComplete="off"
            placeholder="A town or ZIP, like Portland, OR"
            value={value}
            onChange={(event) => {
              onChange(event.target.value)
              setOpen(true)
            }}
            onFocus={() => setOpen(true)}
            onBlur={() => setOpen(false)}
            onKeyDown={onKeyDown}
          />
          <ul
            id={listId}
            role="listbox"
            aria-label="Places"
            hidden={!shown}
            className="absolute inset-x-0 top-full z-30 mt-1 max-h-64 overflow-y-auto rounded-control border border-slip-200 bg-white py-1 shadow-card"
          >
            {places.map((place, index) => (
              <li
                key={place.label}
                id={`${listId}-${index}`}
                role="option"
                aria-selected={index === active}
                // Keeps focus in the input, so the blur does not close the list before the click lands.
                onMouseDown={(event) => event.preventDefault()}
                onClick={() => choose(place.label)}
                className={`cursor-pointer px-3 py-2 text-sm ${index === active ? 'bg-clay-50 text-clay-800' : 'text-slip-800 hover:bg-slip-100'}`}
              >
                {place.label}
              </li>
            ))}
          </ul>
        </div>
      )}
    </Field>
  )
}
