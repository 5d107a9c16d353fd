import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Several service instances on one database: a per-engine count of readings transactions (an instance whose cached
 * recent readings were counted at an older value reads them again), and the table the socket.io PostgreSQL adapter
 * uses for payloads too large for a NOTIFY.
 */
export class SeveralInstances1796424019287 implements MigrationInterface {
  name = 'SeveralInstances1796424019287';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "engine_ingest_marks" ("engine_id" uuid NOT NULL, "seq" bigint NOT NULL, CONSTRAINT "PK_engine_ingest_marks" PRIMARY KEY ("engine_id"))`,
    );
    await queryRunner.query(
      `ALTER TABLE "engine_ingest_marks" ADD CONSTRAINT "FK_engine_ingest_marks_engine" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE CASCADE`,
    );
    await queryRunner.query(
      `CREATE TABLE "socket_io_attachments" ("id" bigserial UNIQUE, "created_at" timestamptz DEFAULT now(), "payload" bytea)`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "socket_io_attachments"`);
    await queryRunner.query(`DROP TABLE "engine_ingest_marks"`);
  }
}
