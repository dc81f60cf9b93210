import { Column, CreateDateColumn, Entity, JoinColumn, OneToOne, PrimaryColumn } from 'typeorm'
import type { FiringRequest } from './FiringRequest'
import type { Quote } from '../../shared/firing/quote'

export interface ReceivedPiece {
  pieceIndex: number
  declared: number
  received: number
  /** Of those received, how many were held back at drop-off. */
  held?: number
  /** Measured size where it differs from the declaration (mm). */
  measured?: { heightMm: number; widthMm: number; depthMm: number }
}

/** What the studio recorded when the ware changed hands at drop-off (or refused it at the door). */
@Entity({ name: 'check_ins' })
export class CheckIn {
  @PrimaryColumn({ name: 'request_id', type: 'uuid' })
  requestId: string

  @OneToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  @Column({ name: 'received_pieces', type: 'jsonb' })
  receivedPieces: ReceivedPiece[]

  /** Cracks, chips or anything else already there when the ware came in. */
  @Column({ name: 'condition_notes', type: 'text', default: '' })
  conditionNotes: string

  @Column({ type: 'boolean', default: false })
  refused: boolean

  @Column({ name: 'refused_reason', type: 'text', nullable: true })
  refusedReason: string | null

  /** The quote before check-in, and after it when measured sizes or counts changed it. */
  @Column({ name: 'quote_before', type: 'jsonb', nullable: true })
  quoteBefore: Quote | null

  @Column({ name: 'quote_after', type: 'jsonb', nullable: true })
  quoteAfter: Quote | null

  /** Set when the potter confirms a changed price (before the firing). */
  @Column({ name: 'price_confirmed_at', type: 'timestamptz', nullable: true })
  priceConfirmedAt: Date | null

  @Column({ name: 'checked_in_by', type: 'uuid' })
  checkedInBy: string

  @CreateDateColumn({ type: 'timestamptz' })
  at: Date
}
