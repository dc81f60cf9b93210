import type { BoardFiring, BoardStudio } from '../../../shared/api/board'
import { CONES, coneIndex } from '../../../shared/firing/cones'
import type { SearchResponse } from '../../../shared/schemas/search'
import type { LatLngPair } from '../../components/map/Basemap'

// What the results map is given, apart from the map itself so the page can work these out while
// the map's code (Leaflet) is still on its way.

/** Marks on a pin beside its cone: firings that change the ware's surface beyond the glaze alone. */
export type PinMark = 'reduction' | 'wood' | 'soda'

export const PIN_MARK_LETTERS: Record<PinMark, string> = { reduction: 'R', wood: 'W', soda: 'S' }
export const PIN_MARK_WORDS: Record<PinMark, string> = { reduction: 'reduction', wood: 'wood', soda: 'soda or salt' }

export interface MapStudio {
  id: string
  name: string
  position: LatLngPair
  /** What the pin says: the cone fired, or the coolest and hottest of several ("04–10"). */
  cones: string
  marks: PinMark[]
}

/** The cone a pin shows: one cone as is, two as "6/10", more as the range from coolest to hottest. */
export function pinCones(firings: readonly Pick<BoardFiring, 'cone'>[]): string {
  const ranks = [...new Set(firings.map((f) => coneIndex(f.cone)))].sort((a, b) => a - b)
  if (ranks.length === 0) return ''
  if (ranks.length <= 2) return ranks.map((r) => CONES[r]).join('/')
  return `${CONES[ranks[0]]}–${CONES[ranks[ranks.length - 1]]}`
}

export function pinMarks(studio: Pick<BoardStudio, 'firings' | 'kilns'>): PinMark[] {
  const marks: PinMark[] = []
  if (studio.firings.some((f) => f.atmosphere === 'reduction')) marks.push('reduction')
  const kinds = new Set(studio.kilns.filter((k) => studio.firings.some((f) => f.kilnId === k.id)).map((k) => k.kind))
  if (kinds.has('wood')) marks.push('wood')
  if (kinds.has('soda') || kinds.has('salt')) marks.push('soda')
  return marks
}

/** One pin per studio on the board. */
export function studiosOf(board: readonly BoardStudio[]): MapStudio[] {
  return board.map((card) => ({
    id: card.studio.id,
    name: card.studio.name,
    position: [card.studio.lat, card.studio.lng],
    cones: pinCones(card.firings),
    marks: pinMarks(card),
  }))
}

/** The view a set of results is shown in: the searched place and the studios found around it. */
export interface MapFit {
  /** Changes when the map should go somewhere else (a new place or distance), not for a new cone: `whereKey`. */
  key: string
  origin: SearchResponse['origin']
  radiusKm: number | null
  studios: MapStudio[]
}

export interface AreaSearch {
  near: string
  radiusKm: string
}
