import { MigrationInterface, QueryRunner } from 'typeorm'

export class PaymentsAndMessages1796151940233 implements MigrationInterface {
  name = 'PaymentsAndMessages1796151940233'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            CREATE TABLE "ledger_entries" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "request_id" uuid NOT NULL,
                "direction" text NOT NULL,
                "kind" text NOT NULL,
                "amount_cents" integer NOT NULL,
                "currency" character(3) NOT NULL,
                "stripe_session_id" text,
                "stripe_payment_intent_id" text,
                "stripe_refund_id" text,
                "note" text NOT NULL DEFAULT '',
                "at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "ledger_entries_amount_check" CHECK ("amount_cents" > 0),
                CONSTRAINT "ledger_entries_kind_check" CHECK (
                    "kind" IN ('deposit', 'balance', 'refund', 'counter')
                ),
                CONSTRAINT "ledger_entries_direction_check" CHECK ("direction" IN ('in', 'out')),
                CONSTRAINT "PK_6efcb84411d3f08b08450ae75d5" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE UNIQUE INDEX "ledger_entries_refund_key" ON "ledger_entries" ("stripe_refund_id")
            WHERE "stripe_refund_id" IS NOT NULL
        `)
    await queryRunner.query(`
            CREATE INDEX "ledger_entries_request_idx" ON "ledger_entries" ("request_id", "at")
        `)
    await queryRunner.query(`
            CREATE TABLE "payments" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "request_id" uuid NOT NULL,
                "purpose" text NOT NULL,
                "stripe_session_id" text NOT NULL,
                "checkout_url" text NOT NULL,
                "amount_cents" integer NOT NULL,
                "currency" character(3) NOT NULL,
                "status" text NOT NULL DEFAULT 'open',
                "stripe_payment_intent_id" text,
                "failure_message" text,
                "expires_at" TIMESTAMP WITH TIME ZONE NOT NULL,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "payments_status_check" CHECK (
                    "status" IN ('open', 'paid', 'expired', 'failed')
                ),
                CONSTRAINT "payments_purpose_check" CHECK ("purpose" IN ('deposit', 'balance')),
                CONSTRAINT "PK_197ab7af18c93fbb0c9b28b4a59" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE UNIQUE INDEX "payments_session_key" ON "payments" ("stripe_session_id")
        `)
    await queryRunner.query(`
            CREATE INDEX "payments_request_idx" ON "payments" ("request_id", "purpose")
        `)
    await queryRunner.query(`
            CREATE TABLE "request_messages" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "request_id" uuid NOT NULL,
                "author_id" uuid NOT NULL,
                "side" text NOT NULL,
                "body" text NOT NULL,
                "notified_at" TIMESTAMP WITH TIME ZONE,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_2c46c29c5bd12025b30863202dc" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE INDEX "request_messages_request_idx" ON "request_messages" ("request_id", "created_at")
        `)
    await queryRunner.query(`
            CREATE TABLE "stripe_events" (
                "id" text NOT NULL,
                "type" text NOT NULL,
                "payload" jsonb NOT NULL,
                "received_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_d3247bd5fc3f66b6982bbcdd897" PRIMARY KEY ("id")
            )
        `)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            DROP TABLE "stripe_events"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."request_messages_request_idx"
        `)
    await queryRunner.query(`
            DROP TABLE "request_messages"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."payments_request_idx"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."payments_session_key"
        `)
    await queryRunner.query(`
            DROP TABLE "payments"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."ledger_entries_request_idx"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."ledger_entries_refund_key"
        `)
    await queryRunner.query(`
            DROP TABLE "ledger_entries"
        `)
  }
}
