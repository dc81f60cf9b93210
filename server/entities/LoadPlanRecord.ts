import { Column, Entity, JoinColumn, OneToOne, PrimaryColumn, UpdateDateColumn } from 'typeorm'
import type { Placement } from '../../shared/firing/load'
import type { Firing } from './Firing'

/**
 * The placements the crew chose for a firing's load (everything else is planned around them, on
 * every read), and, once loading starts, the whole plan as loaded.
 */
@Entity({ name: 'firing_load_plans' })
export class LoadPlanRecord {
  @PrimaryColumn({ name: 'firing_id', type: 'uuid' })
  firingId: string

  @OneToOne('Firing', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'firing_id' })
  firing: Firing

  @Column({ type: 'jsonb', default: [] })
  placements: Placement[]

  /** Set when loading started: the placements are the load as it went into the kiln. */
  @Column({ name: 'loaded_at', type: 'timestamptz', nullable: true })
  loadedAt: Date | null

  @Column({ name: 'updated_by', type: 'uuid', nullable: true })
  updatedBy: string | null

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
