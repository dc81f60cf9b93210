import { MigrationInterface, QueryRunner } from 'typeorm'

const WHOLE = `'022','021','020','019','018','017','016','015','014','013','012','011','010','09','08','07','06','05','04','03','02','01','1','2','3','4','5','6','7','8','9','10','11','12','13','14'`
const WITH_HALVES = `'022','021','020','019','018','017','016','015','014','013','012','011','010','09','08','07','06','05','05½','04','03','02','01','1','2','3','4','5','5½','6','7','8','9','10','11','12','13','14'`

/**
 * Written by hand (TypeORM does not compare CHECK bodies): lustre and raku firings, and the half cones
 * 05½ and 5½ in the cone order the database checks ranges with (the order of CONES in
 * shared/firing/cones.ts). Ranks stored in search documents move with the new order.
 */
export class FiringKindsAndHalfCones1796167600000 implements MigrationInterface {
  name = 'FiringKindsAndHalfCones1796167600000'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "firings" DROP CONSTRAINT "firings_kind_check"`)
    await queryRunner.query(
      `ALTER TABLE "firings" ADD CONSTRAINT "firings_kind_check" CHECK ("kind" IN ('bisque', 'glaze', 'single', 'lustre', 'raku'))`,
    )
    await queryRunner.query(`
            CREATE OR REPLACE FUNCTION cone_rank(cone text) RETURNS integer
            LANGUAGE sql IMMUTABLE STRICT PARALLEL SAFE
            AS $$ SELECT array_position(ARRAY[${WITH_HALVES}]::text[], cone) - 1 $$
        `)
    await queryRunner.query(`UPDATE "search_documents" SET "cone_rank" = cone_rank("cone") WHERE "cone_rank" <> cone_rank("cone")`)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "firings" DROP CONSTRAINT "firings_kind_check"`)
    await queryRunner.query(`ALTER TABLE "firings" ADD CONSTRAINT "firings_kind_check" CHECK ("kind" IN ('bisque', 'glaze', 'single'))`)
    await queryRunner.query(`
            CREATE OR REPLACE FUNCTION cone_rank(cone text) RETURNS integer
            LANGUAGE sql IMMUTABLE STRICT PARALLEL SAFE
            AS $$ SELECT array_position(ARRAY[${WHOLE}]::text[], cone) - 1 $$
        `)
    await queryRunner.query(`UPDATE "search_documents" SET "cone_rank" = cone_rank("cone") WHERE "cone_rank" <> cone_rank("cone")`)
  }
}
