// How a piece came out, in the words crew and potters read: one list for the result forms, the
// piece page and the request's results.
import type { PieceOutcome } from '../../shared/schemas/pickup'

export const OUTCOMES: readonly { value: PieceOutcome; label: string }[] = [
  { value: 'fine', label: 'Fine' },
  { value: 'cracked', label: 'Cracked' },
  { value: 'dunted', label: 'Dunted' },
  { value: 'blown-out', label: 'Blown out' },
  { value: 'bloated', label: 'Bloated' },
  { value: 'glaze-ran', label: 'Glaze ran' },
  { value: 'stuck-to-shelf', label: 'Stuck to the shelf' },
  { value: 'crawled', label: 'Crawled' },
  { value: 'pinholed', label: 'Pinholed' },
  { value: 'underfired', label: 'Underfired' },
  { value: 'crazed', label: 'Crazed' },
  { value: 'other', label: 'Other' },
]

export const outcomeLabel = (outcome: PieceOutcome) => OUTCOMES.find((o) => o.value === outcome)?.label ?? outcome

/** Where a piece stands in a load, counted from the bottom as crew count when they load. */
export const placeInWords = (place: { layer: number; shelf: number }) => `Layer ${place.layer + 1}, shelf ${place.shelf + 1}`
