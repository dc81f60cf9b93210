import { MigrationInterface, QueryRunner } from 'typeorm'

/** Columns for the second pass of the firing science: a firing's cooling profile, the logged curve, a shelf's load. */
export class FiringSciencePass1796167522134 implements MigrationInterface {
  name = 'FiringSciencePass1796167522134'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            ALTER TABLE "firings"
            ADD "cooling" text NOT NULL DEFAULT 'natural'
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_logs"
            ADD "readings" jsonb NOT NULL DEFAULT '[]'
        `)
    await queryRunner.query(`
            ALTER TABLE "kilns"
            ADD "shelf_load_kg" double precision
        `)
    await queryRunner.query(`
            ALTER TABLE "firings"
            ADD CONSTRAINT "firings_cooling_check" CHECK (
                    "cooling" IN ('natural', 'glaze-development', 'drop-and-hold')
                )
        `)
    await queryRunner.query(`
            ALTER TABLE "kilns"
            ADD CONSTRAINT "kilns_shelf_load_check" CHECK (
                    "shelf_load_kg" IS NULL
                    OR "shelf_load_kg" > 0
                )
        `)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            ALTER TABLE "kilns" DROP CONSTRAINT "kilns_shelf_load_check"
        `)
    await queryRunner.query(`
            ALTER TABLE "firings" DROP CONSTRAINT "firings_cooling_check"
        `)
    await queryRunner.query(`
            ALTER TABLE "kilns" DROP COLUMN "shelf_load_kg"
        `)
    await queryRunner.query(`
            ALTER TABLE "firing_logs" DROP COLUMN "readings"
        `)
    await queryRunner.query(`
            ALTER TABLE "firings" DROP COLUMN "cooling"
        `)
  }
}
