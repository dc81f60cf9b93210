// The request form's values and how they are read: pieces through the shared request schema on
// every change (so each field gets the schema's own message), then checked and priced in the
// browser against the firing as it stands. The server checks again on save and on send.

import { checkWare, type Piece, type WareCheck } from '../../../shared/firing/check'
import { quoteRequest, type PriceList, type Quote } from '../../../shared/firing/quote'
import { requestCreateSchema } from '../../../shared/schemas/requests'
import { pieceInputOf, type PieceDraft } from '../../lib/pieceDraft'
import { collectMessages, type FieldMessages } from '../../lib/schemaMessages'
import type { UnitSystem } from '../../lib/units'
import type { FiringRecord, KilnRecord } from './api/types'

export interface ComposeValues {
  pieces: PieceDraft[]
  notes: string
}

export interface ParsedCompose {
  /** null while any piece field does not parse. */
  pieces: Piece[] | null
  notes: string
  messages: FieldMessages
}

export function parseCompose(values: ComposeValues, units: UnitSystem): ParsedCompose {
  const input = { pieces: values.pieces.map(pieceInputOf), notes: values.notes }
  const parsed = requestCreateSchema.safeParse(input)
  const messages: FieldMessages = {}
  if (!parsed.success) collectMessages(messages, parsed.error, input, '', units)
  return {
    pieces: parsed.success ? parsed.data.pieces : piecesIfValid(input.pieces),
    notes: values.notes.trim(),
    messages,
  }
}

// A notes field that is too long should not hide the check of pieces that are fine.
function piecesIfValid(pieces: unknown[]): Piece[] | null {
  const parsed = requestCreateSchema.shape.pieces.safeParse(pieces)
  return parsed.success ? parsed.data : null
}

export interface Outcome {
  check: WareCheck
  quote: Quote | null
  quoteProblem: string | null
}

/**
 * The check and the quote for these pieces in this firing, as the server works them out (space left
 * from the firing as last fetched). The inputs passed the schema; if the science still refuses
 * something, the page says so instead of going blank.
 */
export function checkAgainst(firing: FiringRecord, kiln: KilnRecord, priceList: PriceList | null, pieces: Piece[]): Outcome | string {
  try {
    const check = checkWare(
      kiln,
      {
        kind: firing.kind,
        cone: firing.cone,
        atmosphere: firing.atmosphere,
        slowCool: firing.slowCool,
        load: { room: firing.space },
      },
      pieces,
    )
    if (!priceList) return { check, quote: null, quoteProblem: null }
    try {
      return {
        check,
        quote: quoteRequest(priceList, { atmosphere: firing.atmosphere, slowCool: firing.slowCool }, pieces, kiln),
        quoteProblem: null,
      }
    } catch (error) {
      return { check, quote: null, quoteProblem: error instanceof Error ? error.message : String(error) }
    }
  } catch (error) {
    return error instanceof Error ? error.message : String(error)
  }
}
