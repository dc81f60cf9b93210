import { MigrationInterface, QueryRunner } from 'typeorm'

export class FiringRequests1796150607023 implements MigrationInterface {
  name = 'FiringRequests1796150607023'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            CREATE TABLE "firing_requests" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "firing_id" uuid NOT NULL,
                "potter_id" uuid NOT NULL,
                "state" text NOT NULL DEFAULT 'draft',
                "pieces" jsonb NOT NULL,
                "notes" text NOT NULL DEFAULT '',
                "volume_l" double precision NOT NULL,
                "verdict" text NOT NULL,
                "findings" jsonb NOT NULL DEFAULT '[]',
                "acknowledged_warnings" text array NOT NULL DEFAULT '{}',
                "quote" jsonb,
                "policies_version" integer,
                "deposit_due_at" TIMESTAMP WITH TIME ZONE,
                "proposed_firing_id" uuid,
                "sent_at" TIMESTAMP WITH TIME ZONE,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "firing_requests_volume_check" CHECK ("volume_l" >= 0),
                CONSTRAINT "firing_requests_state_check" CHECK (
                    "state" IN (
                        'draft',
                        'sent',
                        'accepted',
                        'declined',
                        'withdrawn',
                        'deposit_paid',
                        'received',
                        'fired',
                        'ready',
                        'collected',
                        'cancelled',
                        'disputed'
                    )
                ),
                CONSTRAINT "PK_0dd46d76b48cabe3128537211d3" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE INDEX "firing_requests_potter_idx" ON "firing_requests" ("potter_id")
        `)
    await queryRunner.query(`
            CREATE INDEX "firing_requests_firing_state_idx" ON "firing_requests" ("firing_id", "state")
        `)
    await queryRunner.query(`
            CREATE TABLE "request_events" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "request_id" uuid NOT NULL,
                "actor_id" uuid,
                "from_state" text,
                "to_state" text NOT NULL,
                "reason" text NOT NULL DEFAULT '',
                "data" jsonb NOT NULL DEFAULT '{}',
                "at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_bf9333ddb0c34f1533239fc9cb0" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE INDEX "request_events_request_idx" ON "request_events" ("request_id", "at")
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_requests"
            ADD CONSTRAINT "FK_dc623e9799d5b5b13e6aaae29dc" FOREIGN KEY ("firing_id") REFERENCES "firings"("id") ON DELETE RESTRICT ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_requests"
            ADD CONSTRAINT "FK_56c6a0aaa27f2d31116d15b73b3" FOREIGN KEY ("potter_id") REFERENCES "users"("id") ON DELETE RESTRICT ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "request_events"
            ADD CONSTRAINT "FK_e8b717bcc3e01fbd300f4e97e56" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            ALTER TABLE "request_events" DROP CONSTRAINT "FK_e8b717bcc3e01fbd300f4e97e56"
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_requests" DROP CONSTRAINT "FK_56c6a0aaa27f2d31116d15b73b3"
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_requests" DROP CONSTRAINT "FK_dc623e9799d5b5b13e6aaae29dc"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."request_events_request_idx"
        `)
    await queryRunner.query(`
            DROP TABLE "request_events"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."firing_requests_firing_state_idx"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."firing_requests_potter_idx"
        `)
    await queryRunner.query(`
            DROP TABLE "firing_requests"
        `)
  }
}
