import { Column, Entity, JoinColumn, OneToOne, PrimaryColumn, UpdateDateColumn } from 'typeorm'
import type { Reading } from '../../shared/firing/readings'
import type { ConeBend } from '../../shared/firing/witness'
import type { Firing } from './Firing'

export interface WitnessCone {
  cone: string
  bend: ConeBend
  /** Where in the kiln the pack stood, e.g. "top shelf, front". */
  position?: string
}

/** The record of one firing as it ran: times, peak, hold, the curve and the witness cones. */
@Entity({ name: 'firing_logs' })
export class FiringLog {
  @PrimaryColumn({ name: 'firing_id', type: 'uuid' })
  firingId: string

  @OneToOne('Firing', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'firing_id' })
  firing: Firing

  @Column({ name: 'loaded_at', type: 'timestamptz', nullable: true })
  loadedAt: Date | null

  @Column({ name: 'started_at', type: 'timestamptz', nullable: true })
  startedAt: Date | null

  @Column({ name: 'peak_c', type: 'double precision', nullable: true })
  peakC: number | null

  /** The climb over the last 100 °C, which sets the cone the peak reaches. */
  @Column({ name: 'final_rate_c_per_hour', type: 'double precision', nullable: true })
  finalRateCPerHour: number | null

  @Column({ name: 'hold_minutes', type: 'double precision', nullable: true })
  holdMinutes: number | null

  @Column({ name: 'off_at', type: 'timestamptz', nullable: true })
  offAt: Date | null

  @Column({ name: 'opened_at', type: 'timestamptz', nullable: true })
  openedAt: Date | null

  @Column({ name: 'witness_cones', type: 'jsonb', default: [] })
  witnessCones: WitnessCone[]

  /** The logged curve: temperatures in °C at instants, in time order, typed in or read from a controller's export. */
  @Column({ type: 'jsonb', default: [] })
  readings: Reading[]

  @Column({ type: 'text', default: '' })
  notes: string

  @Column({ name: 'updated_by', type: 'uuid', nullable: true })
  updatedBy: string | null

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
