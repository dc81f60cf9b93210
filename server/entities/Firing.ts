import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm'
import { FIRING_KINDS, type Atmosphere, type Cone, type FiringKind } from '../../shared/firing/check'
import { COOLING_PROFILES, type CoolingProfile, type Segment } from '../../shared/firing/schedule'
import { FIRING_STATUSES, type FiringStatus } from '../../shared/workflow/firing-status'
import type { Kiln } from './Kiln'

@Entity({ name: 'firings' })
@Check('firings_kind_check', `"kind" IN (${FIRING_KINDS.map((k) => `'${k}'`).join(', ')})`)
@Check('firings_cooling_check', `"cooling" IN (${COOLING_PROFILES.map((c) => `'${c}'`).join(', ')})`)
@Check('firings_atmosphere_check', `"atmosphere" IN ('oxidation', 'reduction', 'neutral')`)
@Check('firings_cone_check', `cone_rank("cone") IS NOT NULL`)
@Check('firings_status_check', `"status" IN (${FIRING_STATUSES.map((s) => `'${s}'`).join(', ')})`)
@Check('firings_dates_check', `"drop_off_by" <= "firing_date" AND "firing_date" <= "ready_by"`)
@Check('firings_layers_on_sale_check', `"layers_on_sale" IS NULL OR "layers_on_sale" >= 1`)
@Index('firings_kiln_date_idx', ['kilnId', 'firingDate'])
@Index('firings_upcoming_idx', ['firingDate'], { where: `"status" NOT IN ('cancelled', 'unloaded')` })
export class Firing {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'kiln_id', type: 'uuid' })
  kilnId: string

  @ManyToOne('Kiln', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'kiln_id' })
  kiln: Kiln

  @Column({ type: 'text' })
  kind: FiringKind

  @Column({ type: 'text' })
  cone: Cone

  @Column({ type: 'text' })
  atmosphere: Atmosphere

  @Column({ name: 'slow_cool', type: 'boolean', default: false })
  slowCool: boolean

  /** How a glaze firing cools from its peak. */
  @Column({ type: 'text', default: 'natural' })
  cooling: CoolingProfile

  @Column({ name: 'drop_off_by', type: 'timestamptz' })
  dropOffBy: Date

  @Column({ name: 'firing_date', type: 'timestamptz' })
  firingDate: Date

  @Column({ name: 'ready_by', type: 'timestamptz' })
  readyBy: Date

  /** Layers of the kiln on sale in this firing; every layer its shelves make when null. The load plan decides what fits. */
  @Column({ name: 'layers_on_sale', type: 'integer', nullable: true })
  layersOnSale: number | null

  @Column({ type: 'text', default: 'open' })
  status: FiringStatus

  /** The schedule the studio posts for this firing, segments as planSchedule gives them. */
  @Column({ type: 'jsonb', nullable: true })
  schedule: Segment[] | null

  @Column({ type: 'text', default: '' })
  notes: string

  /** Firings created together by one repeat share a series. */
  @Column({ name: 'series_id', type: 'uuid', nullable: true })
  seriesId: string | null

  @Column({ name: 'cancelled_reason', type: 'text', nullable: true })
  cancelledReason: string | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
