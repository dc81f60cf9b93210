import { useState, type FormEvent } from 'react'
import { Link, useParams, useSearchParams } from 'react-router-dom'
import { formatDate, formatDateTime } from '../../../../shared/dates'
import { formatCone } from '../../../../shared/firing/cones'
import { PhotoGallery } from '../../../components/photos/PhotoGallery'
import { Alert } from '../../../components/ui/Alert'
import { Badge } from '../../../components/ui/Badge'
import { Button } from '../../../components/ui/Button'
import { Card } from '../../../components/ui/Card'
import { Field, TextInput } from '../../../components/ui/Field'
import { Spinner } from '../../../components/ui/Spinner'
import { ApiError } from '../../../lib/api'
import { outcomeLabel, placeInWords } from '../../../lib/pieceWords'
import { useHoldPiece, usePiece, type PieceView } from '../api/load'
import { PieceResultForm } from '../components/PieceResultForm'

/** /pieces/:tag: one piece opened by its tag (typed or scanned): whose, which firing, its findings, its place and result. */
export function PiecePage() {
  const { tag = '' } = useParams()
  const [params] = useSearchParams()
  const piece = usePiece(tag.toUpperCase())
  const from = params.get('unload')

  if (piece.isPending) return <Spinner label="Opening the piece…" />
  if (piece.isError) {
    const error = piece.error
    return (
      <div className="space-y-4">
        <Alert
          tone="danger"
          title={error instanceof ApiError && error.status === 404 ? 'No piece with that tag' : 'The piece could not be opened'}
        >
          {error instanceof ApiError && error.status === 404
            ? 'No piece you can see has that tag. Check the label and type it again.'
            : error instanceof ApiError
              ? error.message
              : 'Check your connection and try again.'}
        </Alert>
        {from && <BackToUnloading firingId={from} />}
      </div>
    )
  }
  return <PieceDetail piece={piece.data} unloading={from} />
}

function BackToUnloading({ firingId }: { firingId: string }) {
  return (
    <Link to={`/firings/${firingId}/unload`} className="font-medium text-clay-700 hover:underline">
      ← Back to unloading
    </Link>
  )
}

function PieceDetail({ piece, unloading }: { piece: PieceView; unloading: string | null }) {
  const zone = piece.studio.timezone
  const isStudio = piece.viewer !== 'potter'
  const failed = piece.checks.filter((c) => !c.passed)
  return (
    <article className="space-y-6" data-testid="piece-page" data-tag={piece.tag}>
      <header className="space-y-2">
        <p className="text-sm">
          {unloading ? (
            <BackToUnloading firingId={unloading} />
          ) : (
            <Link to={`/requests/${piece.request.id}`} className="font-medium text-clay-700 hover:underline">
              ← {isStudio ? `${piece.potter.displayName}’s ware` : 'Your ware'}
            </Link>
          )}
        </p>
        <div className="flex flex-wrap items-center gap-3">
          <h1 className="font-mono text-3xl font-bold tracking-wider" data-testid="piece-tag">
            {piece.tag}
          </h1>
          {piece.status === 'held' ? <Badge tone="ember">Held back</Badge> : <Badge tone="celadon">In the load</Badge>}
          {piece.outcome && (
            <Badge tone={piece.outcome.outcome === 'fine' ? 'celadon' : 'danger'}>{outcomeLabel(piece.outcome.outcome)}</Badge>
          )}
        </div>
        <p className="text-lg text-slip-800">
          {piece.label} · {piece.copy} of {piece.of} · <span data-testid="piece-potter">{piece.potter.displayName}</span>
        </p>
      </header>

      <div className="grid gap-6 lg:grid-cols-2">
        <Card>
          <h2 className="mb-3 text-lg font-semibold">Where it is</h2>
          <dl className="space-y-2 text-sm">
            <div>
              <dt className="font-medium text-slip-600">Firing</dt>
              <dd>
                {piece.firing.kind} firing to cone {formatCone(piece.firing.cone)}, {piece.firing.atmosphere},{' '}
                {formatDate(piece.firing.firingDate, zone)}
                {' · '}
                {piece.studio.name}, {piece.kilnName}
              </dd>
            </div>
            <div>
              <dt className="font-medium text-slip-600">In the load</dt>
              <dd data-testid="piece-place">
                {piece.place
                  ? `${placeInWords(piece.place)} (of ${piece.place.layerCount} ${piece.place.layerCount === 1 ? 'layer' : 'layers'})`
                  : piece.status === 'held'
                    ? 'Not in the load: held back.'
                    : 'Not placed yet.'}
              </dd>
            </div>
          </dl>
          {isStudio && (
            <div className="flex flex-wrap gap-3 pt-3">
              <a
                href={`/api/firings/${piece.firing.id}/labels.html?tag=${piece.tag}`}
                target="_blank"
                rel="noreferrer"
                className="font-medium text-clay-700 hover:underline"
              >
                Print this label
              </a>
              <Link to={`/firings/${piece.firing.id}/load`} className="font-medium text-clay-700 hover:underline">
                The load
              </Link>
            </div>
          )}
        </Card>

        <Card>
          <h2 className="mb-3 text-lg font-semibold">At drop-off</h2>
          {piece.hold && (
            <Alert tone="warning" title="Held back" className="mb-3">
              {piece.hold.reason} ({formatDateTime(piece.hold.at, zone)})
            </Alert>
          )}
          {piece.checks.length > 0 ? (
            <ul className="space-y-1 text-sm" data-testid="piece-checks">
              {piece.checks.map((c) => (
                <li key={c.id} className={c.passed ? 'text-slip-800' : 'font-medium text-danger-700'}>
                  {c.passed ? '✓' : '✗'} {c.label}
                </li>
              ))}
            </ul>
          ) : (
            <p className="text-sm text-slip-600">Counted in without a checklist.</p>
          )}
          {failed.length === 0 && piece.findings.length > 0 && (
            <div className="mt-3">
              <h3 className="text-sm font-semibold">From the check of the ask</h3>
              <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-slip-700">
                {piece.findings.map((f) => (
                  <li key={f.code}>{f.message}</li>
                ))}
              </ul>
            </div>
          )}
          {piece.actions.includes('hold') || piece.actions.includes('release') ? <HoldPiece piece={piece} /> : null}
        </Card>
      </div>

      <Card>
        <h2 className="mb-3 text-lg font-semibold">Result</h2>
        {piece.outcome ? (
          <p className="mb-3 text-sm" data-testid="piece-outcome">
            <strong>{outcomeLabel(piece.outcome.outcome)}</strong>
            {piece.outcome.notes && ` · ${piece.outcome.notes}`}
          </p>
        ) : (
          !piece.actions.includes('result') && <p className="text-sm text-slip-600">No result yet: it is posted at unloading.</p>
        )}
        {piece.actions.includes('result') && <PieceResultForm piece={piece} />}
        <div className="mt-4">
          <PhotoGallery photos={piece.photos} headingLevel="h3" />
        </div>
      </Card>
    </article>
  )
}

function HoldPiece({ piece }: { piece: PieceView }) {
  const change = useHoldPiece(piece.tag)
  const [reason, setReason] = useState('')
  const hold = (event: FormEvent) => {
    event.preventDefault()
    change.mutate({ hold: true, reason: reason.trim() })
  }
  return (
    <div className="mt-4 border-t border-slip-200 pt-3">
      {piece.actions.includes('release') ? (
        <Button variant="secondary" className="min-h-12" busy={change.isPending} onClick={() => change.mutate({ hold: false })}>
          Take it into the load after all
        </Button>
      ) : (
        <form onSubmit={hold} className="space-y-2" aria-label="Hold this piece back">
          <Field label="Hold it back: why?">
            {(props) => <TextInput {...props} value={reason} onChange={(e) => setReason(e.target.value)} minLength={3} required />}
          </Field>
          <Button type="submit" variant="secondary" className="min-h-12" busy={change.isPending}>
            Hold it back
          </Button>
        </form>
      )}
      {change.isError && (
        <Alert tone="danger" className="mt-2">
          {change.error instanceof ApiError ? change.error.message : 'Something went wrong. Please try again.'}
        </Alert>
      )}
    </div>
  )
}
