import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { PartUsed, WorkHazard, WorkStatus } from '@crankjournal/shared-types';
import { numeric } from '../../common/transformers/numeric.transformer.js';

/** Work done on the engine: what, who, parts, hours, what prompted it; closing it can reset plans' counters. */
@Entity({ name: 'work_records' })
@Index(['engineId', 'startedAt'])
export class WorkRecord {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Index() @Column({ name: 'bearing_id', type: 'uuid', nullable: true }) bearingId: string | null;
  @Column({ type: 'varchar', length: 160 }) title: string;
  @Column({ type: 'text', default: '' }) description: string;
  @Column({ name: 'performed_by', type: 'varchar', length: 300 }) performedBy: string;
  @Column({ type: 'jsonb', default: () => `'[]'` }) parts: PartUsed[];
  @Column({ name: 'labour_hours', type: 'numeric', default: 0, transformer: numeric }) labourHours: number;
  @Index() @Column({ name: 'prompted_by_inspection_id', type: 'uuid', nullable: true }) promptedByInspectionId: string | null;
  @Column({ name: 'prompted_by_alarm_id', type: 'uuid', nullable: true }) promptedByAlarmId: string | null;
  @Column({ type: 'varchar', length: 24, array: true, default: () => `'{}'` }) hazards: WorkHazard[];
  @Column({ name: 'satisfies_plan_ids', type: 'uuid', array: true, default: () => `'{}'` }) satisfiesPlanIds: string[];
  @Column({ type: 'varchar', length: 8, default: 'open' }) status: WorkStatus;
  @Column({ name: 'started_at', type: 'timestamptz' }) startedAt: Date;
  @Column({ name: 'closed_at', type: 'timestamptz', nullable: true }) closedAt: Date | null;
  @Column({ name: 'closed_by', type: 'uuid', nullable: true }) closedBy: string | null;
  @Column({ name: 'close_note', type: 'text', nullable: true }) closeNote: string | null;
  @Column({ name: 'run_hours_at_completion', type: 'double precision', nullable: true }) runHoursAtCompletion: number | null;
  @Column({ name: 'revolutions_at_completion', type: 'double precision', nullable: true }) revolutionsAtCompletion: number | null;
  @Column({ name: 'reset_plan_ids', type: 'uuid', array: true, default: () => `'{}'` }) resetPlanIds: string[];
  @Column({ name: 'recorded_by', type: 'uuid' }) recordedBy: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}
