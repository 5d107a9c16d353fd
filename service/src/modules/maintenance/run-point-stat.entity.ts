import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/**
 * Aggregates of one point's readings in one closed run, kept once computed: a closed run's readings can no
 * longer change (no new readings, no amendments), so its figures are fixed. Open runs read run_point_figures.
 * A row with count 0 records that the point had no readings in that run.
 */
@Entity({ name: 'run_point_stats' })
@Index(['pointId'])
export class RunPointStat {
  @PrimaryColumn({ name: 'run_id', type: 'uuid' }) runId: string;
  @PrimaryColumn({ name: 'point_id', type: 'uuid' }) pointId: string;
  @Column({ type: 'double precision', nullable: true }) peak: number | null;
  @Column({ type: 'double precision', nullable: true }) mean: number | null;
  @Column({ type: 'double precision', nullable: true }) least: number | null;
  @Column({ type: 'int' }) count: number;
  @Column({ name: 'first_at', type: 'timestamptz', nullable: true }) firstAt: Date | null;
  @Column({ name: 'last_at', type: 'timestamptz', nullable: true }) lastAt: Date | null;
  @Column({ name: 'computed_at', type: 'timestamptz', default: () => 'now()' }) computedAt: Date;
}
