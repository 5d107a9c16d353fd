import type { MigrationInterface, QueryRunner } from 'typeorm';

/** An amendment may carry the client's id, so one sent again from the tablet's outbox is stored once. */
export class ReadingAmendmentClientId1796426692568 implements MigrationInterface {
  name = 'ReadingAmendmentClientId1796426692568';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "reading_amendments" ADD "client_id" uuid`);
    await q.query(
      `CREATE UNIQUE INDEX "uq_reading_amendments_client_id" ON "reading_amendments" ("client_id") WHERE "client_id" IS NOT NULL`,
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX "uq_reading_amendments_client_id"`);
    await q.query(`ALTER TABLE "reading_amendments" DROP COLUMN "client_id"`);
  }
}
