import { BadRequestException, HttpException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, In, Repository } from 'typeorm';
import type {
  ScheduleCopyRequest,
  ScheduleDetail,
  SchedulePassDto,
  ScheduleSummary,
  ScheduleWriteRequest,
} from '@crankjournal/shared-types';
import { barLengthM, sectionAreaMm2 } from '../../calculations/rolling.js';
import { UsersService } from '../users/users.service.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { CalculationInputError } from '../../calculations/errors.js';
import { PassSchedule } from './pass-schedule.entity.js';
import { SchedulePass } from './schedule-pass.entity.js';
import { CustomerLot } from './customer-lot.entity.js';
import type { Mill } from './mill.entity.js';
import { MillService, type MillEngine } from './mill.service.js';
import { calculatePass, passErrorMessage } from './pass-calculation.js';

/** What a plan assumes where the run will tell the truth later. */
function planAssumptions(mill: Mill, engine: MillEngine): string[] {
  const a = [
    `Each pass starts at the engine's rated speed, ${engine.ratedSpeedRpm} rpm (roll speed = engine speed × the stand's ratio).`,
    `Indicated power ${mill.settings.defaultIndicatedHp} hp (site setting), ` +
      `mechanical efficiency ${Math.round(mill.settings.mechanicalEfficiency * 100)} %, base load ${mill.settings.baseLoadHp} hp.`,
    `The flywheel supplies the whole pass; a warning below ${Math.round(mill.settings.minSpeedFraction * 100)} % of rated speed.`,
    `Roll force allows ${Math.round((mill.settings.frictionFactor - 1) * 100)} % for friction; ` +
      'grooved passes use the nominal roll diameter.',
  ];
  if (engine.flywheelMassLb === null || engine.flywheelRadiusOfGyrationFt === null)
    a.push(`${engine.name} has no flywheel mass or radius of gyration recorded: the flywheel check is left out.`);
  return a;
}

@Injectable()
export class SchedulesService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(CustomerLot) private readonly customerLotRepo: Repository<CustomerLot>,
    @InjectRepository(PassSchedule) private readonly passScheduleRepo: Repository<PassSchedule>,
    private readonly mills: MillService,
    private readonly users: UsersService,
  ) {}

  async getEntity(id: string): Promise<PassSchedule> {
    const s = await this.passScheduleRepo.findOne({ where: { id }, relations: { passes: true } });
    if (!s) throw new NotFoundException('No such pass schedule.');
    s.passes = [...(s.passes ?? [])].sort((a, b) => a.seq - b.seq);
    return s;
  }

  async list(filter: { millId?: string; templates?: boolean }): Promise<ScheduleSummary[]> {
    const where: Record<string, unknown> = {};
    if (filter.millId) where.millId = filter.millId;
    if (filter.templates !== undefined) where.isTemplate = filter.templates;
    const rows = await this.passScheduleRepo.find({ where, relations: { passes: true }, order: { isTemplate: 'DESC', name: 'ASC' } });
    const details = await this.build(rows);
    return details.map(({ passes, notes, totalElongation, finalLengthM, assumptions, createdByName, createdAt, ...summary }) => summary);
  }

  async detail(id: string): Promise<ScheduleDetail> {
    const [d] = await this.build([await this.getEntity(id)]);
    return d;
  }

  /** Summaries and passes with their calculations, for a set of schedules. */
  private async build(rows: PassSchedule[]): Promise<ScheduleDetail[]> {
    if (!rows.length) return [];
    const millCache = new Map<string, { mill: Mill; engine: MillEngine }>();
    const lotIds = [...new Set(rows.map((r) => r.lotId).filter((x): x is string => !!x))];
    const lots = lotIds.length ? await this.customerLotRepo.find({ where: { id: In(lotIds) } }) : [];
    const lotRef = new Map(lots.map((l) => [l.id, l.reference]));
    const templateIds = [...new Set(rows.map((r) => r.templateId).filter((x): x is string => !!x))];
    const templates = templateIds.length ? await this.passScheduleRepo.find({ where: { id: In(templateIds) } }) : [];
    const templateName = new Map(templates.map((t) => [t.id, t.name]));
    const userName = await this.users.displayNames(rows.map((r) => r.createdBy));
    const out: ScheduleDetail[] = [];
    for (const s of rows) {
      let ctx = millCache.get(s.millId);
      if (!ctx) {
        const mill = await this.mills.get(s.millId);
        ctx = { mill, engine: await this.mills.engineOf(mill) };
        millCache.set(s.millId, ctx);
      }
      const { mill, engine } = ctx;
      const passes = [...(s.passes ?? [])].sort((a, b) => a.seq - b.seq).map((p) => this.passDto(s, p, mill, engine));
      const stockArea = sectionAreaMm2(s.stock);
      const last = passes[passes.length - 1];
      const finalArea = last ? sectionAreaMm2(last.exit) : null;
      out.push({
        id: s.id,
        millId: s.millId,
        millName: mill.name,
        name: s.name,
        isTemplate: s.isTemplate,
        archived: s.archived,
        productShape: s.productShape,
        productHeightMm: s.productHeightMm,
        productWidthMm: s.productWidthMm,
        steelGrade: s.steelGrade,
        carbonPct: s.carbonPct,
        stock: s.stock,
        stockLengthMm: s.stockLengthMm,
        passCount: passes.length,
        flaggedPasses: passes.filter((p) => p.calcError || (p.calc?.warnings.length ?? 0) > 0).length,
        templateId: s.templateId,
        templateName: s.templateId ? (templateName.get(s.templateId) ?? null) : null,
        lotId: s.lotId,
        lotReference: s.lotId ? (lotRef.get(s.lotId) ?? null) : null,
        updatedAt: s.updatedAt.toISOString(),
        notes: s.notes,
        passes,
        totalElongation: finalArea ? stockArea / finalArea : null,
        finalLengthM: finalArea ? barLengthM(s.stockLengthMm / 1000, stockArea, finalArea) : null,
        assumptions: planAssumptions(mill, engine),
        createdByName: userName.get(s.createdBy) ?? 'unknown',
        createdAt: s.createdAt.toISOString(),
      });
    }
    return out;
  }

  private passDto(s: PassSchedule, p: SchedulePass, mill: Mill, engine: MillEngine): SchedulePassDto {
    const stand = (mill.stands ?? []).find((x) => x.position === p.standPosition);
    const base = {
      id: p.id,
      seq: p.seq,
      standPosition: p.standPosition,
      standName: stand?.name ?? `Stand ${p.standPosition} (not in ${mill.name})`,
      entry: p.entry,
      exit: p.exit,
      expectedTemperatureC: p.expectedTemperatureC,
      notes: p.notes,
    };
    if (!stand) return { ...base, calc: null, calcError: `${mill.name} has no stand ${p.standPosition}.` };
    try {
      const hasFlywheel = engine.flywheelMassLb !== null && engine.flywheelRadiusOfGyrationFt !== null;
      const calc = calculatePass({
        rollDiameterMm: stand.rollDiameterMm,
        entry: p.entry,
        exit: p.exit,
        temperatureC: p.expectedTemperatureC,
        carbonPct: s.carbonPct,
        rollSpeedRpm: engine.ratedSpeedRpm * stand.rollSpeedRatio,
        standMaxForceKn: stand.maxSeparatingForceKn,
        frictionFactor: mill.settings.frictionFactor,
        flywheel: hasFlywheel
          ? {
              flywheelMassLb: engine.flywheelMassLb!,
              flywheelRadiusOfGyrationFt: engine.flywheelRadiusOfGyrationFt!,
              engineSpeedRpm: engine.ratedSpeedRpm,
              startSpeedSource: 'rated speed (plan)',
              ratedSpeedRpm: engine.ratedSpeedRpm,
              minSpeedFraction: mill.settings.minSpeedFraction,
              barExitLengthM: barLengthM(s.stockLengthMm / 1000, sectionAreaMm2(s.stock), sectionAreaMm2(p.exit)),
              indicatedHp: mill.settings.defaultIndicatedHp,
              indicatedHpSource: 'site setting (default indicated hp)',
              mechanicalEfficiency: mill.settings.mechanicalEfficiency,
              baseLoadHp: mill.settings.baseLoadHp,
            }
          : null,
      });
      return { ...base, calc, calcError: null };
    } catch (e) {
      if (e instanceof CalculationInputError) return { ...base, calc: null, calcError: passErrorMessage(e) };
      if (e instanceof HttpException)
        return { ...base, calc: null, calcError: String((e.getResponse() as { message?: string }).message ?? e.message) };
      throw e;
    }
  }

  private async assertRefs(dto: { millId: string; lotId?: string | null; passes: { standPosition: number }[] }): Promise<Mill> {
    const mill = await this.mills.get(dto.millId).catch(() => {
      throw new BadRequestException('millId names no mill.');
    });
    const positions = new Set((mill.stands ?? []).map((s) => s.position));
    const missing = [...new Set(dto.passes.map((p) => p.standPosition).filter((p) => !positions.has(p)))];
    if (missing.length)
      throw new BadRequestException(`${mill.name} has no stand ${missing.join(', ')}; its stands are ${[...positions].sort().join(', ')}.`);
    if (dto.lotId && !(await this.customerLotRepo.exists({ where: { id: dto.lotId } })))
      throw new BadRequestException('lotId names no customer lot.');
    return mill;
  }

  async create(dto: ScheduleWriteRequest, user: AuthUser, templateId: string | null = null): Promise<ScheduleDetail> {
    await this.assertRefs(dto);
    const id = await this.db.transaction(async (m) => {
      const s = await m.save(
        PassSchedule,
        m.create(PassSchedule, {
          millId: dto.millId,
          name: dto.name.trim(),
          isTemplate: dto.isTemplate,
          archived: dto.archived ?? false,
          productShape: dto.productShape,
          productHeightMm: dto.productHeightMm,
          productWidthMm: dto.productWidthMm,
          steelGrade: dto.steelGrade.trim(),
          carbonPct: dto.carbonPct,
          stock: { ...dto.stock },
          stockLengthMm: dto.stockLengthMm,
          templateId,
          lotId: dto.lotId ?? null,
          notes: dto.notes ?? '',
          createdBy: user.id,
        }),
      );
      await m.insert(
        SchedulePass,
        dto.passes.map((p, i) => this.passRow(s.id, i + 1, p)),
      );
      return s.id;
    });
    return this.detail(id);
  }

  private passRow(scheduleId: string, seq: number, p: ScheduleWriteRequest['passes'][number]) {
    return {
      scheduleId,
      seq,
      standPosition: p.standPosition,
      entry: { ...p.entry },
      exit: { ...p.exit },
      expectedTemperatureC: p.expectedTemperatureC,
      notes: p.notes ?? '',
    };
  }

  async update(id: string, dto: ScheduleWriteRequest): Promise<ScheduleDetail> {
    const cur = await this.getEntity(id);
    await this.assertRefs(dto);
    await this.db.transaction(async (m) => {
      await m.update(
        PassSchedule,
        { id },
        {
          millId: dto.millId,
          name: dto.name.trim(),
          isTemplate: dto.isTemplate,
          archived: dto.archived ?? cur.archived,
          productShape: dto.productShape,
          productHeightMm: dto.productHeightMm,
          productWidthMm: dto.productWidthMm,
          steelGrade: dto.steelGrade.trim(),
          carbonPct: dto.carbonPct,
          stock: { ...dto.stock },
          stockLengthMm: dto.stockLengthMm,
          lotId: dto.lotId === undefined ? cur.lotId : dto.lotId,
          notes: dto.notes ?? cur.notes,
        },
      );
      await m.delete(SchedulePass, { scheduleId: id });
      await m.insert(
        SchedulePass,
        dto.passes.map((p, i) => this.passRow(id, i + 1, p)),
      );
    });
    return this.detail(id);
  }

  /** A new schedule planned from a template (or any schedule): same product, stock and passes. */
  async copy(id: string, dto: ScheduleCopyRequest, user: AuthUser): Promise<ScheduleDetail> {
    const src = await this.getEntity(id);
    return this.create(
      {
        millId: dto.millId ?? src.millId,
        name: dto.name,
        isTemplate: dto.isTemplate ?? false,
        productShape: src.productShape,
        productHeightMm: src.productHeightMm,
        productWidthMm: src.productWidthMm,
        steelGrade: src.steelGrade,
        carbonPct: src.carbonPct,
        stock: src.stock,
        stockLengthMm: src.stockLengthMm,
        lotId: dto.lotId ?? null,
        notes: src.notes,
        passes: (src.passes ?? []).map((p) => ({
          standPosition: p.standPosition,
          entry: p.entry,
          exit: p.exit,
          expectedTemperatureC: p.expectedTemperatureC,
          notes: p.notes,
        })),
      },
      user,
      src.id,
    );
  }
}
