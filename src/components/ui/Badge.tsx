import type { ReactNode } from 'react'

export type BadgeTone = 'neutral' | 'clay' | 'celadon' | 'ember' | 'danger'

const tones: Record<BadgeTone, string> = {
  neutral: 'bg-slip-100 text-slip-700',
  clay: 'bg-clay-100 text-clay-800',
  celadon: 'bg-celadon-100 text-celadon-700',
  ember: 'bg-ember-100 text-ember-700',
  danger: 'bg-danger-50 text-danger-700',
}

export function Badge({ tone = 'neutral', children }: { tone?: BadgeTone; children: ReactNode }) {
  return <span className={`inline-flex items-center rounded-full px-2.5 py-0.5 text-xs font-semibold ${tones[tone]}`}>{children}</span>
}
