// The local stand-ins `npm start` runs beside the app for each outside service that is not
// configured. A process of its own, so restarting the app in development keeps caught mail and the
// stand-ins' state. It prints one line, STANDINS {json}, with the environment that points the app at them.
import { startSearchEngine } from './search-engine/server'
import { startMailCatcher } from './mail-catcher'
import { startStripeStandIn } from './stripe/standin'

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

if (!process.env.STRIPE_API_BASE) {
  const secretKey = process.env.STRIPE_SECRET_KEY ?? 'sk_test_conewright_local'
  const webhookSecret = process.env.STRIPE_WEBHOOK_SECRET ?? 'whsec_conewright_local'
  const connectWebhookSecret = process.env.STRIPE_CONNECT_WEBHOOK_SECRET ?? 'whsec_conewright_local_connect'
  const stripe = await startStripeStandIn({
    port: int(process.env.STRIPE_PORT, 4612),
    secretKey,
    webhookSecret,
    connectWebhookSecret,
    // The app's webhook endpoints, as a Stripe account's endpoint settings would name them.
    webhookUrl: process.env.APP_WEBHOOK_URL,
    connectWebhookUrl: process.env.APP_CONNECT_WEBHOOK_URL,
    stateFile: process.env.STRIPE_STATE_FILE,
  })
  Object.assign(env, {
    STRIPE_API_BASE: stripe.url,
    STRIPE_SECRET_KEY: secretKey,
    STRIPE_WEBHOOK_SECRET: webhookSecret,
    STRIPE_CONNECT_WEBHOOK_SECRET: connectWebhookSecret,
  })
  closers.push(() => stripe.close())
}

process.stdout.write(`STANDINS ${JSON.stringify(env)}\n`)

const stop = async () => {
  await Promise.allSettled(closers.map((close) => close()))
  process.exit(0)
}
process.on('SIGTERM', stop)
process.on('SIGINT', stop)
