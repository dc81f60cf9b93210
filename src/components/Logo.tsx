/** The mark: a witness cone caught mid-bend, on its pad. */
export function ConeMark({ className = 'size-8' }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden>
      <rect width="32" height="32" rx="8" className="fill-clay-600" />
      <path d="M9 25 L14.5 7 L17.5 7 L19.6 15 Q21 20 25 22.5 L23.8 25 Z" className="fill-slip-50" />
      <rect x="7" y="24.5" width="18" height="2.5" rx="1" className="fill-ember-300" />
    </svg>
  )
}

export function Logo() {
  return (
    <span className="flex items-center gap-2">
      <ConeMark />
      <span className="text-lg font-bold tracking-tight text-slip-900">Conewright</span>
    </span>
  )
}
