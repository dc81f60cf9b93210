import { MigrationInterface, QueryRunner } from 'typeorm'

export class StudiosKilnsFirings1796150510924 implements MigrationInterface {
  name = 'StudiosKilnsFirings1796150510924'

  public async up(queryRunner: QueryRunner): Promise<void> {
    // Written by hand: a cone's place in the series (022 coolest … 14 hottest), so the database itself
    // can refuse a reversed cone range. Same order as CONES in shared/firing/cones.ts.
    await queryRunner.query(`
            CREATE FUNCTION cone_rank(cone text) RETURNS integer
            LANGUAGE sql IMMUTABLE STRICT PARALLEL SAFE
            AS $$ SELECT array_position(ARRAY['022','021','020','019','018','017','016','015','014','013','012','011','010','09','08','07','06','05','04','03','02','01','1','2','3','4','5','6','7','8','9','10','11','12','13','14']::text[], cone) - 1 $$
        `)
    await queryRunner.query(`
            CREATE TABLE "firings" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "kiln_id" uuid NOT NULL,
                "kind" text NOT NULL,
                "cone" text NOT NULL,
                "atmosphere" text NOT NULL,
                "slow_cool" boolean NOT NULL DEFAULT false,
                "drop_off_by" TIMESTAMP WITH TIME ZONE NOT NULL,
                "firing_date" TIMESTAMP WITH TIME ZONE NOT NULL,
                "ready_by" TIMESTAMP WITH TIME ZONE NOT NULL,
                "capacity_l" double precision NOT NULL,
                "status" text NOT NULL DEFAULT 'open',
                "schedule" jsonb,
                "notes" text NOT NULL DEFAULT '',
                "series_id" uuid,
                "cancelled_reason" text,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "firings_capacity_check" CHECK ("capacity_l" >= 0),
                CONSTRAINT "firings_dates_check" CHECK (
                    "drop_off_by" <= "firing_date"
                    AND "firing_date" <= "ready_by"
                ),
                CONSTRAINT "firings_status_check" CHECK (
                    "status" IN (
                        'open',
                        'full',
                        'closed',
                        'loading',
                        'firing',
                        'cooling',
                        'unloaded',
                        'cancelled'
                    )
                ),
                CONSTRAINT "firings_cone_check" CHECK (cone_rank("cone") IS NOT NULL),
                CONSTRAINT "firings_atmosphere_check" CHECK (
                    "atmosphere" IN ('oxidation', 'reduction', 'neutral')
                ),
                CONSTRAINT "firings_kind_check" CHECK ("kind" IN ('bisque', 'glaze', 'single')),
                CONSTRAINT "PK_d105d1bb43d41b02ad905650581" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE INDEX "firings_kiln_date_idx" ON "firings" ("kiln_id", "firing_date")
        `)
    await queryRunner.query(`
            CREATE TABLE "kilns" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "studio_id" uuid NOT NULL,
                "name" text NOT NULL,
                "kind" text NOT NULL,
                "atmospheres" text array NOT NULL,
                "interior_shape" text NOT NULL,
                "diameter_mm" double precision,
                "width_mm" double precision,
                "depth_mm" double precision,
                "height_mm" double precision NOT NULL,
                "usable_height_mm" double precision,
                "min_cone" text NOT NULL,
                "max_cone" text NOT NULL,
                "max_temp_c" double precision NOT NULL,
                "max_ramp_c_per_hour" double precision NOT NULL,
                "preheat_hold" boolean NOT NULL,
                "controlled_cooling" boolean NOT NULL,
                "shelf_count" integer NOT NULL DEFAULT '0',
                "shelf_width_mm" double precision,
                "shelf_depth_mm" double precision,
                "notes" text NOT NULL DEFAULT '',
                "retired_at" TIMESTAMP WITH TIME ZONE,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "kilns_sizes_check" CHECK (
                    "height_mm" > 0
                    AND (
                        "usable_height_mm" IS NULL
                        OR (
                            "usable_height_mm" > 0
                            AND "usable_height_mm" <= "height_mm"
                        )
                    )
                    AND "max_temp_c" > 0
                    AND "max_ramp_c_per_hour" > 0
                    AND "shelf_count" >= 0
                    AND (
                        "shelf_width_mm" IS NULL
                        OR "shelf_width_mm" > 0
                    )
                    AND (
                        "shelf_depth_mm" IS NULL
                        OR "shelf_depth_mm" > 0
                    )
                ),
                CONSTRAINT "kilns_interior_check" CHECK (
                    (
                        "interior_shape" = 'round'
                        AND "diameter_mm" > 0
                        AND "width_mm" IS NULL
                        AND "depth_mm" IS NULL
                    )
                    OR (
                        "interior_shape" = 'box'
                        AND "width_mm" > 0
                        AND "depth_mm" > 0
                        AND "diameter_mm" IS NULL
                    )
                ),
                CONSTRAINT "kilns_cone_range_check" CHECK (
                    cone_rank("min_cone") IS NOT NULL
                    AND cone_rank("max_cone") IS NOT NULL
                    AND cone_rank("min_cone") <= cone_rank("max_cone")
                ),
                CONSTRAINT "kilns_atmospheres_check" CHECK (
                    cardinality("atmospheres") >= 1
                    AND "atmospheres" <@ ARRAY ['oxidation', 'reduction', 'neutral']::text []
                ),
                CONSTRAINT "kilns_kind_check" CHECK (
                    "kind" IN (
                        'electric',
                        'gas',
                        'wood',
                        'soda',
                        'salt',
                        'raku'
                    )
                ),
                CONSTRAINT "PK_0e0f17d37212baa88e3f6c9f0a8" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE TABLE "kiln_price_lists" (
                "kiln_id" uuid NOT NULL,
                "currency" character(3) NOT NULL,
                "model" text NOT NULL,
                "cents_per_cubic_inch" double precision,
                "cents_per_litre" double precision,
                "shelf_cents" integer,
                "shelf_step" double precision,
                "kiln_cents" integer,
                "minimum_per_piece_cents" integer,
                "surcharge_reduction_percent" double precision,
                "surcharge_slow_cool_percent" double precision,
                "surcharge_preheat_percent" double precision,
                "deposit_percent" double precision,
                "deposit_fixed_cents" integer,
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "kiln_price_lists_deposit_check" CHECK (
                    ("deposit_percent" IS NULL) <> ("deposit_fixed_cents" IS NULL)
                ),
                CONSTRAINT "kiln_price_lists_amounts_check" CHECK (
                    coalesce("cents_per_cubic_inch", 0) >= 0
                    AND coalesce("cents_per_litre", 0) >= 0
                    AND coalesce("shelf_cents", 0) >= 0
                    AND coalesce("kiln_cents", 0) >= 0
                    AND coalesce("minimum_per_piece_cents", 0) >= 0
                    AND coalesce("deposit_fixed_cents", 0) >= 0
                    AND coalesce("deposit_percent", 0) BETWEEN 0 AND 100
                    AND (
                        "shelf_step" IS NULL
                        OR "shelf_step" > 0
                        AND "shelf_step" <= 1
                    )
                ),
                CONSTRAINT "kiln_price_lists_model_check" CHECK ("model" IN ('volume', 'shelf', 'kiln')),
                CONSTRAINT "PK_70d2e0186ae20363a09c47e10bd" PRIMARY KEY ("kiln_id")
            )
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "description" text NOT NULL DEFAULT ''
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "address_line" text
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "postal_code" text
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "city" text NOT NULL DEFAULT ''
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "region" text NOT NULL DEFAULT ''
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "country" text NOT NULL DEFAULT 'US'
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "lat" double precision NOT NULL
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "lng" double precision NOT NULL
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "timezone" text NOT NULL
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "currency" character(3) NOT NULL DEFAULT 'USD'
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "drop_off_hours" text NOT NULL DEFAULT ''
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "policies" jsonb NOT NULL
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "policies_version" integer NOT NULL DEFAULT '1'
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "published" boolean NOT NULL DEFAULT false
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD "verified_at" TIMESTAMP WITH TIME ZONE
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD CONSTRAINT "studios_currency_check" CHECK ("currency" ~ '^[A-Z]{3}$')
        `)
    await queryRunner.query(`
            ALTER TABLE "studios"
            ADD CONSTRAINT "studios_position_check" CHECK (
                    "lat" BETWEEN -90 AND 90
                    AND "lng" BETWEEN -180 AND 180
                )
        `)
    await queryRunner.query(`
            ALTER TABLE "firings"
            ADD CONSTRAINT "FK_8101a5e732c14296851fd7ab166" FOREIGN KEY ("kiln_id") REFERENCES "kilns"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "kilns"
            ADD CONSTRAINT "FK_200b874ef6ebc3ceb96ac821dfe" FOREIGN KEY ("studio_id") REFERENCES "studios"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "kiln_price_lists"
            ADD CONSTRAINT "FK_70d2e0186ae20363a09c47e10bd" FOREIGN KEY ("kiln_id") REFERENCES "kilns"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(
      `CREATE INDEX "firings_upcoming_idx" ON "firings" ("firing_date") WHERE "status" NOT IN ('cancelled', 'unloaded')`,
    )
    await queryRunner.query(`CREATE INDEX "kilns_studio_idx" ON "kilns" ("studio_id")`)
    await queryRunner.query(`CREATE INDEX "studio_members_user_idx" ON "studio_members" ("user_id")`)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "studio_members_user_idx"`)
    await queryRunner.query(`DROP INDEX "kilns_studio_idx"`)
    await queryRunner.query(`DROP INDEX "firings_upcoming_idx"`)
    await queryRunner.query(`
            ALTER TABLE "kiln_price_lists" DROP CONSTRAINT "FK_70d2e0186ae20363a09c47e10bd"
        `)
    await queryRunner.query(`
            ALTER TABLE "kilns" DROP CONSTRAINT "FK_200b874ef6ebc3ceb96ac821dfe"
        `)
    await queryRunner.query(`
            ALTER TABLE "firings" DROP CONSTRAINT "FK_8101a5e732c14296851fd7ab166"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP CONSTRAINT "studios_position_check"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP CONSTRAINT "studios_currency_check"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "verified_at"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "published"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "policies_version"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "policies"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "drop_off_hours"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "currency"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "timezone"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "lng"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "lat"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "country"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "region"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "city"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "postal_code"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "address_line"
        `)
    await queryRunner.query(`
            ALTER TABLE "studios" DROP COLUMN "description"
        `)
    await queryRunner.query(`
            DROP TABLE "kiln_price_lists"
        `)
    await queryRunner.query(`
            DROP TABLE "kilns"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."firings_kiln_date_idx"
        `)
    await queryRunner.query(`
            DROP TABLE "firings"
        `)
    await queryRunner.query(`DROP FUNCTION cone_rank(text)`)
  }
}
