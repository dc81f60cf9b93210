import { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Paying studios: each studio's connected account, the requests whose share is earned (with the fee
 * rule then in force), the transfers and reversals made, and the payouts to the bank Stripe reports.
 * Generated from the entities; the CHECKs on transfer and payout states are by hand.
 */
export class StudioPayouts1796174302372 implements MigrationInterface {
  name = 'StudioPayouts1796174302372'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            CREATE TABLE "payout_accounts" (
                "studio_id" uuid NOT NULL,
                "stripe_account_id" text NOT NULL,
                "details_submitted" boolean NOT NULL DEFAULT false,
                "transfers_status" text,
                "payouts_enabled" boolean NOT NULL DEFAULT false,
                "currently_due" jsonb NOT NULL DEFAULT '[]'::jsonb,
                "pending_verification" jsonb NOT NULL DEFAULT '[]'::jsonb,
                "disabled_reason" text,
                "bank_last4" text,
                "stripe_seen_at" TIMESTAMP WITH TIME ZONE,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_2fe50c0fb0ceded527265190135" PRIMARY KEY ("studio_id")
            )
        `)
    await queryRunner.query(`
            CREATE UNIQUE INDEX "payout_accounts_stripe_key" ON "payout_accounts" ("stripe_account_id")
        `)
    await queryRunner.query(`
            CREATE TABLE "request_payouts" (
                "request_id" uuid NOT NULL,
                "studio_id" uuid NOT NULL,
                "currency" character(3) NOT NULL,
                "fee_percent_bp" integer NOT NULL,
                "fee_minimum_cents" integer NOT NULL,
                "earned_at" TIMESTAMP WITH TIME ZONE NOT NULL,
                "release_at" TIMESTAMP WITH TIME ZONE,
                "dispute_settled_at" TIMESTAMP WITH TIME ZONE,
                "paid_up_at" TIMESTAMP WITH TIME ZONE,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "request_payouts_fee_check" CHECK (
                    "fee_percent_bp" BETWEEN 0 AND 10000
                    AND "fee_minimum_cents" >= 0
                ),
                CONSTRAINT "PK_2bb9454d77e746a3bb415e92574" PRIMARY KEY ("request_id")
            )
        `)
    await queryRunner.query(`
            CREATE INDEX "request_payouts_studio_idx" ON "request_payouts" ("studio_id", "earned_at")
        `)
    await queryRunner.query(`
            CREATE TABLE "studio_payouts" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "studio_id" uuid NOT NULL,
                "stripe_payout_id" text NOT NULL,
                "amount_cents" integer NOT NULL,
                "currency" character(3) NOT NULL,
                "status" text NOT NULL,
                "arrival_date" TIMESTAMP WITH TIME ZONE NOT NULL,
                "failure_message" text,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL,
                "stripe_seen_at" TIMESTAMP WITH TIME ZONE NOT NULL,
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "studio_payouts_amount_check" CHECK ("amount_cents" >= 0),
                CONSTRAINT "PK_19c9cabf3a64161ae806ea8bc26" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE UNIQUE INDEX "studio_payouts_stripe_key" ON "studio_payouts" ("stripe_payout_id")
        `)
    await queryRunner.query(`
            CREATE INDEX "studio_payouts_studio_idx" ON "studio_payouts" ("studio_id", "created_at")
        `)
    await queryRunner.query(`
            CREATE TABLE "studio_transfers" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "request_id" uuid NOT NULL,
                "studio_id" uuid NOT NULL,
                "stripe_transfer_id" text NOT NULL,
                "stripe_account_id" text NOT NULL,
                "source_charge_id" text,
                "amount_cents" integer NOT NULL,
                "currency" character(3) NOT NULL,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL,
                CONSTRAINT "studio_transfers_amount_check" CHECK ("amount_cents" > 0),
                CONSTRAINT "PK_eadbedad40a7480051408882f4c" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE UNIQUE INDEX "studio_transfers_stripe_key" ON "studio_transfers" ("stripe_transfer_id")
        `)
    await queryRunner.query(`
            CREATE INDEX "studio_transfers_studio_idx" ON "studio_transfers" ("studio_id", "created_at")
        `)
    await queryRunner.query(`
            CREATE INDEX "studio_transfers_request_idx" ON "studio_transfers" ("request_id")
        `)
    await queryRunner.query(`
            CREATE TABLE "transfer_reversals" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "transfer_id" uuid NOT NULL,
                "request_id" uuid NOT NULL,
                "stripe_reversal_id" text NOT NULL,
                "amount_cents" integer NOT NULL,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL,
                CONSTRAINT "transfer_reversals_amount_check" CHECK ("amount_cents" > 0),
                CONSTRAINT "PK_39b6458c416a82f221cce0c8f68" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE UNIQUE INDEX "transfer_reversals_stripe_key" ON "transfer_reversals" ("stripe_reversal_id")
        `)
    await queryRunner.query(`
            CREATE INDEX "transfer_reversals_request_idx" ON "transfer_reversals" ("request_id")
        `)
    await queryRunner.query(`
            ALTER TABLE "payout_accounts" ADD CONSTRAINT "payout_accounts_stripe_id_check" CHECK ("stripe_account_id" ~ '^acct_')
        `)
    await queryRunner.query(`
            ALTER TABLE "request_payouts" ADD CONSTRAINT "request_payouts_currency_check" CHECK ("currency" ~ '^[A-Z]{3}$')
        `)
    await queryRunner.query(`
            ALTER TABLE "studio_payouts" ADD CONSTRAINT "studio_payouts_status_check" CHECK ("status" IN ('pending', 'in_transit', 'paid', 'failed', 'canceled'))
        `)
    await queryRunner.query(`
            ALTER TABLE "payout_accounts"
            ADD CONSTRAINT "FK_2fe50c0fb0ceded527265190135" FOREIGN KEY ("studio_id") REFERENCES "studios"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "request_payouts"
            ADD CONSTRAINT "FK_2bb9454d77e746a3bb415e92574" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "studio_transfers"
            ADD CONSTRAINT "FK_d04b797d3d4e00e8247f31dd799" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "transfer_reversals"
            ADD CONSTRAINT "FK_50dce0ec87e6c79b82b28f8570b" FOREIGN KEY ("transfer_id") REFERENCES "studio_transfers"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            ALTER TABLE "transfer_reversals" DROP CONSTRAINT "FK_50dce0ec87e6c79b82b28f8570b"
        `)
    await queryRunner.query(`
            ALTER TABLE "studio_transfers" DROP CONSTRAINT "FK_d04b797d3d4e00e8247f31dd799"
        `)
    await queryRunner.query(`
            ALTER TABLE "request_payouts" DROP CONSTRAINT "FK_2bb9454d77e746a3bb415e92574"
        `)
    await queryRunner.query(`
            ALTER TABLE "payout_accounts" DROP CONSTRAINT "FK_2fe50c0fb0ceded527265190135"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."transfer_reversals_request_idx"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."transfer_reversals_stripe_key"
        `)
    await queryRunner.query(`
            DROP TABLE "transfer_reversals"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."studio_transfers_request_idx"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."studio_transfers_studio_idx"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."studio_transfers_stripe_key"
        `)
    await queryRunner.query(`
            DROP TABLE "studio_transfers"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."studio_payouts_studio_idx"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."studio_payouts_stripe_key"
        `)
    await queryRunner.query(`
            DROP TABLE "studio_payouts"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."request_payouts_studio_idx"
        `)
    await queryRunner.query(`
            DROP TABLE "request_payouts"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."payout_accounts_stripe_key"
        `)
    await queryRunner.query(`
            DROP TABLE "payout_accounts"
        `)
  }
}
