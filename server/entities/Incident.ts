import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import {
  CRACK_EDGES,
  INCIDENT_KINDS,
  INCIDENT_PHASES,
  type CrackEdge,
  type IncidentKind,
  type IncidentPhase,
} from '../../shared/firing/incidents'
import type { Firing } from './Firing'
import type { FiringRequest } from './FiringRequest'

const list = (values: readonly string[]) => values.map((v) => `'${v}'`).join(', ')

/**
 * Something that went wrong in a firing, as the crew or the potter saw it when the kiln was opened:
 * what happened, where, what else it hurt, and the ask whose ware it was. The diagnosis is worked out
 * from these facts, the ware's own check and the firing's log whenever it is read; the phase it gave
 * when reported is kept for the studio's history.
 */
@Entity({ name: 'incidents' })
@Index('incidents_firing_idx', ['firingId', 'createdAt'])
@Index('incidents_request_idx', ['requestId'])
@Check('incidents_kind_check', `"kind" IN (${list(INCIDENT_KINDS)})`)
@Check('incidents_crack_edge_check', `"crack_edge" IS NULL OR "crack_edge" IN (${list(CRACK_EDGES)})`)
@Check('incidents_phase_check', `"phase" IS NULL OR "phase" IN (${list(INCIDENT_PHASES)})`)
@Check('incidents_side_check', `"reporter_side" IN ('potter', 'studio')`)
export class Incident {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'firing_id', type: 'uuid' })
  firingId: string

  @ManyToOne('Firing', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'firing_id' })
  firing: Firing

  /** The ask whose ware failed: the claim is raised on its potter. */
  @Column({ name: 'request_id', type: 'uuid' })
  requestId: string

  @ManyToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  @Column({ name: 'reporter_id', type: 'uuid' })
  reporterId: string

  @Column({ name: 'reporter_side', type: 'text' })
  reporterSide: 'potter' | 'studio'

  @Column({ type: 'text' })
  kind: IncidentKind

  @Column({ name: 'crack_edge', type: 'text', nullable: true })
  crackEdge: CrackEdge | null

  @Column({ type: 'boolean', default: false })
  shards: boolean

  @Column({ name: 'neighbours_hit', type: 'boolean', default: false })
  neighboursHit: boolean

  @Column({ name: 'shelf_damage', type: 'boolean', default: false })
  shelfDamage: boolean

  @Column({ name: 'element_damage', type: 'boolean', default: false })
  elementDamage: boolean

  @Column({ name: 'where_in_kiln', type: 'text', default: '' })
  whereInKiln: string

  @Column({ type: 'text', default: '' })
  note: string

  /** The likely phase as diagnosed when reported, for the studio's history by phase. */
  @Column({ type: 'text', nullable: true })
  phase: IncidentPhase | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date
}
