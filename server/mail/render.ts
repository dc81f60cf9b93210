/**
 * One description of a mail, rendered twice: a plain-text part and an HTML part with the same words.
 * Templates build a MailContent; nothing else writes mail bodies.
 */
export interface MailContent {
  subject: string
  greeting?: string
  paragraphs: string[]
  /** Label/value rows, e.g. what was checked in or what is owed. */
  details?: [string, string][]
  action?: { label: string; url: string }
  /** A last line in small print, e.g. why this mail was sent. */
  footnote?: string
}

export interface RenderedMail {
  subject: string
  text: string
  html: string
}

const escapeHtml = (value: string) =>
  value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!)

export function renderMail(content: MailContent): RenderedMail {
  const text: string[] = []
  if (content.greeting) text.push(content.greeting, '')
  for (const p of content.paragraphs) text.push(p, '')
  if (content.details?.length) {
    const width = Math.max(...content.details.map(([label]) => label.length))
    for (const [label, value] of content.details) text.push(`${label.padEnd(width)}  ${value}`)
    text.push('')
  }
  if (content.action) text.push(`${content.action.label}: ${content.action.url}`, '')
  text.push('— Conewright')
  if (content.footnote) text.push('', content.footnote)

  const html = [
    '<!doctype html><html><body style="margin:0;background:#f6f1ea;font-family:\'DM Sans\',Helvetica,Arial,sans-serif;color:#2b211c">',
    '<div style="max-width:560px;margin:0 auto;padding:24px">',
    '<div style="font-weight:700;font-size:18px;color:#b4532a;margin-bottom:16px">Conewright</div>',
    '<div style="background:#fffdf9;border:1px solid #e7dccd;border-radius:12px;padding:24px">',
    content.greeting ? `<p style="margin:0 0 12px">${escapeHtml(content.greeting)}</p>` : '',
    ...content.paragraphs.map((p) => `<p style="margin:0 0 12px;line-height:1.5">${escapeHtml(p)}</p>`),
    content.details?.length
      ? `<table style="border-collapse:collapse;margin:8px 0 16px">${content.details
          .map(
            ([label, value]) =>
              `<tr><td style="padding:4px 16px 4px 0;color:#7a6a5e">${escapeHtml(label)}</td><td style="padding:4px 0">${escapeHtml(value)}</td></tr>`,
          )
          .join('')}</table>`
      : '',
    content.action
      ? `<p style="margin:16px 0"><a href="${escapeHtml(content.action.url)}" style="display:inline-block;background:#b4532a;color:#fff;text-decoration:none;padding:10px 18px;border-radius:8px;font-weight:600">${escapeHtml(content.action.label)}</a></p><p style="font-size:12px;color:#7a6a5e;word-break:break-all">${escapeHtml(content.action.url)}</p>`
      : '',
    '</div>',
    content.footnote ? `<p style="font-size:12px;color:#7a6a5e">${escapeHtml(content.footnote)}</p>` : '',
    '</div></body></html>',
  ].join('')

  return { subject: content.subject, text: text.join('\n'), html }
}
