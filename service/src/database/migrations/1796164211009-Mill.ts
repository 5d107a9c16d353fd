import { MigrationInterface, QueryRunner } from 'typeorm';

export class Mill1796164211009 implements MigrationInterface {
  name = 'Mill1796164211009';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "mill_stands" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "mill_id" uuid NOT NULL, "position" integer NOT NULL, "name" character varying(80) NOT NULL, "roll_diameter_mm" numeric NOT NULL, "barrel_length_mm" numeric NOT NULL, "roll_speed_ratio" numeric NOT NULL, "max_separating_force_kn" numeric NOT NULL, "notes" text NOT NULL DEFAULT '', CONSTRAINT "PK_9ee7b189d4ae9b896e1b2ba37b0" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_5caf4f42e7e3c9cf60f40644c5" ON "mill_stands"  ("mill_id", "position") `);
    await queryRunner.query(
      `CREATE TABLE "mills" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "name" character varying(120) NOT NULL, "engine_id" uuid NOT NULL, "notes" text NOT NULL DEFAULT '', "settings" jsonb NOT NULL, "quote_rates" jsonb NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_47ca430991ad0b2a3c89b0129fd" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_b5937632ef770dd4a9994896c7" ON "mills"  ("name") `);
    await queryRunner.query(`CREATE INDEX "IDX_a83e28ac43f5e2d69caf422143" ON "mills"  ("engine_id") `);
    await queryRunner.query(
      `CREATE TABLE "mill_schedule_passes" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "schedule_id" uuid NOT NULL, "seq" integer NOT NULL, "stand_position" integer NOT NULL, "entry" jsonb NOT NULL, "exit" jsonb NOT NULL, "expected_temperature_c" numeric NOT NULL, "notes" text NOT NULL DEFAULT '', CONSTRAINT "PK_b724fe934bd1fa798f4492b1be2" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_e8236fefc7b65aa3765a9cdf40" ON "mill_schedule_passes"  ("schedule_id", "seq") `);
    await queryRunner.query(
      `CREATE TABLE "mill_schedules" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "mill_id" uuid NOT NULL, "name" character varying(160) NOT NULL, "is_template" boolean NOT NULL DEFAULT false, "archived" boolean NOT NULL DEFAULT false, "product_shape" character varying(16) NOT NULL, "product_height_mm" numeric NOT NULL, "product_width_mm" numeric NOT NULL, "steel_grade" character varying(120) NOT NULL, "carbon_pct" numeric NOT NULL, "stock" jsonb NOT NULL, "stock_length_mm" numeric NOT NULL, "template_id" uuid, "lot_id" uuid, "notes" text NOT NULL DEFAULT '', "created_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_74eb91c91b094276340570fdace" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_c2201fa1a3b69cac0bcb7d55f1" ON "mill_schedules"  ("mill_id") `);
    await queryRunner.query(`CREATE INDEX "IDX_6b3d0a577dbe7967893369e90f" ON "mill_schedules"  ("lot_id") `);
    await queryRunner.query(
      `CREATE TABLE "mill_bars" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "run_id" uuid NOT NULL, "mill_id" uuid NOT NULL, "bar_code" character varying(40) NOT NULL, "schedule_id" uuid, "lot_id" uuid, "stock" jsonb NOT NULL, "stock_length_mm" numeric NOT NULL, "weight_kg" numeric, "scrapped" boolean NOT NULL DEFAULT false, "scrap_reason" text, "notes" text NOT NULL DEFAULT '', "created_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_846998a65d85a612dedc57e149f" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_24ccdfd25c9fe7147db8843065" ON "mill_bars"  ("run_id") `);
    await queryRunner.query(`CREATE INDEX "IDX_2a9583d66b62e95d95cf76f922" ON "mill_bars"  ("lot_id") `);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_cae2c7ff5645fe4ce91ddb7e41" ON "mill_bars"  ("run_id", "bar_code") `);
    await queryRunner.query(
      `CREATE TABLE "mill_passes" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "client_id" uuid, "bar_id" uuid NOT NULL, "run_id" uuid NOT NULL, "pass_number" integer NOT NULL, "stand_position" integer NOT NULL, "stand_name" character varying(80) NOT NULL, "at" TIMESTAMP WITH TIME ZONE NOT NULL, "measured_temperature_c" numeric NOT NULL, "entry" jsonb NOT NULL, "exit" jsonb NOT NULL, "planned_exit" jsonb, "notes" text NOT NULL DEFAULT '', "logged_by" uuid NOT NULL, "calc" jsonb NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_29e83ea7c7444f9d8b32bd455c0" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(
      `CREATE UNIQUE INDEX "IDX_4770e23a4316c49f4ab8764eed" ON "mill_passes"  ("client_id") WHERE client_id IS NOT NULL`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_2cd0d2b386ae26cfa107df842f" ON "mill_passes"  ("run_id") `);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_109932278bee4bb5fd61e3c037" ON "mill_passes"  ("bar_id", "pass_number") `);
    await queryRunner.query(
      `CREATE TABLE "mill_lots" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "reference" character varying(24) NOT NULL, "customer_name" character varying(160) NOT NULL, "customer_email" character varying(254) NOT NULL, "customer_contact" character varying(160) NOT NULL DEFAULT '', "product_shape" character varying(16) NOT NULL, "product_height_mm" numeric NOT NULL, "product_width_mm" numeric NOT NULL, "steel_grade" character varying(120) NOT NULL, "carbon_pct" numeric, "quantity_tonnes" numeric NOT NULL, "due_date" date NOT NULL, "status" character varying(16) NOT NULL DEFAULT 'enquiry', "produced_tonnes" numeric NOT NULL DEFAULT '0', "scrapped_tonnes" numeric NOT NULL DEFAULT '0', "mill_id" uuid, "notes" text NOT NULL DEFAULT '', "created_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "version" integer NOT NULL, CONSTRAINT "PK_3a7e46354986151bc7232fc5200" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_396acd402698450a07ac34aa36" ON "mill_lots"  ("reference") `);
    await queryRunner.query(`CREATE INDEX "IDX_58eac8ac0db9300442bd3a8dbd" ON "mill_lots"  ("status") `);
    await queryRunner.query(
      `CREATE TABLE "mill_lot_status_changes" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "lot_id" uuid NOT NULL, "from_status" character varying(16), "to_status" character varying(16) NOT NULL, "by_user" uuid NOT NULL, "at" TIMESTAMP WITH TIME ZONE NOT NULL, "note" text, CONSTRAINT "PK_79df4471b3635557904d3e01794" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_ea5a2809dba996f6b4b54229c1" ON "mill_lot_status_changes"  ("lot_id") `);
    await queryRunner.query(
      `CREATE TABLE "mill_lot_runs" ("lot_id" uuid NOT NULL, "run_id" uuid NOT NULL, "linked_by" uuid NOT NULL, "linked_at" TIMESTAMP WITH TIME ZONE NOT NULL, CONSTRAINT "PK_581bba8fdec46e0d879e7f71003" PRIMARY KEY ("lot_id", "run_id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_ac8279c456745d759413d085d1" ON "mill_lot_runs"  ("run_id") `);
    await queryRunner.query(
      `CREATE TABLE "mill_quotes" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "lot_id" uuid NOT NULL, "number" integer NOT NULL, "inputs" jsonb NOT NULL, "result" jsonb NOT NULL, "total" numeric NOT NULL, "currency" character varying(3) NOT NULL, "notes" text NOT NULL DEFAULT '', "created_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "sent_at" TIMESTAMP WITH TIME ZONE, "sent_to" character varying(254), CONSTRAINT "PK_a3290401bdd65007cb8195e777f" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_9bef306a7b442ac6331e485e67" ON "mill_quotes"  ("lot_id", "number") `);
    await queryRunner.query(
      `ALTER TABLE "mill_stands" ADD CONSTRAINT "FK_28ca88bc367524afdc08a74959b" FOREIGN KEY ("mill_id") REFERENCES "mills"("id") ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_schedule_passes" ADD CONSTRAINT "FK_1c75bd44c0c3b1c3ea4509433b9" FOREIGN KEY ("schedule_id") REFERENCES "mill_schedules"("id") ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    // Integrity with other modules' tables and within the mill's own (ids only in the entities).
    await queryRunner.query(
      `ALTER TABLE "mills" ADD CONSTRAINT "fk_mills_engine" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_schedules" ADD CONSTRAINT "fk_mill_schedules_mill" FOREIGN KEY ("mill_id") REFERENCES "mills"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_schedules" ADD CONSTRAINT "fk_mill_schedules_template" FOREIGN KEY ("template_id") REFERENCES "mill_schedules"("id") ON DELETE SET NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_schedules" ADD CONSTRAINT "fk_mill_schedules_lot" FOREIGN KEY ("lot_id") REFERENCES "mill_lots"("id") ON DELETE SET NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_schedules" ADD CONSTRAINT "fk_mill_schedules_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_bars" ADD CONSTRAINT "fk_mill_bars_run" FOREIGN KEY ("run_id") REFERENCES "runs"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_bars" ADD CONSTRAINT "fk_mill_bars_mill" FOREIGN KEY ("mill_id") REFERENCES "mills"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_bars" ADD CONSTRAINT "fk_mill_bars_schedule" FOREIGN KEY ("schedule_id") REFERENCES "mill_schedules"("id") ON DELETE SET NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_bars" ADD CONSTRAINT "fk_mill_bars_lot" FOREIGN KEY ("lot_id") REFERENCES "mill_lots"("id") ON DELETE SET NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_bars" ADD CONSTRAINT "fk_mill_bars_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_passes" ADD CONSTRAINT "fk_mill_passes_bar" FOREIGN KEY ("bar_id") REFERENCES "mill_bars"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_passes" ADD CONSTRAINT "fk_mill_passes_run" FOREIGN KEY ("run_id") REFERENCES "runs"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_passes" ADD CONSTRAINT "fk_mill_passes_logged_by" FOREIGN KEY ("logged_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_lots" ADD CONSTRAINT "fk_mill_lots_mill" FOREIGN KEY ("mill_id") REFERENCES "mills"("id") ON DELETE SET NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_lots" ADD CONSTRAINT "fk_mill_lots_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_lot_status_changes" ADD CONSTRAINT "fk_mill_lot_status_changes_lot" FOREIGN KEY ("lot_id") REFERENCES "mill_lots"("id") ON DELETE CASCADE`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_lot_status_changes" ADD CONSTRAINT "fk_mill_lot_status_changes_by" FOREIGN KEY ("by_user") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_lot_runs" ADD CONSTRAINT "fk_mill_lot_runs_lot" FOREIGN KEY ("lot_id") REFERENCES "mill_lots"("id") ON DELETE CASCADE`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_lot_runs" ADD CONSTRAINT "fk_mill_lot_runs_run" FOREIGN KEY ("run_id") REFERENCES "runs"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_lot_runs" ADD CONSTRAINT "fk_mill_lot_runs_linked_by" FOREIGN KEY ("linked_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_quotes" ADD CONSTRAINT "fk_mill_quotes_lot" FOREIGN KEY ("lot_id") REFERENCES "mill_lots"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "mill_quotes" ADD CONSTRAINT "fk_mill_quotes_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "mill_quotes" DROP CONSTRAINT "fk_mill_quotes_created_by"`);
    await queryRunner.query(`ALTER TABLE "mill_quotes" DROP CONSTRAINT "fk_mill_quotes_lot"`);
    await queryRunner.query(`ALTER TABLE "mill_lot_runs" DROP CONSTRAINT "fk_mill_lot_runs_linked_by"`);
    await queryRunner.query(`ALTER TABLE "mill_lot_runs" DROP CONSTRAINT "fk_mill_lot_runs_run"`);
    await queryRunner.query(`ALTER TABLE "mill_lot_runs" DROP CONSTRAINT "fk_mill_lot_runs_lot"`);
    await queryRunner.query(`ALTER TABLE "mill_lot_status_changes" DROP CONSTRAINT "fk_mill_lot_status_changes_by"`);
    await queryRunner.query(`ALTER TABLE "mill_lot_status_changes" DROP CONSTRAINT "fk_mill_lot_status_changes_lot"`);
    await queryRunner.query(`ALTER TABLE "mill_lots" DROP CONSTRAINT "fk_mill_lots_created_by"`);
    await queryRunner.query(`ALTER TABLE "mill_lots" DROP CONSTRAINT "fk_mill_lots_mill"`);
    await queryRunner.query(`ALTER TABLE "mill_passes" DROP CONSTRAINT "fk_mill_passes_logged_by"`);
    await queryRunner.query(`ALTER TABLE "mill_passes" DROP CONSTRAINT "fk_mill_passes_run"`);
    await queryRunner.query(`ALTER TABLE "mill_passes" DROP CONSTRAINT "fk_mill_passes_bar"`);
    await queryRunner.query(`ALTER TABLE "mill_bars" DROP CONSTRAINT "fk_mill_bars_created_by"`);
    await queryRunner.query(`ALTER TABLE "mill_bars" DROP CONSTRAINT "fk_mill_bars_lot"`);
    await queryRunner.query(`ALTER TABLE "mill_bars" DROP CONSTRAINT "fk_mill_bars_schedule"`);
    await queryRunner.query(`ALTER TABLE "mill_bars" DROP CONSTRAINT "fk_mill_bars_mill"`);
    await queryRunner.query(`ALTER TABLE "mill_bars" DROP CONSTRAINT "fk_mill_bars_run"`);
    await queryRunner.query(`ALTER TABLE "mill_schedules" DROP CONSTRAINT "fk_mill_schedules_created_by"`);
    await queryRunner.query(`ALTER TABLE "mill_schedules" DROP CONSTRAINT "fk_mill_schedules_lot"`);
    await queryRunner.query(`ALTER TABLE "mill_schedules" DROP CONSTRAINT "fk_mill_schedules_template"`);
    await queryRunner.query(`ALTER TABLE "mill_schedules" DROP CONSTRAINT "fk_mill_schedules_mill"`);
    await queryRunner.query(`ALTER TABLE "mills" DROP CONSTRAINT "fk_mills_engine"`);
    await queryRunner.query(`ALTER TABLE "mill_schedule_passes" DROP CONSTRAINT "FK_1c75bd44c0c3b1c3ea4509433b9"`);
    await queryRunner.query(`ALTER TABLE "mill_stands" DROP CONSTRAINT "FK_28ca88bc367524afdc08a74959b"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_9bef306a7b442ac6331e485e67"`);
    await queryRunner.query(`DROP TABLE "mill_quotes"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_ac8279c456745d759413d085d1"`);
    await queryRunner.query(`DROP TABLE "mill_lot_runs"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_ea5a2809dba996f6b4b54229c1"`);
    await queryRunner.query(`DROP TABLE "mill_lot_status_changes"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_58eac8ac0db9300442bd3a8dbd"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_396acd402698450a07ac34aa36"`);
    await queryRunner.query(`DROP TABLE "mill_lots"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_109932278bee4bb5fd61e3c037"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_2cd0d2b386ae26cfa107df842f"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_4770e23a4316c49f4ab8764eed"`);
    await queryRunner.query(`DROP TABLE "mill_passes"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_cae2c7ff5645fe4ce91ddb7e41"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_2a9583d66b62e95d95cf76f922"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_24ccdfd25c9fe7147db8843065"`);
    await queryRunner.query(`DROP TABLE "mill_bars"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_6b3d0a577dbe7967893369e90f"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_c2201fa1a3b69cac0bcb7d55f1"`);
    await queryRunner.query(`DROP TABLE "mill_schedules"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_e8236fefc7b65aa3765a9cdf40"`);
    await queryRunner.query(`DROP TABLE "mill_schedule_passes"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_a83e28ac43f5e2d69caf422143"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_b5937632ef770dd4a9994896c7"`);
    await queryRunner.query(`DROP TABLE "mills"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_5caf4f42e7e3c9cf60f40644c5"`);
    await queryRunner.query(`DROP TABLE "mill_stands"`);
  }
}
