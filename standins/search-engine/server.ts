// Local stand-in for the Meilisearch server, speaking the part of its HTTP API that Conewright
// uses so the app can reach it through the official `meilisearch` SDK unchanged. State lives in
// memory only: the app rebuilds the index from PostgreSQL on start, so nothing needs persisting.
// Point MEILI_HOST at a real engine and this file is simply not started.
//
// Covered: health, version, stats, indexes, settings (whole and per setting), documents (add,
// update, fetch, delete one/batch/by filter/all), tasks, and search with the full filter
// language, geo filters and sorts, facets and both pagination modes. Not covered, because the app
// does not use them: multi-search, facet search, API keys other than the master key, highlighting
// and cropping, ranking scores, phrase search, synonyms, CSV payloads and vector search.

import { timingSafeEqual } from 'node:crypto'
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http'
import type { AddressInfo } from 'node:net'

import { EngineError, engineErrors } from './errors'
import { EngineState, handleRequest, type EngineResponse } from './routes'

export interface SearchEngineOptions {
  /** Interface to listen on; loopback by default. */
  host?: string
  /** 0 picks a free port. */
  port?: number
  /** When set, every route but /health needs `Authorization: Bearer <masterKey>`. */
  masterKey?: string
  /**
   * The indexes and tasks of an engine stopped earlier: a restart that keeps its data, as a real
   * engine's does. A fresh, empty state when left out.
   */
  state?: EngineState
}

export interface RunningSearchEngine {
  url: string
  port: number
  state: EngineState
  close(): Promise<void>
}

const MAX_PAYLOAD_BYTES = 100 * 1024 * 1024

function sameKey(given: string, expected: string): boolean {
  const a = Buffer.from(given)
  const b = Buffer.from(expected)
  return a.length === b.length && timingSafeEqual(a, b)
}

/** Bearer-key check with the engine's two failures: no usable header (401) and a wrong key (403). */
function authorize(request: IncomingMessage, masterKey: string | undefined, path: string): void {
  if (!masterKey || path === '/health') return
  const header = request.headers.authorization
  const match = header ? /^Bearer\s+(.+)$/.exec(header.trim()) : null
  if (!match) throw engineErrors.missingAuthorizationHeader()
  if (!sameKey(match[1].trim(), masterKey)) throw engineErrors.invalidApiKey()
}

function readBody(request: IncomingMessage): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    let size = 0
    request.on('data', (chunk: Buffer) => {
      size += chunk.length
      if (size > MAX_PAYLOAD_BYTES) {
        reject(
          new EngineError(
            413,
            'payload_too_large',
            `The provided payload reached the size limit. The maximum accepted payload size is ${MAX_PAYLOAD_BYTES / 1024 / 1024} MiB.`,
          ),
        )
        request.destroy()
        return
      }
      chunks.push(chunk)
    })
    request.on('end', () => resolve(Buffer.concat(chunks)))
    request.on('error', reject)
  })
}

function send(response: ServerResponse, result: EngineResponse): void {
  if (result.body === undefined) {
    response.writeHead(result.status, { 'content-length': '0' })
    response.end()
    return
  }
  const payload = JSON.stringify(result.body)
  response.writeHead(result.status, { 'content-type': 'application/json', 'content-length': Buffer.byteLength(payload) })
  response.end(payload)
}

export async function startSearchEngine(options: SearchEngineOptions = {}): Promise<RunningSearchEngine> {
  const host = options.host ?? '127.0.0.1'
  const state = options.state ?? new EngineState()
  if (options.state) state.tasks.reopen()

  const server = createServer((request, response) => {
    const url = new URL(request.url ?? '/', 'http://engine.local')
    const respond = async (): Promise<EngineResponse> => {
      authorize(request, options.masterKey, url.pathname)
      const rawBody = await readBody(request)
      return handleRequest(state, {
        method: request.method ?? 'GET',
        path: url.pathname,
        query: url.searchParams,
        contentType: request.headers['content-type'] ?? null,
        rawBody,
      })
    }
    respond()
      .then((result) => send(response, result))
      .catch((error: unknown) => {
        const failure = error instanceof EngineError ? error : new EngineError(500, 'internal', String(error), 'internal')
        send(response, { status: failure.status, body: failure.toBody() })
      })
  })

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(options.port ?? 0, host, () => {
      server.off('error', reject)
      resolve()
    })
  })
  const { port } = server.address() as AddressInfo
  const urlHost = host.includes(':') ? `[${host}]` : host

  return {
    url: `http://${urlHost}:${port}`,
    port,
    state,
    close: () =>
      new Promise<void>((resolve, reject) => {
        state.tasks.close()
        server.close((error) => (error ? reject(error) : resolve()))
        server.closeAllConnections()
      }),
  }
}
