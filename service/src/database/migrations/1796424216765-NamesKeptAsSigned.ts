import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Display names are unique among active people (whatever the case): active people sharing a name keep it in order of
 * joining, the later ones get " (2)", " (3)"... A signed checklist and a run's countersignature keep the signer's
 * name as it was when signed (filled in from the current names for records signed before).
 */
export class NamesKeptAsSigned1796424216765 implements MigrationInterface {
  name = 'NamesKeptAsSigned1796424216765';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `UPDATE "users" u SET "display_name" = left(u."display_name", 110) || ' (' || d.n || ')'
         FROM (SELECT id, row_number() OVER (PARTITION BY lower("display_name") ORDER BY "created_at", id) AS n
                 FROM "users" WHERE "active") d
        WHERE u.id = d.id AND d.n > 1`,
    );
    await queryRunner.query(`CREATE UNIQUE INDEX "users_display_name_active" ON "users" (lower("display_name")) WHERE "active"`);
    await queryRunner.query(`ALTER TABLE "checklists" ADD "signed_by_name" character varying(120)`);
    await queryRunner.query(`UPDATE "checklists" c SET "signed_by_name" = u."display_name" FROM "users" u WHERE c."signed_by" = u.id`);
    await queryRunner.query(`ALTER TABLE "runs" ADD "countersigned_by_name" character varying(120)`);
    await queryRunner.query(
      `UPDATE "runs" r SET "countersigned_by_name" = u."display_name" FROM "users" u WHERE r."countersigned_by" = u.id`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "runs" DROP COLUMN "countersigned_by_name"`);
    await queryRunner.query(`ALTER TABLE "checklists" DROP COLUMN "signed_by_name"`);
    await queryRunner.query(`DROP INDEX "public"."users_display_name_active"`);
  }
}
