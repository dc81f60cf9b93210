import type { Request, RequestHandler, Response } from 'express'
import { existsSync, readFileSync } from 'node:fs'
import { stat } from 'node:fs/promises'
import path from 'node:path'

// The built client (dist/client), served the way a phone on a slow line needs it: the brotli or
// gzip copy the build wrote beside each text file, hashed files cached for a year, index.html
// asked again every time, and source maps never.

/** Vite names every file under /assets/ by its content, so a changed file is a new URL. */
export const IMMUTABLE = 'public, max-age=31536000, immutable'
/** index.html names the current hashed files: the browser keeps it but asks again on every visit. */
export const REVALIDATE = 'no-cache'
/** The few files with fixed names (favicon.svg). */
const FIXED_NAME = 'public, max-age=3600'

/** The encodings the build writes, in the order we prefer them, with the suffix of their file. */
const ENCODINGS = [
  { name: 'br', suffix: '.br' },
  { name: 'gzip', suffix: '.gz' },
] as const

const NEVER_SERVED = /\.(map|br|gz)$/

/**
 * Whether an Accept-Encoding header takes an encoding (RFC 9110 §12.5.3: named or `*`, with a
 * q-value above zero). Our own order of preference decides among those taken, since every browser
 * lists them in its own order with the same q.
 */
export function accepts(header: string | undefined, encoding: string): boolean {
  let wildcard: boolean | null = null
  for (const part of (header ?? '').split(',')) {
    const [raw, ...params] = part.toLowerCase().split(';')
    const name = raw.trim()
    const q = params.map((p) => /^\s*q=([\d.]+)\s*$/.exec(p)).find(Boolean)
    const taken = !q || Number(q[1]) > 0
    if (name === encoding) return taken
    if (name === '*') wildcard = taken
  }
  return wildcard ?? false
}

async function isFile(file: string): Promise<boolean> {
  return stat(file).then(
    (s) => s.isFile(),
    () => false,
  )
}

/** The relative path of a request inside the client folder, or null when it leaves the folder. */
function relativeFile(clientDir: string, urlPath: string): string | null {
  let decoded: string
  try {
    decoded = decodeURIComponent(urlPath)
  } catch {
    return null
  }
  if (decoded.includes('\0')) return null
  const relative = path.posix.normalize(decoded).replace(/^\/+/, '')
  const root = path.resolve(clientDir)
  const full = path.resolve(root, relative)
  return full === root || full.startsWith(root + path.sep) ? relative : null
}

/** Sends one file of the client, as the best precompressed copy the browser accepts. */
async function sendClientFile(req: Request, res: Response, clientDir: string, relative: string, cacheControl: string) {
  // The type of the file itself, not of its compressed copy; sendFile keeps a type already set.
  res.type(path.extname(relative))
  const headers: Record<string, string> = { 'Cache-Control': cacheControl }
  let file = relative
  const variants = await Promise.all(ENCODINGS.map(async (e) => ((await isFile(path.join(clientDir, relative + e.suffix))) ? e : null)))
  const available = variants.filter((e) => e !== null)
  if (available.length > 0) {
    // Caches must keep one copy per encoding, whichever this answer is.
    res.vary('Accept-Encoding')
    const encoding = available.find((e) => accepts(req.headers['accept-encoding'], e.name))
    if (encoding) {
      file = relative + encoding.suffix
      headers['Content-Encoding'] = encoding.name
    }
  }
  await new Promise<void>((resolve, reject) =>
    res.sendFile(file, { root: clientDir, headers, dotfiles: 'deny', cacheControl: false }, (error) => (error ? reject(error) : resolve())),
  )
}

/** Which pages have their first screen drawn into their own HTML (written by build/prerender.ts). */
type PrerenderManifest = Record<string, { file: string; visitorsOnly: boolean }>

function readPrerendered(clientDir: string): PrerenderManifest {
  const file = path.join(clientDir, 'prerendered.json')
  return existsSync(file) ? (JSON.parse(readFileSync(file, 'utf8')) as PrerenderManifest) : {}
}

/**
 * Serves the built client: its files, and for every other path the page's HTML: index.html, or the
 * prerendered copy of a page that has one (for a page meant for visitors, only to requests without
 * a session cookie). The client routes itself from there. Requests under /assets/ for files that
 * do not exist get a plain 404, not the page.
 */
export function clientFiles(clientDir: string, { sessionCookie }: { sessionCookie: string }): RequestHandler {
  const prerendered = readPrerendered(clientDir)
  const hasSession = (req: Request) => (req.headers.cookie ?? '').split(/;\s*/).some((c) => c.startsWith(`${sessionCookie}=`))
  return async (req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return next()
    try {
      const relative = relativeFile(clientDir, req.path)
      if (relative === null || NEVER_SERVED.test(relative)) return void res.status(404).type('text/plain').send('Not found')
      if (relative !== '' && relative !== 'index.html' && (await isFile(path.join(clientDir, relative)))) {
        return await sendClientFile(req, res, clientDir, relative, relative.startsWith('assets/') ? IMMUTABLE : FIXED_NAME)
      }
      if (relative.startsWith('assets/')) return void res.status(404).type('text/plain').send('Not found')
      const page = prerendered[req.path]
      if (page?.visitorsOnly) res.vary('Cookie')
      const html = page && !(page.visitorsOnly && hasSession(req)) ? page.file : 'index.html'
      await sendClientFile(req, res, clientDir, html, REVALIDATE)
    } catch (error) {
      // A client that went away mid-file is no error of ours.
      if ((error as NodeJS.ErrnoException).code === 'ECONNABORTED' || res.headersSent) return
      next(error)
    }
  }
}
