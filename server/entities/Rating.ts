import {
  Check,
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  Unique,
  UpdateDateColumn,
} from 'typeorm'
import type { FiringRequest } from './FiringRequest'

export type RatingDirection = 'potter-rates-studio' | 'studio-rates-potter'

/**
 * One side's rating of the other after a collected request: once per side per request. The potter
 * rates the studio's care of the ware, communication and results; the studio rates whether the ware
 * was as declared and on time. `stars` is the overall 1–5.
 */
@Entity({ name: 'ratings' })
@Unique('ratings_request_direction_key', ['requestId', 'direction'])
@Index('ratings_studio_idx', ['studioId', 'direction'])
@Index('ratings_potter_idx', ['potterId', 'direction'])
@Check('ratings_direction_check', `"direction" IN ('potter-rates-studio', 'studio-rates-potter')`)
@Check('ratings_stars_check', `"stars" BETWEEN 1 AND 5`)
@Check(
  'ratings_aspects_check',
  `("care" IS NULL OR "care" BETWEEN 1 AND 5) AND ("communication" IS NULL OR "communication" BETWEEN 1 AND 5) AND ("results" IS NULL OR "results" BETWEEN 1 AND 5) AND ("as_declared" IS NULL OR "as_declared" BETWEEN 1 AND 5) AND ("on_time" IS NULL OR "on_time" BETWEEN 1 AND 5)`,
)
export class Rating {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'request_id', type: 'uuid' })
  requestId: string

  @ManyToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  @Column({ type: 'text' })
  direction: RatingDirection

  @Column({ name: 'studio_id', type: 'uuid' })
  studioId: string

  @Column({ name: 'potter_id', type: 'uuid' })
  potterId: string

  @Column({ name: 'author_id', type: 'uuid' })
  authorId: string

  @Column({ type: 'smallint' })
  stars: number

  @Column({ type: 'smallint', nullable: true })
  care: number | null

  @Column({ type: 'smallint', nullable: true })
  communication: number | null

  @Column({ type: 'smallint', nullable: true })
  results: number | null

  @Column({ name: 'as_declared', type: 'smallint', nullable: true })
  asDeclared: number | null

  @Column({ name: 'on_time', type: 'smallint', nullable: true })
  onTime: number | null

  @Column({ type: 'text', default: '' })
  text: string

  /** The studio's one public reply to a potter's rating. */
  @Column({ name: 'studio_reply', type: 'text', nullable: true })
  studioReply: string | null

  @Column({ name: 'studio_reply_at', type: 'timestamptz', nullable: true })
  studioReplyAt: Date | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
