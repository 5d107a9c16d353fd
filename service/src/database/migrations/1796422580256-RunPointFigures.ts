import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Figures of each point's readings in each run (count, sum, peak, least, first and last time), kept by the
 * ingest path in the same statement that stores the readings and recomputed when a reading is amended, so the
 * bearing list and histories read one small row per run and point instead of the open run's readings.
 * Filled here from the readings already stored.
 */
export class RunPointFigures1796422580256 implements MigrationInterface {
  name = 'RunPointFigures1796422580256';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "run_point_figures" ("run_id" uuid NOT NULL, "point_id" uuid NOT NULL, "count" integer NOT NULL, "total" double precision NOT NULL, "peak" double precision NOT NULL, "least" double precision NOT NULL, "first_at" TIMESTAMP WITH TIME ZONE NOT NULL, "last_at" TIMESTAMP WITH TIME ZONE NOT NULL, CONSTRAINT "PK_run_point_figures" PRIMARY KEY ("run_id", "point_id"))`,
    );
    await queryRunner.query(
      `ALTER TABLE "run_point_figures" ADD CONSTRAINT "fk_run_point_figures_run_id" FOREIGN KEY ("run_id") REFERENCES "runs"("id") ON DELETE CASCADE`,
    );
    await queryRunner.query(
      `ALTER TABLE "run_point_figures" ADD CONSTRAINT "fk_run_point_figures_point_id" FOREIGN KEY ("point_id") REFERENCES "measurement_points"("id") ON DELETE CASCADE`,
    );
    await queryRunner.query(
      `INSERT INTO "run_point_figures" (run_id, point_id, count, total, peak, least, first_at, last_at)
       SELECT run_id, point_id, count(*), sum(v), max(v), min(v), min(taken_at), max(taken_at)
         FROM (SELECT run_id, point_id, COALESCE(amended_value, value) AS v, taken_at FROM readings) r
        GROUP BY run_id, point_id`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "run_point_figures"`);
  }
}
