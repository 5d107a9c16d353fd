import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, OneToMany, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { FollowUpAction, InspectionKind, MaintenanceUnit, MeasurementItemKind } from '@crankjournal/shared-types';

/** One inspection: what was measured against what tolerance, what was found, what should follow. A record: not edited. */
@Entity({ name: 'inspections' })
@Index(['engineId', 'inspectedAt'])
export class Inspection {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Index() @Column({ name: 'bearing_id', type: 'uuid', nullable: true }) bearingId: string | null;
  @Index() @Column({ name: 'plan_id', type: 'uuid', nullable: true }) planId: string | null;
  @Column({ name: 'completes_plan', type: 'boolean', default: false }) completesPlan: boolean;
  @Column({ type: 'varchar', length: 32 }) kind: InspectionKind;
  @Column({ type: 'varchar', length: 160 }) title: string;
  @Column({ name: 'inspected_at', type: 'timestamptz' }) inspectedAt: Date;
  @Column({ name: 'inspector_name', type: 'varchar', length: 160, default: '' }) inspectorName: string;
  @Column({ name: 'run_hours_at', type: 'double precision' }) runHoursAt: number;
  @Column({ name: 'revolutions_at', type: 'double precision' }) revolutionsAt: number;
  @Column({ type: 'text', default: '' }) findings: string;
  @Column({ name: 'follow_up_actions', type: 'jsonb', default: () => `'[]'` }) followUpActions: FollowUpAction[];
  @Column({ name: 'prompted_by_alarm_id', type: 'uuid', nullable: true }) promptedByAlarmId: string | null;
  @Column({ name: 'prompted_by_run_id', type: 'uuid', nullable: true }) promptedByRunId: string | null;
  @Column({ name: 'recorded_by', type: 'uuid' }) recordedBy: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @OneToMany(() => InspectionMeasurement, (m) => m.inspection) measurements?: InspectionMeasurement[];
  @OneToMany(() => InspectionAttachment, (a) => a.inspection) attachments?: InspectionAttachment[];
}

@Entity({ name: 'inspection_measurements' })
export class InspectionMeasurement {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'inspection_id', type: 'uuid' }) inspectionId: string;
  @ManyToOne(() => Inspection, (i) => i.measurements, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'inspection_id' })
  inspection?: Relation<Inspection>;
  @Column({ type: 'int' }) sequence: number;
  @Column({ type: 'varchar', length: 32 }) kind: MeasurementItemKind;
  @Column({ type: 'varchar', length: 120 }) label: string;
  @Column({ name: 'crank_angle_deg', type: 'double precision', nullable: true }) crankAngleDeg: number | null;
  @Column({ type: 'double precision' }) value: number;
  @Column({ type: 'varchar', length: 8 }) unit: MaintenanceUnit;
  @Column({ type: 'double precision', nullable: true }) nominal: number | null;
  @Column({ name: 'tolerance_min', type: 'double precision', nullable: true }) toleranceMin: number | null;
  @Column({ name: 'tolerance_max', type: 'double precision', nullable: true }) toleranceMax: number | null;
  /** Decided by the server when recorded, from the value and the tolerance then. */
  @Column({ name: 'out_of_tolerance', type: 'boolean' }) outOfTolerance: boolean;
  @Column({ type: 'text', default: '' }) note: string;
}

/** A photo or document of an inspection, kept in the object store. */
@Entity({ name: 'inspection_attachments' })
export class InspectionAttachment {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'inspection_id', type: 'uuid' }) inspectionId: string;
  @ManyToOne(() => Inspection, (i) => i.attachments, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'inspection_id' })
  inspection?: Relation<Inspection>;
  @Column({ type: 'varchar', length: 8 }) kind: 'image' | 'pdf';
  @Column({ name: 'content_type', type: 'varchar', length: 64 }) contentType: string;
  @Column({ type: 'varchar', length: 200 }) filename: string;
  @Column({ name: 'size_bytes', type: 'int' }) sizeBytes: number;
  @Column({ name: 'storage_key', type: 'varchar', length: 200, unique: true }) storageKey: string;
  @Column({ type: 'varchar', length: 300, default: '' }) caption: string;
  @Column({ name: 'uploaded_by', type: 'uuid' }) uploadedBy: string;
  @CreateDateColumn({ name: 'uploaded_at', type: 'timestamptz' }) uploadedAt: Date;
}
