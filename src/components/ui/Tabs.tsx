import { useRef, type KeyboardEvent, type ReactNode } from 'react'

interface Tab<T extends string> {
  value: T
  label: ReactNode
}

interface TabsProps<T extends string> {
  /** Names the group for screen readers. */
  label: string
  /** Prefix for the ids that tie each tab to its panel. */
  idBase: string
  tabs: readonly Tab<T>[]
  value: T
  onChange: (value: T) => void
}

/** A row of tabs; arrow keys, Home and End move between them (the ARIA tabs pattern). */
export function Tabs<T extends string>({ label, idBase, tabs, value, onChange }: TabsProps<T>) {
  const refs = useRef<(HTMLButtonElement | null)[]>([])
  const onKeyDown = (event: KeyboardEvent, index: number) => {
    const last = tabs.length - 1
    const next =
      event.key === 'ArrowRight'
        ? index === last
          ? 0
          : index + 1
        : event.key === 'ArrowLeft'
          ? index === 0
            ? last
            : index - 1
          : event.key === 'Home'
            ? 0
            : event.key === 'End'
              ? last
              : null
    if (next === null) return
    event.preventDefault()
    onChange(tabs[next].value)
    refs.current[next]?.focus()
  }
  return (
    <div role="tablist" aria-label={label} className="inline-flex rounded-control border border-slip-300 bg-white p-0.5">
      {tabs.map((tab, index) => {
        const selected = tab.value === value
        return (
          <button
            key={tab.value}
            ref={(el) => {
              refs.current[index] = el
            }}
            type="button"
            role="tab"
            id={`${idBase}-tab-${tab.value}`}
            aria-selected={selected}
            aria-controls={`${idBase}-panel-${tab.value}`}
            tabIndex={selected ? 0 : -1}
            onClick={() => onChange(tab.value)}
            onKeyDown={(event) => onKeyDown(event, index)}
            className={`focus-ring rounded-control px-3 py-1.5 text-sm font-medium ${selected ? 'bg-clay-600 text-white' : 'text-slip-700 hover:bg-slip-100'}`}
          >
            {tab.label}
          </button>
        )
      })}
    </div>
  )
}

export function TabPanel<T extends string>({
  idBase,
  value,
  children,
  className = '',
}: {
  idBase: string
  value: T
  children: ReactNode
  className?: string
}) {
  return (
    <div role="tabpanel" id={`${idBase}-panel-${value}`} aria-labelledby={`${idBase}-tab-${value}`} className={className}>
      {children}
    </div>
  )
}
