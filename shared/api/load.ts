// The shapes the piece and load routes answer with (server/services/pieces.ts, load-plan.ts), declared
// once for the routes and the client.
import type { Finding } from '../firing/check'
import type { LayerPlan, LoadKiln, LoadRoom, PlacedPiece, PlanProblem, UnplacedReason } from '../firing/load'
import type { PieceOutcome } from '../schemas/pickup'
import type { FiringStatus } from '../workflow/firing-status'
import type { RequestState } from '../workflow/request-states'
import type { PhotoJson } from './photos'

/** Who and what a piece in a load is, beside where it stands. */
export interface LoadItemJson {
  key: string
  /** Null until the piece is checked in and tagged (a declared piece of a request taken on). */
  tag: string | null
  pieceId: string | null
  requestId: string
  potterId: string
  potterName: string
  /** The declared line's label, and which one of it. */
  label: string
  pieceIndex: number
  copy: number
  of: number
  heightMm: number
  widthMm: number
  depthMm: number
  round: boolean
  weightKg: number | null
  outcome: PieceOutcome | null
}

export type LoadPieceJson = PlacedPiece & Omit<LoadItemJson, 'heightMm' | 'widthMm' | 'depthMm' | 'round' | 'weightKg'>

export interface LoadLayerJson extends Omit<LayerPlan, 'shelves'> {
  shelves: { index: number; weightKg: number; taken: number; pieces: LoadPieceJson[] }[]
}

/** A firing's load: layers of shelves with every piece placed, what found no place and why, the room left. */
export interface LoadPlanJson {
  firingId: string
  firingStatus: FiringStatus
  /** Crew may still move pieces (until the firing starts). */
  editable: boolean
  /** When loading started and the plan became the load as it went in. */
  loadedAt: string | null
  kiln: LoadKiln
  gapMm: number
  maxLayers: number
  stackMm: number
  layers: LoadLayerJson[]
  unplaced: (LoadItemJson & { reason: UnplacedReason; reasonText: string })[]
  /** Pieces held back at drop-off: received, not in the load. */
  held: (LoadItemJson & { holdReason: string })[]
  problems: PlanProblem[]
  room: LoadRoom
  /** Everyone with ware in the load, in the order their colours are given. */
  potters: { id: string; name: string }[]
}

export interface PieceCheckJson {
  id: string
  label: string
  passed: boolean
}

/** A piece's place in its firing's load. */
export interface PiecePlaceJson {
  layer: number
  shelf: number
  x: number
  y: number
  rotation: 0 | 90
  layerCount: number
}

/** One tagged piece as its potter, the studio's people or an admin see it. */
export interface PieceJson {
  id: string
  tag: string
  requestId: string
  pieceIndex: number
  copy: number
  /** How many the line declares. */
  of: number
  label: string
  heightMm: number
  widthMm: number
  depthMm: number
  round: boolean
  weightG: number | null
  status: 'in-load' | 'held'
  hold: { reason: string; at: string } | null
  checks: PieceCheckJson[]
  outcome: { outcome: PieceOutcome; notes: string; at: string } | null
  photos: PhotoJson[]
  createdAt: string
}

/** A piece opened by its tag: whose, which firing, its findings, where it stands, and what the reader may do. */
export interface PieceView extends PieceJson {
  viewer: 'potter' | 'studio' | 'admin'
  potter: { id: string; displayName: string }
  request: { id: string; state: RequestState }
  firing: { id: string; kind: string; cone: string; atmosphere: string; firingDate: string; status: FiringStatus }
  studio: { id: string; name: string; timezone: string }
  kilnName: string
  /** The server's check findings about this piece's declared line. */
  findings: Finding[]
  place: PiecePlaceJson | null
  actions: ('hold' | 'release' | 'result')[]
}

/** What tagging a piece at drop-off answers: the piece, and the request's pieces so far. */
export interface PieceTagged {
  piece: PieceJson
  pieces: PieceJson[]
}
