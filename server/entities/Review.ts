import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, Unique } from 'typeorm'
import type { Answer, ReviewSide } from '../../shared/reviews'
import type { FiringRequest } from './FiringRequest'

/**
 * One side's answers after pickup, once per side per request and final once given: the potter answers
 * about the studio (care in loading, results as logged, turnaround, keeping them told, whether they
 * would fire there again), the studio about the potter (ware as declared, clean feet and dry ware, on
 * time). Hidden from the other side and the public until `publishedAt`: set when both sides have
 * answered, or at `closesAt` by the queued publish job.
 */
@Entity({ name: 'reviews' })
@Unique('reviews_request_side_key', ['requestId', 'side'])
@Index('reviews_studio_idx', ['studioId', 'side'])
@Index('reviews_potter_idx', ['potterId', 'side'])
@Check('reviews_side_check', `"side" IN ('potter', 'studio')`)
@Check(
  'reviews_answers_check',
  `("loading" IS NULL OR "loading" IN ('yes', 'partly', 'no')) AND ("results_as_logged" IS NULL OR "results_as_logged" IN ('yes', 'partly', 'no')) AND ("turnaround" IS NULL OR "turnaround" IN ('yes', 'partly', 'no')) AND ("communication" IS NULL OR "communication" IN ('yes', 'partly', 'no')) AND ("as_declared" IS NULL OR "as_declared" IN ('yes', 'partly', 'no')) AND ("clean_and_dry" IS NULL OR "clean_and_dry" IN ('yes', 'partly', 'no')) AND ("on_time" IS NULL OR "on_time" IN ('yes', 'partly', 'no'))`,
)
@Check(
  'reviews_side_questions_check',
  `("side" = 'potter' AND "loading" IS NOT NULL AND "results_as_logged" IS NOT NULL AND "turnaround" IS NOT NULL AND "communication" IS NOT NULL AND "fire_again" IS NOT NULL AND "as_declared" IS NULL AND "clean_and_dry" IS NULL AND "on_time" IS NULL) OR ("side" = 'studio' AND "as_declared" IS NOT NULL AND "clean_and_dry" IS NOT NULL AND "on_time" IS NOT NULL AND "loading" IS NULL AND "results_as_logged" IS NULL AND "turnaround" IS NULL AND "communication" IS NULL AND "fire_again" IS NULL)`,
)
export class Review {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'request_id', type: 'uuid' })
  requestId: string

  @ManyToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  /** Who answered: the potter (about the studio) or the studio (about the potter). */
  @Column({ type: 'text' })
  side: ReviewSide

  @Column({ name: 'studio_id', type: 'uuid' })
  studioId: string

  @Column({ name: 'potter_id', type: 'uuid' })
  potterId: string

  @Column({ name: 'author_id', type: 'uuid' })
  authorId: string

  @Column({ type: 'text', nullable: true })
  loading: Answer | null

  @Column({ name: 'results_as_logged', type: 'text', nullable: true })
  resultsAsLogged: Answer | null

  @Column({ type: 'text', nullable: true })
  turnaround: Answer | null

  @Column({ type: 'text', nullable: true })
  communication: Answer | null

  @Column({ name: 'fire_again', type: 'boolean', nullable: true })
  fireAgain: boolean | null

  @Column({ name: 'as_declared', type: 'text', nullable: true })
  asDeclared: Answer | null

  @Column({ name: 'clean_and_dry', type: 'text', nullable: true })
  cleanAndDry: Answer | null

  @Column({ name: 'on_time', type: 'text', nullable: true })
  onTime: Answer | null

  @Column({ type: 'text', default: '' })
  note: string

  /** When the window closes: both sides' answers are published then, whoever has answered. */
  @Column({ name: 'closes_at', type: 'timestamptz' })
  closesAt: Date

  @Column({ name: 'published_at', type: 'timestamptz', nullable: true })
  publishedAt: Date | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date
}
