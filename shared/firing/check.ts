// The ware check: can this kiln fire these pieces in this firing without harm to the ware, the kiln
// or anyone else's pots? Pure and cheap, so the form can run it on every keystroke and the server
// can run it again as the authority. Inputs are trusted to have passed shared/schemas/firing.ts.

import { CONES, coneIndex, coneTemperatureC, formatCone, type Cone } from './cones'
import {
  CANDLING_C,
  coolingProfileFor,
  meltsGlaze,
  planSchedule,
  THICK_WALL_MM,
  VERY_THICK_MM,
  wareAsksForSlowCooling,
  type CoolingProfile,
  type FiringSchedule,
} from './schedule'
import { cToF, mmToIn } from './units'
import { pieceDepthMm, shelfAreaMm2, shelfFootprint, usableHeightMm } from './kiln-geometry'
import { gapFor, loadKiln, piecesOfLine, shelfShare, shelvesLeftFor, type KilnShelves, type LoadRoom } from './load'

export type { Cone } from './cones'
export {
  HEADROOM_MM,
  kilnVolumeL,
  pieceDepthMm,
  SHELF_CLEARANCE_MM,
  SHELF_THICKNESS_MM,
  shelfAcross,
  shelfAreaMm2,
  shelfFootprint,
  usableHeightMm,
} from './kiln-geometry'
export type { CoolingProfile } from './schedule'

export type Atmosphere = 'oxidation' | 'reduction' | 'neutral'
export type KilnKind = 'electric' | 'gas' | 'wood' | 'soda' | 'salt' | 'raku'
export const FIRING_KINDS = ['bisque', 'glaze', 'single', 'lustre', 'raku'] as const
/** single = raw-glazed greenware fired once; lustre = overglaze, decals and china paint on glazed ware. */
export type FiringKind = (typeof FIRING_KINDS)[number]
export const CLAY_BODIES = ['earthenware', 'stoneware', 'porcelain', 'raku', 'other'] as const
export type ClayBody = (typeof CLAY_BODIES)[number]
/** glazed = ware already glaze fired (for lustre, decals and china paint, or a refire). */
export const PIECE_STATES = ['greenware', 'bisque', 'glazed'] as const
export type PieceState = (typeof PIECE_STATES)[number]
export const PIECE_FORMS = ['open', 'closed', 'solid'] as const
/** open: a pot or dish; closed: hollow and sealed (a bead, a hollow sculpture); solid: no inside at all. */
export type PieceForm = (typeof PIECE_FORMS)[number]
export const GLAZE_SUPPORTS = ['none', 'cookie', 'tray', 'stilt'] as const
/** What the piece stands on: a cookie or tray catches drips; a stilt lifts a glazed foot at low fire. */
export type GlazeSupport = (typeof GLAZE_SUPPORTS)[number]
export const MATERIALS = ['glass', 'metal', 'combustible', 'saggar-salts', 'paper-clay'] as const
/** Things in or on the piece besides clay and glaze. */
export type Material = (typeof MATERIALS)[number]
export const COLOURANTS = ['copper', 'chrome-tin', 'cobalt', 'manganese'] as const
export type Colourant = (typeof COLOURANTS)[number]

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
  /** Can hold below boiling (about 90 °C) for candling. */
  preheatHold: boolean
  controlledCooling: boolean
  /** What one shelf may carry, kg. */
  shelfLoadKg?: number
  /** The shelves and posts the studio loads it with (shared/firing/load.ts); cut to the chamber when not said. */
  shelves?: KilnShelves
}

export interface Firing {
  kind: FiringKind
  cone: Cone
  atmosphere: Atmosphere
  /**
   * The room the firing's load plan has left (shared/firing/load.ts loadRoom), and, when the caller
   * planned these very pieces into the load, whether they all went in.
   */
  load?: { room: LoadRoom; fits?: boolean }
  /** Slow through the quartz and cristobalite inversions. */
  slowCool?: boolean
  /** How a glaze firing cools from its peak; natural when not said. */
  cooling?: CoolingProfile
  /** Other people's ware in the same load; a contract firing is shared unless said otherwise. */
  sharedLoad?: boolean
}

export interface Glaze {
  minCone: Cone
  maxCone: Cone
  runny?: boolean
  onFoot?: boolean
  /** What the piece stands on in the kiln; none when not said. */
  support?: GlazeSupport
  colourants?: Colourant[]
  /** Develops its colour in reduction only (copper reds, celadons, shinos). */
  reductionOnly?: boolean
  /** False when the potter has not fired it on a test tile at this cone and atmosphere. */
  tested?: boolean
}

export interface Piece {
  label?: string
  quantity: number
  heightMm: number
  /** The diameter when round. */
  widthMm: number
  depthMm: number
  round?: boolean
  /** For a solid piece, its thickness at the thickest point. */
  wallThicknessMm: number
  /** open when not said. */
  form?: PieceForm
  /** A closed form's hole for steam and air to leave by. */
  ventHole?: boolean
  /** Weight of one piece, g. */
  weightG?: number
  clay: { body: ClayBody; minCone: Cone; maxCone: Cone }
  state: PieceState
  boneDry?: boolean
  glaze?: Glaze
  materials?: Material[]
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
  | 'solid-too-thick'
  | 'closed-no-vent'
  | 'stilt-high-fire'
  | 'clay-body-range'
  | 'reduction-glaze'
  | 'volatile-colourant'
  | 'foreign-material'
  | 'shelf-overweight'
  | 'untested-glaze'
  | 'lustre-cone'
  | 'lustre-ware'
  | 'raku-body'
  | 'raku-kiln'
  | 'raku-ware'
  | 'firing-safety'

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
  /** The shelves the pieces take, planned alone on this kiln's shelves (a half shelf is half a shelf). */
  shelvesNeeded: number
  /** Shelves the load has left for pieces as tall as the tallest here; null when the firing says nothing of its load. */
  shelvesLeft: number | null
  fitsLoad: boolean
}

export interface WareCheck {
  verdict: Verdict
  findings: Finding[]
  schedule: FiringSchedule
  fit: Fit
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

/** A shelf share in words: "¾ of a shelf", "2¼ shelves". */
export function shelvesWords(shelves: number): string {
  const quarters = Math.round(shelves * 4)
  const whole = Math.floor(quarters / 4)
  const part = ['', '¼', '½', '¾'][quarters % 4]
  if (quarters === 0) return shelves > 0 ? 'a sliver of a shelf' : 'no shelf space'
  if (whole === 0) return `${part} of a shelf`
  return `${whole}${part} ${whole === 1 && !part ? 'shelf' : 'shelves'}`
}

function pieceName(piece: Piece, index: number): string {
  return piece.label?.trim() || `Piece ${index + 1}`
}

function kg(value: number): string {
  return `${value.toFixed(1)} kg (${(value * 2.2046226218).toFixed(1)} lb)`
}

const CONE_1_AT = coneIndex('1')
const CONE_4_AT = coneIndex('4')
const LUSTRE_COOLEST_AT = coneIndex('022')
const LUSTRE_HOTTEST_AT = coneIndex('015')

function hours(minutes: number): string {
  const h = minutes / 60
  return Number.isInteger(h) ? `${h} h` : `${h.toFixed(1)} h`
}

/** One shelf as the plan fills it: pieces laid side by side, one layer. */
export interface ShelfLoad {
  /** Index of each line on this shelf and how many of it. */
  lines: { pieceIndex: number; count: number }[]
  weightKg: number
  /** Share of the shelf's area the footprints take (0–1). */
  areaUsed: number
}

// Round footprints, handles and gaps: pieces cover about four fifths of a shelf at best (our rule).
const SHELF_PACKING = 0.8

/**
 * Lays the pieces on shelves in the order given, one layer per shelf, each shelf filled to the area
 * pieces can cover before the next is started. Only lines with a weight are laid.
 */
export function planShelves(kiln: Pick<Kiln, 'interior'>, pieces: readonly Piece[]): ShelfLoad[] {
  const shelfArea = shelfAreaMm2(kiln)
  const area = shelfArea * SHELF_PACKING
  const shelves: ShelfLoad[] = []
  let current: ShelfLoad | null = null
  let free = 0
  for (let index = 0; index < pieces.length; index++) {
    const piece = pieces[index]
    if (piece.weightG === undefined) continue
    const footprint = piece.round === true ? (Math.PI * piece.widthMm * piece.widthMm) / 4 : piece.widthMm * pieceDepthMm(piece)
    let left = piece.quantity
    while (left > 0) {
      let fits = footprint > 0 ? Math.floor(free / footprint) : left
      if (fits === 0) {
        current = { lines: [], weightKg: 0, areaUsed: 0 }
        shelves.push(current)
        free = area
        // A piece wider than the packing allows still takes a shelf of its own.
        fits = Math.max(1, footprint > 0 ? Math.floor(free / footprint) : left)
      }
      const count = Math.min(left, fits)
      current!.lines.push({ pieceIndex: index, count })
      current!.weightKg += (count * piece.weightG) / 1000
      current!.areaUsed = Math.min(1, current!.areaUsed + (count * footprint) / shelfArea)
      free -= count * footprint
      left -= count
    }
  }
  return shelves
}

function materialWord(material: Material): string {
  return material === 'saggar-salts' ? 'saggar salts' : material === 'paper-clay' ? 'paper clay' : material
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
  const kind = firing.kind
  const schedule = planSchedule({ kind, cone, kiln, pieces, slowCool: firing.slowCool, cooling: firing.cooling })
  const shared = firing.sharedLoad !== false

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

  if (kind === 'lustre' && (coneAt < LUSTRE_COOLEST_AT || coneAt > LUSTRE_HOTTEST_AT)) {
    findings.push({
      code: 'lustre-cone',
      severity: 'block',
      message: `A lustre, decal or china-paint firing goes to cone 022–015, not ${formatCone(cone)}. Choose a cone in that range (the product’s label says which).`,
      detail: 'Overglazes fire far below the glaze: hotter, they sink into the glaze, burn away or change colour.',
    })
  }
  if (kind === 'raku' && kiln.kind !== 'raku') {
    findings.push({
      code: 'raku-kiln',
      severity: 'block',
      message: `Raku ware is pulled from the kiln at full heat; this is a ${kiln.kind} kiln. Look for a raku firing instead.`,
      detail:
        'Opening an electric or shut kiln at glaze heat exposes live elements and cracks its lining; raku kilns are built to be opened hot.',
    })
  }
  if (kind === 'raku') {
    findings.push({
      code: 'firing-safety',
      severity: 'info',
      message:
        'Raku is fired outdoors, away from buildings and anything that burns. Everyone near the kiln wears heat-proof gloves, a face shield or safety glasses, long natural-fibre sleeves and closed shoes; the reduction can smokes and gives off carbon monoxide. Raku ware is not food safe.',
    })
  } else if (kind === 'lustre') {
    findings.push({
      code: 'firing-safety',
      severity: 'info',
      message:
        'Lustres and china-paint media give off strong fumes as they burn off: the kiln is vented to about 550 °C and the room aired, and nobody stays beside it. Metallic lustres are not for surfaces that touch food or go in a microwave.',
    })
  } else if (firing.atmosphere === 'reduction') {
    findings.push({
      code: 'firing-safety',
      severity: 'info',
      message: 'A reduction firing makes carbon monoxide: the kiln room needs working ventilation and a carbon monoxide alarm.',
    })
  }

  const profile = firing.cooling ?? 'natural'
  if (profile !== 'natural' && !meltsGlaze(kind)) {
    findings.push({
      code: 'needs-controlled-cooling',
      severity: 'info',
      message: `A ${profile === 'glaze-development' ? 'slow cool through glaze development' : 'drop and hold'} shapes a melted glaze; this ${kind} firing cools naturally.`,
    })
  }

  const usableHeight = usableHeightMm(kiln)
  const shelf = shelfFootprint(kiln)
  const fits: PieceFit[] = []
  const isBisqueFiring = kind === 'bisque'
  const hotterThanCone1 = coneAt >= CONE_1_AT
  let volumeL = 0
  let volatileIndex = -1
  let volatileKind: Colourant | null = null

  for (let index = 0; index < pieces.length; index++) {
    const piece = pieces[index]
    const name = pieceName(piece, index)
    const lineVolumeL = pieceVolumeL(piece) * piece.quantity
    volumeL += lineVolumeL
    const fitsHeight = piece.heightMm <= usableHeight
    const fitsFootprint = footprintFits(shelf, piece)
    fits.push({ pieceIndex: index, fitsHeight, fitsFootprint, volumeL: lineVolumeL })
    const form = piece.form ?? 'open'
    const body = piece.clay.body

    if (!fitsHeight) {
      findings.push({
        code: 'piece-too-tall',
        severity: 'block',
        pieceIndex: index,
        message: `${name} is ${mm(piece.heightMm)} tall; this kiln takes up to ${mm(usableHeight)}. Choose a taller kiln or a shorter piece.`,
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
        message: `${name} is ${size} and does not fit ${across}. Choose a wider kiln or a smaller piece.`,
        ...(shelf.shape === 'round' && piece.round !== true
          ? { detail: 'On a round shelf a rectangular piece needs room for its diagonal.' }
          : {}),
      })
    }
    if (kiln.shelfLoadKg !== undefined && piece.weightG !== undefined && piece.weightG / 1000 > kiln.shelfLoadKg) {
      findings.push({
        code: 'shelf-overweight',
        severity: 'block',
        pieceIndex: index,
        message: `${name} weighs ${kg(piece.weightG / 1000)}; one shelf of this kiln carries up to ${kg(kiln.shelfLoadKg)}. Choose a kiln with stronger shelves, or stand it on the kiln floor if the studio agrees.`,
        detail: 'An overloaded shelf can crack at heat and drop everything on it onto the shelves below.',
      })
    }

    const clayMaxAt = coneIndex(piece.clay.maxCone)
    if (coneAt > clayMaxAt) {
      findings.push({
        code: 'clay-overfire',
        severity: 'block',
        pieceIndex: index,
        message: `${name}’s clay is rated to ${formatCone(piece.clay.maxCone)}; ${formatCone(cone)} is hotter. Fire it no hotter than ${formatCone(piece.clay.maxCone)}.`,
        detail: 'Clay fired past its maturity slumps, bloats or melts onto the shelf, and can spoil other pots.',
      })
    }
    if (meltsGlaze(kind) && coneAt < coneIndex(piece.clay.minCone)) {
      findings.push({
        code: 'clay-underfire',
        severity: 'warn',
        pieceIndex: index,
        message: `${name}’s clay matures at ${formatCone(piece.clay.minCone)} or hotter; at ${formatCone(cone)} it stays porous and weak. Fire it to at least ${formatCone(piece.clay.minCone)} if it must hold water.`,
        detail: 'Underfired clay is not vitrified: it is weaker and not watertight.',
      })
    }
    if (body === 'earthenware' && clayMaxAt > CONE_1_AT) {
      findings.push({
        code: 'clay-body-range',
        severity: 'block',
        pieceIndex: index,
        message: `${name} is declared earthenware rated to ${formatCone(piece.clay.maxCone)}; earthenware matures at cone 1 or cooler. Check the bag: if it is stoneware or porcelain, say so; if it is earthenware, rate it no hotter than cone 1.`,
        detail: 'Earthenware fired to stoneware heat slumps, bloats and melts into a puddle that welds to the shelf.',
      })
    } else if (body === 'porcelain' && clayMaxAt < CONE_4_AT) {
      findings.push({
        code: 'clay-body-range',
        severity: 'block',
        pieceIndex: index,
        message: `${name} is declared porcelain rated only to ${formatCone(piece.clay.maxCone)}; porcelain matures at cone 4 or hotter. Check the bag and correct the body or its cones.`,
        detail: 'A body declared wrongly is fired at the wrong heat: the studio plans the load from what you declare.',
      })
    }

    if (form === 'solid' && piece.wallThicknessMm > VERY_THICK_MM) {
      findings.push({
        code: 'solid-too-thick',
        severity: 'block',
        pieceIndex: index,
        message: `${name} is solid and ${mm(piece.wallThicknessMm)} thick; studios take solid pieces up to ${mm(VERY_THICK_MM)}. Hollow it out to walls of about 13 mm, or fire it in your own kiln on a very long schedule.`,
        detail:
          'Steam and gases cannot leave the middle of a thick solid piece fast enough; it can burst and throw shards across the load.',
      })
    }
    if (form === 'closed' && piece.ventHole !== true && piece.state !== 'glazed') {
      findings.push({
        code: 'closed-no-vent',
        severity: 'block',
        pieceIndex: index,
        message: `${name} is a closed form without a vent hole. Pierce a small hole (a pin tool or a drinking straw will do) where it will not show, then mark it vented.`,
        detail: 'Air and steam sealed inside expand with the heat and can burst the piece.',
      })
    }

    const glaze = piece.glaze
    const support = glaze?.support ?? 'none'
    if (glaze) {
      if (isBisqueFiring) {
        findings.push({
          code: 'glaze-in-bisque',
          severity: 'block',
          pieceIndex: index,
          message:
            piece.state === 'greenware'
              ? `${name} is glazed, and this is a bisque firing. Bring it to a single firing if it is meant to be fired once, or wipe the glaze off.`
              : `${name} is glazed, and this is a bisque firing. Bring it to a glaze firing instead.`,
          detail: 'Bisque loads are stacked with pieces touching; glaze would weld them together and to the shelves.',
        })
      } else if (kind !== 'lustre') {
        if (coneAt > coneIndex(glaze.maxCone)) {
          findings.push({
            code: 'glaze-cone-mismatch',
            severity: 'block',
            pieceIndex: index,
            message: `${name}’s glaze is rated to ${formatCone(glaze.maxCone)}; at ${formatCone(cone)} it will run. Choose a firing no hotter than ${formatCone(glaze.maxCone)}.`,
            detail: 'An overfired glaze runs off the pot and onto the shelf.',
          })
        } else if (coneAt < coneIndex(glaze.minCone)) {
          findings.push({
            code: 'glaze-cone-mismatch',
            severity: 'warn',
            pieceIndex: index,
            message: `${name}’s glaze needs ${formatCone(glaze.minCone)} or hotter; at ${formatCone(cone)} it will come out dry or rough. Choose a hotter firing for it.`,
          })
        }
        if (glaze.onFoot === true && support === 'none') {
          findings.push({
            code: 'glaze-on-foot',
            severity: 'block',
            pieceIndex: index,
            message: `${name} has glaze on its foot. Wipe the foot clean, or set the piece on a cookie or tray (on a stilt at low fire).`,
            detail: 'Glaze on the foot welds the pot to the shelf.',
          })
        }
        if (glaze.runny === true && support !== 'cookie' && support !== 'tray') {
          findings.push({
            code: 'runny-glaze-tray',
            severity: 'warn',
            pieceIndex: index,
            message: `${name} has a runny glaze. Set it on a catch cookie or tray${support === 'stilt' ? ': a stilt lifts the foot but catches no drips' : ''}.`,
            detail: 'A runny glaze can drip off the pot and ruin the shelf beneath it.',
          })
        }
        if (glaze.reductionOnly === true && firing.atmosphere !== 'reduction') {
          findings.push({
            code: 'reduction-glaze',
            severity: 'info',
            pieceIndex: index,
            message: `${name}’s glaze develops its colour in reduction; in ${firing.atmosphere} it will come out differently (copper reds turn green or clear, celadons pale). Choose a reduction firing if the colour matters.`,
          })
        }
        if (glaze.tested === false) {
          findings.push({
            code: 'untested-glaze',
            severity: 'warn',
            pieceIndex: index,
            message: `${name}’s glaze has not been tried at this cone and atmosphere. Send a test tile first, or fire the piece on a catch tray.`,
            detail: 'An untried glaze can run, crawl or blister, and the studio cannot tell in advance how it behaves in this kiln.',
          })
        }
        if (shared && volatileIndex < 0 && glaze.colourants) {
          for (const colourant of glaze.colourants) {
            if (colourant === 'chrome-tin' || colourant === 'copper') {
              volatileIndex = index
              volatileKind = colourant
              break
            }
          }
        }
      }
    }
    if (support === 'stilt' && hotterThanCone1 && (body === 'stoneware' || body === 'porcelain')) {
      findings.push({
        code: 'stilt-high-fire',
        severity: 'block',
        pieceIndex: index,
        message: `${name} is ${body} set on a stilt at ${formatCone(cone)}. Stilts belong to low fire: wipe the foot clean and stand it on the shelf, or on a cookie.`,
        detail: 'Stoneware and porcelain soften at their maturing heat and sag over a stilt’s points, which can also weld into the foot.',
      })
    }

    const materials = piece.materials
    if (materials && materials.length > 0) {
      const contained = support === 'tray' || materials.includes('saggar-salts')
      for (const material of materials) {
        if (material === 'metal') {
          findings.push({
            code: 'foreign-material',
            severity: 'block',
            pieceIndex: index,
            message: `${name} has metal in or on it. Take the metal out: wire, hooks and fittings are added after firing.`,
            detail: 'Most metals melt, burn or scale at kiln heat, drip onto shelves and can damage elements.',
          })
        } else if ((material === 'glass' || material === 'combustible') && shared && !contained) {
          findings.push({
            code: 'foreign-material',
            severity: 'block',
            pieceIndex: index,
            message: `${name} has ${materialWord(material)} in it, and this load is shared. Set it in a catch tray or a saggar, or ask for a kiln load of your own.`,
            detail:
              material === 'glass'
                ? 'Glass melts and runs far below glaze heat and can run off the piece onto the shelf.'
                : 'Combustibles (sawdust, seeds, fibre) smoke and flare as they burn out and can mark other pots.',
          })
        } else if (material === 'saggar-salts' && kiln.kind === 'electric') {
          findings.push({
            code: 'foreign-material',
            severity: 'warn',
            pieceIndex: index,
            message: `${name} goes in a saggar with salts; in an electric kiln their fumes attack the elements. Ask the studio first; many fire saggars only in fuel kilns.`,
          })
        } else if (material === 'paper-clay' && (kind === 'bisque' || kind === 'single') && piece.state === 'greenware') {
          findings.push({
            code: 'foreign-material',
            severity: 'info',
            pieceIndex: index,
            message: `${name} is paper clay: its fibre burns out in this firing with smoke and smell, so the kiln is vented.`,
          })
        }
      }
    }

    if (kind === 'lustre' && piece.state !== 'glazed') {
      findings.push({
        code: 'lustre-ware',
        severity: 'block',
        pieceIndex: index,
        message: `${name} is ${piece.state}; lustre, decals and china paint go on glazed ware only. Glaze fire it first, then bring it to this firing.`,
        detail: 'Overglazes fuse into a fired glaze surface; on bare clay they sink in and come out dull.',
      })
    }
    if (kind === 'raku') {
      if (body !== 'raku') {
        findings.push({
          code: 'raku-body',
          severity: 'block',
          pieceIndex: index,
          message: `${name} is ${body}, not a raku body. Raku ware must be made of a raku clay (open, heavily grogged) to survive being pulled hot.`,
          detail: 'A dense body cracks or shatters from the shock of leaving the kiln at glaze heat.',
        })
      }
      if (piece.state !== 'bisque') {
        findings.push({
          code: 'raku-ware',
          severity: 'block',
          pieceIndex: index,
          message: `${name} is ${piece.state}; raku takes bisqued, glazed ware. Bisque it first.`,
        })
      } else if (piece.wallThicknessMm > THICK_WALL_MM || form !== 'open') {
        findings.push({
          code: 'raku-ware',
          severity: 'warn',
          pieceIndex: index,
          message: `${name} is ${form === 'open' ? `${mm(piece.wallThicknessMm)} thick` : form}; raku ware is best thin and open, since thick or closed ware cracks when pulled hot.`,
        })
      }
    }

    if (piece.state === 'greenware') {
      // Lustre and raku refuse greenware with their own findings above.
      if (kind === 'glaze') {
        findings.push({
          code: 'not-bisqued',
          severity: 'block',
          pieceIndex: index,
          message: `${name} has not been bisque fired. Bisque it first, or bring it to a single firing if it is glazed raw.`,
          detail: 'Greenware in a fast glaze firing can crack or burst.',
        })
      }
      if (piece.boneDry !== true) {
        findings.push({
          code: 'wet-greenware',
          severity: 'block',
          pieceIndex: index,
          message: `${name} is not marked bone dry. Let it dry until it no longer feels cool against your cheek, then mark it bone dry.`,
          detail: 'Water left in the clay turns to steam at 100 °C and can burst the piece, scattering shards over other pots.',
        })
      }
      if (piece.wallThicknessMm > THICK_WALL_MM || form !== 'open') {
        if (kiln.preheatHold) {
          findings.push({
            code: 'thick-wall-preheat',
            severity: piece.wallThicknessMm > THICK_WALL_MM ? 'warn' : 'info',
            pieceIndex: index,
            message: `${name} is ${form === 'open' ? `${mm(piece.wallThicknessMm)} thick` : `${form}, ${mm(piece.wallThicknessMm)} thick`}; it is candled for ${hours(schedule.candlingHoldMinutes)} at ${degrees(CANDLING_C)} and climbed slowly to 650 °C. Make sure it is fully dry.`,
            detail: `Thick walls and closed or solid forms dry and heat slowly in the middle, and can burst if steam builds up there.`,
          })
        } else if (piece.wallThicknessMm > THICK_WALL_MM) {
          findings.push({
            code: 'thick-wall-preheat',
            severity: 'block',
            pieceIndex: index,
            message: `${name} has ${mm(piece.wallThicknessMm)} walls and this kiln cannot hold a low preheat. Choose a kiln that can candle, or hollow the piece to under ${THICK_WALL_MM} mm.`,
            detail: `Walls over ${THICK_WALL_MM} mm dry and heat slowly in the middle, and can burst if steam builds up there.`,
          })
        }
      }
    }
  }

  if (volatileIndex >= 0) {
    findings.push({
      code: 'volatile-colourant',
      severity: 'warn',
      pieceIndex: volatileIndex,
      message:
        volatileKind === 'chrome-tin'
          ? `${pieceName(pieces[volatileIndex], volatileIndex)} has a chrome–tin pink. Ask the studio to set it apart: chrome vapour turns neighbouring tin glazes pink, and tin nearby turns chrome greens brown.`
          : `${pieceName(pieces[volatileIndex], volatileIndex)} has a copper glaze. Ask the studio to set it apart: copper vapour flashes green or red onto pots next to it.`,
      detail: 'Some colourants travel as vapour at glaze heat and mark other people’s pots in a shared load.',
    })
  }

  const shelfLoadKg = kiln.shelfLoadKg
  if (shelfLoadKg !== undefined) {
    const shelves = planShelves(kiln, pieces)
    let heaviest = -1
    for (let i = 0; i < shelves.length; i++)
      if (shelves[i].lines.length > 1 || shelves[i].lines[0].count > 1) {
        if (shelves[i].weightKg > shelfLoadKg && (heaviest < 0 || shelves[i].weightKg > shelves[heaviest].weightKg)) heaviest = i
      }
    if (heaviest >= 0) {
      findings.push({
        code: 'shelf-overweight',
        severity: 'block',
        message: `Laid out shelf by shelf, these pieces put about ${kg(shelves[heaviest].weightKg)} on one shelf; a shelf here carries up to ${kg(shelfLoadKg)}. Bring fewer heavy pieces, or ask the studio to spread them over more shelves.`,
        detail: 'An overloaded shelf can crack at heat and drop everything on it onto the shelves below.',
      })
    }
  }

  const load = loadKiln(kiln)
  const need = shelfShare(
    load,
    gapFor(load, kind),
    pieces.flatMap((piece, index) => piecesOfLine(`w:${index}`, piece)),
  ).shelves
  const room = firing.load?.room
  const tallest = pieces.reduce((h, piece) => Math.max(h, piece.heightMm), 0)
  const shelvesLeft = room ? shelvesLeftFor(room, tallest) : null
  const fitsLoad =
    firing.load === undefined || (firing.load.fits ?? (shelvesLeft !== null && need <= shelvesLeft + 1e-9 && tallest <= room!.tallestMm))
  if (!fitsLoad) {
    findings.push({
      code: 'over-capacity',
      severity: 'block',
      message:
        room && tallest > room.tallestMm
          ? `The tallest piece stands ${mm(tallest)}; this firing’s load has room for pieces up to ${mm(room.tallestMm)}. Bring shorter pieces or ask for space in another firing.`
          : `These pieces take about ${shelvesWords(need)}; this firing has ${shelvesWords(shelvesLeft ?? 0)} left for pieces this tall. Bring fewer pieces or ask for space in another firing.`,
      detail:
        'Space is planned shelf by shelf: every piece’s footprint with the studio’s gap between glazed pieces, every layer as tall as its tallest piece.',
    })
  }

  if (!kiln.controlledCooling && kind !== 'raku') {
    const wareAsks = wareAsksForSlowCooling(pieces)
    const profileAsked = meltsGlaze(kind) && profile !== 'natural'
    if (firing.slowCool === true || wareAsks || profileAsked) {
      let thickIndex = -1
      if (wareAsks) thickIndex = pieces.findIndex((piece) => piece.wallThicknessMm > THICK_WALL_MM)
      const askedBy =
        firing.slowCool === true
          ? 'This firing asks for a slow cool'
          : profileAsked
            ? `This firing asks for ${profile === 'glaze-development' ? 'a slow cool through glaze development' : 'a drop and hold'}`
            : null
      findings.push({
        code: 'needs-controlled-cooling',
        severity: 'warn',
        ...(askedBy === null && thickIndex >= 0 ? { pieceIndex: thickIndex } : {}),
        message:
          askedBy !== null
            ? `${askedBy}, and this kiln cannot control its cooling. Choose a kiln with controlled cooling, or accept a natural cool.`
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
      shelvesNeeded: need,
      shelvesLeft,
      fitsLoad,
    },
  }
}

/** The cooling a firing will actually get in this kiln (natural when the kiln cannot follow the profile). */
export function coolingFor(
  kiln: Pick<Kiln, 'maxRampCPerHour' | 'preheatHold' | 'controlledCooling'>,
  firing: Pick<Firing, 'kind' | 'cooling'>,
): CoolingProfile {
  return coolingProfileFor({ kind: firing.kind, kiln, cooling: firing.cooling })
}
