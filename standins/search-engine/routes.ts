// The part of the engine's HTTP API the app uses, one handler per route, each answering with the
// engine's status code and body. Request bodies arrive already read; `server.ts` does the HTTP.

import { applyDocumentBatch, type AdditionMethod } from './document-batch'
import { documentIdKey, projectDocument, type JsonObject } from './document-fields'
import { EngineIndex } from './engine-index'
import { engineErrors } from './errors'
import { checkFilterable, evaluateFilter } from './filter-evaluate'
import { FilterSyntaxError, parseFilter } from './filter-parser'
import { sortDocuments } from './ranking'
import { executeSearch, filterDocuments, readSearchBody, readSearchQuery } from './search'
import { applySettingsUpdate, defaultSettings, SETTING_ROUTES } from './settings'
import { TaskQueue, type EnqueuedTask } from './tasks'

export interface EngineRequest {
  method: string
  path: string
  query: URLSearchParams
  contentType: string | null
  rawBody: Buffer
}

export interface EngineResponse {
  status: number
  body?: unknown
}

/** In-memory state of one stand-in process. */
export class EngineState {
  readonly indexes = new Map<string, EngineIndex>()
  readonly tasks = new TaskQueue()
  readonly startedAt = new Date()
}

const INDEX_UID = /^[a-zA-Z0-9_-]+$/

function checkIndexUid(uid: string): string {
  if (!INDEX_UID.test(uid) || Buffer.byteLength(uid) > 400) throw engineErrors.invalidIndexUid(uid)
  return uid
}

function existingIndex(state: EngineState, uid: string): EngineIndex {
  const index = state.indexes.get(checkIndexUid(uid))
  if (!index) throw engineErrors.indexNotFound(uid)
  return index
}

/** The index a write task works on, created on the fly as document and settings tasks do. */
function indexForWrite(state: EngineState, uid: string, primaryKey: string | null): EngineIndex {
  let index = state.indexes.get(uid)
  if (!index) {
    index = new EngineIndex(uid, primaryKey)
    state.indexes.set(uid, index)
  }
  return index
}

function jsonBody(request: EngineRequest, required = true): unknown {
  const text = request.rawBody.toString('utf8')
  if (text.trim() === '') {
    if (required) throw engineErrors.missingPayload()
    return undefined
  }
  try {
    return JSON.parse(text)
  } catch (error) {
    throw engineErrors.malformedPayload((error as Error).message)
  }
}

function objectBody(request: EngineRequest): Record<string, unknown> {
  const body = jsonBody(request)
  if (body === null || typeof body !== 'object' || Array.isArray(body)) {
    throw engineErrors.badRequest(`Invalid value type: expected an object, but found ${JSON.stringify(body)}`)
  }
  return body as Record<string, unknown>
}

const accepted = (task: EnqueuedTask): EngineResponse => ({ status: 202, body: task })

function indexView(index: EngineIndex) {
  return {
    uid: index.uid,
    createdAt: index.createdAt.toISOString(),
    updatedAt: index.updatedAt.toISOString(),
    primaryKey: index.primaryKey,
  }
}

function pageOf(query: URLSearchParams, code: string): { offset: number; limit: number } {
  const read = (name: string, fallback: number) => {
    const text = query.get(name)
    if (text === null) return fallback
    if (!/^\d+$/.test(text)) {
      throw engineErrors.invalid(
        `${code}_${name}`,
        `Invalid value in parameter \`${name}\`: could not parse \`${text}\` as a positive integer`,
      )
    }
    return Number(text)
  }
  return { offset: read('offset', 0), limit: read('limit', 20) }
}

// indexes ------------------------------------------------------------------------------------------

function listIndexes(state: EngineState, request: EngineRequest): EngineResponse {
  const { offset, limit } = pageOf(request.query, 'invalid_index')
  const all = [...state.indexes.values()].sort((a, b) => (a.uid < b.uid ? -1 : 1))
  return { status: 200, body: { results: all.slice(offset, offset + limit).map(indexView), offset, limit, total: all.length } }
}

function createIndex(state: EngineState, request: EngineRequest): EngineResponse {
  const body = objectBody(request)
  if (body.uid === undefined) throw engineErrors.missingIndexUid()
  if (typeof body.uid !== 'string') throw engineErrors.invalidIndexUid(JSON.stringify(body.uid))
  const uid = checkIndexUid(body.uid)
  const primaryKey = typeof body.primaryKey === 'string' ? body.primaryKey : null
  return accepted(
    state.tasks.enqueue('indexCreation', uid, { primaryKey }, () => {
      if (state.indexes.has(uid)) throw engineErrors.indexAlreadyExists(uid)
      state.indexes.set(uid, new EngineIndex(uid, primaryKey))
    }),
  )
}

function updateIndex(state: EngineState, uid: string, request: EngineRequest): EngineResponse {
  checkIndexUid(uid)
  const body = objectBody(request)
  const primaryKey = typeof body.primaryKey === 'string' ? body.primaryKey : null
  return accepted(
    state.tasks.enqueue('indexUpdate', uid, { primaryKey }, () => {
      const index = existingIndex(state, uid)
      if (primaryKey !== null && index.primaryKey !== null && index.primaryKey !== primaryKey && index.documentCount > 0) {
        throw engineErrors.primaryKeyAlreadyExists(index.primaryKey)
      }
      if (primaryKey !== null) index.primaryKey = primaryKey
      index.updatedAt = new Date()
    }),
  )
}

function deleteIndex(state: EngineState, uid: string): EngineResponse {
  checkIndexUid(uid)
  return accepted(
    state.tasks.enqueue('indexDeletion', uid, { deletedDocuments: null }, () => {
      const index = existingIndex(state, uid)
      state.indexes.delete(uid)
      return { deletedDocuments: index.documentCount }
    }),
  )
}

function indexStats(state: EngineState, index: EngineIndex) {
  const fieldDistribution: Record<string, number> = {}
  for (const document of index.documents()) {
    for (const key of Object.keys(document.body)) fieldDistribution[key] = (fieldDistribution[key] ?? 0) + 1
  }
  return { numberOfDocuments: index.documentCount, isIndexing: state.tasks.isIndexing(index.uid), fieldDistribution }
}

// settings -----------------------------------------------------------------------------------------

function enqueueSettings(state: EngineState, uid: string, update: Record<string, unknown>): EngineResponse {
  checkIndexUid(uid)
  const current = state.indexes.get(uid)?.settings
  // Validate now so a bad body is a synchronous 400, as with the engine.
  applySettingsUpdate(current ?? defaultSettings(), update)
  return accepted(
    state.tasks.enqueue('settingsUpdate', uid, update, () => {
      const index = indexForWrite(state, uid, null)
      index.replaceSettings(applySettingsUpdate(index.settings, update))
      index.updatedAt = new Date()
    }),
  )
}

function settingsRoute(state: EngineState, uid: string, name: string | null, request: EngineRequest): EngineResponse {
  const key = name === null ? null : SETTING_ROUTES[name]
  if (name !== null && !key) return { status: 404 }
  switch (request.method) {
    case 'GET': {
      const settings = existingIndex(state, uid).settings
      return { status: 200, body: key ? settings[key] : settings }
    }
    case 'PATCH':
    case 'PUT': {
      if (key) return enqueueSettings(state, uid, { [key]: jsonBody(request) })
      if (request.method === 'PUT') return { status: 405 }
      return enqueueSettings(state, uid, objectBody(request))
    }
    case 'DELETE': {
      const names = key ? [key] : Object.values(SETTING_ROUTES)
      return enqueueSettings(state, uid, Object.fromEntries(names.map((setting) => [setting, null])))
    }
    default:
      return { status: 405 }
  }
}

// documents ----------------------------------------------------------------------------------------

function parseDocuments(request: EngineRequest): JsonObject[] {
  const contentType = (request.contentType ?? 'application/json').split(';')[0].trim().toLowerCase()
  const text = request.rawBody.toString('utf8')
  let parsed: unknown[]
  if (contentType === 'application/x-ndjson') {
    parsed = []
    for (const line of text.split('\n')) {
      if (line.trim() === '') continue
      try {
        parsed.push(JSON.parse(line))
      } catch (error) {
        throw engineErrors.malformedPayload((error as Error).message)
      }
    }
  } else if (contentType === 'application/json') {
    if (text.trim() === '') throw engineErrors.missingPayload()
    let body: unknown
    try {
      body = JSON.parse(text)
    } catch (error) {
      throw engineErrors.malformedPayload((error as Error).message)
    }
    parsed = Array.isArray(body) ? body : [body]
  } else {
    throw engineErrors.invalidContentType(contentType)
  }
  for (const document of parsed) {
    if (document === null || typeof document !== 'object' || Array.isArray(document)) {
      throw engineErrors.malformedPayload(`invalid type: ${JSON.stringify(document)}, expected a map`)
    }
  }
  return parsed as JsonObject[]
}

function addDocuments(state: EngineState, uid: string, request: EngineRequest, method: AdditionMethod): EngineResponse {
  checkIndexUid(uid)
  const documents = parseDocuments(request)
  const primaryKey = request.query.get('primaryKey')
  const customMetadata = request.query.get('customMetadata') ?? undefined
  return accepted(
    state.tasks.enqueue(
      'documentAdditionOrUpdate',
      uid,
      { receivedDocuments: documents.length, indexedDocuments: null },
      (task) => {
        task.details = { receivedDocuments: documents.length, indexedDocuments: 0 }
        const existed = state.indexes.has(uid)
        const index = indexForWrite(state, uid, null)
        try {
          const { indexed } = applyDocumentBatch(index, documents, method, primaryKey)
          return { receivedDocuments: documents.length, indexedDocuments: indexed }
        } catch (error) {
          if (!existed && index.documentCount === 0) state.indexes.delete(uid)
          throw error
        }
      },
      customMetadata,
    ),
  )
}

function deletionTask(
  state: EngineState,
  uid: string,
  providedIds: number,
  originalFilter: string | null,
  remove: (index: EngineIndex) => number,
  customMetadata?: string,
): EngineResponse {
  checkIndexUid(uid)
  return accepted(
    state.tasks.enqueue(
      'documentDeletion',
      uid,
      { providedIds, deletedDocuments: null, originalFilter },
      (task) => {
        task.details = { providedIds, deletedDocuments: 0, originalFilter }
        const index = existingIndex(state, uid)
        const deletedDocuments = remove(index)
        index.updatedAt = new Date()
        return { providedIds, deletedDocuments, originalFilter }
      },
      customMetadata,
    ),
  )
}

function deleteBatch(state: EngineState, uid: string, request: EngineRequest): EngineResponse {
  const body = jsonBody(request)
  if (!Array.isArray(body)) throw engineErrors.badRequest(`Invalid value type: expected an array, but found ${JSON.stringify(body)}`)
  const ids = body.map((id) => (typeof id === 'number' || typeof id === 'string' ? String(id) : JSON.stringify(id)))
  return deletionTask(
    state,
    uid,
    ids.length,
    null,
    (index) => ids.filter((id) => index.deleteDocument(id)).length,
    request.query.get('customMetadata') ?? undefined,
  )
}

function deleteByFilter(state: EngineState, uid: string, request: EngineRequest): EngineResponse {
  const body = objectBody(request)
  if (!('filter' in body)) throw engineErrors.invalid('missing_document_filter', 'Missing field `filter`')
  let node
  try {
    node = parseFilter(body.filter)
  } catch (error) {
    if (error instanceof FilterSyntaxError) throw engineErrors.invalid('invalid_document_filter', error.message)
    throw error
  }
  if (!node) throw engineErrors.invalid('invalid_document_filter', 'Sending an empty filter is forbidden.')
  const filterNode = node
  return deletionTask(state, uid, 0, JSON.stringify(body.filter), (index) => {
    const context = index.filterContext('invalid_document_filter')
    checkFilterable(context, filterNode)
    const doomed = [...evaluateFilter(context, filterNode)].map((id) => index.documentByInternalId(id)!.externalId)
    for (const id of doomed) index.deleteDocument(id)
    return doomed.length
  })
}

function browseDocuments(
  index: EngineIndex,
  options: {
    offset: number
    limit: number
    fields: string[] | null
    filter: unknown
    ids: string[] | null
    sort: string[] | null
  },
): EngineResponse {
  const filtered = filterDocuments(index, options.filter, 'invalid_document_filter')
  let documents = [...index.documents()]
  if (filtered) documents = documents.filter((document) => filtered.has(document.internalId))
  if (options.ids) {
    const wanted = new Set(options.ids.map(String))
    documents = documents.filter((document) => wanted.has(document.externalId))
  }
  if (options.sort && options.sort.length > 0) documents = sortDocuments(index, documents, options.sort, 'invalid_document_sort')
  const results = documents
    .slice(options.offset, options.offset + options.limit)
    .map((document) => projectDocument(document.body, options.fields))
  return { status: 200, body: { results, offset: options.offset, limit: options.limit, total: documents.length } }
}

function getDocuments(state: EngineState, uid: string, request: EngineRequest): EngineResponse {
  const index = existingIndex(state, uid)
  const { offset, limit } = pageOf(request.query, 'invalid_document')
  const list = (name: string) =>
    request.query
      .get(name)
      ?.split(',')
      .map((part) => part.trim())
      .filter(Boolean) ?? null
  return browseDocuments(index, {
    offset,
    limit,
    fields: list('fields'),
    filter: request.query.get('filter'),
    ids: list('ids'),
    sort: list('sort'),
  })
}

function fetchDocuments(state: EngineState, uid: string, request: EngineRequest): EngineResponse {
  const index = existingIndex(state, uid)
  const body = objectBody(request)
  const number = (name: string, fallback: number) => {
    const value = body[name]
    if (value === undefined || value === null) return fallback
    if (typeof value !== 'number' || !Number.isInteger(value) || value < 0) {
      throw engineErrors.invalid(
        `invalid_document_${name}`,
        `Invalid value type at \`.${name}\`: expected a positive integer, but found ${JSON.stringify(value)}`,
      )
    }
    return value
  }
  const strings = (name: string) => (Array.isArray(body[name]) ? (body[name] as unknown[]).map(String) : null)
  return browseDocuments(index, {
    offset: number('offset', 0),
    limit: number('limit', 20),
    fields: strings('fields'),
    filter: body.filter ?? null,
    ids: strings('ids'),
    sort: strings('sort'),
  })
}

function getDocument(state: EngineState, uid: string, id: string, request: EngineRequest): EngineResponse {
  const index = existingIndex(state, uid)
  const document = index.documentByExternalId(documentIdKey(id) ?? id)
  if (!document) throw engineErrors.documentNotFound(id)
  const fields =
    request.query
      .get('fields')
      ?.split(',')
      .map((part) => part.trim())
      .filter(Boolean) ?? null
  return { status: 200, body: projectDocument(document.body, fields) }
}

// dispatch -----------------------------------------------------------------------------------------

function segmentsOf(path: string): string[] {
  return path
    .split('/')
    .filter(Boolean)
    .map((segment) => decodeURIComponent(segment))
}

/** Routes one request; a path the engine does not have is a bare 404, a wrong method a bare 405. */
export function handleRequest(state: EngineState, request: EngineRequest): EngineResponse {
  const segments = segmentsOf(request.path)
  const method = request.method
  const [root, uid, resource, sub, extra] = segments

  if (root === 'health' && segments.length === 1) return method === 'GET' ? { status: 200, body: { status: 'available' } } : { status: 405 }
  if (root === 'version' && segments.length === 1) {
    // The stand-in names itself in commitSha; pkgVersion is the engine line whose API it follows.
    return {
      status: 200,
      body: { commitSha: 'conewright-local-stand-in', commitDate: state.startedAt.toISOString(), pkgVersion: '1.16.0' },
    }
  }
  if (root === 'stats' && segments.length === 1) {
    const indexes = Object.fromEntries([...state.indexes.values()].map((index) => [index.uid, indexStats(state, index)]))
    return { status: 200, body: { databaseSize: 0, usedDatabaseSize: 0, lastUpdate: null, indexes } }
  }
  if (root === 'tasks') {
    if (segments.length === 1 && method === 'GET') return { status: 200, body: state.tasks.list(request.query) }
    if (segments.length === 2 && method === 'GET') {
      if (!/^\d+$/.test(uid)) {
        throw engineErrors.invalid(
          'invalid_task_uids',
          `Invalid value in parameter \`taskUid\`: could not parse \`${uid}\` as a positive integer`,
        )
      }
      return { status: 200, body: state.tasks.get(Number(uid)) }
    }
    return { status: segments.length <= 2 ? 405 : 404 }
  }
  if (root !== 'indexes') return { status: 404 }

  if (segments.length === 1) {
    if (method === 'GET') return listIndexes(state, request)
    if (method === 'POST') return createIndex(state, request)
    return { status: 405 }
  }
  if (segments.length === 2) {
    if (method === 'GET') return { status: 200, body: indexView(existingIndex(state, uid)) }
    if (method === 'PATCH') return updateIndex(state, uid, request)
    if (method === 'DELETE') return deleteIndex(state, uid)
    return { status: 405 }
  }

  switch (resource) {
    case 'stats':
      if (segments.length !== 3) return { status: 404 }
      return method === 'GET' ? { status: 200, body: indexStats(state, existingIndex(state, uid)) } : { status: 405 }
    case 'settings':
      if (segments.length > 4) return { status: 404 }
      return settingsRoute(state, uid, sub ?? null, request)
    case 'search':
      if (segments.length !== 3) return { status: 404 }
      if (method === 'POST') {
        const index = existingIndex(state, uid)
        return { status: 200, body: executeSearch(index, readSearchBody(jsonBody(request))) }
      }
      if (method === 'GET') {
        const index = existingIndex(state, uid)
        return { status: 200, body: executeSearch(index, readSearchQuery(request.query)) }
      }
      return { status: 405 }
    case 'documents': {
      if (extra !== undefined) return { status: 404 }
      if (sub === undefined) {
        if (method === 'GET') return getDocuments(state, uid, request)
        if (method === 'POST') return addDocuments(state, uid, request, 'replace')
        if (method === 'PUT') return addDocuments(state, uid, request, 'update')
        if (method === 'DELETE') {
          return deletionTask(state, uid, 0, null, (index) => index.clear(), request.query.get('customMetadata') ?? undefined)
        }
        return { status: 405 }
      }
      if (sub === 'delete-batch' && method === 'POST') return deleteBatch(state, uid, request)
      if (sub === 'delete' && method === 'POST') return deleteByFilter(state, uid, request)
      if (sub === 'fetch' && method === 'POST') return fetchDocuments(state, uid, request)
      if (method === 'GET') return getDocument(state, uid, sub, request)
      if (method === 'DELETE') {
        const id = documentIdKey(sub) ?? sub
        return deletionTask(
          state,
          uid,
          1,
          null,
          (index) => (index.deleteDocument(id) ? 1 : 0),
          request.query.get('customMetadata') ?? undefined,
        )
      }
      return { status: 405 }
    }
    default:
      return { status: 404 }
  }
}
