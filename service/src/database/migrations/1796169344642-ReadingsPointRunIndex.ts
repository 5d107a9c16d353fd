import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Per-run figures of a point (the bearing history, the open run's figures on every view): one exact range per
 * point and run instead of all the point's readings of every season. Small, as each (point, run) key repeats.
 */
export class ReadingsPointRunIndex1796169344642 implements MigrationInterface {
  name = 'ReadingsPointRunIndex1796169344642';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE INDEX "readings_point_run" ON "readings"  ("point_id", "run_id") `);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "public"."readings_point_run"`);
  }
}
