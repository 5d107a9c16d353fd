import { Injectable, NotFoundException, BadRequestException, ConflictException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, In, Repository } from 'typeorm';
import type { AmendmentDto, BoardPoint, MeasurementKind, ReadingDto } from '@crankjournal/shared-types';
import { UsersService } from '../users/users.service.js';
import { LiveService } from '../live/live.service.js';
import { AlarmsService } from '../alarms/alarms.service.js';
import { EnginesService } from '../engines/engines.service.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { RunsService } from './runs.service.js';
import { ReadingAmendment } from './reading-amendment.entity.js';
import { Reading } from './reading.entity.js';

/** Aggregates of one point's readings in one run (amended values count). */
export interface PointRunStat {
  runId: string;
  pointId: string;
  peak: number;
  mean: number;
  least: number;
  count: number;
  firstAt: Date;
  lastAt: Date;
}

@Injectable()
export class ReadingsService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(Reading) private readonly readingRepo: Repository<Reading>,
    @InjectRepository(ReadingAmendment) private readonly readingAmendmentRepo: Repository<ReadingAmendment>,
    private readonly runs: RunsService,
    private readonly live: LiveService,
    private readonly alarms: AlarmsService,
    private readonly engines: EnginesService,
    private readonly users: UsersService,
  ) {}

  async list(runId: string, filter: { since?: string; pointId?: string; limit?: number }): Promise<ReadingDto[]> {
    await this.runs.get(runId);
    const qb = this.readingRepo.createQueryBuilder('r').where('r.runId = :runId', { runId });
    if (filter.since) qb.andWhere('r.receivedAt > :since', { since: new Date(filter.since) });
    if (filter.pointId) qb.andWhere('r.pointId = :pointId', { pointId: filter.pointId });
    const rows = await qb
      .orderBy('r.takenAt', 'ASC')
      .addOrderBy('r.id', 'ASC')
      .limit(filter.limit ?? 20_000)
      .getMany();
    return this.toDtos(rows);
  }

  private async toDtos(rows: Reading[]): Promise<ReadingDto[]> {
    const amendedIds = rows.filter((r) => r.amendedValue !== null).map((r) => r.id);
    const amendments = amendedIds.length
      ? await this.readingAmendmentRepo.find({ where: { readingId: In(amendedIds) }, order: { at: 'ASC' } })
      : [];
    const userIds = [...new Set([...rows.map((r) => r.enteredBy).filter((x): x is string => !!x), ...amendments.map((a) => a.byUser)])];
    const name = await this.users.displayNames(userIds);
    const byReading = new Map<string, AmendmentDto[]>();
    for (const a of amendments) {
      const list = byReading.get(a.readingId) ?? [];
      list.push({
        id: a.id,
        oldValue: a.oldValue,
        newValue: a.newValue,
        reason: a.reason,
        by: a.byUser,
        byName: name.get(a.byUser) ?? 'unknown',
        at: a.at.toISOString(),
      });
      byReading.set(a.readingId, list);
    }
    return rows.map((r) => ({
      id: String(r.id),
      clientId: r.clientId,
      runId: r.runId,
      pointId: r.pointId,
      value: r.amendedValue ?? r.value,
      originalValue: r.amendedValue !== null ? r.value : null,
      unit: r.unit,
      takenAt: r.takenAt.toISOString(),
      source: r.source,
      enteredByName: r.enteredBy ? (name.get(r.enteredBy) ?? null) : null,
      amendments: byReading.get(String(r.id)) ?? [],
    }));
  }

  /** Latest value, a short trend and the alarm state of every point of the run's engine. */
  async board(runId: string): Promise<BoardPoint[]> {
    const run = await this.runs.get(runId);
    const { points } = await this.engines.withPoints(run.engineId);
    const rows: { point_id: string; value: number; taken_at: Date; rn: number }[] = await this.db.query(
      `SELECT point_id, value, taken_at, rn FROM (
         SELECT point_id, COALESCE(amended_value, value) AS value, taken_at,
                row_number() OVER (PARTITION BY point_id ORDER BY taken_at DESC) AS rn
           FROM readings WHERE run_id = $1) x WHERE rn <= 20 ORDER BY point_id, taken_at`,
      [runId],
    );
    const alarms = await this.alarms.list({ runId, open: true });
    const worst = new Map<string, { state: BoardPoint['alarmState']; priority: BoardPoint['alarmPriority'] }>();
    for (const a of alarms) {
      // Suppressed alarms are recorded but not annunciated: the board shows the one that matters.
      if (!a.pointId || a.suppression) continue;
      const cur = worst.get(a.pointId);
      if (!cur || (a.priority === 'high_high' && cur.priority !== 'high_high'))
        worst.set(a.pointId, { state: a.state, priority: a.priority });
    }
    // The last 10 minutes of each point (before its latest reading), for the forecast; thinned to 120 readings.
    const recent: { point_id: string; value: number; taken_at: Date }[] = await this.db.query(
      `SELECT r.point_id, COALESCE(r.amended_value, r.value) AS value, r.taken_at
         FROM readings r
         JOIN (SELECT point_id, max(taken_at) AS last FROM readings WHERE run_id = $1 GROUP BY point_id) m
           ON m.point_id = r.point_id AND r.taken_at > m.last - interval '10 minutes'
        WHERE r.run_id = $1 ORDER BY r.point_id, r.taken_at`,
      [runId],
    );
    const recentBy = new Map<string, { value: number; takenAt: Date }[]>();
    for (const r of recent) {
      const list = recentBy.get(r.point_id) ?? [];
      list.push({ value: Number(r.value), takenAt: new Date(r.taken_at) });
      recentBy.set(r.point_id, list);
    }
    const thin = <T>(xs: T[]) => (xs.length <= 120 ? xs : xs.filter((_, i) => i % Math.ceil(xs.length / 120) === 0 || i === xs.length - 1));
    const byPoint = new Map<string, { value: number; taken_at: Date }[]>();
    for (const r of rows) {
      const list = byPoint.get(r.point_id) ?? [];
      list.push({ value: Number(r.value), taken_at: new Date(r.taken_at) });
      byPoint.set(r.point_id, list);
    }
    return points
      .filter((p) => p.active)
      .map((p) => {
        const list = byPoint.get(p.id) ?? [];
        const last = list[list.length - 1];
        const w = worst.get(p.id);
        return {
          pointId: p.id,
          value: last ? last.value : null,
          unit: p.unit,
          takenAt: last ? last.taken_at.toISOString() : null,
          trend: list.map((x) => x.value),
          alarmState: w?.state ?? null,
          alarmPriority: w?.priority ?? null,
          forecast: last ? this.alarms.forecast(p, thin(recentBy.get(p.id) ?? []), last.taken_at) : null,
        };
      });
  }

  /** A correction: the original stays, the amendment records the new value, reason, who and when. */
  async amend(readingId: string, value: number, reason: string, user: AuthUser, clientId?: string): Promise<ReadingDto> {
    if (!/^\d{1,18}$/.test(readingId)) throw new BadRequestException('id must be a reading number');
    const r0 = await this.readingRepo.findOne({ where: { id: readingId } });
    if (!r0) throw new NotFoundException('No such reading.');
    // Sent again (the tablet's outbox): the stored amendment answers, even if the run has closed since.
    if (clientId && (await this.sameAmendmentStored(clientId, readingId, value, reason))) return (await this.toDtos([r0]))[0];
    const run = await this.runs.get(r0.runId);
    this.runs.assertOpen(run);
    const { points } = await this.engines.withPoints(r0.engineId);
    const point = points.find((p) => p.id === r0.pointId);
    if (point) {
      const absurd = this.alarms.implausibleReading({ ...point, name: point.label }, value);
      if (absurd) throw new BadRequestException(`value: ${absurd}`);
    }
    try {
      await this.db.transaction(async (m) => {
        const cur = await m.findOne(Reading, { where: { id: readingId }, lock: { mode: 'pessimistic_write' } });
        const old = cur!.amendedValue ?? cur!.value;
        await m.insert(ReadingAmendment, {
          readingId,
          oldValue: old,
          newValue: value,
          reason: reason.trim(),
          byUser: user.id,
          at: new Date(),
          clientId: clientId ?? null,
        });
        await m.update(Reading, { id: readingId }, { amendedValue: value });
        // The run's kept figures of the point, recomputed. Its row is locked first, in a statement of its own, so
        // the recount (a new statement, a new snapshot) includes any readings a store committed meanwhile.
        const key = [cur!.runId, cur!.pointId];
        await m.query(`SELECT 1 FROM run_point_figures WHERE run_id = $1 AND point_id = $2 FOR UPDATE`, key);
        await m.query(
          `UPDATE run_point_figures f SET (count, total, peak, least, first_at, last_at) =
             (SELECT count(*), sum(v), max(v), min(v), min(taken_at), max(taken_at)
                FROM (SELECT COALESCE(amended_value, value) AS v, taken_at FROM readings WHERE point_id = $2 AND run_id = $1) r)
            WHERE f.run_id = $1 AND f.point_id = $2`,
          key,
        );
      });
    } catch (e) {
      // The same id arrived twice at once: the one stored first answers both.
      if (!clientId || (e as { code?: string }).code !== '23505') throw e;
      if (!(await this.sameAmendmentStored(clientId, readingId, value, reason))) throw e;
    }
    const [dto] = await this.toDtos([(await this.readingRepo.findOne({ where: { id: readingId } }))!]);
    this.live.emitToRoom(`run:${r0.runId}`, 'reading:amended', dto);
    return dto;
  }

  /**
   * Whether the amendment with this client id is already stored with this content (true), not stored (false), or
   * stored with other content: then a 409, since one id names one amendment.
   */
  private async sameAmendmentStored(clientId: string, readingId: string, value: number, reason: string): Promise<boolean> {
    const a = await this.readingAmendmentRepo.findOne({ where: { clientId } });
    if (!a) return false;
    if (a.readingId === readingId && a.newValue === value && a.reason === reason.trim()) return true;
    throw new ConflictException(
      'An amendment with this clientId was already stored with another reading, value or reason; send a new clientId for a new amendment.',
    );
  }

  /** Readings of a run in time order, streamed in pages (for CSV and PDF exports). */
  async *iterate(runId: string, pageSize = 5000): AsyncGenerator<Reading[]> {
    let after = '0';
    for (;;) {
      const page = await this.readingRepo
        .createQueryBuilder('r')
        .where('r.runId = :runId AND r.id > :after', { runId, after })
        .orderBy('r.id', 'ASC')
        .limit(pageSize)
        .getMany();
      if (!page.length) return;
      yield page;
      after = String(page[page.length - 1].id);
    }
  }

  /** The kept figures (run_point_figures) of some points in some runs: one small row per run and point with readings. */
  async keptPointRunStats(pointIds: string[], runIds: string[]): Promise<PointRunStat[]> {
    if (!pointIds.length || !runIds.length) return [];
    const rows: {
      run_id: string;
      point_id: string;
      count: number;
      total: number;
      peak: number;
      least: number;
      first_at: Date;
      last_at: Date;
    }[] = await this.db.query(
      `SELECT run_id, point_id, count, total, peak, least, first_at, last_at FROM run_point_figures
          WHERE run_id = ANY($1::uuid[]) AND point_id = ANY($2::uuid[]) AND count > 0`,
      [runIds, pointIds],
    );
    return rows.map((r) => ({
      runId: r.run_id,
      pointId: r.point_id,
      peak: Number(r.peak),
      mean: Number(r.total) / r.count,
      least: Number(r.least),
      count: r.count,
      firstAt: new Date(r.first_at),
      lastAt: new Date(r.last_at),
    }));
  }

  /**
   * Per-run aggregates of some points' readings: peak, mean, least, count, first and last time, amended values
   * counting. One grouped query over the readings(point_id, taken_at) index, never a loop over runs; restrict it
   * to some runs with `runIds` (then the readings(run_id, taken_at) index may serve instead).
   */
  async pointRunStats(pointIds: string[], opts: { runIds?: string[] } = {}): Promise<PointRunStat[]> {
    if (!pointIds.length || (opts.runIds && !opts.runIds.length)) return [];
    const params: unknown[] = [pointIds];
    let byRun = '';
    if (opts.runIds) {
      params.push(opts.runIds);
      byRun = ' AND run_id = ANY($2::uuid[])';
    }
    const rows: {
      run_id: string;
      point_id: string;
      peak: number;
      mean: number;
      least: number;
      n: number;
      first_at: Date;
      last_at: Date;
    }[] = await this.db.query(
      `SELECT run_id, point_id, max(v) AS peak, avg(v) AS mean, min(v) AS least, count(*)::int AS n,
              min(taken_at) AS first_at, max(taken_at) AS last_at
         FROM (SELECT run_id, point_id, COALESCE(amended_value, value) AS v, taken_at FROM readings
               WHERE point_id = ANY($1::uuid[])${byRun}) r
        GROUP BY run_id, point_id`,
      params,
    );
    return rows.map((r) => ({
      runId: r.run_id,
      pointId: r.point_id,
      peak: Number(r.peak),
      mean: Number(r.mean),
      least: Number(r.least),
      count: Number(r.n),
      firstAt: new Date(r.first_at),
      lastAt: new Date(r.last_at),
    }));
  }

  amendmentsOf(readingIds: string[]) {
    return readingIds.length
      ? this.readingAmendmentRepo.find({ where: { readingId: In(readingIds) }, order: { at: 'ASC' } })
      : Promise.resolve([]);
  }

  /**
   * The latest reading of a point in a run at or before `at` and no older than `maxAgeMs` (an amended value wins);
   * null when there is none. Used by the mill's rolling log for the engine's speed as a bar entered.
   */
  async latestValueBefore(runId: string, pointId: string, at: Date, maxAgeMs: number): Promise<{ value: number; takenAt: Date } | null> {
    const rows: { v: number; t: Date }[] = await this.db.query(
      `SELECT COALESCE(amended_value, value) AS v, taken_at AS t FROM readings
        WHERE run_id = $1 AND point_id = $2 AND taken_at <= $3 AND taken_at >= $4 ORDER BY taken_at DESC LIMIT 1`,
      [runId, pointId, at, new Date(at.getTime() - maxAgeMs)],
    );
    return rows.length ? { value: Number(rows[0].v), takenAt: new Date(rows[0].t) } : null;
  }

  /**
   * A run's readings of some points that had arrived by `arrivedBy` (and, when given, were taken at or after
   * `takenFrom`), oldest first, amended values winning. The visitor board shows figures a few seconds late with it.
   */
  async arrivedBy(
    runId: string,
    pointIds: string[],
    arrivedBy: Date,
    takenFrom?: Date,
  ): Promise<{ pointId: string; value: number; takenAt: Date }[]> {
    if (!pointIds.length) return [];
    const rows: { p: string; v: number; t: Date }[] = await this.db.query(
      `SELECT point_id AS p, COALESCE(amended_value, value) AS v, taken_at AS t FROM readings
        WHERE run_id = $1 AND point_id = ANY($2) AND received_at <= $3 AND taken_at >= $4 ORDER BY taken_at`,
      [runId, pointIds, arrivedBy, takenFrom ?? new Date(0)],
    );
    return rows.map((r) => ({ pointId: r.p, value: Number(r.v), takenAt: new Date(r.t) }));
  }

  /** The values a point recorded at exactly these instants (the original values, as the alarm rules saw them). */
  async valuesAt(pointId: string, at: Date[]): Promise<number[]> {
    if (at.length === 0) return [];
    const rows: { value: number }[] = await this.db.query(`SELECT value FROM readings WHERE point_id = $1 AND taken_at = ANY($2)`, [
      pointId,
      at,
    ]);
    return rows.map((r) => Number(r.value));
  }

  /**
   * The run's reading of a point of `pointKind` nearest in time to `at` (an amended value wins), no further
   * than `withinMs` away; null when there is none. Used by the indicator cards for speed and pressures.
   */
  async nearestValue(
    runId: string,
    pointKind: MeasurementKind,
    at: Date,
    withinMs = 30 * 60_000,
  ): Promise<{ value: number; unit: string; takenAt: Date; pointId: string; pointCode: string } | null> {
    const run = await this.runs.get(runId);
    const { points } = await this.engines.withPoints(run.engineId);
    const ofKind = points.filter((p) => p.kind === pointKind);
    if (!ofKind.length) return null;
    const rows: { point_id: string; v: number; unit: string; taken_at: Date }[] = await this.db.query(
      `SELECT point_id, COALESCE(amended_value, value) AS v, unit, taken_at FROM readings
        WHERE run_id = $1 AND point_id = ANY($2) AND taken_at BETWEEN $3 AND $4
        ORDER BY abs(extract(epoch FROM taken_at - $5::timestamptz)), taken_at LIMIT 1`,
      [runId, ofKind.map((p) => p.id), new Date(at.getTime() - withinMs), new Date(at.getTime() + withinMs), at],
    );
    if (!rows.length) return null;
    const r = rows[0];
    return {
      value: Number(r.v),
      unit: r.unit,
      takenAt: new Date(r.taken_at),
      pointId: r.point_id,
      pointCode: ofKind.find((p) => p.id === r.point_id)?.code ?? '',
    };
  }
}
