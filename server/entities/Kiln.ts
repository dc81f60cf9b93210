import {
  Check,
  Column,
  Index,
  CreateDateColumn,
  Entity,
  JoinColumn,
  ManyToOne,
  OneToOne,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
} from 'typeorm'
import type { Atmosphere, Cone, KilnKind } from '../../shared/firing/check'
import type { KilnFurniture } from '../../shared/firing/load'
import type { KilnPriceList } from './KilnPriceList'
import type { Studio } from './Studio'

@Entity({ name: 'kilns' })
@Index('kilns_studio_idx', ['studioId'])
@Check('kilns_kind_check', `"kind" IN ('electric', 'gas', 'wood', 'soda', 'salt', 'raku')`)
@Check('kilns_atmospheres_check', `cardinality("atmospheres") >= 1 AND "atmospheres" <@ ARRAY['oxidation', 'reduction', 'neutral']::text[]`)
@Check(
  'kilns_cone_range_check',
  `cone_rank("min_cone") IS NOT NULL AND cone_rank("max_cone") IS NOT NULL AND cone_rank("min_cone") <= cone_rank("max_cone")`,
)
@Check(
  'kilns_interior_check',
  `("interior_shape" = 'round' AND "diameter_mm" > 0 AND "width_mm" IS NULL AND "depth_mm" IS NULL) OR ("interior_shape" = 'box' AND "width_mm" > 0 AND "depth_mm" > 0 AND "diameter_mm" IS NULL)`,
)
@Check(
  'kilns_sizes_check',
  `"height_mm" > 0 AND ("usable_height_mm" IS NULL OR ("usable_height_mm" > 0 AND "usable_height_mm" <= "height_mm")) AND "max_temp_c" > 0 AND "max_ramp_c_per_hour" > 0 AND "shelf_count" >= 0 AND ("shelf_width_mm" IS NULL OR "shelf_width_mm" > 0) AND ("shelf_depth_mm" IS NULL OR "shelf_depth_mm" > 0)`,
)
@Check('kilns_shelf_load_check', `"shelf_load_kg" IS NULL OR "shelf_load_kg" > 0`)
export class Kiln {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'studio_id', type: 'uuid' })
  studioId: string

  @ManyToOne('Studio', (studio: Studio) => studio.kilns, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'studio_id' })
  studio: Studio

  @Column({ type: 'text' })
  name: string

  @Column({ type: 'text' })
  kind: KilnKind

  @Column({ type: 'text', array: true })
  atmospheres: Atmosphere[]

  @Column({ name: 'interior_shape', type: 'text' })
  interiorShape: 'round' | 'box'

  @Column({ name: 'diameter_mm', type: 'double precision', nullable: true })
  diameterMm: number | null

  @Column({ name: 'width_mm', type: 'double precision', nullable: true })
  widthMm: number | null

  @Column({ name: 'depth_mm', type: 'double precision', nullable: true })
  depthMm: number | null

  @Column({ name: 'height_mm', type: 'double precision' })
  heightMm: number

  @Column({ name: 'usable_height_mm', type: 'double precision', nullable: true })
  usableHeightMm: number | null

  @Column({ name: 'min_cone', type: 'text' })
  minCone: Cone

  @Column({ name: 'max_cone', type: 'text' })
  maxCone: Cone

  @Column({ name: 'max_temp_c', type: 'double precision' })
  maxTempC: number

  @Column({ name: 'max_ramp_c_per_hour', type: 'double precision' })
  maxRampCPerHour: number

  @Column({ name: 'preheat_hold', type: 'boolean' })
  preheatHold: boolean

  @Column({ name: 'controlled_cooling', type: 'boolean' })
  controlledCooling: boolean

  @Column({ name: 'shelf_count', type: 'integer', default: 0 })
  shelfCount: number

  /** Shelf size; for a round kiln the shelf is a circle (or two half shelves) of this diameter. */
  @Column({ name: 'shelf_width_mm', type: 'double precision', nullable: true })
  shelfWidthMm: number | null

  @Column({ name: 'shelf_depth_mm', type: 'double precision', nullable: true })
  shelfDepthMm: number | null

  /** What one shelf may carry, kg. */
  @Column({ name: 'shelf_load_kg', type: 'double precision', nullable: true })
  shelfLoadKg: number | null

  /** Half shelves, post sizes, gaps and clearances the load planner uses (shared/firing/load.ts); null for the defaults. */
  @Column({ type: 'jsonb', nullable: true })
  furniture: KilnFurniture | null

  @Column({ type: 'text', default: '' })
  notes: string

  /** A retired kiln keeps its firings' history but takes no new firings. */
  @Column({ name: 'retired_at', type: 'timestamptz', nullable: true })
  retiredAt: Date | null

  @OneToOne('KilnPriceList', (priceList: KilnPriceList) => priceList.kiln)
  priceList: KilnPriceList | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
