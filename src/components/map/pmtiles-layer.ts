// Loaded only when an installation sets BASEMAP_PMTILES_URL: the PMTiles reader and the vector
// renderer stay out of every other map's code.
import type { GridLayer } from 'leaflet'
import { PMTiles } from 'pmtiles'
import { leafletLayer, type LabelRule } from 'protomaps-leaflet'

/** Labels in the app's own face (shipped with it, never fetched from elsewhere), the system sans after it. */
const LABEL_FAMILY = "'DM Sans', sans-serif"

/**
 * A Leaflet layer drawing the vector basemap in one PMTiles file, read with HTTP range requests.
 * The file's header says up to which zoom it holds tiles; deeper zooms draw those tiles larger.
 */
export async function pmtilesLayer(url: string): Promise<{ layer: GridLayer; maxZoom: number }> {
  const file = new PMTiles(url)
  const header = await file.getHeader()
  const layer = leafletLayer({
    url: file,
    flavor: 'light',
    lang: 'en',
    maxDataZoom: header.maxZoom,
    attribution: '© <a href="https://www.openstreetmap.org/copyright">OpenStreetMap</a> contributors',
  })
  // The layer's labellers hold this same array of rules, so changing the symbolizers in place is enough.
  inFamily(layer.labelRules, LABEL_FAMILY)
  return { layer: layer as unknown as GridLayer, maxZoom: header.maxZoom }
}

/**
 * The flavour's label rules name the generic `sans-serif`; each font attribute (nested in grouped
 * and offset symbolizers) is wrapped so the same size and weight are drawn in our family.
 */
function inFamily(rules: LabelRule[], family: string) {
  const seen = new Set<object>()
  const visit = (node: unknown) => {
    if (!node || typeof node !== 'object' || seen.has(node)) return
    seen.add(node)
    for (const [key, value] of Object.entries(node)) {
      if (key === 'font' && isFontAttr(value)) {
        const get = value.get.bind(value)
        value.get = (zoom, feature) => get(zoom, feature).replace(/sans-serif$/, family)
      } else visit(value)
    }
  }
  for (const rule of rules) visit(rule.symbolizer)
}

interface FontAttrLike {
  get: (zoom: number, feature?: unknown) => string
}

function isFontAttr(value: unknown): value is FontAttrLike {
  return typeof value === 'object' && value !== null && typeof (value as FontAttrLike).get === 'function'
}
