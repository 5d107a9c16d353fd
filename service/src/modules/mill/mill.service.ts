import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, type EntityManager, Repository } from 'typeorm';
import type { MillDto, MillSettings, MillWriteRequest } from '@crankjournal/shared-types';
import { EnginesService } from '../engines/engines.service.js';
import { Mill } from './mill.entity.js';
import { MillStand } from './mill-stand.entity.js';

/** Defaults for a new mill's settings (common practice, no source; every one is a site setting). */
export const DEFAULT_MILL_SETTINGS: MillSettings = {
  minSpeedFraction: 0.9,
  mechanicalEfficiency: 0.88,
  baseLoadHp: 50,
  defaultIndicatedHp: 600,
  frictionFactor: 1.2,
};

/** The engine that drives a mill, as the engines module hands it out. */
export type MillEngine = Awaited<ReturnType<EnginesService['get']>>;

@Injectable()
export class MillService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(Mill) private readonly millRepo: Repository<Mill>,
    private readonly engines: EnginesService,
  ) {}

  async list(): Promise<MillDto[]> {
    const mills = await this.millRepo.find({ relations: { stands: true }, order: { name: 'ASC' } });
    return Promise.all(mills.map((m) => this.toDto(m)));
  }

  async get(id: string): Promise<Mill> {
    const m = await this.millRepo.findOne({ where: { id }, relations: { stands: true } });
    if (!m) throw new NotFoundException('No such mill.');
    m.stands = [...(m.stands ?? [])].sort((a, b) => a.position - b.position);
    return m;
  }

  async detail(id: string): Promise<MillDto> {
    return this.toDto(await this.get(id));
  }

  /** The mill driven by an engine (the first by name if there were several), or null. */
  async forEngine(engineId: string): Promise<Mill | null> {
    const m = await this.millRepo.findOne({ where: { engineId }, relations: { stands: true }, order: { name: 'ASC' } });
    if (m) m.stands = [...(m.stands ?? [])].sort((a, b) => a.position - b.position);
    return m;
  }

  /** The site's first mill (most sites have one), for lots that name none. */
  async first(): Promise<Mill | null> {
    const [m] = await this.millRepo.find({ order: { createdAt: 'ASC' }, take: 1 });
    return m ? this.get(m.id) : null;
  }

  standAt(mill: Mill, position: number): MillStand {
    const s = (mill.stands ?? []).find((x) => x.position === position);
    if (!s)
      throw new BadRequestException(
        `${mill.name} has no stand ${position} (it has ${(mill.stands ?? []).map((x) => x.position).join(', ') || 'none'}).`,
      );
    return s;
  }

  engineOf(mill: Mill): Promise<MillEngine> {
    return this.engines.get(mill.engineId);
  }

  async toDto(m: Mill): Promise<MillDto> {
    const e = await this.engines.get(m.engineId);
    const stands = [...(m.stands ?? [])].sort((a, b) => a.position - b.position);
    return {
      id: m.id,
      name: m.name,
      engineId: m.engineId,
      engineName: e.name,
      engine: {
        ratedSpeedRpm: e.ratedSpeedRpm,
        flywheelMassLb: e.flywheelMassLb,
        flywheelRadiusOfGyrationFt: e.flywheelRadiusOfGyrationFt,
      },
      notes: m.notes,
      stands: stands.map((s) => ({
        id: s.id,
        position: s.position,
        name: s.name,
        rollDiameterMm: s.rollDiameterMm,
        barrelLengthMm: s.barrelLengthMm,
        rollSpeedRatio: s.rollSpeedRatio,
        maxSeparatingForceKn: s.maxSeparatingForceKn,
        notes: s.notes,
      })),
      settings: m.settings,
      quoteRates: m.quoteRates,
      updatedAt: m.updatedAt.toISOString(),
    };
  }

  private validate(dto: MillWriteRequest) {
    const positions = dto.stands.map((s) => s.position);
    if (new Set(positions).size !== positions.length)
      throw new BadRequestException('Two stands have the same position; number them 1, 2, 3 … from the entry side.');
    const labels = dto.quoteRates.fixedCosts.map((f) => f.label.trim().toLowerCase());
    if (new Set(labels).size !== labels.length) throw new BadRequestException('Two fixed costs have the same label.');
  }

  async create(dto: MillWriteRequest): Promise<MillDto> {
    this.validate(dto);
    await this.engines.get(dto.engineId).catch(() => {
      throw new BadRequestException('engineId names no engine.');
    });
    if (await this.millRepo.exists({ where: { name: dto.name.trim() } }))
      throw new ConflictException(`A mill called "${dto.name.trim()}" already exists.`);
    const id = await this.db.transaction(async (m) => {
      const mill = await m.save(
        Mill,
        m.create(Mill, {
          name: dto.name.trim(),
          engineId: dto.engineId,
          notes: dto.notes ?? '',
          settings: { ...dto.settings },
          quoteRates: this.rates(dto),
        }),
      );
      await this.writeStands(m, mill.id, dto);
      return mill.id;
    });
    return this.detail(id);
  }

  async update(id: string, dto: MillWriteRequest): Promise<MillDto> {
    this.validate(dto);
    const cur = await this.get(id);
    await this.engines.get(dto.engineId).catch(() => {
      throw new BadRequestException('engineId names no engine.');
    });
    const clash = await this.millRepo.findOne({ where: { name: dto.name.trim() } });
    if (clash && clash.id !== id) throw new ConflictException(`A mill called "${dto.name.trim()}" already exists.`);
    await this.db.transaction(async (m) => {
      await m.update(
        Mill,
        { id },
        {
          name: dto.name.trim(),
          engineId: dto.engineId,
          notes: dto.notes ?? cur.notes,
          settings: { ...dto.settings },
          quoteRates: this.rates(dto),
        },
      );
      await this.writeStands(m, id, dto);
    });
    return this.detail(id);
  }

  private rates(dto: MillWriteRequest) {
    return { ...dto.quoteRates, fixedCosts: dto.quoteRates.fixedCosts.map((f) => ({ label: f.label.trim(), amount: f.amount })) };
  }

  /** Stands are replaced as a set: listed ones kept (by id, else by position), others removed. */
  private async writeStands(m: EntityManager, millId: string, dto: MillWriteRequest) {
    const existing = await m.find(MillStand, { where: { millId } });
    const byId = new Map(existing.map((s) => [s.id, s]));
    for (const s of dto.stands) if (s.id && !byId.has(s.id)) throw new BadRequestException(`Stand id ${s.id} is not a stand of this mill.`);
    const keepIds = new Set<string>();
    // Free the positions first so that re-numbering stands does not trip the unique (mill, position) index.
    if (existing.length) await m.query(`UPDATE mill_stands SET position = position + 1000 WHERE mill_id = $1`, [millId]);
    for (const s of dto.stands) {
      const match = (s.id && byId.get(s.id)) || existing.find((e) => e.position === s.position && !keepIds.has(e.id));
      const values = {
        millId,
        position: s.position,
        name: s.name.trim(),
        rollDiameterMm: s.rollDiameterMm,
        barrelLengthMm: s.barrelLengthMm,
        rollSpeedRatio: s.rollSpeedRatio,
        maxSeparatingForceKn: s.maxSeparatingForceKn,
        notes: s.notes ?? '',
      };
      if (match) {
        keepIds.add(match.id);
        await m.update(MillStand, { id: match.id }, values);
      } else {
        const saved = await m.save(MillStand, m.create(MillStand, values));
        keepIds.add(saved.id);
      }
    }
    const gone = existing.filter((e) => !keepIds.has(e.id)).map((e) => e.id);
    if (gone.length) await m.delete(MillStand, gone);
  }
}
