import { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Cards kept at the deposit for a damage claim the potter later accepts, the page that keeps one, and
 * the count of declined tries on a claim. Generated, then trimmed of what the generator reports about
 * constraints written by hand earlier; the foreign key to the potter is added by hand.
 */
export class KeptCards1796200576439 implements MigrationInterface {
  name = 'KeptCards1796200576439'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            CREATE TABLE "kept_cards" (
                "request_id" uuid NOT NULL,
                "user_id" uuid NOT NULL,
                "stripe_customer_id" text NOT NULL,
                "stripe_payment_method_id" text,
                "brand" text,
                "last4" text,
                "kept_at" TIMESTAMP WITH TIME ZONE,
                "forgotten_at" TIMESTAMP WITH TIME ZONE,
                "agreed_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "kept_cards_kept_check" CHECK (
                    ("stripe_payment_method_id" IS NULL) = ("kept_at" IS NULL)
                ),
                CONSTRAINT "kept_cards_customer_check" CHECK ("stripe_customer_id" ~ '^cus_'),
                CONSTRAINT "PK_91bc043928c8b5ddcde1f1198ba" PRIMARY KEY ("request_id")
            )
        `)
    await queryRunner.query(`
            CREATE INDEX "kept_cards_user_idx" ON "kept_cards" ("user_id")
        `)
    await queryRunner.query(`
            ALTER TABLE "kept_cards"
            ADD CONSTRAINT "FK_91bc043928c8b5ddcde1f1198ba" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "kept_cards"
            ADD CONSTRAINT "kept_cards_user_fk" FOREIGN KEY ("user_id") REFERENCES "users"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "claims"
            ADD "card_tries" integer NOT NULL DEFAULT '0'
        `)
    await queryRunner.query(`
            ALTER TABLE "payments"
            ADD "keeps_card" boolean NOT NULL DEFAULT false
        `)
    await queryRunner.query(`
            ALTER TABLE "payments"
            ADD CONSTRAINT "payments_keeps_card_check" CHECK (NOT "keeps_card" OR "purpose" = 'deposit')
        `)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "payments" DROP CONSTRAINT "payments_keeps_card_check"`)
    await queryRunner.query(`ALTER TABLE "payments" DROP COLUMN "keeps_card"`)
    await queryRunner.query(`ALTER TABLE "claims" DROP COLUMN "card_tries"`)
    await queryRunner.query(`DROP TABLE "kept_cards"`)
  }
}
