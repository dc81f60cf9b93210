// The load: pieces on shelves, shelves on posts, layer over layer up to the lid. Pure and
// deterministic, so the browser re-checks a crew member's drag as it happens and the server plans,
// holds space and prices with the very same figures.
//
// Every position is a piece's centre in its shelf's own frame, in millimetres: a round shelf's centre
// is its origin; a half shelf is the half of that circle with y ≥ 0 (its straight edge on the x axis);
// a box shelf's centre is its origin. Round pieces are circles; other pieces are rectangles turned by
// 0 or 90 degrees.
import { MaxRectsBin, PACKING_LOGIC } from 'maxrects-packer'
import type { FiringKind, Kiln } from './check'
import { SHELF_THICKNESS_MM, shelfAcross, usableHeightMm } from './kiln-geometry'

/** What a studio says about a kiln's furniture beyond its shelf count and size; all optional. */
export interface KilnFurniture {
  /** Round kilns: pairs of half shelves instead of whole round ones. */
  halfShelves?: boolean
  /** The post sizes the studio has; up to three are stacked for a taller layer. */
  postHeightsMm?: number[]
  /** Between glazed pieces, side to side. */
  glazedGapMm?: number
  /** Between pieces in a bisque load (bisque ware may touch). */
  bisqueGapMm?: number
  /** Over the tallest piece of a layer, up to the shelf above. */
  headClearanceMm?: number
  shelfThicknessMm?: number
}

/** The kiln's shelves as its record keeps them. */
export interface KilnShelves {
  /** Shelves owned; half shelves count one each. */
  count: number
  /** Round kilns: the shelf's diameter; box kilns: one shelf's width and depth. Not given: cut to the chamber. */
  widthMm?: number
  depthMm?: number
  furniture?: KilnFurniture
}

/** ½ in between glazed pieces, so glaze cannot bridge them (common practice). */
export const GLAZED_GAP_MM = 13
/** Bisque ware may touch and even nest (common practice). */
export const BISQUE_GAP_MM = 0
/** ½ in over the tallest piece to the shelf above (common practice, from memory). */
export const HEAD_CLEARANCE_MM = 13
/** Post sizes sold for kiln furniture, ½ in to 10 in (common sizes, from memory). */
export const POST_HEIGHTS_MM = [13, 25, 51, 76, 102, 127, 152, 203, 254]
/** Posts stacked for one layer: more than three is asking for a fall (common practice). */
export const MAX_POSTS_STACKED = 3
/** Between shelves laid side by side in a box kiln, and between two half shelves, for the heat to move (from memory). */
export const SHELF_SPACING_MM = 13
/** Height bands space is reported in: 4, 8, 12 and 18 in, the sizes potters think in. */
export const SPACE_BANDS_MM = [102, 203, 305, 457]

export type ShelfShape = 'round' | 'half' | 'box'

export interface ShelfGeometry {
  index: number
  shape: ShelfShape
  /** round: the diameter twice; half: the diameter and the radius; box: width and depth. */
  widthMm: number
  depthMm: number
  /** Where the shelf's own origin sits in its layer, and how it is turned (the lower half shelf is turned 180°). */
  x: number
  y: number
  turn: 0 | 180
  /** In whole shelves: a half shelf is 0.5. */
  units: number
  areaMm2: number
}

/** A kiln as the planner sees it: one layer's shelves, how many layers the shelves make, posts and gaps. */
export interface LoadKiln {
  shape: 'round' | 'box'
  /** The chamber, for drawing: a diameter, or a width and depth. */
  chamber: { diameterMm: number } | { widthMm: number; depthMm: number }
  halfShelves: boolean
  shelves: ShelfGeometry[]
  layers: number
  usableHeightMm: number
  shelfThicknessMm: number
  postSizesMm: number[]
  /** Every height a stack of up to MAX_POSTS_STACKED posts gives, lowest first. */
  postStacksMm: number[]
  glazedGapMm: number
  bisqueGapMm: number
  headClearanceMm: number
  shelfLoadKg: number | null
}

export type LoadKilnInput = Pick<Kiln, 'interior' | 'usableHeightMm' | 'shelfLoadKg'> & { shelves?: KilnShelves }

function postStacks(sizes: number[]): number[] {
  const heights = new Set<number>()
  const grow = (sum: number, from: number, depth: number) => {
    if (depth > 0) heights.add(Math.round(sum * 10) / 10)
    if (depth === MAX_POSTS_STACKED) return
    for (let i = from; i < sizes.length; i++) grow(sum + sizes[i], i, depth + 1)
  }
  grow(0, 0, 0)
  return [...heights].sort((a, b) => a - b)
}

function circleShelf(index: number, diameterMm: number, x = 0, y = 0): ShelfGeometry {
  return {
    index,
    shape: 'round',
    widthMm: diameterMm,
    depthMm: diameterMm,
    x,
    y,
    turn: 0,
    units: 1,
    areaMm2: (Math.PI * diameterMm ** 2) / 4,
  }
}

function boxShelf(index: number, widthMm: number, depthMm: number, x = 0, y = 0): ShelfGeometry {
  return { index, shape: 'box', widthMm, depthMm, x, y, turn: 0, units: 1, areaMm2: widthMm * depthMm }
}

/** How many shelves of one size lie side by side across a span, with spacing between them. */
const fitAcross = (spanMm: number, shelfMm: number) => Math.floor((spanMm + SHELF_SPACING_MM) / (shelfMm + SHELF_SPACING_MM))

/** The kiln's furniture resolved: one layer's shelves, the layers the shelves owned make, posts and gaps. */
export function loadKiln(kiln: LoadKilnInput): LoadKiln {
  const furniture = kiln.shelves?.furniture ?? {}
  const count = kiln.shelves?.count ?? 0
  const interior = kiln.interior
  const posts = (furniture.postHeightsMm?.length ? furniture.postHeightsMm : POST_HEIGHTS_MM).filter((h) => h > 0)
  let shelves: ShelfGeometry[]
  let halfShelves = false
  if (interior.shape === 'round') {
    const across = shelfAcross(interior.diameterMm)
    const diameter = Math.min(kiln.shelves?.widthMm ?? across, interior.diameterMm)
    halfShelves = furniture.halfShelves === true
    if (halfShelves) {
      const half = (index: number, y: number, turn: 0 | 180): ShelfGeometry => ({
        index,
        shape: 'half',
        widthMm: diameter,
        depthMm: diameter / 2,
        x: 0,
        y,
        turn,
        units: 0.5,
        areaMm2: (Math.PI * diameter ** 2) / 8,
      })
      shelves = [half(0, -SHELF_SPACING_MM / 2, 180), half(1, SHELF_SPACING_MM / 2, 0)]
    } else shelves = [circleShelf(0, diameter)]
  } else {
    const spanW = shelfAcross(interior.widthMm)
    const spanD = shelfAcross(interior.depthMm)
    const w = Math.min(kiln.shelves?.widthMm ?? spanW, Math.max(spanW, spanD))
    const d = Math.min(kiln.shelves?.depthMm ?? spanD, Math.max(spanW, spanD))
    // Shelves lie whichever way round puts more of them in a layer.
    const straight = fitAcross(spanW, w) * fitAcross(spanD, d)
    const turned = fitAcross(spanW, d) * fitAcross(spanD, w)
    const [sw, sd] = turned > straight ? [d, w] : [w, d]
    const cols = Math.max(1, fitAcross(spanW, sw))
    const rows = Math.max(1, fitAcross(spanD, sd))
    shelves = []
    for (let row = 0; row < rows; row++)
      for (let col = 0; col < cols; col++)
        shelves.push(
          boxShelf(
            shelves.length,
            sw,
            sd,
            (col - (cols - 1) / 2) * (sw + SHELF_SPACING_MM),
            (row - (rows - 1) / 2) * (sd + SHELF_SPACING_MM),
          ),
        )
  }
  const usable = usableHeightMm(kiln)
  const thickness = furniture.shelfThicknessMm ?? SHELF_THICKNESS_MM
  const sorted = [...posts].sort((a, b) => a - b)
  // Shelves not counted: as many layers as the shortest posts and the usable height allow.
  const possible = 1 + Math.floor(usable / (thickness + (sorted[0] ?? usable)))
  return {
    shape: interior.shape,
    chamber: interior.shape === 'round' ? { diameterMm: interior.diameterMm } : { widthMm: interior.widthMm, depthMm: interior.depthMm },
    halfShelves,
    shelves,
    // The kiln floor (or its bottom shelf) always takes one layer.
    layers: count > 0 ? Math.max(1, Math.floor(count / shelves.length)) : possible,
    usableHeightMm: usable,
    shelfThicknessMm: thickness,
    postSizesMm: sorted,
    postStacksMm: postStacks(posts),
    glazedGapMm: furniture.glazedGapMm ?? GLAZED_GAP_MM,
    bisqueGapMm: furniture.bisqueGapMm ?? BISQUE_GAP_MM,
    headClearanceMm: furniture.headClearanceMm ?? HEAD_CLEARANCE_MM,
    shelfLoadKg: kiln.shelfLoadKg ?? null,
  }
}

/** The gap between pieces in a firing of this kind: bisque ware may touch, glazed ware may not. */
export function gapFor(kiln: LoadKiln, kind: FiringKind): number {
  return kind === 'bisque' ? kiln.bisqueGapMm : kiln.glazedGapMm
}

/** The lowest post stack that is at least this tall, or null when no stack of the studio's posts is. */
export function postFor(kiln: LoadKiln, needMm: number): number | null {
  for (const h of kiln.postStacksMm) if (h >= needMm - 1e-9) return h
  return null
}

// ————— Pieces and their footprints —————

export interface LoadPiece {
  /** Stable across re-plans: `${requestId}:${pieceIndex}:${copy}`. */
  key: string
  heightMm: number
  /** The diameter when round. */
  widthMm: number
  depthMm: number
  round: boolean
  weightKg: number | null
}

export type Rotation = 0 | 90

export interface Placement {
  key: string
  layer: number
  shelf: number
  x: number
  y: number
  rotation: Rotation
}

type Footprint = { round: true; r: number } | { round: false; w: number; h: number }

function footprintOf(piece: Pick<LoadPiece, 'round' | 'widthMm' | 'depthMm'>, rotation: Rotation): Footprint {
  if (piece.round) return { round: true, r: piece.widthMm / 2 }
  return rotation === 90 ? { round: false, w: piece.depthMm, h: piece.widthMm } : { round: false, w: piece.widthMm, h: piece.depthMm }
}

/** The footprint's area with half the gap around it: what it takes from a shelf. */
function takenArea(fp: Footprint, gap: number): number {
  return fp.round ? Math.PI * (fp.r + gap / 2) ** 2 : (fp.w + gap) * (fp.h + gap)
}

/** The footprint's own area. */
export function footprintAreaMm2(piece: Pick<LoadPiece, 'round' | 'widthMm' | 'depthMm'>): number {
  return piece.round ? (Math.PI * piece.widthMm ** 2) / 4 : piece.widthMm * piece.depthMm
}

interface Placed {
  key: string
  x: number
  y: number
  fp: Footprint
}

const EPS = 1e-7
/** What a checked position may be off by (positions are shown and sent to a tenth of a millimetre). */
export const PLACEMENT_TOLERANCE_MM = 0.2

/**
 * The centre positions x, on the row at height y, where a footprint would come closer than `gap`
 * to a placed one: an open interval, or null. Circles and rectangles are measured exactly (a circle
 * against a rectangle by the rounded rectangle around it); two rectangles must be apart by the gap
 * across or along, as a rectangle packer spaces them.
 */
function blockedSpan(fp: Footprint, p: Placed, y: number, gap: number): [number, number] | null {
  const dy = Math.abs(y - p.y)
  let half: number
  if (fp.round && p.fp.round) {
    const reach = fp.r + p.fp.r + gap
    if (dy >= reach) return null
    half = Math.sqrt(reach * reach - dy * dy)
  } else if (!fp.round && !p.fp.round) {
    if (dy >= (fp.h + p.fp.h) / 2 + gap) return null
    half = (fp.w + p.fp.w) / 2 + gap
  } else {
    const rect = fp.round ? (p.fp as { w: number; h: number }) : fp
    const r = (fp.round ? fp.r : (p.fp as { r: number }).r) + gap
    const a = rect.w / 2
    const b = rect.h / 2
    if (dy <= b) half = a + r
    else if (dy < b + r) half = a + Math.sqrt(r * r - (dy - b) ** 2)
    else return null
  }
  return [p.x - half, p.x + half]
}

/** The heights a footprint's centre may take on a shelf (empty when it cannot lie there at all). */
function rowRange(shelf: ShelfGeometry, fp: Footprint): [number, number] {
  const R = shelf.widthMm / 2
  if (shelf.shape === 'box') {
    const h = fp.round ? fp.r : fp.h / 2
    const w = fp.round ? fp.r : fp.w / 2
    if (w > shelf.widthMm / 2 + EPS) return [1, 0]
    return [-shelf.depthMm / 2 + h, shelf.depthMm / 2 - h]
  }
  if (fp.round) return shelf.shape === 'round' ? [-(R - fp.r), R - fp.r] : [fp.r, R - fp.r]
  const reach = R * R - (fp.w / 2) ** 2
  if (reach < 0) return [1, 0]
  const top = Math.sqrt(reach) - fp.h / 2
  return shelf.shape === 'round' ? [-top, top] : [fp.h / 2, top]
}

/** The centre positions x the shelf's edge allows on the row at height y, or null. */
function rowSpan(shelf: ShelfGeometry, fp: Footprint, y: number): [number, number] | null {
  const R = shelf.widthMm / 2
  let half: number
  if (shelf.shape === 'box') half = shelf.widthMm / 2 - (fp.round ? fp.r : fp.w / 2)
  else if (fp.round) {
    const s = (R - fp.r) ** 2 - y * y
    if (s < -EPS) return null
    half = Math.sqrt(Math.max(0, s))
  } else {
    // The corner farthest from the circle's centre decides.
    const far = shelf.shape === 'round' ? Math.abs(y) + fp.h / 2 : y + fp.h / 2
    const s = R * R - far * far
    if (s < -EPS) return null
    half = Math.sqrt(Math.max(0, s)) - fp.w / 2
  }
  return half < -EPS ? null : [-Math.max(0, half), Math.max(0, half)]
}

/**
 * The leftmost point of [from, to] outside every open interval, or null. Sorted by their left ends,
 * one pass does: the point only moves right, past intervals already passed.
 */
function leftmostFree(from: number, to: number, blocked: [number, number][]): number | null {
  blocked.sort((a, b) => a[0] - b[0])
  let x = from
  for (const [l, r] of blocked) if (l + EPS < x && x < r - EPS) x = r
  return x <= to + EPS ? Math.min(x, to) : null
}

/** A shelf's placed footprints, kept in order of y so a row looks only at its neighbours. */
interface ShelfPieces {
  placed: Placed[]
  /** The largest half-depth of any placed footprint. */
  maxHalf: number
  /**
   * Per footprint, the lowest row where one could still go: a shelf only gets fuller while a plan is
   * made, so the next piece of the same footprint starts its search there.
   */
  rowFrom: Map<string, number>
}

const halfDepth = (fp: Footprint) => (fp.round ? fp.r : fp.h / 2)

/** Index of the first placed footprint with y ≥ value. */
function firstAtOrAbove(placed: Placed[], value: number): number {
  let lo = 0
  let hi = placed.length
  while (lo < hi) {
    const mid = (lo + hi) >> 1
    if (placed[mid].y < value) lo = mid + 1
    else hi = mid
  }
  return lo
}

function addPlaced(pieces: ShelfPieces, p: Placed) {
  pieces.placed.splice(firstAtOrAbove(pieces.placed, p.y), 0, p)
  pieces.maxHalf = Math.max(pieces.maxHalf, halfDepth(p.fp))
}

/** Lowest row first, then leftmost: the bottom-left place for a footprint among the placed ones, or null. */
function scanPlace(
  shelf: ShelfGeometry,
  pieces: ShelfPieces,
  piece: LoadPiece,
  gap: number,
): { x: number; y: number; rotation: Rotation } | null {
  const rotations: Rotation[] = piece.round || piece.widthMm === piece.depthMm ? [0] : [0, 90]
  const step = Math.min(6, Math.max(2, Math.min(shelf.widthMm, shelf.depthMm) / 120))
  const { placed } = pieces
  let best: { x: number; y: number; rotation: Rotation } | null = null
  for (const rotation of rotations) {
    const fp = footprintOf(piece, rotation)
    const signature = fp.round ? `c${fp.r}` : `r${fp.w}x${fp.h}`
    const from = pieces.rowFrom.get(signature) ?? -Infinity
    const [low, high] = rowRange(shelf, fp)
    if (low > high + EPS || from === Infinity) continue
    const rows: number[] = []
    for (let y = low; y < high - EPS; y += step) if (y >= from - EPS) rows.push(y)
    rows.push(Math.max(low, high))
    const reach = halfDepth(fp) + pieces.maxHalf + gap
    let found = false
    for (const y of rows) {
      if (best && y > best.y + EPS) break
      const span = rowSpan(shelf, fp, y)
      if (!span) continue
      const blocked: [number, number][] = []
      for (let i = firstAtOrAbove(placed, y - reach); i < placed.length && placed[i].y < y + reach; i++) {
        const b = blockedSpan(fp, placed[i], y, gap)
        if (b) blocked.push(b)
      }
      const x = leftmostFree(span[0], span[1], blocked)
      if (x === null) continue
      pieces.rowFrom.set(signature, y)
      found = true
      if (!best || y < best.y - EPS || x < best.x) best = { x, y, rotation }
      break
    }
    if (!found && !best) pieces.rowFrom.set(signature, Infinity)
  }
  return best
}

/** Whether a footprint at (x, y) lies on the shelf, within the tolerance. */
function onShelf(shelf: ShelfGeometry, fp: Footprint, x: number, y: number, tol = PLACEMENT_TOLERANCE_MM): boolean {
  const R = shelf.widthMm / 2
  if (shelf.shape === 'box') {
    const w = fp.round ? fp.r : fp.w / 2
    const h = fp.round ? fp.r : fp.h / 2
    return Math.abs(x) + w <= shelf.widthMm / 2 + tol && Math.abs(y) + h <= shelf.depthMm / 2 + tol
  }
  if (fp.round) {
    if (shelf.shape === 'half' && y - fp.r < -tol) return false
    return Math.hypot(x, y) + fp.r <= R + tol
  }
  if (shelf.shape === 'half' && y - fp.h / 2 < -tol) return false
  const far = shelf.shape === 'round' ? Math.abs(y) + fp.h / 2 : y + fp.h / 2
  return Math.hypot(Math.abs(x) + fp.w / 2, far) <= R + tol
}

/** Whether two placed footprints come closer than the gap, within the tolerance. */
function clash(a: Placed, b: Placed, gap: number, tol = PLACEMENT_TOLERANCE_MM): boolean {
  const span = blockedSpan(a.fp, b, a.y, gap)
  return span !== null && span[0] + tol < a.x && a.x < span[1] - tol
}

/** Whether a piece's footprint can lie on this shelf at all, in some turn. */
function fitsShelf(shelf: ShelfGeometry, piece: LoadPiece): boolean {
  const rotations: Rotation[] = piece.round ? [0] : [0, 90]
  return rotations.some((rotation) => {
    const fp = footprintOf(piece, rotation)
    const [low, high] = rowRange(shelf, fp)
    if (low > high + EPS) return false
    // The widest row of a round or half shelf is its lowest for a half, its middle for a round one.
    const probe = shelf.shape === 'half' ? low : shelf.shape === 'round' ? 0 : low
    return rowSpan(shelf, fp, Math.min(Math.max(probe, low), high)) !== null
  })
}

// ————— Shelves being filled —————

interface ShelfState extends ShelfPieces {
  geometry: ShelfGeometry
  heights: Map<string, number>
  weightKg: number
  /** A box shelf with no crew-placed piece is filled by the rectangle packer. */
  bin: MaxRectsBin | null
}

function newShelf(geometry: ShelfGeometry, gap: number, packer: boolean): ShelfState {
  const bin =
    packer && geometry.shape === 'box'
      ? new MaxRectsBin(geometry.widthMm, geometry.depthMm, gap, {
          smart: false,
          pot: false,
          square: false,
          allowRotation: true,
          border: 0,
          logic: PACKING_LOGIC.MAX_AREA,
        })
      : null
  return { geometry, placed: [], maxHalf: 0, rowFrom: new Map(), heights: new Map(), weightKg: 0, bin }
}

/** Places a piece on the shelf if it fits there, and says where. */
function placeOn(shelf: ShelfState, piece: LoadPiece, gap: number): { x: number; y: number; rotation: Rotation } | null {
  const g = shelf.geometry
  if (shelf.bin) {
    const rect = shelf.bin.add(piece.widthMm, piece.round ? piece.widthMm : piece.depthMm, { key: piece.key })
    if (!rect) return null
    const rotation: Rotation = rect.rot && !piece.round ? 90 : 0
    const spot = { x: rect.x + rect.width / 2 - g.widthMm / 2, y: rect.y + rect.height / 2 - g.depthMm / 2, rotation }
    commit(shelf, piece, spot)
    return spot
  }
  const spot = scanPlace(g, shelf, piece, gap)
  if (spot) commit(shelf, piece, spot)
  return spot
}

function commit(shelf: ShelfState, piece: LoadPiece, spot: { x: number; y: number; rotation: Rotation }) {
  addPlaced(shelf, { key: piece.key, x: spot.x, y: spot.y, fp: footprintOf(piece, spot.rotation) })
  shelf.heights.set(piece.key, piece.heightMm)
  shelf.weightKg += piece.weightKg ?? 0
}

/** Whether one more of this piece would still go on the shelf (nothing is changed). */
function roomForAnother(shelf: ShelfState, piece: LoadPiece, gap: number): boolean {
  if (shelf.bin) return shelf.bin.clone().add(piece.widthMm, piece.round ? piece.widthMm : piece.depthMm, null) !== undefined
  return scanPlace(shelf.geometry, { ...shelf, rowFrom: new Map(shelf.rowFrom) }, piece, gap) !== null
}

/**
 * A free spot for one more piece on one shelf, around the pieces standing there as they lie (crew
 * moving a piece to another shelf by its buttons): the exact search, turned if need be; null when it
 * does not go. The server checks the move again with the whole plan.
 */
export function spotOnShelf(
  kiln: LoadKiln,
  gapMm: number,
  shelfIndex: number,
  standing: Pick<PlacedPiece, 'key' | 'x' | 'y' | 'heightMm' | 'round' | 'widthMm' | 'depthMm' | 'weightKg'>[],
  piece: LoadPiece,
): { x: number; y: number; rotation: Rotation } | null {
  const geometry = kiln.shelves.find((g) => g.index === shelfIndex)
  if (!geometry || !fitsShelf(geometry, piece)) return null
  const shelf = newShelf(geometry, gapMm, false)
  for (const p of standing) commit(shelf, p, { x: p.x, y: p.y, rotation: 0 })
  return placeOn(shelf, piece, gapMm)
}

// ————— The plan —————

export type UnplacedReason = 'too-tall' | 'too-wide' | 'too-heavy' | 'no-room'

export const UNPLACED_WORDS: Record<UnplacedReason, string> = {
  'too-tall': 'Taller than the kiln’s usable height.',
  'too-wide': 'Its footprint fits none of the kiln’s shelves.',
  'too-heavy': 'Heavier than one shelf may carry.',
  'no-room': 'No room left in the load for it.',
}

export interface PlacedPiece extends Placement {
  heightMm: number
  round: boolean
  /** The footprint as it lies (turned when rotation is 90). */
  widthMm: number
  depthMm: number
  weightKg: number | null
  pinned: boolean
}

export interface ShelfPlan {
  index: number
  weightKg: number
  /** The share of the shelf the pieces take, with half the gap around each (0–1). */
  taken: number
  pieces: PlacedPiece[]
}

export interface LayerPlan {
  index: number
  tallestMm: number
  /** The posts standing on this layer's shelf and carrying the next; null for the top layer and empty ones. */
  postMm: number | null
  /** The top of this layer's shelf above the top of the bottom shelf. */
  baseMm: number
  /** The tallest piece the layer takes without moving anything above it. */
  capMm: number
  shelves: ShelfPlan[]
}

export interface PlanProblem {
  key: string
  code: 'no-such-shelf' | 'off-shelf' | 'overlap' | 'overweight' | 'stack-too-tall' | 'unknown-piece' | 'placed-twice'
  message: string
}

export interface LoadPlan {
  kiln: LoadKiln
  gapMm: number
  /** The layers the studio offers (the shelves owned, or fewer when only some are on sale). */
  maxLayers: number
  layers: LayerPlan[]
  unplaced: { key: string; reason: UnplacedReason }[]
  /** Crew placements that could not stand as given; their pieces were planned again. */
  problems: PlanProblem[]
  /** The stack's height: every layer's posts and shelves and the top layer's tallest piece. */
  stackMm: number
}

export interface LoadPlanInput {
  kiln: LoadKiln
  gapMm: number
  pieces: LoadPiece[]
  /** Placements the crew chose: kept where they are, and the rest planned around them. */
  pins?: Placement[]
  /** Layers on sale; the kiln's own layer count when not said. */
  maxLayers?: number
}

interface LayerState {
  shelves: ShelfState[]
  tallestMm: number
}

const mm = (n: number) => `${Math.round(n)} mm`

/** The stack's height for layers of these tallest pieces (empty layers take no shelf); Infinity when posts cannot carry it. */
function stackHeight(kiln: LoadKiln, tallest: number[]): number {
  const used = tallest.filter((t) => t > 0)
  if (!used.length) return 0
  let height = used[used.length - 1]
  for (let i = 0; i < used.length - 1; i++) {
    const post = postFor(kiln, used[i] + kiln.headClearanceMm)
    if (post === null) return Infinity
    height += post + kiln.shelfThicknessMm
  }
  return height
}

const byLoadOrder = (a: LoadPiece, b: LoadPiece) =>
  b.heightMm - a.heightMm || footprintAreaMm2(b) - footprintAreaMm2(a) || (a.key < b.key ? -1 : a.key > b.key ? 1 : 0)

/**
 * Plans a load: the crew's placements first, where they put them (any that cannot stand are
 * reported and planned again), then every other piece tallest first, each on the lowest layer and
 * first shelf with room for it (a rectangle packer on box shelves, an exact bottom-left search on
 * round and half shelves), a new layer opened on top when none has room and the stack still fits
 * under the usable height. A layer's posts are its tallest piece plus the head clearance, rounded up
 * to a stack of the studio's posts; no shelf carries more than its rating.
 */
export function planLoad(input: LoadPlanInput): LoadPlan {
  const { kiln, gapMm: gap } = input
  const maxLayers = Math.max(1, Math.min(kiln.layers, input.maxLayers ?? kiln.layers))
  const pieces = new Map(input.pieces.map((p) => [p.key, p]))
  const pins = input.pins ?? []
  const pinnedShelves = new Set(pins.map((p) => `${p.layer}:${p.shelf}`))
  const layers: LayerState[] = []
  const problems: PlanProblem[] = []
  const addLayer = () => {
    const index = layers.length
    layers.push({
      shelves: kiln.shelves.map((g) => newShelf(g, gap, !pinnedShelves.has(`${index}:${g.index}`))),
      tallestMm: 0,
    })
  }
  const loadLimit = kiln.shelfLoadKg
  const pinned = new Set<string>()

  for (const pin of pins) {
    const piece = pieces.get(pin.key)
    const refuse = (code: PlanProblem['code'], message: string) => problems.push({ key: pin.key, code, message })
    if (!piece) {
      refuse('unknown-piece', 'That piece is not in this load.')
      continue
    }
    if (pinned.has(pin.key)) {
      refuse('placed-twice', 'The piece is placed twice.')
      continue
    }
    if (pin.layer < 0 || pin.layer >= maxLayers || pin.shelf < 0 || pin.shelf >= kiln.shelves.length) {
      refuse('no-such-shelf', `There is no shelf ${pin.shelf + 1} on layer ${pin.layer + 1}; this load has ${maxLayers} layers.`)
      continue
    }
    while (layers.length <= pin.layer) addLayer()
    const shelf = layers[pin.layer].shelves[pin.shelf]
    const fp = footprintOf(piece, pin.rotation)
    if (!onShelf(shelf.geometry, fp, pin.x, pin.y)) {
      refuse('off-shelf', 'It hangs over the shelf’s edge.')
      continue
    }
    const here: Placed = { key: pin.key, x: pin.x, y: pin.y, fp }
    const hit = shelf.placed.find((p) => clash(here, p, gap))
    if (hit) {
      refuse('overlap', `It comes closer than ${mm(gap)} to ${hit.key}.`)
      continue
    }
    if (loadLimit !== null && shelf.weightKg + (piece.weightKg ?? 0) > loadLimit + 1e-9) {
      refuse(
        'overweight',
        `The shelf would carry ${(shelf.weightKg + (piece.weightKg ?? 0)).toFixed(1)} kg; it is rated for ${loadLimit} kg.`,
      )
      continue
    }
    commit(shelf, piece, pin)
    layers[pin.layer].tallestMm = Math.max(layers[pin.layer].tallestMm, piece.heightMm)
    pinned.add(pin.key)
  }

  // A crew-built stack too tall for the kiln loses its top layer's placements until it fits.
  while (
    stackHeight(
      kiln,
      layers.map((l) => l.tallestMm),
    ) >
    kiln.usableHeightMm + PLACEMENT_TOLERANCE_MM
  ) {
    const top = layers.map((l) => l.tallestMm > 0).lastIndexOf(true)
    const over =
      stackHeight(
        kiln,
        layers.map((l) => l.tallestMm),
      ) - kiln.usableHeightMm
    for (const shelf of layers[top].shelves) {
      for (const p of shelf.placed) {
        pinned.delete(p.key)
        problems.push({
          key: p.key,
          code: 'stack-too-tall',
          message: Number.isFinite(over)
            ? `The stack would stand ${mm(over)} above the kiln’s usable height.`
            : 'No stack of the studio’s posts is tall enough for the layer below.',
        })
      }
    }
    layers[top] = { shelves: kiln.shelves.map((g) => newShelf(g, gap, true)), tallestMm: 0 }
  }

  const unplaced: LoadPlan['unplaced'] = []
  const failed = new Map<string, UnplacedReason>()
  const rest = input.pieces.filter((p) => !pinned.has(p.key)).sort(byLoadOrder)
  for (const piece of rest) {
    const kind = `${piece.heightMm}|${piece.widthMm}|${piece.depthMm}|${piece.round}|${piece.weightKg}`
    // The load only gets fuller: a piece just like one that found no room finds none either.
    const already = failed.get(kind)
    if (already) {
      unplaced.push({ key: piece.key, reason: already })
      continue
    }
    const reason = placeInLoad(piece)
    if (reason) {
      failed.set(kind, reason)
      unplaced.push({ key: piece.key, reason })
    }
  }

  function placeInLoad(piece: LoadPiece): UnplacedReason | null {
    if (piece.heightMm > kiln.usableHeightMm + EPS) return 'too-tall'
    if (!kiln.shelves.some((g) => fitsShelf(g, piece))) return 'too-wide'
    if (loadLimit !== null && (piece.weightKg ?? 0) > loadLimit + 1e-9) return 'too-heavy'
    const tallest = layers.map((l) => l.tallestMm)
    for (let i = 0; i < layers.length; i++) {
      if (piece.heightMm > layers[i].tallestMm) {
        const raised = tallest.slice()
        raised[i] = piece.heightMm
        if (stackHeight(kiln, raised) > kiln.usableHeightMm + EPS) continue
      }
      if (tryLayer(i, piece)) return null
    }
    if (layers.length < maxLayers && stackHeight(kiln, [...tallest, piece.heightMm]) <= kiln.usableHeightMm + EPS) {
      addLayer()
      if (tryLayer(layers.length - 1, piece)) return null
    }
    return 'no-room'
  }

  function tryLayer(index: number, piece: LoadPiece): boolean {
    for (const shelf of layers[index].shelves) {
      if (loadLimit !== null && shelf.weightKg + (piece.weightKg ?? 0) > loadLimit + 1e-9) continue
      if (placeOn(shelf, piece, gap)) {
        layers[index].tallestMm = Math.max(layers[index].tallestMm, piece.heightMm)
        return true
      }
    }
    return false
  }

  // Trailing empty layers take no shelf.
  while (layers.length && layers[layers.length - 1].tallestMm === 0) layers.pop()
  const tallest = layers.map((l) => l.tallestMm)
  const top = tallest.length - 1
  let base = 0
  const plans: LayerPlan[] = layers.map((layer, index) => {
    const post = index < top && layer.tallestMm > 0 ? postFor(kiln, layer.tallestMm + kiln.headClearanceMm) : null
    const cap = index === top ? kiln.usableHeightMm - base : post !== null ? post - kiln.headClearanceMm : 0
    const plan: LayerPlan = {
      index,
      tallestMm: layer.tallestMm,
      postMm: post,
      baseMm: base,
      capMm: Math.max(0, cap),
      shelves: layer.shelves.map((shelf) => ({
        index: shelf.geometry.index,
        weightKg: Math.round(shelf.weightKg * 1000) / 1000,
        taken: Math.min(1, shelf.placed.reduce((sum, p) => sum + takenArea(p.fp, gap), 0) / shelf.geometry.areaMm2),
        pieces: shelf.placed.map((p) => {
          const piece = pieces.get(p.key)!
          return {
            key: p.key,
            layer: index,
            shelf: shelf.geometry.index,
            x: Math.round(p.x * 10) / 10,
            y: Math.round(p.y * 10) / 10,
            rotation: p.fp.round || p.fp.w === piece.widthMm ? 0 : 90,
            heightMm: piece.heightMm,
            round: piece.round,
            widthMm: p.fp.round ? piece.widthMm : p.fp.w,
            depthMm: p.fp.round ? piece.widthMm : p.fp.h,
            weightKg: piece.weightKg,
            pinned: pinned.has(p.key),
          }
        }),
      })),
    }
    if (layer.tallestMm > 0 && post !== null) base += post + kiln.shelfThicknessMm
    return plan
  })
  return { kiln, gapMm: gap, maxLayers, layers: plans, unplaced, problems, stackMm: stackHeight(kiln, tallest) }
}

/** Every placement of a plan, in layer and shelf order. */
export function placementsOf(plan: LoadPlan): PlacedPiece[] {
  return plan.layers.flatMap((layer) => layer.shelves.flatMap((shelf) => shelf.pieces))
}

// ————— Space left —————

/** What a load can still take, by height band, in shelves (a half shelf is half a shelf). */
export interface LoadRoom {
  shelvesTotal: number
  /** The share of the shelves the planned pieces take. */
  shelvesTaken: number
  /** Shelves free for short ware (the first band): the figure shown as space left. */
  shelvesLeft: number
  /** The tallest piece the load can still take. */
  tallestMm: number
  layersUsed: number
  layersOnSale: number
  /** Shelves free for pieces up to each height. */
  bands: { upToMm: number; shelves: number }[]
}

const round2 = (n: number) => Math.round(n * 100) / 100

/**
 * The room a plan leaves: the free share of each layer's shelves for pieces up to that layer's height,
 * and whole new layers above the stack for as many layers as the posts and the usable height allow.
 */
export function loadRoom(plan: LoadPlan): LoadRoom {
  const { kiln } = plan
  const unitsPerLayer = kiln.shelves.reduce((n, g) => n + g.units, 0)
  const used = plan.layers.filter((l) => l.tallestMm > 0)
  const top = used[used.length - 1]
  let freshHeight = kiln.usableHeightMm
  if (top) {
    const post = postFor(kiln, top.tallestMm + kiln.headClearanceMm)
    freshHeight = post === null ? 0 : kiln.usableHeightMm - (top.baseMm + post + kiln.shelfThicknessMm)
  }
  const layersLeft = Math.max(0, plan.maxLayers - plan.layers.length)
  const freeOf = (layer: LayerPlan) =>
    layer.shelves.reduce((sum, shelf) => sum + Math.max(0, 1 - shelf.taken) * kiln.shelves[shelf.index].units, 0)
  const newLayers = (h: number) => {
    if (layersLeft === 0 || freshHeight < h) return 0
    const post = postFor(kiln, h + kiln.headClearanceMm)
    if (post === null) return 1
    return Math.min(layersLeft, 1 + Math.floor((freshHeight - h) / (post + kiln.shelfThicknessMm)))
  }
  const shelvesFor = (h: number) =>
    round2(plan.layers.filter((l) => l.capMm >= h).reduce((sum, l) => sum + freeOf(l), 0) + newLayers(h) * unitsPerLayer)
  // A layer counts toward the tallest piece only with a useful patch free: a tenth of a shelf.
  const gapTallest = Math.max(0, ...plan.layers.filter((l) => freeOf(l) >= 0.1).map((l) => l.capMm))
  const tallestMm = Math.max(layersLeft > 0 ? Math.max(0, freshHeight) : 0, gapTallest)
  const bands = SPACE_BANDS_MM.map((upToMm) => ({ upToMm, shelves: shelvesFor(upToMm) }))
  return {
    shelvesTotal: plan.maxLayers * unitsPerLayer,
    shelvesTaken: round2(
      plan.layers.reduce((sum, l) => sum + l.shelves.reduce((s, sh) => s + sh.taken * kiln.shelves[sh.index].units, 0), 0),
    ),
    shelvesLeft: tallestMm > 0 ? shelvesFor(Math.min(SPACE_BANDS_MM[0], tallestMm)) : 0,
    tallestMm: Math.round(tallestMm),
    layersUsed: used.length,
    layersOnSale: plan.maxLayers,
    bands,
  }
}

/** Shelves free for pieces up to this height, from a room's bands (the band at or above it). */
export function shelvesLeftFor(room: LoadRoom, heightMm: number): number {
  if (heightMm > room.tallestMm) return 0
  const band = room.bands.find((b) => b.upToMm >= heightMm)
  return band ? band.shelves : (room.bands[room.bands.length - 1]?.shelves ?? 0)
}

// ————— What a request takes —————

export interface ShelfShare {
  /** In whole shelves: every shelf with no room for another of the smallest piece counts whole, the rest by area. */
  shelves: number
  /** The same in layers (a layer of several shelves). */
  layers: number
  /** Pieces that would not go in this kiln at all, and their footprints' area. */
  unplaced: number
  unplacedAreaMm2: number
}

/**
 * The shelves a set of pieces takes, planned alone in the kiln: a shelf that cannot take another of
 * the smallest piece counts as a whole shelf; one that can counts by its pieces' footprint area.
 * Four 10½ in plates on a 555 mm round shelf: two fit on a shelf and no third, so two shelves.
 */
export function shelfShare(kiln: LoadKiln, gapMm: number, pieces: LoadPiece[]): ShelfShare {
  if (!pieces.length) return { shelves: 0, layers: 0, unplaced: 0, unplacedAreaMm2: 0 }
  const plan = planLoad({ kiln, gapMm, pieces })
  const smallest = [...pieces].sort((a, b) => footprintAreaMm2(a) - footprintAreaMm2(b))[0]
  const probe = { ...smallest, key: '\u0000probe', weightKg: 0 }
  const unitsPerLayer = kiln.shelves.reduce((n, g) => n + g.units, 0)
  let shelves = 0
  let layers = 0
  for (const layer of plan.layers) {
    let layerUnits = 0
    for (const shelf of layer.shelves) {
      if (!shelf.pieces.length) continue
      const geometry = kiln.shelves[shelf.index]
      const state = newShelf(geometry, gapMm, false)
      // As placed: the footprint's width and depth are already turned.
      for (const p of shelf.pieces) commit(state, p, { x: p.x, y: p.y, rotation: 0 })
      const area = shelf.pieces.reduce((sum, p) => sum + footprintAreaMm2(p), 0)
      const share = roomForAnother(state, probe, gapMm) ? Math.min(1, area / geometry.areaMm2) : 1
      layerUnits += share * geometry.units
    }
    shelves += layerUnits
    layers += layerUnits / unitsPerLayer
  }
  const byKey = new Map(pieces.map((p) => [p.key, p]))
  const unplacedAreaMm2 = plan.unplaced.reduce((sum, u) => sum + footprintAreaMm2(byKey.get(u.key)!), 0)
  return { shelves: round2(shelves), layers: round2(layers), unplaced: plan.unplaced.length, unplacedAreaMm2 }
}

/** One load piece per physical piece of a declared line (a line of 12 mugs is 12 pieces). */
export function piecesOfLine(
  keyBase: string,
  line: { quantity: number; heightMm: number; widthMm: number; depthMm: number; round?: boolean; weightG?: number },
  fromCopy = 1,
): LoadPiece[] {
  const out: LoadPiece[] = []
  for (let copy = fromCopy; copy <= line.quantity; copy++)
    out.push({
      key: `${keyBase}:${copy}`,
      heightMm: line.heightMm,
      widthMm: line.widthMm,
      depthMm: line.round === true ? line.widthMm : line.depthMm,
      round: line.round === true,
      weightKg: line.weightG !== undefined ? line.weightG / 1000 : null,
    })
  return out
}
