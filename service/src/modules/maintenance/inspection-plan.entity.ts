import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { ComponentKind, InspectionKind, WorkHazard } from '@crankjournal/shared-types';
import { numeric } from '../../common/transformers/numeric.transformer.js';

/** What must be inspected, and how often: by running hours, revolutions or calendar, whichever comes first. */
@Entity({ name: 'inspection_plans' })
@Index(['engineId', 'active'])
export class InspectionPlan {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Column({ name: 'component_kind', type: 'varchar', length: 24 }) componentKind: ComponentKind;
  @Index() @Column({ name: 'bearing_id', type: 'uuid', nullable: true }) bearingId: string | null;
  @Column({ name: 'component_label', type: 'varchar', length: 120 }) componentLabel: string;
  @Column({ type: 'varchar', length: 160 }) title: string;
  @Column({ name: 'inspection_kind', type: 'varchar', length: 32 }) inspectionKind: InspectionKind;
  @Column({ name: 'interval_run_hours', type: 'numeric', nullable: true, transformer: numeric }) intervalRunHours: number | null;
  @Column({ name: 'interval_revolutions', type: 'numeric', nullable: true, transformer: numeric }) intervalRevolutions: number | null;
  @Column({ name: 'interval_days', type: 'numeric', nullable: true, transformer: numeric }) intervalDays: number | null;
  /** When it was last done and the engine's counters then (reset by the work record that satisfied it). */
  @Column({ name: 'last_done_at', type: 'timestamptz' }) lastDoneAt: Date;
  @Column({ name: 'last_done_run_hours', type: 'double precision' }) lastDoneRunHours: number;
  @Column({ name: 'last_done_revolutions', type: 'double precision' }) lastDoneRevolutions: number;
  @Column({ name: 'last_reset_by_work_record_id', type: 'uuid', nullable: true }) lastResetByWorkRecordId: string | null;
  @Column({ name: 'last_reset_by_inspection_id', type: 'uuid', nullable: true }) lastResetByInspectionId: string | null;
  @Column({ type: 'varchar', length: 24, array: true, default: () => `'{}'` }) hazards: WorkHazard[];
  @Column({ type: 'text', default: '' }) notes: string;
  @Column({ type: 'boolean', default: true }) active: boolean;
  @Column({ name: 'created_by', type: 'uuid' }) createdBy: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}
