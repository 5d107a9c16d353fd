import { MigrationInterface, QueryRunner } from 'typeorm';

/** Where a card's trace came from: the automatic tracer's proposal accepted or adjusted, or traced by hand. */
export class CardTraceOrigin1796422565325 implements MigrationInterface {
  name = 'CardTraceOrigin1796422565325';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "indicator_cards" ADD "trace_origin" character varying(20)`);
    // Every trace stored before the tracer proposed any was clicked by hand.
    await queryRunner.query(`UPDATE "indicator_cards" SET "trace_origin" = 'by-hand' WHERE "method" = 'trace' AND "trace" IS NOT NULL`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "indicator_cards" DROP COLUMN "trace_origin"`);
  }
}
