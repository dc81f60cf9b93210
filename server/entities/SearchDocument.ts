import { Column, Entity, Index, PrimaryColumn, UpdateDateColumn } from 'typeorm'
import type { FiringDocument } from '../../search/public'

/**
 * The search document of one open upcoming firing, kept in PostgreSQL beside the engine's copy. It is
 * derived (rebuilt from firings, kilns and studios at any time) and is what /api/search answers from
 * when the engine is unreachable.
 */
@Entity({ name: 'search_documents' })
@Index('search_documents_studio_idx', ['studioId'])
@Index('search_documents_drop_off_idx', ['dropOffByTs'])
// A GiST index on ll_to_earth(lat, lng), written by hand in the migration (TypeORM cannot express it).
@Index('search_documents_earth_idx', { synchronize: false })
export class SearchDocument {
  @PrimaryColumn({ name: 'firing_id', type: 'uuid' })
  firingId: string

  @Column({ name: 'studio_id', type: 'uuid' })
  studioId: string

  @Column({ type: 'double precision' })
  lat: number

  @Column({ type: 'double precision' })
  lng: number

  @Column({ name: 'cone_rank', type: 'integer' })
  coneRank: number

  @Column({ type: 'text' })
  atmosphere: string

  @Column({ type: 'text' })
  kind: string

  /** Facet values kept as plain columns, so counting them never opens the document. */
  @Column({ type: 'text' })
  cone: string

  @Column({ name: 'kiln_kind', type: 'text' })
  kilnKind: string

  @Column({ name: 'drop_off_by_ts', type: 'bigint', transformer: { to: (v: number) => v, from: (v: string) => Number(v) } })
  dropOffByTs: number

  @Column({ name: 'firing_date_ts', type: 'bigint', transformer: { to: (v: number) => v, from: (v: string) => Number(v) } })
  firingDateTs: number

  /** Shelves the load plan has left for short ware (shared/firing/load.ts loadRoom). */
  @Column({ name: 'space_left_shelves', type: 'double precision' })
  spaceLeftShelves: number

  /** The tallest piece the load plan can still take. */
  @Column({ name: 'room_tallest_mm', type: 'double precision' })
  roomTallestMm: number

  @Column({ name: 'usable_height_mm', type: 'double precision' })
  usableHeightMm: number

  @Column({ name: 'shelf_shape', type: 'text' })
  shelfShape: 'round' | 'box'

  @Column({ name: 'shelf_diameter_mm', type: 'double precision', nullable: true })
  shelfDiameterMm: number | null

  @Column({ name: 'shelf_width_mm', type: 'double precision', nullable: true })
  shelfWidthMm: number | null

  @Column({ name: 'shelf_depth_mm', type: 'double precision', nullable: true })
  shelfDepthMm: number | null

  @Column({ name: 'price_example_cents', type: 'integer', nullable: true })
  priceExampleCents: number | null

  @Column({ name: 'rating_score', type: 'double precision', nullable: true })
  ratingScore: number | null

  /** Words the text search looks in: studio, town, kiln, notes. */
  @Column({ name: 'search_text', type: 'text' })
  searchText: string

  /** The whole document as the engine holds it. */
  @Column({ type: 'jsonb' })
  document: FiringDocument

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
