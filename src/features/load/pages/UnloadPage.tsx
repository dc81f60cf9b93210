import { Link, useNavigate, useParams } from 'react-router-dom'
import { FindPiece } from '../../../components/pieces/FindPiece'
import { Alert } from '../../../components/ui/Alert'
import { Badge } from '../../../components/ui/Badge'
import { Card } from '../../../components/ui/Card'
import { Spinner } from '../../../components/ui/Spinner'
import { ApiError } from '../../../lib/api'
import { outcomeLabel } from '../../../lib/pieceWords'
import { useLoadPlan } from '../api/load'

/**
 * /firings/:firingId/unload: the load as it went in, top layer first (as crew take it out), each
 * piece's tag and potter; scanning or typing a tag opens that piece with its result form.
 */
export function UnloadPage() {
  const { firingId = '' } = useParams()
  const navigate = useNavigate()
  const plan = useLoadPlan(firingId)
  const open = (tag: string) => navigate(`/pieces/${tag}?unload=${firingId}`)

  if (plan.isPending) return <Spinner label="Reading the load…" />
  if (plan.isError)
    return (
      <Alert tone="danger" title="The load could not be read">
        {plan.error instanceof ApiError ? plan.error.message : 'Check your connection and try again.'}
      </Alert>
    )
  const layers = [...plan.data.layers].reverse()
  const pieces = layers.flatMap((l) => l.shelves.flatMap((s) => s.pieces))
  const done = pieces.filter((p) => p.outcome !== null).length

  return (
    <article className="space-y-6">
      <header className="space-y-2">
        <p className="text-sm">
          <Link to={`/firings/${firingId}/load`} className="font-medium text-clay-700 hover:underline">
            ← The load
          </Link>
        </p>
        <h1 className="text-2xl font-bold tracking-tight sm:text-3xl">Unloading</h1>
        <p className="text-slip-700" data-testid="unload-progress">
          {done} of {pieces.length} {pieces.length === 1 ? 'piece has its' : 'pieces have their'} result.
        </p>
      </header>

      <Alert tone="warning" title="Before you reach in">
        Open the kiln only when it has cooled as its maker says (usually below about 65 °C / 150 °F), with the power off; wear
        heat-resistant gloves and eye protection, since glaze shards and stilts are sharp. Follow the kiln maker’s instructions and your
        local codes.
      </Alert>

      <Card>
        <FindPiece label="Open a piece" onTag={open} />
      </Card>

      {layers.map((layer) => (
        <section key={layer.index} aria-labelledby={`unload-layer-${layer.index}`} className="space-y-2" data-testid="unload-layer">
          <h2 id={`unload-layer-${layer.index}`} className="text-lg font-semibold">
            Layer {layer.index + 1}
            {layer.index === 0 && ' (bottom)'}
          </h2>
          {layer.shelves.map((shelf) => (
            <div key={shelf.index}>
              <h3 className="text-sm font-semibold text-slip-700">Shelf {shelf.index + 1}</h3>
              <ul className="mt-1 divide-y divide-slip-200 rounded-card border border-slip-200 bg-white">
                {shelf.pieces.map((p) => (
                  <li key={p.key}>
                    {p.tag ? (
                      <Link
                        to={`/pieces/${p.tag}?unload=${firingId}`}
                        className="flex min-h-12 flex-wrap items-center gap-x-3 gap-y-1 px-3 py-2 hover:bg-slip-50"
                        data-testid="unload-piece"
                      >
                        <span className="font-mono text-base font-semibold">{p.tag}</span>
                        <span className="text-sm">
                          {p.potterName} · {p.label}
                        </span>
                        {p.outcome ? (
                          <Badge tone={p.outcome === 'fine' ? 'celadon' : 'ember'}>{outcomeLabel(p.outcome)}</Badge>
                        ) : (
                          <Badge>No result yet</Badge>
                        )}
                      </Link>
                    ) : (
                      <p className="px-3 py-2 text-sm text-slip-600">
                        Not checked in: {p.potterName} · {p.label}
                      </p>
                    )}
                  </li>
                ))}
              </ul>
            </div>
          ))}
        </section>
      ))}
    </article>
  )
}
