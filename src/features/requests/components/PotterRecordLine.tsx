import type { PotterRecord } from '../api/types'

/** A potter's history as a studio weighs it: requests sent, collected, no-shows and rating. */
export function PotterRecordLine({ name, record }: { name: string; record: PotterRecord | undefined }) {
  if (!record) return <span className="text-slip-600">{name}</span>
  const parts = [
    `${record.requests} ${record.requests === 1 ? 'request' : 'requests'}`,
    `${record.collected} collected`,
    `${record.noShows} ${record.noShows === 1 ? 'no-show' : 'no-shows'}`,
    record.rating ? `rated ${record.rating.mean.toFixed(1)} of 5 (${record.rating.count})` : 'not rated yet',
  ]
  return (
    <span data-testid="potter-record">
      <span className="font-medium text-slip-900">{name}</span>
      <span className="text-slip-600"> · {parts.join(' · ')}</span>
    </span>
  )
}
