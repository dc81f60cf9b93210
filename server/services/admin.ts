// The marketplace desk's reads and account actions. Admins only (the routes check the role). The
// lists page and filter in PostgreSQL, since accounts and studios grow past what one page can hold.
import type { EntityManager } from 'typeorm'
import type { DeskAccount, DeskAccountList, DeskDispute, DeskStudioList, DisputeReason } from '../../shared/api/admin'
import type { DeskAccountSort, DeskAccountsQuery, DeskStudioSort, DeskStudiosQuery } from '../../shared/schemas/admin'
import { FiringRequest } from '../entities/FiringRequest'
import { User } from '../entities/User'
import { badRequest, notFound } from '../http/errors'
import type { AppContext } from '../context'
import { requestRows } from './request-views'

/** Words for ILIKE: the pattern characters the person typed are matched as themselves. */
const containing = (q: string | undefined) => (q ? `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : null)

// Orders by whitelist only: the query's sort is one of these keys, never text put into the SQL.
const STUDIO_ORDER: Record<DeskStudioSort, string> = {
  waiting: '(s.published AND s.verified_at IS NULL) DESC, s.created_at DESC, s.id',
  name: 's.name ASC, s.id',
  '-name': 's.name DESC, s.id',
  created: 's.created_at ASC, s.id',
  '-created': 's.created_at DESC, s.id',
}

const STUDIO_STATE: Record<NonNullable<DeskStudiosQuery['state']>, string> = {
  waiting: 's.published AND s.verified_at IS NULL',
  verified: 's.verified_at IS NOT NULL',
  unverified: 's.verified_at IS NULL',
  draft: 'NOT s.published',
}

/** Studios by name, town or owner, in a state, a page at a time; bench data is left out. */
export async function deskStudios(manager: EntityManager, query: DeskStudiosQuery): Promise<DeskStudioList> {
  const where = [
    `s.name NOT LIKE 'Bench studio %'`,
    `($1::text IS NULL OR s.name ILIKE $1 OR s.city ILIKE $1 OR EXISTS (
       SELECT 1 FROM studio_members m JOIN users u ON u.id = m.user_id
       WHERE m.studio_id = s.id AND m.role = 'owner' AND (u.display_name ILIKE $1 OR u.email ILIKE $1)))`,
    query.state ? STUDIO_STATE[query.state] : 'TRUE',
  ].join(' AND ')
  const pattern = containing(query.q)
  const [{ total }] = await manager.query(`SELECT count(*)::int AS total FROM studios s WHERE ${where}`, [pattern])
  const studios = await manager.query(
    `SELECT s.id, s.name, s.city, s.region, s.published, s.verified_at IS NOT NULL AS verified, s.created_at AS "createdAt",
            (SELECT count(*)::int FROM kilns k WHERE k.studio_id = s.id AND k.retired_at IS NULL) AS kilns,
            (SELECT count(*)::int FROM firings f JOIN kilns k ON k.id = f.kiln_id WHERE k.studio_id = s.id AND f.firing_date > now()) AS "upcomingFirings",
            coalesce((SELECT json_agg(json_build_object('name', u.display_name, 'email', u.email) ORDER BY u.display_name)
                      FROM studio_members m JOIN users u ON u.id = m.user_id WHERE m.studio_id = s.id AND m.role = 'owner'), '[]'::json) AS owners
     FROM studios s WHERE ${where}
     ORDER BY ${STUDIO_ORDER[query.sort]} LIMIT $2 OFFSET $3`,
    [pattern, query.perPage, (query.page - 1) * query.perPage],
  )
  return { studios, total, page: query.page, perPage: query.perPage }
}

const ACCOUNT_ORDER: Record<DeskAccountSort, string> = {
  '-created': 'created_at DESC, id',
  created: 'created_at ASC, id',
  name: 'display_name ASC, id',
  '-name': 'display_name DESC, id',
}

/** Accounts by name or address, of a kind and a state, a page at a time; the reader's own is marked. */
export async function deskUsers(manager: EntityManager, reader: Pick<User, 'id'>, query: DeskAccountsQuery): Promise<DeskAccountList> {
  const where = `($1::text IS NULL OR email ILIKE $1 OR display_name ILIKE $1)
    AND ($2::text IS NULL OR role = $2)
    AND ($3::text IS NULL OR ($3 = 'suspended') = (suspended_at IS NOT NULL))`
  const params = [containing(query.q), query.role ?? null, query.state ?? null]
  const [{ total }] = await manager.query(`SELECT count(*)::int AS total FROM users WHERE ${where}`, params)
  const rows: Omit<DeskAccount, 'self'>[] = await manager.query(
    `SELECT id, email, display_name AS "displayName", role, suspended_at IS NOT NULL AS suspended, created_at AS "createdAt"
     FROM users WHERE ${where} ORDER BY ${ACCOUNT_ORDER[query.sort]} LIMIT $4 OFFSET $5`,
    [...params, query.perPage, (query.page - 1) * query.perPage],
  )
  return { users: rows.map((row) => ({ ...row, self: row.id === reader.id })), total, page: query.page, perPage: query.perPage }
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

interface ReasonRow {
  request_id: string
  reason: string
  at: Date
  actor_name: string | null
  /** The side the door recorded on the move ("potter" or "studio"). */
  side: string | null
}

/** Disputed requests, latest change first, each with the reason its raiser gave and who they are. */
export async function deskDisputes(manager: EntityManager, reader: Pick<User, 'id'>): Promise<DeskDispute[]> {
  const disputed = await manager
    .getRepository(FiringRequest)
    .find({ where: { state: 'disputed' }, order: { updatedAt: 'DESC' }, take: 100 })
  const rows = await requestRows(manager, disputed, reader)
  if (!rows.length) return []
  const reasons: ReasonRow[] = await manager.query(
    `SELECT DISTINCT ON (e.request_id) e.request_id, e.reason, e.at, u.display_name AS actor_name, e.data ->> 'by' AS side
     FROM request_events e LEFT JOIN users u ON u.id = e.actor_id
     WHERE e.request_id = ANY($1::uuid[]) AND e.to_state = 'disputed'
     ORDER BY e.request_id, e.at DESC`,
    [rows.map((r) => r.id)],
  )
  const byRequest = new Map(
    reasons.map((r): [string, DisputeReason] => [
      r.request_id,
      {
        reason: r.reason,
        raisedBy: r.side === 'potter' || r.side === 'studio' ? r.side : 'desk',
        raisedByName: r.actor_name ?? 'Conewright',
        at: new Date(r.at).toISOString(),
      },
    ]),
  )
  return rows.map((row) => ({ ...row, dispute: byRequest.get(row.id) ?? null }))
}
