// Tag labels to print: a page made for the browser's own printing (@media print and @page), so no
// headless browser is needed to make a PDF. A sheet of 2⅝ × 1 in labels, 30 to a US Letter page, or
// one label sized for a label printer. Each carries its QR code (the piece's address, so any phone's
// camera opens it), the tag in large letters, the potter, the firing and the cone.
import QRCode from 'qrcode'
import { formatDate } from '../../shared/dates'
import { formatCone } from '../../shared/firing/cones'
import type { Piece } from '../../shared/firing/check'
import type { AppContext } from '../context'
import { Firing } from '../entities/Firing'
import { Kiln } from '../entities/Kiln'
import { Studio } from '../entities/Studio'
import { notFound } from '../http/errors'
import { tagFrom } from './pieces'

const escape = (value: string) =>
  value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!)

interface LabelRow {
  tag: string
  piece_index: number
  copy: number
  status: 'in-load' | 'held'
  pieces: Piece[]
  display_name: string
}

const FIRING_WORDS: Record<Firing['kind'], string> = {
  bisque: 'Bisque',
  glaze: 'Glaze',
  single: 'Single fire',
  lustre: 'Lustre',
  raku: 'Raku',
}

/** The labels of a firing's tagged pieces: all of them, one request's, or one piece's. */
export async function labelsHtml(ctx: AppContext, firingId: string, only: { tag?: string; request?: string } = {}): Promise<string> {
  const firing = await ctx.db.getRepository(Firing).findOneBy({ id: firingId })
  if (!firing) throw notFound('That firing')
  const kiln = await ctx.db.getRepository(Kiln).findOneByOrFail({ id: firing.kilnId })
  const studio = await ctx.db.getRepository(Studio).findOneByOrFail({ id: kiln.studioId })
  const tag = only.tag !== undefined ? tagFrom(only.tag) : null
  const rows: LabelRow[] = await ctx.db.query(
    `SELECT p.tag, p.piece_index, p.copy, p.status, r.pieces, u.display_name
     FROM pieces p JOIN firing_requests r ON r.id = p.request_id JOIN users u ON u.id = r.potter_id
     WHERE r.firing_id = $1 AND ($2::text IS NULL OR p.tag = $2) AND ($3::uuid IS NULL OR r.id = $3)
     ORDER BY u.display_name, r.id, p.piece_index, p.copy`,
    [firingId, tag, only.request ?? null],
  )
  if (tag && !rows.length) throw notFound('No piece with that tag in this firing')
  const firingLine = `${FIRING_WORDS[firing.kind]} · ${formatCone(firing.cone)} · ${formatDate(firing.firingDate, studio.timezone)}`
  const labels = await Promise.all(
    rows.map(async (row) => {
      const line = row.pieces[row.piece_index]
      const what = `${line?.label?.trim() || `Piece ${row.piece_index + 1}`} ${row.copy} of ${line?.quantity ?? row.copy}`
      const svg = await QRCode.toString(`${ctx.config.publicUrl}/pieces/${row.tag}`, { type: 'svg', errorCorrectionLevel: 'M', margin: 1 })
      return `<article class="label" data-tag="${row.tag}">
  ${svg.replace('<svg ', `<svg role="img" aria-label="QR code for ${row.tag}" `)}
  <div class="text">
    <p class="tag">${row.tag}</p>
    <p class="who">${escape(row.display_name)}</p>
    <p class="what">${escape(what)}${row.status === 'held' ? ' · HELD BACK' : ''}</p>
    <p class="what">${escape(firingLine)}</p>
    <p class="what">${escape(studio.name)} · ${escape(kiln.name)}</p>
  </div>
</article>`
    }),
  )
  const single = tag !== null
  const title = single ? `Label ${tag}` : `Tag labels — ${firingLine}`
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escape(title)}</title>
<style>
  @page { ${single ? 'size: 2.625in 1in; margin: 0;' : 'size: letter; margin: 0.5in 0.19in;'} }
  * { box-sizing: border-box; }
  body { margin: 0; font-family: 'DM Sans', Helvetica, Arial, sans-serif; color: #111; }
  .note { margin: 1rem; padding: 0.75rem 1rem; background: #f6f1ea; border-radius: 0.5rem; font-size: 0.95rem; max-width: 40rem; }
  .sheet { display: grid; grid-template-columns: repeat(${single ? 1 : 3}, 2.625in); grid-auto-rows: 1in; column-gap: 0.125in; }
  .label { display: flex; align-items: center; gap: 0.07in; padding: 0.05in 0.08in; overflow: hidden; break-inside: avoid; }
  .label svg { flex: none; width: 0.88in; height: 0.88in; }
  .text { min-width: 0; }
  .text p { margin: 0; white-space: nowrap; overflow: hidden; text-overflow: ellipsis; }
  .tag { font: 700 14pt/1.1 ui-monospace, 'DejaVu Sans Mono', Menlo, monospace; letter-spacing: 0.04em; }
  .who { font-size: 8.5pt; font-weight: 600; }
  .what { font-size: 7pt; }
  @media screen { .sheet { margin: 1rem; } .label { outline: 1px dashed #b9aea3; } }
  @media print { .note { display: none; } }
</style>
</head>
<body>
<p class="note">${
    rows.length
      ? `${rows.length} ${rows.length === 1 ? 'label' : 'labels'}. Print this page from the browser (${single ? 'one 2⅝ × 1 in label' : '2⅝ × 1 in labels, 30 to a US Letter sheet, at 100 % scale'}). Keep each label with its piece (on its board, bag or slip) until loading: paper does not go in the kiln. At unloading the load plan shows where each tag stood.`
      : 'No piece of this firing is tagged yet: pieces get their tags at drop-off.'
  }</p>
<main class="sheet">
${labels.join('\n')}
</main>
</body>
</html>`
}
