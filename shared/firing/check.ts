// The ware check: can this kiln fire these pieces in this firing without harm to the ware, the kiln
// or anyone else's pots? Pure and cheap, so the form can run it on every keystroke and the server
// can run it again as the authority. Inputs are trusted to have passed shared/schemas/firing.ts.

import { CONES, coneIndex, coneTemperatureC, formatCone, type Cone } from './cones'
import { planSchedule, THICK_WALL_MM, wareAsksForSlowCooling, type FiringSchedule } from './schedule'
import { cToF, mmToIn } from './units'

export type { Cone } from './cones'

export type Atmosphere = 'oxidation' | 'reduction' | 'neutral'
export type KilnKind = 'electric' | 'gas' | 'wood' | 'soda' | 'salt' | 'raku'
export type FiringKind = 'bisque' | 'glaze' | 'single'
export type ClayBody = 'earthenware' | 'stoneware' | 'porcelain' | 'other'
export type PieceState = 'greenware' | 'bisque'

export type KilnInterior =
  { shape: 'round'; diameterMm: number; heightMm: number } | { shape: 'box'; widthMm: number; depthMm: number; heightMm: number }

export interface Kiln {
  kind: KilnKind
  atmospheres: Atmosphere[]
  interior: KilnInterior
  /** Default: interior height less one shelf and clearance (see usableHeightMm). */
  usableHeightMm?: number
  minCone: Cone
  maxCone: Cone
  maxTempC: number
  maxRampCPerHour: number
  /** Can hold below about 120 °C for candling. */
  preheatHold: boolean
  controlledCooling: boolean
}

export interface Firing {
  /** single = raw-glazed greenware fired once. */
  kind: FiringKind
  cone: Cone
  atmosphere: Atmosphere
  /** Bounding-box litres still free in this firing. */
  remainingCapacityL?: number
  slowCool?: boolean
}

export interface Glaze {
  minCone: Cone
  maxCone: Cone
  runny?: boolean
  onFoot?: boolean
  /** Set on a cookie or stilt. */
  onCookie?: boolean
}

export interface Piece {
  label?: string
  quantity: number
  heightMm: number
  /** The diameter when round. */
  widthMm: number
  depthMm: number
  round?: boolean
  wallThicknessMm: number
  clay: { body: ClayBody; minCone: Cone; maxCone: Cone }
  state: PieceState
  boneDry?: boolean
  glaze?: Glaze
}

export type Severity = 'block' | 'warn' | 'info'
export type Verdict = 'ok' | 'warn' | 'block'

export type FindingCode =
  | 'kiln-cone-range'
  | 'kiln-max-temp'
  | 'atmosphere-unavailable'
  | 'piece-too-tall'
  | 'piece-too-wide'
  | 'over-capacity'
  | 'clay-overfire'
  | 'clay-underfire'
  | 'glaze-cone-mismatch'
  | 'glaze-in-bisque'
  | 'not-bisqued'
  | 'wet-greenware'
  | 'thick-wall-preheat'
  | 'glaze-on-foot'
  | 'runny-glaze-tray'
  | 'needs-controlled-cooling'

export interface Finding {
  code: FindingCode
  severity: Severity
  pieceIndex?: number
  /** What is wrong and what to change, in the potter's words. */
  message: string
  /** Why it matters. */
  detail?: string
}

export type ShelfFootprint = { shape: 'round'; diameterMm: number } | { shape: 'box'; widthMm: number; depthMm: number }

export interface PieceFit {
  pieceIndex: number
  fitsHeight: boolean
  fitsFootprint: boolean
  /** Bounding-box litres of the whole line (quantity included). */
  volumeL: number
}

export interface Fit {
  usableHeightMm: number
  shelf: ShelfFootprint
  pieces: PieceFit[]
  requestVolumeL: number
  /** null when the firing does not say how much room is left. */
  remainingCapacityL: number | null
  fitsCapacity: boolean
}

export interface WareCheck {
  verdict: Verdict
  findings: Finding[]
  schedule: FiringSchedule
  fit: Fit
}

/** A kiln shelf, 5/8 in (16 mm) cordierite, the common thickness. */
export const SHELF_THICKNESS_MM = 16
/** Room left above the tallest piece for the lid, the elements and the posts under the bottom shelf. */
export const HEADROOM_MM = 25
/** Shelves are cut about an inch narrower than the chamber so they clear the walls and let heat move. */
export const SHELF_CLEARANCE_MM = 25

/** The tallest piece the kiln takes: as stated, or the interior height less one shelf and headroom. */
export function usableHeightMm(kiln: Pick<Kiln, 'interior' | 'usableHeightMm'>): number {
  if (kiln.usableHeightMm !== undefined) return kiln.usableHeightMm
  return Math.max(0, kiln.interior.heightMm - SHELF_THICKNESS_MM - HEADROOM_MM)
}

export function shelfFootprint(kiln: Pick<Kiln, 'interior'>): ShelfFootprint {
  const interior = kiln.interior
  if (interior.shape === 'round') {
    return { shape: 'round', diameterMm: Math.max(0, interior.diameterMm - SHELF_CLEARANCE_MM) }
  }
  return {
    shape: 'box',
    widthMm: Math.max(0, interior.widthMm - SHELF_CLEARANCE_MM),
    depthMm: Math.max(0, interior.depthMm - SHELF_CLEARANCE_MM),
  }
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

/**
 * Does the piece's footprint fit a shelf? On a round shelf a rectangle fits only if its diagonal
 * does and a round piece if its diameter does; on a box shelf either orientation will do.
 */
export function pieceFitsFootprint(kiln: Pick<Kiln, 'interior'>, piece: Pick<Piece, 'widthMm' | 'depthMm' | 'round'>): boolean {
  return footprintFits(shelfFootprint(kiln), piece)
}

function footprintFits(shelf: ShelfFootprint, piece: Pick<Piece, 'widthMm' | 'depthMm' | 'round'>): boolean {
  const width = piece.widthMm
  const depth = pieceDepthMm(piece)
  if (shelf.shape === 'round') {
    const across = piece.round === true ? width : Math.sqrt(width * width + depth * depth)
    return across <= shelf.diameterMm
  }
  return (width <= shelf.widthMm && depth <= shelf.depthMm) || (width <= shelf.depthMm && depth <= shelf.widthMm)
}

/** Does the piece stand in the kiln's usable height? */
export function pieceFitsHeight(kiln: Pick<Kiln, 'interior' | 'usableHeightMm'>, piece: Pick<Piece, 'heightMm'>): boolean {
  return piece.heightMm <= usableHeightMm(kiln)
}

/** Bounding-box litres of one piece (height × width × depth; a round piece's depth is its diameter). */
export function pieceVolumeL(piece: Pick<Piece, 'heightMm' | 'widthMm' | 'depthMm' | 'round'>): number {
  return (piece.heightMm * piece.widthMm * pieceDepthMm(piece)) / 1_000_000
}

/** Bounding-box litres of a whole request, quantities included. */
export function requestVolumeL(pieces: readonly Pick<Piece, 'heightMm' | 'widthMm' | 'depthMm' | 'round' | 'quantity'>[]): number {
  let litres = 0
  for (const piece of pieces) litres += pieceVolumeL(piece) * piece.quantity
  return litres
}

const SEVERITY_RANK: Record<Severity, number> = { info: 0, warn: 1, block: 2 }
const VERDICT_RANK: Record<Verdict, number> = { ok: 0, warn: 1, block: 2 }

/** 0 ok, 1 warn, 2 block: for comparing verdicts. */
export function verdictRank(verdict: Verdict): number {
  return VERDICT_RANK[verdict]
}

/** The worst severity among the findings; info findings leave it ok. */
export function verdictOf(findings: readonly Finding[]): Verdict {
  let worst = 0
  for (const finding of findings) if (SEVERITY_RANK[finding.severity] > worst) worst = SEVERITY_RANK[finding.severity]
  return worst === 2 ? 'block' : worst === 1 ? 'warn' : 'ok'
}

function mm(value: number): string {
  return `${Math.round(value)} mm (${mmToIn(value).toFixed(1)} in)`
}

function degrees(celsius: number): string {
  return `${Math.round(celsius)} °C (${Math.round(cToF(celsius))} °F)`
}

function litres(value: number): string {
  return `${value.toFixed(1)} L`
}

function pieceName(piece: Piece, index: number): string {
  return piece.label?.trim() || `Piece ${index + 1}`
}

function hours(minutes: number): string {
  const h = minutes / 60
  return Number.isInteger(h) ? `${h} h` : `${h.toFixed(1)} h`
}

/**
 * Checks a request against a kiln and a firing: findings (each saying what to change), the verdict
 * (their worst severity), the planned schedule and how the pieces fit. Cones must be ones parseCone
 * reads (the schemas make them canonical); an unknown cone throws a RangeError.
 */
export function checkWare(kiln: Kiln, firing: Firing, pieces: readonly Piece[]): WareCheck {
  const findings: Finding[] = []
  const cone = firing.cone
  const coneAt = coneIndex(cone)
  const schedule = planSchedule({ kind: firing.kind, cone, kiln, pieces, slowCool: firing.slowCool })

  if (coneAt < coneIndex(kiln.minCone) || coneAt > coneIndex(kiln.maxCone)) {
    findings.push({
      code: 'kiln-cone-range',
      severity: 'block',
      message: `This kiln fires ${formatCone(kiln.minCone)} to ${formatCone(kiln.maxCone)}, not ${formatCone(cone)}. Choose a cone in its range or another kiln.`,
      detail: 'A kiln fired outside its rated range can fail to reach the cone or wear out its elements and lining.',
    })
  }

  const coneC = coneTemperatureC(cone, schedule.finalRateCPerHour)
  if (coneC > kiln.maxTempC) {
    findings.push({
      code: 'kiln-max-temp',
      severity: 'block',
      message: `Cone ${CONES[coneAt]} needs about ${degrees(coneC)} at this kiln’s final rate, above its ${degrees(kiln.maxTempC)} limit. Fire a cooler cone or use a hotter kiln.`,
      detail: `Cone temperature for a final climb of ${Math.round(schedule.finalRateCPerHour)} °C/h over the last 100 °C.`,
    })
  }

  if (!kiln.atmospheres.includes(firing.atmosphere)) {
    findings.push({
      code: 'atmosphere-unavailable',
      severity: 'block',
      message: `This kiln fires in ${kiln.atmospheres.join(' or ')}, not ${firing.atmosphere}. Pick one of those atmospheres or another kiln.`,
      detail: 'Glaze colours and surfaces depend on the atmosphere; a kiln that cannot make it gives different results.',
    })
  }

  const usableHeight = usableHeightMm(kiln)
  const shelf = shelfFootprint(kiln)
  const fits: PieceFit[] = []
  const isBisqueFiring = firing.kind === 'bisque'
  let volumeL = 0

  for (let index = 0; index < pieces.length; index++) {
    const piece = pieces[index]
    const lineVolumeL = pieceVolumeL(piece) * piece.quantity
    volumeL += lineVolumeL
    const fitsHeight = piece.heightMm <= usableHeight
    const fitsFootprint = footprintFits(shelf, piece)
    fits.push({ pieceIndex: index, fitsHeight, fitsFootprint, volumeL: lineVolumeL })

    if (!fitsHeight) {
      findings.push({
        code: 'piece-too-tall',
        severity: 'block',
        pieceIndex: index,
        message: `${pieceName(piece, index)} is ${mm(piece.heightMm)} tall; this kiln takes up to ${mm(usableHeight)}. Choose a taller kiln or a shorter piece.`,
      })
    }
    if (!fitsFootprint) {
      const across =
        shelf.shape === 'round' ? `a ${mm(shelf.diameterMm)} round shelf` : `a ${mm(shelf.widthMm)} × ${mm(shelf.depthMm)} shelf`
      const size = piece.round === true ? `${mm(piece.widthMm)} across` : `${mm(piece.widthMm)} × ${mm(piece.depthMm)}`
      findings.push({
        code: 'piece-too-wide',
        severity: 'block',
        pieceIndex: index,
        message: `${pieceName(piece, index)} is ${size} and does not fit ${across}. Choose a wider kiln or a smaller piece.`,
        ...(shelf.shape === 'round' && piece.round !== true
          ? { detail: 'On a round shelf a rectangular piece needs room for its diagonal.' }
          : {}),
      })
    }

    const clayMaxAt = coneIndex(piece.clay.maxCone)
    if (coneAt > clayMaxAt) {
      findings.push({
        code: 'clay-overfire',
        severity: 'block',
        pieceIndex: index,
        message: `${pieceName(piece, index)}’s clay is rated to ${formatCone(piece.clay.maxCone)}; ${formatCone(cone)} is hotter. Fire it no hotter than ${formatCone(piece.clay.maxCone)}.`,
        detail: 'Clay fired past its maturity slumps, bloats or melts onto the shelf, and can spoil other pots.',
      })
    }
    if (!isBisqueFiring && coneAt < coneIndex(piece.clay.minCone)) {
      findings.push({
        code: 'clay-underfire',
        severity: 'warn',
        pieceIndex: index,
        message: `${pieceName(piece, index)}’s clay matures at ${formatCone(piece.clay.minCone)} or hotter; at ${formatCone(cone)} it stays porous and weak. Fire it to at least ${formatCone(piece.clay.minCone)} if it must hold water.`,
        detail: 'Underfired clay is not vitrified: it is weaker and not watertight.',
      })
    }

    const glaze = piece.glaze
    if (glaze) {
      if (isBisqueFiring) {
        findings.push({
          code: 'glaze-in-bisque',
          severity: 'block',
          pieceIndex: index,
          message:
            piece.state === 'greenware'
              ? `${pieceName(piece, index)} is glazed, and this is a bisque firing. Bring it to a single firing if it is meant to be fired once, or wipe the glaze off.`
              : `${pieceName(piece, index)} is glazed, and this is a bisque firing. Bring it to a glaze firing instead.`,
          detail: 'Bisque loads are stacked with pieces touching; glaze would weld them together and to the shelves.',
        })
      } else {
        if (coneAt > coneIndex(glaze.maxCone)) {
          findings.push({
            code: 'glaze-cone-mismatch',
            severity: 'block',
            pieceIndex: index,
            message: `${pieceName(piece, index)}’s glaze is rated to ${formatCone(glaze.maxCone)}; at ${formatCone(cone)} it will run. Choose a firing no hotter than ${formatCone(glaze.maxCone)}.`,
            detail: 'An overfired glaze runs off the pot and onto the shelf.',
          })
        } else if (coneAt < coneIndex(glaze.minCone)) {
          findings.push({
            code: 'glaze-cone-mismatch',
            severity: 'warn',
            pieceIndex: index,
            message: `${pieceName(piece, index)}’s glaze needs ${formatCone(glaze.minCone)} or hotter; at ${formatCone(cone)} it will come out dry or rough. Choose a hotter firing for it.`,
          })
        }
        if (glaze.onFoot === true && glaze.onCookie !== true) {
          findings.push({
            code: 'glaze-on-foot',
            severity: 'block',
            pieceIndex: index,
            message: `${pieceName(piece, index)} has glaze on its foot. Wipe the foot clean, or set the piece on a cookie or stilt.`,
            detail: 'Glaze on the foot welds the pot to the shelf.',
          })
        }
        if (glaze.runny === true && glaze.onCookie !== true) {
          findings.push({
            code: 'runny-glaze-tray',
            severity: 'warn',
            pieceIndex: index,
            message: `${pieceName(piece, index)} has a runny glaze. Set it on a catch tray or cookie.`,
            detail: 'A runny glaze can drip off the pot and ruin the shelf beneath it.',
          })
        }
      }
    }

    if (piece.state === 'greenware') {
      if (firing.kind === 'glaze') {
        findings.push({
          code: 'not-bisqued',
          severity: 'block',
          pieceIndex: index,
          message: `${pieceName(piece, index)} has not been bisque fired. Bisque it first, or bring it to a single firing if it is glazed raw.`,
          detail: 'Greenware in a fast glaze firing can crack or burst.',
        })
      }
      if (piece.boneDry !== true) {
        findings.push({
          code: 'wet-greenware',
          severity: 'block',
          pieceIndex: index,
          message: `${pieceName(piece, index)} is not marked bone dry. Let it dry until it no longer feels cool against your cheek, then mark it bone dry.`,
          detail: 'Water left in the clay turns to steam past 100 °C and can burst the piece, scattering shards over other pots.',
        })
      }
      if (piece.wallThicknessMm > THICK_WALL_MM) {
        if (kiln.preheatHold) {
          findings.push({
            code: 'thick-wall-preheat',
            severity: 'warn',
            pieceIndex: index,
            message: `${pieceName(piece, index)} has ${mm(piece.wallThicknessMm)} walls; it needs a long preheat, planned here as ${hours(schedule.candlingHoldMinutes)} at 120 °C. Make sure it is fully dry.`,
            detail: `Walls over ${THICK_WALL_MM} mm dry and heat slowly in the middle, and can burst if steam builds up there.`,
          })
        } else {
          findings.push({
            code: 'thick-wall-preheat',
            severity: 'block',
            pieceIndex: index,
            message: `${pieceName(piece, index)} has ${mm(piece.wallThicknessMm)} walls and this kiln cannot hold a low preheat. Choose a kiln that can candle, or hollow the piece to under ${THICK_WALL_MM} mm.`,
            detail: `Walls over ${THICK_WALL_MM} mm dry and heat slowly in the middle, and can burst if steam builds up there.`,
          })
        }
      }
    }
  }

  const remaining = firing.remainingCapacityL
  const fitsCapacity = remaining === undefined || volumeL <= remaining
  if (!fitsCapacity) {
    findings.push({
      code: 'over-capacity',
      severity: 'block',
      message: `These pieces take about ${litres(volumeL)} of kiln space; this firing has ${litres(remaining as number)} left. Bring fewer pieces or book another firing.`,
      detail: 'Space is counted as each piece’s bounding box (height × width × depth).',
    })
  }

  if (!kiln.controlledCooling) {
    const wareAsks = wareAsksForSlowCooling(pieces)
    if (firing.slowCool === true || wareAsks) {
      let thickIndex = -1
      if (wareAsks) thickIndex = pieces.findIndex((piece) => piece.wallThicknessMm > THICK_WALL_MM)
      findings.push({
        code: 'needs-controlled-cooling',
        severity: 'warn',
        ...(firing.slowCool !== true && thickIndex >= 0 ? { pieceIndex: thickIndex } : {}),
        message:
          firing.slowCool === true
            ? 'This firing asks for a slow cool, and this kiln cannot control its cooling. Choose a kiln with controlled cooling, or accept a natural cool.'
            : `${pieceName(pieces[thickIndex], thickIndex)} has thick walls that want a slow cool, and this kiln cannot control its cooling. Choose a kiln with controlled cooling, or accept the risk of cracks.`,
        detail: 'Ware cooled fast through the quartz inversion (573 °C) and the cristobalite inversion (about 220 °C) can crack (dunt).',
      })
    }
  }

  return {
    verdict: verdictOf(findings),
    findings,
    schedule,
    fit: {
      usableHeightMm: usableHeight,
      shelf,
      pieces: fits,
      requestVolumeL: volumeL,
      remainingCapacityL: remaining ?? null,
      fitsCapacity,
    },
  }
}
