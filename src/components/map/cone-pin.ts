import L from 'leaflet'

// Pins that say what a studio fires: its cone and marks for atmospheres and kilns that change the
// surface (reduction, wood, soda), as a tag with a point at the place, not a bubble with a count.

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!)
}

export interface ConePinOptions {
  /** "6", "04/6", "04–10". */
  cones: string
  /** One letter each, e.g. ["R", "W"]. */
  marks: string[]
  selected?: boolean
  /** The studio's name in full beside the tag. */
  label?: string
}

// react-leaflet replaces a marker's element whenever its icon object changes, which loses focus;
// the same options always give the same icon.
const cache = new Map<string, L.DivIcon>()

const PIN_HEIGHT = 30
const PIN_WIDTH = 24

export function conePinIcon({ cones, marks, selected = false, label }: ConePinOptions): L.DivIcon {
  const key = `${cones}|${marks.join('')}|${selected ? 1 : 0}|${label ?? ''}`
  const cached = cache.get(key)
  if (cached) return cached
  const tone = selected ? 'bg-celadon-700 text-white border-white' : 'bg-white text-slip-900 border-clay-600'
  const markHtml = marks.length
    ? `<span class="ml-0.5 rounded-sm bg-clay-600 px-0.5 text-[10px] leading-tight font-bold text-white">${escapeHtml(marks.join(''))}</span>`
    : ''
  const name = label
    ? `<span class="absolute top-0 left-full ml-1 rounded-control bg-white px-1.5 py-0.5 text-xs font-semibold whitespace-nowrap text-slip-900 shadow-card">${escapeHtml(label)}</span>`
    : ''
  const icon = L.divIcon({
    className: '',
    html:
      `<span class="absolute bottom-0 left-1/2 flex -translate-x-1/2 flex-col items-center">` +
      `<span class="relative flex items-center"><span class="flex items-center rounded-control border-2 px-1 py-0.5 text-xs font-bold whitespace-nowrap shadow-card ${tone}">` +
      `<span aria-hidden="true">∆</span>${escapeHtml(cones)}${markHtml}</span>${name}</span>` +
      `<span class="block h-2 w-0.5 ${selected ? 'bg-celadon-700' : 'bg-clay-600'}"></span></span>`,
    // The tag is drawn centred above the place whatever its width; the box is the stem's reach.
    iconSize: [PIN_WIDTH, PIN_HEIGHT],
    iconAnchor: [PIN_WIDTH / 2, PIN_HEIGHT],
    tooltipAnchor: [0, -PIN_HEIGHT],
  })
  cache.set(key, icon)
  return icon
}

let centre: L.DivIcon | null = null

/** The place searched from: a ringed dot, not a pin, so it is never taken for a studio. */
export function searchCentreIcon(): L.DivIcon {
  centre ??= L.divIcon({
    className: '',
    html:
      `<span class="block size-5 rounded-full border-2 border-slip-900 bg-white/70 shadow-card">` +
      `<span class="m-auto mt-[5px] block size-1.5 rounded-full bg-slip-900"></span></span>`,
    iconSize: [20, 20],
    iconAnchor: [10, 10],
  })
  return centre
}
