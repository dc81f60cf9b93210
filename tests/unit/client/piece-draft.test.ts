// The piece form's mapping to the schema's shape: what the rows hold becomes what the ware check reads.
import { describe, expect, it } from 'vitest'
import { pieceSchema } from '../../../shared/schemas/firing'
import { newPiece, pieceDraftOf, pieceInputOf } from '../../../src/lib/pieceDraft'
import { thinReadings } from '../../../shared/firing/readings'
import { MAX_READINGS } from '../../../shared/schemas/pickup'

describe('pieceInputOf', () => {
  it('sends the new fields the schema reads, and leaves out what the choices hide', () => {
    const draft = {
      ...newPiece(),
      form: 'closed' as const,
      ventHole: true,
      weightG: 850,
      materials: ['glass' as const],
      glaze: { ...newPiece().glaze, support: 'tray' as const, colourants: ['copper' as const], untested: true },
    }
    const parsed = pieceSchema.parse(pieceInputOf(draft))
    expect(parsed).toMatchObject({ form: 'closed', ventHole: true, weightG: 850, materials: ['glass'] })
    expect(parsed.glaze).toMatchObject({ support: 'tray', colourants: ['copper'], tested: false })
    // An open form has no vent hole to speak of; a glaze the potter did not flag as untried says nothing.
    const open = pieceSchema.parse(pieceInputOf({ ...newPiece(), ventHole: true }))
    expect(open.ventHole).toBeUndefined()
    expect(open.glaze?.tested).toBeUndefined()
  })

  it('reads checkbox lists with nothing ticked (false from the form library) as empty', () => {
    const draft = { ...newPiece(), materials: false as const, glaze: { ...newPiece().glaze, colourants: false as const } }
    const parsed = pieceSchema.parse(pieceInputOf(draft))
    expect(parsed.materials).toEqual([])
    expect(parsed.glaze?.colourants).toEqual([])
  })

  it('round-trips a stored piece through the form', () => {
    const stored = pieceSchema.parse(
      pieceInputOf({ ...newPiece(), form: 'solid', weightG: 1200, glaze: { ...newPiece().glaze, support: 'cookie', untested: true } }),
    )
    expect(pieceSchema.parse(pieceInputOf(pieceDraftOf(stored)))).toEqual(stored)
  })
})

describe('thinReadings', () => {
  it('keeps a long export under the limit, with its first, hottest and last reading', () => {
    const readings = Array.from({ length: MAX_READINGS * 3 }, (_, i) => ({
      at: new Date(Date.UTC(2026, 0, 1) + i * 20_000).toISOString(),
      tempC: i === 7777 ? 1300 : Math.min(1200, i / 10),
    }))
    const thinned = thinReadings(readings, MAX_READINGS)
    expect(thinned.length).toBeLessThanOrEqual(MAX_READINGS)
    expect(thinned[0]).toBe(readings[0])
    expect(thinned.at(-1)).toBe(readings.at(-1))
    expect(thinned).toContain(readings[7777])
    expect(thinReadings(readings.slice(0, 10), MAX_READINGS)).toHaveLength(10)
  })
})
