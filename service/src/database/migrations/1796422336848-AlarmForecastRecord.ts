import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A pre-alarm (kind 'pre_alarm', priority 'advisory') is recorded like any alarm, with the forecast it was raised on:
 * the limit it was heading for, the minutes to it and the rate per minute at the time.
 */
export class AlarmForecastRecord1796422336848 implements MigrationInterface {
  name = 'AlarmForecastRecord1796422336848';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "alarms" ADD "forecast_limit_kind" character varying(24)`);
    await queryRunner.query(`ALTER TABLE "alarms" ADD "forecast_minutes" double precision`);
    await queryRunner.query(`ALTER TABLE "alarms" ADD "forecast_rate_per_min" double precision`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "alarms" DROP COLUMN "forecast_rate_per_min"`);
    await queryRunner.query(`ALTER TABLE "alarms" DROP COLUMN "forecast_minutes"`);
    await queryRunner.query(`ALTER TABLE "alarms" DROP COLUMN "forecast_limit_kind"`);
  }
}
