// A piece as the form holds it against the piece the API takes: hidden fields never leak through,
// and a saved piece comes back into the form as it was. Sizes in mm (NIST SP 811: 1 in = 25.4 mm).
import { describe, expect, it } from 'vitest'
import { parseCompose } from '../../../src/features/requests/composeForm'
import { newPiece, pieceDraftOf, pieceInputOf } from '../../../src/lib/pieceDraft'

describe('the piece form’s mapping', () => {
  it('gives a round piece its width as its depth, and drops the glaze of an unglazed piece', () => {
    const piece = { ...newPiece(), round: true, widthMm: 100, depthMm: 40, glazed: false }
    const input = pieceInputOf(piece)
    expect(input.depthMm).toBe(100)
    expect(input.glaze).toBeUndefined()
  })

  it('asks “bone dry?” only of greenware', () => {
    expect(pieceInputOf({ ...newPiece(), state: 'bisque', boneDry: true }).boneDry).toBeUndefined()
    expect(pieceInputOf({ ...newPiece(), state: 'greenware', boneDry: true }).boneDry).toBe(true)
  })

  it('brings a saved piece back into the form unchanged', () => {
    const parsed = parseCompose({ pieces: [{ ...newPiece(), label: 'Tall vase', heightMm: 304.8, round: true }], notes: '' }, 'imperial')
    expect(parsed.pieces).not.toBeNull()
    const again = parseCompose({ pieces: parsed.pieces!.map(pieceDraftOf), notes: '' }, 'imperial')
    expect(again.pieces).toEqual(parsed.pieces)
  })

  it('names a bad field in the reader’s units, and still checks the pieces when only the notes are wrong', () => {
    const tooTall = parseCompose({ pieces: [{ ...newPiece(), heightMm: -5 }], notes: '' }, 'imperial')
    expect(tooTall.pieces).toBeNull()
    expect(Object.keys(tooTall.messages).some((k) => k.includes('heightMm'))).toBe(true)
    const longNotes = parseCompose({ pieces: [newPiece()], notes: 'x'.repeat(5000) }, 'metric')
    expect(longNotes.pieces).not.toBeNull()
  })
})
