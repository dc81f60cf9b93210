import { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Incidents in a firing, the pieces they name, their photos, and damage claims paid through the ask's
 * own checkout. Generated, then trimmed of what the generator reports about constraints written by
 * hand earlier, and finished by hand: the changed CHECKs on photos, payments and ledger entries (the
 * generator does not see a CHECK's expression change) and the pairing of a claim payment with its
 * claim and of an incident photo with its incident.
 */
export class IncidentsAndClaims1796189313576 implements MigrationInterface {
  name = 'IncidentsAndClaims1796189313576'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            CREATE TABLE "incidents" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "firing_id" uuid NOT NULL,
                "request_id" uuid NOT NULL,
                "reporter_id" uuid NOT NULL,
                "reporter_side" text NOT NULL,
                "kind" text NOT NULL,
                "crack_edge" text,
                "shards" boolean NOT NULL DEFAULT false,
                "neighbours_hit" boolean NOT NULL DEFAULT false,
                "shelf_damage" boolean NOT NULL DEFAULT false,
                "element_damage" boolean NOT NULL DEFAULT false,
                "where_in_kiln" text NOT NULL DEFAULT '',
                "note" text NOT NULL DEFAULT '',
                "phase" text,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "incidents_side_check" CHECK ("reporter_side" IN ('potter', 'studio')),
                CONSTRAINT "incidents_phase_check" CHECK (
                    "phase" IS NULL
                    OR "phase" IN (
                        'water-smoking',
                        'burnout',
                        'quartz-heating',
                        'peak',
                        'quartz-cooling',
                        'cristobalite-cooling'
                    )
                ),
                CONSTRAINT "incidents_crack_edge_check" CHECK (
                    "crack_edge" IS NULL
                    OR "crack_edge" IN ('sharp', 'rounded', 'unknown')
                ),
                CONSTRAINT "incidents_kind_check" CHECK (
                    "kind" IN (
                        'blowout',
                        'crack',
                        'bloating',
                        'black-core',
                        'slumping',
                        'glaze-run',
                        'stuck'
                    )
                ),
                CONSTRAINT "PK_ccb34c01719889017e2246469f9" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE TABLE "incident_pieces" (
                "incident_id" uuid NOT NULL,
                "piece_id" uuid NOT NULL,
                "role" text NOT NULL,
                CONSTRAINT "incident_pieces_role_check" CHECK ("role" IN ('failed', 'hurt')),
                CONSTRAINT "PK_6b7950aed5dc99b62300309b6c7" PRIMARY KEY ("incident_id", "piece_id")
            )
        `)
    await queryRunner.query(`
            CREATE TABLE "claims" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "incident_id" uuid NOT NULL,
                "request_id" uuid NOT NULL,
                "raised_by" uuid NOT NULL,
                "charge_kind" text NOT NULL,
                "amount_cents" integer NOT NULL,
                "currency" character(3) NOT NULL,
                "note" text NOT NULL DEFAULT '',
                "status" text NOT NULL DEFAULT 'raised',
                "contest_reason" text,
                "desk_note" text,
                "paid_at" TIMESTAMP WITH TIME ZONE,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "claims_paid_check" CHECK (("status" = 'paid') = ("paid_at" IS NOT NULL)),
                CONSTRAINT "claims_amount_check" CHECK ("amount_cents" > 0),
                CONSTRAINT "claims_status_check" CHECK (
                    "status" IN (
                        'raised',
                        'contested',
                        'upheld',
                        'paid',
                        'waived'
                    )
                ),
                CONSTRAINT "claims_kind_check" CHECK (
                    "charge_kind" IN (
                        'kiln-cleaning',
                        'shelf-ground',
                        'shelf-replaced',
                        'other-ware'
                    )
                ),
                CONSTRAINT "PK_96c91970c0dcb2f69fdccd0a698" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`CREATE INDEX "incidents_request_idx" ON "incidents" ("request_id")`)
    await queryRunner.query(`CREATE INDEX "incidents_firing_idx" ON "incidents" ("firing_id", "created_at")`)
    await queryRunner.query(`CREATE INDEX "incident_pieces_piece_idx" ON "incident_pieces" ("piece_id")`)
    await queryRunner.query(`CREATE INDEX "claims_request_idx" ON "claims" ("request_id")`)
    await queryRunner.query(`CREATE INDEX "claims_incident_idx" ON "claims" ("incident_id")`)
    await queryRunner.query(
      `ALTER TABLE "incidents" ADD CONSTRAINT "incidents_firing_fk" FOREIGN KEY ("firing_id") REFERENCES "firings"("id") ON DELETE CASCADE`,
    )
    await queryRunner.query(
      `ALTER TABLE "incidents" ADD CONSTRAINT "incidents_request_fk" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE`,
    )
    await queryRunner.query(
      `ALTER TABLE "incident_pieces" ADD CONSTRAINT "incident_pieces_incident_fk" FOREIGN KEY ("incident_id") REFERENCES "incidents"("id") ON DELETE CASCADE`,
    )
    await queryRunner.query(
      `ALTER TABLE "incident_pieces" ADD CONSTRAINT "incident_pieces_piece_fk" FOREIGN KEY ("piece_id") REFERENCES "pieces"("id") ON DELETE CASCADE`,
    )
    await queryRunner.query(
      `ALTER TABLE "claims" ADD CONSTRAINT "claims_incident_fk" FOREIGN KEY ("incident_id") REFERENCES "incidents"("id") ON DELETE CASCADE`,
    )
    await queryRunner.query(
      `ALTER TABLE "claims" ADD CONSTRAINT "claims_request_fk" FOREIGN KEY ("request_id") REFERENCES "firing_requests"("id") ON DELETE CASCADE`,
    )

    await queryRunner.query(`ALTER TABLE "photos" ADD "incident_id" uuid`)
    await queryRunner.query(
      `ALTER TABLE "photos" ADD CONSTRAINT "photos_incident_fk" FOREIGN KEY ("incident_id") REFERENCES "incidents"("id") ON DELETE CASCADE`,
    )
    await queryRunner.query(`CREATE INDEX "photos_incident_idx" ON "photos" ("incident_id")`)
    await queryRunner.query(`ALTER TABLE "photos" DROP CONSTRAINT "photos_kind_check"`)
    await queryRunner.query(
      `ALTER TABLE "photos" ADD CONSTRAINT "photos_kind_check" CHECK ("kind" IN ('ware', 'check-in', 'result', 'refusal', 'incident'))`,
    )
    await queryRunner.query(
      `ALTER TABLE "photos" ADD CONSTRAINT "photos_incident_check" CHECK (("kind" = 'incident') = ("incident_id" IS NOT NULL))`,
    )

    await queryRunner.query(`ALTER TABLE "payments" ADD "claim_id" uuid`)
    await queryRunner.query(
      `ALTER TABLE "payments" ADD CONSTRAINT "payments_claim_fk" FOREIGN KEY ("claim_id") REFERENCES "claims"("id") ON DELETE RESTRICT`,
    )
    await queryRunner.query(`ALTER TABLE "payments" DROP CONSTRAINT "payments_purpose_check"`)
    await queryRunner.query(
      `ALTER TABLE "payments" ADD CONSTRAINT "payments_purpose_check" CHECK ("purpose" IN ('deposit', 'balance', 'claim'))`,
    )
    await queryRunner.query(
      `ALTER TABLE "payments" ADD CONSTRAINT "payments_claim_check" CHECK (("purpose" = 'claim') = ("claim_id" IS NOT NULL))`,
    )

    await queryRunner.query(`ALTER TABLE "ledger_entries" DROP CONSTRAINT "ledger_entries_kind_check"`)
    await queryRunner.query(
      `ALTER TABLE "ledger_entries" ADD CONSTRAINT "ledger_entries_kind_check" CHECK ("kind" IN ('deposit', 'balance', 'refund', 'counter', 'counter-refund', 'claim'))`,
    )
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DELETE FROM "ledger_entries" WHERE "kind" = 'claim'`)
    await queryRunner.query(`ALTER TABLE "ledger_entries" DROP CONSTRAINT "ledger_entries_kind_check"`)
    await queryRunner.query(
      `ALTER TABLE "ledger_entries" ADD CONSTRAINT "ledger_entries_kind_check" CHECK ("kind" IN ('deposit', 'balance', 'refund', 'counter', 'counter-refund'))`,
    )
    await queryRunner.query(`DELETE FROM "payments" WHERE "purpose" = 'claim'`)
    await queryRunner.query(`ALTER TABLE "payments" DROP CONSTRAINT "payments_claim_check"`)
    await queryRunner.query(`ALTER TABLE "payments" DROP CONSTRAINT "payments_purpose_check"`)
    await queryRunner.query(`ALTER TABLE "payments" ADD CONSTRAINT "payments_purpose_check" CHECK ("purpose" IN ('deposit', 'balance'))`)
    await queryRunner.query(`ALTER TABLE "payments" DROP CONSTRAINT "payments_claim_fk"`)
    await queryRunner.query(`ALTER TABLE "payments" DROP COLUMN "claim_id"`)
    await queryRunner.query(`DELETE FROM "photos" WHERE "kind" = 'incident'`)
    await queryRunner.query(`ALTER TABLE "photos" DROP CONSTRAINT "photos_incident_check"`)
    await queryRunner.query(`ALTER TABLE "photos" DROP CONSTRAINT "photos_kind_check"`)
    await queryRunner.query(
      `ALTER TABLE "photos" ADD CONSTRAINT "photos_kind_check" CHECK ("kind" IN ('ware', 'check-in', 'result', 'refusal'))`,
    )
    await queryRunner.query(`DROP INDEX "public"."photos_incident_idx"`)
    await queryRunner.query(`ALTER TABLE "photos" DROP CONSTRAINT "photos_incident_fk"`)
    await queryRunner.query(`ALTER TABLE "photos" DROP COLUMN "incident_id"`)
    await queryRunner.query(`DROP TABLE "claims"`)
    await queryRunner.query(`DROP TABLE "incident_pieces"`)
    await queryRunner.query(`DROP TABLE "incidents"`)
  }
}
