import { Column, CreateDateColumn, Entity, OneToMany, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { EngineType } from '@crankjournal/shared-types';
import { numeric } from '../../common/transformers/numeric.transformer.js';
import { Cylinder } from './cylinder.entity.js';
import { Bearing } from './bearing.entity.js';
import { LubricationPoint } from './lubrication-point.entity.js';
import { MeasurementPoint } from './measurement-point.entity.js';

@Entity({ name: 'engines' })
export class Engine {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ type: 'varchar', length: 120, unique: true }) name: string;
  @Column({ type: 'varchar', length: 200, default: '' }) builder: string;
  @Column({ name: 'year_built', type: 'varchar', length: 40, default: '' }) yearBuilt: string;
  @Column({ type: 'varchar', length: 24 }) type: EngineType;
  @Column({ name: 'rated_speed_rpm', type: 'numeric', transformer: numeric }) ratedSpeedRpm: number;
  @Column({ name: 'overspeed_rpm', type: 'numeric', transformer: numeric }) overspeedRpm: number;
  @Column({ name: 'mawp_psig', type: 'numeric', transformer: numeric }) mawpPsig: number;
  @Column({ name: 'pre_lube_freshness_minutes', type: 'int', default: 30 }) preLubeFreshnessMinutes: number;
  @Column({ name: 'flywheel_mass_lb', type: 'numeric', nullable: true, transformer: numeric }) flywheelMassLb: number | null;
  @Column({ name: 'flywheel_radius_of_gyration_ft', type: 'numeric', nullable: true, transformer: numeric }) flywheelRadiusOfGyrationFt:
    number | null;
  @Column({ name: 'rotating_weight_lb', type: 'numeric', nullable: true, transformer: numeric }) rotatingWeightLb: number | null;
  /** Hours and revolutions before the first run recorded here (from the old log books). */
  @Column({ name: 'baseline_hours', type: 'numeric', default: 0, transformer: numeric }) baselineHours: number;
  @Column({ name: 'baseline_revolutions', type: 'numeric', default: 0, transformer: numeric }) baselineRevolutions: number;
  /** Totals of the runs recorded here, kept up to date by the run log when a run stops. */
  @Column({ name: 'recorded_hours', type: 'double precision', default: 0 }) recordedHours: number;
  @Column({ name: 'recorded_revolutions', type: 'double precision', default: 0 }) recordedRevolutions: number;
  /** The run now in preparation or under way, if any (one at a time per engine). */
  @Column({ name: 'active_run_id', type: 'uuid', nullable: true }) activeRunId: string | null;
  @Column({ type: 'text', default: '' }) notes: string;
  /** Minutes a high-high alarm may wait unacknowledged before the call list is e-mailed. */
  @Column({ name: 'escalate_after_minutes', type: 'int', default: 5 }) escalateAfterMinutes: number;
  /** People (user ids) to e-mail, in this order, about a high-high alarm nobody acknowledged in time. */
  @Column({ name: 'call_list', type: 'jsonb', default: () => "'[]'" }) callList: string[];
  @OneToMany(() => Cylinder, (c) => c.engine) cylinders?: Cylinder[];
  @OneToMany(() => Bearing, (b) => b.engine) bearings?: Bearing[];
  @OneToMany(() => LubricationPoint, (l) => l.engine) lubricationPoints?: LubricationPoint[];
  @OneToMany(() => MeasurementPoint, (m) => m.engine) measurementPoints?: MeasurementPoint[];
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}
