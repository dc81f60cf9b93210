// Keeping the index true. Every change that can alter a studio's documents enqueues a sync of that
// studio in the same transaction; the worker rebuilds the studio's documents from PostgreSQL and
// writes them to the search_documents table and to the engine. A failed engine write is retried by
// the queue, so an outage loses nothing.
import { In, Not, type EntityManager } from 'typeorm'
import { firingDocument, replaceAllDocuments, writeStudioDocuments, type FiringDocument } from '../../search/public'
import type { AppContext } from '../context'
import { Firing } from '../entities/Firing'
import { Kiln } from '../entities/Kiln'
import { SearchDocument } from '../entities/SearchDocument'
import { Studio } from '../entities/Studio'
import { enqueueJob } from '../jobs/queue'
import { getPriceList, kilnSpec } from './kilns'
import { loadsOf } from './load-plan'
import { engineFailed, engineIsUp } from './search'
import { studioReviewSummaries } from './reviews'

export const SYNC_STUDIO_TASK = 'search-sync-studio'
export const REINDEX_TASK = 'search-reindex'

/** Queues a sync of one studio; several changes before the worker runs coalesce into one job. */
export async function enqueueStudioSync(manager: EntityManager, studioId: string) {
  await enqueueJob(manager, SYNC_STUDIO_TASK, { studioId }, { jobKey: `search-sync:${studioId}`, maxAttempts: 30 })
}

export async function enqueueReindex(manager: EntityManager) {
  await enqueueJob(manager, REINDEX_TASK, {}, { jobKey: 'search-reindex', maxAttempts: 30 })
}

/** The documents of one studio as PostgreSQL has it now; empty when it is unpublished or gone. */
export async function studioDocuments(manager: EntityManager, studioId: string, now = new Date()): Promise<FiringDocument[]> {
  const studio = await manager.getRepository(Studio).findOne({ where: { id: studioId } })
  if (!studio || !studio.published) return []
  const kilns = (await manager.getRepository(Kiln).find({ where: { studioId } })).filter((k) => !k.retiredAt)
  if (!kilns.length) return []
  const firings = await manager
    .getRepository(Firing)
    .createQueryBuilder('f')
    .where('f.kiln_id = ANY(:kilnIds)', { kilnIds: kilns.map((k) => k.id) })
    .andWhere(`f.status = 'open'`)
    .andWhere('f.drop_off_by > :now', { now })
    .getMany()
  const loads = await loadsOf(manager, firings)
  const reviews = (await studioReviewSummaries(manager, [studioId])).get(studioId) ?? null
  const priceLists = new Map(await Promise.all(kilns.map(async (k) => [k.id, await getPriceList(manager, k.id)] as const)))
  const byId = new Map(kilns.map((k) => [k.id, k]))
  const place = {
    id: studio.id,
    name: studio.name,
    city: studio.city,
    region: studio.region,
    verified: studio.verifiedAt !== null,
    lat: studio.lat,
    lng: studio.lng,
    currency: studio.currency,
  }
  return firings.map((firing) => {
    const kiln = byId.get(firing.kilnId)!
    return firingDocument({
      studio: place,
      kiln: { id: kiln.id, name: kiln.name, kind: kiln.kind, spec: kilnSpec(kiln) },
      firing,
      room: loads.get(firing.id)!.room,
      priceList: priceLists.get(kiln.id) ?? null,
      reviews,
    })
  })
}

/** Every studio that may have documents: the published ones. */
async function publishedStudioIds(manager: EntityManager): Promise<string[]> {
  const rows: { id: string }[] = await manager.query(`SELECT id FROM studios WHERE published`)
  return rows.map((r) => r.id)
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
    spaceLeftShelves: doc.spaceLeftShelves,
    roomTallestMm: doc.roomTallestMm,
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

/**
 * Rebuilds one studio's documents in both places. While the engine is out (or fails this write) the
 * PostgreSQL copy is still written, and the engine's part waits in the queue for the search monitor
 * to run it when the engine is back, instead of failing and logging on every retry.
 */
export async function syncStudio(ctx: AppContext, studioId: string) {
  const docs = await studioDocuments(ctx.db.manager, studioId)
  await writeTable(ctx, studioId, docs)
  if (!engineIsUp()) return waitForEngine(ctx, studioId)
  try {
    await writeStudioDocuments(ctx.config, studioId, docs)
  } catch (error) {
    engineFailed(ctx, error)
    await waitForEngine(ctx, studioId)
  }
}

/** The studio's sync, parked: the monitor runs it as soon as the engine is back (within the hour regardless). */
async function waitForEngine(ctx: AppContext, studioId: string) {
  await enqueueJob(
    ctx.db.manager,
    SYNC_STUDIO_TASK,
    { studioId },
    // A newer change's sync already waiting keeps its own (sooner) time.
    { jobKey: `search-sync:${studioId}`, maxAttempts: 30, runAt: new Date(Date.now() + 3600_000), jobKeyMode: 'preserve_run_at' },
  )
}

/** Rebuilds the whole index from PostgreSQL: `npm run search:reindex`, and on every server start. */
export async function reindexAll(
  ctx: AppContext,
  onProgress?: (done: number, total: number) => void,
): Promise<{ studios: number; documents: number }> {
  const studioIds = await publishedStudioIds(ctx.db.manager)
  const all: FiringDocument[] = []
  for (const [i, studioId] of studioIds.entries()) {
    const docs = await studioDocuments(ctx.db.manager, studioId)
    await writeTable(ctx, studioId, docs)
    all.push(...docs)
    onProgress?.(i + 1, studioIds.length)
  }
  await ctx.db.query(`DELETE FROM search_documents WHERE NOT (studio_id = ANY($1::uuid[]))`, [studioIds])
  await replaceAllDocuments(ctx.config, all)
  // Every row was just rewritten: reclaim the old versions so the fallback's scans stay short.
  await ctx.db.query('VACUUM (ANALYZE) search_documents').catch((error) => ctx.log.warn('could not vacuum search_documents', error))
  return { studios: studioIds.length, documents: all.length }
}
