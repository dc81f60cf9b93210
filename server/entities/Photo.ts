import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import type { FiringRequest } from './FiringRequest'
import type { Incident } from './Incident'
import type { WarePiece } from './WarePiece'

export type PhotoKind = 'ware' | 'check-in' | 'result' | 'refusal' | 'incident'

/**
 * A photo of a request's ware, stored re-encoded and without metadata under a random name. The
 * potter may let result photos show on the studio's public page.
 */
@Entity({ name: 'photos' })
@Index('photos_request_idx', ['requestId', 'kind'])
@Index('photos_piece_idx', ['pieceId'])
@Index('photos_incident_idx', ['incidentId'])
@Check('photos_kind_check', `"kind" IN ('ware', 'check-in', 'result', 'refusal', 'incident')`)
@Check('photos_incident_check', `("kind" = 'incident') = ("incident_id" IS NOT NULL)`)
export class Photo {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'request_id', type: 'uuid' })
  requestId: string

  @ManyToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  @Column({ type: 'text' })
  kind: PhotoKind

  /** The one piece the photo shows (a held-back piece, a piece's result), when it shows one. */
  @Column({ name: 'piece_id', type: 'uuid', nullable: true })
  pieceId: string | null

  @ManyToOne('WarePiece', { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'piece_id' })
  piece: WarePiece | null

  /** The incident an incident photo shows; its request is the ask whose ware failed. */
  @Column({ name: 'incident_id', type: 'uuid', nullable: true })
  incidentId: string | null

  @ManyToOne('Incident', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'incident_id' })
  incident: Incident | null

  @Column({ name: 'storage_key', type: 'text' })
  storageKey: string

  @Column({ name: 'thumb_key', type: 'text' })
  thumbKey: string

  @Column({ type: 'integer' })
  width: number

  @Column({ type: 'integer' })
  height: number

  @Column({ type: 'integer' })
  bytes: number

  @Column({ name: 'uploaded_by', type: 'uuid' })
  uploadedBy: string

  @Column({ name: 'public_opt_in', type: 'boolean', default: false })
  publicOptIn: boolean

  /** Taken in, but still being re-encoded by the queue (large images); not served until it is done. */
  @Column({ type: 'boolean', default: false })
  processing: boolean

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date
}
