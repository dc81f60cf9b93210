import compression from 'compression'
import type { RequestHandler } from 'express'

/** JSON answers smaller than this go as they are: compressing them saves less than it costs. */
export const API_COMPRESSION_MIN_BYTES = 1024

/** Compresses API answers above the threshold (brotli or gzip, as the browser accepts). */
export const compressApi = (): RequestHandler => compression({ threshold: API_COMPRESSION_MIN_BYTES })

/**
 * API reads are stored by the browser but checked with the server every time (`no-cache`): Express
 * puts an ETag on each JSON answer, so a repeat of an unchanged studio page or firing list costs a
 * 304 with no body, while a changed one comes back whole. The browser turns a 304 into the stored
 * 200 before fetch sees it, so the client's queries always get the current answer. `private`
 * keeps shared caches away from answers that depend on the session. A route that knows better
 * (photos) sets its own.
 */
export const revalidateApiReads = (): RequestHandler => (req, res, next) => {
  if (req.method === 'GET' || req.method === 'HEAD') res.setHeader('Cache-Control', 'private, no-cache')
  next()
}
