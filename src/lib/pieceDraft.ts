// A piece as a form holds it while it is typed: sizes in mm (SI, as the firing science takes them),
// numbers possibly empty or not numbers yet, and the choices that hide fields ("round", "glazed").

import type { ClayBody, Colourant, GlazeSupport, Material, Piece, PieceForm, PieceState } from '../../shared/firing/check'

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
  form: PieceForm
  ventHole: boolean
  weightG: NumberDraft
  clay: { body: ClayBody; minCone: string; maxCone: string }
  state: PieceState
  boneDry: boolean
  glazed: boolean
  glaze: {
    minCone: string
    maxCone: string
    runny: boolean
    onFoot: boolean
    support: GlazeSupport
    /** Checkbox lists hold the values ticked; react-hook-form gives false when none is. */
    colourants: Colourant[] | false
    reductionOnly: boolean
    untested: boolean
  }
  materials: Material[] | false
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
    form: 'open',
    ventHole: false,
    weightG: undefined,
    clay: { body: 'stoneware', minCone: '5', maxCone: '10' },
    state: 'bisque',
    boneDry: false,
    glazed: true,
    glaze: {
      minCone: '5',
      maxCone: '6',
      runny: false,
      onFoot: false,
      support: 'none',
      colourants: [],
      reductionOnly: false,
      untested: false,
    },
    materials: [],
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
    form: piece.form,
    ventHole: piece.form === 'closed' ? piece.ventHole : undefined,
    weightG: piece.weightG,
    clay: piece.clay,
    state: piece.state,
    boneDry: piece.state === 'greenware' ? piece.boneDry : undefined,
    glaze: piece.glazed ? glazeInputOf(piece.glaze) : undefined,
    materials: piece.materials ? piece.materials : [],
  }
}

function glazeInputOf(glaze: PieceDraft['glaze']) {
  return {
    minCone: glaze.minCone,
    maxCone: glaze.maxCone,
    runny: glaze.runny,
    onFoot: glaze.onFoot,
    support: glaze.support,
    colourants: glaze.colourants ? glaze.colourants : [],
    reductionOnly: glaze.reductionOnly,
    // Left out unless the potter says it is untried, so saying nothing raises no finding.
    ...(glaze.untested ? { tested: false } : {}),
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
    form: piece.form ?? 'open',
    ventHole: piece.ventHole ?? false,
    weightG: piece.weightG,
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
          support: piece.glaze.support ?? 'none',
          colourants: piece.glaze.colourants ?? [],
          reductionOnly: piece.glaze.reductionOnly ?? false,
          untested: piece.glaze.tested === false,
        }
      : blank.glaze,
    materials: piece.materials ?? [],
  }
}
