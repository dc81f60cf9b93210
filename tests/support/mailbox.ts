/** Reads what the local catcher (MailDev) has caught, through its REST API. */
export interface CaughtMail {
  id: string
  subject: string
  text: string
  html: string
  to: { address: string }[]
  time: string
}

export async function listMail(inboxUrl: string): Promise<CaughtMail[]> {
  const res = await fetch(`${inboxUrl}/api/email`)
  return (await res.json()) as CaughtMail[]
}

/** Waits for a mail to an address (and with a subject containing `subject`), newest first. */
export async function waitForMail(
  inboxUrl: string,
  match: { to: string; subject?: string | RegExp; after?: Date },
  timeoutMs = 60_000,
): Promise<CaughtMail> {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    const found = (await listMail(inboxUrl))
      .filter((m) => m.to.some((t) => t.address.toLowerCase() === match.to.toLowerCase()))
      .filter(
        (m) => !match.subject || (typeof match.subject === 'string' ? m.subject.includes(match.subject) : match.subject.test(m.subject)),
      )
      .filter((m) => !match.after || new Date(m.time).getTime() >= match.after.getTime() - 1000)
      .sort((a, b) => new Date(b.time).getTime() - new Date(a.time).getTime())
    if (found.length) return found[0]
    await new Promise((r) => setTimeout(r, 200))
  }
  throw new Error(`no mail to ${match.to}${match.subject ? ` about "${match.subject}"` : ''} within ${timeoutMs} ms`)
}

/** The first link in a mail's text part that goes to `path` on our site. */
export function linkIn(mail: CaughtMail, path: string): string {
  const match = mail.text.match(new RegExp(`https?://[^\\s]+${path.replace(/[/?]/g, '\\$&')}[^\\s]*`))
  if (!match) throw new Error(`no ${path} link in mail "${mail.subject}":\n${mail.text}`)
  return match[0]
}
