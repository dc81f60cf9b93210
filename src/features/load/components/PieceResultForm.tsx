import { useState, type FormEvent } from 'react'
import type { PieceOutcome } from '../../../../shared/schemas/pickup'
import { PhotoUploader } from '../../../components/photos/PhotoUploader'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Field, TextArea } from '../../../components/ui/Field'
import { ApiError } from '../../../lib/api'
import { OUTCOMES } from '../../../lib/pieceWords'
import { usePostPieceResult, type PieceView } from '../api/load'

/** At unloading: how this one piece came out (the twelve outcomes), a note and photos, posted from its tag. */
export function PieceResultForm({ piece, onPosted }: { piece: PieceView; onPosted?: () => void }) {
  const post = usePostPieceResult(piece.tag)
  const [outcome, setOutcome] = useState<PieceOutcome | null>(piece.outcome?.outcome ?? null)
  const [notes, setNotes] = useState(piece.outcome?.notes ?? '')
  const [photoIds, setPhotoIds] = useState<string[]>([])
  const [missing, setMissing] = useState(false)

  const submit = (event: FormEvent) => {
    event.preventDefault()
    if (!outcome) {
      setMissing(true)
      return
    }
    post.mutate(
      { outcome, ...(notes.trim() ? { notes: notes.trim() } : {}), ...(photoIds.length ? { photoIds } : {}) },
      { onSuccess: () => onPosted?.() },
    )
  }

  return (
    <form onSubmit={submit} className="space-y-4" aria-label="Result of this piece">
      <fieldset>
        <legend className="mb-2 text-sm font-medium text-slip-800">How did it come out?</legend>
        <div className="grid grid-cols-2 gap-2 sm:grid-cols-3">
          {OUTCOMES.map((o) => (
            <label
              key={o.value}
              className="flex min-h-12 cursor-pointer items-center gap-2 rounded-control border border-slip-300 px-3 text-sm has-[:checked]:border-clay-600 has-[:checked]:bg-clay-50"
            >
              <input
                type="radio"
                name="outcome"
                value={o.value}
                checked={outcome === o.value}
                onChange={() => {
                  setOutcome(o.value)
                  setMissing(false)
                }}
                className="focus-ring size-5 accent-clay-600"
              />
              {o.label}
            </label>
          ))}
        </div>
        {missing && (
          <p role="alert" className="mt-1 text-xs font-medium text-danger-700">
            Choose how the piece came out.
          </p>
        )}
      </fieldset>
      <Field label="Note" hint={outcome && outcome !== 'fine' ? 'What happened, for the potter.' : undefined}>
        {(props) => <TextArea {...props} rows={2} value={notes} onChange={(e) => setNotes(e.target.value)} maxLength={1000} />}
      </Field>
      <PhotoUploader
        uploadUrl={`/api/requests/${piece.request.id}/photos`}
        fields={{ kind: 'result' }}
        label="Photos of this piece"
        hint="The potter sees them with the piece."
        onUploaded={(photos) => setPhotoIds((ids) => [...ids, ...photos.map((p) => p.id)])}
      />
      {post.isError && (
        <Alert tone="danger" title="The result was not saved">
          {post.error instanceof ApiError ? post.error.message : 'Something went wrong. Please try again.'}
        </Alert>
      )}
      {post.isSuccess && <Alert tone="success">Result saved: the potter sees it on their page.</Alert>}
      <Button type="submit" busy={post.isPending} className="min-h-12 w-full sm:w-auto">
        {piece.outcome ? 'Save the result' : 'Post the result'}
      </Button>
    </form>
  )
}
