import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, Unique, UpdateDateColumn } from 'typeorm';
import type { ChecklistEntryValue, ChecklistStatus } from '@crankjournal/shared-types';

/** A checklist of a run, filled against one version of a template. Read-only once signed, except by amendment. */
@Entity({ name: 'checklists' })
@Index(['runId'])
@Index('checklists_one_open_per_template', ['runId', 'templateId'], { unique: true, where: `status = 'in_progress'` })
export class Checklist {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'run_id', type: 'uuid' }) runId: string;
  @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Column({ name: 'template_id', type: 'uuid' }) templateId: string;
  @Column({ name: 'template_version_id', type: 'uuid' }) templateVersionId: string;
  @Column({ type: 'int' }) version: number;
  @Column({ type: 'varchar', length: 16, default: 'in_progress' }) status: ChecklistStatus;
  @Column({ name: 'started_by', type: 'uuid' }) startedBy: string;
  @Column({ name: 'started_at', type: 'timestamptz' }) startedAt: Date;
  @Column({ name: 'signed_by', type: 'uuid', nullable: true }) signedBy: string | null;
  /** The signer's name as it was when signed: the record shows it even after a rename. */
  @Column({ name: 'signed_by_name', type: 'varchar', length: 120, nullable: true }) signedByName: string | null;
  @Column({ name: 'signed_at', type: 'timestamptz', nullable: true }) signedAt: Date | null;
  /** When the signer signed on a tablet without a connection (its clock); the signature counts from signedAt. */
  @Column({ name: 'signed_on_device_at', type: 'timestamptz', nullable: true }) signedOnDeviceAt: Date | null;
  /** The signer's qualification that allowed the signature. */
  @Column({ name: 'signer_qualification_id', type: 'uuid', nullable: true }) signerQualificationId: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}

/** The value of one item of a checklist, with the chief engineer's override when it is out of range. */
@Entity({ name: 'checklist_entries' })
@Unique('checklist_entries_item', ['checklistId', 'itemKey'])
export class ChecklistEntry {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'checklist_id', type: 'uuid' }) checklistId: string;
  @Column({ name: 'item_key', type: 'varchar', length: 64 }) itemKey: string;
  @Column({ type: 'boolean', nullable: true }) tick: boolean | null;
  @Column({ name: 'value_number', type: 'double precision', nullable: true }) value: number | null;
  @Column({ type: 'varchar', length: 200, nullable: true }) choice: string | null;
  @Column({ type: 'text', nullable: true }) text: string | null;
  @Column({ name: 'photo_key', type: 'varchar', length: 300, nullable: true }) photoKey: string | null;
  @Column({ name: 'photo_type', type: 'varchar', length: 32, nullable: true }) photoType: string | null;
  @Column({ name: 'filled_by', type: 'uuid', nullable: true }) filledBy: string | null;
  @Column({ name: 'filled_at', type: 'timestamptz', nullable: true }) filledAt: Date | null;
  @Column({ name: 'override_reason', type: 'text', nullable: true }) overrideReason: string | null;
  @Column({ name: 'override_by', type: 'uuid', nullable: true }) overrideBy: string | null;
  @Column({ name: 'override_at', type: 'timestamptz', nullable: true }) overrideAt: Date | null;
  /** The value the override was recorded for; it holds only while the value is unchanged. */
  @Column({ name: 'override_value', type: 'jsonb', nullable: true }) overrideValue: ChecklistEntryValue | null;
  /** The value as signed, kept when the first amendment changes it. */
  @Column({ name: 'signed_value', type: 'jsonb', nullable: true }) signedValue: ChecklistEntryValue | null;
}

/** A correction of a signed checklist: the old value stays in the record beside the new one. */
@Entity({ name: 'checklist_amendments' })
@Index(['checklistId'])
export class ChecklistAmendment {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'checklist_id', type: 'uuid' }) checklistId: string;
  @Column({ name: 'item_key', type: 'varchar', length: 64 }) itemKey: string;
  @Column({ name: 'old_value', type: 'jsonb' }) oldValue: ChecklistEntryValue;
  @Column({ name: 'new_value', type: 'jsonb' }) newValue: ChecklistEntryValue;
  @Column({ type: 'text' }) reason: string;
  @Column({ name: 'override_reason', type: 'text', nullable: true }) overrideReason: string | null;
  @Column({ name: 'by_user', type: 'uuid' }) byUser: string;
  @Column({ type: 'timestamptz' }) at: Date;
}
