import { useRef, useState, type KeyboardEvent, type PointerEvent } from 'react'
import type { LoadKiln, ShelfGeometry } from '../../../../shared/firing/load'
import type { LoadLayerJson, LoadPieceJson } from '../../../../shared/api/load'
import type { Placement } from '../loadMoves'

interface LayerDrawingProps {
  kiln: LoadKiln
  layer: LoadLayerJson
  colours: Map<string, string>
  selected: string | null
  /** A move not yet standing (being dragged, or refused): drawn where crew put it. */
  draft: Placement | null
  refused: boolean
  editable: boolean
  onSelect: (key: string) => void
  onDraft: (move: Placement) => void
  onCommit: (move: Placement) => void
  onCancel: () => void
}

/** A nudge by the arrow keys: 5 mm, or 25 mm with Shift. */
const NUDGE_MM = 5
const BIG_NUDGE_MM = 25

function chamberBox(kiln: LoadKiln) {
  if ('diameterMm' in kiln.chamber) {
    const r = kiln.chamber.diameterMm / 2
    return { minX: -r, minY: -r, width: 2 * r, height: 2 * r }
  }
  const { widthMm, depthMm } = kiln.chamber
  return { minX: -widthMm / 2, minY: -depthMm / 2, width: widthMm, height: depthMm }
}

/** The shelf's outline in its own frame: a circle, a half circle (flat edge on y = 0), or a rectangle. */
function ShelfOutline({ shelf }: { shelf: ShelfGeometry }) {
  const common = { className: 'fill-slip-100 stroke-slip-500', strokeWidth: 2 }
  if (shelf.shape === 'round') return <circle cx={0} cy={0} r={shelf.widthMm / 2} {...common} />
  if (shelf.shape === 'half') {
    const r = shelf.widthMm / 2
    return <path d={`M ${-r} 0 A ${r} ${r} 0 0 1 ${r} 0 Z`} {...common} />
  }
  return <rect x={-shelf.widthMm / 2} y={-shelf.depthMm / 2} width={shelf.widthMm} height={shelf.depthMm} {...common} />
}

/**
 * One layer of the load drawn to scale (SVG, millimetres): the chamber, its shelves and every piece as
 * its footprint, coloured by potter and labelled by its tag. Crew drag a piece on its shelf, or focus
 * it and move it with the arrow keys; Enter saves, Escape puts it back.
 */
export function LayerDrawing(props: LayerDrawingProps) {
  const { kiln, layer, colours, selected, draft, refused, editable } = props
  const box = chamberBox(kiln)
  const groups = useRef(new Map<number, SVGGElement>())
  const [dragging, setDragging] = useState<{ key: string; dx: number; dy: number } | null>(null)
  const fontSize = Math.max(14, Math.min(box.width, box.height) / 28)

  const pointIn = (shelfIndex: number, event: PointerEvent) => {
    const group = groups.current.get(shelfIndex)
    const matrix = group?.getScreenCTM()?.inverse()
    if (!group || !matrix) return null
    const point = new DOMPoint(event.clientX, event.clientY).matrixTransform(matrix)
    return { x: point.x, y: point.y }
  }

  const placementOf = (piece: LoadPieceJson, shelf: number): Placement => ({
    key: piece.key,
    layer: layer.index,
    shelf,
    x: piece.x,
    y: piece.y,
    rotation: piece.rotation,
  })

  const keyDown = (event: KeyboardEvent, piece: LoadPieceJson, shelf: number) => {
    if (!editable) return
    const step = event.shiftKey ? BIG_NUDGE_MM : NUDGE_MM
    const base = draft?.key === piece.key ? draft : placementOf(piece, shelf)
    const by: Record<string, [number, number]> = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, -step], ArrowDown: [0, step] }
    if (by[event.key]) {
      event.preventDefault()
      // On a turned (lower half) shelf the arrows still move the piece as it looks on screen.
      const sign = kiln.shelves[shelf]?.turn === 180 ? -1 : 1
      props.onDraft({ ...base, x: base.x + sign * by[event.key][0], y: base.y + sign * by[event.key][1] })
    } else if (event.key === 'Enter' && draft?.key === piece.key) {
      event.preventDefault()
      props.onCommit(draft)
    } else if (event.key === 'Escape') {
      props.onCancel()
    } else if (event.key === ' ' || event.key === 'Enter') {
      event.preventDefault()
      props.onSelect(piece.key)
    }
  }

  return (
    <svg
      viewBox={`${box.minX - 10} ${box.minY - 10} ${box.width + 20} ${box.height + 20}`}
      className="h-auto w-full max-w-md touch-none select-none"
      role="group"
      aria-label={`Layer ${layer.index + 1} seen from above`}
      data-testid="layer-drawing"
    >
      {'diameterMm' in kiln.chamber ? (
        <circle cx={0} cy={0} r={kiln.chamber.diameterMm / 2} className="fill-white stroke-slip-700" strokeWidth={3} />
      ) : (
        <rect x={box.minX} y={box.minY} width={box.width} height={box.height} className="fill-white stroke-slip-700" strokeWidth={3} />
      )}
      {kiln.shelves.map((geometry) => {
        const shelf = layer.shelves.find((s) => s.index === geometry.index)
        return (
          <g
            key={geometry.index}
            ref={(el) => {
              if (el) groups.current.set(geometry.index, el)
              else groups.current.delete(geometry.index)
            }}
            transform={`translate(${geometry.x} ${geometry.y}) rotate(${geometry.turn})`}
          >
            <ShelfOutline shelf={geometry} />
            {shelf?.pieces.map((piece) => {
              const moved = draft?.key === piece.key && draft.shelf === geometry.index && draft.layer === layer.index ? draft : null
              const x = moved?.x ?? piece.x
              const y = moved?.y ?? piece.y
              const turned = (moved?.rotation ?? piece.rotation) !== piece.rotation
              const w = turned ? piece.depthMm : piece.widthMm
              const d = turned ? piece.widthMm : piece.depthMm
              const isSelected = selected === piece.key
              const stroke = moved && refused ? 'stroke-danger-700' : isSelected ? 'stroke-clay-800' : 'stroke-slip-800'
              const shape = {
                fill: colours.get(piece.potterId),
                className: `${stroke} ${editable ? 'cursor-grab' : ''}`,
                strokeWidth: isSelected ? 5 : 2,
                strokeDasharray: moved ? '10 6' : undefined,
              }
              return (
                <g
                  key={piece.key}
                  tabIndex={0}
                  role="button"
                  aria-pressed={isSelected}
                  aria-label={`${piece.tag ?? piece.label}, ${piece.potterName}’s ${piece.label}${editable ? '; arrow keys move it, Enter saves' : ''}`}
                  data-testid="load-piece"
                  data-tag={piece.tag ?? ''}
                  className="focus:outline-none [&:focus>*:first-child]:stroke-clay-700"
                  onKeyDown={(e) => keyDown(e, piece, geometry.index)}
                  onClick={() => props.onSelect(piece.key)}
                  onPointerDown={(e) => {
                    props.onSelect(piece.key)
                    if (!editable) return
                    const at = pointIn(geometry.index, e)
                    if (!at) return
                    ;(e.currentTarget as Element).setPointerCapture(e.pointerId)
                    setDragging({ key: piece.key, dx: at.x - x, dy: at.y - y })
                  }}
                  onPointerMove={(e) => {
                    if (dragging?.key !== piece.key) return
                    const at = pointIn(geometry.index, e)
                    if (at) props.onDraft({ ...placementOf(piece, geometry.index), x: at.x - dragging.dx, y: at.y - dragging.dy })
                  }}
                  onPointerUp={() => {
                    if (dragging?.key !== piece.key) return
                    setDragging(null)
                    if (moved && (Math.abs(moved.x - piece.x) > 0.5 || Math.abs(moved.y - piece.y) > 0.5)) props.onCommit(moved)
                  }}
                >
                  {piece.round ? (
                    <circle cx={x} cy={y} r={w / 2} {...shape} />
                  ) : (
                    <rect x={x - w / 2} y={y - d / 2} width={w} height={d} {...shape} />
                  )}
                  <text
                    x={x}
                    y={y}
                    transform={`rotate(${-geometry.turn} ${x} ${y})`}
                    textAnchor="middle"
                    dominantBaseline="central"
                    fontSize={Math.min(fontSize, w / 6)}
                    className="pointer-events-none fill-slip-900 font-mono font-semibold"
                  >
                    {piece.tag ?? '—'}
                  </text>
                </g>
              )
            })}
          </g>
        )
      })}
    </svg>
  )
}
