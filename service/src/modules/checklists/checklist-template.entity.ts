import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, Unique, UpdateDateColumn } from 'typeorm';
import type { ChecklistPurpose, ChecklistRequiredWhen, ChecklistTemplateContent, Duty } from '@crankjournal/shared-types';

/**
 * A checklist template of one engine. Its name, purpose, requirement and duty mirror the latest published
 * version (or the draft while nothing is published); the content itself lives in the versions, which are
 * never changed once published.
 */
@Entity({ name: 'checklist_templates' })
@Index(['engineId'])
export class ChecklistTemplate {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Column({ type: 'varchar', length: 120 }) name: string;
  @Column({ type: 'varchar', length: 32 }) purpose: ChecklistPurpose;
  @Column({ name: 'required_when', type: 'varchar', length: 16 }) requiredWhen: ChecklistRequiredWhen;
  @Column({ name: 'required_duty', type: 'varchar', length: 24 }) requiredDuty: Duty;
  /** 0 while nothing is published. */
  @Column({ name: 'current_version', type: 'int', default: 0 }) currentVersion: number;
  @Column({ type: 'jsonb', nullable: true }) draft: ChecklistTemplateContent | null;
  @Column({ name: 'draft_updated_at', type: 'timestamptz', nullable: true }) draftUpdatedAt: Date | null;
  @Column({ name: 'retired_at', type: 'timestamptz', nullable: true }) retiredAt: Date | null;
  @Column({ name: 'created_by', type: 'uuid' }) createdBy: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}

/** One published version of a template: immutable. */
@Entity({ name: 'checklist_template_versions' })
@Unique('checklist_template_versions_number', ['templateId', 'version'])
export class ChecklistTemplateVersion {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'template_id', type: 'uuid' }) templateId: string;
  @Column({ type: 'int' }) version: number;
  @Column({ type: 'jsonb' }) content: ChecklistTemplateContent;
  @Column({ name: 'change_note', type: 'text', default: '' }) changeNote: string;
  @Column({ name: 'published_by', type: 'uuid' }) publishedBy: string;
  @Column({ name: 'published_at', type: 'timestamptz' }) publishedAt: Date;
}
