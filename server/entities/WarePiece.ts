import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm'
import { PIECE_OUTCOMES, type PieceOutcome } from '../../shared/schemas/pickup'
import type { FiringRequest } from './FiringRequest'

export type PieceStatus = 'in-load' | 'held'

/** One item of the studio's drop-off checklist as the crew answered it for this piece (the label as it read then). */
export interface PieceCheck {
  id: string
  label: string
  passed: boolean
}

/**
 * One physical piece received at drop-off: its tag, the declared line it is one of, its size and
 * weight as it came in, the checklist as the crew answered it, whether it is held back (and why), and
 * how it came out. Incidents and the load plan name pieces by tag and by request, line and copy.
 */
@Entity({ name: 'pieces' })
@Index('pieces_tag_key', ['tag'], { unique: true })
@Index('pieces_request_line_copy_key', ['requestId', 'pieceIndex', 'copy'], { unique: true })
@Check('pieces_status_check', `"status" IN ('in-load', 'held')`)
@Check('pieces_hold_check', `("status" = 'held') = ("hold_reason" IS NOT NULL)`)
@Check('pieces_outcome_check', `"outcome" IS NULL OR "outcome" IN (${PIECE_OUTCOMES.map((o) => `'${o}'`).join(', ')})`)
@Check('pieces_sizes_check', `"height_mm" > 0 AND "width_mm" > 0 AND "depth_mm" > 0 AND ("weight_g" IS NULL OR "weight_g" > 0)`)
@Check('pieces_line_check', `"piece_index" >= 0 AND "copy" >= 1`)
@Check('pieces_tag_check', `"tag" ~ '^[023456789HKMRTWXY]{4}-[023456789HKMRTWXY]{4}$'`)
export class WarePiece {
  @PrimaryGeneratedColumn('uuid')
  id: string

  /** Printed on the label and read aloud: shared/firing/tags.ts. */
  @Column({ type: 'text' })
  tag: string

  @Column({ name: 'request_id', type: 'uuid' })
  requestId: string

  @ManyToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  /** The declared line (the request's pieces[pieceIndex]) this piece is one of. */
  @Column({ name: 'piece_index', type: 'integer' })
  pieceIndex: number

  /** Which one of that line: 1 to its quantity. */
  @Column({ type: 'integer' })
  copy: number

  @Column({ name: 'height_mm', type: 'double precision' })
  heightMm: number

  /** The diameter when round. */
  @Column({ name: 'width_mm', type: 'double precision' })
  widthMm: number

  @Column({ name: 'depth_mm', type: 'double precision' })
  depthMm: number

  @Column({ type: 'boolean', default: false })
  round: boolean

  @Column({ name: 'weight_g', type: 'double precision', nullable: true })
  weightG: number | null

  /** The drop-off checklist as answered; empty when the piece was counted in without it. */
  @Column({ type: 'jsonb', default: [] })
  checks: PieceCheck[]

  @Column({ type: 'text', default: 'in-load' })
  status: PieceStatus

  @Column({ name: 'hold_reason', type: 'text', nullable: true })
  holdReason: string | null

  @Column({ name: 'held_at', type: 'timestamptz', nullable: true })
  heldAt: Date | null

  @Column({ type: 'text', nullable: true })
  outcome: PieceOutcome | null

  @Column({ name: 'outcome_notes', type: 'text', default: '' })
  outcomeNotes: string

  @Column({ name: 'outcome_at', type: 'timestamptz', nullable: true })
  outcomeAt: Date | null

  @Column({ name: 'outcome_by', type: 'uuid', nullable: true })
  outcomeBy: string | null

  @Column({ name: 'checked_in_by', type: 'uuid' })
  checkedInBy: string

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
