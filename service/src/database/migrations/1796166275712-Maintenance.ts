import { MigrationInterface, QueryRunner } from 'typeorm';

/** Maintenance (inspection plans, inspections, work records, kept run figures) and the lubrication programme (oils, consumption). */
export class Maintenance1796166275712 implements MigrationInterface {
  name = 'Maintenance1796166275712';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "inspection_plans" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "engine_id" uuid NOT NULL, "component_kind" character varying(24) NOT NULL, "bearing_id" uuid, "component_label" character varying(120) NOT NULL, "title" character varying(160) NOT NULL, "inspection_kind" character varying(32) NOT NULL, "interval_run_hours" numeric, "interval_revolutions" numeric, "interval_days" numeric, "last_done_at" TIMESTAMP WITH TIME ZONE NOT NULL, "last_done_run_hours" double precision NOT NULL, "last_done_revolutions" double precision NOT NULL, "last_reset_by_work_record_id" uuid, "last_reset_by_inspection_id" uuid, "hazards" character varying(24) array NOT NULL DEFAULT '{}', "notes" text NOT NULL DEFAULT '', "active" boolean NOT NULL DEFAULT true, "created_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_8c16d2b43b2cf86be36c96a3094" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_ef8a5fcfd0582a8fc215b474d7" ON "inspection_plans"  ("bearing_id") `);
    await queryRunner.query(`CREATE INDEX "IDX_1bcd66c17d7fe0fcbe285e122c" ON "inspection_plans"  ("engine_id", "active") `);
    await queryRunner.query(
      `CREATE TABLE "inspections" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "engine_id" uuid NOT NULL, "bearing_id" uuid, "plan_id" uuid, "completes_plan" boolean NOT NULL DEFAULT false, "kind" character varying(32) NOT NULL, "title" character varying(160) NOT NULL, "inspected_at" TIMESTAMP WITH TIME ZONE NOT NULL, "inspector_name" character varying(160) NOT NULL DEFAULT '', "run_hours_at" double precision NOT NULL, "revolutions_at" double precision NOT NULL, "findings" text NOT NULL DEFAULT '', "follow_up_actions" jsonb NOT NULL DEFAULT '[]', "prompted_by_alarm_id" uuid, "prompted_by_run_id" uuid, "recorded_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_a484980015782324454d8c88abe" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_70d587b9cb60ac622ab5f5b349" ON "inspections"  ("bearing_id") `);
    await queryRunner.query(`CREATE INDEX "IDX_bac72880ccc8a75a974d4acbc0" ON "inspections"  ("plan_id") `);
    await queryRunner.query(`CREATE INDEX "IDX_bab03411e6f3fac60dfffdcb6e" ON "inspections"  ("engine_id", "inspected_at") `);
    await queryRunner.query(
      `CREATE TABLE "inspection_measurements" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "inspection_id" uuid NOT NULL, "sequence" integer NOT NULL, "kind" character varying(32) NOT NULL, "label" character varying(120) NOT NULL, "crank_angle_deg" double precision, "value" double precision NOT NULL, "unit" character varying(8) NOT NULL, "nominal" double precision, "tolerance_min" double precision, "tolerance_max" double precision, "out_of_tolerance" boolean NOT NULL, "note" text NOT NULL DEFAULT '', CONSTRAINT "PK_f808ca74bec0464c1306fbfd798" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_787ac26888a33b56248804c4b0" ON "inspection_measurements"  ("inspection_id") `);
    await queryRunner.query(
      `CREATE TABLE "inspection_attachments" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "inspection_id" uuid NOT NULL, "kind" character varying(8) NOT NULL, "content_type" character varying(64) NOT NULL, "filename" character varying(200) NOT NULL, "size_bytes" integer NOT NULL, "storage_key" character varying(200) NOT NULL, "caption" character varying(300) NOT NULL DEFAULT '', "uploaded_by" uuid NOT NULL, "uploaded_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "UQ_38e2347722957a567f730194f30" UNIQUE ("storage_key"), CONSTRAINT "PK_445e952c4824b0489a251d98c73" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_df0d5ece5d71f057e92fe46d2b" ON "inspection_attachments"  ("inspection_id") `);
    await queryRunner.query(
      `CREATE TABLE "work_records" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "engine_id" uuid NOT NULL, "bearing_id" uuid, "title" character varying(160) NOT NULL, "description" text NOT NULL DEFAULT '', "performed_by" character varying(300) NOT NULL, "parts" jsonb NOT NULL DEFAULT '[]', "labour_hours" numeric NOT NULL DEFAULT '0', "prompted_by_inspection_id" uuid, "prompted_by_alarm_id" uuid, "hazards" character varying(24) array NOT NULL DEFAULT '{}', "satisfies_plan_ids" uuid array NOT NULL DEFAULT '{}', "status" character varying(8) NOT NULL DEFAULT 'open', "started_at" TIMESTAMP WITH TIME ZONE NOT NULL, "closed_at" TIMESTAMP WITH TIME ZONE, "closed_by" uuid, "close_note" text, "run_hours_at_completion" double precision, "revolutions_at_completion" double precision, "reset_plan_ids" uuid array NOT NULL DEFAULT '{}', "recorded_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_f68bc319f4f758a975804787331" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_e858c06dd19c9a5fbda8a2fcca" ON "work_records"  ("bearing_id") `);
    await queryRunner.query(`CREATE INDEX "IDX_f14612dbfaaad013af9070e445" ON "work_records"  ("prompted_by_inspection_id") `);
    await queryRunner.query(`CREATE INDEX "IDX_a898145874dbc0ff5736a80d79" ON "work_records"  ("engine_id", "started_at") `);
    await queryRunner.query(
      `CREATE TABLE "run_point_stats" ("run_id" uuid NOT NULL, "point_id" uuid NOT NULL, "peak" double precision, "mean" double precision, "least" double precision, "count" integer NOT NULL, "first_at" TIMESTAMP WITH TIME ZONE, "last_at" TIMESTAMP WITH TIME ZONE, "computed_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_2f6987aedebccb2825dddb62051" PRIMARY KEY ("run_id", "point_id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_291e43e7945426faef6bb737e8" ON "run_point_stats"  ("point_id") `);
    await queryRunner.query(
      `CREATE TABLE "oils" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "name" character varying(120) NOT NULL, "grade" character varying(60) NOT NULL, "viscosity_40_cst" numeric NOT NULL, "viscosity_100_cst" numeric NOT NULL, "density_kg_m3_at_15c" numeric, "figures_source" character varying(300) NOT NULL, "notes" text NOT NULL DEFAULT '', "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "UQ_b659613d3a72df84fb77ff3a28f" UNIQUE ("name"), CONSTRAINT "PK_f51c8836984bf13b6049ccb9ba6" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(
      `CREATE TABLE "lubrication_point_oils" ("lubrication_point_id" uuid NOT NULL, "engine_id" uuid NOT NULL, "oil_id" uuid NOT NULL, "assigned_by" uuid NOT NULL, "assigned_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_453fdc2010bef21f3fc5f0d3792" PRIMARY KEY ("lubrication_point_id"))`,
    );
    await queryRunner.query(
      `CREATE TABLE "oil_consumption_entries" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "engine_id" uuid NOT NULL, "run_id" uuid NOT NULL, "lubrication_point_id" uuid NOT NULL, "method" character varying(8) NOT NULL, "quantity_litres" numeric, "level_start_litres" numeric, "level_end_litres" numeric, "used_litres" numeric NOT NULL, "note" text NOT NULL DEFAULT '', "recorded_by" uuid NOT NULL, "recorded_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_98f328f1be144092dbfc0f59f0d" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_e2dbb354909b3877dba031ba02" ON "oil_consumption_entries"  ("run_id") `);
    await queryRunner.query(
      `CREATE INDEX "IDX_453ab9cfa7b0cfe3ed868a103f" ON "oil_consumption_entries"  ("lubrication_point_id", "run_id") `,
    );
    await queryRunner.query(
      `ALTER TABLE "inspection_measurements" ADD CONSTRAINT "FK_787ac26888a33b56248804c4b09" FOREIGN KEY ("inspection_id") REFERENCES "inspections"("id") ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "inspection_attachments" ADD CONSTRAINT "FK_df0d5ece5d71f057e92fe46d2b0" FOREIGN KEY ("inspection_id") REFERENCES "inspections"("id") ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    // Links to other areas' tables, by hand (no ORM relations across modules).
    await queryRunner.query(
      `ALTER TABLE "inspection_plans" ADD CONSTRAINT "fk_inspection_plans_engine_id" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "inspection_plans" ADD CONSTRAINT "fk_inspection_plans_bearing_id" FOREIGN KEY ("bearing_id") REFERENCES "bearings"("id") ON DELETE SET NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "inspection_plans" ADD CONSTRAINT "fk_inspection_plans_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "inspections" ADD CONSTRAINT "fk_inspections_engine_id" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "inspections" ADD CONSTRAINT "fk_inspections_bearing_id" FOREIGN KEY ("bearing_id") REFERENCES "bearings"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "inspections" ADD CONSTRAINT "fk_inspections_plan_id" FOREIGN KEY ("plan_id") REFERENCES "inspection_plans"("id") ON DELETE SET NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "inspections" ADD CONSTRAINT "fk_inspections_prompted_by_alarm_id" FOREIGN KEY ("prompted_by_alarm_id") REFERENCES "alarms"("id") ON DELETE SET NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "inspections" ADD CONSTRAINT "fk_inspections_prompted_by_run_id" FOREIGN KEY ("prompted_by_run_id") REFERENCES "runs"("id") ON DELETE SET NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "inspections" ADD CONSTRAINT "fk_inspections_recorded_by" FOREIGN KEY ("recorded_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "inspection_attachments" ADD CONSTRAINT "fk_inspection_attachments_uploaded_by" FOREIGN KEY ("uploaded_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "work_records" ADD CONSTRAINT "fk_work_records_engine_id" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "work_records" ADD CONSTRAINT "fk_work_records_bearing_id" FOREIGN KEY ("bearing_id") REFERENCES "bearings"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "work_records" ADD CONSTRAINT "fk_work_records_prompted_by_inspection_id" FOREIGN KEY ("prompted_by_inspection_id") REFERENCES "inspections"("id") ON DELETE SET NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "work_records" ADD CONSTRAINT "fk_work_records_prompted_by_alarm_id" FOREIGN KEY ("prompted_by_alarm_id") REFERENCES "alarms"("id") ON DELETE SET NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "work_records" ADD CONSTRAINT "fk_work_records_recorded_by" FOREIGN KEY ("recorded_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "work_records" ADD CONSTRAINT "fk_work_records_closed_by" FOREIGN KEY ("closed_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "inspection_plans" ADD CONSTRAINT "fk_inspection_plans_last_reset_by_work_record_id" FOREIGN KEY ("last_reset_by_work_record_id") REFERENCES "work_records"("id") ON DELETE SET NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "inspection_plans" ADD CONSTRAINT "fk_inspection_plans_last_reset_by_inspection_id" FOREIGN KEY ("last_reset_by_inspection_id") REFERENCES "inspections"("id") ON DELETE SET NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "run_point_stats" ADD CONSTRAINT "fk_run_point_stats_run_id" FOREIGN KEY ("run_id") REFERENCES "runs"("id") ON DELETE CASCADE`,
    );
    await queryRunner.query(
      `ALTER TABLE "run_point_stats" ADD CONSTRAINT "fk_run_point_stats_point_id" FOREIGN KEY ("point_id") REFERENCES "measurement_points"("id") ON DELETE CASCADE`,
    );
    await queryRunner.query(
      `ALTER TABLE "lubrication_point_oils" ADD CONSTRAINT "fk_lubrication_point_oils_lubrication_point_id" FOREIGN KEY ("lubrication_point_id") REFERENCES "lubrication_points"("id") ON DELETE CASCADE`,
    );
    await queryRunner.query(
      `ALTER TABLE "lubrication_point_oils" ADD CONSTRAINT "fk_lubrication_point_oils_engine_id" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE CASCADE`,
    );
    await queryRunner.query(
      `ALTER TABLE "lubrication_point_oils" ADD CONSTRAINT "fk_lubrication_point_oils_oil_id" FOREIGN KEY ("oil_id") REFERENCES "oils"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "lubrication_point_oils" ADD CONSTRAINT "fk_lubrication_point_oils_assigned_by" FOREIGN KEY ("assigned_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "oil_consumption_entries" ADD CONSTRAINT "fk_oil_consumption_entries_engine_id" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "oil_consumption_entries" ADD CONSTRAINT "fk_oil_consumption_entries_run_id" FOREIGN KEY ("run_id") REFERENCES "runs"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "oil_consumption_entries" ADD CONSTRAINT "fk_oil_consumption_entries_lubrication_point_id" FOREIGN KEY ("lubrication_point_id") REFERENCES "lubrication_points"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "oil_consumption_entries" ADD CONSTRAINT "fk_oil_consumption_entries_recorded_by" FOREIGN KEY ("recorded_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "inspection_plans" ADD CONSTRAINT "ck_inspection_plans_interval" CHECK (interval_run_hours IS NOT NULL OR interval_revolutions IS NOT NULL OR interval_days IS NOT NULL)`,
    );
    await queryRunner.query(`ALTER TABLE "work_records" ADD CONSTRAINT "ck_work_records_status" CHECK (status IN ('open', 'closed'))`);
    await queryRunner.query(`ALTER TABLE "oil_consumption_entries" ADD CONSTRAINT "ck_oil_consumption_used" CHECK (used_litres >= 0)`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "inspection_plans" DROP CONSTRAINT "fk_inspection_plans_last_reset_by_work_record_id"`);
    await queryRunner.query(`ALTER TABLE "inspection_plans" DROP CONSTRAINT "fk_inspection_plans_last_reset_by_inspection_id"`);
    await queryRunner.query(`ALTER TABLE "inspections" DROP CONSTRAINT "fk_inspections_plan_id"`);
    await queryRunner.query(`DROP TABLE "oil_consumption_entries"`);
    await queryRunner.query(`DROP TABLE "lubrication_point_oils"`);
    await queryRunner.query(`DROP TABLE "oils"`);
    await queryRunner.query(`DROP TABLE "run_point_stats"`);
    await queryRunner.query(`DROP TABLE "work_records"`);
    await queryRunner.query(`DROP TABLE "inspection_attachments"`);
    await queryRunner.query(`DROP TABLE "inspection_measurements"`);
    await queryRunner.query(`DROP TABLE "inspection_plans"`);
    await queryRunner.query(`DROP TABLE "inspections"`);
  }
}
