import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { MeasurementKind, MeasurementUnit, RunState } from '@crankjournal/shared-types';
import { Engine } from './engine.entity.js';

@Entity({ name: 'measurement_points' })
@Index(['engineId', 'code'], { unique: true })
export class MeasurementPoint {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @ManyToOne(() => Engine, (e) => e.measurementPoints, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'engine_id' })
  engine?: Relation<Engine>;
  @Column({ type: 'varchar', length: 24 }) code: string;
  @Column({ type: 'varchar', length: 120 }) label: string;
  @Column({ type: 'varchar', length: 32 }) kind: MeasurementKind;
  @Column({ type: 'varchar', length: 16 }) unit: MeasurementUnit;
  @Column({ type: 'int', default: 0 }) sequence: number;
  @Column({ name: 'normal_low', type: 'double precision', nullable: true }) normalLow: number | null;
  @Column({ name: 'normal_high', type: 'double precision', nullable: true }) normalHigh: number | null;
  @Column({ name: 'low_limit', type: 'double precision', nullable: true }) lowLimit: number | null;
  @Column({ name: 'high_limit', type: 'double precision', nullable: true }) highLimit: number | null;
  @Column({ name: 'high_high_limit', type: 'double precision', nullable: true }) highHighLimit: number | null;
  @Column({ name: 'max_rise_rate_per_min', type: 'double precision', nullable: true }) maxRiseRatePerMin: number | null;
  @Column({ name: 'max_rise_above_ambient', type: 'double precision', nullable: true }) maxRiseAboveAmbient: number | null;
  @Column({ type: 'double precision', nullable: true }) deadband: number | null;
  /** An absolute limit suppresses this point's rise-above-ambient and rate-of-rise alarms. */
  @Column({ name: 'related_suppression', type: 'boolean', default: true }) relatedSuppression: boolean;
  /** Run states in which this point's alarms are suppressed by state. */
  @Column({ name: 'suppressed_in_states', type: 'text', array: true, default: () => "'{}'" }) suppressedInStates: RunState[];
  @Column({ name: 'bearing_id', type: 'uuid', nullable: true }) bearingId: string | null;
  @Column({ name: 'cylinder_id', type: 'uuid', nullable: true }) cylinderId: string | null;
  /** Retired points keep their readings but leave the round. */
  @Column({ type: 'boolean', default: true }) active: boolean;
}
