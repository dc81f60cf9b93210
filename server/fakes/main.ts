// The local stand-ins `npm start` runs beside the app for each outside service that is not
// configured. A process of its own, so restarting the app in development keeps caught mail and the
// stand-ins' state. It prints one line, STANDINS {json}, with the environment that points the app at them.
import { startSearchEngine } from '../../search/engine/server'
import { startMailCatcher } from './mail-catcher'

const int = (value: string | undefined, fallback: number) => (value ? Number(value) : fallback)
const env: Record<string, string> = {}
const closers: (() => Promise<void>)[] = []

if (!process.env.SMTP_URL) {
  const mail = await startMailCatcher({
    smtpPort: int(process.env.MAIL_SMTP_PORT, 4625),
    webPort: int(process.env.MAIL_WEB_PORT, 4626),
    mailDirectory: process.env.MAIL_DIRECTORY,
  })
  Object.assign(env, { SMTP_URL: mail.smtpUrl, MAIL_INBOX_URL: mail.webUrl })
  closers.push(() => mail.close())
}

if (!process.env.MEILI_HOST) {
  const masterKey = process.env.MEILI_API_KEY ?? 'conewright-local-search-key'
  const search = await startSearchEngine({ port: int(process.env.SEARCH_PORT, 4617), masterKey })
  Object.assign(env, { MEILI_HOST: search.url, MEILI_API_KEY: masterKey })
  closers.push(() => search.close())
}

process.stdout.write(`STANDINS ${JSON.stringify(env)}\n`)

const stop = async () => {
  await Promise.allSettled(closers.map((close) => close()))
  process.exit(0)
}
process.on('SIGTERM', stop)
process.on('SIGINT', stop)
