import { Link } from 'react-router-dom'
import { Badge } from '../../../components/ui/Badge'
import { outcomeLabel } from '../../../lib/pieceWords'
import type { RequestView } from '../api/types'

/** Every piece received, by its tag: held back or in the load, and how it came out; each opens its own page. */
export function TaggedPieces({ view }: { view: RequestView }) {
  const isStudio = view.viewer !== 'potter'
  return (
    <div className="space-y-3">
      {isStudio && (
        <a
          href={`/api/firings/${view.firing.id}/labels.html?request=${view.id}`}
          target="_blank"
          rel="noreferrer"
          className="inline-block text-sm font-medium text-clay-700 hover:underline"
        >
          Print these labels
        </a>
      )}
      <ul className="divide-y divide-slip-200 rounded-card border border-slip-200" data-testid="tagged-pieces">
        {view.pieceRecords.map((piece) => (
          <li
            key={piece.id}
            className="flex flex-wrap items-center gap-x-3 gap-y-1 px-3 py-2"
            data-testid="tagged-piece"
            data-tag={piece.tag}
          >
            <Link to={`/pieces/${piece.tag}`} className="font-mono text-base font-semibold text-clay-700 hover:underline">
              {piece.tag}
            </Link>
            <span className="text-sm">
              {piece.label} {piece.copy} of {piece.of}
            </span>
            {piece.status === 'held' ? <Badge tone="ember">Held back</Badge> : null}
            {piece.outcome ? (
              <Badge tone={piece.outcome.outcome === 'fine' ? 'celadon' : 'ember'}>
                <span data-testid="tagged-outcome">{outcomeLabel(piece.outcome.outcome)}</span>
              </Badge>
            ) : null}
            {piece.hold && <p className="w-full text-sm text-ember-700">{piece.hold.reason}</p>}
            {piece.outcome?.notes && <p className="w-full text-sm text-slip-700">{piece.outcome.notes}</p>}
          </li>
        ))}
      </ul>
    </div>
  )
}
