import { useState, type FormEvent } from 'react'
import { useForm } from 'react-hook-form'
import { itemApplies, type ChecklistItem } from '../../../../shared/schemas/pieces'
import { PhotoUploader } from '../../../components/photos/PhotoUploader'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Checkbox, Field, TextInput } from '../../../components/ui/Field'
import { MeasureField } from '../../../components/ui/MeasureField'
import { pieceName } from '../../../components/ware/CheckResults'
import { ApiError } from '../../../lib/api'
import { lengthMeasure, localiseMessage, type UnitSystem } from '../../../lib/units'
import { useRefreshPhotos, useTagPiece } from '../api/pickup'
import type { RequestView } from '../api/types'

type Answers = Record<string, boolean | undefined>

interface Measured {
  heightMm: number | undefined
  widthMm: number | undefined
  depthMm: number | undefined
}

/**
 * Check-in piece by piece, made for a phone at the door: crew pick which declared piece is in their
 * hand, answer the studio's drop-off checklist for it, and it gets its tag at once. A failed item holds
 * that piece back (with the reason and a photo, and the potter told), never the rest of the ware.
 */
export function TagPieces({ view, units }: { view: RequestView; units: UnitSystem }) {
  const tag = useTagPiece(view)
  const refreshPhotos = useRefreshPhotos(view.id)
  const tagged = (index: number) => view.pieceRecords.filter((p) => p.pieceIndex === index).length
  const open = view.pieces.map((line, index) => ({ line, index, left: line.quantity - tagged(index) })).filter((l) => l.left > 0)
  const [chosen, setChosen] = useState<number | null>(null)
  const current = open.find((l) => l.index === chosen) ?? open[0]
  const [answers, setAnswers] = useState<Answers>({})
  const [reason, setReason] = useState('')
  const [photoIds, setPhotoIds] = useState<string[]>([])
  const [unanswered, setUnanswered] = useState(false)
  const [last, setLast] = useState<{ tag: string; name: string; held: boolean } | null>(null)
  // The uploader is drawn afresh for each piece, so one piece's photos never show under the next.
  const [uploads, setUploads] = useState(0)
  // Measured only when the piece in hand is bigger or smaller than declared; the load plans what is entered.
  const [differs, setDiffers] = useState(false)
  const size = useForm<Measured>({ defaultValues: { heightMm: undefined, widthMm: undefined, depthMm: undefined } })

  const items: ChecklistItem[] = current ? view.studio.dropOffChecklist.filter((item) => itemApplies(item, current.line)) : []
  const failed = items.filter((item) => answers[item.id] === false)

  const answerAll = () => setAnswers(Object.fromEntries(items.map((item) => [item.id, true])))

  const submit = (event: FormEvent) => {
    event.preventDefault()
    if (!current) return
    if (items.some((item) => answers[item.id] === undefined)) {
      setUnanswered(true)
      return
    }
    setUnanswered(false)
    const measured = size.getValues()
    const isRound = current.line.round === true
    tag.mutate(
      {
        pieceIndex: current.index,
        ...(differs
          ? {
              measured: {
                heightMm: measured.heightMm as number,
                widthMm: measured.widthMm as number,
                depthMm: (isRound ? measured.widthMm : measured.depthMm) as number,
              },
            }
          : {}),
        checks: Object.fromEntries(items.map((item) => [item.id, answers[item.id] === true])),
        ...(failed.length && reason.trim().length >= 3 ? { holdReason: reason.trim() } : {}),
        ...(photoIds.length ? { photoIds } : {}),
      },
      {
        onSuccess: ({ piece }) => {
          setLast({ tag: piece.tag, name: `${piece.label} ${piece.copy} of ${piece.of}`, held: piece.status === 'held' })
          setAnswers({})
          setReason('')
          setPhotoIds([])
          setDiffers(false)
          setUploads((n) => n + 1)
          if (photoIds.length) void refreshPhotos()
        },
      },
    )
  }

  return (
    <div className="space-y-4" data-testid="tag-pieces">
      {last && (
        <div
          role="status"
          className={`rounded-card border-2 p-4 ${last.held ? 'border-ember-500 bg-ember-100' : 'border-celadon-500 bg-celadon-50'}`}
          data-testid="last-tag"
        >
          <p className="text-sm">
            {last.held ? 'Held back, tagged' : 'Tagged'}: {last.name}
          </p>
          <p className="font-mono text-3xl font-bold tracking-wider" data-testid="last-tag-code">
            {last.tag}
          </p>
          <a
            href={`/api/firings/${view.firing.id}/labels.html?tag=${last.tag}`}
            target="_blank"
            rel="noreferrer"
            className="mt-1 inline-block font-medium text-clay-700 underline"
          >
            Print its label
          </a>
        </div>
      )}

      {current ? (
        <form onSubmit={submit} noValidate className="space-y-4" aria-label="Check in a piece">
          <fieldset>
            <legend className="mb-2 text-sm font-medium text-slip-800">Which piece is in your hand?</legend>
            <div className="grid gap-2">
              {open.map((l) => (
                <label
                  key={l.index}
                  className="flex min-h-12 cursor-pointer items-center gap-3 rounded-control border border-slip-300 px-3 has-[:checked]:border-clay-600 has-[:checked]:bg-clay-50"
                >
                  <input
                    type="radio"
                    name="piece-line"
                    className="focus-ring size-5 accent-clay-600"
                    checked={l.index === current.index}
                    onChange={() => {
                      setChosen(l.index)
                      setAnswers({})
                    }}
                  />
                  <span className="flex-1">{pieceName(view.pieces, l.index)}</span>
                  <span className="text-sm text-slip-600">{l.left} to go</span>
                </label>
              ))}
            </div>
          </fieldset>

          {items.length > 0 ? (
            <fieldset className="space-y-2">
              <legend className="mb-1 text-sm font-medium text-slip-800">The studio’s drop-off checklist</legend>
              {items.map((item) => (
                <div key={item.id} className="rounded-control border border-slip-200 p-2" role="radiogroup" aria-label={item.label}>
                  <p className="mb-2 text-sm">{item.label}</p>
                  <div className="grid grid-cols-2 gap-2">
                    {[
                      { value: true, label: 'Passes' },
                      { value: false, label: 'Fails' },
                    ].map((choice) => (
                      <label
                        key={choice.label}
                        className={`flex min-h-12 cursor-pointer items-center justify-center gap-2 rounded-control border text-sm font-semibold ${
                          choice.value
                            ? 'has-[:checked]:border-celadon-500 has-[:checked]:bg-celadon-50'
                            : 'has-[:checked]:border-danger-500 has-[:checked]:bg-danger-50'
                        } border-slip-300`}
                      >
                        <input
                          type="radio"
                          name={`check-${item.id}`}
                          className="focus-ring size-5"
                          checked={answers[item.id] === choice.value}
                          onChange={() => setAnswers((a) => ({ ...a, [item.id]: choice.value }))}
                        />
                        {choice.label}
                      </label>
                    ))}
                  </div>
                </div>
              ))}
              <Button variant="secondary" className="min-h-12 w-full" onClick={answerAll}>
                Everything passes
              </Button>
              {unanswered && (
                <p role="alert" className="text-sm font-medium text-danger-700">
                  Answer every item for this piece.
                </p>
              )}
            </fieldset>
          ) : (
            <p className="text-sm text-slip-600">No item of the studio’s checklist applies to this piece.</p>
          )}

          <div className="space-y-3">
            <Checkbox
              label="Its size differs from what was declared"
              checked={differs}
              onChange={(e) => {
                setDiffers(e.target.checked)
                size.reset({ heightMm: current.line.heightMm, widthMm: current.line.widthMm, depthMm: current.line.depthMm })
              }}
            />
            {differs && (
              <div className="grid grid-cols-3 gap-2">
                <MeasureField control={size.control} name="heightMm" label="Height" measure={lengthMeasure(units)} units={units} />
                <MeasureField
                  control={size.control}
                  name="widthMm"
                  label={current.line.round ? 'Diameter' : 'Width'}
                  measure={lengthMeasure(units)}
                  units={units}
                />
                {!current.line.round && (
                  <MeasureField control={size.control} name="depthMm" label="Depth" measure={lengthMeasure(units)} units={units} />
                )}
              </div>
            )}
          </div>

          {failed.length > 0 && (
            <div className="space-y-3 rounded-control border border-ember-300 bg-ember-100 p-3">
              <p className="text-sm font-medium text-ember-700">
                This piece will be held back, not fired; the potter is told why. The rest of the ware goes on.
              </p>
              <Field label="Why, in your words" hint={`Left empty, the failed ${failed.length === 1 ? 'item is' : 'items are'} named.`}>
                {(props) => <TextInput {...props} value={reason} onChange={(e) => setReason(e.target.value)} maxLength={1000} />}
              </Field>
              <PhotoUploader
                key={uploads}
                uploadUrl={`/api/requests/${view.id}/photos`}
                fields={{ kind: 'check-in' }}
                label="Photo of the problem"
                onUploaded={(photos) => setPhotoIds((ids) => [...ids, ...photos.map((p) => p.id)])}
              />
            </div>
          )}

          {tag.isError && (
            <Alert tone="danger" title="Not tagged">
              {tag.error instanceof ApiError ? tag.error.message : 'Something went wrong. Please try again.'}
              {tag.error instanceof ApiError && Object.keys(tag.error.fields).length > 0 && (
                <ul className="mt-1 list-disc pl-5">
                  {Object.values(tag.error.fields).map((message) => (
                    <li key={message}>{localiseMessage(message, units)}</li>
                  ))}
                </ul>
              )}
            </Alert>
          )}
          <Button type="submit" className="min-h-12 w-full text-base" busy={tag.isPending}>
            {failed.length ? 'Tag it and hold it back' : 'Tag this piece'}
          </Button>
        </form>
      ) : (
        <p className="text-sm text-slip-700" data-testid="all-tagged">
          Every declared piece is tagged. Count the ware in below to finish the drop-off.
        </p>
      )}
    </div>
  )
}
