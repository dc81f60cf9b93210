import { Check, Column, Entity, Index, JoinColumn, ManyToOne, PrimaryColumn } from 'typeorm'
import type { Incident } from './Incident'
import type { WarePiece } from './WarePiece'

/** A piece named in an incident: one that failed, or another potter's piece it hurt. */
@Entity({ name: 'incident_pieces' })
@Index('incident_pieces_piece_idx', ['pieceId'])
@Check('incident_pieces_role_check', `"role" IN ('failed', 'hurt')`)
export class IncidentPiece {
  @PrimaryColumn({ name: 'incident_id', type: 'uuid' })
  incidentId: string

  @ManyToOne('Incident', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'incident_id' })
  incident: Incident

  @PrimaryColumn({ name: 'piece_id', type: 'uuid' })
  pieceId: string

  @ManyToOne('WarePiece', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'piece_id' })
  piece: WarePiece

  @Column({ type: 'text' })
  role: 'failed' | 'hurt'
}
