import { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Star ratings give way to the answers after pickup (server/entities/Review.ts). The table is generated;
 * the data moves by hand, as follows.
 *
 * - Stars become answers: 4–5 stars "yes", 3 "partly", 1–2 "no".
 * - A potter's rating: care → care in loading, results → results as logged, communication → kept
 *   told; turnaround had no star of its own and takes the overall stars; "would fire here again" is
 *   yes when the overall was 4 or 5. Any aspect left unrated takes the overall stars too.
 * - A studio's rating: ware as declared and on time from their stars; clean feet and dry ware had no
 *   star of its own and takes the overall.
 * - The words become the note. The ratings were public as soon as given, so the answers are published
 *   at the moment they were given; the window closes 21 days after the ware was picked up (or the
 *   dispute raised), else 21 days after the rating.
 * - The studio's public replies are not a thing any more: each becomes a message from the studio (its
 *   owner) in the request's thread, dated when it was written and marked as already told, so nothing
 *   written is lost and nobody is mailed again.
 *
 * Down turns answers back into stars (yes 5, partly 3, no 1; the overall is 5 for "would fire again",
 * else 2, and for a studio the lowest of its answers); the moved replies stay in the threads.
 */

export class ReviewsAfterPickup1796174002687 implements MigrationInterface {
  name = 'ReviewsAfterPickup1796174002687'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            CREATE TABLE "reviews" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "request_id" uuid NOT NULL,
                "side" text NOT NULL,
                "studio_id" uuid NOT NULL,
                "potter_id" uuid NOT NULL,
                "author_id" uuid NOT NULL,
                "loading" text,
                "results_as_logged" text,
                "turnaround" text,
                "communication" text,
                "fire_again" boolean,
                "as_declared" text,
                "clean_and_dry" text,
                "on_time" text,
                "note" text NOT NULL DEFAULT '',
                "closes_at" TIMESTAMP WITH TIME ZONE NOT NULL,
                "published_at" TIMESTAMP WITH TIME ZONE,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "reviews_request_side_key" UNIQUE ("request_id", "side"),
                CONSTRAINT "reviews_side_questions_check" CHECK (
                    (
                        "side" = 'potter'
                        AND "loading" IS NOT NULL
                        AND "results_as_logged" IS NOT NULL
                        AND "turnaround" IS NOT NULL
                        AND "communication" IS NOT NULL
                        AND "fire_again" IS NOT NULL
                        AND "as_declared" IS NULL
                        AND "clean_and_dry" IS NULL
                        AND "on_time" IS NULL
                    )
                    OR (
                        "side" = 'studio'
                        AND "as_declared" IS NOT NULL
                        AND "clean_and_dry" IS NOT NULL
                        AND "on_time" IS NOT NULL
                        AND "loading" IS NULL
                        AND "results_as_logged" IS NULL
                        AND "turnaround" IS NULL
                        AND "communication" IS NULL
                        AND "fire_again" IS NULL
                    )
                ),
                CONSTRAINT "reviews_answers_check" CHECK (
                    (
                        "loading" IS NULL
                        OR "loading" IN ('yes', 'partly', 'no')
                    )
                    AND (
                        "results_as_logged" IS NULL
                        OR "results_as_logged" IN ('yes', 'partly', 'no')
                    )
                    AND (
                        "turnaround" IS NULL
                        OR "turnaround" IN ('yes', 'partly', 'no')
                    )
                    AND (
                        "communication" IS NULL
                        OR "communication" IN ('yes', 'partly', 'no')
                    )
                    AND (
                        "as_declared" IS NULL
                        OR "as_declared" IN ('yes', 'partly', 'no')
                    )
                    AND (
                        "clean_and_dry" IS NULL
                        OR "clean_and_dry" IN ('yes', 'partly', 'no')
                    )
                    AND (
                        "on_time" IS NULL
                        OR "on_time" IN ('yes', 'partly', 'no')
                    )
                ),
                CONSTRAINT "reviews_side_check" CHECK ("side" IN ('potter', 'studio')),
                CONSTRAINT "PK_231ae565c273ee700b283f15c1d" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE INDEX "reviews_potter_idx" ON "reviews" ("potter_id", "side")
        `)
    await queryRunner.query(`
            CREATE INDEX "reviews_studio_idx" ON "reviews" ("studio_id", "side")
        `)
    await queryRunner.query(`
            ALTER TABLE "reviews"
            ADD CONSTRAINT "FK_6ea6d2328e7d32aa0b0970d8d96" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            CREATE FUNCTION pg_temp.stars_to_answer(stars smallint) RETURNS text LANGUAGE sql IMMUTABLE AS $$
                SELECT CASE WHEN stars >= 4 THEN 'yes' WHEN stars = 3 THEN 'partly' ELSE 'no' END
            $$
        `)
    await queryRunner.query(`
            INSERT INTO "reviews" (
                "request_id", "side", "studio_id", "potter_id", "author_id",
                "loading", "results_as_logged", "turnaround", "communication", "fire_again",
                "as_declared", "clean_and_dry", "on_time", "note", "closes_at", "published_at", "created_at"
            )
            SELECT r."request_id",
                   CASE r."direction" WHEN 'potter-rates-studio' THEN 'potter' ELSE 'studio' END,
                   r."studio_id", r."potter_id", r."author_id",
                   CASE WHEN r."direction" = 'potter-rates-studio' THEN pg_temp.stars_to_answer(coalesce(r."care", r."stars")) END,
                   CASE WHEN r."direction" = 'potter-rates-studio' THEN pg_temp.stars_to_answer(coalesce(r."results", r."stars")) END,
                   CASE WHEN r."direction" = 'potter-rates-studio' THEN pg_temp.stars_to_answer(r."stars") END,
                   CASE WHEN r."direction" = 'potter-rates-studio' THEN pg_temp.stars_to_answer(coalesce(r."communication", r."stars")) END,
                   CASE WHEN r."direction" = 'potter-rates-studio' THEN r."stars" >= 4 END,
                   CASE WHEN r."direction" = 'studio-rates-potter' THEN pg_temp.stars_to_answer(coalesce(r."as_declared", r."stars")) END,
                   CASE WHEN r."direction" = 'studio-rates-potter' THEN pg_temp.stars_to_answer(r."stars") END,
                   CASE WHEN r."direction" = 'studio-rates-potter' THEN pg_temp.stars_to_answer(coalesce(r."on_time", r."stars")) END,
                   r."text",
                   coalesce(
                       (SELECT min(e."at") FROM "request_events" e WHERE e."request_id" = r."request_id" AND e."to_state" IN ('collected', 'disputed')),
                       r."created_at"
                   ) + interval '21 days',
                   r."created_at",
                   r."created_at"
            FROM "ratings" r
        `)
    await queryRunner.query(`
            INSERT INTO "request_messages" ("request_id", "author_id", "side", "body", "notified_at", "created_at")
            SELECT r."request_id", m."user_id", 'studio', r."studio_reply", r."studio_reply_at", coalesce(r."studio_reply_at", r."updated_at")
            FROM "ratings" r
            JOIN "studio_members" m ON m."studio_id" = r."studio_id" AND m."role" = 'owner'
            WHERE r."studio_reply" IS NOT NULL
        `)
    await queryRunner.query(`DROP FUNCTION pg_temp.stars_to_answer(smallint)`)
    await queryRunner.query(`DROP TABLE "ratings"`)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
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
                    ("care" IS NULL OR "care" BETWEEN 1 AND 5)
                    AND ("communication" IS NULL OR "communication" BETWEEN 1 AND 5)
                    AND ("results" IS NULL OR "results" BETWEEN 1 AND 5)
                    AND ("as_declared" IS NULL OR "as_declared" BETWEEN 1 AND 5)
                    AND ("on_time" IS NULL OR "on_time" BETWEEN 1 AND 5)
                ),
                CONSTRAINT "ratings_stars_check" CHECK ("stars" BETWEEN 1 AND 5),
                CONSTRAINT "ratings_direction_check" CHECK ("direction" IN ('potter-rates-studio', 'studio-rates-potter')),
                CONSTRAINT "PK_0f31425b073219379545ad68ed9" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`CREATE INDEX "ratings_potter_idx" ON "ratings" ("potter_id", "direction")`)
    await queryRunner.query(`CREATE INDEX "ratings_studio_idx" ON "ratings" ("studio_id", "direction")`)
    await queryRunner.query(`
            ALTER TABLE "ratings"
            ADD CONSTRAINT "FK_3cb8f146d96bca48dcca4330f7b" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            CREATE FUNCTION pg_temp.answer_to_stars(answer text) RETURNS smallint LANGUAGE sql IMMUTABLE AS $$
                SELECT (CASE answer WHEN 'yes' THEN 5 WHEN 'partly' THEN 3 ELSE 1 END)::smallint
            $$
        `)
    await queryRunner.query(`
            INSERT INTO "ratings" (
                "request_id", "direction", "studio_id", "potter_id", "author_id",
                "stars", "care", "communication", "results", "as_declared", "on_time", "text", "created_at", "updated_at"
            )
            SELECT v."request_id",
                   CASE v."side" WHEN 'potter' THEN 'potter-rates-studio' ELSE 'studio-rates-potter' END,
                   v."studio_id", v."potter_id", v."author_id",
                   CASE WHEN v."side" = 'potter' THEN (CASE WHEN v."fire_again" THEN 5 ELSE 2 END)::smallint
                        ELSE least(pg_temp.answer_to_stars(v."as_declared"), pg_temp.answer_to_stars(v."clean_and_dry"), pg_temp.answer_to_stars(v."on_time")) END,
                   CASE WHEN v."side" = 'potter' THEN pg_temp.answer_to_stars(v."loading") END,
                   CASE WHEN v."side" = 'potter' THEN pg_temp.answer_to_stars(v."communication") END,
                   CASE WHEN v."side" = 'potter' THEN pg_temp.answer_to_stars(v."results_as_logged") END,
                   CASE WHEN v."side" = 'studio' THEN pg_temp.answer_to_stars(v."as_declared") END,
                   CASE WHEN v."side" = 'studio' THEN pg_temp.answer_to_stars(v."on_time") END,
                   v."note", v."created_at", v."created_at"
            FROM "reviews" v
        `)
    await queryRunner.query(`DROP FUNCTION pg_temp.answer_to_stars(text)`)
    await queryRunner.query(`
            ALTER TABLE "reviews" DROP CONSTRAINT "FK_6ea6d2328e7d32aa0b0970d8d96"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."reviews_studio_idx"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."reviews_potter_idx"
        `)
    await queryRunner.query(`
            DROP TABLE "reviews"
        `)
  }
}
