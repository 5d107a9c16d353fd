import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A reading's client id is unique within its run, not across the database: the same id in another run is another
 * reading (CSV ids are derived from run, point and time), and a clash within a run is compared, not dropped.
 */
export class ReadingClientIdPerRun1796423309760 implements MigrationInterface {
  name = 'ReadingClientIdPerRun1796423309760';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE UNIQUE INDEX "readings_run_client_id" ON "readings" ("run_id", "client_id")`);
    await queryRunner.query(`DROP INDEX "public"."readings_client_id"`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE UNIQUE INDEX "readings_client_id" ON "readings" ("client_id")`);
    await queryRunner.query(`DROP INDEX "public"."readings_run_client_id"`);
  }
}
