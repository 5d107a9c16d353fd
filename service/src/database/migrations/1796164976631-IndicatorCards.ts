import { MigrationInterface, QueryRunner } from 'typeorm';

/** Indicator cards: card sets of a run, their cards, card images, brake figures and amendments. */
export class IndicatorCards1796164976631 implements MigrationInterface {
  name = 'IndicatorCards1796164976631';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "indicator_cards" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "card_set_id" uuid NOT NULL, "cylinder_id" uuid, "cylinder_label" character varying(40) NOT NULL, "end" character varying(8) NOT NULL, "method" character varying(12) NOT NULL, "spring_psi_per_in" double precision, "length_in" double precision, "area_sq_in" double precision, "ordinates_in" double precision array, "given_mep_psi" double precision, "image_id" uuid, "trace" jsonb, "cut_off_percent" double precision, "compression_percent" double precision, "admission_pressure_psig" double precision, "note" text, "mean_height_in" double precision, "mep_psi" double precision NOT NULL, "traced_area_sq_in" double precision, "outline" jsonb, "created_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_71e6ba46f34add9d17e36ccb70e" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(
      `CREATE UNIQUE INDEX "indicator_cards_one_per_end" ON "indicator_cards"  ("card_set_id", "cylinder_label", "end") `,
    );
    await queryRunner.query(
      `CREATE TABLE "card_sets" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "run_id" uuid NOT NULL, "engine_id" uuid NOT NULL, "taken_at" TIMESTAMP WITH TIME ZONE NOT NULL, "speed_rpm" double precision NOT NULL, "speed_source" character varying(8) NOT NULL, "speed_reading_at" TIMESTAMP WITH TIME ZONE, "cut_off_percent" double precision, "throttle_pressure_psig" double precision, "throttle_source" character varying(8), "receiver_pressure_psig" double precision, "receiver_source" character varying(8), "vacuum_in_hg" double precision, "vacuum_source" character varying(8), "notes" text, "cylinders" jsonb NOT NULL, "condensing" boolean NOT NULL DEFAULT true, "results" jsonb NOT NULL, "created_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_f0d2e7dd04def6de3b34be736c9" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "card_sets_run_time" ON "card_sets"  ("run_id", "taken_at") `);
    await queryRunner.query(
      `CREATE TABLE "card_images" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "run_id" uuid NOT NULL, "storage_key" character varying(200) NOT NULL, "content_type" character varying(40) NOT NULL, "bytes" integer NOT NULL, "width_px" integer NOT NULL, "height_px" integer NOT NULL, "sha256" character(64) NOT NULL, "uploaded_by" uuid NOT NULL, "uploaded_at" TIMESTAMP WITH TIME ZONE NOT NULL, CONSTRAINT "UQ_80541553a6d1794375cb46e2a36" UNIQUE ("storage_key"), CONSTRAINT "PK_402596c7513fbd3cc45750c8e16" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_26669cb38f99cf8237e0436d01" ON "card_images"  ("run_id") `);
    await queryRunner.query(
      `CREATE TABLE "brake_figures" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "run_id" uuid NOT NULL, "measured_at" TIMESTAMP WITH TIME ZONE NOT NULL, "method" character varying(12) NOT NULL, "brake_hp" double precision NOT NULL, "net_brake_load_lbf" double precision, "drum_diameter_ft" double precision, "rope_diameter_ft" double precision, "torque_lbf_ft" double precision, "speed_rpm" double precision, "note" text, "created_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_555fe7651782cad7e77f5de2223" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "brake_figures_run_time" ON "brake_figures"  ("run_id", "measured_at") `);
    await queryRunner.query(
      `CREATE TABLE "card_record_amendments" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "subject_type" character varying(16) NOT NULL, "subject_id" uuid NOT NULL, "run_id" uuid NOT NULL, "changes" jsonb NOT NULL, "reason" text NOT NULL, "by_user" uuid NOT NULL, "at" TIMESTAMP WITH TIME ZONE NOT NULL, CONSTRAINT "PK_d4580aa84bd608cfbaead1f1bc2" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_0a78d0f98bc3240654029555bc" ON "card_record_amendments"  ("run_id") `);
    await queryRunner.query(
      `CREATE INDEX "card_record_amendments_subject" ON "card_record_amendments"  ("subject_type", "subject_id", "at") `,
    );
    await queryRunner.query(
      `ALTER TABLE "indicator_cards" ADD CONSTRAINT "FK_dd271914850245a13fdb18a9cc4" FOREIGN KEY ("card_set_id") REFERENCES "card_sets"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    // Integrity with other modules' tables (added by hand).
    await queryRunner.query(
      `ALTER TABLE "card_sets" ADD CONSTRAINT "fk_card_sets_run" FOREIGN KEY ("run_id") REFERENCES "runs"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "card_sets" ADD CONSTRAINT "fk_card_sets_engine" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "card_sets" ADD CONSTRAINT "fk_card_sets_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "indicator_cards" ADD CONSTRAINT "fk_indicator_cards_cylinder" FOREIGN KEY ("cylinder_id") REFERENCES "cylinders"("id") ON DELETE SET NULL ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "indicator_cards" ADD CONSTRAINT "fk_indicator_cards_image" FOREIGN KEY ("image_id") REFERENCES "card_images"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "indicator_cards" ADD CONSTRAINT "fk_indicator_cards_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "card_images" ADD CONSTRAINT "fk_card_images_run" FOREIGN KEY ("run_id") REFERENCES "runs"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "card_images" ADD CONSTRAINT "fk_card_images_uploaded_by" FOREIGN KEY ("uploaded_by") REFERENCES "users"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "brake_figures" ADD CONSTRAINT "fk_brake_figures_run" FOREIGN KEY ("run_id") REFERENCES "runs"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "brake_figures" ADD CONSTRAINT "fk_brake_figures_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "card_record_amendments" ADD CONSTRAINT "fk_card_record_amendments_run" FOREIGN KEY ("run_id") REFERENCES "runs"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE "card_record_amendments" ADD CONSTRAINT "fk_card_record_amendments_by_user" FOREIGN KEY ("by_user") REFERENCES "users"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "card_record_amendments" DROP CONSTRAINT "fk_card_record_amendments_by_user"`);
    await queryRunner.query(`ALTER TABLE "card_record_amendments" DROP CONSTRAINT "fk_card_record_amendments_run"`);
    await queryRunner.query(`ALTER TABLE "brake_figures" DROP CONSTRAINT "fk_brake_figures_created_by"`);
    await queryRunner.query(`ALTER TABLE "brake_figures" DROP CONSTRAINT "fk_brake_figures_run"`);
    await queryRunner.query(`ALTER TABLE "card_images" DROP CONSTRAINT "fk_card_images_uploaded_by"`);
    await queryRunner.query(`ALTER TABLE "card_images" DROP CONSTRAINT "fk_card_images_run"`);
    await queryRunner.query(`ALTER TABLE "indicator_cards" DROP CONSTRAINT "fk_indicator_cards_created_by"`);
    await queryRunner.query(`ALTER TABLE "indicator_cards" DROP CONSTRAINT "fk_indicator_cards_image"`);
    await queryRunner.query(`ALTER TABLE "indicator_cards" DROP CONSTRAINT "fk_indicator_cards_cylinder"`);
    await queryRunner.query(`ALTER TABLE "card_sets" DROP CONSTRAINT "fk_card_sets_created_by"`);
    await queryRunner.query(`ALTER TABLE "card_sets" DROP CONSTRAINT "fk_card_sets_engine"`);
    await queryRunner.query(`ALTER TABLE "card_sets" DROP CONSTRAINT "fk_card_sets_run"`);
    await queryRunner.query(`ALTER TABLE "indicator_cards" DROP CONSTRAINT "FK_dd271914850245a13fdb18a9cc4"`);
    await queryRunner.query(`DROP INDEX "public"."card_record_amendments_subject"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_0a78d0f98bc3240654029555bc"`);
    await queryRunner.query(`DROP TABLE "card_record_amendments"`);
    await queryRunner.query(`DROP INDEX "public"."brake_figures_run_time"`);
    await queryRunner.query(`DROP TABLE "brake_figures"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_26669cb38f99cf8237e0436d01"`);
    await queryRunner.query(`DROP TABLE "card_images"`);
    await queryRunner.query(`DROP INDEX "public"."card_sets_run_time"`);
    await queryRunner.query(`DROP TABLE "card_sets"`);
    await queryRunner.query(`DROP INDEX "public"."indicator_cards_one_per_end"`);
    await queryRunner.query(`DROP TABLE "indicator_cards"`);
  }
}
