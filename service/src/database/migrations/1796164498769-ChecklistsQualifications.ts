import { MigrationInterface, QueryRunner } from 'typeorm';

/** Crew qualifications, versioned checklist templates and a run's checklists (entries, amendments). */
export class ChecklistsQualifications1796164498769 implements MigrationInterface {
  name = 'ChecklistsQualifications1796164498769';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "qualifications" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "user_id" uuid NOT NULL, "engine_id" uuid NOT NULL, "duty" character varying(24) NOT NULL, "granted_on" date NOT NULL, "expires_on" date NOT NULL, "notes" text NOT NULL DEFAULT '', "granted_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "withdrawn_at" TIMESTAMP WITH TIME ZONE, "withdrawn_by" uuid, "withdrawn_reason" text, CONSTRAINT "PK_9ed4d526ac3b76ba3f1c1080433" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_31207e28861fb300bbb5a5195b" ON "qualifications"  ("engine_id") `);
    await queryRunner.query(
      `CREATE UNIQUE INDEX "qualifications_one_standing" ON "qualifications"  ("user_id", "engine_id", "duty") WHERE withdrawn_at IS NULL`,
    );
    await queryRunner.query(
      `CREATE TABLE "checklist_templates" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "engine_id" uuid NOT NULL, "name" character varying(120) NOT NULL, "purpose" character varying(32) NOT NULL, "required_when" character varying(16) NOT NULL, "required_duty" character varying(24) NOT NULL, "current_version" integer NOT NULL DEFAULT '0', "draft" jsonb, "draft_updated_at" TIMESTAMP WITH TIME ZONE, "retired_at" TIMESTAMP WITH TIME ZONE, "created_by" uuid NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_e6d17651d110bbac45cf07e44fa" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_64e2ce957dac8f0ccb78f5a32d" ON "checklist_templates"  ("engine_id") `);
    await queryRunner.query(
      `CREATE TABLE "checklist_template_versions" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "template_id" uuid NOT NULL, "version" integer NOT NULL, "content" jsonb NOT NULL, "change_note" text NOT NULL DEFAULT '', "published_by" uuid NOT NULL, "published_at" TIMESTAMP WITH TIME ZONE NOT NULL, CONSTRAINT "checklist_template_versions_number" UNIQUE ("template_id", "version"), CONSTRAINT "PK_b9e08d9316c2a5fe768881d71ec" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(
      `CREATE TABLE "checklists" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "run_id" uuid NOT NULL, "engine_id" uuid NOT NULL, "template_id" uuid NOT NULL, "template_version_id" uuid NOT NULL, "version" integer NOT NULL, "status" character varying(16) NOT NULL DEFAULT 'in_progress', "started_by" uuid NOT NULL, "started_at" TIMESTAMP WITH TIME ZONE NOT NULL, "signed_by" uuid, "signed_at" TIMESTAMP WITH TIME ZONE, "signer_qualification_id" uuid, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_336ade2047f3d713e1afa20d2c6" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(
      `CREATE UNIQUE INDEX "checklists_one_open_per_template" ON "checklists"  ("run_id", "template_id") WHERE status = 'in_progress'`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_fa18a11f7e6bb60b6e14b3d8f9" ON "checklists"  ("run_id") `);
    await queryRunner.query(
      `CREATE TABLE "checklist_entries" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "checklist_id" uuid NOT NULL, "item_key" character varying(64) NOT NULL, "tick" boolean, "value_number" double precision, "choice" character varying(200), "text" text, "photo_key" character varying(300), "photo_type" character varying(32), "filled_by" uuid, "filled_at" TIMESTAMP WITH TIME ZONE, "override_reason" text, "override_by" uuid, "override_at" TIMESTAMP WITH TIME ZONE, "override_value" jsonb, "signed_value" jsonb, CONSTRAINT "checklist_entries_item" UNIQUE ("checklist_id", "item_key"), CONSTRAINT "PK_0c4cd4f293724e4dec1dd601218" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(
      `CREATE TABLE "checklist_amendments" ("id" uuid NOT NULL DEFAULT uuid_generate_v4(), "checklist_id" uuid NOT NULL, "item_key" character varying(64) NOT NULL, "old_value" jsonb NOT NULL, "new_value" jsonb NOT NULL, "reason" text NOT NULL, "override_reason" text, "by_user" uuid NOT NULL, "at" TIMESTAMP WITH TIME ZONE NOT NULL, CONSTRAINT "PK_669d716a464ee78988fda6ed027" PRIMARY KEY ("id"))`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_5a811865d8a97f6cf948470f60" ON "checklist_amendments"  ("checklist_id") `);
    await queryRunner.query(
      `ALTER TABLE "qualifications" ADD CONSTRAINT "fk_qualifications_user_id" FOREIGN KEY ("user_id") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "qualifications" ADD CONSTRAINT "fk_qualifications_engine_id" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "qualifications" ADD CONSTRAINT "fk_qualifications_granted_by" FOREIGN KEY ("granted_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "qualifications" ADD CONSTRAINT "fk_qualifications_withdrawn_by" FOREIGN KEY ("withdrawn_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklist_templates" ADD CONSTRAINT "fk_checklist_templates_engine_id" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklist_templates" ADD CONSTRAINT "fk_checklist_templates_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklist_template_versions" ADD CONSTRAINT "fk_checklist_template_versions_template_id" FOREIGN KEY ("template_id") REFERENCES "checklist_templates"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklist_template_versions" ADD CONSTRAINT "fk_checklist_template_versions_published_by" FOREIGN KEY ("published_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklists" ADD CONSTRAINT "fk_checklists_run_id" FOREIGN KEY ("run_id") REFERENCES "runs"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklists" ADD CONSTRAINT "fk_checklists_engine_id" FOREIGN KEY ("engine_id") REFERENCES "engines"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklists" ADD CONSTRAINT "fk_checklists_template_id" FOREIGN KEY ("template_id") REFERENCES "checklist_templates"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklists" ADD CONSTRAINT "fk_checklists_template_version_id" FOREIGN KEY ("template_version_id") REFERENCES "checklist_template_versions"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklists" ADD CONSTRAINT "fk_checklists_started_by" FOREIGN KEY ("started_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklists" ADD CONSTRAINT "fk_checklists_signed_by" FOREIGN KEY ("signed_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklists" ADD CONSTRAINT "fk_checklists_signer_qualification_id" FOREIGN KEY ("signer_qualification_id") REFERENCES "qualifications"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklist_entries" ADD CONSTRAINT "fk_checklist_entries_checklist_id" FOREIGN KEY ("checklist_id") REFERENCES "checklists"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklist_entries" ADD CONSTRAINT "fk_checklist_entries_filled_by" FOREIGN KEY ("filled_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklist_entries" ADD CONSTRAINT "fk_checklist_entries_override_by" FOREIGN KEY ("override_by") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklist_amendments" ADD CONSTRAINT "fk_checklist_amendments_checklist_id" FOREIGN KEY ("checklist_id") REFERENCES "checklists"("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `ALTER TABLE "checklist_amendments" ADD CONSTRAINT "fk_checklist_amendments_by_user" FOREIGN KEY ("by_user") REFERENCES "users"("id") ON DELETE RESTRICT`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "checklist_amendments" DROP CONSTRAINT "fk_checklist_amendments_by_user"`);
    await queryRunner.query(`ALTER TABLE "checklist_amendments" DROP CONSTRAINT "fk_checklist_amendments_checklist_id"`);
    await queryRunner.query(`ALTER TABLE "checklist_entries" DROP CONSTRAINT "fk_checklist_entries_override_by"`);
    await queryRunner.query(`ALTER TABLE "checklist_entries" DROP CONSTRAINT "fk_checklist_entries_filled_by"`);
    await queryRunner.query(`ALTER TABLE "checklist_entries" DROP CONSTRAINT "fk_checklist_entries_checklist_id"`);
    await queryRunner.query(`ALTER TABLE "checklists" DROP CONSTRAINT "fk_checklists_signer_qualification_id"`);
    await queryRunner.query(`ALTER TABLE "checklists" DROP CONSTRAINT "fk_checklists_signed_by"`);
    await queryRunner.query(`ALTER TABLE "checklists" DROP CONSTRAINT "fk_checklists_started_by"`);
    await queryRunner.query(`ALTER TABLE "checklists" DROP CONSTRAINT "fk_checklists_template_version_id"`);
    await queryRunner.query(`ALTER TABLE "checklists" DROP CONSTRAINT "fk_checklists_template_id"`);
    await queryRunner.query(`ALTER TABLE "checklists" DROP CONSTRAINT "fk_checklists_engine_id"`);
    await queryRunner.query(`ALTER TABLE "checklists" DROP CONSTRAINT "fk_checklists_run_id"`);
    await queryRunner.query(`ALTER TABLE "checklist_template_versions" DROP CONSTRAINT "fk_checklist_template_versions_published_by"`);
    await queryRunner.query(`ALTER TABLE "checklist_template_versions" DROP CONSTRAINT "fk_checklist_template_versions_template_id"`);
    await queryRunner.query(`ALTER TABLE "checklist_templates" DROP CONSTRAINT "fk_checklist_templates_created_by"`);
    await queryRunner.query(`ALTER TABLE "checklist_templates" DROP CONSTRAINT "fk_checklist_templates_engine_id"`);
    await queryRunner.query(`ALTER TABLE "qualifications" DROP CONSTRAINT "fk_qualifications_withdrawn_by"`);
    await queryRunner.query(`ALTER TABLE "qualifications" DROP CONSTRAINT "fk_qualifications_granted_by"`);
    await queryRunner.query(`ALTER TABLE "qualifications" DROP CONSTRAINT "fk_qualifications_engine_id"`);
    await queryRunner.query(`ALTER TABLE "qualifications" DROP CONSTRAINT "fk_qualifications_user_id"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_5a811865d8a97f6cf948470f60"`);
    await queryRunner.query(`DROP TABLE "checklist_amendments"`);
    await queryRunner.query(`DROP TABLE "checklist_entries"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_fa18a11f7e6bb60b6e14b3d8f9"`);
    await queryRunner.query(`DROP INDEX "public"."checklists_one_open_per_template"`);
    await queryRunner.query(`DROP TABLE "checklists"`);
    await queryRunner.query(`DROP TABLE "checklist_template_versions"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_64e2ce957dac8f0ccb78f5a32d"`);
    await queryRunner.query(`DROP TABLE "checklist_templates"`);
    await queryRunner.query(`DROP INDEX "public"."qualifications_one_standing"`);
    await queryRunner.query(`DROP INDEX "public"."IDX_31207e28861fb300bbb5a5195b"`);
    await queryRunner.query(`DROP TABLE "qualifications"`);
  }
}
