import connectPgSimple from 'connect-pg-simple'
import { csrfSync } from 'csrf-sync'
import express, { type Express } from 'express'
import session from 'express-session'
import helmet from 'helmet'
import { existsSync } from 'node:fs'
import path from 'node:path'
import type { PassportStatic } from 'passport'
import { createPassport } from './auth/passport'
import type { AppContext } from './context'
import { compressApi, revalidateApiReads } from './http/api-responses'
import { clientFiles } from './http/client-files'
import { errorHandler, notFoundApi } from './http/errors'
import { poolOf } from './jobs/worker'
import { adminRouter } from './routes/admin'
import { authRouter } from './routes/auth'
import { firingsRouter } from './routes/firings'
import { healthRouter } from './routes/health'
import { invitesRouter } from './routes/invites'
import { kilnsRouter } from './routes/kilns'
import { metaRouter } from './routes/meta'
import { photosRouter } from './routes/photos'
import { firingLogsRouter } from './routes/firing-logs'
import { noticesRouter } from './routes/notices'
import { pickupRouter } from './routes/pickup'
import { piecesRouter } from './routes/pieces'
import { loadPlansRouter } from './routes/load-plans'
import { placesRouter } from './routes/places'
import { ratingsRouter } from './routes/ratings'
import { requestsRouter } from './routes/requests'
import { searchRouter } from './routes/search'
import { studiosRouter } from './routes/studios'
import { webhooksRouter } from './routes/webhooks'
import { wareChecksRouter } from './routes/ware-checks'

const SESSION_COOKIE = 'cw.sid'

export interface App {
  app: Express
  /** Stops timers the app owns (the session pruner); the data source is the caller's. */
  close(): void
}

/** Builds the Express app: API under /api, the built client everywhere else. Holds no state. */
export function createApp(ctx: AppContext): App {
  const { config } = ctx
  const app = express()
  app.disable('x-powered-by')
  app.set('trust proxy', process.env.TRUST_PROXY ?? 'loopback')

  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'default-src': ["'self'"],
          'img-src': ["'self'", 'data:', 'blob:', ...(config.tileUrl ? [new URL(config.tileUrl.replace(/[{}]/g, '')).origin] : [])],
          // Leaflet positions its panes with inline styles.
          'style-src': ["'self'", "'unsafe-inline'"],
          'script-src': ["'self'"],
          'connect-src': ["'self'"],
          'form-action': ["'self'"],
          'upgrade-insecure-requests': config.secureCookies ? [] : null,
        },
      },
      crossOriginEmbedderPolicy: false,
    }),
  )

  app.use('/api', compressApi(), revalidateApiReads())
  app.use('/api', healthRouter(ctx))
  app.use('/api', metaRouter(ctx))

  app.use('/api', webhooksRouter(ctx))
  // Public reads that need no session: answered before the session, passport and CSRF layers.
  app.use('/api', searchRouter(ctx))

  app.use('/api', express.json({ limit: '1mb' }))

  const PgStore = connectPgSimple(session)
  const store = new PgStore({ pool: poolOf(ctx), tableName: 'session', createTableIfMissing: false })
  app.use(
    '/api',
    session({
      name: SESSION_COOKIE,
      secret: config.sessionSecret,
      store,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: {
        httpOnly: true,
        sameSite: 'lax',
        secure: config.secureCookies,
        maxAge: 30 * 24 * 3600_000,
        path: '/',
      },
    }),
  )

  const passport = createPassport(ctx) as unknown as PassportStatic
  app.use('/api', passport.initialize(), passport.session())

  const { csrfSynchronisedProtection, generateToken } = csrfSync({
    getTokenFromRequest: (req) => req.headers['x-csrf-token'] as string | undefined,
  })
  const csrfToken: express.RequestHandler = (req, res) => {
    res.json({ token: generateToken(req) })
  }
  // csrf-sync alone lets a request with no session and no token through (undefined equals undefined),
  // which would allow login CSRF; every change must carry a token.
  app.use('/api', (req, res, next) => {
    if (['GET', 'HEAD', 'OPTIONS'].includes(req.method)) return next()
    if (!req.get('x-csrf-token')) return next(Object.assign(new Error('missing csrf token'), { code: 'EBADCSRFTOKEN' }))
    csrfSynchronisedProtection(req, res, next)
  })

  app.use('/api/auth', authRouter(ctx, passport, csrfToken))
  app.use('/api', wareChecksRouter(ctx))

  app.use('/api', studiosRouter(ctx))
  app.use('/api', kilnsRouter(ctx))
  app.use('/api', firingsRouter(ctx))
  app.use('/api', invitesRouter(ctx))
  app.use('/api', placesRouter(ctx))
  app.use('/api', requestsRouter(ctx))
  app.use('/api', pickupRouter(ctx))
  app.use('/api', piecesRouter(ctx))
  app.use('/api', loadPlansRouter(ctx))
  app.use('/api', firingLogsRouter(ctx))
  app.use('/api', noticesRouter(ctx))
  app.use('/api', photosRouter(ctx))
  app.use('/api', ratingsRouter(ctx))
  app.use('/api', adminRouter(ctx))

  app.use('/api', notFoundApi)

  if (config.serveClient && existsSync(path.join(config.clientDir, 'index.html'))) {
    app.use(clientFiles(config.clientDir, { sessionCookie: SESSION_COOKIE }))
  }

  app.use(errorHandler(ctx.log.error))

  return { app, close: () => store.close() }
}
