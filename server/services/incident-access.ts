// Who may see an incident: the studio's people, the potter whose ware failed, a potter whose piece it
// hurt, and the front desk. Anyone else gets a 404, as if it were not there. One place, read by the
// incident routes and by the photos of an incident.
import type { EntityManager } from 'typeorm'
import { Incident } from '../entities/Incident'
import { StudioMember } from '../entities/StudioMember'
import type { User } from '../entities/User'
import { notFound } from '../http/errors'
import { isUuid } from '../http/validate'

export type IncidentViewer = { side: 'admin' } | { side: 'studio'; role: 'owner' | 'crew' } | { side: 'potter' } | { side: 'neighbour' }

export interface IncidentRecord {
  incident: Incident
  studioId: string
  potterId: string
}

export async function loadIncident(manager: EntityManager, id: string): Promise<IncidentRecord> {
  if (!isUuid(id)) throw notFound('That incident')
  const incident = await manager.getRepository(Incident).findOne({ where: { id } })
  if (!incident) throw notFound('That incident')
  const [row]: { studio_id: string; potter_id: string }[] = await manager.query(
    `SELECT k.studio_id, r.potter_id FROM firing_requests r JOIN firings f ON f.id = $2 JOIN kilns k ON k.id = f.kiln_id WHERE r.id = $1`,
    [incident.requestId, incident.firingId],
  )
  return { incident, studioId: row.studio_id, potterId: row.potter_id }
}

export async function incidentViewerOf(
  manager: EntityManager,
  record: IncidentRecord,
  user: Pick<User, 'id' | 'role'>,
): Promise<IncidentViewer> {
  if (user.role === 'admin') return { side: 'admin' }
  const member = await manager.getRepository(StudioMember).findOne({ where: { studioId: record.studioId, userId: user.id } })
  if (member) return { side: 'studio', role: member.role }
  if (record.potterId === user.id) return { side: 'potter' }
  const hurt: unknown[] = await manager.query(
    `SELECT 1 FROM incident_pieces ip JOIN pieces p ON p.id = ip.piece_id JOIN firing_requests r ON r.id = p.request_id
     WHERE ip.incident_id = $1 AND ip.role = 'hurt' AND r.potter_id = $2 LIMIT 1`,
    [record.incident.id, user.id],
  )
  if (hurt.length) return { side: 'neighbour' }
  throw notFound('That incident')
}
