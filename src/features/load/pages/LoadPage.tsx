import { useMemo, useState } from 'react'
import { Link, useNavigate, useParams } from 'react-router-dom'
import type { LoadPieceJson } from '../../../../shared/api/load'
import { FindPiece } from '../../../components/pieces/FindPiece'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Card } from '../../../components/ui/Card'
import { Select } from '../../../components/ui/Field'
import { Spinner } from '../../../components/ui/Spinner'
import { ApiError } from '../../../lib/api'
import { useLoadPlan, useSaveLoadPlan, type LoadPlanJson } from '../api/load'
import { LayerDrawing } from '../components/LayerDrawing'
import { moveToShelf, placementsOf, withMove, type Placement } from '../loadMoves'
import { potterColours } from '../potterColours'

/** /firings/:firingId/load: the firing's load, layer by layer, for crew to check, adjust and print. */
export function LoadPage() {
  const { firingId = '' } = useParams()
  const plan = useLoadPlan(firingId)
  if (plan.isPending) return <Spinner label="Planning the load…" />
  if (plan.isError)
    return (
      <Alert tone="danger" title="The load could not be read">
        {plan.error instanceof ApiError ? plan.error.message : 'Check your connection and try again.'}
      </Alert>
    )
  return <LoadView plan={plan.data} />
}

interface Refusal {
  message: string
  details: string[]
}

function LoadView({ plan }: { plan: LoadPlanJson }) {
  const navigate = useNavigate()
  const save = useSaveLoadPlan(plan.firingId)
  const colours = useMemo(() => potterColours(plan.potters), [plan.potters])
  const [selected, setSelected] = useState<string | null>(null)
  const [draft, setDraft] = useState<Placement | null>(null)
  const [refusal, setRefusal] = useState<Refusal | null>(null)
  // The placements before each move that stood, newest last: undo sends the last one back.
  const [history, setHistory] = useState<Placement[][]>([])
  const pieces = plan.layers.flatMap((l) => l.shelves.flatMap((s) => s.pieces))
  const chosen = pieces.find((p) => p.key === selected) ?? null
  const layerCount = Math.max(plan.maxLayers, plan.layers.length)

  const send = (placements: Placement[], onStood: () => void) => {
    setRefusal(null)
    save.mutate(
      { placements },
      {
        onSuccess: () => {
          setDraft(null)
          onStood()
        },
        onError: (error) =>
          setRefusal({
            message: error instanceof ApiError ? error.message : 'The move was not saved. Check your connection and try again.',
            details: error instanceof ApiError ? Object.values(error.fields) : [],
          }),
      },
    )
  }
  const commit = (move: Placement) => {
    const before = placementsOf(plan)
    setDraft(move)
    send(withMove(before, move), () => setHistory((h) => [...h, before]))
  }
  const undo = () => {
    const last = history[history.length - 1]
    if (!last) return
    setDraft(null)
    send(last, () => setHistory((h) => h.slice(0, -1)))
  }
  const moveTo = (piece: LoadPieceJson, layer: number, shelf: number) => {
    const move = moveToShelf(plan, piece, layer, shelf)
    if (!move) {
      setRefusal({ message: `No room for ${piece.tag ?? piece.label} on layer ${layer + 1}, shelf ${shelf + 1}.`, details: [] })
      return
    }
    commit(move)
  }

  return (
    <article className="space-y-6">
      <header className="space-y-2">
        <p className="text-sm print:hidden">
          <Link to={`/firings/${plan.firingId}/requests`} className="font-medium text-clay-700 hover:underline">
            ← The firing’s asks
          </Link>
        </p>
        <h1 className="text-2xl font-bold tracking-tight sm:text-3xl">The load</h1>
        <p className="text-slip-700" data-testid="load-summary">
          {pieces.length} {pieces.length === 1 ? 'piece' : 'pieces'} on {plan.layers.length} of {plan.maxLayers}{' '}
          {plan.maxLayers === 1 ? 'layer' : 'layers'}; the stack stands {Math.round(plan.stackMm)} mm of{' '}
          {Math.round(plan.kiln.usableHeightMm)} mm usable. {plan.room.shelvesLeft} {plan.room.shelvesLeft === 1 ? 'shelf' : 'shelves'} left
          for short ware.
        </p>
        <div className="flex flex-wrap gap-2 print:hidden">
          <a
            className="focus-ring rounded-control border border-slip-300 bg-white px-4 py-2.5 text-sm font-semibold hover:bg-slip-100"
            href={`/api/firings/${plan.firingId}/labels.html`}
            target="_blank"
            rel="noreferrer"
          >
            Print labels
          </a>
          <Button variant="secondary" onClick={() => window.print()}>
            Print the load sheet
          </Button>
          <Link
            className="focus-ring rounded-control border border-slip-300 bg-white px-4 py-2.5 text-sm font-semibold hover:bg-slip-100"
            to={`/firings/${plan.firingId}/unload`}
          >
            Unloading
          </Link>
        </div>
      </header>

      <div className="print:hidden">
        <FindPiece onTag={(tag) => navigate(`/pieces/${tag}`)} />
      </div>

      {plan.editable ? (
        <Card className="space-y-3 print:hidden">
          <h2 className="text-lg font-semibold">Move a piece</h2>
          <p className="text-sm text-slip-700">
            Tap a piece in a drawing (or tab to it) to choose it. Drag it on its shelf, or use the arrow keys and Enter; or send it to
            another shelf below. Every move is checked against the shelf’s edge, the gap between pieces, the shelf’s rating and the kiln’s
            height.
          </p>
          {chosen ? (
            <MoveControls
              key={chosen.key}
              plan={plan}
              piece={chosen}
              layerCount={layerCount}
              busy={save.isPending}
              onMove={moveTo}
              onTurn={() => commit({ ...placementOf(chosen), rotation: chosen.rotation === 0 ? 90 : 0 })}
            />
          ) : (
            <p className="text-sm text-slip-600">No piece chosen.</p>
          )}
          <div className="flex flex-wrap items-center gap-2">
            <Button variant="secondary" onClick={undo} disabled={history.length === 0} busy={save.isPending && history.length > 0}>
              Undo the last move
            </Button>
            {draft && (
              <Button
                variant="ghost"
                onClick={() => {
                  setDraft(null)
                  setRefusal(null)
                }}
              >
                Put it back
              </Button>
            )}
          </div>
          {refusal && (
            <Alert tone="danger" title="That move does not stand">
              <p>{refusal.message}</p>
              {refusal.details.length > 0 && (
                <ul className="mt-1 list-disc pl-5">
                  {refusal.details.map((d) => (
                    <li key={d}>{d}</li>
                  ))}
                </ul>
              )}
              <p className="mt-1">The piece is drawn where you put it, dashed; move it again or put it back.</p>
            </Alert>
          )}
        </Card>
      ) : (
        <Alert tone="info" className="print:hidden">
          The firing has started: this is the load as it went in.
        </Alert>
      )}

      <section aria-labelledby="potters-heading" className="space-y-2">
        <h2 id="potters-heading" className="text-lg font-semibold">
          Potters in this load
        </h2>
        <ul className="flex flex-wrap gap-3 text-sm" data-testid="load-potters">
          {plan.potters.map((p) => (
            <li key={p.id} className="flex items-center gap-2">
              <span
                className="inline-block size-4 rounded-sm border border-slip-700"
                style={{ background: colours.get(p.id) }}
                aria-hidden
              />
              {p.name}
            </li>
          ))}
        </ul>
      </section>

      {Array.from({ length: layerCount }, (_, index) => plan.layers.find((l) => l.index === index) ?? null)
        .map((layer, index) => ({ layer, index }))
        .reverse()
        .map(({ layer, index }) =>
          layer ? (
            <section
              key={index}
              aria-labelledby={`layer-${index}`}
              className="break-inside-avoid space-y-3"
              data-testid="load-layer"
              data-layer={index}
            >
              <h2 id={`layer-${index}`} className="text-lg font-semibold">
                Layer {index + 1}
                {index === 0 && ' (bottom)'}
                <span className="ml-2 text-sm font-normal text-slip-600">
                  tallest {Math.round(layer.tallestMm)} mm
                  {layer.postMm !== null && ` · posts ${Math.round(layer.postMm)} mm to the next shelf`}
                </span>
              </h2>
              <div className="grid gap-4 md:grid-cols-[minmax(0,28rem)_1fr]">
                <div className="print:hidden">
                  <LayerDrawing
                    kiln={plan.kiln}
                    layer={layer}
                    colours={colours}
                    selected={selected}
                    draft={draft?.layer === index ? draft : null}
                    refused={refusal !== null}
                    editable={plan.editable && !save.isPending}
                    onSelect={setSelected}
                    onDraft={(move) => {
                      setRefusal(null)
                      setDraft(move)
                    }}
                    onCommit={commit}
                    onCancel={() => {
                      setDraft(null)
                      setRefusal(null)
                    }}
                  />
                </div>
                <ShelfLists layer={layer} colours={colours} />
              </div>
            </section>
          ) : null,
        )}

      {plan.unplaced.length > 0 && (
        <Card>
          <h2 className="mb-2 text-lg font-semibold">Not placed</h2>
          <ul className="space-y-1 text-sm" data-testid="load-unplaced">
            {plan.unplaced.map((p) => (
              <li key={p.key}>
                <span className="font-mono font-semibold">{p.tag ?? '—'}</span> {p.potterName}’s {p.label} ({p.copy} of {p.of}):{' '}
                {p.reasonText}
              </li>
            ))}
          </ul>
        </Card>
      )}
      {plan.held.length > 0 && (
        <Card>
          <h2 className="mb-2 text-lg font-semibold">Held back at drop-off</h2>
          <ul className="space-y-1 text-sm" data-testid="load-held">
            {plan.held.map((p) => (
              <li key={p.key}>
                <span className="font-mono font-semibold">{p.tag ?? '—'}</span> {p.potterName}’s {p.label}: {p.holdReason}
              </li>
            ))}
          </ul>
        </Card>
      )}
    </article>
  )
}

const placementOf = (p: LoadPieceJson): Placement => ({ key: p.key, layer: p.layer, shelf: p.shelf, x: p.x, y: p.y, rotation: p.rotation })

/** The load sheet's part for one layer: each shelf, and on it each tag with its potter. Printed as it is. */
function ShelfLists({ layer, colours }: { layer: LoadPlanJson['layers'][number]; colours: Map<string, string> }) {
  return (
    <div className="space-y-3">
      {layer.shelves.map((shelf) => (
        <div key={shelf.index} data-testid="load-shelf">
          <h3 className="text-sm font-semibold">
            Shelf {shelf.index + 1}{' '}
            <span className="font-normal text-slip-600">
              · {Math.round(shelf.taken * 100)}% taken{shelf.weightKg > 0 && ` · ${shelf.weightKg.toFixed(1)} kg`}
            </span>
          </h3>
          {shelf.pieces.length === 0 ? (
            <p className="text-sm text-slip-600">Empty.</p>
          ) : (
            <ul className="mt-1 grid gap-1 text-sm sm:grid-cols-2">
              {shelf.pieces.map((p) => (
                <li key={p.key} className="flex items-center gap-2">
                  <span
                    className="inline-block size-3 shrink-0 rounded-sm border border-slip-700"
                    style={{ background: colours.get(p.potterId) }}
                    aria-hidden
                  />
                  <span className="font-mono font-semibold" data-testid="shelf-tag">
                    {p.tag ?? '—'}
                  </span>
                  <span className="truncate">
                    {p.potterName} · {p.label}
                  </span>
                </li>
              ))}
            </ul>
          )}
        </div>
      ))}
    </div>
  )
}

function MoveControls({
  plan,
  piece,
  layerCount,
  busy,
  onMove,
  onTurn,
}: {
  plan: LoadPlanJson
  piece: LoadPieceJson
  layerCount: number
  busy: boolean
  onMove: (piece: LoadPieceJson, layer: number, shelf: number) => void
  onTurn: () => void
}) {
  const here = `${piece.layer}:${piece.shelf}`
  const [target, setTarget] = useState(here)
  const options = Array.from({ length: layerCount }, (_, layer) => plan.kiln.shelves.map((s) => ({ layer, shelf: s.index }))).flat()
  return (
    <div className="space-y-2" data-testid="move-controls">
      <p className="text-sm">
        <span className="font-mono font-semibold">{piece.tag ?? '—'}</span> · {piece.potterName}’s {piece.label} · layer {piece.layer + 1},
        shelf {piece.shelf + 1}
      </p>
      <div className="flex flex-wrap items-end gap-2">
        <div className="space-y-1">
          <label htmlFor="move-to" className="block text-sm font-medium text-slip-800">
            Move it to
          </label>
          <Select id="move-to" value={target} onChange={(e) => setTarget(e.target.value)} className="min-h-12">
            {options.map((o) => (
              <option key={`${o.layer}:${o.shelf}`} value={`${o.layer}:${o.shelf}`}>
                Layer {o.layer + 1}, shelf {o.shelf + 1}
              </option>
            ))}
          </Select>
        </div>
        <Button
          className="min-h-12"
          disabled={target === here}
          busy={busy}
          onClick={() => {
            const [layer, shelf] = target.split(':').map(Number)
            onMove(piece, layer, shelf)
          }}
        >
          Move
        </Button>
        {!piece.round && (
          <Button variant="secondary" className="min-h-12" busy={busy} onClick={onTurn}>
            Turn it a quarter
          </Button>
        )}
      </div>
    </div>
  )
}
