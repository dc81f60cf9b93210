// The frame of the stand-in's hosted test pages (payment, onboarding): plain server-rendered HTML,
// clearly marked as a local test page, with no script and nothing fetched from elsewhere.

export function escapeHtml(text: string): string {
  return text.replaceAll('&', '&amp;').replaceAll('<', '&lt;').replaceAll('>', '&gt;').replaceAll('"', '&quot;').replaceAll("'", '&#39;')
}

const STYLE = `
  :root { --ink: #1f2428; --muted: #5b6470; --line: #d5d9de; --accent: #2f5d8a; --warn-bg: #fff4d6;
    --warn-line: #e0b84c; --error-bg: #fdecec; --error-line: #c94a4a; --radius: 6px; }
  * { box-sizing: border-box; }
  body { margin: 0; font: 16px/1.45 system-ui, sans-serif; color: var(--ink); background: #f4f5f7; }
  .test-banner { background: var(--warn-bg); border-bottom: 2px solid var(--warn-line); padding: .6rem 1rem;
    text-align: center; font-weight: 600; }
  main { max-width: 28rem; margin: 1.5rem auto; padding: 0 1rem; }
  .panel { background: #fff; border: 1px solid var(--line); border-radius: var(--radius); padding: 1.25rem; }
  h1 { font-size: 1.25rem; margin: 0 0 .75rem; }
  .lines { list-style: none; margin: 0 0 .5rem; padding: 0; }
  .lines li { display: flex; justify-content: space-between; gap: 1rem; padding: .25rem 0; }
  .total { display: flex; justify-content: space-between; font-weight: 700; border-top: 1px solid var(--line);
    padding-top: .5rem; margin-bottom: 1rem; }
  label { display: block; font-size: .9rem; color: var(--muted); margin: .75rem 0 .25rem; }
  input, select { width: 100%; padding: .55rem .6rem; border: 1px solid var(--line); border-radius: var(--radius); font: inherit; }
  .check { display: flex; gap: .5rem; align-items: flex-start; margin-top: 1rem; color: var(--ink); }
  .check input { width: auto; margin-top: .3rem; }
  .done { background: #e9f5ee; border: 1px solid #7fb895; border-radius: var(--radius); padding: .6rem .75rem; margin-bottom: 1rem; }
  .row { display: flex; gap: .75rem; } .row > div { flex: 1; }
  button { width: 100%; margin-top: 1.25rem; padding: .7rem; border: 0; border-radius: var(--radius);
    background: var(--accent); color: #fff; font: inherit; font-weight: 600; cursor: pointer; }
  .error { background: var(--error-bg); border: 1px solid var(--error-line); border-radius: var(--radius);
    padding: .6rem .75rem; margin-bottom: 1rem; }
  .cancel { display: inline-block; margin-top: 1rem; color: var(--accent); }
  details { margin-top: 1rem; font-size: .9rem; color: var(--muted); }
  code { font-size: .9em; }
`

export function testPage(title: string, banner: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex">
<title>${escapeHtml(title)} · Local test page</title>
<style>${STYLE}</style>
</head>
<body>
<div class="test-banner" role="note">${escapeHtml(banner)}</div>
<main>${body}</main>
</body>
</html>`
}
