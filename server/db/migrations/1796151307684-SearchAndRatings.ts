import { MigrationInterface, QueryRunner } from 'typeorm'

export class SearchAndRatings1796151307684 implements MigrationInterface {
  name = 'SearchAndRatings1796151307684'

  public async up(queryRunner: QueryRunner): Promise<void> {
    // Written by hand: great-circle distance for the search fallback (earthdistance sits on cube).
    await queryRunner.query(`CREATE EXTENSION IF NOT EXISTS cube`)
    await queryRunner.query(`CREATE EXTENSION IF NOT EXISTS earthdistance`)
    await queryRunner.query(`
            CREATE TABLE "ratings" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "request_id" uuid NOT NULL,
                "direction" text NOT NULL,
                "studio_id" uuid NOT NULL,
                "potter_id" uuid NOT NULL,
                "author_id" uuid NOT NULL,
                "stars" smallint NOT NULL,
                "care" smallint,
                "communication" smallint,
                "results" smallint,
                "as_declared" smallint,
                "on_time" smallint,
                "text" text NOT NULL DEFAULT '',
                "studio_reply" text,
                "studio_reply_at" TIMESTAMP WITH TIME ZONE,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "ratings_request_direction_key" UNIQUE ("request_id", "direction"),
                CONSTRAINT "ratings_aspects_check" CHECK (
                    (
                        "care" IS NULL
                        OR "care" BETWEEN 1 AND 5
                    )
                    AND (
                        "communication" IS NULL
                        OR "communication" BETWEEN 1 AND 5
                    )
                    AND (
                        "results" IS NULL
                        OR "results" BETWEEN 1 AND 5
                    )
                    AND (
                        "as_declared" IS NULL
                        OR "as_declared" BETWEEN 1 AND 5
                    )
                    AND (
                        "on_time" IS NULL
                        OR "on_time" BETWEEN 1 AND 5
                    )
                ),
                CONSTRAINT "ratings_stars_check" CHECK (
                    "stars" BETWEEN 1 AND 5
                ),
                CONSTRAINT "ratings_direction_check" CHECK (
                    "direction" IN ('potter-rates-studio', 'studio-rates-potter')
                ),
                CONSTRAINT "PK_0f31425b073219379545ad68ed9" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE INDEX "ratings_potter_idx" ON "ratings" ("potter_id", "direction")
        `)
    await queryRunner.query(`
            CREATE INDEX "ratings_studio_idx" ON "ratings" ("studio_id", "direction")
        `)
    await queryRunner.query(`
            CREATE TABLE "search_documents" (
                "firing_id" uuid NOT NULL,
                "studio_id" uuid NOT NULL,
                "lat" double precision NOT NULL,
                "lng" double precision NOT NULL,
                "cone_rank" integer NOT NULL,
                "atmosphere" text NOT NULL,
                "kind" text NOT NULL,
                "drop_off_by_ts" bigint NOT NULL,
                "firing_date_ts" bigint NOT NULL,
                "space_left_l" double precision NOT NULL,
                "usable_height_mm" double precision NOT NULL,
                "shelf_shape" text NOT NULL,
                "shelf_diameter_mm" double precision,
                "shelf_width_mm" double precision,
                "shelf_depth_mm" double precision,
                "price_example_cents" integer,
                "rating_score" double precision,
                "search_text" text NOT NULL,
                "document" jsonb NOT NULL,
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_3aafcb0e2396363435d0902e5e7" PRIMARY KEY ("firing_id")
            )
        `)
    await queryRunner.query(`
            CREATE INDEX "search_documents_drop_off_idx" ON "search_documents" ("drop_off_by_ts")
        `)
    await queryRunner.query(`
            CREATE INDEX "search_documents_studio_idx" ON "search_documents" ("studio_id")
        `)
    await queryRunner.query(`
            ALTER TABLE "ratings"
            ADD CONSTRAINT "FK_3cb8f146d96bca48dcca4330f7b" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`CREATE INDEX "search_documents_earth_idx" ON "search_documents" USING gist (ll_to_earth("lat", "lng"))`)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "search_documents_earth_idx"`)
    await queryRunner.query(`
            ALTER TABLE "ratings" DROP CONSTRAINT "FK_3cb8f146d96bca48dcca4330f7b"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."search_documents_studio_idx"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."search_documents_drop_off_idx"
        `)
    await queryRunner.query(`
            DROP TABLE "search_documents"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."ratings_studio_idx"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."ratings_potter_idx"
        `)
    await queryRunner.query(`
            DROP TABLE "ratings"
        `)
  }
}
