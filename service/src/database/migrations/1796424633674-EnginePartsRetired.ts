import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Cylinders, bearings and lubrication points left out of an engine's description are retired, not deleted: their
 * inspections, work records, oil records and indicator cards keep pointing at them.
 */
export class EnginePartsRetired1796424633674 implements MigrationInterface {
  name = 'EnginePartsRetired1796424633674';

  public async up(queryRunner: QueryRunner): Promise<void> {
    for (const table of ['cylinders', 'bearings', 'lubrication_points'])
      await queryRunner.query(`ALTER TABLE "${table}" ADD "active" boolean NOT NULL DEFAULT true`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    for (const table of ['cylinders', 'bearings', 'lubrication_points'])
      await queryRunner.query(`ALTER TABLE "${table}" DROP COLUMN "active"`);
  }
}
