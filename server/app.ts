import connectPgSimple from 'connect-pg-simple'
import express, { type Express } from 'express'
import session from 'express-session'
import helmet from 'helmet'
import { existsSync } from 'node:fs'
import path from 'node:path'
import type { PassportStatic } from 'passport'
import { csrfTokens } from './auth/csrf'
import { createPassport } from './auth/passport'
import { outageLog, type AppContext } from './context'
import { compressApi, revalidateApiReads } from './http/api-responses'
import { clientFiles } from './http/client-files'
import { errorHandler, notFoundApi } from './http/errors'
import { monitorSearchEngine } from './services/search'
import { poolOf } from './jobs/worker'
import { adminRouter } from './routes/admin'
import { authRouter } from './routes/auth'
import { firingsRouter } from './routes/firings'
import { healthRouter } from './routes/health'
import { invitesRouter } from './routes/invites'
import { kilnsRouter } from './routes/kilns'
import { metaRouter } from './routes/meta'
import { photosRouter } from './routes/photos'
import { incidentsRouter } from './routes/incidents'
import { firingLogsRouter } from './routes/firing-logs'
import { noticesRouter } from './routes/notices'
import { payoutsRouter } from './routes/payouts'
import { pickupRouter } from './routes/pickup'
import { piecesRouter } from './routes/pieces'
import { loadPlansRouter } from './routes/load-plans'
import { placesRouter } from './routes/places'
import { reviewsRouter } from './routes/reviews'
import { requestsRouter } from './routes/requests'
import { searchRouter } from './routes/search'
import { studiosRouter } from './routes/studios'
import { webhooksRouter } from './routes/webhooks'
import { wareChecksRouter } from './routes/ware-checks'

const SESSION_COOKIE = 'cw.sid'

export interface App {
  app: Express
  /** Stops timers the app owns (the session pruner, the search monitor); the data source is the caller's. */
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
          // PMTiles is read with ranged fetches, so a basemap file on another host is a connection.
          'connect-src': [
            "'self'",
            ...(config.basemapPmtilesUrl && /^https?:/i.test(config.basemapPmtilesUrl) ? [new URL(config.basemapPmtilesUrl).origin] : []),
          ],
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
  // Expired rows are deleted when the app starts and about every ten minutes after.
  const store = new PgStore({ pool: poolOf(ctx), tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 600 })
  if (ctx.db.isInitialized) store.pruneSessions()
  app.use(
    '/api',
    session({
      name: SESSION_COOKIE,
      secret: config.sessionSecret,
      store,
      resave: false,
      // A row is written only once there is something to keep (a signed-in user); visitors get none.
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

  // Every change must carry a token; fetching one stores nothing (see auth/csrf.ts).
  const csrf = csrfTokens(config)
  app.use('/api', csrf.protect)

  app.use('/api/auth', authRouter(ctx, passport, csrf.issue))
  app.use('/api', wareChecksRouter(ctx))

  app.use('/api', studiosRouter(ctx))
  app.use('/api', payoutsRouter(ctx))
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
  app.use('/api', incidentsRouter(ctx))
  app.use('/api', reviewsRouter(ctx))
  app.use('/api', adminRouter(ctx))

  app.use('/api', notFoundApi)

  if (config.serveClient && existsSync(path.join(config.clientDir, 'index.html'))) {
    app.use(clientFiles(config.clientDir, { sessionCookie: SESSION_COOKIE }))
  }

  // One log line per database outage; the first connection that succeeds afterwards closes it.
  const database = outageLog(ctx.log, 'the database')
  poolOf(ctx)?.on('connect', () => database.recovered())
  app.use(errorHandler(ctx.log.error, { databaseDown: (error) => database.failed(error) }))

  const stopMonitor = monitorSearchEngine(ctx, config.searchProbeMs)
  return {
    app,
    close: () => {
      stopMonitor()
      void store.close()
    },
  }
}
