import { MigrationInterface, QueryRunner } from 'typeorm';

/** Payments for customer lots (deposits, balances, refunds, the webhook events applied) and the site's deposit share. */
export class Payments1796422787315 implements MigrationInterface {
  name = 'Payments1796422787315';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "payments" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "lot_id" uuid NOT NULL, "kind" character varying(16) NOT NULL, "state" character varying(16) NOT NULL DEFAULT 'asked', "amount_minor" integer NOT NULL, "refunded_minor" integer NOT NULL DEFAULT '0', "currency" character varying(3) NOT NULL, "session_id" character varying(255) NOT NULL, "checkout_url" text NOT NULL, "payment_intent_id" character varying(255), "emailed_to" character varying(254) NOT NULL, "decline_reason" text, "asked_by" uuid NOT NULL, "asked_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "paid_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "PK_197ab7af18c93fbb0c9b28b4a59" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_a611e79770b877f99ae3c5394a" ON "payments"  ("lot_id") `);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_b61ceb7c34c6de400d731bbdb4" ON "payments"  ("session_id") `);
    await queryRunner.query(
      `CREATE TABLE "payment_refunds" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "payment_id" uuid NOT NULL, "refund_ref" character varying(255) NOT NULL, "amount_minor" integer NOT NULL, "reason" text NOT NULL, "by_user" uuid NOT NULL, "at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_c33fe9426d69e3d60080c7d2f06" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_a10d6c1918989353b79932a2ba" ON "payment_refunds"  ("payment_id") `);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_83ecb45ef82da0550273d8c3f5" ON "payment_refunds"  ("refund_ref") `);
    await queryRunner.query(
      `CREATE TABLE "payment_events" ("event_id" character varying(255) NOT NULL, "type" character varying(80) NOT NULL, "received_at" TIMESTAMP WITH TIME ZONE NOT NULL, CONSTRAINT "PK_4f36a430ea944f1d250f0500d13" PRIMARY KEY ("event_id"))`,
    );
    await queryRunner.query(`ALTER TABLE "site_settings" ADD "deposit_share_pct" integer NOT NULL DEFAULT '30'`);
    await queryRunner.query(
      `ALTER TABLE "payments" ADD CONSTRAINT "fk_payments_lot" FOREIGN KEY ("lot_id") REFERENCES "mill_lots"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "payments" ADD CONSTRAINT "fk_payments_asked_by" FOREIGN KEY ("asked_by") REFERENCES "users"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "payment_refunds" ADD CONSTRAINT "fk_payment_refunds_payment" FOREIGN KEY ("payment_id") REFERENCES "payments"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "payment_refunds" ADD CONSTRAINT "fk_payment_refunds_by_user" FOREIGN KEY ("by_user") REFERENCES "users"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "site_settings" ADD CONSTRAINT "ck_site_settings_deposit_share" CHECK ("deposit_share_pct" BETWEEN 0 AND 100)`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "site_settings" DROP CONSTRAINT "ck_site_settings_deposit_share"`);
    await queryRunner.query(`ALTER TABLE "site_settings" DROP COLUMN "deposit_share_pct"`);
    await queryRunner.query(`DROP TABLE "payment_events"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_83ecb45ef82da0550273d8c3f5"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_a10d6c1918989353b79932a2ba"`);
    await queryRunner.query(`DROP TABLE "payment_refunds"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_b61ceb7c34c6de400d731bbdb4"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_a611e79770b877f99ae3c5394a"`);
    await queryRunner.query(`DROP TABLE "payments"`);
  }
}
