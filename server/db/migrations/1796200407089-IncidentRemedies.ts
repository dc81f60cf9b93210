import { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * What a studio did to make good to potters whose pieces an incident hurt: a credit given back on the
 * hurt ask, or a free refire promised. Generated, then trimmed of what the generator reports about
 * constraints written by hand earlier (foreign keys, CHECKs and defaults it cannot compare), with the
 * foreign keys named by hand.
 */
export class IncidentRemedies1796200407089 implements MigrationInterface {
  name = 'IncidentRemedies1796200407089'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            CREATE TABLE "incident_remedies" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "incident_id" uuid NOT NULL,
                "request_id" uuid NOT NULL,
                "kind" text NOT NULL,
                "amount_cents" integer,
                "online_cents" integer,
                "counter_cents" integer,
                "currency" character(3),
                "piece_tags" text array NOT NULL DEFAULT '{}',
                "target_firing_id" uuid,
                "note" text NOT NULL DEFAULT '',
                "given_by" uuid NOT NULL,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "incident_remedies_refire_check" CHECK (
                    ("kind" = 'refire') = (cardinality("piece_tags") > 0)
                    AND (
                        "kind" = 'refire'
                        OR "target_firing_id" IS NULL
                    )
                ),
                CONSTRAINT "incident_remedies_credit_check" CHECK (
                    ("kind" = 'credit') = ("amount_cents" IS NOT NULL)
                    AND (
                        "amount_cents" IS NULL
                        OR (
                            "amount_cents" > 0
                            AND "online_cents" >= 0
                            AND "counter_cents" >= 0
                            AND "online_cents" + "counter_cents" = "amount_cents"
                            AND "currency" IS NOT NULL
                        )
                    )
                ),
                CONSTRAINT "incident_remedies_kind_check" CHECK ("kind" IN ('credit', 'refire')),
                CONSTRAINT "incident_remedies_pkey" PRIMARY KEY ("id"),
                CONSTRAINT "incident_remedies_incident_fk" FOREIGN KEY ("incident_id") REFERENCES "incidents"("id") ON DELETE CASCADE,
                CONSTRAINT "incident_remedies_request_fk" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE,
                CONSTRAINT "incident_remedies_target_firing_fk" FOREIGN KEY ("target_firing_id") REFERENCES "firings"("id") ON DELETE SET NULL
            )
        `)
    await queryRunner.query(`CREATE INDEX "incident_remedies_request_idx" ON "incident_remedies" ("request_id")`)
    await queryRunner.query(`CREATE UNIQUE INDEX "incident_remedies_once_idx" ON "incident_remedies" ("incident_id", "request_id", "kind")`)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "incident_remedies"`)
  }
}
