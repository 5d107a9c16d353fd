import { MigrationInterface, QueryRunner } from 'typeorm';

/** The works' own settings (one row): its name, its time zone for printed records, the wet-signature block. */
export class SiteSettings1796413937879 implements MigrationInterface {
  name = 'SiteSettings1796413937879';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "site_settings" ("id" integer NOT NULL, "works_name" character varying(120) NOT NULL, "time_zone" character varying(64) NOT NULL, "wet_signature" boolean NOT NULL DEFAULT true, "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_site_settings" PRIMARY KEY ("id"), CONSTRAINT "CHK_site_settings_one_row" CHECK ("id" = 1))`,
    );
    await queryRunner.query(`INSERT INTO "site_settings" ("id", "works_name", "time_zone") VALUES (1, 'The works', 'UTC')`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "site_settings"`);
  }
}
