import { MigrationInterface, QueryRunner } from 'typeorm'

export class DropOffToPickup1796152667537 implements MigrationInterface {
  name = 'DropOffToPickup1796152667537'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            CREATE TABLE "check_ins" (
                "request_id" uuid NOT NULL,
                "received_pieces" jsonb NOT NULL,
                "condition_notes" text NOT NULL DEFAULT '',
                "refused" boolean NOT NULL DEFAULT false,
                "refused_reason" text,
                "quote_before" jsonb,
                "quote_after" jsonb,
                "price_confirmed_at" TIMESTAMP WITH TIME ZONE,
                "checked_in_by" uuid NOT NULL,
                "at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_3bcc78ee853dc037ae83b1cf764" PRIMARY KEY ("request_id")
            )
        `)
    await queryRunner.query(`
            CREATE TABLE "firing_logs" (
                "firing_id" uuid NOT NULL,
                "loaded_at" TIMESTAMP WITH TIME ZONE,
                "started_at" TIMESTAMP WITH TIME ZONE,
                "peak_c" double precision,
                "final_rate_c_per_hour" double precision,
                "hold_minutes" double precision,
                "off_at" TIMESTAMP WITH TIME ZONE,
                "opened_at" TIMESTAMP WITH TIME ZONE,
                "witness_cones" jsonb NOT NULL DEFAULT '[]',
                "notes" text NOT NULL DEFAULT '',
                "updated_by" uuid,
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_84a108fba50f9130a33aa653bed" PRIMARY KEY ("firing_id")
            )
        `)
    await queryRunner.query(`
            CREATE TABLE "photos" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "request_id" uuid NOT NULL,
                "kind" text NOT NULL,
                "storage_key" text NOT NULL,
                "thumb_key" text NOT NULL,
                "width" integer NOT NULL,
                "height" integer NOT NULL,
                "bytes" integer NOT NULL,
                "uploaded_by" uuid NOT NULL,
                "public_opt_in" boolean NOT NULL DEFAULT false,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "photos_kind_check" CHECK ("kind" IN ('ware', 'check-in', 'result', 'refusal')),
                CONSTRAINT "PK_5220c45b8e32d49d767b9b3d725" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE INDEX "photos_request_idx" ON "photos" ("request_id", "kind")
        `)
    await queryRunner.query(`
            CREATE TABLE "request_results" (
                "request_id" uuid NOT NULL,
                "outcomes" jsonb NOT NULL,
                "notes" text NOT NULL DEFAULT '',
                "posted_by" uuid NOT NULL,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_5021b18a841088440c74108c3c1" PRIMARY KEY ("request_id")
            )
        `)
    await queryRunner.query(`
            ALTER TABLE "check_ins"
            ADD CONSTRAINT "FK_3bcc78ee853dc037ae83b1cf764" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_logs"
            ADD CONSTRAINT "FK_84a108fba50f9130a33aa653bed" FOREIGN KEY ("firing_id") REFERENCES "firings"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "photos"
            ADD CONSTRAINT "FK_6cd38627e086335650f91a8bb74" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "request_results"
            ADD CONSTRAINT "FK_5021b18a841088440c74108c3c1" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            ALTER TABLE "request_results" DROP CONSTRAINT "FK_5021b18a841088440c74108c3c1"
        `)
    await queryRunner.query(`
            ALTER TABLE "photos" DROP CONSTRAINT "FK_6cd38627e086335650f91a8bb74"
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_logs" DROP CONSTRAINT "FK_84a108fba50f9130a33aa653bed"
        `)
    await queryRunner.query(`
            ALTER TABLE "check_ins" DROP CONSTRAINT "FK_3bcc78ee853dc037ae83b1cf764"
        `)
    await queryRunner.query(`
            DROP TABLE "request_results"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."photos_request_idx"
        `)
    await queryRunner.query(`
            DROP TABLE "photos"
        `)
    await queryRunner.query(`
            DROP TABLE "firing_logs"
        `)
    await queryRunner.query(`
            DROP TABLE "check_ins"
        `)
  }
}
