import { MigrationInterface, QueryRunner } from 'typeorm'

export class SearchFacetColumns1796153787338 implements MigrationInterface {
  name = 'SearchFacetColumns1796153787338'

  public async up(queryRunner: QueryRunner): Promise<void> {
    // Edited by hand: filled from the stored documents before the columns become required.
    await queryRunner.query(`ALTER TABLE "search_documents" ADD "cone" text, ADD "kiln_kind" text`)
    await queryRunner.query(`UPDATE "search_documents" SET "cone" = "document"->>'cone', "kiln_kind" = "document"->>'kilnKind'`)
    await queryRunner.query(`ALTER TABLE "search_documents" ALTER "cone" SET NOT NULL, ALTER "kiln_kind" SET NOT NULL`)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            ALTER TABLE "search_documents" DROP COLUMN "kiln_kind"
        `)
    await queryRunner.query(`
            ALTER TABLE "search_documents" DROP COLUMN "cone"
        `)
  }
}
