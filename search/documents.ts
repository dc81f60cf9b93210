// The mapping from PostgreSQL rows to search documents: one per open upcoming firing of a published
// studio, carrying what a potter filters and sorts on.
import type { EntityManager } from 'typeorm'
import { shelfFootprint, usableHeightMm } from '../shared/firing/check'
import { coneIndex } from '../shared/firing/cones'
import { EXAMPLE_MUG } from '../shared/firing/examples'
import { quoteRequest } from '../shared/firing/quote'
import { Firing } from '../server/entities/Firing'
import { Kiln } from '../server/entities/Kiln'
import { Studio } from '../server/entities/Studio'
import { heldLitres } from '../server/services/firings'
import { getPriceList, kilnSpec } from '../server/services/kilns'
import { studioRatings } from '../server/services/studio-ratings'

export interface FiringDocument {
  id: string
  studioId: string
  studioName: string
  studioCity: string
  studioRegion: string
  verified: boolean
  kilnId: string
  kilnName: string
  kilnKind: string
  kilnMinCone: string
  kilnMaxCone: string
  kilnAtmospheres: string[]
  cone: string
  coneRank: number
  atmosphere: string
  kind: string
  slowCool: boolean
  dropOffBy: string
  dropOffByTs: number
  firingDate: string
  firingDateTs: number
  readyBy: string
  capacityL: number
  spaceLeftL: number
  usableHeightMm: number
  shelfShape: 'round' | 'box'
  shelfDiameterMm: number | null
  shelfWidthMm: number | null
  shelfDepthMm: number | null
  priceExampleCents: number | null
  priceExampleLabel: string | null
  currency: string
  ratingScore: number | null
  ratingMean: number | null
  ratingCount: number
  notes: string
  _geo: { lat: number; lng: number }
}

const seconds = (d: Date) => Math.floor(d.getTime() / 1000)

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
  const held = await heldLitres(
    manager,
    firings.map((f) => f.id),
  )
  const rating = (await studioRatings(manager, [studioId])).get(studioId)
  const priceLists = new Map(await Promise.all(kilns.map(async (k) => [k.id, await getPriceList(manager, k.id)] as const)))
  const byId = new Map(kilns.map((k) => [k.id, k]))
  return firings.map((firing) => {
    const kiln = byId.get(firing.kilnId)!
    const spec = kilnSpec(kiln)
    const shelf = shelfFootprint(spec)
    const priceList = priceLists.get(kiln.id)
    const example = priceList
      ? quoteRequest(priceList, { atmosphere: firing.atmosphere, slowCool: firing.slowCool }, [EXAMPLE_MUG], spec)
      : null
    return {
      id: firing.id,
      studioId: studio.id,
      studioName: studio.name,
      studioCity: studio.city,
      studioRegion: studio.region,
      verified: studio.verifiedAt !== null,
      kilnId: kiln.id,
      kilnName: kiln.name,
      kilnKind: kiln.kind,
      kilnMinCone: kiln.minCone,
      kilnMaxCone: kiln.maxCone,
      kilnAtmospheres: kiln.atmospheres,
      cone: firing.cone,
      coneRank: coneIndex(firing.cone),
      atmosphere: firing.atmosphere,
      kind: firing.kind,
      slowCool: firing.slowCool,
      dropOffBy: firing.dropOffBy.toISOString(),
      dropOffByTs: seconds(firing.dropOffBy),
      firingDate: firing.firingDate.toISOString(),
      firingDateTs: seconds(firing.firingDate),
      readyBy: firing.readyBy.toISOString(),
      capacityL: firing.capacityL,
      spaceLeftL: Math.round(Math.max(0, firing.capacityL - (held.get(firing.id) ?? 0)) * 10) / 10,
      usableHeightMm: usableHeightMm(spec),
      shelfShape: shelf.shape,
      shelfDiameterMm: shelf.shape === 'round' ? shelf.diameterMm : null,
      shelfWidthMm: shelf.shape === 'box' ? shelf.widthMm : null,
      shelfDepthMm: shelf.shape === 'box' ? shelf.depthMm : null,
      priceExampleCents: example?.totalCents ?? null,
      priceExampleLabel: example ? EXAMPLE_MUG.label! : null,
      currency: priceList?.currency ?? studio.currency,
      ratingScore: rating?.score ?? null,
      ratingMean: rating?.mean ?? null,
      ratingCount: rating?.count ?? 0,
      notes: firing.notes,
      _geo: { lat: studio.lat, lng: studio.lng },
    }
  })
}

/** Every studio that may have documents: the published ones. */
export async function publishedStudioIds(manager: EntityManager): Promise<string[]> {
  const rows: { id: string }[] = await manager.query(`SELECT id FROM studios WHERE published`)
  return rows.map((r) => r.id)
}
