import { MigrationInterface, QueryRunner } from 'typeorm';

/** Visitor boards: a public, read-only window on a run or an engine, with its story and photo. */
export class VisitorBoards1796422583042 implements MigrationInterface {
  name = 'VisitorBoards1796422583042';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "visitor_boards" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "scope" character varying(8) NOT NULL, "engine_id" uuid NOT NULL, "run_id" uuid, "slug" character varying(64) NOT NULL, "enabled" boolean NOT NULL DEFAULT false, "story" text NOT NULL DEFAULT '', "photo_key" character varying(200), "photo_content_type" character varying(32), "created_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_visitor_boards" PRIMARY KEY ("id"), CONSTRAINT "CHK_visitor_boards_scope" CHECK (("scope" = 'run' AND "run_id" IS NOT NULL) OR ("scope" = 'engine' AND "run_id" IS NULL)))`,
    );
    await queryRunner.query(`CREATE UNIQUE INDEX "visitor_boards_slug" ON "visitor_boards" ("slug")`);
    await queryRunner.query(`CREATE UNIQUE INDEX "visitor_boards_run" ON "visitor_boards" ("run_id") WHERE "run_id" IS NOT NULL`);
    await queryRunner.query(`CREATE UNIQUE INDEX "visitor_boards_engine" ON "visitor_boards" ("engine_id") WHERE "run_id" IS NULL`);
    await queryRunner.query(
      `ALTER TABLE "visitor_boards" ADD CONSTRAINT "FK_visitor_boards_engine" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE CASCADE`,
    );
    await queryRunner.query(
      `ALTER TABLE "visitor_boards" ADD CONSTRAINT "FK_visitor_boards_run" FOREIGN KEY ("run_id") REFERENCES "runs"("id") ON DELETE CASCADE`,
    );
    await queryRunner.query(
      `ALTER TABLE "visitor_boards" ADD CONSTRAINT "FK_visitor_boards_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id")`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "visitor_boards"`);
  }
}
