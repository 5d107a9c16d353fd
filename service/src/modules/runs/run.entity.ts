import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';
import type { RunPurpose, RunState } from '@crankjournal/shared-types';

@Entity({ name: 'runs' })
@Index(['engineId', 'state'])
export class Run {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Column({ type: 'varchar', length: 160 }) title: string;
  @Column({ type: 'varchar', length: 24 }) purpose: RunPurpose;
  @Column({ type: 'varchar', length: 16, default: 'planned' }) state: RunState;
  @Column({ name: 'planned_for', type: 'date', nullable: true }) plannedFor: string | null;
  @Column({ name: 'crew_ids', type: 'uuid', array: true, default: () => `'{}'` }) crewIds: string[];
  @Column({ type: 'text', default: '' }) notes: string;
  @Column({ name: 'started_at', type: 'timestamptz', nullable: true }) startedAt: Date | null;
  @Column({ name: 'stopped_at', type: 'timestamptz', nullable: true }) stoppedAt: Date | null;
  @Column({ name: 'closed_at', type: 'timestamptz', nullable: true }) closedAt: Date | null;
  @Column({ name: 'countersigned_by', type: 'uuid', nullable: true }) countersignedBy: string | null;
  /** The countersigner's name as it was when signed: the record shows it even after a rename. */
  @Column({ name: 'countersigned_by_name', type: 'varchar', length: 120, nullable: true }) countersignedByName: string | null;
  @Column({ name: 'abandoned_reason', type: 'text', nullable: true }) abandonedReason: string | null;
  /** Revolutions from the speed record, fixed when the run stops. */
  @Column({ type: 'double precision', nullable: true }) revolutions: number | null;
  @Column({ name: 'created_by', type: 'uuid' }) createdBy: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
  @VersionColumn() version: number;
}
