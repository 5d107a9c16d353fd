import { BadRequestException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager, In } from 'typeorm';
import type { DueList, InspectionPlanDto, PlanDue } from '@crankjournal/shared-types';
import { DUE_RULE_TEXT, maintenanceDue, resetFromWorkRecord, type MaintenanceDueResult } from '../../calculations/maintenance-due.js';
import { InspectionPlan } from './inspection-plan.entity.js';
import { EngineFactsService, type Counters } from './engine-facts.service.js';
import type { PlanUpdateDto, PlanWriteDto } from './dto/plan.dto.js';

const STATUS_ORDER = { overrun: 0, coming_due: 1, in_hand: 2 } as const;

export function dueToDto(r: MaintenanceDueResult): PlanDue {
  return {
    status: r.status,
    governing: r.governing,
    dueDate: r.dueDate?.toISOString() ?? null,
    dueDateNote: r.dueDateNote,
    criteria: r.criteria.map((c) => ({ ...c, estimatedDueDate: c.estimatedDueDate?.toISOString() ?? null })),
  };
}

/** Inspection plans and what is due: hours, revolutions or calendar, whichever comes first. */
@Injectable()
export class PlansService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly facts: EngineFactsService,
  ) {}

  private repo(m?: EntityManager) {
    return (m ?? this.db.manager).getRepository(InspectionPlan);
  }

  async get(id: string): Promise<InspectionPlan> {
    const p = await this.repo().findOne({ where: { id } });
    if (!p) throw new NotFoundException('No such inspection plan.');
    return p;
  }

  async list(filter: { engineId?: string; bearingId?: string; activeOnly?: boolean } = {}): Promise<InspectionPlanDto[]> {
    const where: Record<string, unknown> = {};
    if (filter.engineId) where.engineId = filter.engineId;
    if (filter.bearingId) where.bearingId = filter.bearingId;
    if (filter.activeOnly) where.active = true;
    const rows = await this.repo().find({ where, order: { title: 'ASC' } });
    return this.toDtos(rows);
  }

  async dto(id: string): Promise<InspectionPlanDto> {
    return (await this.toDtos([await this.get(id)]))[0];
  }

  /** Active plans of every engine (or one), overrun first, then coming due, then by due date. */
  async dueList(engineId?: string): Promise<DueList> {
    const items = await this.list({ engineId, activeOnly: true });
    items.sort(
      (a, b) =>
        STATUS_ORDER[a.due.status] - STATUS_ORDER[b.due.status] ||
        (a.due.dueDate ?? '9999').localeCompare(b.due.dueDate ?? '9999') ||
        a.title.localeCompare(b.title),
    );
    return { items, ruleText: DUE_RULE_TEXT, generatedAt: new Date().toISOString() };
  }

  async toDtos(rows: InspectionPlan[], now = new Date()): Promise<InspectionPlanDto[]> {
    if (!rows.length) return [];
    const names = await this.facts.engineNames();
    const perEngine = new Map<
      string,
      { counters: Counters; rates: { runHoursPerDay: number; revolutionsPerDay: number }; bearings: Map<string, string> }
    >();
    for (const engineId of new Set(rows.map((r) => r.engineId))) {
      const detail = await this.facts.detail(engineId);
      perEngine.set(engineId, {
        counters: { runHours: detail.runningHours, revolutions: detail.revolutions },
        rates: await this.facts.usageRates(engineId, now),
        bearings: new Map(detail.bearings.map((b) => [b.id, b.label])),
      });
    }
    return rows.map((p) => {
      const e = perEngine.get(p.engineId)!;
      // Counters never run backwards; a last-done figure above today's (a mistyped baseline) counts as zero used.
      const current = {
        runHours: Math.max(e.counters.runHours, p.lastDoneRunHours),
        revolutions: Math.max(e.counters.revolutions, p.lastDoneRevolutions),
        now,
      };
      const due = maintenanceDue(
        {
          intervalRunHours: p.intervalRunHours ?? undefined,
          intervalRevolutions: p.intervalRevolutions ?? undefined,
          intervalDays: p.intervalDays ?? undefined,
        },
        { runHours: p.lastDoneRunHours, revolutions: p.lastDoneRevolutions, date: p.lastDoneAt },
        current,
        e.rates,
      );
      return {
        id: p.id,
        engineId: p.engineId,
        engineName: names.get(p.engineId) ?? '',
        componentKind: p.componentKind,
        bearingId: p.bearingId,
        bearingLabel: p.bearingId ? (e.bearings.get(p.bearingId) ?? null) : null,
        componentLabel: p.componentLabel,
        title: p.title,
        inspectionKind: p.inspectionKind,
        intervalRunHours: p.intervalRunHours,
        intervalRevolutions: p.intervalRevolutions,
        intervalDays: p.intervalDays,
        lastDoneAt: p.lastDoneAt.toISOString(),
        lastDoneRunHours: p.lastDoneRunHours,
        lastDoneRevolutions: p.lastDoneRevolutions,
        lastResetByWorkRecordId: p.lastResetByWorkRecordId,
        lastResetByInspectionId: p.lastResetByInspectionId,
        hazards: p.hazards,
        notes: p.notes,
        active: p.active,
        due: dueToDto(due),
      };
    });
  }

  private async checkComponent(engineId: string, bearingId: string | null | undefined): Promise<string | null> {
    const detail = await this.facts.detail(engineId);
    if (!bearingId) return null;
    const b = detail.bearings.find((x) => x.id === bearingId);
    if (!b) throw new BadRequestException('bearingId is not a bearing of this engine.');
    return b.label;
  }

  private checkIntervals(p: { intervalRunHours?: number | null; intervalRevolutions?: number | null; intervalDays?: number | null }) {
    if (p.intervalRunHours == null && p.intervalRevolutions == null && p.intervalDays == null)
      throw new BadRequestException('A plan needs at least one interval: intervalRunHours, intervalRevolutions or intervalDays.');
  }

  private lastDone(at: string | undefined): Date {
    const d = at ? new Date(at) : new Date();
    if (d.getTime() > Date.now() + 5 * 60_000) throw new BadRequestException('lastDoneAt must not be in the future.');
    return d;
  }

  async create(dto: PlanWriteDto, userId: string): Promise<InspectionPlanDto> {
    await this.facts.summary(dto.engineId);
    this.checkIntervals(dto);
    const bearingLabel = await this.checkComponent(dto.engineId, dto.bearingId);
    const lastDoneAt = this.lastDone(dto.lastDoneAt);
    const counters = await this.facts.countersAt(dto.engineId, lastDoneAt);
    const saved = await this.repo().save(
      this.repo().create({
        engineId: dto.engineId,
        componentKind: dto.componentKind,
        bearingId: dto.bearingId ?? null,
        componentLabel: dto.componentLabel?.trim() || bearingLabel || dto.title.trim(),
        title: dto.title.trim(),
        inspectionKind: dto.inspectionKind,
        intervalRunHours: dto.intervalRunHours ?? null,
        intervalRevolutions: dto.intervalRevolutions ?? null,
        intervalDays: dto.intervalDays ?? null,
        lastDoneAt,
        lastDoneRunHours: counters.runHours,
        lastDoneRevolutions: counters.revolutions,
        lastResetByWorkRecordId: null,
        lastResetByInspectionId: null,
        hazards: [...new Set(dto.hazards ?? [])],
        notes: dto.notes ?? '',
        active: dto.active ?? true,
        createdBy: userId,
      }),
    );
    return this.dto(saved.id);
  }

  async update(id: string, dto: PlanUpdateDto): Promise<InspectionPlanDto> {
    const p = await this.get(id);
    const next = {
      intervalRunHours: dto.intervalRunHours !== undefined ? dto.intervalRunHours : p.intervalRunHours,
      intervalRevolutions: dto.intervalRevolutions !== undefined ? dto.intervalRevolutions : p.intervalRevolutions,
      intervalDays: dto.intervalDays !== undefined ? dto.intervalDays : p.intervalDays,
    };
    this.checkIntervals(next);
    Object.assign(p, next);
    if (dto.bearingId !== undefined) {
      await this.checkComponent(p.engineId, dto.bearingId);
      p.bearingId = dto.bearingId ?? null;
    }
    if (dto.componentKind !== undefined) p.componentKind = dto.componentKind;
    if (dto.componentLabel !== undefined) p.componentLabel = dto.componentLabel.trim() || p.componentLabel;
    if (dto.title !== undefined) p.title = dto.title.trim();
    if (dto.inspectionKind !== undefined) p.inspectionKind = dto.inspectionKind;
    if (dto.hazards !== undefined) p.hazards = [...new Set(dto.hazards)];
    if (dto.notes !== undefined) p.notes = dto.notes;
    if (dto.active !== undefined) p.active = dto.active;
    if (dto.lastDoneAt !== undefined) {
      // Correcting when it was last done: the counters are taken from the run log at that date.
      p.lastDoneAt = this.lastDone(dto.lastDoneAt);
      const c = await this.facts.countersAt(p.engineId, p.lastDoneAt);
      p.lastDoneRunHours = c.runHours;
      p.lastDoneRevolutions = c.revolutions;
      p.lastResetByWorkRecordId = null;
      p.lastResetByInspectionId = null;
    }
    await this.repo().save(p);
    return this.dto(id);
  }

  /** Plans of an engine by id; 400 naming any that is not one of its plans. */
  async ofEngine(engineId: string, ids: string[], m?: EntityManager): Promise<InspectionPlan[]> {
    if (!ids.length) return [];
    const rows = await this.repo(m).find({ where: { id: In(ids), engineId } });
    const missing = ids.filter((x) => !rows.some((r) => r.id === x));
    if (missing.length) throw new BadRequestException(`Not an inspection plan of this engine: ${missing.join(', ')}.`);
    return rows;
  }

  /**
   * Resets plans to "last done" at a completion (resetFromWorkRecord). A plan already reset by something done
   * later is left alone. Returns the ids of the plans reset.
   */
  async reset(
    m: EntityManager,
    plans: InspectionPlan[],
    completion: { completedAt: Date; counters: Counters; workRecordId?: string; inspectionId?: string },
  ): Promise<string[]> {
    const last = resetFromWorkRecord({
      completedAt: completion.completedAt,
      runHoursAtCompletion: completion.counters.runHours,
      revolutionsAtCompletion: completion.counters.revolutions,
    });
    const done: string[] = [];
    for (const p of plans) {
      if (p.lastDoneAt.getTime() > last.date.getTime()) continue;
      await m.update(
        InspectionPlan,
        { id: p.id },
        {
          lastDoneAt: last.date,
          lastDoneRunHours: last.runHours,
          lastDoneRevolutions: last.revolutions,
          lastResetByWorkRecordId: completion.workRecordId ?? null,
          lastResetByInspectionId: completion.inspectionId ?? null,
        },
      );
      done.push(p.id);
    }
    return done;
  }

  async titles(ids: string[]): Promise<Map<string, string>> {
    if (!ids.length) return new Map();
    const rows = await this.repo().find({ where: { id: In(ids) } });
    return new Map(rows.map((r) => [r.id, r.title]));
  }
}
