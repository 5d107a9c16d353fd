import {
  BadRequestException,
  ConflictException,
  ForbiddenException,
  HttpException,
  Injectable,
  Logger,
  NotFoundException,
} from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, In, Not, Repository } from 'typeorm';
import {
  RUN_STATE_LABELS,
  RUN_STATES_TAKING_READINGS,
  RUN_TRANSITIONS,
  type Role,
  type RunDetail,
  type RunDetailWithEngine,
  type StartGateVerdict,
  type RunState,
  type RunSummary,
} from '@crankjournal/shared-types';
import { EnginesService } from '../engines/engines.service.js';
import { LiveService } from '../live/live.service.js';
import { AuthService } from '../auth/auth.service.js';
import { UsersService } from '../users/users.service.js';
import { AlarmsService } from '../alarms/alarms.service.js';
import { ClusterService } from '../cluster/cluster.service.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { revolutionsFromSpeedRecord, runningSeconds } from '../../calculations/run-derived.js';
import { KeyedMutex } from '../../common/util/keyed-mutex.js';
import type { CreateRunDto, RunTransitionDto, UpdateRunDto } from './dto/run.dto.js';
import { StartGateService } from './start-gate.service.js';
import { RunStateChange } from './run-state-change.entity.js';
import { Run } from './run.entity.js';

/** Who may move a run into each state. */
const TRANSITION_ROLES: Record<Exclude<RunState, 'planned'>, Role[]> = {
  preparing: ['operator', 'chief_engineer'],
  cleared: ['chief_engineer'],
  running: ['operator', 'chief_engineer'],
  stopped: ['operator', 'chief_engineer'],
  closed: ['chief_engineer'],
  abandoned: ['operator', 'chief_engineer'],
};

/** A started run as the maintenance histories need it. */
export type RunOutline = Pick<RunSummary, 'id' | 'title' | 'state' | 'runningSeconds'> & { startedAt: string };

/** What other modules read of a run (a stored run satisfies it); they never import the entity. */
export interface RunRecord {
  id: string;
  engineId: string;
  title: string;
  state: RunState;
  createdAt: Date;
  startedAt: Date | null;
  stoppedAt: Date | null;
}

@Injectable()
export class RunsService {
  /** Per engine: one change of its runs' state at a time in this process (the database locks hold across processes). */
  private readonly mutex = new KeyedMutex();
  private readonly logger = new Logger('Runs');
  /** Runs that take readings, as forReadings last read them; dropped on every instance when a run changes. */
  private readonly takingReadings = new Map<string, Run>();

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(Run) private readonly runRepo: Repository<Run>,
    @InjectRepository(RunStateChange) private readonly runStateChangeRepo: Repository<RunStateChange>,
    private readonly engines: EnginesService,
    private readonly gate: StartGateService,
    private readonly live: LiveService,
    private readonly auth: AuthService,
    private readonly alarms: AlarmsService,
    private readonly users: UsersService,
    private readonly cluster: ClusterService,
  ) {
    cluster.on('run', (id) => (id ? this.takingReadings.delete(id) : this.takingReadings.clear()));
  }

  /**
   * The run a live reading is for, kept in memory while it takes readings: every change of a run is announced to
   * every instance (ClusterService, at commit), which drops it. The storing transaction still reads the run's state
   * again under its lock, and that is the state used.
   */
  async forReadings(id: string): Promise<Run> {
    const hit = this.takingReadings.get(id);
    if (hit) return hit;
    const r = await this.get(id);
    if (RUN_STATES_TAKING_READINGS.includes(r.state)) this.takingReadings.set(id, r);
    return r;
  }

  async get(id: string): Promise<Run> {
    const r = await this.runRepo.findOne({ where: { id } });
    if (!r) throw new NotFoundException('No such run.');
    return r;
  }

  /** The runs of an engine opened in a calendar year (UTC), abandoned ones left out: a season. */
  async season(engineId: string, year: number): Promise<Run[]> {
    return this.runRepo
      .createQueryBuilder('r')
      .where('r.engine_id = :engineId AND r.state <> :ab', { engineId, ab: 'abandoned' })
      .andWhere('r.created_at >= :from AND r.created_at < :to', {
        from: new Date(Date.UTC(year, 0, 1)),
        to: new Date(Date.UTC(year + 1, 0, 1)),
      })
      .orderBy('r.created_at', 'ASC')
      .getMany();
  }

  /** Refuses changes to a closed or abandoned run: it is part of the record. */
  assertOpen(run: Run) {
    if (run.state === 'closed' || run.state === 'abandoned')
      throw new ConflictException(`This run is ${RUN_STATE_LABELS[run.state].toLowerCase()} and can no longer be changed.`);
  }

  assertTakingReadings(run: Run) {
    if (!RUN_STATES_TAKING_READINGS.includes(run.state))
      throw new ConflictException(
        `This run is ${RUN_STATE_LABELS[run.state].toLowerCase()}: readings are taken from preparation until the run is closed.`,
      );
  }

  async list(filter: { engineId?: string; state?: RunState }): Promise<RunSummary[]> {
    const where: Record<string, unknown> = {};
    if (filter.engineId) where.engineId = filter.engineId;
    if (filter.state) where.state = filter.state;
    const runs = await this.runRepo.find({ where, order: { createdAt: 'DESC' }, take: 300 });
    return this.summaries(runs);
  }

  /**
   * An engine's runs that have started (not abandoned), oldest first, with only their own columns: no open
   * alarm counts and no revolutions summed from the readings (which a running run would read in full).
   */
  async startedOutlines(engineId: string): Promise<RunOutline[]> {
    const runs = await this.runRepo.find({ where: { engineId }, order: { createdAt: 'DESC' }, take: 300 });
    return runs
      .filter((r) => r.startedAt !== null && r.state !== 'abandoned')
      .map((r) => ({
        id: r.id,
        title: r.title,
        state: r.state,
        startedAt: r.startedAt!.toISOString(),
        runningSeconds: runningSeconds(r.startedAt, r.stoppedAt),
      }))
      .sort((a, b) => a.startedAt.localeCompare(b.startedAt));
  }

  private async summaries(runs: Run[]): Promise<RunSummary[]> {
    if (!runs.length) return [];
    const engineNames = new Map((await this.engines.list()).map((e) => [e.id, e.name]));
    const openBy = await this.alarms.openCountByRun(runs.map((r) => r.id));
    const live = await Promise.all(
      runs.map((r) => (r.state === 'running' && r.revolutions === null ? this.liveRevolutions(r) : Promise.resolve(r.revolutions ?? 0))),
    );
    return runs.map((r, i) => ({
      id: r.id,
      engineId: r.engineId,
      engineName: engineNames.get(r.engineId) ?? '',
      purpose: r.purpose,
      state: r.state,
      title: r.title,
      plannedFor: r.plannedFor,
      startedAt: r.startedAt?.toISOString() ?? null,
      stoppedAt: r.stoppedAt?.toISOString() ?? null,
      closedAt: r.closedAt?.toISOString() ?? null,
      runningSeconds: runningSeconds(r.startedAt, r.stoppedAt),
      revolutions: live[i],
      openAlarms: openBy.get(r.id) ?? 0,
    }));
  }

  /** Revolutions so far, from the speed readings. */
  private async liveRevolutions(r: Run, until?: Date): Promise<number> {
    if (!r.startedAt) return 0;
    const { points } = await this.engines.withPoints(r.engineId);
    const speed = points.filter((p) => p.kind === 'speed' && p.unit === 'rpm').map((p) => p.id);
    if (!speed.length) return 0;
    const rows: { t: Date; v: number }[] = await this.db.query(
      `SELECT taken_at AS t, COALESCE(amended_value, value) AS v FROM readings WHERE run_id = $1 AND point_id = ANY($2) ORDER BY taken_at`,
      [r.id, speed],
    );
    const end = (until ?? r.stoppedAt ?? new Date()).getTime();
    return revolutionsFromSpeedRecord(
      rows.map((x) => ({ takenAtMs: new Date(x.t).getTime(), speedRpm: Number(x.v) })),
      r.startedAt.getTime(),
      end,
    );
  }

  async detail(id: string): Promise<RunDetail> {
    return this.detailOf(await this.get(id));
  }

  /** The run's detail and its engine's (as GET /engines/:id gives it), read side by side. */
  async detailWithEngine(id: string): Promise<RunDetailWithEngine> {
    const r = await this.get(id);
    const [run, engine] = await Promise.all([this.detailOf(r), this.engines.detail(r.engineId)]);
    return { ...run, engine };
  }

  private async detailOf(r: Run): Promise<RunDetail> {
    const id = r.id;
    const [summary] = await this.summaries([r]);
    const history = await this.runStateChangeRepo.find({ where: { runId: id }, order: { at: 'ASC' } });
    const userIds = [...new Set([...r.crewIds, ...history.map((h) => h.byUser), ...(r.countersignedBy ? [r.countersignedBy] : [])])];
    const name = await this.users.displayNames(userIds);
    const peaks: { point_id: string; max: number; min: number; unit: string }[] = await this.db.query(
      `SELECT point_id, max(COALESCE(amended_value, value)) AS max, min(COALESCE(amended_value, value)) AS min, max(unit) AS unit
       FROM readings WHERE run_id = $1 GROUP BY point_id`,
      [id],
    );
    return {
      ...summary,
      notes: r.notes,
      crew: r.crewIds.map((cid) => ({ id: cid, displayName: name.get(cid) ?? 'unknown' })),
      countersignedBy: r.countersignedBy,
      countersignedByName: r.countersignedBy ? (r.countersignedByName ?? name.get(r.countersignedBy) ?? null) : null,
      countersignedAt: r.closedAt?.toISOString() ?? null,
      abandonedReason: r.abandonedReason,
      history: history.map((h) => ({
        from: h.fromState,
        to: h.toState,
        by: h.byUser,
        byName: name.get(h.byUser) ?? 'unknown',
        at: h.at.toISOString(),
        note: h.note,
      })),
      peaks: peaks.map((p) => ({ pointId: p.point_id, max: Number(p.max), min: Number(p.min), unit: p.unit })),
      createdAt: r.createdAt.toISOString(),
    };
  }

  private async assertCrew(ids: string[] | undefined) {
    if (!ids?.length) return;
    const found = await this.users.displayNames(ids);
    if (found.size !== new Set(ids).size) throw new BadRequestException('crewIds holds someone who has no account.');
  }

  async create(dto: CreateRunDto, user: AuthUser): Promise<RunDetail> {
    await this.engines.get(dto.engineId);
    await this.assertCrew(dto.crewIds);
    const run = await this.db.transaction(async (m) => {
      const r = await m.save(
        Run,
        m.create(Run, {
          engineId: dto.engineId,
          purpose: dto.purpose,
          title: dto.title.trim(),
          plannedFor: dto.plannedFor ?? null,
          crewIds: [...new Set(dto.crewIds ?? [])],
          notes: dto.notes ?? '',
          state: 'planned',
          createdBy: user.id,
        }),
      );
      await m.insert(RunStateChange, { runId: r.id, fromState: null, toState: 'planned', byUser: user.id, at: new Date(), note: null });
      return r;
    });
    return this.detail(run.id);
  }

  async update(id: string, dto: UpdateRunDto, user: AuthUser): Promise<RunDetail> {
    const r = await this.get(id);
    this.assertOpen(r);
    if (dto.engineId && dto.engineId !== r.engineId) throw new BadRequestException('A run cannot move to another engine; plan a new run.');
    await this.assertCrew(dto.crewIds);
    const patch: Partial<Run> = {};
    if (dto.title !== undefined) patch.title = dto.title.trim();
    if (dto.purpose !== undefined) patch.purpose = dto.purpose;
    if (dto.plannedFor !== undefined) patch.plannedFor = dto.plannedFor;
    if (dto.crewIds !== undefined) patch.crewIds = [...new Set(dto.crewIds)];
    if (dto.notes !== undefined) patch.notes = dto.notes;
    await this.runRepo.update({ id }, patch);
    await this.cluster.announce('run', id);
    void user;
    return this.broadcast(id);
  }

  async startGate(id: string, user: AuthUser) {
    return this.gate.checkStart(await this.get(id), user);
  }

  /** Every change of state goes through here; the start gate and the close gate are asked here and nowhere else. */
  async transition(id: string, dto: RunTransitionDto, user: AuthUser): Promise<RunDetail> {
    const run0 = await this.get(id);
    const to = dto.to;
    const allowedRoles = TRANSITION_ROLES[to];
    if (!allowedRoles.includes(user.role)) throw new ForbiddenException(`Your role may not move a run to "${RUN_STATE_LABELS[to]}".`);
    return this.move(run0, dto, user);
  }

  /**
   * Preparing → cleared, asked by the checklists module once every checklist required before a start is
   * signed for this run: the signatures (each by a person qualified for its duty, re-authenticated) are the
   * clearance, so no role check here. Recorded under the signer's name with the note. Returns null when the
   * run is no longer preparing. Starting still goes through the start gate.
   */
  async clearAfterChecklists(id: string, user: AuthUser, note: string): Promise<RunDetail | null> {
    const run0 = await this.get(id);
    if (run0.state !== 'preparing') return null;
    return this.move(run0, { to: 'cleared', note }, user);
  }

  /**
   * One transaction for the gate and the change: the run's row and its engine's are locked before the start
   * or close gate is asked and until the new state is committed: a reading that would raise a high-high alarm waits
   * on the run's row (ingest reads it FOR SHARE), and any other change of state of this run or of another run of the
   * engine waits on the rows. Changes of one engine's runs also queue here, so a burst of requests holds one
   * database connection at a time while the gate's rules read on others.
   */
  private move(run0: Run, dto: RunTransitionDto, user: AuthUser): Promise<RunDetail> {
    return this.mutex.run(run0.engineId, () => this.moveLocked(run0, dto, user));
  }

  private async moveLocked(run0: Run, dto: RunTransitionDto, user: AuthUser): Promise<RunDetail> {
    const id = run0.id;
    const to = dto.to;
    if (!RUN_TRANSITIONS[run0.state].includes(to))
      throw new ConflictException(`A run that is ${RUN_STATE_LABELS[run0.state].toLowerCase()} cannot go to "${RUN_STATE_LABELS[to]}".`);
    if (to === 'abandoned' && !dto.note?.trim()) throw new BadRequestException('note must say why the run is abandoned');
    if (to === 'closed' && (!dto.signature || !(await this.auth.verifySigner(user.id, dto.signature))))
      throw new BadRequestException('To countersign, type your password or signing PIN; the one given is not right.');
    const refuse = (verdict: StartGateVerdict) => {
      if (!verdict.allowed)
        throw new HttpException(
          { statusCode: 409, error: 'Conflict', message: verdict.reasons.map((r) => r.message), details: verdict },
          409,
        );
    };
    let now = new Date();
    await this.db.transaction(async (m) => {
      const cur = await m.findOne(Run, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!cur || cur.state !== run0.state)
        throw new ConflictException('Someone else changed this run a moment ago. Look again and retry.');
      await this.engines.lockForRunChange(cur.engineId, m);
      if (to === 'preparing' && run0.state === 'planned') {
        const other = await m.findOne(Run, {
          where: { engineId: cur.engineId, state: In(RUN_STATES_TAKING_READINGS as RunState[]), id: Not(id) },
        });
        if (other)
          throw new ConflictException(
            `Another run of this engine ("${other.title}") is ${RUN_STATE_LABELS[other.state].toLowerCase()}. Close or abandon it first.`,
          );
      }
      if (to === 'running') refuse(await this.gate.checkStart(cur, user));
      if (to === 'closed') refuse(await this.gate.checkClose(cur, user));
      now = new Date();
      let addTotals: { hours: number; revs: number } | null = null;
      if (to === 'stopped') {
        const revs = await this.liveRevolutions(cur, now);
        addTotals = { hours: runningSeconds(cur.startedAt, now) / 3600, revs };
      }
      cur.state = to;
      if (to === 'running') cur.startedAt = now;
      if (to === 'stopped') {
        cur.stoppedAt = now;
        cur.revolutions = addTotals!.revs;
      }
      if (to === 'closed') {
        cur.closedAt = now;
        cur.countersignedBy = user.id;
        cur.countersignedByName = (await this.users.displayNames([user.id])).get(user.id) ?? null;
      }
      if (to === 'abandoned') cur.abandonedReason = dto.note!.trim();
      await m.save(Run, cur);
      await this.cluster.announce('run', id, m);
      await m.insert(RunStateChange, {
        runId: id,
        fromState: run0.state,
        toState: to,
        byUser: user.id,
        at: now,
        note: dto.note?.trim() || null,
      });
      if (RUN_STATES_TAKING_READINGS.includes(to)) await this.engines.setActiveRun(cur.engineId, id, m);
      if (to === 'closed' || to === 'abandoned') await this.engines.setActiveRun(cur.engineId, null, m);
      if (addTotals) await this.engines.addRunTotals(cur.engineId, addTotals.hours, addTotals.revs, m);
    });
    // Alarms suppressed by state are released (or suppressed) by the change itself, not by the next reading.
    if (RUN_STATES_TAKING_READINGS.includes(to))
      await this.alarms
        .runStateChanged(run0.engineId, id, to, now)
        .catch((e: Error) => this.logger.warn(`alarm state suppression: ${e.message}`));
    return this.broadcast(id);
  }

  private async broadcast(id: string): Promise<RunDetail> {
    const d = await this.detail(id);
    this.live.emitToRoom(`run:${id}`, 'run:changed', d);
    this.live.emitToRoom(`engine:${d.engineId}`, 'run:changed', d);
    return d;
  }

  /** The run an engine is preparing or running now (for loggers that do not name a run). */
  async activeRunOf(engineId: string): Promise<Run | null> {
    return this.runRepo.findOne({ where: { engineId, state: In(RUN_STATES_TAKING_READINGS as RunState[]) }, order: { createdAt: 'DESC' } });
  }
}
