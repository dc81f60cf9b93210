// The app's only way to the search engine: the official meilisearch SDK, pointed at MEILI_HOST.
import { Meilisearch, type Index } from 'meilisearch'
import type { FiringDocument } from './documents'
import { FIRINGS_INDEX, FIRINGS_INDEX_SETTINGS } from './settings'

/** Where the engine is: MEILI_HOST and MEILI_API_KEY, as the server's config reads them. */
export interface EngineConfig {
  meiliHost: string
  meiliApiKey: string
}

const clients = new Map<string, Meilisearch>()

export function searchClient(config: EngineConfig): Meilisearch {
  const key = `${config.meiliHost}|${config.meiliApiKey}`
  let client = clients.get(key)
  if (!client) {
    // A short timeout: a slow engine should send the page to the PostgreSQL answer, not hang it.
    client = new Meilisearch({ host: config.meiliHost, apiKey: config.meiliApiKey, timeout: 2000 })
    clients.set(key, client)
  }
  return client
}

export function firingsIndex(config: EngineConfig): Index<FiringDocument> {
  return searchClient(config).index<FiringDocument>(FIRINGS_INDEX)
}

const ensured = new Map<string, Promise<void>>()

/** Creates the index and applies its settings once per process (and again after a failure). */
export function ensureFiringsIndex(config: EngineConfig): Promise<void> {
  const key = config.meiliHost
  let pending = ensured.get(key)
  if (!pending) {
    pending = (async () => {
      const client = searchClient(config)
      const created = await client.createIndex(FIRINGS_INDEX, { primaryKey: 'id' }).waitTask({ timeout: 30_000 })
      if (created.status === 'failed' && created.error?.code !== 'index_already_exists') {
        throw new Error(`could not create the search index: ${created.error?.message}`)
      }
      const settings = await client.index(FIRINGS_INDEX).updateSettings(FIRINGS_INDEX_SETTINGS).waitTask({ timeout: 30_000 })
      if (settings.status === 'failed') throw new Error(`could not set up the search index: ${settings.error?.message}`)
    })()
    ensured.set(key, pending)
    pending.catch(() => ensured.delete(key))
  }
  return pending
}

/** Forgets that the index was set up, so the next write creates it and applies its settings again. */
export function forgetFiringsIndex(config: EngineConfig) {
  ensured.delete(config.meiliHost)
}

/** When the engine's index was created, or null when the engine has no such index. Throws when unreachable. */
export async function firingsIndexCreatedAt(config: EngineConfig): Promise<string | null> {
  try {
    const info = await searchClient(config).index(FIRINGS_INDEX).getRawInfo()
    return String(info.createdAt)
  } catch (error) {
    if ((error as { cause?: { code?: string } }).cause?.code === 'index_not_found') return null
    throw error
  }
}
