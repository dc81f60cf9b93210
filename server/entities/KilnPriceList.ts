import { Check, Column, Entity, JoinColumn, OneToOne, PrimaryColumn, UpdateDateColumn } from 'typeorm'
import type { PricingModel } from '../../shared/firing/quote'
import type { Kiln } from './Kiln'

/** The price list of one kiln: the `PriceList` of shared/firing/quote.ts, one column per field. */
@Entity({ name: 'kiln_price_lists' })
@Check('kiln_price_lists_model_check', `"model" IN ('volume', 'shelf', 'layer', 'kiln')`)
@Check(
  'kiln_price_lists_amounts_check',
  `coalesce("cents_per_cubic_inch", 0) >= 0 AND coalesce("cents_per_litre", 0) >= 0 AND coalesce("shelf_cents", 0) >= 0 AND coalesce("kiln_cents", 0) >= 0 AND coalesce("minimum_per_piece_cents", 0) >= 0 AND coalesce("deposit_fixed_cents", 0) >= 0 AND coalesce("deposit_percent", 0) BETWEEN 0 AND 100 AND ("shelf_step" IS NULL OR "shelf_step" > 0 AND "shelf_step" <= 1)`,
)
@Check('kiln_price_lists_layer_cents_check', `"layer_cents" IS NULL OR "layer_cents" >= 0`)
@Check('kiln_price_lists_deposit_check', `("deposit_percent" IS NULL) <> ("deposit_fixed_cents" IS NULL)`)
export class KilnPriceList {
  @PrimaryColumn({ name: 'kiln_id', type: 'uuid' })
  kilnId: string

  @OneToOne('Kiln', (kiln: Kiln) => kiln.priceList, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'kiln_id' })
  kiln: Kiln

  @Column({ type: 'char', length: 3 })
  currency: string

  @Column({ type: 'text' })
  model: PricingModel

  @Column({ name: 'cents_per_cubic_inch', type: 'double precision', nullable: true })
  centsPerCubicInch: number | null

  @Column({ name: 'cents_per_litre', type: 'double precision', nullable: true })
  centsPerLitre: number | null

  @Column({ name: 'shelf_cents', type: 'integer', nullable: true })
  shelfCents: number | null

  @Column({ name: 'shelf_step', type: 'double precision', nullable: true })
  shelfStep: number | null

  @Column({ name: 'layer_cents', type: 'integer', nullable: true })
  layerCents: number | null

  @Column({ name: 'kiln_cents', type: 'integer', nullable: true })
  kilnCents: number | null

  @Column({ name: 'minimum_per_piece_cents', type: 'integer', nullable: true })
  minimumPerPieceCents: number | null

  @Column({ name: 'surcharge_reduction_percent', type: 'double precision', nullable: true })
  surchargeReductionPercent: number | null

  @Column({ name: 'surcharge_slow_cool_percent', type: 'double precision', nullable: true })
  surchargeSlowCoolPercent: number | null

  @Column({ name: 'surcharge_preheat_percent', type: 'double precision', nullable: true })
  surchargePreheatPercent: number | null

  @Column({ name: 'deposit_percent', type: 'double precision', nullable: true })
  depositPercent: number | null

  @Column({ name: 'deposit_fixed_cents', type: 'integer', nullable: true })
  depositFixedCents: number | null

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
