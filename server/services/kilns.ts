import type { EntityManager } from 'typeorm'
import { kilnVolumeL, usableHeightMm, type Kiln as KilnSpec } from '../../shared/firing/check'
import { quoteRequest, type PriceList, type Quote } from '../../shared/firing/quote'
import { EXAMPLE_PIECES } from '../../shared/firing/examples'
import type { KilnJson } from '../../shared/api/studios'
import { kilnBodySchema, type KilnBody, type PriceListBody } from '../../shared/schemas/studios'
import { enqueueStudioSync } from './search-sync'
import type { AppContext } from '../context'
import { Kiln } from '../entities/Kiln'
import { KilnPriceList } from '../entities/KilnPriceList'
import { conflict, fieldErrorsFrom, HttpError, notFound } from '../http/errors'

/** The kiln's limits as the firing science takes them. */
export function kilnSpec(kiln: Kiln): KilnSpec {
  return {
    kind: kiln.kind,
    atmospheres: kiln.atmospheres,
    interior:
      kiln.interiorShape === 'round'
        ? { shape: 'round', diameterMm: kiln.diameterMm!, heightMm: kiln.heightMm }
        : { shape: 'box', widthMm: kiln.widthMm!, depthMm: kiln.depthMm!, heightMm: kiln.heightMm },
    ...(kiln.usableHeightMm !== null ? { usableHeightMm: kiln.usableHeightMm } : {}),
    minCone: kiln.minCone,
    maxCone: kiln.maxCone,
    maxTempC: kiln.maxTempC,
    maxRampCPerHour: kiln.maxRampCPerHour,
    preheatHold: kiln.preheatHold,
    controlledCooling: kiln.controlledCooling,
    ...(kiln.shelfLoadKg !== null ? { shelfLoadKg: kiln.shelfLoadKg } : {}),
    shelves: {
      count: kiln.shelfCount,
      ...(kiln.shelfWidthMm !== null ? { widthMm: kiln.shelfWidthMm } : {}),
      ...(kiln.shelfDepthMm !== null ? { depthMm: kiln.shelfDepthMm } : {}),
      ...(kiln.furniture ? { furniture: kiln.furniture } : {}),
    },
  }
}

export function kilnJson(kiln: Kiln): KilnJson {
  const spec = kilnSpec(kiln)
  return {
    id: kiln.id,
    studioId: kiln.studioId,
    name: kiln.name,
    ...spec,
    shelfCount: kiln.shelfCount,
    shelfWidthMm: kiln.shelfWidthMm,
    shelfDepthMm: kiln.shelfDepthMm,
    notes: kiln.notes,
    retired: kiln.retiredAt !== null,
    effectiveUsableHeightMm: usableHeightMm(spec),
    volumeL: kilnVolumeL(spec),
  }
}

export function kilnColumns(body: KilnBody): Partial<Kiln> {
  const interior = body.interior
  return {
    name: body.name,
    kind: body.kind,
    atmospheres: body.atmospheres,
    interiorShape: interior.shape,
    diameterMm: interior.shape === 'round' ? interior.diameterMm : null,
    widthMm: interior.shape === 'box' ? interior.widthMm : null,
    depthMm: interior.shape === 'box' ? interior.depthMm : null,
    heightMm: interior.heightMm,
    usableHeightMm: body.usableHeightMm ?? null,
    minCone: body.minCone,
    maxCone: body.maxCone,
    maxTempC: body.maxTempC,
    maxRampCPerHour: body.maxRampCPerHour,
    preheatHold: body.preheatHold,
    controlledCooling: body.controlledCooling,
    shelfLoadKg: body.shelfLoadKg ?? null,
    shelfCount: body.shelfCount,
    shelfWidthMm: body.shelfWidthMm ?? null,
    shelfDepthMm: body.shelfDepthMm ?? null,
    furniture: body.furniture ?? null,
    notes: body.notes ?? '',
  }
}

/** The kiln, or a 404. `lock` holds its row for the caller's transaction, so edits do not interleave. */
export async function getKiln(manager: EntityManager, id: string, lock = false): Promise<Kiln> {
  const kiln = await manager
    .getRepository(Kiln)
    .findOne({ where: { id }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) })
  if (!kiln) throw notFound('That kiln')
  return kiln
}

export async function createKiln(ctx: AppContext, studioId: string, body: KilnBody): Promise<Kiln> {
  return ctx.db.transaction(async (manager) => {
    const kiln = await manager
      .getRepository(Kiln)
      .save(manager.getRepository(Kiln).create({ ...kilnColumns(body), studioId, retiredAt: null }))
    await enqueueStudioSync(manager, studioId)
    return kiln
  })
}

/** Merges a partial change with the stored kiln and checks the whole kiln again, so ranges stay whole. */
export async function updateKiln(ctx: AppContext, id: string, patch: Record<string, unknown>): Promise<Kiln> {
  return ctx.db.transaction(async (manager) => {
    // Locked, as for price lists: a round kiln made square by one edit and resized by another must stay whole.
    const kiln = await getKiln(manager, id, true)
    const current = kilnJson(kiln)
    const merged = {
      name: current.name,
      kind: current.kind,
      atmospheres: current.atmospheres,
      interior: current.interior,
      usableHeightMm: current.usableHeightMm,
      minCone: current.minCone,
      maxCone: current.maxCone,
      maxTempC: current.maxTempC,
      maxRampCPerHour: current.maxRampCPerHour,
      preheatHold: current.preheatHold,
      controlledCooling: current.controlledCooling,
      shelfLoadKg: current.shelfLoadKg,
      shelfCount: current.shelfCount,
      shelfWidthMm: current.shelfWidthMm,
      shelfDepthMm: current.shelfDepthMm,
      furniture: kiln.furniture,
      notes: current.notes,
      ...patch,
    }
    // null clears the usable height, which then follows from the interior again, and the shelf load.
    if (merged.usableHeightMm === null) delete (merged as Record<string, unknown>).usableHeightMm
    if (merged.shelfLoadKg === null) delete (merged as Record<string, unknown>).shelfLoadKg
    const parsed = kilnBodySchema.safeParse(merged)
    if (!parsed.success) throw new HttpError(400, 'invalid-input', 'Some fields need fixing.', fieldErrorsFrom(parsed.error))
    Object.assign(kiln, kilnColumns(parsed.data))
    const saved = await manager.getRepository(Kiln).save(kiln)
    await enqueueStudioSync(manager, kiln.studioId)
    return saved
  })
}

/** A kiln with firings is retired rather than deleted, so their history stays whole. */
export async function removeKiln(ctx: AppContext, id: string): Promise<'deleted' | 'retired'> {
  return ctx.db.transaction(async (manager) => {
    const kiln = await getKiln(manager, id)
    const [{ upcoming, total }] = await manager.query(
      `SELECT count(*) FILTER (WHERE status NOT IN ('cancelled', 'unloaded'))::int AS upcoming, count(*)::int AS total
       FROM firings WHERE kiln_id = $1`,
      [id],
    )
    if (upcoming > 0) throw conflict('This kiln has firings coming up. Call them off first.', 'has-upcoming-firings')
    await enqueueStudioSync(manager, kiln.studioId)
    if (total === 0) {
      await manager.delete(Kiln, { id })
      return 'deleted'
    }
    await manager.update(Kiln, id, { retiredAt: new Date() })
    return 'retired'
  })
}

export async function listKilns(manager: EntityManager, studioId: string, { includeRetired = false } = {}): Promise<Kiln[]> {
  const kilns = await manager.getRepository(Kiln).find({ where: { studioId }, order: { createdAt: 'ASC' } })
  return includeRetired ? kilns : kilns.filter((k) => k.retiredAt === null)
}

export function priceListSpec(row: KilnPriceList): PriceList {
  const surcharges = {
    ...(row.surchargeReductionPercent !== null ? { reduction: row.surchargeReductionPercent } : {}),
    ...(row.surchargeSlowCoolPercent !== null ? { slowCool: row.surchargeSlowCoolPercent } : {}),
    ...(row.surchargePreheatPercent !== null ? { preheat: row.surchargePreheatPercent } : {}),
  }
  return {
    currency: row.currency,
    model: row.model,
    ...(row.centsPerCubicInch !== null ? { centsPerCubicInch: row.centsPerCubicInch } : {}),
    ...(row.centsPerLitre !== null ? { centsPerLitre: row.centsPerLitre } : {}),
    ...(row.shelfCents !== null ? { shelfCents: row.shelfCents } : {}),
    ...(row.layerCents !== null ? { layerCents: row.layerCents } : {}),
    ...(row.shelfStep !== null ? { shelfStep: row.shelfStep } : {}),
    ...(row.kilnCents !== null ? { kilnCents: row.kilnCents } : {}),
    ...(row.minimumPerPieceCents !== null ? { minimumPerPieceCents: row.minimumPerPieceCents } : {}),
    ...(Object.keys(surcharges).length ? { surcharges } : {}),
    deposit: row.depositPercent !== null ? { percent: row.depositPercent } : { fixedCents: row.depositFixedCents ?? 0 },
  }
}

export async function getPriceList(manager: EntityManager, kilnId: string): Promise<PriceList | null> {
  const row = await manager.getRepository(KilnPriceList).findOne({ where: { kilnId } })
  return row ? priceListSpec(row) : null
}

/** The columns of a price list row for a PriceList. */
export function priceListColumns(p: PriceList): Omit<KilnPriceList, 'kilnId' | 'kiln' | 'updatedAt'> {
  return {
    currency: p.currency,
    model: p.model,
    centsPerCubicInch: p.centsPerCubicInch ?? null,
    centsPerLitre: p.centsPerLitre ?? null,
    shelfCents: p.shelfCents ?? null,
    layerCents: p.layerCents ?? null,
    shelfStep: p.shelfStep ?? null,
    kilnCents: p.kilnCents ?? null,
    minimumPerPieceCents: p.minimumPerPieceCents ?? null,
    surchargeReductionPercent: p.surcharges?.reduction ?? null,
    surchargeSlowCoolPercent: p.surcharges?.slowCool ?? null,
    surchargePreheatPercent: p.surcharges?.preheat ?? null,
    depositPercent: 'percent' in p.deposit ? p.deposit.percent : null,
    depositFixedCents: 'fixedCents' in p.deposit ? p.deposit.fixedCents : null,
  }
}

export async function putPriceList(ctx: AppContext, kilnId: string, body: PriceListBody): Promise<PriceList> {
  return ctx.db.transaction(async (manager) => {
    // Two edits at once must not interleave: save() writes only the columns it sees changed, so a
    // deposit switched from percent to fixed by one and back by the other could leave both set.
    const kiln = await getKiln(manager, kilnId, true)
    await manager.getRepository(KilnPriceList).save(manager.getRepository(KilnPriceList).create({ kilnId, ...priceListColumns(body) }))
    await enqueueStudioSync(manager, kiln.studioId)
    return (await getPriceList(manager, kilnId))!
  })
}

/** Prices of the reference pieces in a cone 6 oxidation glaze firing of this kiln. */
export function examplePrices(kiln: Kiln, priceList: PriceList): { label: string; quote: Quote }[] {
  const spec = kilnSpec(kiln)
  const atmosphere = spec.atmospheres.includes('oxidation') ? 'oxidation' : spec.atmospheres[0]
  return EXAMPLE_PIECES.map((piece) => ({
    label: piece.label!,
    quote: quoteRequest(priceList, { atmosphere }, [piece], spec),
  }))
}
