import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, EntityManager, In, Repository } from 'typeorm';
import type { EngineDetail, EngineSummary, LimitChangeDto } from '@crankjournal/shared-types';
import { UsersService } from '../users/users.service.js';
import { ClusterService } from '../cluster/cluster.service.js';
import { Engine } from './engine.entity.js';
import { Cylinder } from './cylinder.entity.js';
import { Bearing } from './bearing.entity.js';
import { LubricationPoint } from './lubrication-point.entity.js';
import { MeasurementPoint } from './measurement-point.entity.js';
import { LimitChange } from './limit-change.entity.js';
import type { EngineWriteDto } from './dto/engine-write.dto.js';

/** Limit fields whose every change is kept for the record. */
const POINT_LIMIT_FIELDS = [
  'normalLow',
  'normalHigh',
  'lowLimit',
  'highLimit',
  'highHighLimit',
  'maxRiseRatePerMin',
  'maxRiseAboveAmbient',
  'deadband',
  'unit',
] as const;
const ENGINE_LIMIT_FIELDS = ['ratedSpeedRpm', 'overspeedRpm', 'mawpPsig', 'preLubeFreshnessMinutes'] as const;

export interface EngineWithPoints {
  engine: Engine;
  points: MeasurementPoint[];
}

@Injectable()
export class EnginesService {
  /** Engines and their points, cached for the reading path; cleared on every engine write. */
  private readonly cache = new Map<string, EngineWithPoints>();

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(Engine) private readonly engines: Repository<Engine>,
    @InjectRepository(MeasurementPoint) private readonly points: Repository<MeasurementPoint>,
    @InjectRepository(LimitChange) private readonly changes: Repository<LimitChange>,
    private readonly users: UsersService,
    private readonly cluster: ClusterService,
  ) {
    cluster.on('engine', (id) => (id ? this.cache.delete(id) : this.cache.clear()));
  }

  /**
   * Drops the cached engine here and in every other instance (NOTIFY; inside transaction `m` it goes out at commit,
   * so no instance reloads the engine before the change is visible).
   */
  private async forgetEngine(id: string, m?: EntityManager) {
    this.cache.delete(id);
    await this.cluster.announce('engine', id, m);
  }

  async list(): Promise<EngineSummary[]> {
    const rows = await this.engines.find({ order: { name: 'ASC' } });
    return rows.map((e) => this.summary(e));
  }

  summary(e: Engine): EngineSummary {
    return {
      id: e.id,
      name: e.name,
      builder: e.builder,
      yearBuilt: e.yearBuilt,
      type: e.type,
      ratedSpeedRpm: e.ratedSpeedRpm,
      overspeedRpm: e.overspeedRpm,
      mawpPsig: e.mawpPsig,
      preLubeFreshnessMinutes: e.preLubeFreshnessMinutes,
      runningHours: e.baselineHours + e.recordedHours,
      revolutions: e.baselineRevolutions + e.recordedRevolutions,
      activeRunId: e.activeRunId,
    };
  }

  async get(id: string): Promise<Engine> {
    const e = await this.engines.findOne({ where: { id } });
    if (!e) throw new NotFoundException('No such engine.');
    return e;
  }

  async detail(id: string): Promise<EngineDetail> {
    // Each kind of part by a query of its own: joined in one, the rows multiplied (cylinders × bearings × lubrication
    // points × measurement points, 176 rows for a two-cylinder engine) and building the entities from them was most
    // of the read.
    const e = await this.engines.findOne({
      where: { id },
      relations: { cylinders: true, bearings: true, lubricationPoints: true, measurementPoints: true },
      relationLoadStrategy: 'query',
    });
    if (!e) throw new NotFoundException('No such engine.');
    const lubeById = new Map((e.lubricationPoints ?? []).map((l) => [l.id, l.label]));
    const bearingById = new Map((e.bearings ?? []).map((b) => [b.id, b.label]));
    const cylById = new Map((e.cylinders ?? []).map((c) => [c.id, c.label]));
    const byPos = <T extends { position: number }>(a: T, b: T) => a.position - b.position;
    return {
      ...this.summary(e),
      notes: e.notes,
      escalateAfterMinutes: e.escalateAfterMinutes,
      callList: e.callList ?? [],
      flywheelMassLb: e.flywheelMassLb,
      flywheelRadiusOfGyrationFt: e.flywheelRadiusOfGyrationFt,
      rotatingWeightLb: e.rotatingWeightLb,
      cylinders: (e.cylinders ?? [])
        .filter((x) => x.active)
        .sort(byPos)
        .map(({ id, label, role, boreIn, strokeIn, pistonRodIn, tailRodIn, clearancePercent }) => ({
          id,
          label,
          role,
          boreIn,
          strokeIn,
          pistonRodIn,
          tailRodIn,
          clearancePercent,
        })),
      lubricationPoints: (e.lubricationPoints ?? [])
        .filter((x) => x.active)
        .sort(byPos)
        .map(({ id, label, kind, oilGrade }) => ({ id, label, kind, oilGrade })),
      bearings: (e.bearings ?? [])
        .filter((x) => x.active)
        .sort(byPos)
        .map((b) => ({
          id: b.id,
          label: b.label,
          kind: b.kind,
          journalDiameterIn: b.journalDiameterIn,
          journalLengthIn: b.journalLengthIn,
          loadSharePercent: b.loadSharePercent,
          radialClearanceIn: b.radialClearanceIn,
          lubricationPointId: b.lubricationPointId,
          lubricationPointLabel: b.lubricationPointId ? (lubeById.get(b.lubricationPointId) ?? null) : null,
        })),
      measurementPoints: (e.measurementPoints ?? [])
        .filter((m) => m.active)
        .sort((a, b) => a.sequence - b.sequence)
        .map((m) => ({
          id: m.id,
          code: m.code,
          label: m.label,
          kind: m.kind,
          unit: m.unit,
          sequence: m.sequence,
          normalLow: m.normalLow,
          normalHigh: m.normalHigh,
          lowLimit: m.lowLimit,
          highLimit: m.highLimit,
          highHighLimit: m.highHighLimit,
          maxRiseRatePerMin: m.maxRiseRatePerMin,
          maxRiseAboveAmbient: m.maxRiseAboveAmbient,
          deadband: m.deadband,
          relatedSuppression: m.relatedSuppression,
          suppressedInStates: m.suppressedInStates ?? [],
          bearingId: m.bearingId,
          bearingLabel: m.bearingId ? (bearingById.get(m.bearingId) ?? null) : null,
          cylinderId: m.cylinderId,
          cylinderLabel: m.cylinderId ? (cylById.get(m.cylinderId) ?? null) : null,
        })),
    };
  }

  /** Checks that hold across fields (the DTO checks each field alone). */
  private crossCheck(dto: EngineWriteDto) {
    const errs: string[] = [];
    if (dto.overspeedRpm <= dto.ratedSpeedRpm) errs.push('overspeedRpm must be above ratedSpeedRpm');
    dto.cylinders.forEach((c, i) => {
      if (c.pistonRodIn >= c.boreIn) errs.push(`cylinders.${i}.pistonRodIn must be smaller than the bore`);
      if (c.tailRodIn >= c.boreIn) errs.push(`cylinders.${i}.tailRodIn must be smaller than the bore`);
    });
    const dup = (xs: string[], what: string) => {
      const seen = new Set<string>();
      for (const x of xs) {
        const k = x.trim().toLowerCase();
        if (seen.has(k)) errs.push(`${what} "${x}" is used twice`);
        seen.add(k);
      }
    };
    dup(
      dto.cylinders.map((c) => c.label),
      'cylinder label',
    );
    dup(
      dto.bearings.map((b) => b.label),
      'bearing label',
    );
    dup(
      dto.lubricationPoints.map((l) => l.label),
      'lubrication point label',
    );
    dup(
      dto.measurementPoints.map((m) => m.code),
      'measurement point code',
    );
    const lubeLabels = new Set(dto.lubricationPoints.map((l) => l.label));
    const bearingLabels = new Set(dto.bearings.map((b) => b.label));
    const cylLabels = new Set(dto.cylinders.map((c) => c.label));
    dto.bearings.forEach((b, i) => {
      if (b.lubricationPointLabel && !lubeLabels.has(b.lubricationPointLabel))
        errs.push(`bearings.${i}.lubricationPointLabel "${b.lubricationPointLabel}" is not one of the lubrication points`);
    });
    dto.measurementPoints.forEach((m, i) => {
      if (m.highLimit != null && m.highHighLimit != null && m.highHighLimit < m.highLimit)
        errs.push(`measurementPoints.${i}.highHighLimit must not be below highLimit`);
      if (m.normalLow != null && m.normalHigh != null && m.normalLow > m.normalHigh)
        errs.push(`measurementPoints.${i}.normalLow must not be above normalHigh`);
      if (m.bearingLabel && !bearingLabels.has(m.bearingLabel))
        errs.push(`measurementPoints.${i}.bearingLabel "${m.bearingLabel}" is not one of the bearings`);
      if (m.cylinderLabel && !cylLabels.has(m.cylinderLabel))
        errs.push(`measurementPoints.${i}.cylinderLabel "${m.cylinderLabel}" is not one of the cylinders`);
    });
    if (errs.length) throw new BadRequestException({ statusCode: 400, error: 'Bad Request', message: errs });
  }

  async create(dto: EngineWriteDto, userId: string): Promise<EngineDetail> {
    this.crossCheck(dto);
    if (await this.engines.exists({ where: { name: dto.name.trim() } }))
      throw new ConflictException(`An engine called "${dto.name}" already exists.`);
    const id = await this.db.transaction(async (m) => {
      const e = await m.save(Engine, m.create(Engine, this.engineFields(dto)));
      await this.writeParts(m, e, dto, userId, true);
      return e.id;
    });
    await this.forgetEngine(id);
    return this.detail(id);
  }

  async update(id: string, dto: EngineWriteDto, userId: string): Promise<EngineDetail> {
    this.crossCheck(dto);
    await this.db.transaction(async (m) => {
      const e = await m.findOne(Engine, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!e) throw new NotFoundException('No such engine.');
      const fields = this.engineFields(dto);
      const log: Partial<LimitChange>[] = [];
      for (const f of ENGINE_LIMIT_FIELDS) {
        if (e[f] !== fields[f])
          log.push({ engineId: id, subject: 'engine', field: f, oldValue: String(e[f]), newValue: String(fields[f]), changedBy: userId });
      }
      Object.assign(e, fields);
      await m.save(Engine, e);
      if (log.length) await m.insert(LimitChange, log);
      await this.writeParts(m, e, dto, userId, false);
    });
    await this.forgetEngine(id);
    return this.detail(id);
  }

  private engineFields(dto: EngineWriteDto) {
    return {
      name: dto.name.trim(),
      builder: dto.builder.trim(),
      yearBuilt: dto.yearBuilt.trim(),
      type: dto.type,
      ratedSpeedRpm: dto.ratedSpeedRpm,
      overspeedRpm: dto.overspeedRpm,
      mawpPsig: dto.mawpPsig,
      preLubeFreshnessMinutes: dto.preLubeFreshnessMinutes,
      notes: dto.notes ?? '',
      flywheelMassLb: dto.flywheelMassLb ?? null,
      flywheelRadiusOfGyrationFt: dto.flywheelRadiusOfGyrationFt ?? null,
      rotatingWeightLb: dto.rotatingWeightLb ?? null,
      ...(dto.escalateAfterMinutes !== undefined ? { escalateAfterMinutes: dto.escalateAfterMinutes } : {}),
      ...(dto.callList !== undefined ? { callList: [...new Set(dto.callList)] } : {}),
    };
  }

  /**
   * Parts with an id are updated (they must belong to this engine), without one created; omitted parts and points are
   * retired (kept for the records that refer to them). A reference by id (a bearing's lubrication point, a point's
   * bearing or cylinder) must name a part of this engine's new description.
   */
  private async writeParts(m: EntityManager, e: Engine, dto: EngineWriteDto, userId: string, fresh: boolean) {
    const own = async <T extends { id: string }>(cls: new () => T, ids: (string | undefined)[], what: string) => {
      const want = ids.filter((x): x is string => !!x);
      if (!want.length) return new Map<string, T>();
      const rows = (await m.find(cls, { where: { id: In(want), engineId: e.id } as never })) as T[];
      const found = new Map(rows.map((r) => [r.id, r]));
      const missing = want.filter((x) => !found.has(x));
      if (missing.length) throw new BadRequestException(`${what} ${missing.join(', ')} does not belong to this engine.`);
      return found;
    };
    // Lubrication points first: bearings refer to them.
    const lubes = await own(
      LubricationPoint,
      dto.lubricationPoints.map((l) => l.id),
      'lubrication point',
    );
    const savedLubes = await m.save(
      LubricationPoint,
      dto.lubricationPoints.map((l, i) => ({
        ...(l.id ? lubes.get(l.id) : {}),
        engineId: e.id,
        label: l.label.trim(),
        kind: l.kind,
        oilGrade: l.oilGrade.trim(),
        position: i,
        active: true,
      })),
    );
    const lubeByLabel = new Map(savedLubes.map((l) => [l.label, l.id]));
    const cyls = await own(
      Cylinder,
      dto.cylinders.map((c) => c.id),
      'cylinder',
    );
    const savedCyls = await m.save(
      Cylinder,
      dto.cylinders.map((c, i) => ({
        ...(c.id ? cyls.get(c.id) : {}),
        ...c,
        label: c.label.trim(),
        engineId: e.id,
        position: i,
        active: true,
      })),
    );
    const cylByLabel = new Map(savedCyls.map((c) => [c.label, c.id]));
    const refersTo = (ids: Set<string>, id: string | null | undefined, what: string, where: string) => {
      if (id && !ids.has(id)) throw new BadRequestException(`${where}: ${what} ${id} is not one of this engine's ${what}s.`);
      return id ?? null;
    };
    const lubeIds = new Set(savedLubes.map((l) => l.id));
    const cylIds = new Set(savedCyls.map((c) => c.id));
    const bearings = await own(
      Bearing,
      dto.bearings.map((b) => b.id),
      'bearing',
    );
    const savedBearings = await m.save(
      Bearing,
      dto.bearings.map((b, i) => ({
        ...(b.id ? bearings.get(b.id) : {}),
        engineId: e.id,
        label: b.label.trim(),
        kind: b.kind,
        journalDiameterIn: b.journalDiameterIn,
        journalLengthIn: b.journalLengthIn,
        loadSharePercent: b.loadSharePercent,
        radialClearanceIn: b.radialClearanceIn ?? null,
        lubricationPointId: b.lubricationPointLabel
          ? (lubeByLabel.get(b.lubricationPointLabel.trim()) ?? null)
          : refersTo(lubeIds, b.lubricationPointId, 'lubrication point', `bearings.${i}.lubricationPointId`),
        position: i,
        active: true,
      })),
    );
    const bearingByLabel = new Map(savedBearings.map((b) => [b.label, b.id]));
    const bearingIds = new Set(savedBearings.map((b) => b.id));
    const points = await own(
      MeasurementPoint,
      dto.measurementPoints.map((p) => p.id),
      'measurement point',
    );
    const existingByCode = fresh
      ? new Map<string, MeasurementPoint>()
      : new Map((await m.find(MeasurementPoint, { where: { engineId: e.id } })).map((p) => [p.code, p]));
    const log: Partial<LimitChange>[] = [];
    const savedPoints: MeasurementPoint[] = [];
    for (const [i, p] of dto.measurementPoints.entries()) {
      const before = p.id ? points.get(p.id) : existingByCode.get(p.code);
      const next = {
        ...(before ?? {}),
        engineId: e.id,
        code: p.code,
        label: p.label.trim(),
        kind: p.kind,
        unit: p.unit,
        sequence: p.sequence,
        normalLow: p.normalLow ?? null,
        normalHigh: p.normalHigh ?? null,
        lowLimit: p.lowLimit ?? null,
        highLimit: p.highLimit ?? null,
        highHighLimit: p.highHighLimit ?? null,
        maxRiseRatePerMin: p.maxRiseRatePerMin ?? null,
        maxRiseAboveAmbient: p.maxRiseAboveAmbient ?? null,
        deadband: p.deadband ?? null,
        relatedSuppression: p.relatedSuppression ?? before?.relatedSuppression ?? true,
        suppressedInStates: p.suppressedInStates ?? before?.suppressedInStates ?? [],
        bearingId: p.bearingLabel
          ? (bearingByLabel.get(p.bearingLabel.trim()) ?? null)
          : refersTo(bearingIds, p.bearingId, 'bearing', `measurementPoints.${i}.bearingId`),
        cylinderId: p.cylinderLabel
          ? (cylByLabel.get(p.cylinderLabel.trim()) ?? null)
          : refersTo(cylIds, p.cylinderId, 'cylinder', `measurementPoints.${i}.cylinderId`),
        active: true,
      };
      if (before && !fresh) {
        for (const f of POINT_LIMIT_FIELDS) {
          const o = before[f] ?? null;
          const n = next[f] ?? null;
          if (o !== n)
            log.push({
              engineId: e.id,
              subject: `${p.code} ${p.label}`,
              field: f,
              oldValue: o === null ? null : String(o),
              newValue: n === null ? null : String(n),
              changedBy: userId,
            });
        }
      }
      savedPoints.push(await m.save(MeasurementPoint, next));
    }
    if (log.length) await m.insert(LimitChange, log);
    const keepPoints = new Set(savedPoints.map((p) => p.id));
    if (!fresh) {
      const all = await m.find(MeasurementPoint, { where: { engineId: e.id } });
      const retire = all.filter((p) => !keepPoints.has(p.id) && p.active).map((p) => p.id);
      if (retire.length) await m.update(MeasurementPoint, { id: In(retire) }, { active: false });
      const retireParts = async (cls: typeof Cylinder | typeof Bearing | typeof LubricationPoint, keep: { id: string }[]) => {
        const ids = new Set(keep.map((k) => k.id));
        const rows = (await m.find(cls, { where: { engineId: e.id, active: true } })) as { id: string }[];
        const gone = rows.filter((r) => !ids.has(r.id)).map((r) => r.id);
        if (gone.length) await m.update(cls, { id: In(gone) }, { active: false });
      };
      await retireParts(Cylinder, savedCyls);
      await retireParts(Bearing, savedBearings);
      await retireParts(LubricationPoint, savedLubes);
    }
  }

  async limitChanges(engineId: string): Promise<LimitChangeDto[]> {
    await this.get(engineId);
    const rows = await this.changes.find({ where: { engineId }, order: { changedAt: 'DESC' }, take: 500 });
    const names = await this.users.displayNames(rows.map((c) => c.changedBy));
    return rows.map((c) => {
      const num = (v: string | null) => (v !== null && v !== '' && Number.isFinite(Number(v)) ? Number(v) : v);
      return {
        id: c.id,
        engineId: c.engineId,
        subject: c.subject,
        field: c.field,
        oldValue: num(c.oldValue),
        newValue: num(c.newValue),
        changedBy: c.changedBy,
        changedByName: names.get(c.changedBy) ?? 'unknown',
        changedAt: c.changedAt.toISOString(),
      };
    });
  }

  /** The active bearings of some engines (in the engines' order of position), in one read: for lists across engines. */
  async activeBearings(engineIds: string[]): Promise<Map<string, Pick<Bearing, 'id' | 'label' | 'kind'>[]>> {
    const out = new Map<string, Pick<Bearing, 'id' | 'label' | 'kind'>[]>(engineIds.map((id) => [id, []]));
    if (!engineIds.length) return out;
    const rows = await this.db.getRepository(Bearing).find({
      select: { id: true, engineId: true, label: true, kind: true, position: true },
      where: { engineId: In(engineIds), active: true },
      order: { position: 'ASC' },
    });
    for (const b of rows) out.get(b.engineId)?.push({ id: b.id, label: b.label, kind: b.kind });
    return out;
  }

  /** The engine and its active points, for evaluating readings quickly. */
  async withPoints(engineId: string): Promise<EngineWithPoints> {
    const hit = this.cache.get(engineId);
    if (hit) return hit;
    const engine = await this.get(engineId);
    const points = await this.points.find({ where: { engineId }, order: { sequence: 'ASC' } });
    const v = { engine, points };
    this.cache.set(engineId, v);
    return v;
  }

  /**
   * Locks the engine's row for the caller's transaction (a run's change of state: the start and close gates), so
   * changes of one engine's runs follow one another. NO KEY UPDATE: rows that merely refer to the engine (readings,
   * alarms) are still written meanwhile.
   */
  async lockForRunChange(engineId: string, m: EntityManager) {
    await m.query(`SELECT id FROM engines WHERE id = $1 FOR NO KEY UPDATE`, [engineId]);
  }

  async setActiveRun(engineId: string, runId: string | null, m?: EntityManager) {
    await (m ?? this.db.manager).update(Engine, { id: engineId }, { activeRunId: runId });
    await this.forgetEngine(engineId, m);
  }

  async addRunTotals(engineId: string, hours: number, revolutions: number, m?: EntityManager) {
    await (m ?? this.db.manager)
      .createQueryBuilder()
      .update(Engine)
      .set({
        recordedHours: () => `recorded_hours + ${Number(hours) || 0}`,
        recordedRevolutions: () => `recorded_revolutions + ${Number(revolutions) || 0}`,
      })
      .where('id = :engineId', { engineId })
      .execute();
    await this.forgetEngine(engineId, m);
  }
}
