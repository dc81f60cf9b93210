// The local stand-ins `npm start` runs beside the app when no real service is configured. A process
// of its own, so restarting the app in development keeps the caught mail.
import { startMailCatcher } from './mail-catcher'

const int = (value: string | undefined, fallback: number) => (value ? Number(value) : fallback)

const mail = await startMailCatcher({
  smtpPort: int(process.env.MAIL_SMTP_PORT, 4625),
  webPort: int(process.env.MAIL_WEB_PORT, 4626),
  mailDirectory: process.env.MAIL_DIRECTORY,
})

const env: Record<string, string> = {
  SMTP_URL: mail.smtpUrl,
  MAIL_INBOX_URL: mail.webUrl,
}

// The start script reads this one line to learn where each stand-in listens.
process.stdout.write(`STANDINS ${JSON.stringify(env)}\n`)

const stop = async () => {
  await mail.close()
  process.exit(0)
}
process.on('SIGTERM', stop)
process.on('SIGINT', stop)
