import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, Repository } from 'typeorm';
import type {
  BearingLubricationAnalysis,
  BearingLubricationRow,
  ConsumptionEntryDto as ConsumptionEntryOut,
  EngineDetail,
  EngineLubrication,
  LubricationPointOilDto,
  OilDto,
  PointConsumption,
  RunSummary,
} from '@crankjournal/shared-types';
import { EnginesService } from '../engines/engines.service.js';
import { RunsService } from '../runs/runs.service.js';
import { ReadingsService } from '../runs/readings.service.js';
import { UsersService } from '../users/users.service.js';
import {
  CONSUMPTION_TREND_RULE_TEXT,
  bearingUnitLoadPsi,
  consumptionTrend,
  journalFriction,
  oilConsumption,
  oilViscosity,
} from '../../calculations/lubrication.js';
import { fahrenheitToCelsius } from '../../calculations/units.js';
import type { ConsumptionEntryDto, OilWriteDto } from './dto/lubrication.dto.js';
import { OilConsumptionEntry } from './oil-consumption.entity.js';
import { Oil, LubricationPointOil } from './oil.entity.js';
import { FRICTION_METHOD } from './lubrication-calculations.controller.js';

type LubePoint = EngineDetail['lubricationPoints'][number];

/** Oils, which point takes which, oil used per run with its rates and trend, and each main bearing's figures for a run. */
@Injectable()
export class LubricationService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(LubricationPointOil) private readonly lubricationPointOilRepo: Repository<LubricationPointOil>,
    @InjectRepository(Oil) private readonly oilRepo: Repository<Oil>,
    @InjectRepository(OilConsumptionEntry) private readonly oilConsumptionEntryRepo: Repository<OilConsumptionEntry>,
    private readonly engines: EnginesService,
    private readonly runs: RunsService,
    private readonly readings: ReadingsService,
    private readonly users: UsersService,
  ) {}

  // --- Oils ---------------------------------------------------------------------------------------

  private oilDto(o: Oil): OilDto {
    return {
      id: o.id,
      name: o.name,
      grade: o.grade,
      viscosity40cSt: o.viscosity40cSt,
      viscosity100cSt: o.viscosity100cSt,
      densityKgM3At15C: o.densityKgM3At15C,
      figuresSource: o.figuresSource,
      notes: o.notes,
    };
  }

  async oils(): Promise<OilDto[]> {
    return (await this.oilRepo.find({ order: { name: 'ASC' } })).map((o) => this.oilDto(o));
  }

  private checkOil(dto: OilWriteDto) {
    if (dto.viscosity100cSt >= dto.viscosity40cSt)
      throw new BadRequestException('viscosity100cSt must be lower than viscosity40cSt (oil thins as it warms).');
  }

  async createOil(dto: OilWriteDto): Promise<OilDto> {
    this.checkOil(dto);
    const name = dto.name.trim();
    if (await this.oilRepo.exists({ where: { name } })) throw new ConflictException(`An oil called "${name}" already exists.`);
    const saved = await this.oilRepo.save({
      name,
      grade: dto.grade.trim(),
      viscosity40cSt: dto.viscosity40cSt,
      viscosity100cSt: dto.viscosity100cSt,
      densityKgM3At15C: dto.densityKgM3At15C ?? null,
      figuresSource: dto.figuresSource.trim(),
      notes: dto.notes ?? '',
    });
    return this.oilDto(saved as Oil);
  }

  async updateOil(id: string, dto: OilWriteDto): Promise<OilDto> {
    this.checkOil(dto);
    const o = await this.oilRepo.findOne({ where: { id } });
    if (!o) throw new NotFoundException('No such oil.');
    const name = dto.name.trim();
    if (name !== o.name && (await this.oilRepo.exists({ where: { name } })))
      throw new ConflictException(`An oil called "${name}" already exists.`);
    Object.assign(o, {
      name,
      grade: dto.grade.trim(),
      viscosity40cSt: dto.viscosity40cSt,
      viscosity100cSt: dto.viscosity100cSt,
      densityKgM3At15C: dto.densityKgM3At15C ?? null,
      figuresSource: dto.figuresSource.trim(),
      notes: dto.notes ?? '',
    });
    return this.oilDto(await this.oilRepo.save(o));
  }

  // --- Points and their oils ------------------------------------------------------------------------

  /** The oil of each lubrication point: the one assigned here, else the oil whose name is the point's grade text. */
  async pointOils(engine: EngineDetail): Promise<{ dtos: LubricationPointOilDto[]; oilOf: Map<string, Oil> }> {
    const oils = await this.oilRepo.find();
    const byId = new Map(oils.map((o) => [o.id, o]));
    const byName = new Map(oils.map((o) => [o.name.trim().toLowerCase(), o]));
    const assigned = await this.lubricationPointOilRepo.find({ where: { engineId: engine.id } });
    const oilOf = new Map<string, Oil>();
    const dtos = engine.lubricationPoints.map((l) => {
      const a = assigned.find((x) => x.lubricationPointId === l.id);
      const byAssign = a ? byId.get(a.oilId) : undefined;
      const byGrade = byName.get(l.oilGrade.trim().toLowerCase());
      const oil = byAssign ?? byGrade ?? null;
      if (oil) oilOf.set(l.id, oil);
      return {
        lubricationPointId: l.id,
        engineId: engine.id,
        label: l.label,
        kind: l.kind,
        oilGradeText: l.oilGrade,
        oilId: oil?.id ?? null,
        oilName: oil?.name ?? null,
        matchedBy: byAssign ? ('assigned' as const) : byGrade ? ('grade' as const) : null,
        bearings: engine.bearings.filter((b) => b.lubricationPointId === l.id).map((b) => ({ id: b.id, label: b.label })),
      };
    });
    return { dtos, oilOf };
  }

  /** The engine that has this lubrication point. */
  private async pointOwner(pointId: string): Promise<{ engine: EngineDetail; point: LubePoint }> {
    for (const e of await this.engines.list()) {
      const d = await this.engines.detail(e.id);
      const point = d.lubricationPoints.find((l) => l.id === pointId);
      if (point) return { engine: d, point };
    }
    throw new NotFoundException('No such lubrication point.');
  }

  async assignOil(pointId: string, oilId: string | null, userId: string): Promise<LubricationPointOilDto> {
    const { engine } = await this.pointOwner(pointId);
    if (oilId === null) {
      await this.lubricationPointOilRepo.delete({ lubricationPointId: pointId });
    } else {
      if (!(await this.oilRepo.exists({ where: { id: oilId } }))) throw new BadRequestException('oilId is not one of the oils.');
      await this.lubricationPointOilRepo.upsert({ lubricationPointId: pointId, engineId: engine.id, oilId, assignedBy: userId }, [
        'lubricationPointId',
      ]);
    }
    const { dtos } = await this.pointOils(engine);
    return dtos.find((d) => d.lubricationPointId === pointId)!;
  }

  // --- Consumption ---------------------------------------------------------------------------------

  async addConsumption(dto: ConsumptionEntryDto, userId: string): Promise<ConsumptionEntryOut> {
    const run = await this.runs.get(dto.runId);
    const engine = await this.engines.detail(run.engineId);
    if (!engine.lubricationPoints.some((l) => l.id === dto.lubricationPointId))
      throw new BadRequestException('lubricationPointId is not a lubrication point of the run’s engine.');
    if (!run.startedAt || run.state === 'abandoned')
      throw new ConflictException('Oil used is logged against a run that has run; this one has not started.');
    let used: number;
    if (dto.method === 'added') {
      if (dto.quantityLitres == null) throw new BadRequestException('quantityLitres is needed when method is added.');
      used = dto.quantityLitres;
    } else {
      if (dto.levelStartLitres == null || dto.levelEndLitres == null)
        throw new BadRequestException('levelStartLitres and levelEndLitres are needed when method is levels.');
      if (dto.levelEndLitres > dto.levelStartLitres)
        throw new BadRequestException('levelEndLitres is above levelStartLitres: if oil was put in during the run, log it as added.');
      used = dto.levelStartLitres - dto.levelEndLitres;
    }
    const saved = await this.oilConsumptionEntryRepo.save({
      engineId: run.engineId,
      runId: run.id,
      lubricationPointId: dto.lubricationPointId,
      method: dto.method,
      quantityLitres: dto.method === 'added' ? dto.quantityLitres! : null,
      levelStartLitres: dto.method === 'levels' ? dto.levelStartLitres! : null,
      levelEndLitres: dto.method === 'levels' ? dto.levelEndLitres! : null,
      usedLitres: used,
      note: dto.note ?? '',
      recordedBy: userId,
    });
    const names = new Map((await this.users.list()).map((u) => [u.id, u.displayName]));
    return this.entryDto(saved as OilConsumptionEntry, new Map([[run.id, run.title]]), names);
  }

  private entryDto(e: OilConsumptionEntry, runTitles: Map<string, string>, names: Map<string, string>): ConsumptionEntryOut {
    return {
      id: e.id,
      runId: e.runId,
      runTitle: runTitles.get(e.runId) ?? '',
      lubricationPointId: e.lubricationPointId,
      method: e.method,
      quantityLitres: e.quantityLitres,
      levelStartLitres: e.levelStartLitres,
      levelEndLitres: e.levelEndLitres,
      usedLitres: e.usedLitres,
      note: e.note,
      recordedByName: names.get(e.recordedBy) ?? 'unknown',
      recordedAt: e.recordedAt.toISOString(),
    };
  }

  /** Oils and points of an engine, and each point's oil used per run, per run-hour and per thousand revolutions, with its trend. */
  async engineLubrication(engineId: string): Promise<EngineLubrication> {
    const engine = await this.engines.detail(engineId);
    const { dtos, oilOf } = await this.pointOils(engine);
    const runs = (await this.runs.list({ engineId }))
      .filter((r) => r.startedAt && r.state !== 'abandoned')
      .sort((a, b) => a.startedAt!.localeCompare(b.startedAt!));
    const runById = new Map(runs.map((r) => [r.id, r]));
    const entries = await this.oilConsumptionEntryRepo.find({ where: { engineId }, order: { recordedAt: 'ASC' } });
    const consumption: PointConsumption[] = engine.lubricationPoints.map((l) => {
      const used = new Map<string, number>();
      for (const e of entries) if (e.lubricationPointId === l.id) used.set(e.runId, (used.get(e.runId) ?? 0) + e.usedLitres);
      const rows = runs
        .filter((r) => used.has(r.id))
        .map((r) => {
          const runHours = r.runningSeconds / 3600;
          const rates =
            runHours > 0 && r.revolutions > 0
              ? oilConsumption({ oilUsedLitres: used.get(r.id)!, runHours, revolutions: r.revolutions })
              : null;
          return {
            runId: r.id,
            title: r.title,
            startedAt: r.startedAt,
            usedLitres: used.get(r.id)!,
            runHours,
            revolutions: r.revolutions,
            litresPerRunHour: rates?.litresPerRunHour ?? null,
            litresPerThousandRevolutions: rates?.litresPerThousandRevolutions ?? null,
          };
        });
      const perThousand = rows.map((r) => r.litresPerThousandRevolutions).filter((v): v is number => v !== null);
      return {
        lubricationPointId: l.id,
        label: l.label,
        kind: l.kind,
        oilName: oilOf.get(l.id)?.name ?? null,
        runs: rows,
        totalLitres: rows.reduce((s, r) => s + r.usedLitres, 0),
        trend: { ...consumptionTrend(perThousand), ruleText: CONSUMPTION_TREND_RULE_TEXT },
      };
    });
    const names = new Map((await this.users.list()).map((u) => [u.id, u.displayName]));
    const titles = new Map([...runById.values()].map((r) => [r.id, r.title]));
    return {
      engineId,
      engineName: engine.name,
      points: dtos,
      consumption,
      entries: entries
        .slice(-200)
        .reverse()
        .map((e) => this.entryDto(e, titles, names)),
    };
  }

  // --- Bearing figures for a run -----------------------------------------------------------------------

  /**
   * For each bearing of the engine at a run: viscosity at its mean running temperature, unit load from the
   * rotating weight and its share, Petroff friction and power lost, Sommerfeld number. The run defaults to the
   * latest that has run.
   */
  async bearingAnalysis(engineId: string, runId?: string): Promise<BearingLubricationAnalysis> {
    const engine = await this.engines.detail(engineId);
    let run: RunSummary | undefined;
    const runs = (await this.runs.list({ engineId })).filter((r) => r.startedAt && r.state !== 'abandoned');
    if (runId) {
      run = runs.find((r) => r.id === runId);
      if (!run) {
        const r = await this.runs.get(runId);
        throw new BadRequestException(
          r.engineId !== engineId ? 'runId is not a run of this engine.' : 'That run has not run yet: there are no running figures.',
        );
      }
    } else run = runs.sort((a, b) => b.startedAt!.localeCompare(a.startedAt!))[0];
    const { oilOf } = await this.pointOils(engine);
    const { points } = await this.engines.withPoints(engineId);
    const tempPoints = points.filter((p) => p.kind === 'bearing_temperature' && p.bearingId && (p.unit === 'degF' || p.unit === 'degC'));
    const speedPoints = points.filter((p) => p.kind === 'speed' && p.unit === 'rpm');
    const stats = run
      ? await this.readings.pointRunStats(
          [...tempPoints, ...speedPoints].map((p) => p.id),
          { runIds: [run.id] },
        )
      : [];
    const speedStat = speedPoints.map((p) => stats.find((s) => s.pointId === p.id)).find((s) => s);
    const speedRpm = speedStat ? speedStat.mean : null;
    const rows: BearingLubricationRow[] = engine.bearings.map((b) => {
      const missing: string[] = [];
      const tp = tempPoints
        .filter((p) => p.bearingId === b.id)
        .map((p) => ({ p, s: stats.find((s) => s.pointId === p.id) }))
        .find((x) => x.s);
      const temperatureC = tp ? (tp.p.unit === 'degF' ? fahrenheitToCelsius(tp.s!.mean) : tp.s!.mean) : null;
      if (!run) missing.push('no run yet');
      else if (temperatureC === null) missing.push('no temperature readings of this bearing in the run');
      if (run && speedRpm === null) missing.push('no speed readings in the run');
      const oil = b.lubricationPointId ? oilOf.get(b.lubricationPointId) : undefined;
      if (!oil) missing.push('no oil known for its lubrication point');
      const loadLbf = engine.rotatingWeightLb && b.loadSharePercent > 0 ? (engine.rotatingWeightLb * b.loadSharePercent) / 100 : null;
      if (!engine.rotatingWeightLb) missing.push('the engine’s rotating weight is not given');
      else if (!(b.loadSharePercent > 0)) missing.push('it carries no share of the rotating weight');
      if (!b.radialClearanceIn) missing.push('no radial clearance given');
      const visc =
        oil && temperatureC !== null
          ? oilViscosity({
              viscosity40cSt: oil.viscosity40cSt,
              viscosity100cSt: oil.viscosity100cSt,
              temperatureC,
              densityKgM3At15C: oil.densityKgM3At15C ?? undefined,
            })
          : null;
      const friction =
        visc && loadLbf && b.radialClearanceIn && speedRpm !== null && speedRpm > 0
          ? journalFriction({
              diameterIn: b.journalDiameterIn,
              lengthIn: b.journalLengthIn,
              radialClearanceIn: b.radialClearanceIn,
              speedRpm,
              viscosityReyn: visc.dynamicReyn,
              loadLbf,
            })
          : null;
      return {
        bearingId: b.id,
        label: b.label,
        kind: b.kind,
        oilName: oil?.name ?? null,
        temperatureC,
        speedRpm,
        loadLbf,
        kinematicCst: visc?.kinematicCst ?? null,
        dynamicPaS: visc?.dynamicPaS ?? null,
        dynamicReyn: visc?.dynamicReyn ?? null,
        densityAssumed: visc?.densityAssumed ?? false,
        unitLoadPsi: friction?.unitLoadPsi ?? (loadLbf ? bearingUnitLoadPsi(loadLbf, b.journalDiameterIn, b.journalLengthIn) : null),
        frictionTorqueLbfIn: friction?.frictionTorqueLbfIn ?? null,
        frictionCoefficient: friction?.frictionCoefficient ?? null,
        powerLossHp: friction?.powerLossHp ?? null,
        sommerfeldNumber: friction?.sommerfeldNumber ?? null,
        missing,
      };
    });
    return {
      engineId,
      runId: run?.id ?? null,
      runTitle: run?.title ?? null,
      rotatingWeightLb: engine.rotatingWeightLb,
      rows,
      notes: [
        'Temperature: the bearing’s mean temperature over the run (warm-up included), taken as the oil film’s.',
        'Load: the engine’s rotating weight × the bearing’s share; bearings that carry no share of it have no load figure here.',
        FRICTION_METHOD,
      ],
    };
  }
}
