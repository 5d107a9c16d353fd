import { Column, Entity, PrimaryColumn } from 'typeorm';

/**
 * Figures of one point's readings in one run, kept by the ingest path in the statement that stores the readings
 * (and recomputed when a reading is amended): what the bearing list and histories read instead of the readings.
 * Values are the recorded ones, amended values counting; the mean is total / count.
 */
@Entity({ name: 'run_point_figures' })
export class RunPointFigure {
  @PrimaryColumn({ name: 'run_id', type: 'uuid' }) runId: string;
  @PrimaryColumn({ name: 'point_id', type: 'uuid' }) pointId: string;
  @Column({ type: 'int' }) count: number;
  @Column({ type: 'double precision' }) total: number;
  @Column({ type: 'double precision' }) peak: number;
  @Column({ type: 'double precision' }) least: number;
  @Column({ name: 'first_at', type: 'timestamptz' }) firstAt: Date;
  @Column({ name: 'last_at', type: 'timestamptz' }) lastAt: Date;
}
