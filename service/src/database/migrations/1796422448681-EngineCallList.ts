import { MigrationInterface, QueryRunner } from 'typeorm';

/** Per engine: how long a high-high alarm may wait unacknowledged, and the ordered call list e-mailed after that. */
export class EngineCallList1796422448681 implements MigrationInterface {
  name = 'EngineCallList1796422448681';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "engines" ADD "escalate_after_minutes" integer NOT NULL DEFAULT 5`);
    await queryRunner.query(`ALTER TABLE "engines" ADD "call_list" jsonb NOT NULL DEFAULT '[]'`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "engines" DROP COLUMN "call_list"`);
    await queryRunner.query(`ALTER TABLE "engines" DROP COLUMN "escalate_after_minutes"`);
  }
}
