import path from 'node:path'
import { fileURLToPath } from 'node:url'

export const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..')

/** Everything the server reads from its environment, in one place, with the local defaults. */
export interface Config {
  port: number
  host: string
  /** The address people open; links in mail point here. */
  publicUrl: string
  databaseUrl: string
  sessionSecret: string
  /** Secure cookies: on when the public address is https. */
  secureCookies: boolean
  smtpUrl: string
  mailFrom: string
  /** The local catcher's web inbox, linked from the page footer in development. */
  mailInboxUrl: string | null
  stripeSecretKey: string
  stripeApiBase: string | null
  stripeWebhookSecret: string
  /** The signing secret of the Connect endpoint (events about studios' connected accounts). */
  stripeConnectWebhookSecret: string
  /** The marketplace's fee on what potters pay online: a percentage with a minimum per request. */
  marketplaceFee: { percent: number; minimumCents: number }
  /** Hours after collection before a studio's share is transferred (0: at collection). */
  payoutHoldHours: number
  meiliHost: string
  meiliApiKey: string
  tileUrl: string | null
  storageDir: string
  clientDir: string
  serveClient: boolean
  dev: boolean
  rateLimits: { authPerIpPer15Min: number; authPerAccountPer15Min: number; openApiPerIpPerMin: number }
  workerConcurrency: number
  runWorker: boolean
}

function int(value: string | undefined, fallback: number): number {
  const n = value === undefined || value === '' ? NaN : Number(value)
  return Number.isInteger(n) ? n : fallback
}

/** A percentage with up to two decimals, from 0 to 100. */
function percent(value: string | undefined, fallback: number): number {
  const n = value === undefined || value === '' ? NaN : Number(value)
  return Number.isFinite(n) && n >= 0 && n <= 100 && Math.round(n * 100) === n * 100 ? n : fallback
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env, overrides: Partial<Config> = {}): Config {
  const port = int(env.PORT, 4610)
  const host = env.HOST ?? '127.0.0.1'
  const publicUrl = (env.PUBLIC_URL ?? `http://${host}:${port}`).replace(/\/$/, '')
  if (!env.DATABASE_URL && !overrides.databaseUrl) {
    throw new Error('DATABASE_URL is not set (npm start sets it for the local cluster)')
  }
  const config: Config = {
    port,
    host,
    publicUrl,
    databaseUrl: env.DATABASE_URL ?? '',
    sessionSecret: env.SESSION_SECRET ?? 'conewright-local-session-secret',
    secureCookies: publicUrl.startsWith('https:'),
    smtpUrl: env.SMTP_URL ?? 'smtp://127.0.0.1:4625',
    mailFrom: env.MAIL_FROM ?? 'Conewright <studio-mail@conewright.test>',
    mailInboxUrl: env.MAIL_INBOX_URL ?? null,
    stripeSecretKey: env.STRIPE_SECRET_KEY ?? 'sk_test_conewright_local',
    stripeApiBase: env.STRIPE_API_BASE ?? null,
    stripeWebhookSecret: env.STRIPE_WEBHOOK_SECRET ?? 'whsec_conewright_local',
    stripeConnectWebhookSecret: env.STRIPE_CONNECT_WEBHOOK_SECRET ?? 'whsec_conewright_local_connect',
    marketplaceFee: {
      percent: percent(env.MARKETPLACE_FEE_PERCENT, 10),
      minimumCents: Math.max(0, int(env.MARKETPLACE_FEE_MINIMUM_CENTS, 100)),
    },
    payoutHoldHours: Math.max(0, int(env.PAYOUT_HOLD_HOURS, 0)),
    meiliHost: env.MEILI_HOST ?? 'http://127.0.0.1:4617',
    meiliApiKey: env.MEILI_API_KEY ?? 'conewright-local-search-key',
    tileUrl: env.TILE_URL ?? null,
    storageDir: env.STORAGE_DIR ?? path.join(repoRoot, 'var', 'storage'),
    clientDir: env.CLIENT_DIR ?? path.join(repoRoot, 'dist', 'client'),
    serveClient: env.SERVE_CLIENT !== 'false',
    dev: env.NODE_ENV === 'development',
    rateLimits: {
      authPerIpPer15Min: int(env.RATE_LIMIT_AUTH_PER_IP, 100),
      authPerAccountPer15Min: int(env.RATE_LIMIT_AUTH_PER_ACCOUNT, 10),
      openApiPerIpPerMin: int(env.RATE_LIMIT_OPEN_API_PER_IP, 300),
    },
    workerConcurrency: int(env.WORKER_CONCURRENCY, 4),
    runWorker: env.RUN_WORKER !== 'false',
    ...overrides,
  }
  return config
}
