import { BadRequestException, Injectable, Logger, NotFoundException, type OnModuleDestroy, type OnModuleInit } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, EntityManager, In, Not, Repository } from 'typeorm';
import {
  type AlarmDto,
  type AlarmFiguresDto,
  type AlarmKind,
  type AlarmSuppression,
  type LimitForecastDto,
  type RunState,
  ALARM_KIND_WORDS,
  RUN_STATE_LABELS,
} from '@crankjournal/shared-types';
import { EnginesService, type EngineWithPoints } from '../engines/engines.service.js';
import { LiveService } from '../live/live.service.js';
import { JobsService } from '../jobs/jobs.service.js';
import { MailService, type OutgoingMail } from '../mail/mail.service.js';
import { UsersService } from '../users/users.service.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { temperatureInUnit, unitLabel } from '../../calculations/units.js';
import { FORECAST_DEFAULTS } from '../../calculations/trend-forecast.js';
import { AppConfig } from '../../config/app-config.service.js';
import { runAlone } from '../../common/util/run-alone.js';
import { YIELD_EVERY_ROWS, yieldToEventLoop } from '../../common/util/yield.js';
import {
  AlarmTransitionError,
  applyShelveExpiry,
  transition,
  type AlarmEvent as LifecycleEvent,
  type AlarmLifecycle,
} from './alarm-lifecycle.js';
import {
  evaluateReading,
  validateReadingValue,
  type AlarmConditionKind,
  type MeasurementPointSettings,
  type PointReading,
} from './alarm-rules.js';
import { designSuppressor, suppressedByState } from './alarm-suppression.js';
import { forecastForPoint } from './alarm-forecast.js';
import {
  ALARM_FIGURE_BASIS,
  alarmFigureRows,
  alarmFigures,
  detectChattering,
  suggestDeadband,
  type AlarmSpan,
  type Annunciation,
} from './alarm-performance.js';
import { AlarmEvent } from './alarm-event.entity.js';
import { Alarm } from './alarm.entity.js';

/** A measurement point as the engines module hands it out. */
type EnginePoint = EngineWithPoints['points'][number];
/** One reading of a point, as the alarm rules take it (for modules that keep recent history). */
export type { PointReading };

/** The queue of escalations: one job per high-high alarm, due when its engine's escalation time is up. */
export const ESCALATION_QUEUE = 'alarm-escalation';
/** Minutes a high-high alarm may wait unacknowledged before the call list is e-mailed (an engine may set its own). */
export const DEFAULT_ESCALATE_AFTER_MINUTES = 5;
interface EscalationJob {
  alarmId: string;
}

/** Rate of rise is judged over this window, long enough to hold two hand-taken rounds. */
export const RATE_WINDOW_MINUTES = 15;

export interface NewReading {
  id: string;
  pointId: string;
  value: number;
  takenAt: Date;
}

interface Suppression {
  kind: AlarmSuppression;
  /** The suppressing alarm (design). */
  by: string | null;
  label: string;
}

interface EngineState {
  /** The engine's ingest count (engine_ingest_marks) this state includes: another instance's write makes it stale. */
  seq: number;
  recent: Map<string, PointReading[]>;
  /**
   * Per point: readings of `recent` before this time (ms) count as gone. They are dropped in bulk, once they span a
   * second window, rather than one at a time (each drop moves the whole list: most of a logger batch's evaluation).
   */
  floor: Map<string, number>;
  open: Map<string, Alarm>;
  ambient: { value: number; unit: string; takenAt: Date } | null;
}

export interface EvaluationOutcome {
  changed: Alarm[];
  raised: number;
  /** Ids of the readings that raised a new alarm (one per new alarm), so a caller can split `raised` among batches. */
  raisedReadingIds: string[];
  toEmail: Alarm[];
}

/** Recent readings per point and the latest ambient reading, from the module that owns readings. */
export type RecentHistoryLoader = (
  engineId: string,
  windowMinutes: number,
  m: EntityManager,
  /** Readings being evaluated (already stored in this transaction): left out, so each counts once and as new. */
  excludeIds: string[],
) => Promise<{ recent: Map<string, PointReading[]>; ambient: { value: number; unit: string; takenAt: Date } | null }>;

/** Permission check for acknowledging (the qualifications module fills it in). */
export interface AlarmAckPolicy {
  assertMayAcknowledge(user: AuthUser, alarm: Alarm): Promise<void>;
}

/** The kinds the alarm rules raise (every kind but the advisory pre-alarm, which the forecast raises). */
function isConditionKind(kind: AlarmKind): kind is AlarmConditionKind {
  return kind !== 'pre_alarm';
}

/** Inserts a reading into a list kept in time order (after readings of the same moment, so ties keep arrival order). */
function insertByTime(list: PointReading[], r: PointReading) {
  const t = r.takenAt.getTime();
  if (!list.length || list[list.length - 1].takenAt.getTime() <= t) {
    list.push(r);
    return;
  }
  let lo = 0;
  let hi = list.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (list[mid].takenAt.getTime() <= t) lo = mid + 1;
    else hi = mid;
  }
  list.splice(lo, 0, r);
}

/**
 * The earliest reading of a time-ordered list within [takenAt − window, takenAt] with a finite value (the
 * first such in arrival order among readings of the same moment), as a one-element list; empty when none.
 */
function oldestInWindow(list: readonly PointReading[], takenAt: Date, windowMinutes: number, floor = -Infinity): PointReading[] {
  const end = takenAt.getTime();
  const start = Math.max(end - windowMinutes * 60_000, floor);
  let lo = 0;
  let hi = list.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (list[mid].takenAt.getTime() < start) lo = mid + 1;
    else hi = mid;
  }
  for (let i = lo; i < list.length; i++) {
    const t = list[i].takenAt.getTime();
    if (t > end) break;
    if (Number.isFinite(list[i].value) && Number.isFinite(t)) return [list[i]];
  }
  return [];
}

/**
 * The recorded values of a point at given instants (the readings module answers it: alarms never read its table).
 * Used for the deadband a chattering alarm would have needed.
 */
export type ReadingValuesAt = (pointId: string, at: Date[]) => Promise<number[]>;

@Injectable()
export class AlarmsService implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('Alarms');
  private readonly state = new Map<string, EngineState>();
  private readonly names = new Map<string, string>();
  private sweep: NodeJS.Timeout | null = null;
  private ackPolicy: AlarmAckPolicy | null = null;

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(Alarm) private readonly alarmRepo: Repository<Alarm>,
    private readonly engines: EnginesService,
    private readonly live: LiveService,
    private readonly mail: MailService,
    private readonly jobs: JobsService,
    private readonly users: UsersService,
    private readonly config: AppConfig,
  ) {}

  async onModuleInit() {
    // Every instance runs the sweep; the advisory lock lets one at a time do it (the others skip that turn).
    this.sweep = setInterval(
      () => void runAlone(this.db, 'alarms:expire-shelves', () => this.expireShelves()).catch((e) => this.logger.warn(e.message)),
      30_000,
    );
    this.sweep.unref();
    await this.jobs.queue(ESCALATION_QUEUE, { retryLimit: 5, retryDelay: 30, retryBackoff: true });
    await this.jobs.work<EscalationJob>(ESCALATION_QUEUE, (job) => this.escalate(job));
  }
  onModuleDestroy() {
    if (this.sweep) clearInterval(this.sweep);
  }

  setAckPolicy(policy: AlarmAckPolicy) {
    this.ackPolicy = policy;
  }

  /** Forget cached state of an engine (after a rolled-back transaction). */
  forget(engineId: string) {
    this.state.delete(engineId);
  }

  private async load(engineId: string, m: EntityManager, history: RecentHistoryLoader, evaluating: NewReading[]): Promise<EngineState> {
    const hit = this.state.get(engineId);
    if (hit) return hit;
    const open = await m.find(Alarm, { where: { engineId, state: Not('normal') } });
    const { recent, ambient } = await history(
      engineId,
      RATE_WINDOW_MINUTES,
      m,
      evaluating.map((r) => r.id),
    );
    const st: EngineState = {
      seq: 0,
      recent,
      floor: new Map(),
      open: new Map(open.map((a) => [`${a.pointId}:${a.kind}`, a])),
      ambient,
    };
    this.state.set(engineId, st);
    return st;
  }

  /**
   * Evaluates new readings (already stored, in the same transaction) against their points' limits.
   * The caller serialises calls per engine and broadcasts/e-mails the outcome after commit.
   */
  async evaluate(
    engineId: string,
    runId: string,
    readings: NewReading[],
    m: EntityManager,
    history: RecentHistoryLoader,
    /** The run's state, for suppression by state; none = no state suppression. */
    runState?: RunState | null,
  ): Promise<EvaluationOutcome> {
    const { engine, points } = await this.engines.withPoints(engineId);
    const pointById = new Map(points.map((p) => [p.id, p]));
    // Counts this engine's evaluations in the database (the caller holds the engine's lock): if the count moved on
    // since this instance's last one, another instance stored readings meanwhile and the cached recent readings are
    // stale, so they are read again.
    const [{ seq }] = (await m.query(
      `INSERT INTO engine_ingest_marks (engine_id, seq) VALUES ($1, 1)
       ON CONFLICT (engine_id) DO UPDATE SET seq = engine_ingest_marks.seq + 1 RETURNING seq::int AS seq`,
      [engineId],
    )) as { seq: number }[];
    if (this.state.get(engineId)?.seq !== seq - 1) this.state.delete(engineId);
    const st = await this.load(engineId, m, history, readings);
    st.seq = seq;
    // The open alarms are read again, and locked, in this transaction: people acknowledge, shelve and unshelve
    // them meanwhile (change(), expireShelves()), and a cached copy would overwrite their change or miss it
    // (an acknowledged alarm raised a second time, refused by alarms_one_open_per_condition).
    const open = await m.find(Alarm, {
      where: { engineId, state: Not('normal') },
      order: { id: 'ASC' },
      lock: { mode: 'pessimistic_write' },
    });
    st.open = new Map(open.map((a) => [`${a.pointId}:${a.kind}`, a]));
    const changed = new Map<string, Alarm>();
    const toEmail: Alarm[] = [];
    const events: Partial<AlarmEvent>[] = [];
    let raised = 0;
    const raisedReadingIds: string[] = [];
    const sorted = [...readings].sort((a, b) => a.takenAt.getTime() - b.takenAt.getTime());
    // Built once per call rather than once per reading (a logger batch holds thousands of readings).
    const engineLimits = { maximumAllowableWorkingPressurePsig: engine.mawpPsig, overspeedRpm: engine.overspeedRpm };
    const settingsById = new Map<string, EnginePoint & { name: string }>();
    let done = 0;
    for (const r of sorted) {
      if (++done % YIELD_EVERY_ROWS === 0) await yieldToEventLoop();
      const point = pointById.get(r.pointId);
      if (!point) continue;
      let settings = settingsById.get(point.id);
      if (!settings) settingsById.set(point.id, (settings = { ...point, name: point.label }));
      const list = st.recent.get(point.id) ?? [];
      // A reading older than the newest one of its point tells of the past: it may raise, never clear.
      const backDated = list.length > 0 && r.takenAt.getTime() < list[list.length - 1].takenAt.getTime();
      insertByTime(list, { pointId: point.id, value: r.value, takenAt: r.takenAt });
      const cutoff = r.takenAt.getTime() - RATE_WINDOW_MINUTES * 60_000;
      const floor = Math.max(st.floor.get(point.id) ?? -Infinity, cutoff);
      st.floor.set(point.id, floor);
      if (list[0].takenAt.getTime() < floor - RATE_WINDOW_MINUTES * 60_000) {
        let drop = 0;
        while (drop < list.length && list[drop].takenAt.getTime() < floor) drop++;
        list.splice(0, drop);
      }
      st.recent.set(point.id, list);
      if (point.kind === 'ambient_temperature') {
        if (!st.ambient || st.ambient.takenAt <= r.takenAt) st.ambient = { value: r.value, unit: point.unit, takenAt: r.takenAt };
      }
      // An alarm left open by an earlier run is closed out on the record; this run gets its own.
      for (const [key, a] of st.open) {
        if (a.pointId !== point.id || a.runId === runId) continue;
        events.push({
          alarmId: a.id,
          event: 'superseded',
          fromState: a.state,
          toState: 'normal',
          byUser: null,
          at: r.takenAt,
          note: 'Closed out: a later run took over this point.',
        });
        a.state = 'normal';
        a.conditionActive = false;
        await m.save(Alarm, a);
        changed.set(a.id, a);
        st.open.delete(key);
      }
      const activeConditions = [...st.open.values()]
        .filter((a) => a.pointId === point.id && a.conditionActive)
        .map((a) => a.kind)
        .filter(isConditionKind);
      const decisions = evaluateReading({
        point: settings,
        engine: engineLimits,
        reading: { pointId: point.id, value: r.value, takenAt: r.takenAt },
        // The list is kept in time order, so the rate of rise needs only the oldest reading of the window
        // (the one riseRatePerMinute would pick from the whole list): O(log n) instead of O(n) per reading.
        // (A reading older than the floor still sees itself, as when the older ones were dropped one at a time.)
        recentHistory: oldestInWindow(list, r.takenAt, RATE_WINDOW_MINUTES, Math.min(floor, r.takenAt.getTime())),
        ambientTemperature: this.ambientIn(st, point),
        activeConditions,
        rateWindowMinutes: RATE_WINDOW_MINUTES,
      });
      for (const d of decisions) {
        if (!d.evaluated || d.action === 'hold') continue;
        const key = `${point.id}:${d.kind}`;
        const open = st.open.get(key);
        if (d.action === 'raise') {
          const sup = this.suppressionFor(point, d.kind, st, runState);
          if (open) {
            const next = this.apply(open, { type: 'reactivate' }, null, r.takenAt, events);
            next.value = d.value;
            next.limit = d.limit;
            next.message = d.message;
            if (sup && !next.suppression) this.suppress(next, sup, r.takenAt, events);
            changed.set(next.id, next);
          } else {
            const a = m.create(Alarm, {
              engineId,
              runId,
              pointId: point.id,
              kind: d.kind as AlarmKind,
              priority: d.priority,
              state: 'active_unacknowledged',
              conditionActive: true,
              message: d.message,
              value: d.value,
              limit: d.limit,
              unit: d.unit,
              readingId: r.id,
              raisedAt: r.takenAt,
              suppression: null,
              suppressedBy: null,
            });
            const saved = await m.save(Alarm, a);
            events.push({
              alarmId: saved.id,
              event: 'raise',
              fromState: null,
              toState: 'active_unacknowledged',
              byUser: null,
              at: r.takenAt,
              note: d.message,
            });
            st.open.set(key, saved);
            changed.set(saved.id, saved);
            if (sup) {
              // Recorded, not annunciated: neither counted as raised for the crew nor e-mailed.
              this.suppress(saved, sup, r.takenAt, events);
            } else {
              raised++;
              raisedReadingIds.push(r.id);
              if (saved.priority === 'high_high') toEmail.push(saved);
            }
          }
        } else if (d.action === 'clear' && open && (backDated || r.takenAt.getTime() < open.raisedAt.getTime())) {
          // Older than what is known of the point (or than the reading that raised the alarm): it clears nothing.
          continue;
        } else if (d.action === 'clear' && open && open.conditionActive && open.suppression && open.state !== 'shelved') {
          // Never annunciated, so nothing waits for the crew: straight back to normal, on the record.
          events.push({
            alarmId: open.id,
            event: 'return_to_normal',
            fromState: open.state,
            toState: 'normal',
            byUser: null,
            at: r.takenAt,
            note: 'Returned to normal while suppressed.',
          });
          open.state = 'normal';
          open.conditionActive = false;
          open.returnedAt = r.takenAt;
          open.suppression = null;
          open.suppressedBy = null;
          await m.save(Alarm, open);
          changed.set(open.id, open);
          st.open.delete(key);
        } else if (d.action === 'clear' && open && open.conditionActive) {
          const next = this.apply(open, { type: 'return_to_normal' }, null, r.takenAt, events);
          changed.set(next.id, next);
          if (next.state === 'normal') {
            // Written at once: a later reading of this batch may cross again and open a new alarm, and
            // alarms_one_open_per_condition must see this one closed by then (else the batch fails with 409).
            await m.save(Alarm, next);
            st.open.delete(key);
          }
        }
      }
      for (const a of this.releaseSuppressed(point, st, runState, r.takenAt, events)) {
        changed.set(a.id, a);
        if (a.suppression) continue;
        // Released: annunciated from now on, so it counts as raised by this reading.
        raised++;
        raisedReadingIds.push(r.id);
        if (a.priority === 'high_high') toEmail.push(a);
      }
    }
    // The forecast of each point read in this batch, at its latest reading: a pre-alarm is raised, raised again or
    // returned to normal on the record (advisory: neither counted as raised nor e-mailed).
    const lastByPoint = new Map<string, Date>();
    for (const r of sorted) if (settingsById.has(r.pointId)) lastByPoint.set(r.pointId, r.takenAt);
    for (const [pointId, at] of lastByPoint) {
      const point = pointById.get(pointId)!;
      const a = await this.preAlarm(engineId, runId, point, st, runState, at, m, events);
      if (a) changed.set(a.id, a);
    }
    // The e-mail (and its escalation) is queued in this transaction: it exists exactly when the alarm does.
    for (const a of toEmail) {
      if (a.emailedAt) continue;
      a.emailedAt = new Date();
      changed.set(a.id, a);
      await this.queueAlarmMail(a, engine, m);
    }
    await this.writeChanges(m, [...changed.values()], events);
    return { changed: [...changed.values()], raised, raisedReadingIds, toEmail };
  }

  /**
   * The changed alarms and their events in one statement: every changed alarm updated from a JSON list (a column
   * left out of an alarm's entry keeps its value) and the events inserted, in a data-modifying WITH. An alarm not
   * yet stored (none is: raised ones are inserted when raised) is saved on its own first.
   */
  private async writeChanges(m: EntityManager, alarms: Alarm[], events: Partial<AlarmEvent>[]): Promise<void> {
    const unsaved = alarms.filter((a) => !a.id);
    if (unsaved.length) await m.save(Alarm, unsaved);
    const stored = alarms.filter((a) => !unsaved.includes(a));
    if (!stored.length && !events.length) return;
    const meta = m.connection.getMetadata(Alarm);
    const cols = meta.columns.filter((c) => !c.isPrimary && !c.isUpdateDate).map((c) => ({ c, name: c.databaseName }));
    const rows = stored.map((a) => {
      const row: Record<string, unknown> = { id: a.id };
      for (const { c, name } of cols) {
        const v: unknown = c.getEntityValue(a);
        if (v !== undefined) row[name] = v;
      }
      return row;
    });
    const evCols = m.connection
      .getMetadata(AlarmEvent)
      .columns.filter((c) => !c.isPrimary)
      .map((c) => ({ c, name: c.databaseName }));
    const evRows = events.map((e) => Object.fromEntries(evCols.map(({ c, name }) => [name, (c.getEntityValue(e) as unknown) ?? null])));
    const set = cols.map(({ name }) => `"${name}" = CASE WHEN j.o ? '${name}' THEN r."${name}" ELSE a."${name}" END`).join(', ');
    const updated = meta.updateDateColumn!.databaseName;
    const evList = evCols.map(({ name }) => `"${name}"`).join(', ');
    const back: { id: string; updated_at: Date }[] = await m.query(
      `WITH changed AS (
         UPDATE alarms a SET ${set}, "${updated}" = now()
           FROM jsonb_array_elements($1::jsonb) j(o), LATERAL jsonb_populate_record(NULL::alarms, j.o) r
          WHERE a.id = r.id RETURNING a.id, a."${updated}" AS updated_at),
       logged AS (
         INSERT INTO alarm_events (${evList}) SELECT ${evList} FROM jsonb_populate_recordset(NULL::alarm_events, $2::jsonb))
       SELECT id, updated_at FROM changed`,
      [JSON.stringify(rows), JSON.stringify(evRows)],
    );
    const at = new Map(back.map((b) => [b.id, b.updated_at]));
    for (const a of stored) a.updatedAt = at.get(a.id) ?? a.updatedAt;
  }

  /**
   * The point's pre-alarm after its latest reading: the forecast over the readings of the forecast window (the
   * board's), raised when the time to the next limit is under ALARM_FORECAST_MINUTES, returned to normal when not.
   */
  private async preAlarm(
    engineId: string,
    runId: string,
    point: EnginePoint,
    st: EngineState,
    runState: RunState | null | undefined,
    at: Date,
    m: EntityManager,
    events: Partial<AlarmEvent>[],
  ): Promise<Alarm | null> {
    const from = at.getTime() - FORECAST_DEFAULTS.windowMinutes * 60_000;
    const window = (st.recent.get(point.id) ?? []).filter((x) => {
      const t = x.takenAt.getTime();
      return t >= from && t <= at.getTime() && Number.isFinite(x.value);
    });
    const f = suppressedByState(point.suppressedInStates, runState) ? null : this.forecast(point, window, at);
    const key = `${point.id}:pre_alarm`;
    const open = st.open.get(key);
    if (f?.preAlarm) {
      const minutes = Math.max(1, Math.round(f.minutesToLimit));
      const limitWords = `${ALARM_KIND_WORDS[f.limitKind].toLowerCase()} (${f.limit} ${unitLabel(f.unit)})`;
      const message = `${point.label}: ${limitWords} in about ${minutes} min at the present trend`;
      const record = { forecastLimitKind: f.limitKind, forecastMinutes: f.minutesToLimit, forecastRatePerMin: f.ratePerMin };
      if (open) {
        if (open.conditionActive) return null;
        const next = this.apply(open, { type: 'reactivate' }, null, at, events, message);
        Object.assign(next, record, { message, value: window[window.length - 1]?.value ?? null, limit: f.limit });
        return next;
      }
      const saved = await m.save(
        Alarm,
        m.create(Alarm, {
          engineId,
          runId,
          pointId: point.id,
          kind: 'pre_alarm',
          priority: 'advisory',
          state: 'active_unacknowledged',
          conditionActive: true,
          message,
          value: window[window.length - 1]?.value ?? null,
          limit: f.limit,
          unit: point.unit,
          readingId: null,
          raisedAt: at,
          suppression: null,
          suppressedBy: null,
          ...record,
        }),
      );
      events.push({ alarmId: saved.id, event: 'raise', fromState: null, toState: saved.state, byUser: null, at, note: message });
      st.open.set(key, saved);
      return saved;
    }
    if (!open || !open.conditionActive || open.runId !== runId) return null;
    const next = this.apply(
      open,
      { type: 'return_to_normal' },
      null,
      at,
      events,
      f ? 'The limit is no longer near.' : 'No steady trend toward a limit.',
    );
    if (next.state === 'normal') {
      await m.save(Alarm, next);
      st.open.delete(key);
    }
    return next;
  }

  /** Why a new `kind` alarm of the point is suppressed (state first, then design), or null to annunciate it. */
  private suppressionFor(
    point: EnginePoint,
    kind: AlarmConditionKind,
    st: EngineState,
    runState: RunState | null | undefined,
  ): Suppression | null {
    if (suppressedByState(point.suppressedInStates, runState)) return { kind: 'state', by: null, label: `run state ${runState}` };
    const others = [...st.open.values()].flatMap((a) =>
      a.pointId === point.id && a.kind !== kind && isConditionKind(a.kind)
        ? [{ id: a.id, kind: a.kind, conditionActive: a.conditionActive }]
        : [],
    );
    const hit = designSuppressor(kind, others, point.relatedSuppression !== false);
    return hit ? { kind: 'design', by: hit.id, label: ALARM_KIND_WORDS[hit.kind] } : null;
  }

  private suppress(a: Alarm, s: Suppression, at: Date, events: Partial<AlarmEvent>[]) {
    a.suppression = s.kind;
    a.suppressedBy = s.by;
    events.push({
      alarmId: a.id,
      event: 'suppress',
      fromState: a.state,
      toState: a.state,
      byUser: null,
      at,
      note: `Suppressed by ${s.label}.`,
    });
  }

  /**
   * After a reading of the point: suppressed alarms whose reason is gone are re-pointed to the next higher active
   * alarm or released (annunciated from then on). Returns the alarms changed (released ones have no suppression).
   */
  private releaseSuppressed(
    point: EnginePoint,
    st: EngineState,
    runState: RunState | null | undefined,
    at: Date,
    events: Partial<AlarmEvent>[],
  ): Alarm[] {
    const released: Alarm[] = [];
    for (const a of st.open.values()) {
      if (a.pointId !== point.id || !a.suppression || !a.conditionActive || !isConditionKind(a.kind)) continue;
      if (a.suppression === 'state' && suppressedByState(point.suppressedInStates, runState)) continue;
      if (a.suppression === 'design') {
        const by = [...st.open.values()].find((o) => o.id === a.suppressedBy);
        if (by && by.conditionActive) continue;
      }
      const next = this.suppressionFor(point, a.kind, st, runState);
      if (next && next.by !== a.id) {
        if (next.by === a.suppressedBy && next.kind === a.suppression) continue;
        this.suppress(a, next, at, events);
        released.push(a);
        continue;
      }
      const was = a.suppression === 'state' ? 'the run state changed' : 'the alarm that suppressed it cleared';
      events.push({ alarmId: a.id, event: 'release', fromState: a.state, toState: a.state, byUser: null, at, note: `Released: ${was}.` });
      a.suppression = null;
      a.suppressedBy = null;
      released.push(a);
    }
    return released;
  }

  /**
   * A run changed state (RunsService.transition, after commit): alarms of the run that are suppressed by state and
   * mean something in the new state are released at once (annunciated from the change, not from the point's next
   * reading), and active alarms of points the chief engineer marked as meaningless in the new state are suppressed
   * by state. Every release and suppression is on the record; the changes are broadcast and a released high-high
   * is e-mailed. Returns the alarms changed.
   */
  async runStateChanged(engineId: string, runId: string, runState: RunState, at: Date = new Date()): Promise<AlarmDto[]> {
    const { points } = await this.engines.withPoints(engineId);
    const pointById = new Map(points.map((p) => [p.id, p]));
    const changed = await this.db.transaction(async (m) => {
      const open = await m.find(Alarm, {
        where: { engineId, runId, state: Not('normal') },
        order: { id: 'ASC' },
        lock: { mode: 'pessimistic_write' },
      });
      const events: Partial<AlarmEvent>[] = [];
      const out: Alarm[] = [];
      for (const a of open) {
        const point = a.pointId ? pointById.get(a.pointId) : undefined;
        if (!point || !a.conditionActive || !isConditionKind(a.kind)) continue;
        const meaningless = suppressedByState(point.suppressedInStates, runState);
        if (a.suppression === 'state' && !meaningless) {
          events.push({
            alarmId: a.id,
            event: 'release',
            fromState: a.state,
            toState: a.state,
            byUser: null,
            at,
            note: `Released: the run state changed to ${RUN_STATE_LABELS[runState].toLowerCase()}.`,
          });
          a.suppression = null;
          a.suppressedBy = null;
          out.push(a);
        } else if (!a.suppression && meaningless) {
          this.suppress(a, { kind: 'state', by: null, label: `run state ${runState}` }, at, events);
          out.push(a);
        }
      }
      // A released alarm may itself be suppressed by design by a higher alarm of its point that is still active.
      for (const a of out) {
        if (a.suppression) continue;
        const others = open.flatMap((o) =>
          o.pointId === a.pointId && o.id !== a.id && !o.suppression && isConditionKind(o.kind)
            ? [{ id: o.id, kind: o.kind, conditionActive: o.conditionActive }]
            : [],
        );
        const hit = designSuppressor(a.kind as AlarmConditionKind, others, pointById.get(a.pointId!)!.relatedSuppression !== false);
        if (hit) this.suppress(a, { kind: 'design', by: hit.id, label: ALARM_KIND_WORDS[hit.kind] }, at, events);
      }
      if (out.length) await m.save(Alarm, out);
      if (events.length) await m.insert(AlarmEvent, events);
      return out;
    });
    const st = this.state.get(engineId);
    if (st) for (const a of changed) st.open.set(`${a.pointId}:${a.kind}`, a);
    await this.publish({
      changed,
      raised: 0,
      raisedReadingIds: [],
      toEmail: changed.filter((a) => !a.suppression && a.priority === 'high_high'),
    });
    return Promise.all(changed.map((a) => this.toDto(a)));
  }

  private ambientIn(st: EngineState, point: EnginePoint): number | null {
    if (!st.ambient || point.kind !== 'bearing_temperature') return null;
    return temperatureInUnit(st.ambient.value, st.ambient.unit, point.unit);
  }

  /** Applies a lifecycle event to an alarm in memory, recording the event. */
  private apply(a: Alarm, ev: LifecycleEvent, by: string | null, at: Date, events: Partial<AlarmEvent>[], note?: string): Alarm {
    const before: AlarmLifecycle = {
      state: a.state,
      conditionActive: a.conditionActive,
      shelvedUntil: a.shelvedUntil,
      shelveReason: a.shelveReason,
    };
    const next = transition(before, ev, { now: at });
    events.push({ alarmId: a.id, event: ev.type, fromState: a.state, toState: next.state, byUser: by, at, note: note ?? null });
    a.state = next.state;
    a.conditionActive = next.conditionActive;
    a.shelvedUntil = next.shelvedUntil;
    a.shelveReason = next.shelveReason;
    if (ev.type === 'return_to_normal') a.returnedAt = at;
    if (ev.type === 'acknowledge') {
      a.acknowledgedAt = at;
      a.acknowledgedBy = by;
    }
    if (ev.type === 'shelve') a.shelvedBy = by;
    return a;
  }

  /** After commit: tell everyone watching (the e-mails were queued in the transaction). */
  async publish(outcome: EvaluationOutcome) {
    for (const a of outcome.changed) await this.broadcast(a);
  }

  /** The high-high e-mail to the chief engineer and maintenance lead, and its escalation job, in transaction `m`. */
  private async queueAlarmMail(a: Alarm, engine: EngineWithPoints['engine'], m: EntityManager) {
    const to = (await this.users.usersWithRoles(['chief_engineer', 'maintenance_lead'])).map((u) => u.email);
    if (to.length) await this.mail.send(this.alarmMail(a, engine.name, to, false), m);
    const minutes = engine.escalateAfterMinutes ?? DEFAULT_ESCALATE_AFTER_MINUTES;
    const job: EscalationJob = { alarmId: a.id };
    await this.jobs.send(ESCALATION_QUEUE, job, { startAfter: new Date(a.raisedAt.getTime() + minutes * 60_000) }, m);
  }

  private alarmMail(a: Alarm, engineName: string, to: string[], escalated: boolean): OutgoingMail {
    return {
      to,
      subject: `${escalated ? 'Not acknowledged: ' : ''}High-high alarm on ${engineName}: ${a.message}`,
      text: [
        `${ALARM_KIND_WORDS[a.kind]} alarm raised at ${a.raisedAt.toISOString()} on ${engineName}.`,
        ...(escalated ? ['', 'Nobody has acknowledged it yet: you are the next on the engine’s call list.'] : []),
        '',
        a.message,
        '',
        a.runId ? `Open the run: ${this.config.get('PUBLIC_URL')}/runs/${a.runId}` : '',
        '',
        'Follow the engine house’s hot-bearing and over-pressure procedures. Crankjournal aids a qualified crew; ' +
          'it does not replace local codes, the insurer’s inspections or licensed practice.',
      ].join('\n'),
    };
  }

  /**
   * The escalation job of a high-high alarm, when its time is up: if the alarm still waits for acknowledgement, an
   * e-mail to the people on the engine's call list (in its order) who were not on the first e-mail. Once per alarm:
   * the job is the only sender, and the queue hands it to one instance.
   */
  private async escalate({ alarmId }: EscalationJob) {
    const a = await this.alarmRepo.findOne({ where: { id: alarmId } });
    if (!a || a.state !== 'active_unacknowledged' || a.suppression) return;
    const { engine } = await this.engines.withPoints(a.engineId);
    const first = new Set((await this.users.usersWithRoles(['chief_engineer', 'maintenance_lead'])).map((u) => u.id));
    const next = (engine.callList ?? []).filter((id) => !first.has(id));
    const people = await this.users.activeEmails(next);
    if (!people.length) {
      this.logger.warn(`high-high alarm ${a.id} not acknowledged, and nobody further on the call list of ${engine.name}`);
      return;
    }
    await this.db.transaction(async (m) => {
      await this.mail.send(this.alarmMail(a, engine.name, people, true), m);
      await m.insert(AlarmEvent, {
        alarmId: a.id,
        event: 'escalate',
        fromState: a.state,
        toState: a.state,
        byUser: null,
        at: new Date(),
        note: `Not acknowledged in time: e-mailed ${people.join(', ')}.`,
      });
    });
  }

  private async broadcast(a: Alarm) {
    const dto = await this.toDto(a);
    if (a.runId) this.live.emitToRoom(`run:${a.runId}`, 'alarm:changed', dto);
    this.live.emitToRoom(`engine:${a.engineId}`, 'alarm:changed', dto);
  }

  private async nameOf(id: string | null): Promise<string | null> {
    if (!id) return null;
    const hit = this.names.get(id);
    if (hit) return hit;
    const u = await this.users.get(id).catch(() => null);
    const n = u?.displayName ?? 'unknown';
    this.names.set(id, n);
    return n;
  }

  private async suppressorLabel(a: Alarm): Promise<string | null> {
    if (a.suppression === 'state') return 'the run state';
    if (a.suppression !== 'design' || !a.suppressedBy) return null;
    const by = await this.alarmRepo.findOne({ where: { id: a.suppressedBy }, select: { id: true, kind: true } });
    return by ? ALARM_KIND_WORDS[by.kind] : 'a higher alarm';
  }

  async toDto(a: Alarm): Promise<AlarmDto> {
    const { points } = await this.engines.withPoints(a.engineId);
    const p = points.find((x) => x.id === a.pointId);
    return {
      id: a.id,
      engineId: a.engineId,
      runId: a.runId,
      pointId: a.pointId,
      pointLabel: p ? p.label : 'engine',
      kind: a.kind,
      priority: a.priority,
      state: a.state,
      conditionActive: a.conditionActive,
      message: a.message,
      value: a.value,
      limit: a.limit,
      unit: a.unit,
      raisedAt: a.raisedAt.toISOString(),
      acknowledgedAt: a.acknowledgedAt?.toISOString() ?? null,
      acknowledgedByName: await this.nameOf(a.acknowledgedBy),
      returnedAt: a.returnedAt?.toISOString() ?? null,
      shelvedUntil: a.shelvedUntil?.toISOString() ?? null,
      shelveReason: a.shelveReason,
      shelvedByName: await this.nameOf(a.shelvedBy),
      suppression: a.suppression ?? null,
      suppressedById: a.suppressedBy ?? null,
      suppressedByLabel: await this.suppressorLabel(a),
      forecast:
        a.kind === 'pre_alarm' && a.forecastLimitKind && a.forecastMinutes !== null && a.forecastRatePerMin !== null
          ? { limitKind: a.forecastLimitKind, minutesToLimit: a.forecastMinutes, ratePerMin: a.forecastRatePerMin }
          : null,
      updatedAt: (a.updatedAt ?? new Date()).toISOString(),
    };
  }

  /**
   * Why a value cannot be a real reading of the point (a mistyped figure or a failed sensor), else null. The
   * reading paths refuse such a value before it is stored; the rule lives with the alarm rules.
   */
  implausibleReading(point: MeasurementPointSettings, value: number): string | null {
    return validateReadingValue(point, value);
  }

  async list(filter: { engineId?: string; runId?: string; open?: boolean }): Promise<AlarmDto[]> {
    await this.expireShelves();
    const where: Record<string, unknown> = {};
    if (filter.engineId) where.engineId = filter.engineId;
    if (filter.runId) where.runId = filter.runId;
    if (filter.open) where.state = Not('normal');
    const rows = await this.alarmRepo.find({ where, order: { raisedAt: 'DESC' }, take: 500 });
    return Promise.all(rows.map((a) => this.toDto(a)));
  }

  /** Every alarm raised on some points (e.g. one bearing's temperature points), oldest first. */
  async listByPoints(pointIds: string[], limit = 2000): Promise<AlarmDto[]> {
    if (!pointIds.length) return [];
    const rows = await this.alarmRepo.find({ where: { pointId: In(pointIds) }, order: { raisedAt: 'ASC' }, take: limit });
    return Promise.all(rows.map((a) => this.toDto(a)));
  }

  async openCountByRun(runIds: string[]): Promise<Map<string, number>> {
    if (!runIds.length) return new Map();
    const rows: { run_id: string; n: number }[] = await this.db.query(
      `SELECT run_id, count(*)::int AS n FROM alarms WHERE run_id = ANY($1) AND state <> 'normal' AND suppression IS NULL GROUP BY run_id`,
      [runIds],
    );
    return new Map(rows.map((o) => [o.run_id, o.n]));
  }

  /** True when a high-high priority alarm is active (condition present) on the engine. */
  /**
   * High-high alarms of the engine that still hold the start gate: every one not back to normal, i.e. its
   * condition present, or gone but not yet acknowledged by a person (returned unacknowledged, or shelved).
   */
  async unresolvedHighHigh(engineId: string): Promise<Alarm[]> {
    return this.alarmRepo.find({ where: { engineId, priority: 'high_high', state: Not('normal') } });
  }

  private async change(alarmId: string, user: AuthUser, build: (a: Alarm) => LifecycleEvent, note?: string): Promise<AlarmDto> {
    const a0 = await this.alarmRepo.findOne({ where: { id: alarmId } });
    if (!a0) throw new NotFoundException('No such alarm.');
    if (this.ackPolicy) await this.ackPolicy.assertMayAcknowledge(user, a0);
    const engineId = a0.engineId;
    const a = await this.db.transaction(async (m) => {
      const cur = await m.findOne(Alarm, { where: { id: alarmId }, lock: { mode: 'pessimistic_write' } });
      if (!cur) throw new NotFoundException('No such alarm.');
      const events: Partial<AlarmEvent>[] = [];
      try {
        this.apply(cur, build(cur), user.id, new Date(), events, note);
      } catch (e) {
        if (e instanceof AlarmTransitionError) throw new BadRequestException(e.message);
        throw e;
      }
      await m.save(Alarm, cur);
      await m.insert(AlarmEvent, events);
      return cur;
    });
    // Keep the cached open set in step.
    const st = this.state.get(engineId);
    if (st) {
      const key = `${a.pointId}:${a.kind}`;
      if (a.state === 'normal') st.open.delete(key);
      else st.open.set(key, a);
    }
    await this.broadcast(a);
    return this.toDto(a);
  }

  acknowledge(alarmId: string, user: AuthUser) {
    return this.change(alarmId, user, () => ({ type: 'acknowledge' }));
  }
  shelve(alarmId: string, user: AuthUser, reason: string, minutes: number) {
    return this.change(alarmId, user, () => ({ type: 'shelve', reason, until: new Date(Date.now() + minutes * 60_000) }), reason);
  }
  unshelve(alarmId: string, user: AuthUser) {
    return this.change(alarmId, user, () => ({ type: 'unshelve' }));
  }

  /** Shelved alarms whose time is up go back to their real state. */
  async expireShelves() {
    const due = await this.alarmRepo.createQueryBuilder('a').where(`a.state = 'shelved' AND a.shelved_until <= now()`).getMany();
    for (const a0 of due) {
      // Decided on the row as it is now (locked): the readings may have changed its condition since.
      const a = await this.db.transaction(async (m) => {
        const cur = await m.findOne(Alarm, { where: { id: a0.id }, lock: { mode: 'pessimistic_write' } });
        if (!cur || cur.state !== 'shelved') return null;
        const next = applyShelveExpiry(
          { state: cur.state, conditionActive: cur.conditionActive, shelvedUntil: cur.shelvedUntil, shelveReason: cur.shelveReason },
          new Date(),
        );
        if (next.state === cur.state) return null;
        await m.update(Alarm, { id: cur.id }, { state: next.state, shelvedUntil: null, shelveReason: null });
        await m.insert(AlarmEvent, {
          alarmId: cur.id,
          event: 'shelve_expired',
          fromState: 'shelved',
          toState: next.state,
          byUser: null,
          at: new Date(),
          note: null,
        });
        cur.state = next.state;
        cur.shelvedUntil = null;
        cur.shelveReason = null;
        return cur;
      });
      if (!a) continue;
      const st = this.state.get(a.engineId);
      if (st) {
        if (a.state === 'normal') st.open.delete(`${a.pointId}:${a.kind}`);
        else st.open.set(`${a.pointId}:${a.kind}`, a);
      }
      await this.broadcast(a);
    }
  }

  /**
   * The alarm system's figures over some runs (one run, or a season's): each run counted from its opening to its
   * close (or now). Annunciated alarms only: a raise suppressed at once is not counted, a release is.
   */
  async figures(
    runs: { id: string; from: Date; to: Date; startedAt: Date | null }[],
    readingValuesAt: ReadingValuesAt,
  ): Promise<AlarmFiguresDto> {
    const ids = runs.map((r) => r.id);
    // Pre-alarms are advisory forecasts, not alarms of the rules: the figures count the alarms of the rules only.
    const alarms = ids.length ? await this.alarmRepo.find({ where: { runId: In(ids), kind: Not('pre_alarm') } }) : [];
    const events = alarms.length
      ? await this.db.getRepository(AlarmEvent).find({ where: { alarmId: In(alarms.map((a) => a.id)) }, order: { at: 'ASC' } })
      : [];
    const points = new Map<string, EnginePoint>();
    for (const engineId of new Set(alarms.map((a) => a.engineId)))
      for (const p of (await this.engines.withPoints(engineId)).points) points.set(p.id, p);
    const keyOf = (a: Alarm) => `${(a.pointId && points.get(a.pointId)?.label) || 'engine'} · ${ALARM_KIND_WORDS[a.kind]}`;
    const byAlarm = new Map<string, AlarmEvent[]>();
    for (const e of events) byAlarm.set(e.alarmId, [...(byAlarm.get(e.alarmId) ?? []), e]);
    const annunciations: Annunciation[] = [];
    const spans: AlarmSpan[] = [];
    const chatter: AlarmFiguresDto['chattering'] = [];
    const activations = new Map<string, { alarm: Alarm; at: Date[] }>();
    for (const a of alarms) {
      const evs = byAlarm.get(a.id) ?? [];
      let suppressed = false;
      let annunciated = false;
      for (const e of evs) {
        const suppressedNow = evs.some((x) => x.event === 'suppress' && x.at.getTime() === e.at.getTime());
        if (e.event === 'raise' || e.event === 'reactivate') {
          if (!suppressed && !suppressedNow) annunciations.push({ at: e.at, key: keyOf(a) });
          const k = `${a.pointId}:${a.kind}`;
          const act = activations.get(k) ?? { alarm: a, at: [] };
          act.at.push(e.at);
          activations.set(k, act);
          annunciated ||= !suppressed && !suppressedNow;
        }
        if (e.event === 'suppress') suppressed = true;
        if (e.event === 'release') {
          suppressed = false;
          annunciated = true;
          annunciations.push({ at: e.at, key: keyOf(a) });
        }
        if (e.event === 'return_to_normal') suppressed = false;
      }
      if (annunciated) spans.push({ key: keyOf(a), raisedAt: a.raisedAt, endedAt: a.returnedAt });
    }
    const opts = { maxActivations: this.config.get('ALARM_CHATTER_COUNT'), windowMinutes: this.config.get('ALARM_CHATTER_MINUTES') };
    for (const { alarm, at } of activations.values()) {
      const c = detectChattering(at, opts);
      if (!c.chattering) continue;
      const p = alarm.pointId ? points.get(alarm.pointId) : undefined;
      let suggested: number | null = null;
      if (p && alarm.limit !== null && alarm.kind !== 'rate_of_rise') {
        // The readings that cleared it: those of the point when its alarm of this kind returned to normal.
        const clears = alarms
          .filter((x) => x.pointId === alarm.pointId && x.kind === alarm.kind && x.returnedAt)
          .map((x) => x.returnedAt as Date);
        const values = clears.length ? await readingValuesAt(p.id, clears) : [];
        suggested = suggestDeadband(values, alarm.limit, alarm.kind === 'low' ? 'low' : 'high');
      }
      chatter.push({ key: keyOf(alarm), count: c.worst, suggestedDeadband: suggested, unit: alarm.unit });
    }
    const standing = runs.reduce((n, r) => {
      if (!r.startedAt) return n;
      const t = r.startedAt.getTime();
      return n + spans.filter((s) => s.raisedAt.getTime() < t && (!s.endedAt || s.endedAt.getTime() > t)).length;
    }, 0);
    // Readings may be entered with an earlier time than the run's opening (a round written up late): the span
    // starts at the earliest alarm when that is earlier.
    const firstOf = (runId: string) => Math.min(...alarms.filter((a) => a.runId === runId).map((a) => a.raisedAt.getTime()));
    const f = alarmFigures(
      // No runs (a season not yet begun): one empty span, so every figure is zero.
      runs.length
        ? runs.map((r) => ({ from: new Date(Math.min(r.from.getTime(), firstOf(r.id))), to: r.to }))
        : [{ from: new Date(), to: new Date() }],
      annunciations,
      spans,
      chatter,
      standing,
      { staleMinutes: this.config.get('ALARM_STALE_MINUTES') },
    );
    return { ...f, runs: runs.length, chattering: chatter, rows: alarmFigureRows(f), basis: ALARM_FIGURE_BASIS };
  }

  /**
   * Time to the point's next limit at the present trend (readings of the last minutes, oldest first), with the
   * advisory pre-alarm under ALARM_FORECAST_MINUTES; null when the trend is not steady enough to say.
   */
  forecast(point: EnginePoint, readings: readonly { value: number; takenAt: Date }[], now: Date): LimitForecastDto | null {
    return forecastForPoint(point, readings, now, this.config.get('ALARM_FORECAST_MINUTES'));
  }

  /** The log sheet's alarm-figures section as plain rows (any PDF layout can place them). */
  logSheetAlarmRows(f: AlarmFiguresDto): { label: string; value: string; target: string }[] {
    return f.rows.map((r) => ({ label: r.label, value: r.value, target: `${r.target}${r.met ? '' : ' (not met)'}` }));
  }

  async get(id: string): Promise<Alarm> {
    const a = await this.alarmRepo.findOne({ where: { id } });
    if (!a) throw new NotFoundException('No such alarm.');
    return a;
  }
}
