import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { ConflictException, Injectable, Logger } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { plainToInstance } from 'class-transformer';
import { isDateString, isUUID, validateSync } from 'class-validator';
import { DataSource, EntityManager } from 'typeorm';
import type { PoolClient } from 'pg';
import { from as copyFrom } from 'pg-copy-streams';
import {
  RUN_STATES_TAKING_READINGS,
  type IngestResult,
  type ReadingDto,
  type ReadingSource,
  type RejectedRow,
  type RunState,
} from '@crankjournal/shared-types';
import { EnginesService, type EngineWithPoints } from '../engines/engines.service.js';
import { AlarmsService, type NewReading, type PointReading, type RecentHistoryLoader } from '../alarms/alarms.service.js';
import { LiveService } from '../live/live.service.js';
import { KeyedMutex } from '../../common/util/keyed-mutex.js';
import { YIELD_EVERY_ROWS, yieldToEventLoop } from '../../common/util/yield.js';
import { flattenValidationErrors, hiddenKeyPath } from '../../common/pipes/validation.pipe.js';
import { RunsService } from './runs.service.js';
import { Run } from './run.entity.js';
import { ReadingInputDto } from './dto/reading.dto.js';

/** A measurement point as the engines module hands it out. */
type EnginePoint = EngineWithPoints['points'][number];

/** Readings may be stamped at most this far ahead of the server's clock (clock drift on a tablet). */
const MAX_FUTURE_MS = 5 * 60_000;
/** ...and no earlier than this before the run was planned. */
const MAX_PAST_MS = 7 * 86_400_000;
const MAX_REPORTED_REJECTIONS = 1000;

const READING_FIELDS = new Set(['clientId', 'pointId', 'pointCode', 'value', 'unit', 'takenAt']);
const absent = (v: unknown) => v === undefined || v === null;

/**
 * The common case of ReadingInputDto checked by hand: true only for a row that the DTO's own rules
 * (class-validator, whitelist and forbidNonWhitelisted) accept, using the same checks; anything else
 * goes through class-validator, which gives the messages. About twenty times faster on logger batches.
 */
function plainlyValidReading(raw: object): raw is ReadingInputDto {
  if (Object.getPrototypeOf(raw) !== Object.prototype) return false;
  for (const k of Object.keys(raw)) if (!READING_FIELDS.has(k)) return false;
  const r = raw as Record<string, unknown>;
  return (
    typeof r.clientId === 'string' &&
    isUUID(r.clientId, 'all') &&
    (absent(r.pointId) || (typeof r.pointId === 'string' && isUUID(r.pointId, 'all'))) &&
    (absent(r.pointCode) || (typeof r.pointCode === 'string' && r.pointCode.length <= 24)) &&
    typeof r.value === 'number' &&
    Number.isFinite(r.value) &&
    r.value >= -1e9 &&
    r.value <= 1e9 &&
    (absent(r.unit) || (typeof r.unit === 'string' && r.unit.length <= 16)) &&
    isDateString(r.takenAt, {})
  );
}

/** Readings of batches waiting for the same engine are stored together up to this many rows. */
const GROUP_MAX_ROWS = 5000;
/** Delimiter of the text-encoded columns of the INSERT (the ASCII unit separator). */
const SEP = '\u001f';

/** From this many rows a store goes by COPY into a staging table (fewer: one INSERT, one round trip less). */
const COPY_MIN_ROWS = 200;

/** A value as a field of COPY's text format (backslash, tab and line breaks escaped). */
const copyText = (v: string) =>
  /[\\\t\n\r]/.test(v) ? v.replace(/[\\\t\n\r]/g, (c) => ({ '\\': '\\\\', '\t': '\\t', '\n': '\\n', '\r': '\\r' })[c]!) : v;

/** Adds a row of figures to the run's kept figures of its point (`run_point_figures AS f`), or keeps it as the first. */
const ADD_TO_KEPT_FIGURES = `ON CONFLICT (run_id, point_id) DO UPDATE SET
  count = f.count + EXCLUDED.count, total = f.total + EXCLUDED.total,
  peak = GREATEST(f.peak, EXCLUDED.peak), least = LEAST(f.least, EXCLUDED.least),
  first_at = LEAST(f.first_at, EXCLUDED.first_at), last_at = GREATEST(f.last_at, EXCLUDED.last_at)`;

/**
 * The tail of the storing statement after `WITH ins AS (INSERT INTO readings ... RETURNING ...)`: adds the new
 * readings to the run's kept figures per point (run_point_figures, in the same statement) and hands back the new ids.
 */
const keepFigures = (runParam: string) => `,
  fig AS (INSERT INTO run_point_figures AS f (run_id, point_id, count, total, peak, least, first_at, last_at)
          SELECT ${runParam}::uuid, point_id, count(*), sum(value), max(value), min(value), min(taken_at), max(taken_at)
            FROM ins GROUP BY point_id
          ${ADD_TO_KEPT_FIGURES})
  SELECT id, client_id FROM ins`;

type StoreResult = Omit<IngestResult, 'rejected' | 'rejectedCount'>;
type InsertedRow = { id: string; client_id: string; point_id: string; value: number; unit: string; taken_at: Date };
type StoredId = { id: string; client_id: string };
type GroupRow = { job: number; g: GoodRow };
interface StoreJob {
  ctx: IngestContext;
  good: GoodRow[];
  resolve: (r: StoreResult) => void;
  reject: (e: unknown) => void;
  taken: boolean;
}

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
  point: EnginePoint;
  value: number;
  takenAt: Date;
}

/** First half of the advisory lock key of an engine's readings transaction (the second is a hash of its id). */
const ENGINE_WRITE_LOCK = 7_401;

/**
 * The one path every reading takes, whatever its source (round, logger, CSV file, live channel):
 * row-by-row checks, storing once per client id, alarm evaluation in the same transaction, then broadcast.
 */
@Injectable()
export class IngestService {
  private readonly logger = new Logger('Ingest');
  private readonly mutex = new KeyedMutex();
  /** Per engine: batches waiting for the engine's turn, oldest first. */
  private readonly waiting = new Map<string, StoreJob[]>();

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
    const settingsOf = new Map<string, EnginePoint & { name: string }>();
    const now = Date.now();
    const earliest = ctx.run.createdAt.getTime() - MAX_PAST_MS;
    const col = ctx.columnOf ?? ((f: string) => f);
    const reject = (index: number, field: string | undefined, reason: string) => {
      rejectedCount++;
      if (rejected.length >= MAX_REPORTED_REJECTIONS) return;
      const where = ctx.lineOf ? { line: ctx.lineOf(index) } : { index };
      rejected.push({ ...where, ...(field ? { field, column: col(field) } : {}), reason });
    };
    const checkRow = (raw: unknown, index: number) => {
      if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) return reject(index, undefined, 'each reading must be an object');
      let dto: ReadingInputDto;
      if (plainlyValidReading(raw)) dto = raw;
      else {
        // Keys class-transformer would drop without a word are refused, as the global pipe refuses them elsewhere.
        const hidden = hiddenKeyPath(raw);
        if (hidden) return reject(index, undefined, `property ${hidden} should not exist`);
        dto = plainToInstance(ReadingInputDto, raw);
        const errors = validateSync(dto, { whitelist: true, forbidNonWhitelisted: true });
        if (errors.length) {
          for (const e of errors) reject(index, e.property, flattenValidationErrors([e]).join('; '));
          return;
        }
      }
      const point = dto.pointId ? byId.get(dto.pointId) : dto.pointCode ? byCode.get(dto.pointCode.toLowerCase()) : undefined;
      if (!dto.pointId && !dto.pointCode) return reject(index, 'pointId', 'pointId or pointCode is required');
      if (!point)
        return reject(
          index,
          dto.pointId ? 'pointId' : 'pointCode',
          `no measurement point ${dto.pointId ?? dto.pointCode} on this run's engine`,
        );
      if (dto.unit !== undefined && dto.unit !== point.unit)
        return reject(index, 'unit', `${point.code} is recorded in ${point.unit}, not ${dto.unit}`);
      let settings = settingsOf.get(point.id);
      if (!settings) settingsOf.set(point.id, (settings = { ...point, name: point.label }));
      const absurd = this.alarms.implausibleReading(settings, dto.value);
      if (absurd) return reject(index, 'value', absurd);
      const t = new Date(dto.takenAt);
      if (t.getTime() > now + MAX_FUTURE_MS) return reject(index, 'takenAt', 'takenAt is in the future; check the clock of the device');
      if (t.getTime() < earliest) return reject(index, 'takenAt', 'takenAt is long before this run was planned');
      if (seen.has(dto.clientId)) return; // the same reading twice in one batch counts once
      seen.add(dto.clientId);
      good.push({ clientId: dto.clientId, point, value: dto.value, takenAt: t });
    };
    for (let i = 0; i < rows.length; i++) {
      checkRow(rows[i], i);
      if (i % YIELD_EVERY_ROWS === YIELD_EVERY_ROWS - 1) await yieldToEventLoop();
    }
    return { good, rejected, rejectedCount };
  }

  async ingest(ctx: IngestContext, rows: unknown[]): Promise<IngestResult> {
    this.runs.assertTakingReadings(ctx.run);
    const { good, rejected, rejectedCount } = await this.check(ctx, rows);
    const result = await this.store(ctx, good);
    return { ...result, rejected, rejectedCount };
  }

  /**
   * Stores checked rows (once per client id) and evaluates alarms, serialised per engine. Batches that
   * arrive while the engine's previous transaction runs wait for it and then share one transaction (group
   * commit): one commit for many live readings, so a busy run does not queue up behind the disk. Each
   * caller still gets its own result; if a shared transaction fails, each batch is retried on its own.
   */
  store(ctx: IngestContext, good: GoodRow[]): Promise<StoreResult> {
    if (!good.length) return Promise.resolve({ stored: 0, duplicates: 0, alarmsRaised: 0 });
    const engineId = ctx.run.engineId;
    return new Promise<StoreResult>((resolve, reject) => {
      const job: StoreJob = { ctx, good, resolve, reject, taken: false };
      const queue = this.waiting.get(engineId) ?? [];
      queue.push(job);
      this.waiting.set(engineId, queue);
      void this.mutex.run(engineId, async () => {
        if (job.taken) return;
        await this.storeGroup(engineId, this.takeGroup(engineId, job));
      });
    });
  }

  /** The job and the jobs queued right behind it for the same run, up to GROUP_MAX_ROWS rows (the job always). */
  private takeGroup(engineId: string, job: StoreJob): StoreJob[] {
    const queue = this.waiting.get(engineId) ?? [];
    const at = queue.indexOf(job);
    let end = at + 1;
    let rows = job.good.length;
    while (end < queue.length && queue[end].ctx.run.id === job.ctx.run.id && rows + queue[end].good.length <= GROUP_MAX_ROWS) {
      rows += queue[end].good.length;
      end++;
    }
    const group = at < 0 ? [job] : queue.splice(at, end - at);
    if (!queue.length) this.waiting.delete(engineId);
    for (const j of group) j.taken = true;
    return group;
  }

  private async storeGroup(engineId: string, group: StoreJob[]) {
    try {
      const results = await this.commitGroup(engineId, group);
      group.forEach((j, i) => j.resolve(results[i]));
    } catch (e) {
      if (group.length === 1) return group[0].reject(e);
      // One batch made the shared transaction fail: each on its own, exactly as if it had come alone.
      for (const j of group) {
        try {
          j.resolve((await this.commitGroup(engineId, [j]))[0]);
        } catch (e2) {
          j.reject(e2);
        }
      }
    }
  }

  /** One transaction for the group: insert, evaluate alarms, commit; then publish and broadcast. */
  private async commitGroup(engineId: string, group: StoreJob[]): Promise<StoreResult[]> {
    const run = group[0].ctx.run;
    const rows: GroupRow[] = [];
    group.forEach((j, job) => j.good.forEach((g) => rows.push({ job, g })));
    let outcome;
    let inserted: { job: number; row: InsertedRow }[];
    try {
      // The one transaction of a store: everything from here to its commit happens in it.
      ({ inserted, outcome } = await this.db.transaction(async (m) => {
        // Across service instances: one transaction per engine at a time (the mutex above orders this instance only).
        // The engine's lock and the run's state (held FOR SHARE) in one round trip: the lock is taken in the filter
        // of the run's row, before the row lock (a missing run takes no lock and is refused below).
        const [state] = (await m.query(
          `SELECT state FROM runs WHERE id = $1 AND pg_advisory_xact_lock(${ENGINE_WRITE_LOCK}, hashtext($2)) IS NOT NULL FOR SHARE`,
          [run.id, engineId],
        )) as { state: RunState }[];
        if (!state || !RUN_STATES_TAKING_READINGS.includes(state.state)) throw new ConflictException('This run no longer takes readings.');
        const ids =
          rows.length >= COPY_MIN_ROWS
            ? await this.insertByCopy(m, run.id, engineId, group, rows)
            : await this.insertByUnnest(m, run.id, engineId, group, rows);
        // Only the new ids come back from the database; the rest is what was just checked. A client id
        // sent by two batches of the group counts for the first.
        const byClientId = new Map<string, { job: number; g: GoodRow }>();
        // Keyed in lower case, as the database writes a uuid back.
        for (const r of rows) if (!byClientId.has(r.g.clientId.toLowerCase())) byClientId.set(r.g.clientId.toLowerCase(), r);
        const ins = ids.map(({ id, client_id }) => {
          const { job, g } = byClientId.get(client_id.toLowerCase())!;
          return { job, row: { id, client_id: g.clientId, point_id: g.point.id, value: g.value, unit: g.point.unit, taken_at: g.takenAt } };
        });
        await this.assertResentUnchanged(m, run.id, rows, ins);
        const fresh: NewReading[] = ins.map(({ row }) => ({
          id: String(row.id),
          pointId: row.point_id,
          value: row.value,
          takenAt: row.taken_at,
        }));
        // The state read (and held) in this transaction: the run handed in may have been read a little earlier.
        const o = await this.alarms.evaluate(engineId, run.id, fresh, m, this.history, state.state);
        return { inserted: ins, outcome: o };
      }));
    } catch (e) {
      this.alarms.forget(engineId);
      throw e;
    }
    await this.alarms.publish(outcome);
    const raisedBy = new Set(outcome.raisedReadingIds);
    // One readings:new per commit, whatever the number of batches the group held.
    if (inserted.length)
      this.broadcast(
        run,
        inserted.map((x) => ({ row: x.row, source: group[x.job].ctx.source })),
      );
    return group.map((j, job) => {
      const mine = inserted.filter((x) => x.job === job).map((x) => x.row);
      return {
        stored: mine.length,
        duplicates: j.good.length - mine.length,
        alarmsRaised: mine.filter((r) => raisedBy.has(String(r.id))).length,
      };
    });
  }

  /**
   * A client id already stored in the run counts as a resend (a duplicate) only when it says the same thing: the
   * same point, value and time. Another reading under a known id is refused with 409 (the whole group rolls back
   * and each batch is tried on its own), so a reused id can never silently drop a reading.
   */
  private async assertResentUnchanged(
    m: EntityManager,
    runId: string,
    rows: { g: GoodRow }[],
    inserted: { row: InsertedRow }[],
  ): Promise<void> {
    if (inserted.length === rows.length) return;
    const fresh = new Set(inserted.map((x) => x.row.client_id));
    const firstOf = new Map<string, GoodRow>();
    const resent: GoodRow[] = [];
    for (const { g } of rows) {
      if (fresh.has(g.clientId) && !firstOf.has(g.clientId)) firstOf.set(g.clientId, g);
      else resent.push(g);
    }
    const stored: { client_id: string; point_id: string; value: number; taken_at: Date }[] = await m.query(
      `SELECT client_id, point_id, value, taken_at FROM readings WHERE run_id = $1 AND client_id = ANY($2::uuid[])`,
      [runId, [...new Set(resent.map((g) => g.clientId))]],
    );
    const byId = new Map(stored.map((s) => [s.client_id, s]));
    const clashes = resent.filter((g) => {
      const s = byId.get(g.clientId.toLowerCase());
      return !s || s.point_id !== g.point.id || Number(s.value) !== g.value || new Date(s.taken_at).getTime() !== g.takenAt.getTime();
    });
    if (clashes.length)
      throw new ConflictException(
        `clientId ${clashes[0].clientId} was already used in this run for another reading` +
          (clashes.length > 1 ? ` (and ${clashes.length - 1} more)` : '') +
          '; give each reading an id of its own.',
      );
  }

  /** A few rows (live readings, rounds): one INSERT with the columns as delimited text. */
  private insertByUnnest(m: EntityManager, runId: string, engineId: string, group: StoreJob[], rows: GroupRow[]): Promise<StoredId[]> {
    // Columns go as delimited text (cheaper to build than array literals for thousands of rows); every
    // field is a uuid, a number, an ISO time, a source word or a unit, none of which holds the delimiter.
    const col = (f: (r: GroupRow) => string) => rows.map(f).join(SEP);
    return m.query(
      `WITH ins AS (INSERT INTO readings (client_id, run_id, engine_id, point_id, value, unit, taken_at, source, entered_by, logger_id)
       SELECT c, $2::uuid, $3::uuid, p, v, u, t, s, e, l
         FROM unnest(
           string_to_array($1, $11)::uuid[], string_to_array($4, $11)::uuid[], string_to_array($5, $11)::float8[],
           string_to_array($6, $11), string_to_array($7, $11)::timestamptz[], string_to_array($8, $11),
           string_to_array($9, $11, '')::uuid[], string_to_array($10, $11, '')::uuid[]
         ) AS x(c, p, v, u, t, s, e, l)
       ON CONFLICT (run_id, client_id) DO NOTHING
       RETURNING id, client_id, point_id, value, taken_at)${keepFigures('$2')}`,
      [
        col((r) => r.g.clientId),
        runId,
        engineId,
        col((r) => r.g.point.id),
        col((r) => String(r.g.value)),
        col((r) => r.g.point.unit),
        col((r) => r.g.takenAt.toISOString()),
        col((r) => group[r.job].ctx.source),
        col((r) => group[r.job].ctx.enteredBy ?? ''),
        col((r) => group[r.job].ctx.loggerId ?? ''),
        SEP,
      ],
    );
  }

  /**
   * Many rows (logger batches, CSV chunks): COPY straight into readings. The caller holds the engine's lock, and
   * readings are written nowhere else, so no other transaction adds readings of this run meanwhile: one indexed
   * query finds which client ids the run already holds (and takes ids for the new rows from the table's sequence),
   * the new rows (the first of each client id) go in by COPY with those ids, and the run's kept figures are added to
   * from sums made here. Resent ids are then checked by the caller (assertResentUnchanged), as after ON CONFLICT.
   */
  private async insertByCopy(m: EntityManager, runId: string, engineId: string, group: StoreJob[], rows: GroupRow[]): Promise<StoredId[]> {
    const firsts: GroupRow[] = [];
    const seen = new Set<string>();
    for (const r of rows) {
      const key = r.g.clientId.toLowerCase();
      if (seen.has(key)) continue;
      seen.add(key);
      firsts.push(r);
    }
    const [taken] = (await m.query(
      `WITH known AS (SELECT client_id FROM readings WHERE run_id = $1 AND client_id = ANY(string_to_array($2, ',')::uuid[]))
       SELECT (SELECT string_agg(client_id::text, ',') FROM known) AS known,
              (SELECT string_agg(id::text, ',' ORDER BY id)
                 FROM (SELECT nextval((SELECT pg_get_serial_sequence('readings', 'id')::regclass)) AS id
                         FROM generate_series(1, $3::int - (SELECT count(*) FROM known)::int)) n) AS ids`,
      [runId, [...seen].join(','), seen.size],
    )) as { known: string | null; ids: string | null }[];
    const known = new Set(taken.known ? taken.known.split(',') : []);
    const fresh = known.size ? firsts.filter((r) => !known.has(r.g.clientId.toLowerCase())) : firsts;
    const ids = taken.ids ? taken.ids.split(',') : [];
    if (ids.length !== fresh.length) throw new Error(`expected ${fresh.length} reading ids, got ${ids.length}`);
    if (!fresh.length) return [];
    const client = (await m.queryRunner!.connect()) as PoolClient;
    const copy = client.query(
      copyFrom(
        'COPY readings (id, client_id, run_id, engine_id, point_id, value, unit, taken_at, source, entered_by, logger_id) FROM STDIN',
      ),
    );
    const figures = new Map<string, { count: number; total: number; peak: number; least: number; first: number; last: number }>();
    async function* lines() {
      for (let i = 0; i < fresh.length; i += YIELD_EVERY_ROWS) {
        let text = '';
        const end = Math.min(fresh.length, i + YIELD_EVERY_ROWS);
        for (let k = i; k < end; k++) {
          const { job, g } = fresh[k];
          const ctx = group[job].ctx;
          const t = g.takenAt.getTime();
          const f = figures.get(g.point.id);
          if (!f) figures.set(g.point.id, { count: 1, total: g.value, peak: g.value, least: g.value, first: t, last: t });
          else {
            f.count++;
            f.total += g.value;
            if (g.value > f.peak) f.peak = g.value;
            if (g.value < f.least) f.least = g.value;
            if (t < f.first) f.first = t;
            if (t > f.last) f.last = t;
          }
          const what = `${g.point.id}\t${g.value}\t${copyText(g.point.unit)}\t${g.takenAt.toISOString()}`;
          const who = `${ctx.source}\t${ctx.enteredBy ?? '\\N'}\t${ctx.loggerId ?? '\\N'}`;
          text += `${ids[k]}\t${g.clientId}\t${runId}\t${engineId}\t${what}\t${who}\n`;
        }
        yield text;
        await yieldToEventLoop();
      }
    }
    await pipeline(Readable.from(lines()), copy);
    const fig = [...figures];
    await m.query(
      `INSERT INTO run_point_figures AS f (run_id, point_id, count, total, peak, least, first_at, last_at)
       SELECT $1::uuid, x.*
         FROM unnest($2::uuid[], $3::int[], $4::float8[], $5::float8[], $6::float8[], $7::timestamptz[], $8::timestamptz[])
           AS x(point_id, count, total, peak, least, first_at, last_at)
       ${ADD_TO_KEPT_FIGURES}`,
      [
        runId,
        fig.map(([p]) => p),
        fig.map(([, f]) => f.count),
        fig.map(([, f]) => f.total),
        fig.map(([, f]) => f.peak),
        fig.map(([, f]) => f.least),
        fig.map(([, f]) => new Date(f.first).toISOString()),
        fig.map(([, f]) => new Date(f.last).toISOString()),
      ],
    );
    return fresh.map((r, k) => ({ id: ids[k], client_id: r.g.clientId }));
  }

  private broadcast(run: Run, inserted: { row: InsertedRow; source: ReadingSource }[]) {
    // A large logger batch sends only the newest value of each point; viewers fetch the rest as they need.
    let rows = inserted;
    if (rows.length > 500) {
      const latest = new Map<string, (typeof rows)[number]>();
      for (const r of rows) {
        const cur = latest.get(r.row.point_id);
        if (!cur || cur.row.taken_at < r.row.taken_at) latest.set(r.row.point_id, r);
      }
      rows = [...latest.values()];
    }
    const readings: ReadingDto[] = rows.map(({ row: r, source }) => ({
      id: String(r.id),
      clientId: r.client_id,
      runId: run.id,
      pointId: r.point_id,
      value: Number(r.value),
      originalValue: null,
      unit: r.unit,
      takenAt: r.taken_at.toISOString(),
      source,
      enteredByName: null,
      amendments: [],
    }));
    this.live.emitToRoom(`run:${run.id}`, 'readings:new', { runId: run.id, readings });
  }

  /** What the alarm evaluation needs after a restart: recent readings and the latest ambient value. */
  private readonly history: RecentHistoryLoader = async (engineId: string, windowMinutes: number, m: EntityManager, excludeIds) => {
    const rows: { point_id: string; value: number; taken_at: Date }[] = await m.query(
      `SELECT point_id, COALESCE(amended_value, value) AS value, taken_at FROM readings
        WHERE engine_id = $1 AND id <> ALL($3::bigint[])
          AND taken_at > (SELECT COALESCE(max(taken_at), now()) FROM readings WHERE engine_id = $1 AND id <> ALL($3::bigint[]))
                         - make_interval(mins => $2)
        ORDER BY taken_at`,
      [engineId, windowMinutes, excludeIds],
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
        `SELECT COALESCE(amended_value, value) AS value, unit, taken_at FROM readings
         WHERE point_id = ANY($1) AND id <> ALL($2::bigint[]) ORDER BY taken_at DESC LIMIT 1`,
        [ambientIds, excludeIds],
      );
      if (a[0]) ambient = { value: Number(a[0].value), unit: a[0].unit, takenAt: new Date(a[0].taken_at) };
    }
    return { recent, ambient };
  };
}
