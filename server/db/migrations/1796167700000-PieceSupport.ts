import { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Written by hand (the pieces live in JSON): a glaze's `onCookie` flag becomes `support`. A piece
 * marked on a cookie (or stilt: the old flag did not tell them apart) is read as on a cookie, which
 * waives what the old flag waived; unmarked pieces stand on the shelf. Down turns any support back
 * into the flag.
 */
export class PieceSupport1796167700000 implements MigrationInterface {
  name = 'PieceSupport1796167700000'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            UPDATE "firing_requests" SET "pieces" = (
                SELECT jsonb_agg(
                    CASE WHEN piece ? 'glaze' AND jsonb_typeof(piece -> 'glaze') = 'object' THEN
                        jsonb_set(
                            piece,
                            '{glaze}',
                            ((piece -> 'glaze') - 'onCookie')
                                || jsonb_build_object('support', CASE WHEN (piece -> 'glaze' ->> 'onCookie') = 'true' THEN 'cookie' ELSE 'none' END)
                        )
                    ELSE piece END
                    ORDER BY ordinality
                )
                FROM jsonb_array_elements("pieces") WITH ORDINALITY AS element(piece, ordinality)
            )
            WHERE jsonb_typeof("pieces") = 'array' AND jsonb_array_length("pieces") > 0
        `)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            UPDATE "firing_requests" SET "pieces" = (
                SELECT jsonb_agg(
                    CASE WHEN piece ? 'glaze' AND jsonb_typeof(piece -> 'glaze') = 'object' THEN
                        jsonb_set(
                            piece,
                            '{glaze}',
                            ((piece -> 'glaze') - 'support')
                                || jsonb_build_object('onCookie', COALESCE(piece -> 'glaze' ->> 'support', 'none') <> 'none')
                        )
                    ELSE piece END
                    ORDER BY ordinality
                )
                FROM jsonb_array_elements("pieces") WITH ORDINALITY AS element(piece, ordinality)
            )
            WHERE jsonb_typeof("pieces") = 'array' AND jsonb_array_length("pieces") > 0
        `)
  }
}
