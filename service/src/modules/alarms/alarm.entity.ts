import { Column, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { AlarmKind, AlarmPriority, AlarmState, AlarmSuppression } from '@crankjournal/shared-types';

/** One alarm: one crossing of one condition of one point, through its whole lifecycle. */
@Entity({ name: 'alarms' })
@Index('alarms_one_open_per_condition', ['pointId', 'kind'], { unique: true, where: `state <> 'normal'` })
@Index(['engineId', 'state'])
@Index(['runId'])
export class Alarm {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Column({ name: 'run_id', type: 'uuid', nullable: true }) runId: string | null;
  @Column({ name: 'point_id', type: 'uuid', nullable: true }) pointId: string | null;
  @Column({ type: 'varchar', length: 24 }) kind: AlarmKind;
  @Column({ type: 'varchar', length: 16 }) priority: AlarmPriority;
  @Column({ type: 'varchar', length: 32 }) state: AlarmState;
  @Column({ name: 'condition_active', type: 'boolean', default: true }) conditionActive: boolean;
  @Column({ type: 'text' }) message: string;
  @Column({ type: 'double precision', nullable: true }) value: number | null;
  @Column({ name: 'limit_value', type: 'double precision', nullable: true }) limit: number | null;
  @Column({ type: 'varchar', length: 16, default: '' }) unit: string;
  /** The reading that raised it. */
  @Column({ name: 'reading_id', type: 'bigint', nullable: true }) readingId: string | null;
  @Column({ name: 'raised_at', type: 'timestamptz' }) raisedAt: Date;
  @Column({ name: 'acknowledged_at', type: 'timestamptz', nullable: true }) acknowledgedAt: Date | null;
  @Column({ name: 'acknowledged_by', type: 'uuid', nullable: true }) acknowledgedBy: string | null;
  @Column({ name: 'returned_at', type: 'timestamptz', nullable: true }) returnedAt: Date | null;
  @Column({ name: 'shelved_until', type: 'timestamptz', nullable: true }) shelvedUntil: Date | null;
  @Column({ name: 'shelve_reason', type: 'text', nullable: true }) shelveReason: string | null;
  @Column({ name: 'shelved_by', type: 'uuid', nullable: true }) shelvedBy: string | null;
  /** Suppressed alarms are recorded but not annunciated: 'design' (by `suppressedBy`) or 'state'. */
  @Column({ type: 'varchar', length: 8, nullable: true }) suppression: AlarmSuppression | null;
  @Column({ name: 'suppressed_by', type: 'uuid', nullable: true }) suppressedBy: string | null;
  /** A pre-alarm's forecast (null for every other kind): the limit it heads for, minutes to it, rate per minute. */
  @Column({ name: 'forecast_limit_kind', type: 'varchar', length: 24, nullable: true }) forecastLimitKind: AlarmKind | null;
  @Column({ name: 'forecast_minutes', type: 'double precision', nullable: true }) forecastMinutes: number | null;
  @Column({ name: 'forecast_rate_per_min', type: 'double precision', nullable: true }) forecastRatePerMin: number | null;
  /** When its e-mail was queued (in the transaction that raised or released it): at most one per alarm. */
  @Column({ name: 'emailed_at', type: 'timestamptz', nullable: true }) emailedAt: Date | null;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}
