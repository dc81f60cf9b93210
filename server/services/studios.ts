import type { EntityManager } from 'typeorm'
import type { PublicStudioJson, StudioJson } from '../../shared/api/studios'
import type { ChecklistItem } from '../../shared/schemas/pieces'
import { DEFAULT_POLICIES, type StudioCreateBody, type StudioPatchBody } from '../../shared/schemas/studios'
import type { AppContext } from '../context'
import { Studio } from '../entities/Studio'
import { StudioMember, type StudioRole } from '../entities/StudioMember'

export type { PublicStudioJson, StudioJson }
import type { User } from '../entities/User'
import { badRequest, conflict, notFound } from '../http/errors'
import { enqueueStudioSync } from './search-sync'
import { lookupPlace, timezoneAt, type Place } from './gazetteer'

export function publicStudioJson(studio: Studio): PublicStudioJson {
  return {
    id: studio.id,
    name: studio.name,
    description: studio.description,
    city: studio.city,
    region: studio.region,
    country: studio.country,
    postalCode: studio.postalCode,
    lat: studio.lat,
    lng: studio.lng,
    timezone: studio.timezone,
    currency: studio.currency,
    dropOffHours: studio.dropOffHours,
    policies: studio.policies,
    policiesVersion: studio.policiesVersion,
    dropOffChecklist: studio.dropOffChecklist,
    published: studio.published,
    verified: studio.verifiedAt !== null,
  }
}

export function studioJson(studio: Studio, role: StudioRole | null): PublicStudioJson | StudioJson {
  if (!role) return publicStudioJson(studio)
  return { ...publicStudioJson(studio), address: studio.addressLine, myRole: role, createdAt: studio.createdAt.toISOString() }
}

function placeFor(query: string, field: 'postalCode' | 'address'): Place {
  const place = lookupPlace(query)
  if (!place) {
    throw badRequest('We could not place that on the map.', {
      [field]:
        field === 'postalCode'
          ? 'We do not know that postal code. Check it, or enter the town and state instead.'
          : 'We could not find that address. Include the town and state, or the ZIP code.',
    })
  }
  return place
}

const currencyFor = (country: string) => (country === 'CA' ? 'CAD' : 'USD')

export async function createStudio(ctx: AppContext, owner: User, body: StudioCreateBody): Promise<Studio> {
  const place = body.postalCode ? placeFor(body.postalCode, 'postalCode') : placeFor(body.address!, 'address')
  return ctx.db.transaction(async (manager) => {
    const studios = manager.getRepository(Studio)
    const studio = await studios.save(
      studios.create({
        name: body.name,
        addressLine: body.address ?? null,
        postalCode: place.postalCode ?? body.postalCode ?? null,
        city: place.city,
        region: place.region,
        country: place.country,
        lat: place.lat,
        lng: place.lng,
        timezone: place.timezone,
        currency: currencyFor(place.country),
        policies: DEFAULT_POLICIES,
        published: false,
        verifiedAt: null,
      }),
    )
    await manager.getRepository(StudioMember).save({ studioId: studio.id, userId: owner.id, role: 'owner' })
    return studio
  })
}

/** The studio, or a 404. `lock` holds its row for the caller's transaction, so edits do not interleave. */
export async function getStudio(manager: EntityManager, id: string, lock = false): Promise<Studio> {
  const studio = await manager
    .getRepository(Studio)
    .findOne({ where: { id }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) })
  if (!studio) throw notFound('That studio')
  return studio
}

export async function updateStudio(ctx: AppContext, id: string, patch: StudioPatchBody): Promise<Studio> {
  return ctx.db.transaction(async (manager) => {
    const studio = await getStudio(manager, id, true)
    const { address, postalCode, lat, lng, policies, ...plain } = patch
    Object.assign(studio, plain)
    // A new address moves the pin unless the owner also placed the pin by hand.
    if ((address !== undefined && address !== null) || postalCode !== undefined) {
      const place = address ? placeFor(address, 'address') : placeFor(postalCode!, 'postalCode')
      if (address !== undefined) studio.addressLine = address
      studio.postalCode = place.postalCode ?? postalCode ?? studio.postalCode
      Object.assign(studio, { city: place.city, region: place.region, country: place.country })
      if (lat === undefined) Object.assign(studio, { lat: place.lat, lng: place.lng, timezone: patch.timezone ?? place.timezone })
    } else if (address === null) {
      studio.addressLine = null
    }
    if (lat !== undefined && lng !== undefined) {
      studio.lat = lat
      studio.lng = lng
      if (!patch.timezone) studio.timezone = timezoneAt(lat, lng)
    }
    if (policies && JSON.stringify(policies) !== JSON.stringify(studio.policies)) {
      studio.policies = policies
      studio.policiesVersion += 1
    }
    const saved = await manager.getRepository(Studio).save(studio)
    await enqueueStudioSync(manager, id)
    return saved
  })
}

/** Only a studio without firing history can be deleted; otherwise it is unpublished instead. */
export async function deleteStudio(ctx: AppContext, id: string) {
  await ctx.db.transaction(async (manager) => {
    await getStudio(manager, id)
    const [{ count }] = await manager.query(
      `SELECT count(*)::int AS count FROM firings f JOIN kilns k ON k.id = f.kiln_id WHERE k.studio_id = $1`,
      [id],
    )
    if (count > 0) {
      throw conflict('This studio has firings on record, so it cannot be deleted. Unpublish it instead.', 'has-history')
    }
    await manager.delete(Studio, { id })
    await enqueueStudioSync(manager, id)
  })
}

export async function listPublishedStudios(ctx: AppContext, limit = 200): Promise<Studio[]> {
  return ctx.db.getRepository(Studio).find({ where: { published: true }, order: { name: 'ASC' }, take: limit })
}

export async function listMyStudios(ctx: AppContext, userId: string): Promise<{ studio: Studio; role: StudioRole }[]> {
  const members = await ctx.db
    .getRepository(StudioMember)
    .find({ where: { userId }, relations: { studio: true }, order: { createdAt: 'ASC' } })
  return members.map((m) => ({ studio: m.studio, role: m.role }))
}

export async function setVerified(ctx: AppContext, id: string, verified: boolean): Promise<Studio> {
  return ctx.db.transaction(async (manager) => {
    const studio = await getStudio(manager, id)
    studio.verifiedAt = verified ? (studio.verifiedAt ?? new Date()) : null
    const saved = await manager.getRepository(Studio).save(studio)
    await enqueueStudioSync(manager, id)
    return saved
  })
}

/**
 * The studio's drop-off checklist, replaced whole. Pieces already tagged keep the items as they were
 * answered; the next piece is checked against the new list.
 */
export async function setDropOffChecklist(ctx: AppContext, id: string, items: ChecklistItem[]): Promise<Studio> {
  return ctx.db.transaction(async (manager) => {
    const studio = await getStudio(manager, id)
    studio.dropOffChecklist = items
    return manager.getRepository(Studio).save(studio)
  })
}
