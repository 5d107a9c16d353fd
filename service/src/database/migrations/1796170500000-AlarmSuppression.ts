import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Alarms the crew can trust: suppression by design (a higher alarm of the same point) and by run state. A point
 * says whether its absolute limits suppress its rise-above-ambient and rate-of-rise alarms and in which run states
 * its alarms mean nothing; an alarm records whether, and by what, it is suppressed.
 */
export class AlarmSuppression1796170500000 implements MigrationInterface {
  name = 'AlarmSuppression1796170500000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "measurement_points" ADD "related_suppression" boolean NOT NULL DEFAULT true`);
    await queryRunner.query(`ALTER TABLE "measurement_points" ADD "suppressed_in_states" text array NOT NULL DEFAULT '{}'`);
    await queryRunner.query(`ALTER TABLE "alarms" ADD "suppression" character varying(8)`);
    await queryRunner.query(`ALTER TABLE "alarms" ADD "suppressed_by" uuid`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "alarms" DROP COLUMN "suppressed_by"`);
    await queryRunner.query(`ALTER TABLE "alarms" DROP COLUMN "suppression"`);
    await queryRunner.query(`ALTER TABLE "measurement_points" DROP COLUMN "suppressed_in_states"`);
    await queryRunner.query(`ALTER TABLE "measurement_points" DROP COLUMN "related_suppression"`);
  }
}
