import { MigrationInterface, QueryRunner } from 'typeorm';

/** The site barometer a card set's vacuum and gauge readings are turned absolute with (null: the standard atmosphere). */
export class CardSetBarometer1796414559444 implements MigrationInterface {
  name = 'CardSetBarometer1796414559444';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "card_sets" ADD "barometer_in_hg" double precision`);
    await queryRunner.query(`ALTER TABLE "card_sets" ADD "barometer_source" character varying(8)`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "card_sets" DROP COLUMN "barometer_source"`);
    await queryRunner.query(`ALTER TABLE "card_sets" DROP COLUMN "barometer_in_hg"`);
  }
}
