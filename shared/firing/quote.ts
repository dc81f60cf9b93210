// Prices a firing request from a studio's price list. Money is integer cents throughout; fractional
// amounts appear only inside a line's arithmetic and are rounded half-up once, at the line.

import { pieceDepthMm, type Firing, type FiringKind, type Kiln, type Piece } from './check'
import { gapFor, loadKiln, piecesOfLine, shelfShare } from './load'
import { THICK_WALL_MM, wareAsksForSlowCooling } from './schedule'
import { MM3_PER_LITRE, MM_PER_INCH } from './units'

export type PricingModel = 'volume' | 'shelf' | 'layer' | 'kiln'

export interface PriceList {
  /** ISO 4217 code, e.g. "USD". */
  currency: string
  model: PricingModel
  centsPerCubicInch?: number
  centsPerLitre?: number
  shelfCents?: number
  /** The share of a shelf that is sold at once, e.g. 0.25 for quarter shelves. Default 0.25. */
  shelfStep?: number
  /** Shelf area for shelf pricing when no kiln is given to quoteRequest. */
  shelfAreaMm2?: number
  /** The price of a whole layer (every shelf at one level); sold in shelfStep shares. */
  layerCents?: number
  kilnCents?: number
  minimumPerPieceCents?: number
  /** Percent of the base price. */
  surcharges?: { reduction?: number; slowCool?: number; preheat?: number }
  deposit: { percent: number } | { fixedCents: number }
}

export interface QuoteLine {
  label: string
  amountCents: number
}

export interface Quote {
  currency: string
  lines: QuoteLine[]
  totalCents: number
  depositCents: number
}

/** The parts of a kiln a quote can use: its shelves for shelf and layer pricing, and what it can do for surcharges. */
export type QuoteKiln = Pick<Kiln, 'interior' | 'controlledCooling' | 'preheatHold'> &
  Partial<Pick<Kiln, 'usableHeightMm' | 'shelfLoadKg' | 'shelves'>>

/** The firing facts a quote reads: the kind sets the gap between pieces when shelves are planned. */
export type QuoteFiring = Pick<Firing, 'atmosphere' | 'slowCool'> & { kind?: FiringKind }

export const DEFAULT_SHELF_STEP = 0.25

const MM3_PER_CUBIC_INCH = MM_PER_INCH * MM_PER_INCH * MM_PER_INCH

/**
 * Half-up to a whole cent. The value is first trimmed to 12 significant digits so that float noise
 * (2.675 stored as 2.67499…) does not move a true half cent down.
 */
export function roundHalfUpCents(amount: number): number {
  return Math.floor(Number(amount.toPrecision(12)) + 0.5)
}

function pieceLabel(piece: Piece, index: number): string {
  const name = piece.label?.trim() || `Piece ${index + 1}`
  return piece.quantity === 1 ? name : `${name} × ${piece.quantity}`
}

function formatShelves(shelves: number): string {
  return `${Number(shelves.toFixed(3))} shelf`
}

function percentLabel(percent: number): string {
  return `${Number(percent.toFixed(2))} %`
}

/**
 * The shelves (or layers) the pieces take, planned alone on the kiln's own shelves (shared/firing/load.ts):
 * a shelf with no room for another of the smallest piece counts whole, the others by their pieces'
 * footprint area. Pieces the kiln cannot take at all are counted by footprint area, as before a plan.
 */
function plannedShare(kiln: QuoteKiln, firing: QuoteFiring, pieces: readonly Piece[], unit: 'shelves' | 'layers'): number {
  const load = loadKiln(kiln)
  const loadPieces = pieces.flatMap((piece, index) => piecesOfLine(`q:${index}`, piece))
  const share = shelfShare(load, gapFor(load, firing.kind ?? 'glaze'), loadPieces)
  let planned = unit === 'shelves' ? share.shelves : share.layers
  if (share.unplacedAreaMm2 > 0) {
    const shelf = load.shelves[0]
    const perUnit = unit === 'shelves' ? shelf.areaMm2 / shelf.units : load.shelves.reduce((sum, g) => sum + g.areaMm2, 0)
    planned += share.unplacedAreaMm2 / perUnit
  }
  return planned
}

function baseLines(priceList: PriceList, pieces: readonly Piece[], kiln: QuoteKiln | undefined, firing: QuoteFiring): QuoteLine[] {
  const minimum = priceList.minimumPerPieceCents ?? 0
  let quantity = 0
  for (const piece of pieces) quantity += piece.quantity

  if (priceList.model === 'volume') {
    const perCubicInch = priceList.centsPerCubicInch
    const perLitre = priceList.centsPerLitre
    if (perCubicInch === undefined && perLitre === undefined) {
      throw new RangeError('A volume price list needs centsPerCubicInch or centsPerLitre.')
    }
    return pieces.map((piece, index) => {
      const mm3 = piece.heightMm * piece.widthMm * pieceDepthMm(piece) * piece.quantity
      const exact = perCubicInch !== undefined ? (mm3 / MM3_PER_CUBIC_INCH) * perCubicInch : (mm3 / MM3_PER_LITRE) * (perLitre as number)
      const amount = roundHalfUpCents(exact)
      const floor = minimum * piece.quantity
      return amount < floor
        ? { label: `${pieceLabel(piece, index)} (minimum per piece)`, amountCents: floor }
        : { label: pieceLabel(piece, index), amountCents: amount }
    })
  }

  let line: QuoteLine
  const step = priceList.shelfStep ?? DEFAULT_SHELF_STEP
  // Rounded up to the step; the tolerance keeps an exact half shelf from becoming three quarters.
  const toStep = (share: number) => Math.ceil(share / step - 1e-9) * step
  if (priceList.model === 'shelf') {
    if (priceList.shelfCents === undefined) throw new RangeError('A shelf price list needs shelfCents.')
    let share: number
    if (kiln !== undefined) share = plannedShare(kiln, firing, pieces, 'shelves')
    else {
      const areaMm2 = priceList.shelfAreaMm2
      if (areaMm2 === undefined || !(areaMm2 > 0)) {
        throw new RangeError('Shelf pricing needs the shelf size: pass the kiln or set shelfAreaMm2.')
      }
      let footprintMm2 = 0
      for (const piece of pieces) footprintMm2 += piece.widthMm * pieceDepthMm(piece) * piece.quantity
      share = footprintMm2 / areaMm2
    }
    const shelves = toStep(share)
    line = { label: `Shelf space: ${formatShelves(shelves)}`, amountCents: roundHalfUpCents(shelves * priceList.shelfCents) }
  } else if (priceList.model === 'layer') {
    if (priceList.layerCents === undefined) throw new RangeError('A layer price list needs layerCents.')
    if (kiln === undefined) throw new RangeError('Layer pricing needs the kiln, to plan its shelves.')
    const layers = toStep(plannedShare(kiln, firing, pieces, 'layers'))
    line = { label: `Kiln layers: ${Number(layers.toFixed(3))} layer`, amountCents: roundHalfUpCents(layers * priceList.layerCents) }
  } else {
    if (priceList.kilnCents === undefined) throw new RangeError('A whole-kiln price list needs kilnCents.')
    line = { label: 'Whole kiln', amountCents: roundHalfUpCents(priceList.kilnCents) }
  }
  const floor = minimum * quantity
  if (line.amountCents < floor) line = { label: `${line.label} (minimum ${quantity} × per piece)`, amountCents: floor }
  return [line]
}

/**
 * Quote for a request: base lines by the studio's pricing model, then surcharges as a percent of the base,
 * then the deposit (a percent of the total, or a fixed sum never above the total). The kiln, when
 * given, sizes shelf shares and drops surcharges for things the kiln will not do.
 */
export function quoteRequest(priceList: PriceList, firing: QuoteFiring, pieces: readonly Piece[], kiln?: QuoteKiln): Quote {
  const lines = baseLines(priceList, pieces, kiln, firing)
  let baseCents = 0
  for (const line of lines) baseCents += line.amountCents

  const surcharges = priceList.surcharges ?? {}
  const addSurcharge = (percent: number | undefined, what: string) => {
    if (percent === undefined || percent === 0) return
    lines.push({ label: `${what} (+${percentLabel(percent)})`, amountCents: roundHalfUpCents((baseCents * percent) / 100) })
  }
  if (firing.atmosphere === 'reduction') addSurcharge(surcharges.reduction, 'Reduction firing')
  if ((firing.slowCool === true || wareAsksForSlowCooling(pieces)) && (kiln === undefined || kiln.controlledCooling)) {
    addSurcharge(surcharges.slowCool, 'Slow cooling')
  }
  const needsLongPreheat = pieces.some((piece) => piece.state === 'greenware' && piece.wallThicknessMm > THICK_WALL_MM)
  if (needsLongPreheat && (kiln === undefined || kiln.preheatHold)) addSurcharge(surcharges.preheat, 'Long preheat')

  let totalCents = 0
  for (const line of lines) totalCents += line.amountCents

  const deposit = priceList.deposit
  const depositCents =
    'percent' in deposit ? roundHalfUpCents((totalCents * deposit.percent) / 100) : Math.min(deposit.fixedCents, totalCents)

  return { currency: priceList.currency, lines, totalCents, depositCents }
}
