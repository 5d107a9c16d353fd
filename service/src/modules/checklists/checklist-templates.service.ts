import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, Repository, IsNull, Not, type EntityManager } from 'typeorm';
import type {
  ChecklistRequiredWhen,
  ChecklistTemplateContent,
  ChecklistTemplateDetail,
  ChecklistTemplateSummary,
  ChecklistTemplateVersionDto,
} from '@crankjournal/shared-types';
import { EnginesService } from '../engines/engines.service.js';
import { UsersService } from '../users/users.service.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { itemsOf, validateTemplateContent } from './checklist-rules.js';
import { ChecklistTemplate, ChecklistTemplateVersion } from './checklist-template.entity.js';
import type { CreateChecklistTemplateDto } from './dto/template.dto.js';

/** Plain content (the DTO class instance carries nothing else, but stored JSON should be plain and trimmed). */
export function cleanContent(c: ChecklistTemplateContent): ChecklistTemplateContent {
  return {
    name: c.name.trim(),
    purpose: c.purpose,
    requiredWhen: c.requiredWhen,
    requiredDuty: c.requiredDuty,
    description: (c.description ?? '').trim(),
    sections: c.sections.map((s) => ({
      key: s.key,
      title: s.title.trim(),
      items: s.items.map((it) => ({
        key: it.key,
        kind: it.kind,
        label: it.label.trim(),
        ...(it.help?.trim() ? { help: it.help.trim() } : {}),
        required: it.required,
        ...(it.kind === 'reading' ? { unit: it.unit?.trim() ?? '', min: it.min ?? null, max: it.max ?? null } : {}),
        ...(it.kind === 'choice'
          ? { choices: (it.choices ?? []).map((x) => x.trim()), acceptable: (it.acceptable ?? []).map((x) => x.trim()) }
          : {}),
        caution: it.caution ? { hazard: it.caution.hazard, text: it.caution.text.trim() } : null,
      })),
    })),
  };
}

/** Checklist templates per engine, their drafts and their published (immutable) versions. */
@Injectable()
export class ChecklistTemplatesService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(ChecklistTemplate) private readonly checklistTemplateRepo: Repository<ChecklistTemplate>,
    @InjectRepository(ChecklistTemplateVersion) private readonly checklistTemplateVersionRepo: Repository<ChecklistTemplateVersion>,
    private readonly engines: EnginesService,
    private readonly users: UsersService,
  ) {}

  async get(id: string, m: EntityManager = this.db.manager): Promise<ChecklistTemplate> {
    const t = await m.findOne(ChecklistTemplate, { where: { id } });
    if (!t) throw new NotFoundException('No such checklist template.');
    return t;
  }

  async versionRow(templateId: string, version: number): Promise<ChecklistTemplateVersion> {
    const v = await this.checklistTemplateVersionRepo.findOne({ where: { templateId, version } });
    if (!v) throw new NotFoundException(`This template has no version ${version}.`);
    return v;
  }

  async versionById(id: string): Promise<ChecklistTemplateVersion> {
    const v = await this.checklistTemplateVersionRepo.findOne({ where: { id } });
    if (!v) throw new NotFoundException('No such template version.');
    return v;
  }

  private async summaries(rows: ChecklistTemplate[]): Promise<ChecklistTemplateSummary[]> {
    if (!rows.length) return [];
    const engineNames = new Map((await this.engines.list()).map((e) => [e.id, e.name]));
    const published = rows.filter((t) => t.currentVersion > 0);
    const versions = published.length
      ? await this.checklistTemplateVersionRepo.find({
          where: published.map((t) => ({ templateId: t.id, version: t.currentVersion })),
        })
      : [];
    const current = new Map(versions.map((v) => [v.templateId, v]));
    return rows.map((t) => {
      const v = current.get(t.id);
      const content = v?.content ?? t.draft;
      return {
        id: t.id,
        engineId: t.engineId,
        engineName: engineNames.get(t.engineId) ?? '',
        name: t.name,
        purpose: t.purpose,
        requiredWhen: t.requiredWhen,
        requiredDuty: t.requiredDuty,
        currentVersion: t.currentVersion,
        issuedAt: v?.publishedAt.toISOString() ?? null,
        itemCount: content ? itemsOf(content.sections).length : 0,
        hasDraft: t.draft !== null,
        withdrawn: t.retiredAt !== null,
        state: t.retiredAt !== null ? 'withdrawn' : t.currentVersion > 0 ? 'issued' : 'in_preparation',
      };
    });
  }

  async list(filter: { engineId?: string }): Promise<ChecklistTemplateSummary[]> {
    const where: Record<string, unknown> = {};
    if (filter.engineId) where.engineId = filter.engineId;
    const rows = await this.checklistTemplateRepo.find({ where, order: { createdAt: 'ASC' } });
    const order: ChecklistRequiredWhen[] = ['before_start', 'not_required', 'after_stop'];
    return (await this.summaries(rows)).sort(
      (a, b) => Number(a.withdrawn) - Number(b.withdrawn) || order.indexOf(a.requiredWhen) - order.indexOf(b.requiredWhen),
    );
  }

  private async versionDto(v: ChecklistTemplateVersion, names?: Map<string, string>): Promise<ChecklistTemplateVersionDto> {
    const n = names ?? (await this.names([v.publishedBy]));
    return {
      templateId: v.templateId,
      version: v.version,
      content: v.content,
      issuedAt: v.publishedAt.toISOString(),
      issuedByName: n.get(v.publishedBy) ?? 'unknown',
      changeNote: v.changeNote,
    };
  }

  private names(ids: string[]): Promise<Map<string, string>> {
    return this.users.displayNames(ids);
  }

  async detail(id: string): Promise<ChecklistTemplateDetail> {
    const t = await this.get(id);
    const [summary] = await this.summaries([t]);
    const versions = await this.checklistTemplateVersionRepo.find({ where: { templateId: id }, order: { version: 'DESC' } });
    const names = await this.names(versions.map((v) => v.publishedBy));
    const cur = versions.find((v) => v.version === t.currentVersion);
    return {
      ...summary,
      current: cur ? await this.versionDto(cur, names) : null,
      draft: t.draft,
      draftUpdatedAt: t.draftUpdatedAt?.toISOString() ?? null,
      versions: versions.map((v) => ({
        version: v.version,
        issuedAt: v.publishedAt.toISOString(),
        issuedByName: names.get(v.publishedBy) ?? 'unknown',
        changeNote: v.changeNote,
      })),
    };
  }

  async version(id: string, version: number): Promise<ChecklistTemplateVersionDto> {
    await this.get(id);
    return this.versionDto(await this.versionRow(id, version));
  }

  private check(content: ChecklistTemplateContent) {
    const errs = validateTemplateContent(content);
    if (errs.length) throw new BadRequestException({ statusCode: 400, error: 'Bad Request', message: errs });
  }

  private async assertNameFree(m: EntityManager, engineId: string, name: string, exceptId?: string) {
    const clash = await m
      .getRepository(ChecklistTemplate)
      .createQueryBuilder('t')
      .where('t.engineId = :engineId AND lower(t.name) = lower(:name) AND t.retiredAt IS NULL', { engineId, name })
      .andWhere(exceptId ? 't.id <> :exceptId' : '1=1', { exceptId })
      .getOne();
    if (clash) throw new ConflictException(`This engine already has a checklist called "${clash.name}".`);
  }

  async create(dto: CreateChecklistTemplateDto, user: AuthUser): Promise<ChecklistTemplateDetail> {
    const content = cleanContent(dto);
    this.check(content);
    await this.engines.get(dto.engineId);
    const id = await this.db.transaction(async (m) => {
      await this.assertNameFree(m, dto.engineId, content.name);
      const t = await m.save(
        ChecklistTemplate,
        m.create(ChecklistTemplate, {
          engineId: dto.engineId,
          name: content.name,
          purpose: content.purpose,
          requiredWhen: content.requiredWhen,
          requiredDuty: content.requiredDuty,
          currentVersion: 0,
          draft: content,
          draftUpdatedAt: new Date(),
          createdBy: user.id,
        }),
      );
      if (dto.issue) await this.issueIn(m, t, '', user);
      return t.id;
    });
    return this.detail(id);
  }

  async saveDraft(id: string, raw: ChecklistTemplateContent, user: AuthUser): Promise<ChecklistTemplateDetail> {
    const content = cleanContent(raw);
    this.check(content);
    await this.db.transaction(async (m) => {
      const t = await m.findOne(ChecklistTemplate, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!t) throw new NotFoundException('No such checklist template.');
      await this.assertNameFree(m, t.engineId, content.name, t.id);
      const patch: Partial<ChecklistTemplate> = { draft: content, draftUpdatedAt: new Date() };
      // While nothing is published the template shows what its draft says.
      if (t.currentVersion === 0)
        Object.assign(patch, {
          name: content.name,
          purpose: content.purpose,
          requiredWhen: content.requiredWhen,
          requiredDuty: content.requiredDuty,
        });
      await m.update(ChecklistTemplate, { id }, patch);
    });
    void user;
    return this.detail(id);
  }

  async discardDraft(id: string): Promise<ChecklistTemplateDetail> {
    const t = await this.get(id);
    if (!t.draft) throw new ConflictException('There is no revision in preparation to discard.');
    if (t.currentVersion === 0)
      throw new ConflictException(
        'Nothing is issued yet: the revision in preparation is all this template has. Withdraw the template instead.',
      );
    await this.checklistTemplateRepo.update({ id }, { draft: null, draftUpdatedAt: null });
    return this.detail(id);
  }

  private async issueIn(m: EntityManager, t: ChecklistTemplate, changeNote: string, user: AuthUser) {
    if (!t.draft) throw new ConflictException('There is nothing in preparation to issue: save your changes first.');
    this.check(t.draft);
    const version = t.currentVersion + 1;
    await m.insert(ChecklistTemplateVersion, {
      templateId: t.id,
      version,
      content: t.draft,
      changeNote: changeNote.trim(),
      publishedBy: user.id,
      publishedAt: new Date(),
    });
    await m.update(
      ChecklistTemplate,
      { id: t.id },
      {
        currentVersion: version,
        name: t.draft.name,
        purpose: t.draft.purpose,
        requiredWhen: t.draft.requiredWhen,
        requiredDuty: t.draft.requiredDuty,
        draft: null,
        draftUpdatedAt: null,
      },
    );
  }

  /** Issue: the revision in preparation becomes the next version; checklists already filled keep the version they were filled against. */
  async issue(id: string, changeNote: string, user: AuthUser): Promise<ChecklistTemplateDetail> {
    await this.db.transaction(async (m) => {
      const t = await m.findOne(ChecklistTemplate, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!t) throw new NotFoundException('No such checklist template.');
      if (t.retiredAt) throw new ConflictException('This template is withdrawn; reissue it before issuing a new version.');
      await this.issueIn(m, t, changeNote, user);
    });
    return this.detail(id);
  }

  /** Withdraw (true) or reissue (false) a template. */
  async setWithdrawn(id: string, withdrawn: boolean): Promise<ChecklistTemplateDetail> {
    await this.db.transaction(async (m) => {
      const t = await m.findOne(ChecklistTemplate, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!t) throw new NotFoundException('No such checklist template.');
      if (withdrawn === (t.retiredAt !== null))
        throw new ConflictException(withdrawn ? 'This template is already withdrawn.' : 'This template is not withdrawn.');
      if (!withdrawn) await this.assertNameFree(m, t.engineId, t.name, t.id);
      await m.update(ChecklistTemplate, { id }, { retiredAt: withdrawn ? new Date() : null });
    });
    return this.detail(id);
  }

  /** Issued, not withdrawn templates of an engine (what the gates and a run's checklists work from). */
  async activeFor(engineId: string): Promise<ChecklistTemplate[]> {
    return this.checklistTemplateRepo.find({
      where: { engineId, retiredAt: IsNull(), currentVersion: Not(0) },
      order: { createdAt: 'ASC' },
    });
  }

  async summariesOf(rows: ChecklistTemplate[]): Promise<ChecklistTemplateSummary[]> {
    return this.summaries(rows);
  }
}
