import { Injectable, Logger, type OnApplicationBootstrap, type OnModuleDestroy } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import type { RunSummary } from '@crankjournal/shared-types';
import { ReadingsService, type PointRunStat } from '../runs/readings.service.js';
import { EnginesService } from '../engines/engines.service.js';
import { RunsService } from '../runs/runs.service.js';
import { AppConfig } from '../../config/app-config.service.js';
import { RunPointStat } from './run-point-stat.entity.js';

/** Points whose per-run figures the bearing histories use. */
const HISTORY_KINDS = new Set(['bearing_temperature', 'ambient_temperature', 'speed']);
const WARM_EVERY_MS = 10 * 60_000;

/**
 * Per-run figures of points for the bearing histories. Closed runs are computed once with one grouped query
 * (ReadingsService.pointRunStats) and kept in run_point_stats; open runs read the figures kept as readings arrive. A
 * background pass fills the figures of newly closed runs, so a history over millions of readings reads only
 * one small row per run and point (open runs: ReadingsService.keptPointRunStats).
 */
@Injectable()
export class RunStatsService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('Maintenance');
  private timer: NodeJS.Timeout | null = null;
  private warming: Promise<void> | null = null;
  private stopped = false;

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly readings: ReadingsService,
    private readonly engines: EnginesService,
    private readonly runs: RunsService,
    private readonly config: AppConfig,
  ) {}

  onApplicationBootstrap() {
    if (this.config.get('NODE_ENV') === 'test') return;
    const pass = () => {
      void this.warm().catch((e) => {
        if (!this.stopped) this.logger.warn(`run figures not filled: ${(e as Error).message}`);
      });
      this.timer = setTimeout(pass, WARM_EVERY_MS);
      this.timer.unref();
    };
    this.timer = setTimeout(pass, 5_000);
    this.timer.unref();
  }
  onModuleDestroy() {
    this.stopped = true;
    if (this.timer) clearTimeout(this.timer);
  }

  /** Fills the kept figures of every closed run of every engine for the points the histories use. */
  warm(): Promise<void> {
    this.warming ??= (async () => {
      try {
        for (const e of await this.engines.list()) {
          if (this.stopped) return;
          const { points } = await this.engines.withPoints(e.id);
          const ids = points.filter((p) => HISTORY_KINDS.has(p.kind)).map((p) => p.id);
          const runs = (await this.runs.list({ engineId: e.id })).filter((r) => r.startedAt);
          await this.stats(ids, runs);
        }
      } finally {
        this.warming = null;
      }
    })();
    return this.warming;
  }

  /** Figures of these points in these runs (only pairs with readings are returned). */
  async stats(pointIds: string[], runs: Pick<RunSummary, 'id' | 'state'>[]): Promise<PointRunStat[]> {
    if (!pointIds.length || !runs.length) return [];
    const closed = runs.filter((r) => r.state === 'closed').map((r) => r.id);
    const open = runs.filter((r) => r.state !== 'closed').map((r) => r.id);
    const kept: {
      runId: string;
      pointId: string;
      peak: number | null;
      mean: number | null;
      least: number | null;
      count: number;
      firstAt: Date | null;
      lastAt: Date | null;
    }[] = closed.length
      ? (
          await this.db.query(
            'SELECT run_id, point_id, peak, mean, least, count, first_at, last_at FROM run_point_stats ' +
              'WHERE point_id = ANY($1::uuid[]) AND run_id = ANY($2::uuid[])',
            [pointIds, closed],
          )
        ).map(
          (k: {
            run_id: string;
            point_id: string;
            peak: number | null;
            mean: number | null;
            least: number | null;
            count: number;
            first_at: Date | null;
            last_at: Date | null;
          }) => ({
            runId: k.run_id,
            pointId: k.point_id,
            peak: k.peak,
            mean: k.mean,
            least: k.least,
            count: k.count,
            firstAt: k.first_at,
            lastAt: k.last_at,
          }),
        )
      : [];
    const have = new Set(kept.map((k) => `${k.runId}|${k.pointId}`));
    const missingRuns = closed.filter((r) => pointIds.some((p) => !have.has(`${r}|${p}`)));
    const fresh: PointRunStat[] = [];
    if (missingRuns.length) {
      const computed = await this.readings.pointRunStats(pointIds, { runIds: missingRuns });
      const got = new Map(computed.map((c) => [`${c.runId}|${c.pointId}`, c]));
      const rows: Partial<RunPointStat>[] = [];
      for (const r of missingRuns)
        for (const p of pointIds) {
          const key = `${r}|${p}`;
          if (have.has(key)) continue;
          const c = got.get(key);
          rows.push(
            c
              ? { runId: r, pointId: p, peak: c.peak, mean: c.mean, least: c.least, count: c.count, firstAt: c.firstAt, lastAt: c.lastAt }
              : { runId: r, pointId: p, peak: null, mean: null, least: null, count: 0, firstAt: null, lastAt: null },
          );
          if (c) fresh.push(c);
        }
      for (let i = 0; i < rows.length; i += 1000)
        await this.db
          .createQueryBuilder()
          .insert()
          .into(RunPointStat)
          .values(rows.slice(i, i + 1000))
          .orIgnore()
          .execute();
    }
    // Open runs: the figures the ingest path keeps as readings arrive (one row per run and point, not their readings).
    const live = open.length ? await this.readings.keptPointRunStats(pointIds, open) : [];
    return [
      ...kept
        .filter((k) => k.count > 0)
        .map((k) => ({
          runId: k.runId,
          pointId: k.pointId,
          peak: k.peak!,
          mean: k.mean!,
          least: k.least!,
          count: k.count,
          firstAt: k.firstAt!,
          lastAt: k.lastAt!,
        })),
      ...fresh,
      ...live,
    ];
  }
}
