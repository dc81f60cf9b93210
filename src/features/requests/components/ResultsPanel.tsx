import { useState } from 'react'
import { formatDateTime } from '../../../../shared/dates'
import { resultsSchema } from '../../../../shared/schemas/pickup'
import { PhotoGallery } from '../../../components/photos/PhotoGallery'
import { PhotoUploader } from '../../../components/photos/PhotoUploader'
import type { PhotoRecord } from '../../../components/photos/photoTypes'
import { Alert } from '../../../components/ui/Alert'
import { Badge, type BadgeTone } from '../../../components/ui/Badge'
import { Button } from '../../../components/ui/Button'
import { Checkbox, Field, Select, TextArea, TextInput } from '../../../components/ui/Field'
import { Table, Td, Th } from '../../../components/ui/Table'
import { pieceName } from '../../../components/ware/CheckResults'
import { ApiError } from '../../../lib/api'
import { usePostResults, useRefreshPhotos, useSetPhotoPublic } from '../api/pickup'
import type { PieceOutcome, RequestView, ResultsRecord } from '../api/types'
import { OUTCOMES, outcomeLabel } from '../pickupWords'

const OUTCOME_TONES: Record<PieceOutcome, BadgeTone> = {
  fine: 'celadon',
  cracked: 'danger',
  dunted: 'danger',
  'blown-out': 'danger',
  bloated: 'ember',
  'glaze-ran': 'ember',
  'stuck-to-shelf': 'danger',
  crawled: 'ember',
  pinholed: 'ember',
  underfired: 'ember',
  crazed: 'ember',
  other: 'neutral',
}

const problemOf = (error: unknown) => (error instanceof ApiError ? error.message : 'Something went wrong. Please try again.')

/** The studio's results: per piece how it came out, with notes; the photos go up beside them. */
export function ResultsForm({ view }: { view: RequestView }) {
  const post = usePostResults()
  const refreshPhotos = useRefreshPhotos(view.id)
  const [rows, setRows] = useState(() =>
    view.pieces.map((_, pieceIndex) => {
      const given = view.results?.outcomes.find((o) => o.pieceIndex === pieceIndex)
      return { outcome: given?.outcome ?? ('fine' as PieceOutcome), notes: given?.notes ?? '' }
    }),
  )
  const [notes, setNotes] = useState(view.results?.notes ?? '')
  const [saved, setSaved] = useState(false)
  const body = {
    outcomes: rows.map((row, pieceIndex) => ({
      pieceIndex,
      outcome: row.outcome,
      ...(row.notes.trim() ? { notes: row.notes.trim() } : {}),
    })),
    ...(notes.trim() ? { notes: notes.trim() } : {}),
  }
  const parsed = resultsSchema.safeParse(body)
  const change = (index: number, next: Partial<(typeof rows)[number]>) => {
    setSaved(false)
    setRows((list) => list.map((row, i) => (i === index ? { ...row, ...next } : row)))
  }

  return (
    <form
      className="space-y-4"
      noValidate
      aria-label="Results"
      data-testid="results-form"
      onSubmit={(event) => {
        event.preventDefault()
        if (parsed.success) post.mutate({ id: view.id, body: parsed.data }, { onSuccess: () => setSaved(true) })
      }}
    >
      <ul className="space-y-3">
        {view.pieces.map((piece, index) => (
          <li
            key={index}
            className="grid gap-3 rounded-control border border-slip-200 p-3 sm:grid-cols-[minmax(0,12rem)_12rem_1fr] sm:items-end"
            data-testid="result-piece"
          >
            <p className="text-sm font-semibold text-slip-800 sm:pb-2">
              {pieceName(view.pieces, index)} <span className="font-normal text-slip-500">× {piece.quantity}</span>
            </p>
            <Field label="How it came out">
              {(a11y) => (
                <Select
                  {...a11y}
                  value={rows[index].outcome}
                  onChange={(event) => change(index, { outcome: event.target.value as PieceOutcome })}
                >
                  {OUTCOMES.map((o) => (
                    <option key={o.value} value={o.value}>
                      {o.label}
                    </option>
                  ))}
                </Select>
              )}
            </Field>
            <Field label="Notes" hint={rows[index].outcome === 'fine' ? undefined : 'What happened, and to how many of them.'}>
              {(a11y) => (
                <TextInput
                  {...a11y}
                  value={rows[index].notes}
                  maxLength={1000}
                  onChange={(event) => change(index, { notes: event.target.value })}
                />
              )}
            </Field>
          </li>
        ))}
      </ul>
      <Field label="Notes on the firing for this potter (optional)">
        {(a11y) => (
          <TextArea
            {...a11y}
            rows={2}
            value={notes}
            maxLength={4000}
            onChange={(event) => {
              setSaved(false)
              setNotes(event.target.value)
            }}
          />
        )}
      </Field>
      <PhotoUploader
        uploadUrl={`/api/requests/${view.id}/photos`}
        fields={{ kind: 'result' }}
        label="Result photos"
        hint="The potter sees them on their page for this ware and may show them on your public page."
        onUploaded={() => void refreshPhotos()}
      />
      {!parsed.success && <Alert tone="danger">{parsed.error.issues[0]?.message}</Alert>}
      {post.isError && <Alert tone="danger">{problemOf(post.error)}</Alert>}
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" busy={post.isPending} disabled={!parsed.success}>
          {view.results ? 'Update the results' : 'Post the results'}
        </Button>
        {saved && <span className="text-sm text-celadon-700">Saved. The potter sees them now.</span>}
      </div>
    </form>
  )
}

/** The potter's switch for one result photo: shown on the studio's public page, or not. */
function PublicSwitch({ photo, requestId }: { photo: PhotoRecord; requestId: string }) {
  const setPublic = useSetPhotoPublic(requestId)
  // The box follows the click at once; a refusal puts it back.
  const [shown, setShown] = useState(photo.public)
  return (
    <div className="space-y-0.5">
      <Checkbox
        label="Show on the studio’s page"
        checked={shown}
        onChange={(event) => {
          const next = event.target.checked
          setShown(next)
          setPublic.mutate({ photoId: photo.id, shown: next }, { onError: () => setShown(!next) })
        }}
      />
      {setPublic.isError && (
        <p className="text-xs font-medium text-danger-700" role="alert">
          {problemOf(setPublic.error)}
        </p>
      )}
    </div>
  )
}

/** The results as both sides read them: each piece's outcome, the notes and the photos. */
export function ResultsView({ view, results }: { view: RequestView; results: ResultsRecord | null }) {
  const potter = view.viewer === 'potter'
  return (
    <div className="space-y-4" data-testid="results">
      {results ? (
        <>
          <Table caption="How each piece came out">
            <thead>
              <tr>
                <Th>Piece</Th>
                <Th>Tag</Th>
                <Th>Outcome</Th>
                <Th>Notes</Th>
              </tr>
            </thead>
            <tbody className="divide-y divide-slip-100">
              {results.outcomes.map((o) => (
                <tr key={o.pieceId} data-testid="result-outcome" data-outcome={o.outcome} data-tag={o.tag}>
                  <Td className="font-medium">{pieceName(view.pieces, o.pieceIndex)}</Td>
                  <Td className="font-mono">{o.tag}</Td>
                  <Td>
                    <Badge tone={OUTCOME_TONES[o.outcome]}>{outcomeLabel(o.outcome)}</Badge>
                  </Td>
                  <Td>{o.notes || '—'}</Td>
                </tr>
              ))}
            </tbody>
          </Table>
          <p className="text-sm text-slip-700" data-testid="result-counts">
            {OUTCOMES.filter((o) => results.counts[o.value])
              .map((o) => `${results.counts[o.value]} ${o.label.toLowerCase()}`)
              .join(' · ')}
          </p>
          {results.notes && <p className="whitespace-pre-line text-sm text-slip-800">{results.notes}</p>}
          <p className="text-xs text-slip-500">Posted {formatDateTime(results.at, view.studio.timezone)}.</p>
        </>
      ) : (
        <p className="text-sm text-slip-600">No results posted yet.</p>
      )}
      <PhotoGallery
        photos={view.photos}
        kinds={['result']}
        headings={{ result: 'Result photos' }}
        below={
          potter
            ? (photo) => <PublicSwitch photo={photo} requestId={view.id} />
            : (photo) => (photo.public ? <span className="text-xs text-slip-500">On your public page</span> : null)
        }
        empty={results ? 'No result photos yet.' : undefined}
      />
      {potter && view.photos.some((p) => p.kind === 'result') && (
        <p className="text-xs text-slip-500">
          Result photos stay private unless you tick “Show on the studio’s page”. You can take them back any time.
        </p>
      )}
    </div>
  )
}
