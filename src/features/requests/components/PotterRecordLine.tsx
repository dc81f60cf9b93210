import { POTTER_QUESTIONS } from '../../../../shared/reviews'
import type { PotterRecord } from '../api/types'

/**
 * A potter's history as a studio weighs it: asks sent, picked up, no-shows, and what studios answered
 * after pickup (published answers only), counted as how many said yes to each question.
 */
export function PotterRecordLine({ name, record }: { name: string; record: PotterRecord | undefined }) {
  if (!record) return <span className="text-slip-600">{name}</span>
  const reviews = record.reviews
  const parts = [
    `${record.requests} ${record.requests === 1 ? 'ask' : 'asks'}`,
    `${record.collected} picked up`,
    `${record.noShows} ${record.noShows === 1 ? 'no-show' : 'no-shows'}`,
    ...(reviews
      ? POTTER_QUESTIONS.map((q) => `${q.short.toLowerCase()} ${reviews[q.key].yes} of ${reviews.count}`)
      : ['no studio answers yet']),
  ]
  return (
    <span data-testid="potter-record">
      <span className="font-medium text-slip-900">{name}</span>
      <span className="text-slip-600"> · {parts.join(' · ')}</span>
    </span>
  )
}
