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
  /** One self-hosted PMTiles vector basemap: a path on this server or an absolute https URL. */
  basemapPmtilesUrl: string | null
  storageDir: string
  clientDir: string
  serveClient: boolean
  dev: boolean
  rateLimits: {
    /** Sign-in, registration and reset attempts from one address (IP). */
    authPerIpPer15Min: number
    /** Wrong passwords for one account from one address before that pair is paused. */
    authPerAccountPer15Min: number
    /** Wrong passwords for one account from all addresses together before password sign-in is paused for it. */
    authAccountWidePer15Min: number
    openApiPerIpPerMin: number
  }
  workerConcurrency: number
  runWorker: boolean
  /** How often each process looks at the search engine, to notice it leave and come back. */
  searchProbeMs: number
}

/**
 * The values used when a secret is not set. They are written here, so anyone can read them: fine on
 * a developer's loopback, never anywhere else.
 */
export const LOCAL_SECRETS = {
  sessionSecret: 'conewright-local-session-secret',
  stripeSecretKey: 'sk_test_conewright_local',
  stripeWebhookSecret: 'whsec_conewright_local',
  stripeConnectWebhookSecret: 'whsec_conewright_local_connect',
} as const

/** A path on this server (`/basemap/region.pmtiles`) or an absolute http(s) URL; anything else stops the start. */
function pmtilesUrl(value: string | undefined): string | null {
  if (!value) return null
  if (/^\/(?!\/)/.test(value)) return value
  if (/^https?:\/\/[^/]/i.test(value) && URL.canParse(value)) return value
  throw new Error(
    `BASEMAP_PMTILES_URL must be a path on this server (/basemap/region.pmtiles) or an http(s) URL, not ${JSON.stringify(value)}`,
  )
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

/** Settings to put in place of what the environment says; rate limits may be given one by one. */
export type ConfigOverrides = Partial<Omit<Config, 'rateLimits'>> & { rateLimits?: Partial<Config['rateLimits']> }

export function loadConfig(env: NodeJS.ProcessEnv = process.env, overrides: ConfigOverrides = {}): Config {
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
    sessionSecret: env.SESSION_SECRET || LOCAL_SECRETS.sessionSecret,
    secureCookies: publicUrl.startsWith('https:'),
    smtpUrl: env.SMTP_URL ?? 'smtp://127.0.0.1:4625',
    mailFrom: env.MAIL_FROM ?? 'Conewright <studio-mail@conewright.test>',
    mailInboxUrl: env.MAIL_INBOX_URL ?? null,
    stripeSecretKey: env.STRIPE_SECRET_KEY || LOCAL_SECRETS.stripeSecretKey,
    stripeApiBase: env.STRIPE_API_BASE ?? null,
    stripeWebhookSecret: env.STRIPE_WEBHOOK_SECRET || LOCAL_SECRETS.stripeWebhookSecret,
    stripeConnectWebhookSecret: env.STRIPE_CONNECT_WEBHOOK_SECRET || LOCAL_SECRETS.stripeConnectWebhookSecret,
    marketplaceFee: {
      percent: percent(env.MARKETPLACE_FEE_PERCENT, 10),
      minimumCents: Math.max(0, int(env.MARKETPLACE_FEE_MINIMUM_CENTS, 100)),
    },
    payoutHoldHours: Math.max(0, int(env.PAYOUT_HOLD_HOURS, 0)),
    meiliHost: env.MEILI_HOST ?? 'http://127.0.0.1:4617',
    meiliApiKey: env.MEILI_API_KEY ?? 'conewright-local-search-key',
    tileUrl: env.TILE_URL ?? null,
    basemapPmtilesUrl: pmtilesUrl(env.BASEMAP_PMTILES_URL),
    storageDir: env.STORAGE_DIR ?? path.join(repoRoot, 'var', 'storage'),
    clientDir: env.CLIENT_DIR ?? path.join(repoRoot, 'dist', 'client'),
    serveClient: env.SERVE_CLIENT !== 'false',
    dev: env.NODE_ENV === 'development',
    workerConcurrency: int(env.WORKER_CONCURRENCY, 4),
    runWorker: env.RUN_WORKER !== 'false',
    searchProbeMs: int(env.SEARCH_PROBE_MS, 10_000),
    ...overrides,
    rateLimits: {
      authPerIpPer15Min: int(env.RATE_LIMIT_AUTH_PER_IP, 100),
      authPerAccountPer15Min: int(env.RATE_LIMIT_AUTH_PER_ACCOUNT, 10),
      authAccountWidePer15Min: int(env.RATE_LIMIT_AUTH_ACCOUNT_WIDE, 50),
      openApiPerIpPerMin: int(env.RATE_LIMIT_OPEN_API_PER_IP, 300),
      ...overrides.rateLimits,
    },
  }
  return config
}

const LOOPBACK = new Set(['127.0.0.1', 'localhost', '[::1]', '::1'])
const isLiveKey = (key: string) => /^(sk|rk)_live_/.test(key)
const isTestKey = (key: string) => /^(sk|rk)_test_/.test(key)

/**
 * Local development: served on loopback only, not marked production, and no live Stripe key. Anything
 * else may be reached by people other than its developer.
 */
export function isLocalDevelopment(config: Pick<Config, 'publicUrl' | 'stripeSecretKey'>, env: NodeJS.ProcessEnv = process.env): boolean {
  const host = new URL(config.publicUrl).hostname
  return LOOPBACK.has(host) && env.NODE_ENV !== 'production' && !isLiveKey(config.stripeSecretKey)
}

/**
 * Why this configuration must not start, or [] when it may. Outside local development every secret
 * must be set and not be one of the values written in this file, and a Stripe test key is refused
 * where everything else looks live (unless STRIPE_TEST_MODE=true says it is a rehearsal site).
 */
export function secretProblems(config: Config, env: NodeJS.ProcessEnv = process.env): string[] {
  const problems: string[] = []
  if (isLiveKey(config.stripeSecretKey) && config.stripeApiBase)
    problems.push('STRIPE_API_BASE points the SDK away from Stripe while STRIPE_SECRET_KEY is a live key; unset one of them.')
  if (isLocalDevelopment(config, env)) return problems
  if (config.sessionSecret === LOCAL_SECRETS.sessionSecret) problems.push('SESSION_SECRET is not set: set it to a long random value.')
  else if (config.sessionSecret.length < 32) problems.push('SESSION_SECRET is too short: use at least 32 random characters.')
  if (config.stripeWebhookSecret === LOCAL_SECRETS.stripeWebhookSecret)
    problems.push('STRIPE_WEBHOOK_SECRET is not set: copy the signing secret of the webhook endpoint from the Stripe dashboard.')
  if (config.stripeConnectWebhookSecret === LOCAL_SECRETS.stripeConnectWebhookSecret)
    problems.push(
      'STRIPE_CONNECT_WEBHOOK_SECRET is not set: copy the signing secret of the Connect webhook endpoint from the Stripe dashboard.',
    )
  if (config.stripeSecretKey === LOCAL_SECRETS.stripeSecretKey) problems.push('STRIPE_SECRET_KEY is not set.')
  else if (isTestKey(config.stripeSecretKey) && env.STRIPE_TEST_MODE !== 'true')
    problems.push(
      'STRIPE_SECRET_KEY is a test key on a site that looks live (production, or a public address): no payment would be real. Set a live key, or STRIPE_TEST_MODE=true for a rehearsal site.',
    )
  return problems
}
