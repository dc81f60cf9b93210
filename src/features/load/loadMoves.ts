// The crew's moves on a load plan as placements to send: every piece standing is kept where it is
// (crew expect nothing else to move when they move one), with the moved piece in its new place.
import type { LoadPlanJson, LoadPieceJson } from '../../../shared/api/load'
import { spotOnShelf, type Placement } from '../../../shared/firing/load'

export type { Placement }

/** Every piece placed in the plan, where it stands. */
export function placementsOf(plan: Pick<LoadPlanJson, 'layers'>): Placement[] {
  return plan.layers.flatMap((layer) =>
    layer.shelves.flatMap((shelf) =>
      shelf.pieces.map((p) => ({
        key: p.key,
        layer: layer.index,
        shelf: shelf.index,
        x: round1(p.x),
        y: round1(p.y),
        rotation: p.rotation,
      })),
    ),
  )
}

/** Positions are sent to a tenth of a millimetre (the planner's tolerance is 0.2 mm). */
const round1 = (n: number) => Math.round(n * 10) / 10

export function withMove(placements: Placement[], move: Placement): Placement[] {
  const moved = { ...move, x: round1(move.x), y: round1(move.y) }
  return placements.some((p) => p.key === move.key) ? placements.map((p) => (p.key === move.key ? moved : p)) : [...placements, moved]
}

export function piecesOn(plan: Pick<LoadPlanJson, 'layers'>, layer: number, shelf: number): LoadPieceJson[] {
  return plan.layers.find((l) => l.index === layer)?.shelves.find((s) => s.index === shelf)?.pieces ?? []
}

/**
 * Where a piece would go on another shelf: a free spot among the pieces standing there, or null
 * when there is none (said to crew at once, without asking the server).
 */
export function moveToShelf(plan: LoadPlanJson, piece: LoadPieceJson, layer: number, shelf: number): Placement | null {
  const standing = piecesOn(plan, layer, shelf).filter((p) => p.key !== piece.key)
  const lying = {
    key: piece.key,
    heightMm: piece.heightMm,
    widthMm: piece.widthMm,
    depthMm: piece.depthMm,
    round: piece.round,
    weightKg: piece.weightKg,
  }
  const spot = spotOnShelf(plan.kiln, plan.gapMm, shelf, standing, lying)
  if (!spot) return null
  // The spot's turn is on top of how the piece lies now.
  const rotation = spot.rotation === 90 ? (piece.rotation === 90 ? 0 : 90) : piece.rotation
  return { key: piece.key, layer, shelf, x: spot.x, y: spot.y, rotation }
}
