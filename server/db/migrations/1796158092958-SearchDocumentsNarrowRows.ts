import { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Written by hand (storage settings are not part of the entities): the search fallback scans many
 * candidate rows but opens only a page of documents, so documents are kept out of line and the rows
 * the scan reads stay narrow.
 */
export class SearchDocumentsNarrowRows1796158092958 implements MigrationInterface {
  name = 'SearchDocumentsNarrowRows1796158092958'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "search_documents" ALTER COLUMN "document" SET STORAGE EXTERNAL`)
    await queryRunner.query(`ALTER TABLE "search_documents" SET (toast_tuple_target = 128)`)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "search_documents" RESET (toast_tuple_target)`)
    await queryRunner.query(`ALTER TABLE "search_documents" ALTER COLUMN "document" SET STORAGE EXTENDED`)
  }
}
