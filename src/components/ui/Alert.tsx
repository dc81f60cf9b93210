import type { ReactNode } from 'react'

type Tone = 'info' | 'success' | 'warning' | 'danger'

const tones: Record<Tone, string> = {
  info: 'border-slip-200 bg-white text-slip-800',
  success: 'border-celadon-300 bg-celadon-50 text-celadon-700',
  warning: 'border-ember-300 bg-ember-100 text-ember-700',
  danger: 'border-danger-500/40 bg-danger-50 text-danger-700',
}

export function Alert({
  tone = 'info',
  title,
  children,
  className = '',
}: {
  tone?: Tone
  title?: ReactNode
  children?: ReactNode
  className?: string
}) {
  return (
    <div role={tone === 'danger' ? 'alert' : 'status'} className={`rounded-control border px-4 py-3 text-sm ${tones[tone]} ${className}`}>
      {title && <p className="font-semibold">{title}</p>}
      {children && <div className={title ? 'mt-1' : ''}>{children}</div>}
    </div>
  )
}
