import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, In, Repository } from 'typeorm';
import {
  RUN_STATE_LABELS,
  RUN_STATES_LOGGING_PASSES,
  RUN_STATES_TAKING_READINGS,
  type BarDto,
  type CreateBarRequest,
  type LoggedPassDto,
  type LogPassRequest,
  type MillRunLog,
  type MillRunSummary,
  type MillTimelineItem,
  type RunState,
  type SectionDto,
  type TimelineReading,
  type UpdateBarRequest,
} from '@crankjournal/shared-types';
import { RunsService, type RunRecord } from '../runs/runs.service.js';
import { ReadingsService } from '../runs/readings.service.js';
import { AlarmsService } from '../alarms/alarms.service.js';
import { EnginesService } from '../engines/engines.service.js';
import { LiveService } from '../live/live.service.js';
import { UsersService } from '../users/users.service.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { barLengthM, sectionAreaMm2 } from '../../calculations/rolling.js';
import { MillBar } from './mill-bar.entity.js';
import { MillPass } from './mill-pass.entity.js';
import { PassSchedule } from './pass-schedule.entity.js';
import { SchedulePass } from './schedule-pass.entity.js';
import { CustomerLot } from './customer-lot.entity.js';
import { LotRun } from './lot-run.entity.js';
import type { Mill } from './mill.entity.js';
import { MillService } from './mill.service.js';
import { MillIndicatedPowerSource } from './mill-indicated-power.source.js';
import { calculatePass } from './pass-calculation.js';

/** A speed reading older than this before a pass is not taken as the speed at the pass. */
const SPEED_READING_MAX_AGE_MS = 30 * 60_000;
/** Clocks on tablets drift: a pass may be logged this far ahead of the server's time. */
const CLOCK_SLACK_MS = 5 * 60_000;

function fmtClock(d: Date): string {
  return d.toISOString().slice(11, 16) + ' UTC';
}

@Injectable()
export class RollingLogService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(CustomerLot) private readonly customerLotRepo: Repository<CustomerLot>,
    @InjectRepository(LotRun) private readonly lotRunRepo: Repository<LotRun>,
    @InjectRepository(MillBar) private readonly millBarRepo: Repository<MillBar>,
    @InjectRepository(MillPass) private readonly millPassRepo: Repository<MillPass>,
    @InjectRepository(PassSchedule) private readonly passScheduleRepo: Repository<PassSchedule>,
    @InjectRepository(SchedulePass) private readonly schedulePassRepo: Repository<SchedulePass>,
    private readonly mills: MillService,
    private readonly runs: RunsService,
    private readonly readings: ReadingsService,
    private readonly alarms: AlarmsService,
    private readonly engines: EnginesService,
    private readonly live: LiveService,
    private readonly power: MillIndicatedPowerSource,
    private readonly users: UsersService,
  ) {}

  /** Passes are logged while the run is running, or stopped and not yet closed. */
  loggingRefusal(run: RunRecord): string | null {
    if (RUN_STATES_LOGGING_PASSES.includes(run.state)) return null;
    return (
      `This run is ${RUN_STATE_LABELS[run.state].toLowerCase()}: ` +
      'passes are logged while the run is running, or stopped and not yet closed.'
    );
  }
  private assertLogging(run: RunRecord) {
    const why = this.loggingRefusal(run);
    if (why) throw new ConflictException(why);
  }

  private async millOfRun(run: RunRecord): Promise<Mill> {
    const mill = await this.mills.forEngine(run.engineId);
    if (!mill) {
      const e = await this.engines.get(run.engineId);
      throw new ConflictException(`No mill is driven by ${e.name}, the engine of this run. Describe the mill first.`);
    }
    return mill;
  }

  // ---- runs ----------------------------------------------------------------------------------------------

  /** Runs with bars, and the open runs of engines that drive a mill (where passes may be logged now or soon). */
  async runsList(): Promise<MillRunSummary[]> {
    const counts: { run_id: string; bars: number; passes: number; flagged: number }[] = await this.db.query(
      `SELECT b.run_id, count(DISTINCT b.id)::int AS bars, count(p.id)::int AS passes,
              count(p.id) FILTER (WHERE jsonb_array_length(p.calc->'warnings') > 0)::int AS flagged
         FROM mill_bars b LEFT JOIN mill_passes p ON p.bar_id = b.id GROUP BY b.run_id`,
    );
    const byRun = new Map(counts.map((c) => [c.run_id, c]));
    const millEngines = new Set((await this.mills.list()).map((m) => m.engineId));
    const all = await this.runs.list({});
    const wanted = all.filter((r) => byRun.has(r.id) || (millEngines.has(r.engineId) && RUN_STATES_TAKING_READINGS.includes(r.state)));
    const lotRows: { run_id: string; reference: string }[] = wanted.length
      ? await this.db.query(
          `SELECT lr.run_id, l.reference FROM mill_lot_runs lr JOIN mill_lots l ON l.id = lr.lot_id
           WHERE lr.run_id = ANY($1) ORDER BY l.reference`,
          [wanted.map((r) => r.id)],
        )
      : [];
    const rank = (s: RunState) => (s === 'running' ? 0 : s === 'stopped' ? 1 : RUN_STATES_TAKING_READINGS.includes(s) ? 2 : 3);
    return wanted
      .map((r) => {
        const c = byRun.get(r.id);
        return {
          runId: r.id,
          title: r.title,
          state: r.state,
          plannedFor: r.plannedFor,
          startedAt: r.startedAt,
          engineName: r.engineName,
          bars: c?.bars ?? 0,
          passes: c?.passes ?? 0,
          flaggedPasses: c?.flagged ?? 0,
          lotReferences: lotRows.filter((x) => x.run_id === r.id).map((x) => x.reference),
        };
      })
      .sort(
        (a, b) => rank(a.state) - rank(b.state) || (b.startedAt ?? b.plannedFor ?? '').localeCompare(a.startedAt ?? a.plannedFor ?? ''),
      );
  }

  async runLog(runId: string): Promise<MillRunLog> {
    const run = await this.runs.get(runId);
    const engine = await this.engines.get(run.engineId);
    const mill = await this.mills.forEngine(run.engineId);
    const why = mill ? this.loggingRefusal(run) : `No mill is driven by ${engine.name}, the engine of this run.`;
    const millDto = mill ? await this.mills.toDto(mill) : null;
    return {
      run: {
        id: run.id,
        title: run.title,
        state: run.state,
        engineId: run.engineId,
        engineName: engine.name,
        plannedFor: run.plannedFor,
        startedAt: run.startedAt?.toISOString() ?? null,
        stoppedAt: run.stoppedAt?.toISOString() ?? null,
      },
      mill: millDto ? { id: millDto.id, name: millDto.name, stands: millDto.stands } : null,
      canLog: why === null,
      reasonNotLogging: why,
      bars: await this.barsOf({ runId }),
    };
  }

  // ---- bars ----------------------------------------------------------------------------------------------

  async barsOf(where: { runId?: string; lotId?: string; ids?: string[] }): Promise<BarDto[]> {
    const w: Record<string, unknown> = {};
    if (where.runId) w.runId = where.runId;
    if (where.lotId) w.lotId = where.lotId;
    if (where.ids) w.id = In(where.ids);
    const bars = await this.millBarRepo.find({ where: w, order: { createdAt: 'ASC', barCode: 'ASC' } });
    if (!bars.length) return [];
    const passes = await this.millPassRepo.find({ where: { barId: In(bars.map((b) => b.id)) }, order: { passNumber: 'ASC' } });
    const passDtos = await this.passDtos(passes, bars);
    const scheduleIds = [...new Set(bars.map((b) => b.scheduleId).filter((x): x is string => !!x))];
    const schedules = scheduleIds.length ? await this.passScheduleRepo.find({ where: { id: In(scheduleIds) } }) : [];
    const lotIds = [...new Set(bars.map((b) => b.lotId).filter((x): x is string => !!x))];
    const lots = lotIds.length ? await this.customerLotRepo.find({ where: { id: In(lotIds) } }) : [];
    return bars.map((b) => ({
      id: b.id,
      runId: b.runId,
      barCode: b.barCode,
      scheduleId: b.scheduleId,
      scheduleName: schedules.find((s) => s.id === b.scheduleId)?.name ?? null,
      lotId: b.lotId,
      lotReference: lots.find((l) => l.id === b.lotId)?.reference ?? null,
      stock: b.stock,
      stockLengthMm: b.stockLengthMm,
      weightKg: b.weightKg,
      scrapped: b.scrapped,
      scrapReason: b.scrapReason,
      notes: b.notes,
      passes: passDtos.filter((p) => p.barId === b.id),
      createdAt: b.createdAt.toISOString(),
    }));
  }

  private async bar(id: string): Promise<BarDto> {
    const [b] = await this.barsOf({ ids: [id] });
    if (!b) throw new NotFoundException('No such bar.');
    return b;
  }

  /** Starts a bar on a run (`allowClosedRun`: the demo seed's past season only; the API never sets it). */
  async createBar(
    runId: string,
    dto: CreateBarRequest,
    user: Pick<AuthUser, 'id'>,
    opts: { allowClosedRun?: boolean } = {},
  ): Promise<BarDto> {
    const run = await this.runs.get(runId);
    if (!opts.allowClosedRun) this.assertLogging(run);
    const mill = await this.millOfRun(run);
    let schedule: PassSchedule | null = null;
    if (dto.scheduleId) {
      schedule = await this.passScheduleRepo.findOne({ where: { id: dto.scheduleId } });
      if (!schedule) throw new BadRequestException('scheduleId names no pass schedule.');
    }
    const stock = dto.stock ?? schedule?.stock;
    const stockLengthMm = dto.stockLengthMm ?? schedule?.stockLengthMm;
    if (!stock || !stockLengthMm)
      throw new BadRequestException('Give the stock size and length, or choose the pass schedule the bar follows.');
    if (dto.lotId && !(await this.customerLotRepo.exists({ where: { id: dto.lotId } })))
      throw new BadRequestException('lotId names no customer lot.');
    const code = dto.barCode.trim();
    if (await this.millBarRepo.exists({ where: { runId, barCode: code } }))
      throw new ConflictException(`Bar ${code} is already logged on this run; give the next bar its own id.`);
    const saved = await this.db.transaction(async (m) => {
      const b = await m.save(
        MillBar,
        m.create(MillBar, {
          runId,
          millId: mill.id,
          barCode: code,
          scheduleId: schedule?.id ?? null,
          lotId: dto.lotId ?? null,
          stock: { ...stock },
          stockLengthMm,
          notes: dto.notes ?? '',
          createdBy: user.id,
        }),
      );
      if (dto.lotId) await this.linkRunToLot(m, dto.lotId, runId, user.id);
      return b;
    });
    const out = await this.bar(saved.id);
    this.live.emitToRoom(`run:${runId}`, 'run:record', { runId, kind: 'mill-bar', id: out.id, data: out });
    return out;
  }

  async updateBar(barId: string, dto: UpdateBarRequest, user: AuthUser): Promise<BarDto> {
    const bar = await this.millBarRepo.findOne({ where: { id: barId } });
    if (!bar) throw new NotFoundException('No such bar.');
    const run = await this.runs.get(bar.runId);
    this.runs.assertOpen(run);
    if (dto.lotId && !(await this.customerLotRepo.exists({ where: { id: dto.lotId } })))
      throw new BadRequestException('lotId names no customer lot.');
    const patch: Partial<MillBar> = {};
    if (dto.lotId !== undefined) patch.lotId = dto.lotId;
    if (dto.weightKg !== undefined) patch.weightKg = dto.weightKg;
    if (dto.scrapped !== undefined) patch.scrapped = dto.scrapped;
    if (dto.scrapReason !== undefined) patch.scrapReason = dto.scrapReason;
    if (dto.notes !== undefined) patch.notes = dto.notes;
    if (patch.scrapped && !(patch.scrapReason ?? bar.scrapReason)?.trim())
      throw new BadRequestException('scrapReason must say why the bar was scrapped.');
    await this.db.transaction(async (m) => {
      if (Object.keys(patch).length) await m.update(MillBar, { id: barId }, patch);
      if (dto.lotId) await this.linkRunToLot(m, dto.lotId, bar.runId, user.id);
    });
    const out = await this.bar(barId);
    this.live.emitToRoom(`run:${bar.runId}`, 'run:record', { runId: bar.runId, kind: 'mill-bar', id: out.id, data: out });
    return out;
  }

  /** A bar of a lot ties its run to the lot. */
  private async linkRunToLot(m: import('typeorm').EntityManager, lotId: string, runId: string, userId: string) {
    await m.query(`INSERT INTO mill_lot_runs (lot_id, run_id, linked_by, linked_at) VALUES ($1, $2, $3, now()) ON CONFLICT DO NOTHING`, [
      lotId,
      runId,
      userId,
    ]);
  }

  // ---- passes --------------------------------------------------------------------------------------------

  /**
   * Logs one pass of a bar and stores its calculation as made at that moment. `allowClosedRun` is for the demo
   * seed, which writes a past season's passes on runs it has already closed; the API never sets it.
   */
  async logPass(
    barId: string,
    dto: LogPassRequest,
    user: Pick<AuthUser, 'id'>,
    opts: { allowClosedRun?: boolean } = {},
  ): Promise<LoggedPassDto> {
    const bar = await this.millBarRepo.findOne({ where: { id: barId } });
    if (!bar) throw new NotFoundException('No such bar.');
    if (dto.clientId) {
      const dup = await this.millPassRepo.findOne({ where: { clientId: dto.clientId } });
      if (dup) {
        if (dup.barId !== barId) throw new ConflictException('That clientId was used for a pass of another bar.');
        return (await this.passDtos([dup], [bar]))[0];
      }
    }
    const run = await this.runs.get(bar.runId);
    if (!opts.allowClosedRun) this.assertLogging(run);
    const mill = await this.mills.get(bar.millId);
    const stand = this.mills.standAt(mill, dto.standPosition);
    const engine = await this.engines.get(mill.engineId);
    const at = dto.at ? new Date(dto.at) : new Date();
    if (!opts.allowClosedRun) {
      if (at.getTime() > Date.now() + CLOCK_SLACK_MS)
        throw new BadRequestException('at is in the future; leave it out to log the pass now.');
      if (run.startedAt && at < run.startedAt)
        throw new BadRequestException(`at is before the run started (${run.startedAt.toISOString()}).`);
    }
    if (await this.millPassRepo.exists({ where: { barId, passNumber: dto.passNumber } }))
      throw new ConflictException(`Pass ${dto.passNumber} of bar ${bar.barCode} is already logged. Log the next pass number.`);
    const planned = bar.scheduleId
      ? await this.schedulePassRepo.findOne({ where: { scheduleId: bar.scheduleId, seq: dto.passNumber } })
      : null;
    const previous = await this.millPassRepo.findOne({ where: { barId }, order: { passNumber: 'DESC' } });
    const entry: SectionDto = dto.entry ?? planned?.entry ?? (previous && previous.passNumber < dto.passNumber ? previous.exit : bar.stock);
    const speed = await this.speedAt(run, engine.ratedSpeedRpm, at);
    const ihp = await this.power.forRun(run.id, mill, at);
    const hasFlywheel = engine.flywheelMassLb !== null && engine.flywheelRadiusOfGyrationFt !== null;
    const calc = calculatePass({
      rollDiameterMm: stand.rollDiameterMm,
      entry,
      exit: dto.exit,
      temperatureC: dto.measuredTemperatureC,
      carbonPct: await this.carbonOf(bar),
      rollSpeedRpm: speed.rpm * stand.rollSpeedRatio,
      standMaxForceKn: stand.maxSeparatingForceKn,
      frictionFactor: mill.settings.frictionFactor,
      flywheel: hasFlywheel
        ? {
            flywheelMassLb: engine.flywheelMassLb!,
            flywheelRadiusOfGyrationFt: engine.flywheelRadiusOfGyrationFt!,
            engineSpeedRpm: speed.rpm,
            startSpeedSource: speed.source,
            ratedSpeedRpm: engine.ratedSpeedRpm,
            minSpeedFraction: mill.settings.minSpeedFraction,
            barExitLengthM: barLengthM(bar.stockLengthMm / 1000, sectionAreaMm2(bar.stock), sectionAreaMm2(dto.exit)),
            indicatedHp: ihp.indicatedHp,
            indicatedHpSource: ihp.source,
            mechanicalEfficiency: mill.settings.mechanicalEfficiency,
            baseLoadHp: mill.settings.baseLoadHp,
          }
        : null,
    });
    const row = await this.millPassRepo.save(
      this.millPassRepo.create({
        clientId: dto.clientId ?? null,
        barId,
        runId: bar.runId,
        passNumber: dto.passNumber,
        standPosition: stand.position,
        standName: stand.name,
        at,
        measuredTemperatureC: dto.measuredTemperatureC,
        entry: { ...entry },
        exit: { ...dto.exit },
        plannedExit: planned ? planned.exit : null,
        notes: dto.notes ?? '',
        loggedBy: user.id,
        calc,
      }),
    );
    const [out] = await this.passDtos([row], [bar]);
    this.live.emitToRoom(`run:${bar.runId}`, 'run:record', { runId: bar.runId, kind: 'mill-pass', id: out.id, data: out });
    return out;
  }

  /** Carbon for the flow stress: the bar's schedule, else its lot, else 0.2 % (mild steel) when neither names one. */
  private async carbonOf(bar: MillBar): Promise<number> {
    if (bar.scheduleId) {
      const s = await this.passScheduleRepo.findOne({ where: { id: bar.scheduleId } });
      if (s) return s.carbonPct;
    }
    if (bar.lotId) {
      const l = await this.customerLotRepo.findOne({ where: { id: bar.lotId } });
      if (l?.carbonPct !== null && l?.carbonPct !== undefined) return l.carbonPct;
    }
    return 0.2;
  }

  /** The engine's speed as the bar entered: the latest speed reading before the pass, else rated speed. */
  private async speedAt(run: RunRecord, ratedSpeedRpm: number, at: Date): Promise<{ rpm: number; source: string }> {
    const { points } = await this.engines.withPoints(run.engineId);
    const speed = points.find((p) => p.kind === 'speed' && p.unit === 'rpm');
    if (speed) {
      const latest = await this.readings.latestValueBefore(run.id, speed.id, at, SPEED_READING_MAX_AGE_MS);
      if (latest && latest.value > 0) return { rpm: latest.value, source: `speed reading ${speed.code} at ${fmtClock(latest.takenAt)}` };
    }
    return { rpm: ratedSpeedRpm, source: 'rated speed (no speed reading in the 30 minutes before the pass)' };
  }

  private async passDtos(rows: MillPass[], bars: MillBar[]): Promise<LoggedPassDto[]> {
    if (!rows.length) return [];
    const name = await this.users.displayNames(rows.map((r) => r.loggedBy));
    const barCode = new Map(bars.map((b) => [b.id, b.barCode]));
    return rows.map((p) => ({
      id: p.id,
      barId: p.barId,
      barCode: barCode.get(p.barId) ?? '',
      runId: p.runId,
      passNumber: p.passNumber,
      standPosition: p.standPosition,
      standName: p.standName,
      at: p.at.toISOString(),
      measuredTemperatureC: p.measuredTemperatureC,
      entry: p.entry,
      exit: p.exit,
      plannedExit: p.plannedExit,
      notes: p.notes,
      loggedByName: name.get(p.loggedBy) ?? 'unknown',
      calc: p.calc,
    }));
  }

  // ---- one timeline --------------------------------------------------------------------------------------

  /** Passes, rounds of readings and alarms of a run, in time order. */
  async timeline(runId: string): Promise<MillTimelineItem[]> {
    const run = await this.runs.get(runId);
    const [bars, readings, alarms, { points }] = await Promise.all([
      this.barsOf({ runId }),
      this.readings.list(runId, {}),
      this.alarms.list({ runId }),
      this.engines.withPoints(run.engineId),
    ]);
    const pointById = new Map(points.map((p) => [p.id, p]));
    const items: MillTimelineItem[] = [];
    for (const b of bars) for (const p of b.passes) items.push({ kind: 'pass', at: p.at, pass: p });
    const rounds = new Map<string, TimelineReading[]>();
    for (const r of readings) {
      const key = r.takenAt.slice(0, 16);
      const p = pointById.get(r.pointId);
      const list = rounds.get(key) ?? [];
      list.push({ pointId: r.pointId, code: p?.code ?? '?', label: p?.label ?? 'retired point', value: r.value, unit: r.unit });
      rounds.set(key, list);
    }
    const seq = new Map(points.map((p) => [p.id, p.sequence]));
    for (const [key, list] of rounds) {
      list.sort((a, b) => (seq.get(a.pointId) ?? 999) - (seq.get(b.pointId) ?? 999));
      items.push({ kind: 'round', at: `${key}:00.000Z`, readings: list });
    }
    for (const a of alarms) items.push({ kind: 'alarm', at: a.raisedAt, alarm: a });
    const order = { alarm: 0, round: 1, pass: 2 } as const;
    return items.sort((a, b) => a.at.localeCompare(b.at) || order[a.kind] - order[b.kind]);
  }

  /** The bars of a lot (for the lot's page). */
  async lotBars(lotId: string) {
    const bars = await this.millBarRepo.find({ where: { lotId }, order: { createdAt: 'ASC' } });
    if (!bars.length) return [];
    const counts: { bar_id: string; n: number }[] = await this.db.query(
      `SELECT bar_id, count(*)::int AS n FROM mill_passes WHERE bar_id = ANY($1) GROUP BY bar_id`,
      [bars.map((b) => b.id)],
    );
    const runIds = [...new Set(bars.map((b) => b.runId))];
    const titles = new Map<string, string>();
    for (const id of runIds) titles.set(id, (await this.runs.get(id)).title);
    return bars.map((b) => ({
      id: b.id,
      barCode: b.barCode,
      runId: b.runId,
      runTitle: titles.get(b.runId) ?? '',
      passes: counts.find((c) => c.bar_id === b.id)?.n ?? 0,
      weightKg: b.weightKg,
      scrapped: b.scrapped,
    }));
  }

  /** Used by lots: a run may be linked only if it exists. */
  async assertRunExists(runId: string): Promise<RunRecord> {
    return this.runs.get(runId);
  }

  linkedRunIds(lotId: string): Promise<LotRun[]> {
    return this.lotRunRepo.find({ where: { lotId }, order: { linkedAt: 'ASC' } });
  }
}
