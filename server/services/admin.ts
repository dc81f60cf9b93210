// The marketplace desk's reads and account actions. Admins only (the routes check the role).
import type { EntityManager } from 'typeorm'
import { FiringRequest } from '../entities/FiringRequest'
import { User } from '../entities/User'
import { badRequest, notFound } from '../http/errors'
import type { AppContext } from '../context'
import { requestRows } from './request-views'

export async function deskStudios(manager: EntityManager) {
  return manager.query(
    `SELECT s.id, s.name, s.city, s.region, s.published, s.verified_at IS NOT NULL AS verified, s.created_at AS "createdAt",
            (SELECT count(*)::int FROM kilns k WHERE k.studio_id = s.id AND k.retired_at IS NULL) AS kilns,
            (SELECT count(*)::int FROM firings f JOIN kilns k ON k.id = f.kiln_id WHERE k.studio_id = s.id AND f.firing_date > now()) AS "upcomingFirings",
            (SELECT json_agg(json_build_object('name', u.display_name, 'email', u.email)) FROM studio_members m JOIN users u ON u.id = m.user_id WHERE m.studio_id = s.id AND m.role = 'owner') AS owners
     FROM studios s WHERE s.name NOT LIKE 'Bench studio %' ORDER BY (s.published AND s.verified_at IS NULL) DESC, s.created_at DESC LIMIT 500`,
  )
}

export async function deskUsers(manager: EntityManager, q: string | undefined) {
  return manager.query(
    `SELECT id, email, display_name AS "displayName", role, suspended_at IS NOT NULL AS suspended, created_at AS "createdAt"
     FROM users WHERE ($1::text IS NULL OR email ILIKE '%' || $1 || '%' OR display_name ILIKE '%' || $1 || '%')
     ORDER BY created_at DESC LIMIT 50`,
    [q || null],
  )
}

/** Suspends or restores an account; a suspension ends its sessions at once. Never one's own. */
export async function setSuspended(ctx: AppContext, adminId: string, userId: string, suspended: boolean) {
  await ctx.db.transaction(async (manager) => {
    const user = await manager.getRepository(User).findOne({ where: { id: userId }, lock: { mode: 'pessimistic_write' } })
    if (!user) throw notFound('That account')
    if (user.id === adminId) throw badRequest('You cannot suspend your own account.', { suspended: 'Not your own account.' })
    await manager.update(User, user.id, { suspendedAt: suspended ? new Date() : null })
    if (suspended) await manager.query(`DELETE FROM session WHERE sess -> 'passport' ->> 'user' = $1`, [user.id])
  })
}

export async function deskDisputes(manager: EntityManager, reader: Pick<User, 'id'>) {
  const disputed = await manager
    .getRepository(FiringRequest)
    .find({ where: { state: 'disputed' }, order: { updatedAt: 'DESC' }, take: 100 })
  return requestRows(manager, disputed, reader)
}
