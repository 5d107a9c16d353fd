import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, Repository } from 'typeorm';
import type { WorkRecordDto, WorkRecordSummary } from '@crankjournal/shared-types';
import { AlarmsService } from '../alarms/alarms.service.js';
import { WorkRecord } from './work-record.entity.js';
import { Inspection } from './inspection.entity.js';
import { EngineFactsService } from './engine-facts.service.js';
import { PlansService } from './plans.service.js';
import { workSummary } from './inspections.service.js';
import type { CloseWorkRecordDto, WorkRecordCreateDto, WorkRecordUpdateDto } from './dto/work-record.dto.js';

const FUTURE_SLACK_MS = 5 * 60_000;

/** Work done on the engine; closing a record can reset the counters of the plans it satisfies. */
@Injectable()
export class WorkRecordsService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(Inspection) private readonly inspectionRepo: Repository<Inspection>,
    @InjectRepository(WorkRecord) private readonly workRecordRepo: Repository<WorkRecord>,
    private readonly facts: EngineFactsService,
    private readonly plans: PlansService,
    private readonly alarms: AlarmsService,
  ) {}

  async get(id: string): Promise<WorkRecord> {
    const w = await this.workRecordRepo.findOne({ where: { id } });
    if (!w) throw new NotFoundException('No such work record.');
    return w;
  }

  private async bearingLabels(engineIds: string[]): Promise<Map<string, string>> {
    const out = new Map<string, string>();
    for (const id of new Set(engineIds)) for (const b of (await this.facts.detail(id)).bearings) out.set(b.id, b.label);
    return out;
  }

  async list(filter: { engineId?: string; bearingId?: string; status?: 'open' | 'closed' }): Promise<WorkRecordSummary[]> {
    const where: Record<string, unknown> = {};
    if (filter.engineId) where.engineId = filter.engineId;
    if (filter.bearingId) where.bearingId = filter.bearingId;
    if (filter.status) where.status = filter.status;
    const rows = await this.workRecordRepo.find({ where, order: { startedAt: 'DESC' }, take: 500 });
    const labels = await this.bearingLabels(rows.map((r) => r.engineId));
    return rows.map((w) => workSummary(w, w.bearingId ? (labels.get(w.bearingId) ?? null) : null));
  }

  /** Work on a bearing, oldest first (for its history). */
  async ofBearing(bearingId: string, bearingLabel: string): Promise<WorkRecordSummary[]> {
    const rows = await this.workRecordRepo.find({ where: { bearingId }, order: { startedAt: 'ASC' } });
    return rows.map((w) => workSummary(w, bearingLabel));
  }

  async detail(id: string): Promise<WorkRecordDto> {
    const w = await this.get(id);
    const labels = await this.bearingLabels([w.engineId]);
    const names = await this.facts.userNames();
    const engineNames = await this.facts.engineNames();
    const titles = await this.plans.titles([...new Set([...w.satisfiesPlanIds, ...w.resetPlanIds])]);
    const inspection = w.promptedByInspectionId ? await this.inspectionRepo.findOne({ where: { id: w.promptedByInspectionId } }) : null;
    const alarm = w.promptedByAlarmId ? await this.alarms.get(w.promptedByAlarmId).catch(() => null) : null;
    return {
      ...workSummary(w, w.bearingId ? (labels.get(w.bearingId) ?? null) : null),
      engineName: engineNames.get(w.engineId) ?? '',
      description: w.description,
      performedBy: w.performedBy,
      parts: w.parts,
      labourHours: w.labourHours,
      recordedByName: names.get(w.recordedBy) ?? 'unknown',
      promptedByInspectionTitle: inspection?.title ?? null,
      promptedByAlarmMessage: alarm?.message ?? null,
      satisfiesPlanIds: w.satisfiesPlanIds,
      satisfiesPlans: w.satisfiesPlanIds.map((p) => ({ id: p, title: titles.get(p) ?? 'plan removed' })),
      closedByName: w.closedBy ? (names.get(w.closedBy) ?? 'unknown') : null,
      closeNote: w.closeNote,
      runHoursAtCompletion: w.runHoursAtCompletion,
      revolutionsAtCompletion: w.revolutionsAtCompletion,
      resetPlans: w.resetPlanIds.map((p) => ({ id: p, title: titles.get(p) ?? 'plan removed' })),
      createdAt: w.createdAt.toISOString(),
    };
  }

  /** Checks the links of a record against its engine (bearing, inspection, alarm, plans). */
  private async checkLinks(engineId: string, dto: WorkRecordUpdateDto) {
    const engine = await this.facts.detail(engineId);
    if (dto.bearingId && !engine.bearings.some((b) => b.id === dto.bearingId))
      throw new BadRequestException('bearingId is not a bearing of this engine.');
    if (dto.promptedByInspectionId) {
      const i = await this.inspectionRepo.findOne({ where: { id: dto.promptedByInspectionId } });
      if (!i || i.engineId !== engineId) throw new BadRequestException('promptedByInspectionId is not an inspection of this engine.');
    }
    if (dto.promptedByAlarmId) {
      const a = await this.alarms.get(dto.promptedByAlarmId).catch(() => null);
      if (!a || a.engineId !== engineId) throw new BadRequestException('promptedByAlarmId is not an alarm of this engine.');
    }
    if (dto.satisfiesPlanIds?.length) await this.plans.ofEngine(engineId, dto.satisfiesPlanIds);
    if (dto.startedAt && new Date(dto.startedAt).getTime() > Date.now() + FUTURE_SLACK_MS)
      throw new BadRequestException('startedAt must not be in the future.');
  }

  /** Marks follow-up actions of the prompting inspection as carried out by this work record. */
  private async linkFollowUps(workId: string, inspectionId: string | null, indexes: number[] | undefined) {
    if (!indexes?.length) return;
    if (!inspectionId) throw new BadRequestException('followUpActionIndexes needs promptedByInspectionId.');
    await this.db.transaction(async (m) => {
      const insp = await m.findOne(Inspection, { where: { id: inspectionId }, lock: { mode: 'pessimistic_write' } });
      if (!insp) throw new BadRequestException('promptedByInspectionId is not an inspection.');
      const bad = indexes.filter((i) => i < 0 || i >= insp.followUpActions.length);
      if (bad.length)
        throw new BadRequestException(
          `followUpActionIndexes ${bad.join(', ')} is not a follow-up action of that inspection (it has ${insp.followUpActions.length}).`,
        );
      insp.followUpActions = insp.followUpActions.map((a, i) => (indexes.includes(i) ? { ...a, workRecordId: workId } : a));
      await m.save(Inspection, insp);
    });
  }

  async create(dto: WorkRecordCreateDto, userId: string): Promise<WorkRecordDto> {
    await this.facts.summary(dto.engineId);
    await this.checkLinks(dto.engineId, dto);
    if (dto.followUpActionIndexes?.length && !dto.promptedByInspectionId)
      throw new BadRequestException('followUpActionIndexes needs promptedByInspectionId.');
    const saved = await this.workRecordRepo.save(
      this.workRecordRepo.create({
        engineId: dto.engineId,
        bearingId: dto.bearingId ?? null,
        title: dto.title.trim(),
        description: dto.description ?? '',
        performedBy: dto.performedBy.trim(),
        parts: (dto.parts ?? []).map((p) => ({ description: p.description.trim(), quantity: p.quantity, unit: p.unit.trim() })),
        labourHours: dto.labourHours ?? 0,
        promptedByInspectionId: dto.promptedByInspectionId ?? null,
        promptedByAlarmId: dto.promptedByAlarmId ?? null,
        hazards: [...new Set(dto.hazards ?? [])],
        satisfiesPlanIds: [...new Set(dto.satisfiesPlanIds ?? [])],
        status: 'open',
        startedAt: dto.startedAt ? new Date(dto.startedAt) : new Date(),
        recordedBy: userId,
      }),
    );
    await this.linkFollowUps(saved.id, saved.promptedByInspectionId, dto.followUpActionIndexes);
    return this.detail(saved.id);
  }

  /** An open record may be completed or corrected; a closed one is part of the record. */
  async update(id: string, dto: WorkRecordUpdateDto): Promise<WorkRecordDto> {
    const w = await this.get(id);
    if (w.status === 'closed') throw new ConflictException('This work record is closed and can no longer be changed.');
    await this.checkLinks(w.engineId, dto);
    if (dto.bearingId !== undefined) w.bearingId = dto.bearingId ?? null;
    if (dto.title !== undefined) w.title = dto.title.trim();
    if (dto.description !== undefined) w.description = dto.description;
    if (dto.performedBy !== undefined) w.performedBy = dto.performedBy.trim();
    if (dto.parts !== undefined)
      w.parts = dto.parts.map((p) => ({ description: p.description.trim(), quantity: p.quantity, unit: p.unit.trim() }));
    if (dto.labourHours !== undefined) w.labourHours = dto.labourHours;
    if (dto.promptedByInspectionId !== undefined) w.promptedByInspectionId = dto.promptedByInspectionId ?? null;
    if (dto.promptedByAlarmId !== undefined) w.promptedByAlarmId = dto.promptedByAlarmId ?? null;
    if (dto.hazards !== undefined) w.hazards = [...new Set(dto.hazards)];
    if (dto.startedAt !== undefined) w.startedAt = new Date(dto.startedAt);
    if (dto.satisfiesPlanIds !== undefined) w.satisfiesPlanIds = [...new Set(dto.satisfiesPlanIds)];
    await this.workRecordRepo.save(w);
    await this.linkFollowUps(id, w.promptedByInspectionId, dto.followUpActionIndexes);
    return this.detail(id);
  }

  /**
   * Closes the record: completion time and the engine's counters then are kept, and the plans it satisfies
   * (or those named) are reset to it, so their intervals start again from this work.
   */
  async close(id: string, dto: CloseWorkRecordDto, userId: string): Promise<WorkRecordDto> {
    const w0 = await this.get(id);
    if (w0.status === 'closed') throw new ConflictException('This work record is already closed.');
    const completedAt = dto.completedAt ? new Date(dto.completedAt) : new Date();
    if (completedAt.getTime() > Date.now() + FUTURE_SLACK_MS) throw new BadRequestException('completedAt must not be in the future.');
    if (completedAt.getTime() < w0.startedAt.getTime()) throw new BadRequestException('completedAt must not be before the work started.');
    const resetIds = [...new Set(dto.resetPlanIds ?? w0.satisfiesPlanIds)];
    const counters = await this.facts.countersAt(w0.engineId, completedAt);
    await this.db.transaction(async (m) => {
      const cur = await m.findOne(WorkRecord, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!cur || cur.status === 'closed') throw new ConflictException('Someone closed this work record a moment ago.');
      const plans = await this.plans.ofEngine(cur.engineId, resetIds, m);
      const reset = await this.plans.reset(m, plans, { completedAt, counters, workRecordId: id });
      cur.status = 'closed';
      cur.closedAt = completedAt;
      cur.closedBy = userId;
      cur.closeNote = dto.note?.trim() || null;
      cur.runHoursAtCompletion = counters.runHours;
      cur.revolutionsAtCompletion = counters.revolutions;
      cur.resetPlanIds = reset;
      cur.satisfiesPlanIds = [...new Set([...cur.satisfiesPlanIds, ...resetIds])];
      await m.save(WorkRecord, cur);
    });
    return this.detail(id);
  }
}
