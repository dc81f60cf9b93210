// Writing documents into the engine. The server decides what the documents are (from PostgreSQL) and
// when to write them (queued jobs); this module only talks to the engine, through the meilisearch SDK.
import { ensureFiringsIndex, firingsIndex, type EngineConfig } from './client'
import type { FiringDocument } from './documents'

async function waitOk(
  promise: { waitTask(options?: { timeout?: number }): Promise<{ status: string; error?: { message: string } | null }> },
  what: string,
) {
  const task = await promise.waitTask({ timeout: 30_000 })
  if (task.status !== 'succeeded') throw new Error(`search engine: ${what} ${task.status}: ${task.error?.message ?? ''}`)
}

/** Replaces one studio's documents in the engine. Throws (for the queue to retry) if the engine fails. */
export async function writeStudioDocuments(config: EngineConfig, studioId: string, docs: FiringDocument[]) {
  await ensureFiringsIndex(config)
  const index = firingsIndex(config)
  if (docs.length) await waitOk(index.addDocuments(docs), 'adding documents')
  const keep = docs.map((d) => `"${d.id}"`).join(', ')
  await waitOk(
    index.deleteDocuments({ filter: docs.length ? `studioId = "${studioId}" AND id NOT IN [${keep}]` : `studioId = "${studioId}"` }),
    'deleting stale documents',
  )
}

/** Replaces every document in the engine with these, in batches. */
export async function replaceAllDocuments(config: EngineConfig, docs: FiringDocument[]) {
  await ensureFiringsIndex(config)
  const index = firingsIndex(config)
  await waitOk(index.deleteAllDocuments(), 'clearing the index')
  for (let i = 0; i < docs.length; i += 5000) await waitOk(index.addDocuments(docs.slice(i, i + 5000)), 'adding documents')
}
