import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { ReadingSource } from '@crankjournal/shared-types';

/**
 * One reading. Never updated in place except `amended_value`, which mirrors the latest amendment
 * (the amendments table keeps every step; `value` keeps what was first recorded).
 */
@Entity({ name: 'readings' })
@Index('readings_point_time', ['pointId', 'takenAt'])
@Index('readings_run_time', ['runId', 'takenAt'])
@Index('readings_engine_time', ['engineId', 'takenAt'])
/** Per-run figures of a point (bearing history): one exact range per point and run, whatever the table's size. */
@Index('readings_point_run', ['pointId', 'runId'])
/** A client id names one reading of its run (a device or logger may resend it; another run may use it too). */
@Index('readings_run_client_id', ['runId', 'clientId'], { unique: true })
export class Reading {
  @PrimaryGeneratedColumn('identity', { type: 'bigint', generatedIdentity: 'ALWAYS' }) id: string;
  @Column({ name: 'client_id', type: 'uuid' }) clientId: string;
  @Column({ name: 'run_id', type: 'uuid' }) runId: string;
  @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Column({ name: 'point_id', type: 'uuid' }) pointId: string;
  @Column({ type: 'double precision' }) value: number;
  @Column({ name: 'amended_value', type: 'double precision', nullable: true }) amendedValue: number | null;
  @Column({ type: 'varchar', length: 16 }) unit: string;
  @Column({ name: 'taken_at', type: 'timestamptz' }) takenAt: Date;
  @Column({ name: 'received_at', type: 'timestamptz', default: () => 'now()' }) receivedAt: Date;
  @Column({ type: 'varchar', length: 8 }) source: ReadingSource;
  @Column({ name: 'entered_by', type: 'uuid', nullable: true }) enteredBy: string | null;
  @Column({ name: 'logger_id', type: 'uuid', nullable: true }) loggerId: string | null;
}
