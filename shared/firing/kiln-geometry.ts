// The kiln's geometry as the ware check, the quote and the load planner share it: the tallest piece,
// the shelf a chamber takes, a piece's footprint. Pure; imports only types, so every firing module can
// build on it without import cycles.
import type { Kiln, Piece, ShelfFootprint } from './check'

/** A kiln shelf, 5/8 in (16 mm) cordierite, the common thickness. */
export const SHELF_THICKNESS_MM = 16
/**
 * Room besides the bottom shelf: the posts under it and clearance under the lid and elements. With
 * the shelf that is about 65 mm of the chamber's height (from memory).
 */
export const HEADROOM_MM = 49
/** Shelves are about 50 mm smaller than the chamber so they clear the walls and let heat move (from memory). */
export const SHELF_CLEARANCE_MM = 50

/** The tallest piece the kiln takes: as stated, or the interior height less one shelf and headroom. */
export function usableHeightMm(kiln: Pick<Kiln, 'interior' | 'usableHeightMm'>): number {
  if (kiln.usableHeightMm !== undefined) return kiln.usableHeightMm
  return Math.max(0, kiln.interior.heightMm - SHELF_THICKNESS_MM - HEADROOM_MM)
}

// A test kiln a few inches across has shelves cut to fit it: the clearance never takes more than a quarter.
export function shelfAcross(chamberMm: number): number {
  return chamberMm - Math.min(SHELF_CLEARANCE_MM, chamberMm / 4)
}

export function shelfFootprint(kiln: Pick<Kiln, 'interior'>): ShelfFootprint {
  const interior = kiln.interior
  if (interior.shape === 'round') return { shape: 'round', diameterMm: shelfAcross(interior.diameterMm) }
  return { shape: 'box', widthMm: shelfAcross(interior.widthMm), depthMm: shelfAcross(interior.depthMm) }
}

/** Shelf area in mm², for shelf-share pricing. */
export function shelfAreaMm2(kiln: Pick<Kiln, 'interior'>): number {
  const shelf = shelfFootprint(kiln)
  if (shelf.shape === 'round') return (Math.PI * shelf.diameterMm * shelf.diameterMm) / 4
  return shelf.widthMm * shelf.depthMm
}

/** Chamber volume in litres (interior, before shelves). */
export function kilnVolumeL(kiln: Pick<Kiln, 'interior'>): number {
  const interior = kiln.interior
  const mm3 =
    interior.shape === 'round'
      ? (Math.PI * interior.diameterMm * interior.diameterMm * interior.heightMm) / 4
      : interior.widthMm * interior.depthMm * interior.heightMm
  return mm3 / 1_000_000
}

/** A round piece's depth is its diameter; otherwise width and depth as given. */
export function pieceDepthMm(piece: Pick<Piece, 'widthMm' | 'depthMm' | 'round'>): number {
  return piece.round === true ? piece.widthMm : piece.depthMm
}
