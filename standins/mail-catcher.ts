import { MailDev } from 'maildev'
import { mkdtempSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'

export interface MailCatcher {
  smtpUrl: string
  /** The web inbox; captured messages are at `${webUrl}/api/email`. */
  webUrl: string
  close(): Promise<void>
}

/** The local SMTP catcher (MailDev) on loopback; nothing it catches leaves the machine. */
export async function startMailCatcher(options: { smtpPort: number; webPort: number; mailDirectory?: string }): Promise<MailCatcher> {
  const ownDirectory = !options.mailDirectory
  const mailDirectory = options.mailDirectory ?? mkdtempSync(path.join(os.tmpdir(), 'conewright-mail-'))
  const maildev = new MailDev({
    smtp: options.smtpPort,
    web: options.webPort,
    ip: '127.0.0.1',
    webIp: '127.0.0.1',
    mailDirectory,
    silent: true,
  })
  await maildev.start()
  return {
    smtpUrl: `smtp://127.0.0.1:${options.smtpPort}`,
    webUrl: `http://127.0.0.1:${options.webPort}`,
    async close() {
      await maildev.stop()
      if (ownDirectory) rmSync(mailDirectory, { recursive: true, force: true })
    },
  }
}
