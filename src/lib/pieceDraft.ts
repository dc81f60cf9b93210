// A piece as a form holds it while it is typed: sizes in mm (SI, as the firing science takes them),
// numbers possibly empty or not numbers yet, and the choices that hide fields ("round", "glazed").

import type { ClayBody, Piece, PieceState } from '../../shared/firing/check'

/** A number field's value: undefined while empty, NaN while it holds something that is not a number. */
export type NumberDraft = number | undefined

export interface PieceDraft {
  label: string
  quantity: NumberDraft
  heightMm: NumberDraft
  /** The diameter when round. */
  widthMm: NumberDraft
  depthMm: NumberDraft
  round: boolean
  wallThicknessMm: NumberDraft
  clay: { body: ClayBody; minCone: string; maxCone: string }
  state: PieceState
  boneDry: boolean
  glazed: boolean
  glaze: { minCone: string; maxCone: string; runny: boolean; onFoot: boolean; onCookie: boolean }
}

/** A form with a list of pieces, as the shared piece rows edit it. */
export interface PieceFormValues {
  pieces: PieceDraft[]
}

/** A new row: a 4 in mug, bisqued, in a mid-fire stoneware under a cone 5–6 glaze. */
export function newPiece(): PieceDraft {
  return {
    label: '',
    quantity: 1,
    heightMm: 101.6,
    widthMm: 88.9,
    depthMm: 88.9,
    round: true,
    wallThicknessMm: 6.35,
    clay: { body: 'stoneware', minCone: '5', maxCone: '10' },
    state: 'bisque',
    boneDry: false,
    glazed: true,
    glaze: { minCone: '5', maxCone: '6', runny: false, onFoot: false, onCookie: false },
  }
}

/** The row in the shape pieceSchema reads: hidden fields left out. */
export function pieceInputOf(piece: PieceDraft) {
  return {
    label: piece.label,
    quantity: piece.quantity,
    heightMm: piece.heightMm,
    widthMm: piece.widthMm,
    // A round piece is as deep as it is wide; the depth field is hidden then.
    depthMm: piece.round ? piece.widthMm : piece.depthMm,
    round: piece.round,
    wallThicknessMm: piece.wallThicknessMm,
    clay: piece.clay,
    state: piece.state,
    boneDry: piece.state === 'greenware' ? piece.boneDry : undefined,
    glaze: piece.glazed ? piece.glaze : undefined,
  }
}

/** A stored piece back in the form, for editing a saved draft. */
export function pieceDraftOf(piece: Piece): PieceDraft {
  const blank = newPiece()
  return {
    label: piece.label ?? '',
    quantity: piece.quantity,
    heightMm: piece.heightMm,
    widthMm: piece.widthMm,
    depthMm: piece.depthMm,
    round: piece.round ?? false,
    wallThicknessMm: piece.wallThicknessMm,
    clay: { ...piece.clay },
    state: piece.state,
    boneDry: piece.boneDry ?? false,
    glazed: piece.glaze !== undefined,
    glaze: piece.glaze
      ? {
          minCone: piece.glaze.minCone,
          maxCone: piece.glaze.maxCone,
          runny: piece.glaze.runny ?? false,
          onFoot: piece.glaze.onFoot ?? false,
          onCookie: piece.glaze.onCookie ?? false,
        }
      : blank.glaze,
  }
}
