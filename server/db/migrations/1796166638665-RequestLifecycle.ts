import { MigrationInterface, QueryRunner } from 'typeorm'

export class RequestLifecycle1796166638665 implements MigrationInterface {
  name = 'RequestLifecycle1796166638665'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            CREATE TABLE "firing_events" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "firing_id" uuid NOT NULL,
                "actor_id" uuid,
                "from_status" text NOT NULL,
                "to_status" text NOT NULL,
                "reason" text NOT NULL DEFAULT '',
                "effects" jsonb NOT NULL DEFAULT '{"requests":[],"jobKeys":[],"mailIds":[],"counterRefundIds":[]}',
                "undone_at" TIMESTAMP WITH TIME ZONE,
                "at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_8a81bc17f167a66be3f170ae59b" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE INDEX "firing_events_firing_idx" ON "firing_events" ("firing_id", "at")
        `)
    await queryRunner.query(`
            CREATE TABLE "notices" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "user_id" uuid NOT NULL,
                "kind" text NOT NULL,
                "title" text NOT NULL,
                "body" text NOT NULL DEFAULT '',
                "path" text NOT NULL,
                "request_id" uuid,
                "firing_id" uuid,
                "firing_event_id" uuid,
                "read_at" TIMESTAMP WITH TIME ZONE,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_3eb18c29da25d6935fcbe584237" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE INDEX "notices_user_idx" ON "notices" ("user_id", "created_at")
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_requests"
            ADD "standing_quote" jsonb
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_requests"
            ADD "pending_quote" jsonb
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_requests"
            ADD "deposit_asked_cents" integer
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_events"
            ADD CONSTRAINT "FK_d8d3dfe44915e3665903d99eaa8" FOREIGN KEY ("firing_id") REFERENCES "firings"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "notices"
            ADD CONSTRAINT "FK_b63e8dcd3d13a55e8099bfee902" FOREIGN KEY ("user_id") REFERENCES "users"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
      CREATE TABLE "counter_refunds" (
        "id" uuid NOT NULL DEFAULT gen_random_uuid(),
        "request_id" uuid NOT NULL,
        "amount_cents" integer NOT NULL,
        "currency" character(3) NOT NULL,
        "reason" text NOT NULL DEFAULT '',
        "paid_at" TIMESTAMP WITH TIME ZONE,
        "paid_by" uuid,
        "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
        CONSTRAINT "counter_refunds_amount_check" CHECK ("amount_cents" > 0),
        CONSTRAINT "PK_counter_refunds" PRIMARY KEY ("id"),
        CONSTRAINT "FK_counter_refunds_request" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE
      )
    `)
    await queryRunner.query(`CREATE INDEX "counter_refunds_request_idx" ON "counter_refunds" ("request_id")`)
    await queryRunner.query(`ALTER TABLE "ledger_entries" DROP CONSTRAINT "ledger_entries_kind_check"`)
    await queryRunner.query(
      `ALTER TABLE "ledger_entries" ADD CONSTRAINT "ledger_entries_kind_check" CHECK ("kind" IN ('deposit', 'balance', 'refund', 'counter', 'counter-refund'))`,
    )
    await queryRunner.query(`ALTER TABLE "stripe_events" ADD "problem" text`)
    await queryRunner.query(`CREATE INDEX "stripe_events_problem_idx" ON "stripe_events" ("received_at") WHERE "problem" IS NOT NULL`)
    // Hand-written: the new `lapsed` state, CHECKs on firing events, the unread-notice index, and
    // the prices of requests made before this change (the sent quote stands; the deposit asked is
    // the sent quote's, for requests the studio already took on).
    await queryRunner.query(`ALTER TABLE "firing_requests" DROP CONSTRAINT "firing_requests_state_check"`)
    await queryRunner.query(
      `ALTER TABLE "firing_requests" ADD CONSTRAINT "firing_requests_state_check" CHECK ("state" IN ('draft', 'sent', 'accepted', 'declined', 'withdrawn', 'deposit_paid', 'received', 'fired', 'ready', 'collected', 'cancelled', 'lapsed', 'disputed'))`,
    )
    await queryRunner.query(
      `ALTER TABLE "firing_events" ADD CONSTRAINT "firing_events_status_check" CHECK ("from_status" IN ('open', 'full', 'closed', 'loading', 'firing', 'cooling', 'unloaded', 'cancelled') AND "to_status" IN ('open', 'full', 'closed', 'loading', 'firing', 'cooling', 'unloaded', 'cancelled'))`,
    )
    await queryRunner.query(`CREATE INDEX "notices_unread_idx" ON "notices" ("user_id") WHERE "read_at" IS NULL`)
    await queryRunner.query(`UPDATE "firing_requests" SET "standing_quote" = "quote" WHERE "state" <> 'draft'`)
    await queryRunner.query(`
            UPDATE "firing_requests" r SET "standing_quote" = c."quote_after"
            FROM "check_ins" c WHERE c."request_id" = r."id" AND c."quote_after" IS NOT NULL AND c."price_confirmed_at" IS NOT NULL
        `)
    await queryRunner.query(`
            UPDATE "firing_requests" r SET "pending_quote" = c."quote_after"
            FROM "check_ins" c WHERE c."request_id" = r."id" AND c."quote_after" IS NOT NULL AND c."price_confirmed_at" IS NULL AND NOT c."refused"
        `)
    await queryRunner.query(`
            UPDATE "firing_requests" SET "deposit_asked_cents" = ("quote" ->> 'depositCents')::int
            WHERE "quote" IS NOT NULL AND "state" IN ('accepted', 'deposit_paid', 'received', 'fired', 'ready', 'collected', 'disputed')
        `)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "counter_refunds"`)
    await queryRunner.query(`ALTER TABLE "stripe_events" DROP COLUMN "problem"`)
    await queryRunner.query(`ALTER TABLE "ledger_entries" DROP CONSTRAINT "ledger_entries_kind_check"`)
    await queryRunner.query(`DELETE FROM "ledger_entries" WHERE "kind" = 'counter-refund'`)
    await queryRunner.query(
      `ALTER TABLE "ledger_entries" ADD CONSTRAINT "ledger_entries_kind_check" CHECK ("kind" IN ('deposit', 'balance', 'refund', 'counter'))`,
    )
    await queryRunner.query(`DROP INDEX "public"."notices_unread_idx"`)
    await queryRunner.query(`ALTER TABLE "firing_requests" DROP CONSTRAINT "firing_requests_state_check"`)
    await queryRunner.query(`UPDATE "firing_requests" SET "state" = 'cancelled' WHERE "state" = 'lapsed'`)
    await queryRunner.query(
      `ALTER TABLE "firing_requests" ADD CONSTRAINT "firing_requests_state_check" CHECK ("state" IN ('draft', 'sent', 'accepted', 'declined', 'withdrawn', 'deposit_paid', 'received', 'fired', 'ready', 'collected', 'cancelled', 'disputed'))`,
    )
    await queryRunner.query(`
            ALTER TABLE "notices" DROP CONSTRAINT "FK_b63e8dcd3d13a55e8099bfee902"
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_events" DROP CONSTRAINT "FK_d8d3dfe44915e3665903d99eaa8"
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_requests" DROP COLUMN "deposit_asked_cents"
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_requests" DROP COLUMN "pending_quote"
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_requests" DROP COLUMN "standing_quote"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."notices_user_idx"
        `)
    await queryRunner.query(`
            DROP TABLE "notices"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."firing_events_firing_idx"
        `)
    await queryRunner.query(`
            DROP TABLE "firing_events"
        `)
  }
}
