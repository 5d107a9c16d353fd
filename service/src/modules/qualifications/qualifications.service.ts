import { BadRequestException, ConflictException, ForbiddenException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, Repository, IsNull, type EntityManager } from 'typeorm';
import {
  DUTIES,
  QUALIFICATION_EXPIRY_WARNING_DAYS,
  ROLE_LABELS,
  type Duty,
  type QualificationDto,
  type QualificationMatrix,
  type QualificationMatrixRow,
} from '@crankjournal/shared-types';
import { EnginesService } from '../engines/engines.service.js';
import { UsersService } from '../users/users.service.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import {
  daysBetween,
  isQualified,
  qualificationProblem,
  qualificationStatus,
  utcDateOf,
  type QualificationFinding,
} from './qualification-rules.js';
import { Qualification } from './qualification.entity.js';
import type { GrantQualificationDto, RenewQualificationDto } from './dto/qualification.dto.js';

/** Roles that carry out duties on the engine (observers only read). */
const CREW_ROLES = ['chief_engineer', 'operator', 'maintenance_lead', 'mill_lead', 'administrator'] as const;

@Injectable()
export class QualificationsService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(Qualification) private readonly qualificationRepo: Repository<Qualification>,
    private readonly engines: EnginesService,
    private readonly users: UsersService,
  ) {}

  private names(ids: (string | null | undefined)[]): Promise<Map<string, string>> {
    return this.users.displayNames(ids);
  }

  private async toDtos(rows: Qualification[], today = utcDateOf(new Date())): Promise<QualificationDto[]> {
    const name = await this.names(rows.flatMap((q) => [q.userId, q.grantedBy, q.withdrawnBy]));
    const engineNames = new Map((await this.engines.list()).map((e) => [e.id, e.name]));
    return rows.map((q) => ({
      id: q.id,
      userId: q.userId,
      userName: name.get(q.userId) ?? 'unknown',
      engineId: q.engineId,
      engineName: engineNames.get(q.engineId) ?? '',
      duty: q.duty,
      grantedOn: q.grantedOn,
      expiresOn: q.expiresOn,
      notes: q.notes,
      status: qualificationStatus(q, today),
      daysToExpiry: daysBetween(today, q.expiresOn),
      grantedByName: name.get(q.grantedBy) ?? 'unknown',
      grantedAt: q.createdAt.toISOString(),
      updatedAt: q.updatedAt.toISOString(),
      withdrawnAt: q.withdrawnAt?.toISOString() ?? null,
      withdrawnByName: q.withdrawnBy ? (name.get(q.withdrawnBy) ?? 'unknown') : null,
      withdrawnReason: q.withdrawnReason,
    }));
  }

  /** Where a person stands for a duty on an engine now: the standing qualification, else the latest withdrawn one. */
  async finding(
    userId: string,
    engineId: string,
    duty: Duty,
    at = new Date(),
  ): Promise<QualificationFinding & { qualificationId: string | null }> {
    const repo = this.qualificationRepo;
    const standing = await repo.findOne({ where: { userId, engineId, duty, withdrawnAt: IsNull() } });
    const q = standing ?? (await repo.findOne({ where: { userId, engineId, duty }, order: { withdrawnAt: 'DESC' } }));
    if (!q) return { status: 'none', qualificationId: null };
    return {
      status: qualificationStatus(q, utcDateOf(at)),
      grantedOn: q.grantedOn,
      expiresOn: q.expiresOn,
      withdrawnAt: q.withdrawnAt,
      qualificationId: q.id,
    };
  }

  /** What keeps a person from a duty on an engine at a time, in words naming them as `who`; null when qualified. */
  async problemOf(userId: string, engineId: string, duty: Duty, engineName: string, who: string, at = new Date()): Promise<string | null> {
    const f = await this.finding(userId, engineId, duty, at);
    return isQualified(f.status) ? null : (qualificationProblem(f, duty, engineName, who)?.message ?? null);
  }

  /** The id of the current qualification that allows the duty, or a 403 with what is missing, in words. */
  async assertQualified(user: Pick<AuthUser, 'id'>, engineId: string, duty: Duty, toDo: string): Promise<string> {
    const f = await this.finding(user.id, engineId, duty);
    if (isQualified(f.status) && f.qualificationId) return f.qualificationId;
    const engine = await this.engines.get(engineId);
    const p = qualificationProblem(f, duty, engine.name)!;
    throw new ForbiddenException({
      statusCode: 403,
      error: 'Forbidden',
      message: `${p.message} It is needed to ${toDo}.`,
      details: { code: p.code, duty, engineId },
    });
  }

  async list(filter: { userId?: string; engineId?: string; includeWithdrawn?: boolean }): Promise<QualificationDto[]> {
    const where: Record<string, unknown> = {};
    if (filter.userId) where.userId = filter.userId;
    if (filter.engineId) where.engineId = filter.engineId;
    if (!filter.includeWithdrawn) where.withdrawnAt = IsNull();
    const rows = await this.qualificationRepo.find({ where, order: { expiresOn: 'ASC' }, take: 2000 });
    return this.toDtos(rows);
  }

  /** A person's own qualifications, standing ones first, then the withdrawn history. */
  async mine(userId: string): Promise<QualificationDto[]> {
    const rows = await this.qualificationRepo.find({ where: { userId }, order: { createdAt: 'DESC' } });
    const dtos = await this.toDtos(rows);
    return [
      ...dtos.filter((d) => !d.withdrawnAt).sort((a, b) => a.expiresOn.localeCompare(b.expiresOn)),
      ...dtos.filter((d) => d.withdrawnAt),
    ];
  }

  async matrix(engineId: string): Promise<QualificationMatrix> {
    const engine = await this.engines.get(engineId);
    const today = utcDateOf(new Date());
    const crew = (await this.users.crew()).filter((u) => (CREW_ROLES as readonly string[]).includes(u.role));
    const rows = await this.qualificationRepo.find({ where: { engineId, withdrawnAt: IsNull() } });
    const dtos = await this.toDtos(rows, today);
    const byUser = new Map<string, QualificationDto[]>();
    for (const d of dtos) byUser.set(d.userId, [...(byUser.get(d.userId) ?? []), d]);
    const matrixRows: QualificationMatrixRow[] = crew.map((u) => {
      const mine = byUser.get(u.id) ?? [];
      const cells = Object.fromEntries(DUTIES.map((duty) => [duty, mine.find((d) => d.duty === duty) ?? null])) as Record<
        Duty,
        QualificationDto | null
      >;
      return { userId: u.id, displayName: u.displayName, role: u.role, cells };
    });
    const attention = dtos
      .filter((d) => d.status === 'expiring_soon' || d.status === 'expired')
      .sort((a, b) => a.expiresOn.localeCompare(b.expiresOn));
    return {
      engineId,
      engineName: engine.name,
      today,
      warningDays: QUALIFICATION_EXPIRY_WARNING_DAYS,
      duties: [...DUTIES],
      rows: matrixRows,
      attention,
    };
  }

  private async get(id: string, m: EntityManager = this.db.manager, lock = false): Promise<Qualification> {
    const q = await m.findOne(Qualification, { where: { id }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
    if (!q) throw new NotFoundException('No such qualification.');
    return q;
  }

  private assertDates(grantedOn: string, expiresOn: string) {
    if (daysBetween(grantedOn, expiresOn) < 0) throw new BadRequestException('expiresOn must not be before grantedOn');
  }

  async grant(dto: GrantQualificationDto, by: AuthUser): Promise<QualificationDto> {
    this.assertDates(dto.grantedOn, dto.expiresOn);
    const engine = await this.engines.get(dto.engineId);
    const person = await this.users.get(dto.userId).catch((e: unknown) => {
      if (e instanceof NotFoundException) throw new NotFoundException('No such person.');
      throw e;
    });
    if (!person.active) throw new BadRequestException(`${person.displayName}'s account is deactivated.`);
    if (!(CREW_ROLES as readonly string[]).includes(person.role))
      throw new BadRequestException(
        `${person.displayName} is an ${ROLE_LABELS[person.role].toLowerCase()}: observers only read. Change their role first.`,
      );
    const saved = await this.db.transaction(async (m) => {
      const standing = await m.findOne(Qualification, {
        where: { userId: dto.userId, engineId: dto.engineId, duty: dto.duty, withdrawnAt: IsNull() },
      });
      if (standing)
        throw new ConflictException(
          `${person.displayName} already holds this qualification for ${engine.name} (until ${standing.expiresOn}). Renew it instead.`,
        );
      return m.save(
        Qualification,
        m.create(Qualification, {
          userId: dto.userId,
          engineId: dto.engineId,
          duty: dto.duty,
          grantedOn: dto.grantedOn,
          expiresOn: dto.expiresOn,
          notes: dto.notes?.trim() ?? '',
          grantedBy: by.id,
        }),
      );
    });
    return (await this.toDtos([saved]))[0];
  }

  /** Withdraws the standing qualification ("Renewed until …") and grants its successor, in one transaction. */
  async renew(id: string, dto: RenewQualificationDto, by: AuthUser): Promise<QualificationDto> {
    const today = utcDateOf(new Date());
    const saved = await this.db.transaction(async (m) => {
      const old = await this.get(id, m, true);
      if (old.withdrawnAt) throw new ConflictException('This qualification was withdrawn; grant a new one instead.');
      const grantedOn = dto.grantedOn ?? today;
      this.assertDates(grantedOn, dto.expiresOn);
      await m.update(
        Qualification,
        { id },
        { withdrawnAt: new Date(), withdrawnBy: by.id, withdrawnReason: `Renewed until ${dto.expiresOn}.` },
      );
      return m.save(
        Qualification,
        m.create(Qualification, {
          userId: old.userId,
          engineId: old.engineId,
          duty: old.duty,
          grantedOn,
          expiresOn: dto.expiresOn,
          notes: dto.notes?.trim() ?? old.notes,
          grantedBy: by.id,
        }),
      );
    });
    return (await this.toDtos([saved]))[0];
  }

  async withdraw(id: string, reason: string, by: AuthUser): Promise<QualificationDto> {
    const q = await this.db.transaction(async (m) => {
      const cur = await this.get(id, m, true);
      if (cur.withdrawnAt) throw new ConflictException('This qualification was already withdrawn.');
      cur.withdrawnAt = new Date();
      cur.withdrawnBy = by.id;
      cur.withdrawnReason = reason.trim();
      return m.save(Qualification, cur);
    });
    return (await this.toDtos([q]))[0];
  }
}
