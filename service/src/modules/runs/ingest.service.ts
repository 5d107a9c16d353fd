import { ConflictException, Injectable, Logger } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { plainToInstance } from 'class-transformer';
import { validateSync } from 'class-validator';
import { DataSource, EntityManager } from 'typeorm';
import type { IngestResult, ReadingDto, ReadingSource, RejectedRow } from '@crankjournal/shared-types';
import { ReadingInputDto } from './dto/reading.dto.js';
import { Run } from './run.entity.js';
import { RunsService } from './runs.service.js';
import { EnginesService } from '../engines/engines.service.js';
import type { MeasurementPoint } from '../engines/measurement-point.entity.js';
import { AlarmsService, type NewReading, type RecentHistoryLoader } from '../alarms/alarms.service.js';
import { validateReadingValue, type PointReading } from '../alarms/alarm-rules.js';
import { LiveService } from '../live/live.service.js';
import { KeyedMutex } from '../../common/util/keyed-mutex.js';
import { flattenValidationErrors } from '../../common/pipes/validation.pipe.js';

/** Readings may be stamped at most this far ahead of the server's clock (clock drift on a tablet). */
const MAX_FUTURE_MS = 5 * 60_000;
/** ...and no earlier than this before the run was planned. */
const MAX_PAST_MS = 7 * 86_400_000;
const MAX_REPORTED_REJECTIONS = 1000;

export interface IngestContext {
  run: Run;
  source: ReadingSource;
  enteredBy?: string | null;
  loggerId?: string | null;
  /** Maps a DTO field to the caller's name for it (CSV column names). */
  columnOf?: (field: string) => string;
  /** Row numbers for the report (CSV line numbers); default the index in the batch. */
  lineOf?: (index: number) => number;
}

interface GoodRow {
  clientId: string;
  point: MeasurementPoint;
  value: number;
  takenAt: Date;
}

/**
 * The one path every reading takes, whatever its source (round, logger, CSV file, live channel):
 * row-by-row checks, storing once per client id, alarm evaluation in the same transaction, then broadcast.
 */
@Injectable()
export class IngestService {
  private readonly logger = new Logger('Ingest');
  private readonly mutex = new KeyedMutex();

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly runs: RunsService,
    private readonly engines: EnginesService,
    private readonly alarms: AlarmsService,
    private readonly live: LiveService,
  ) {}

  /** Checks each row on its own; returns the good ones and a report of the bad ones. */
  async check(ctx: IngestContext, rows: unknown[]): Promise<{ good: GoodRow[]; rejected: RejectedRow[]; rejectedCount: number }> {
    const { points } = await this.engines.withPoints(ctx.run.engineId);
    const byId = new Map(points.filter((p) => p.active).map((p) => [p.id, p]));
    const byCode = new Map(points.filter((p) => p.active).map((p) => [p.code.toLowerCase(), p]));
    const rejected: RejectedRow[] = [];
    let rejectedCount = 0;
    const good: GoodRow[] = [];
    const seen = new Set<string>();
    const now = Date.now();
    const earliest = ctx.run.createdAt.getTime() - MAX_PAST_MS;
    const col = ctx.columnOf ?? ((f: string) => f);
    const reject = (index: number, field: string | undefined, reason: string) => {
      rejectedCount++;
      if (rejected.length >= MAX_REPORTED_REJECTIONS) return;
      const where = ctx.lineOf ? { line: ctx.lineOf(index) } : { index };
      rejected.push({ ...where, ...(field ? { field, column: col(field) } : {}), reason });
    };
    rows.forEach((raw, index) => {
      if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) return reject(index, undefined, 'each reading must be an object');
      const dto = plainToInstance(ReadingInputDto, raw);
      const errors = validateSync(dto, { whitelist: true, forbidNonWhitelisted: true });
      if (errors.length) {
        for (const e of errors) reject(index, e.property, flattenValidationErrors([e]).join('; '));
        return;
      }
      const point = dto.pointId ? byId.get(dto.pointId) : dto.pointCode ? byCode.get(dto.pointCode.toLowerCase()) : undefined;
      if (!dto.pointId && !dto.pointCode) return reject(index, 'pointId', 'pointId or pointCode is required');
      if (!point) return reject(index, dto.pointId ? 'pointId' : 'pointCode', `no measurement point ${dto.pointId ?? dto.pointCode} on this run's engine`);
      if (dto.unit !== undefined && dto.unit !== point.unit) return reject(index, 'unit', `${point.code} is recorded in ${point.unit}, not ${dto.unit}`);
      const absurd = validateReadingValue({ ...point, name: point.label }, dto.value);
      if (absurd) return reject(index, 'value', absurd);
      const t = new Date(dto.takenAt);
      if (t.getTime() > now + MAX_FUTURE_MS) return reject(index, 'takenAt', 'takenAt is in the future; check the clock of the device');
      if (t.getTime() < earliest) return reject(index, 'takenAt', 'takenAt is long before this run was planned');
      if (seen.has(dto.clientId)) return; // the same reading twice in one batch counts once
      seen.add(dto.clientId);
      good.push({ clientId: dto.clientId, point, value: dto.value, takenAt: t });
    });
    return { good, rejected, rejectedCount };
  }

  async ingest(ctx: IngestContext, rows: unknown[]): Promise<IngestResult> {
    this.runs.assertTakingReadings(ctx.run);
    const { good, rejected, rejectedCount } = await this.check(ctx, rows);
    const result = await this.store(ctx, good);
    return { ...result, rejected, rejectedCount };
  }

  /** Stores checked rows (once per client id) and evaluates alarms, serialised per engine. */
  async store(ctx: IngestContext, good: GoodRow[]): Promise<Omit<IngestResult, 'rejected' | 'rejectedCount'>> {
    if (!good.length) return { stored: 0, duplicates: 0, alarmsRaised: 0 };
    const engineId = ctx.run.engineId;
    return this.mutex.run(engineId, async () => {
      let outcome;
      let inserted: { id: string; client_id: string; point_id: string; value: number; taken_at: Date }[];
      try {
        ({ inserted, outcome } = await this.db.transaction(async (m) => {
          const [state] = await m.query(`SELECT state FROM runs WHERE id = $1 FOR SHARE`, [ctx.run.id]);
          if (!state || !['preparing', 'cleared', 'running', 'stopped'].includes(state.state)) throw new ConflictException('This run no longer takes readings.');
          const ins: typeof inserted = await m.query(
            `INSERT INTO readings (client_id, run_id, engine_id, point_id, value, unit, taken_at, source, entered_by, logger_id)
             SELECT c, $2::uuid, $3::uuid, p, v, u, t, $4, $5::uuid, $6::uuid
               FROM unnest($1::uuid[], $7::uuid[], $8::float8[], $9::text[], $10::timestamptz[]) AS x(c, p, v, u, t)
             ON CONFLICT (client_id) DO NOTHING
             RETURNING id, client_id, point_id, value, taken_at`,
            [
              good.map((g) => g.clientId),
              ctx.run.id,
              engineId,
              ctx.source,
              ctx.enteredBy ?? null,
              ctx.loggerId ?? null,
              good.map((g) => g.point.id),
              good.map((g) => g.value),
              good.map((g) => g.point.unit),
              good.map((g) => g.takenAt.toISOString()),
            ],
          );
          const fresh: NewReading[] = ins.map((r) => ({ id: String(r.id), pointId: r.point_id, value: Number(r.value), takenAt: new Date(r.taken_at) }));
          const o = await this.alarms.evaluate(engineId, ctx.run.id, fresh, m, this.history);
          return { inserted: ins, outcome: o };
        }));
      } catch (e) {
        this.alarms.forget(engineId);
        throw e;
      }
      await this.alarms.publish(outcome);
      if (inserted.length) this.broadcast(ctx, inserted);
      return { stored: inserted.length, duplicates: good.length - inserted.length, alarmsRaised: outcome.raised };
    });
  }

  private broadcast(ctx: IngestContext, inserted: { id: string; client_id: string; point_id: string; value: number; taken_at: Date }[]) {
    // A large logger batch sends only the newest value of each point; viewers fetch the rest as they need.
    let rows = inserted;
    if (rows.length > 500) {
      const latest = new Map<string, (typeof rows)[number]>();
      for (const r of rows) {
        const cur = latest.get(r.point_id);
        if (!cur || new Date(cur.taken_at) < new Date(r.taken_at)) latest.set(r.point_id, r);
      }
      rows = [...latest.values()];
    }
    const readings: ReadingDto[] = rows.map((r) => ({
      id: String(r.id),
      clientId: r.client_id,
      runId: ctx.run.id,
      pointId: r.point_id,
      value: Number(r.value),
      originalValue: null,
      unit: '',
      takenAt: new Date(r.taken_at).toISOString(),
      source: ctx.source,
      enteredByName: null,
      amendments: [],
    }));
    void this.engines.withPoints(ctx.run.engineId).then(({ points }) => {
      const unit = new Map(points.map((p) => [p.id, p.unit]));
      for (const r of readings) r.unit = unit.get(r.pointId) ?? '';
      this.live.emitToRoom(`run:${ctx.run.id}`, 'readings:new', { runId: ctx.run.id, readings });
    });
  }

  /** What the alarm evaluation needs after a restart: recent readings and the latest ambient value. */
  private readonly history: RecentHistoryLoader = async (engineId: string, windowMinutes: number, m: EntityManager) => {
    const rows: { point_id: string; value: number; taken_at: Date }[] = await m.query(
      `SELECT point_id, COALESCE(amended_value, value) AS value, taken_at FROM readings
        WHERE engine_id = $1 AND taken_at > (SELECT COALESCE(max(taken_at), now()) FROM readings WHERE engine_id = $1) - make_interval(mins => $2)
        ORDER BY taken_at`,
      [engineId, windowMinutes],
    );
    const recent = new Map<string, PointReading[]>();
    for (const r of rows) {
      const list = recent.get(r.point_id) ?? [];
      list.push({ pointId: r.point_id, value: Number(r.value), takenAt: new Date(r.taken_at) });
      recent.set(r.point_id, list);
    }
    const { points } = await this.engines.withPoints(engineId);
    const ambientIds = points.filter((p) => p.kind === 'ambient_temperature').map((p) => p.id);
    let ambient = null;
    if (ambientIds.length) {
      const a: { value: number; unit: string; taken_at: Date }[] = await m.query(
        `SELECT COALESCE(amended_value, value) AS value, unit, taken_at FROM readings WHERE point_id = ANY($1) ORDER BY taken_at DESC LIMIT 1`,
        [ambientIds],
      );
      if (a[0]) ambient = { value: Number(a[0].value), unit: a[0].unit, takenAt: new Date(a[0].taken_at) };
    }
    return { recent, ambient };
  };
}
