import { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Photos re-encoded by the queue carry `processing` until they are done; a new token purpose, the
 * one-time sign-in link (written by hand: TypeORM does not compare CHECK expressions).
 */
export class Hardening1796172202396 implements MigrationInterface {
  name = 'Hardening1796172202396'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "photos" ADD "processing" boolean NOT NULL DEFAULT false`)
    await queryRunner.query(`ALTER TABLE "auth_tokens" DROP CONSTRAINT "auth_tokens_purpose_check"`)
    await queryRunner.query(
      `ALTER TABLE "auth_tokens" ADD CONSTRAINT "auth_tokens_purpose_check" CHECK ("purpose" IN ('verify-email', 'password-reset', 'crew-invite', 'sign-in-link'))`,
    )
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DELETE FROM "auth_tokens" WHERE "purpose" = 'sign-in-link'`)
    await queryRunner.query(`ALTER TABLE "auth_tokens" DROP CONSTRAINT "auth_tokens_purpose_check"`)
    await queryRunner.query(
      `ALTER TABLE "auth_tokens" ADD CONSTRAINT "auth_tokens_purpose_check" CHECK ("purpose" IN ('verify-email', 'password-reset', 'crew-invite'))`,
    )
    await queryRunner.query(`ALTER TABLE "photos" DROP COLUMN "processing"`)
  }
}
