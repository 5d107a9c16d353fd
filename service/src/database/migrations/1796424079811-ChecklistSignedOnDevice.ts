import type { MigrationInterface, QueryRunner } from 'typeorm';

/** A checklist signed on a tablet without a connection keeps the tablet's time beside the server's. */
export class ChecklistSignedOnDevice1796424079811 implements MigrationInterface {
  name = 'ChecklistSignedOnDevice1796424079811';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "checklists" ADD "signed_on_device_at" TIMESTAMP WITH TIME ZONE`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "checklists" DROP COLUMN "signed_on_device_at"`);
  }
}
