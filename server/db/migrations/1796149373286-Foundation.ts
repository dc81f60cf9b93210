import { MigrationInterface, QueryRunner } from 'typeorm'

export class Foundation1796149373286 implements MigrationInterface {
  name = 'Foundation1796149373286'

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            CREATE TABLE "auth_tokens" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "token_hash" text NOT NULL,
                "purpose" text NOT NULL,
                "user_id" uuid,
                "data" jsonb NOT NULL DEFAULT '{}',
                "expires_at" TIMESTAMP WITH TIME ZONE NOT NULL,
                "used_at" TIMESTAMP WITH TIME ZONE,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_41e9ddfbb32da18c4e85e45c2fd" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE UNIQUE INDEX "auth_tokens_hash_key" ON "auth_tokens" ("token_hash")
        `)
    await queryRunner.query(`
            CREATE TABLE "outbound_mail" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "to_address" text NOT NULL,
                "template" text NOT NULL,
                "subject" text NOT NULL,
                "body_text" text NOT NULL,
                "body_html" text NOT NULL,
                "attempts" integer NOT NULL DEFAULT '0',
                "last_error" text,
                "sent_at" TIMESTAMP WITH TIME ZONE,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_e7f6d3164f065d081b18f3b324f" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE TABLE "studios" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "name" text NOT NULL,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_76ff398ef5041c4b42618ed6111" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE TABLE "studio_members" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "studio_id" uuid NOT NULL,
                "user_id" uuid NOT NULL,
                "role" text NOT NULL,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "studio_members_studio_user_key" UNIQUE ("studio_id", "user_id"),
                CONSTRAINT "PK_3685dd8cfd665e977ea8694e1f1" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE TABLE "users" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "email" text NOT NULL,
                "password_hash" text NOT NULL,
                "display_name" text NOT NULL,
                "role" text NOT NULL,
                "unit_system" text NOT NULL DEFAULT 'imperial',
                "email_verified_at" TIMESTAMP WITH TIME ZONE,
                "suspended_at" TIMESTAMP WITH TIME ZONE,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_a3ffb1c0c8416b9fc6f907b7433" PRIMARY KEY ("id")
            )
        `)
    await queryRunner.query(`
            CREATE UNIQUE INDEX "users_email_key" ON "users" ("email")
        `)
    await queryRunner.query(`
            ALTER TABLE "studio_members"
            ADD CONSTRAINT "FK_f29b3acac56a40ef621327e929e" FOREIGN KEY ("studio_id") REFERENCES "studios"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)
    await queryRunner.query(`
            ALTER TABLE "studio_members"
            ADD CONSTRAINT "FK_306c0744a09b888f06ec693234f" FOREIGN KEY ("user_id") REFERENCES "users"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `)

    // Written by hand: what the entities cannot say, and the tables owned by libraries.
    await queryRunner.query(`
            ALTER TABLE "users"
            ADD CONSTRAINT "users_role_check" CHECK ("role" IN ('potter', 'host', 'crew', 'admin')),
            ADD CONSTRAINT "users_unit_system_check" CHECK ("unit_system" IN ('imperial', 'metric')),
            ADD CONSTRAINT "users_email_lower_check" CHECK ("email" = lower("email"))
        `)
    await queryRunner.query(`
            ALTER TABLE "studio_members" ADD CONSTRAINT "studio_members_role_check" CHECK ("role" IN ('owner', 'crew'))
        `)
    await queryRunner.query(`
            ALTER TABLE "auth_tokens"
            ADD CONSTRAINT "auth_tokens_purpose_check" CHECK ("purpose" IN ('verify-email', 'password-reset', 'crew-invite')),
            ADD CONSTRAINT "auth_tokens_user_fk" FOREIGN KEY ("user_id") REFERENCES "users"("id") ON DELETE CASCADE
        `)
    // The session store's table, as connect-pg-simple defines it.
    await queryRunner.query(`
            CREATE TABLE "session" (
                "sid" varchar NOT NULL COLLATE "default",
                "sess" json NOT NULL,
                "expire" timestamp(6) NOT NULL,
                CONSTRAINT "session_pkey" PRIMARY KEY ("sid")
            )
        `)
    await queryRunner.query(`CREATE INDEX "IDX_session_expire" ON "session" ("expire")`)
    // Rate-limit counters shared by every server process.
    await queryRunner.query(`
            CREATE TABLE "rate_limit_counters" (
                "key" text NOT NULL PRIMARY KEY,
                "hits" integer NOT NULL,
                "reset_at" TIMESTAMP WITH TIME ZONE NOT NULL
            )
        `)
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "rate_limit_counters"`)
    await queryRunner.query(`DROP TABLE "session"`)
    await queryRunner.query(`ALTER TABLE "auth_tokens" DROP CONSTRAINT "auth_tokens_user_fk"`)
    await queryRunner.query(`
            ALTER TABLE "studio_members" DROP CONSTRAINT "FK_306c0744a09b888f06ec693234f"
        `)
    await queryRunner.query(`
            ALTER TABLE "studio_members" DROP CONSTRAINT "FK_f29b3acac56a40ef621327e929e"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."users_email_key"
        `)
    await queryRunner.query(`
            DROP TABLE "users"
        `)
    await queryRunner.query(`
            DROP TABLE "studio_members"
        `)
    await queryRunner.query(`
            DROP TABLE "studios"
        `)
    await queryRunner.query(`
            DROP TABLE "outbound_mail"
        `)
    await queryRunner.query(`
            DROP INDEX "public"."auth_tokens_hash_key"
        `)
    await queryRunner.query(`
            DROP TABLE "auth_tokens"
        `)
  }
}
