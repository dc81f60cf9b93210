// Keeping the index true. Every change that can alter a studio's documents enqueues a sync of that
// studio in the same transaction; the worker rebuilds the studio's documents from PostgreSQL and
// writes them to the search_documents table and to the engine. A failed engine write is retried by
// the queue, so an outage loses nothing.
import { In, Not, type EntityManager } from 'typeorm'
import type { AppContext } from '../server/context'
import { SearchDocument } from '../server/entities/SearchDocument'
import { enqueueJob } from '../server/jobs/queue'
import { ensureFiringsIndex, firingsIndex } from './client'
import { publishedStudioIds, studioDocuments, type FiringDocument } from './documents'

export const SYNC_STUDIO_TASK = 'search-sync-studio'
export const REINDEX_TASK = 'search-reindex'

/** Queues a sync of one studio; several changes before the worker runs coalesce into one job. */
export async function enqueueStudioSync(manager: EntityManager, studioId: string) {
  await enqueueJob(manager, SYNC_STUDIO_TASK, { studioId }, { jobKey: `search-sync:${studioId}`, maxAttempts: 30 })
}

export async function enqueueReindex(manager: EntityManager) {
  await enqueueJob(manager, REINDEX_TASK, {}, { jobKey: 'search-reindex', maxAttempts: 30 })
}

function rowOf(doc: FiringDocument): Omit<SearchDocument, 'updatedAt'> {
  return {
    firingId: doc.id,
    studioId: doc.studioId,
    lat: doc._geo.lat,
    lng: doc._geo.lng,
    coneRank: doc.coneRank,
    atmosphere: doc.atmosphere,
    kind: doc.kind,
    cone: doc.cone,
    kilnKind: doc.kilnKind,
    dropOffByTs: doc.dropOffByTs,
    firingDateTs: doc.firingDateTs,
    spaceLeftL: doc.spaceLeftL,
    usableHeightMm: doc.usableHeightMm,
    shelfShape: doc.shelfShape,
    shelfDiameterMm: doc.shelfDiameterMm,
    shelfWidthMm: doc.shelfWidthMm,
    shelfDepthMm: doc.shelfDepthMm,
    priceExampleCents: doc.priceExampleCents,
    ratingScore: doc.ratingScore,
    searchText: [doc.studioName, doc.studioCity, doc.studioRegion, doc.kilnName, doc.notes].join(' '),
    document: doc,
  }
}

/** The PostgreSQL copy of one studio's documents, replaced in one transaction. */
async function writeTable(ctx: AppContext, studioId: string, docs: FiringDocument[]) {
  await ctx.db.transaction(async (manager) => {
    const repo = manager.getRepository(SearchDocument)
    await repo.delete(docs.length ? { studioId, firingId: Not(In(docs.map((d) => d.id))) } : { studioId })
    if (docs.length) await repo.upsert(docs.map(rowOf), ['firingId'])
  })
}

async function waitOk(
  promise: { waitTask(options?: { timeout?: number }): Promise<{ status: string; error?: { message: string } | null }> },
  what: string,
) {
  const task = await promise.waitTask({ timeout: 30_000 })
  if (task.status !== 'succeeded') throw new Error(`search engine: ${what} ${task.status}: ${task.error?.message ?? ''}`)
}

/** Rebuilds one studio's documents in both places. Throws (for the queue to retry) if the engine fails. */
export async function syncStudio(ctx: AppContext, studioId: string) {
  const docs = await studioDocuments(ctx.db.manager, studioId)
  await writeTable(ctx, studioId, docs)
  await ensureFiringsIndex(ctx.config)
  const index = firingsIndex(ctx.config)
  if (docs.length) await waitOk(index.addDocuments(docs), 'adding documents')
  const keep = docs.map((d) => `"${d.id}"`).join(', ')
  await waitOk(
    index.deleteDocuments({ filter: docs.length ? `studioId = "${studioId}" AND id NOT IN [${keep}]` : `studioId = "${studioId}"` }),
    'deleting stale documents',
  )
}

/** Rebuilds the whole index from PostgreSQL: `npm run search:reindex`, and on every server start. */
export async function reindexAll(
  ctx: AppContext,
  onProgress?: (done: number, total: number) => void,
): Promise<{ studios: number; documents: number }> {
  const studioIds = await publishedStudioIds(ctx.db.manager)
  await ensureFiringsIndex(ctx.config)
  const index = firingsIndex(ctx.config)
  let documents = 0
  const all: FiringDocument[] = []
  for (const [i, studioId] of studioIds.entries()) {
    const docs = await studioDocuments(ctx.db.manager, studioId)
    await writeTable(ctx, studioId, docs)
    all.push(...docs)
    documents += docs.length
    onProgress?.(i + 1, studioIds.length)
  }
  await ctx.db.query(`DELETE FROM search_documents WHERE NOT (studio_id = ANY($1::uuid[]))`, [studioIds])
  await waitOk(index.deleteAllDocuments(), 'clearing the index')
  for (let i = 0; i < all.length; i += 5000) await waitOk(index.addDocuments(all.slice(i, i + 5000)), 'adding documents')
  // Every row was just rewritten: reclaim the old versions so the fallback's scans stay short.
  await ctx.db.query('VACUUM (ANALYZE) search_documents').catch((error) => ctx.log.warn('could not vacuum search_documents', error))
  return { studios: studioIds.length, documents }
}
