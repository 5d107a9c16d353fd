import { MigrationInterface, QueryRunner } from 'typeorm';

export class RunLog1796163443370 implements MigrationInterface {
  name = 'RunLog1796163443370';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "cylinders" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "engine_id" uuid NOT NULL, "label" character varying(40) NOT NULL, "role" character varying(16) NOT NULL, "bore_in" numeric NOT NULL, "stroke_in" numeric NOT NULL, "piston_rod_in" numeric NOT NULL, "tail_rod_in" numeric NOT NULL DEFAULT '0', "clearance_percent" numeric NOT NULL DEFAULT '0', "position" integer NOT NULL DEFAULT '0', CONSTRAINT "PK_81b2b8d89b0eac9492068ed2d9f" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_810bebc27c4d456a0e11a1c866" ON "cylinders"  ("engine_id") `);
    await queryRunner.query(
      `CREATE TABLE "bearings" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "engine_id" uuid NOT NULL, "label" character varying(80) NOT NULL, "kind" character varying(24) NOT NULL, "journal_diameter_in" numeric NOT NULL, "journal_length_in" numeric NOT NULL, "load_share_percent" numeric NOT NULL DEFAULT '0', "radial_clearance_in" numeric, "lubrication_point_id" uuid, "position" integer NOT NULL DEFAULT '0', CONSTRAINT "PK_99c4355eaf4a3f363bdcc04a092" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_cb6739e22534538e876cdc6c73" ON "bearings"  ("engine_id") `);
    await queryRunner.query(
      `CREATE TABLE "lubrication_points" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "engine_id" uuid NOT NULL, "label" character varying(80) NOT NULL, "kind" character varying(24) NOT NULL, "oil_grade" character varying(80) NOT NULL DEFAULT '', "position" integer NOT NULL DEFAULT '0', CONSTRAINT "PK_f38a6bdff97d1e6292f227ce737" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_6921e5f4b73f13281d3bc4fa23" ON "lubrication_points"  ("engine_id") `);
    await queryRunner.query(
      `CREATE TABLE "measurement_points" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "engine_id" uuid NOT NULL, "code" character varying(24) NOT NULL, "label" character varying(120) NOT NULL, "kind" character varying(32) NOT NULL, "unit" character varying(16) NOT NULL, "sequence" integer NOT NULL DEFAULT '0', "normal_low" double precision, "normal_high" double precision, "low_limit" double precision, "high_limit" double precision, "high_high_limit" double precision, "max_rise_rate_per_min" double precision, "max_rise_above_ambient" double precision, "deadband" double precision, "bearing_id" uuid, "cylinder_id" uuid, "active" boolean NOT NULL DEFAULT true, CONSTRAINT "PK_6c3ce9917687be6525d7c3910a1" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_3eac736fc345b9d91713e01bd9" ON "measurement_points"  ("engine_id") `);
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_5db3fe26d130164af13a1e1024" ON "measurement_points"  ("engine_id", "code") `);
    await queryRunner.query(
      `CREATE TABLE "engines" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "name" character varying(120) NOT NULL, "builder" character varying(200) NOT NULL DEFAULT '', "year_built" character varying(40) NOT NULL DEFAULT '', "type" character varying(24) NOT NULL, "rated_speed_rpm" numeric NOT NULL, "overspeed_rpm" numeric NOT NULL, "mawp_psig" numeric NOT NULL, "pre_lube_freshness_minutes" integer NOT NULL DEFAULT '30', "flywheel_mass_lb" numeric, "flywheel_radius_of_gyration_ft" numeric, "rotating_weight_lb" numeric, "baseline_hours" numeric NOT NULL DEFAULT '0', "baseline_revolutions" numeric NOT NULL DEFAULT '0', "recorded_hours" double precision NOT NULL DEFAULT '0', "recorded_revolutions" double precision NOT NULL DEFAULT '0', "active_run_id" uuid, "notes" text NOT NULL DEFAULT '', "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "UQ_8415e2ae6055af59ec4b8c4da91" UNIQUE ("name"), CONSTRAINT "PK_983c05bf61572322f7fedb7633c" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(
      `CREATE TABLE "limit_changes" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "engine_id" uuid NOT NULL, "subject" character varying(160) NOT NULL, "field" character varying(60) NOT NULL, "old_value" text, "new_value" text, "changed_by" uuid NOT NULL, "changed_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_8a2689a2b5aff4374d8a5b7e903" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_54a9750b1c8c8d8950f8962234" ON "limit_changes"  ("engine_id") `);
    await queryRunner.query(
      `CREATE TABLE "alarms" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "engine_id" uuid NOT NULL, "run_id" uuid, "point_id" uuid, "kind" character varying(24) NOT NULL, "priority" character varying(16) NOT NULL, "state" character varying(32) NOT NULL, "condition_active" boolean NOT NULL DEFAULT true, "message" text NOT NULL, "value" double precision, "limit_value" double precision, "unit" character varying(16) NOT NULL DEFAULT '', "reading_id" bigint, "raised_at" TIMESTAMP WITH TIME ZONE NOT NULL, "acknowledged_at" TIMESTAMP WITH TIME ZONE, "acknowledged_by" uuid, "returned_at" TIMESTAMP WITH TIME ZONE, "shelved_until" TIMESTAMP WITH TIME ZONE, "shelve_reason" text, "shelved_by" uuid, "emailed_at" TIMESTAMP WITH TIME ZONE, "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_b776da486fb19d38b4f7777a6da" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_2233da6437d0f74f7450fa241a" ON "alarms"  ("run_id") `);
    await queryRunner.query(`CREATE INDEX "IDX_294526b0b2e6d730af64c5f826" ON "alarms"  ("engine_id", "state") `);
    await queryRunner.query(
      `CREATE UNIQUE INDEX "alarms_one_open_per_condition" ON "alarms"  ("point_id", "kind") WHERE state <> 'normal'`,
    );
    await queryRunner.query(
      `CREATE TABLE "alarm_events" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "alarm_id" uuid NOT NULL, "event" character varying(24) NOT NULL, "from_state" character varying(32), "to_state" character varying(32) NOT NULL, "by_user" uuid, "at" TIMESTAMP WITH TIME ZONE NOT NULL, "note" text, CONSTRAINT "PK_d736a6c28ff175f4252c0da0c80" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_bc2ad90e6114f4829394b666df" ON "alarm_events"  ("alarm_id") `);
    await queryRunner.query(
      `CREATE TABLE "runs" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "engine_id" uuid NOT NULL, "title" character varying(160) NOT NULL, "purpose" character varying(24) NOT NULL, "state" character varying(16) NOT NULL DEFAULT 'planned', "planned_for" date, "crew_ids" uuid array NOT NULL DEFAULT '{}', "notes" text NOT NULL DEFAULT '', "started_at" TIMESTAMP WITH TIME ZONE, "stopped_at" TIMESTAMP WITH TIME ZONE, "closed_at" TIMESTAMP WITH TIME ZONE, "countersigned_by" uuid, "abandoned_reason" text, "revolutions" double precision, "created_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "version" integer NOT NULL, CONSTRAINT "PK_46d6a1e257c38ba58f1a3c30836" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_526e7b766a391141687a934dfd" ON "runs"  ("engine_id", "state") `);
    await queryRunner.query(
      `CREATE TABLE "run_state_changes" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "run_id" uuid NOT NULL, "from_state" character varying(16), "to_state" character varying(16) NOT NULL, "by_user" uuid NOT NULL, "at" TIMESTAMP WITH TIME ZONE NOT NULL, "note" text, CONSTRAINT "PK_9270f8f20e04ef9404f01047e57" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_f2bbf56e0cc80e2c67f549067e" ON "run_state_changes"  ("run_id") `);
    await queryRunner.query(
      `CREATE TABLE "readings" ("id" bigint GENERATED ALWAYS AS IDENTITY NOT NULL, "client_id" uuid NOT NULL, "run_id" uuid NOT NULL, "engine_id" uuid NOT NULL, "point_id" uuid NOT NULL, "value" double precision NOT NULL, "amended_value" double precision, "unit" character varying(16) NOT NULL, "taken_at" TIMESTAMP WITH TIME ZONE NOT NULL, "received_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "source" character varying(8) NOT NULL, "entered_by" uuid, "logger_id" uuid, CONSTRAINT "PK_a0f3aa79140b41884f2e53ba52a" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE UNIQUE INDEX "readings_client_id" ON "readings"  ("client_id") `);
    await queryRunner.query(`CREATE INDEX "readings_engine_time" ON "readings"  ("engine_id", "taken_at") `);
    await queryRunner.query(`CREATE INDEX "readings_run_time" ON "readings"  ("run_id", "taken_at") `);
    await queryRunner.query(`CREATE INDEX "readings_point_time" ON "readings"  ("point_id", "taken_at") `);
    await queryRunner.query(
      `CREATE TABLE "reading_amendments" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "reading_id" bigint NOT NULL, "old_value" double precision NOT NULL, "new_value" double precision NOT NULL, "reason" text NOT NULL, "by_user" uuid NOT NULL, "at" TIMESTAMP WITH TIME ZONE NOT NULL, CONSTRAINT "PK_1643c8d5e1279fdf89e19a6ec73" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_8b29c9088528141df393b025b3" ON "reading_amendments"  ("reading_id") `);
    await queryRunner.query(
      `CREATE TABLE "loggers" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "engine_id" uuid NOT NULL, "name" character varying(80) NOT NULL, "key_prefix" character varying(12) NOT NULL, "key_hash" character(64) NOT NULL, "created_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "revoked_at" TIMESTAMP WITH TIME ZONE, "last_seen_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "PK_29e8f8af58645b7a782e3694a1a" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE UNIQUE INDEX "IDX_13c7cc615ad8d3936a99b01d56" ON "loggers"  ("key_hash") `);
    await queryRunner.query(
      `ALTER TABLE "cylinders" ADD CONSTRAINT "FK_810bebc27c4d456a0e11a1c8668" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "bearings" ADD CONSTRAINT "FK_cb6739e22534538e876cdc6c73f" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "lubrication_points" ADD CONSTRAINT "FK_6921e5f4b73f13281d3bc4fa23b" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "measurement_points" ADD CONSTRAINT "FK_3eac736fc345b9d91713e01bd98" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    // Integrity between the run log's tables (not expressed as ORM relations).
    await queryRunner.query(
      `ALTER TABLE "runs" ADD CONSTRAINT "fk_runs_engine" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "readings" ADD CONSTRAINT "fk_readings_run" FOREIGN KEY ("run_id") REFERENCES "runs"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "readings" ADD CONSTRAINT "fk_readings_point" FOREIGN KEY ("point_id") REFERENCES "measurement_points"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "alarms" ADD CONSTRAINT "fk_alarms_engine" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "alarm_events" ADD CONSTRAINT "fk_alarm_events_alarm" FOREIGN KEY ("alarm_id") REFERENCES "alarms"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "reading_amendments" ADD CONSTRAINT "fk_amendments_reading" FOREIGN KEY ("reading_id") REFERENCES "readings"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "run_state_changes" ADD CONSTRAINT "fk_run_state_changes_run" FOREIGN KEY ("run_id") REFERENCES "runs"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "loggers" ADD CONSTRAINT "fk_loggers_engine" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "limit_changes" ADD CONSTRAINT "fk_limit_changes_engine" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE RESTRICT`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "runs" DROP CONSTRAINT "fk_runs_engine"`);
    await queryRunner.query(`ALTER TABLE "readings" DROP CONSTRAINT "fk_readings_run"`);
    await queryRunner.query(`ALTER TABLE "readings" DROP CONSTRAINT "fk_readings_point"`);
    await queryRunner.query(`ALTER TABLE "alarms" DROP CONSTRAINT "fk_alarms_engine"`);
    await queryRunner.query(`ALTER TABLE "alarm_events" DROP CONSTRAINT "fk_alarm_events_alarm"`);
    await queryRunner.query(`ALTER TABLE "reading_amendments" DROP CONSTRAINT "fk_amendments_reading"`);
    await queryRunner.query(`ALTER TABLE "run_state_changes" DROP CONSTRAINT "fk_run_state_changes_run"`);
    await queryRunner.query(`ALTER TABLE "loggers" DROP CONSTRAINT "fk_loggers_engine"`);
    await queryRunner.query(`ALTER TABLE "limit_changes" DROP CONSTRAINT "fk_limit_changes_engine"`);
    await queryRunner.query(`ALTER TABLE "measurement_points" DROP CONSTRAINT "FK_3eac736fc345b9d91713e01bd98"`);
    await queryRunner.query(`ALTER TABLE "lubrication_points" DROP CONSTRAINT "FK_6921e5f4b73f13281d3bc4fa23b"`);
    await queryRunner.query(`ALTER TABLE "bearings" DROP CONSTRAINT "FK_cb6739e22534538e876cdc6c73f"`);
    await queryRunner.query(`ALTER TABLE "cylinders" DROP CONSTRAINT "FK_810bebc27c4d456a0e11a1c8668"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_13c7cc615ad8d3936a99b01d56"`);
    await queryRunner.query(`DROP TABLE "loggers"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_8b29c9088528141df393b025b3"`);
    await queryRunner.query(`DROP TABLE "reading_amendments"`);
    await queryRunner.query(`DROP INDEX "public"."readings_point_time"`);
    await queryRunner.query(`DROP INDEX "public"."readings_run_time"`);
    await queryRunner.query(`DROP INDEX "public"."readings_engine_time"`);
    await queryRunner.query(`DROP INDEX "public"."readings_client_id"`);
    await queryRunner.query(`DROP TABLE "readings"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_f2bbf56e0cc80e2c67f549067e"`);
    await queryRunner.query(`DROP TABLE "run_state_changes"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_526e7b766a391141687a934dfd"`);
    await queryRunner.query(`DROP TABLE "runs"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_bc2ad90e6114f4829394b666df"`);
    await queryRunner.query(`DROP TABLE "alarm_events"`);
    await queryRunner.query(`DROP INDEX "public"."alarms_one_open_per_condition"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_294526b0b2e6d730af64c5f826"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_2233da6437d0f74f7450fa241a"`);
    await queryRunner.query(`DROP TABLE "alarms"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_54a9750b1c8c8d8950f8962234"`);
    await queryRunner.query(`DROP TABLE "limit_changes"`);
    await queryRunner.query(`DROP TABLE "engines"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_5db3fe26d130164af13a1e1024"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_3eac736fc345b9d91713e01bd9"`);
    await queryRunner.query(`DROP TABLE "measurement_points"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_6921e5f4b73f13281d3bc4fa23"`);
    await queryRunner.query(`DROP TABLE "lubrication_points"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_cb6739e22534538e876cdc6c73"`);
    await queryRunner.query(`DROP TABLE "bearings"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_810bebc27c4d456a0e11a1c866"`);
    await queryRunner.query(`DROP TABLE "cylinders"`);
  }
}
