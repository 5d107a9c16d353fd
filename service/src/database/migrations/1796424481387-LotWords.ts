import { MigrationInterface, QueryRunner } from 'typeorm';

const WORDS: [string, string][] = [
  ['enquiry', 'on_the_slate'],
  ['quoted', 'priced'],
  ['accepted', 'ordered'],
  ['scheduled', 'on_roll_plan'],
  ['inspected', 'passed'],
  ['delivered', 'dispatched'],
];

/** Customer lots in the works' own words: their states (stored values converted) and bar-lot numbers (LOT-2026-001 → BL26-001). */
export class LotWords1796424481387 implements MigrationInterface {
  name = 'LotWords1796424481387';

  private async rename(q: QueryRunner, pairs: [string, string][]): Promise<void> {
    const cases = (col: string) => `CASE ${col} ${pairs.map(([a, b]) => `WHEN '${a}' THEN '${b}'`).join(' ')} ELSE ${col} END`;
    await q.query(`UPDATE "mill_lots" SET "status" = ${cases('"status"')}`);
    await q.query(`UPDATE "mill_lot_status_changes" SET "from_status" = ${cases('"from_status"')}, "to_status" = ${cases('"to_status"')}`);
  }

  public async up(queryRunner: QueryRunner): Promise<void> {
    await this.rename(queryRunner, WORDS);
    await queryRunner.query(`ALTER TABLE "mill_lots" ALTER COLUMN "status" SET DEFAULT 'on_the_slate'`);
    await queryRunner.query(
      `UPDATE "mill_lots" SET "reference" = 'BL' || substr("reference", 7, 2) || '-' || substr("reference", 10) WHERE "reference" ~ '^LOT-[0-9]{4}-[0-9]+$'`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `UPDATE "mill_lots" SET "reference" = 'LOT-20' || substr("reference", 3, 2) || '-' || substr("reference", 6) WHERE "reference" ~ '^BL[0-9]{2}-[0-9]+$'`,
    );
    await queryRunner.query(`ALTER TABLE "mill_lots" ALTER COLUMN "status" SET DEFAULT 'enquiry'`);
    await this.rename(
      queryRunner,
      WORDS.map(([a, b]) => [b, a]),
    );
  }
}
