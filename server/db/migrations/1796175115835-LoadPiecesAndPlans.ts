import { randomBytes } from 'node:crypto'
import { MigrationInterface, QueryRunner } from 'typeorm'
import { newTag } from '../../../shared/firing/tags'

/**
 * Pieces as records with tags, the crew's load plans, kiln furniture, the studio's drop-off checklist,
 * photos of one piece, and layers on sale in place of litres. Generated, then trimmed of what the
 * generator cannot see (constraints written by hand earlier) and finished by hand:
 *
 * - ware already checked in becomes piece records, one per piece received, each with a fresh tag;
 * - the per-line outcomes of posted results move onto those pieces, and the line list is dropped;
 * - search documents are derived, so they are emptied here and rebuilt on the next start;
 * - price lists may price by the layer (layer_cents); going down, a layer price becomes a shelf price.
 */
export class LoadPiecesAndPlans1796175115835 implements MigrationInterface {
  name = 'LoadPiecesAndPlans1796175115835'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            ALTER TABLE "kiln_price_lists"
            ADD "layer_cents" integer
        `)
    await queryRunner.query(`
            ALTER TABLE "kiln_price_lists"
            ADD CONSTRAINT "kiln_price_lists_layer_cents_check" CHECK (
                    "layer_cents" IS NULL
                    OR "layer_cents" >= 0
                )
        `)
    await queryRunner.query(`
            ALTER TABLE "kiln_price_lists" DROP CONSTRAINT "kiln_price_lists_model_check"
        `)
    await queryRunner.query(`
            ALTER TABLE "kiln_price_lists"
            ADD CONSTRAINT "kiln_price_lists_model_check" CHECK ("model" IN ('volume', 'shelf', 'layer', 'kiln'))
        `)
    await queryRunner.query(`
            CREATE TABLE "firing_load_plans" (
                "firing_id" uuid NOT NULL,
                "placements" jsonb NOT NULL DEFAULT '[]',
                "loaded_at" TIMESTAMP WITH TIME ZONE,
                "updated_by" uuid,
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_b75d06f9560d0c014600730b9fd" PRIMARY KEY ("firing_id")
            )
        `)
    await queryRunner.query(`
            CREATE TABLE "pieces" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "tag" text NOT NULL,
                "request_id" uuid NOT NULL,
                "piece_index" integer NOT NULL,
                "copy" integer NOT NULL,
                "height_mm" double precision NOT NULL,
                "width_mm" double precision NOT NULL,
                "depth_mm" double precision NOT NULL,
                "round" boolean NOT NULL DEFAULT false,
                "weight_g" double precision,
                "checks" jsonb NOT NULL DEFAULT '[]',
                "status" text NOT NULL DEFAULT 'in-load',
                "hold_reason" text,
                "held_at" TIMESTAMP WITH TIME ZONE,
                "outcome" text,
                "outcome_notes" text NOT NULL DEFAULT '',
                "outcome_at" TIMESTAMP WITH TIME ZONE,
                "outcome_by" uuid,
                "checked_in_by" uuid NOT NULL,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "pieces_tag_check" CHECK (
                    "tag" ~ '^[023456789HKMRTWXY]{4}-[023456789HKMRTWXY]{4}$'
                ),
                CONSTRAINT "pieces_line_check" CHECK (
                    "piece_index" >= 0
                    AND "copy" >= 1
                ),
                CONSTRAINT "pieces_sizes_check" CHECK (
                    "height_mm" > 0
                    AND "width_mm" > 0
                    AND "depth_mm" > 0
                    AND (
                        "weight_g" IS NULL
                        OR "weight_g" > 0
                    )
                ),
                CONSTRAINT "pieces_outcome_check" CHECK (
                    "outcome" IS NULL
                    OR "outcome" IN (
                        'fine',
                        'cracked',
                        'dunted',
                        'blown-out',
                        'bloated',
                        'glaze-ran',
                        'stuck-to-shelf',
                        'crawled',
                        'pinholed',
                        'underfired',
                        'crazed',
                        'other'
                    )
                ),
                CONSTRAINT "pieces_hold_check" CHECK (
                    ("status" = 'held') = ("hold_reason" IS NOT NULL)
                ),
                CONSTRAINT "pieces_status_check" CHECK ("status" IN ('in-load', 'held')),
                CONSTRAINT "PK_bc4a9ebcd4cd96d03522b4ca408" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE UNIQUE INDEX "pieces_request_line_copy_key" ON "pieces" ("request_id", "piece_index", "copy")
        `)
    await queryRunner.query(`
            CREATE UNIQUE INDEX "pieces_tag_key" ON "pieces" ("tag")
        `)
    await queryRunner.query(`
            ALTER TABLE "kilns"
            ADD "furniture" jsonb
        `)
    await queryRunner.query(`
            ALTER TABLE "photos"
            ADD "piece_id" uuid
        `)
    await queryRunner.query(`
            CREATE INDEX "photos_piece_idx" ON "photos" ("piece_id")
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "drop_off_checklist" jsonb NOT NULL DEFAULT '[{"id":"bone-dry","label":"Bone dry: cool to the cheek, one even colour, no damp patches","appliesTo":"greenware"},{"id":"sound","label":"No cracks; handles, knobs and joins sound","appliesTo":"all"},{"id":"clean-foot","label":"Foot clean: glaze stops at least ¼ in (6 mm) above it","appliesTo":"glazed"},{"id":"vent-hole","label":"Closed form has a vent hole","appliesTo":"closed-form"},{"id":"cookie","label":"Runny glaze stands on a cookie or tray","appliesTo":"runny-glaze"}]'::jsonb
        `)
    // Layers on sale replace litres on sale: the load plan decides what fits.
    await queryRunner.query(`
            ALTER TABLE "firings"
            ADD "layers_on_sale" integer
        `)
    await queryRunner.query(`
            ALTER TABLE "firings"
            ADD CONSTRAINT "firings_layers_on_sale_check" CHECK (
                    "layers_on_sale" IS NULL
                    OR "layers_on_sale" >= 1
                )
        `)
    await queryRunner.query(`
            ALTER TABLE "firings" DROP CONSTRAINT "firings_capacity_check"
        `)
    await queryRunner.query(`
            ALTER TABLE "firings" DROP COLUMN "capacity_l"
        `)
    await queryRunner.query(`
            DELETE FROM "search_documents"
        `)
    await queryRunner.query(`
            ALTER TABLE "search_documents" DROP COLUMN "space_left_l"
        `)
    await queryRunner.query(`
            ALTER TABLE "search_documents"
            ADD "space_left_shelves" double precision NOT NULL
        `)
    await queryRunner.query(`
            ALTER TABLE "search_documents"
            ADD "room_tallest_mm" double precision NOT NULL
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_load_plans"
            ADD CONSTRAINT "FK_b75d06f9560d0c014600730b9fd" FOREIGN KEY ("firing_id") REFERENCES "firings"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "photos"
            ADD CONSTRAINT "FK_21bad4eebf7d21652671a6ef9b2" FOREIGN KEY ("piece_id") REFERENCES "pieces"("id") ON DELETE
            SET NULL ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "pieces"
            ADD CONSTRAINT "FK_76807006689b12328d56a5566d2" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)

    // Ware already checked in: one record per piece received, each with its own tag.
    type Received = { pieceIndex: number; received: number; measured?: { heightMm: number; widthMm: number; depthMm: number } }
    type Line = { heightMm: number; widthMm: number; depthMm: number; round?: boolean; weightG?: number }
    const checkedIn: { request_id: string; received_pieces: Received[]; checked_in_by: string; at: Date; pieces: Line[] }[] =
      await queryRunner.query(`
            SELECT c.request_id, c.received_pieces, c.checked_in_by, c.at, r.pieces
            FROM "check_ins" c JOIN "firing_requests" r ON r.id = c.request_id
            WHERE NOT c.refused
        `)
    for (const row of checkedIn) {
      for (const line of row.received_pieces) {
        const declared = row.pieces[line.pieceIndex]
        if (!declared) continue
        const size = line.measured ?? declared
        for (let copy = 1; copy <= line.received; copy++) {
          for (;;) {
            const inserted: unknown[] = await queryRunner.query(
              `INSERT INTO "pieces" ("tag", "request_id", "piece_index", "copy", "height_mm", "width_mm", "depth_mm", "round", "weight_g", "checked_in_by", "created_at")
               VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11) ON CONFLICT ("tag") DO NOTHING RETURNING "id"`,
              [
                newTag((n) => randomBytes(n)),
                row.request_id,
                line.pieceIndex,
                copy,
                size.heightMm,
                size.widthMm,
                declared.round === true ? size.widthMm : size.depthMm,
                declared.round === true,
                declared.weightG ?? null,
                row.checked_in_by,
                row.at,
              ],
            )
            if (inserted.length) break
          }
        }
      }
    }
    await queryRunner.query(`
            UPDATE "pieces" p
            SET "outcome" = o ->> 'outcome', "outcome_notes" = coalesce(o ->> 'notes', ''), "outcome_at" = rr.updated_at, "outcome_by" = rr.posted_by
            FROM "request_results" rr, jsonb_array_elements(rr.outcomes) o
            WHERE rr.request_id = p.request_id AND (o ->> 'pieceIndex')::int = p.piece_index
        `)
    await queryRunner.query(`
            ALTER TABLE "request_results" DROP COLUMN "outcomes"
        `)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            UPDATE "kiln_price_lists" SET "model" = 'shelf', "shelf_cents" = coalesce("shelf_cents", "layer_cents")
            WHERE "model" = 'layer'
        `)
    await queryRunner.query(`
            ALTER TABLE "kiln_price_lists" DROP CONSTRAINT "kiln_price_lists_model_check"
        `)
    await queryRunner.query(`
            ALTER TABLE "kiln_price_lists"
            ADD CONSTRAINT "kiln_price_lists_model_check" CHECK ("model" IN ('volume', 'shelf', 'kiln'))
        `)
    await queryRunner.query(`
            ALTER TABLE "kiln_price_lists" DROP CONSTRAINT "kiln_price_lists_layer_cents_check"
        `)
    await queryRunner.query(`
            ALTER TABLE "kiln_price_lists" DROP COLUMN "layer_cents"
        `)
    await queryRunner.query(`
            ALTER TABLE "request_results"
            ADD "outcomes" jsonb NOT NULL DEFAULT '[]'
        `)
    // Each line's outcome back from its first piece that has one.
    await queryRunner.query(`
            UPDATE "request_results" rr SET "outcomes" = coalesce((
                SELECT jsonb_agg(jsonb_build_object('pieceIndex', line.piece_index, 'outcome', line.outcome, 'notes', line.outcome_notes) ORDER BY line.piece_index)
                FROM (
                    SELECT DISTINCT ON (piece_index) piece_index, outcome, outcome_notes FROM "pieces"
                    WHERE request_id = rr.request_id AND outcome IS NOT NULL ORDER BY piece_index, copy
                ) line
            ), '[]'::jsonb)
        `)
    await queryRunner.query(`
            ALTER TABLE "pieces" DROP CONSTRAINT "FK_76807006689b12328d56a5566d2"
        `)
    await queryRunner.query(`
            ALTER TABLE "photos" DROP CONSTRAINT "FK_21bad4eebf7d21652671a6ef9b2"
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_load_plans" DROP CONSTRAINT "FK_b75d06f9560d0c014600730b9fd"
        `)
    await queryRunner.query(`
            DELETE FROM "search_documents"
        `)
    await queryRunner.query(`
            ALTER TABLE "search_documents" DROP COLUMN "room_tallest_mm"
        `)
    await queryRunner.query(`
            ALTER TABLE "search_documents" DROP COLUMN "space_left_shelves"
        `)
    await queryRunner.query(`
            ALTER TABLE "search_documents"
            ADD "space_left_l" double precision NOT NULL
        `)
    // Litres on sale again: the kiln's whole chamber.
    await queryRunner.query(`
            ALTER TABLE "firings"
            ADD "capacity_l" double precision NOT NULL DEFAULT 0
        `)
    await queryRunner.query(`
            UPDATE "firings" f SET "capacity_l" = CASE WHEN k.interior_shape = 'round'
                THEN pi() * k.diameter_mm * k.diameter_mm * k.height_mm / 4e6 ELSE k.width_mm * k.depth_mm * k.height_mm / 1e6 END
            FROM "kilns" k WHERE k.id = f.kiln_id
        `)
    await queryRunner.query(`
            ALTER TABLE "firings" ALTER COLUMN "capacity_l" DROP DEFAULT
        `)
    await queryRunner.query(`
            ALTER TABLE "firings"
            ADD CONSTRAINT "firings_capacity_check" CHECK ((capacity_l >= (0)::double precision))
        `)
    await queryRunner.query(`
            ALTER TABLE "firings" DROP CONSTRAINT "firings_layers_on_sale_check"
        `)
    await queryRunner.query(`
            ALTER TABLE "firings" DROP COLUMN "layers_on_sale"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "drop_off_checklist"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."photos_piece_idx"
        `)
    await queryRunner.query(`
            ALTER TABLE "photos" DROP COLUMN "piece_id"
        `)
    await queryRunner.query(`
            ALTER TABLE "kilns" DROP COLUMN "furniture"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."pieces_tag_key"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."pieces_request_line_copy_key"
        `)
    await queryRunner.query(`
            DROP TABLE "pieces"
        `)
    await queryRunner.query(`
            DROP TABLE "firing_load_plans"
        `)
  }
}
