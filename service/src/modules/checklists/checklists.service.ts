import { randomUUID } from 'node:crypto';
import { DataSource, Repository, In, type EntityManager } from 'typeorm';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import {
  BadRequestException,
  ConflictException,
  ForbiddenException,
  HttpException,
  Injectable,
  Logger,
  NotFoundException,
} from '@nestjs/common';
import {
  CHECKLIST_RUN_STATES,
  RUN_STATE_LABELS,
  type ChecklistAmendmentDto,
  type ChecklistDetail,
  type ChecklistEntryDto,
  type ChecklistItemDef,
  type ChecklistRequiredWhen,
  type ChecklistSummary,
  type RunChecklistsOverview,
  type RunChecklistTemplateStatus,
} from '@crankjournal/shared-types';
import { RunsService } from '../runs/runs.service.js';
import type { GateRule } from '../runs/start-gate.service.js';
import { EnginesService } from '../engines/engines.service.js';
import { QualificationsService } from '../qualifications/qualifications.service.js';
import { AuthService } from '../auth/auth.service.js';
import { StorageService } from '../storage/storage.service.js';
import { LiveService } from '../live/live.service.js';
import { UsersService } from '../users/users.service.js';
import { KeyedMutex } from '../../common/util/keyed-mutex.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IMAGE_EXTENSIONS, sniffImageType } from '../../common/util/image-sniff.js';
import {
  allStartChecklistsSigned,
  evaluateCloseChecklists,
  evaluateStartChecklists,
  latestByTemplate,
  preLubeFreshUntil,
  type GateChecklist,
  type GateTemplate,
  type GateVerdictPart,
} from './checklist-gate.js';
import {
  isDone,
  isOutOfRange,
  itemsOf,
  normaliseValue,
  overrideHolds,
  progressOf,
  rangeText,
  sameValue,
  signBlockers,
  unitText,
  valueOf,
  type EntryState,
} from './checklist-rules.js';
import { ChecklistTemplatesService } from './checklist-templates.service.js';
import { ChecklistTemplate, ChecklistTemplateVersion } from './checklist-template.entity.js';
import { Checklist, ChecklistAmendment, ChecklistEntry } from './checklist.entity.js';
import type { AmendChecklistDto, FillChecklistItemDto } from './dto/checklist.dto.js';

interface Loaded {
  c: Checklist;
  version: ChecklistTemplateVersion;
}

const toState = (e: ChecklistEntry | undefined): EntryState | undefined =>
  e ? { tick: e.tick, value: e.value, choice: e.choice, text: e.text, hasPhoto: !!e.photoKey, overrideValue: e.overrideValue } : undefined;

/** A run's checklists: started against a template version, filled in any order, signed, amended; and the gate rules built on them. */
/** A run as the start gate and RunsService hand it over. */
type Run = Parameters<GateRule['check']>[0];

/** How far a tablet's clock may run ahead of or behind the server's for a time it sends. */
const DEVICE_CLOCK_SLACK_MS = 5 * 60_000;
const earliest = (a: Date, b: Date | null): Date => (b && b < a ? b : a);

@Injectable()
export class ChecklistsService {
  private readonly logger = new Logger('Checklists');
  /** Signing is serialised per run, so two signatures at once cannot both miss the run's clearance. */
  private readonly perRun = new KeyedMutex();

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(Checklist) private readonly checklistRepo: Repository<Checklist>,
    @InjectRepository(ChecklistAmendment) private readonly checklistAmendmentRepo: Repository<ChecklistAmendment>,
    @InjectRepository(ChecklistEntry) private readonly checklistEntryRepo: Repository<ChecklistEntry>,
    @InjectRepository(ChecklistTemplateVersion) private readonly checklistTemplateVersionRepo: Repository<ChecklistTemplateVersion>,
    private readonly templates: ChecklistTemplatesService,
    private readonly runs: RunsService,
    private readonly engines: EnginesService,
    private readonly quals: QualificationsService,
    private readonly auth: AuthService,
    private readonly storage: StorageService,
    private readonly live: LiveService,
    private readonly users: UsersService,
  ) {}

  // ---- reading -------------------------------------------------------------------------------------

  private async load(id: string, m: EntityManager = this.db.manager, lock = false): Promise<Loaded> {
    const c = await m.findOne(Checklist, { where: { id }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
    if (!c) throw new NotFoundException('No such checklist.');
    const version = await m.findOne(ChecklistTemplateVersion, { where: { id: c.templateVersionId } });
    if (!version) throw new NotFoundException('The template version of this checklist is missing.');
    return { c, version };
  }

  private item(version: ChecklistTemplateVersion, itemKey: string): ChecklistItemDef {
    const it = itemsOf(version.content.sections).find((x) => x.key === itemKey);
    if (!it) throw new NotFoundException(`This checklist (version ${version.version}) has no item "${itemKey}".`);
    return it;
  }

  private names(ids: (string | null | undefined)[]): Promise<Map<string, string>> {
    return this.users.displayNames(ids);
  }

  private async build(
    rows: Checklist[],
    full: boolean,
  ): Promise<{
    summaries: ChecklistSummary[];
    entries: Map<string, ChecklistEntryDto[]>;
    versions: Map<string, ChecklistTemplateVersion>;
  }> {
    if (!rows.length) return { summaries: [], entries: new Map(), versions: new Map() };
    const ids = rows.map((c) => c.id);
    const versions = new Map(
      (await this.checklistTemplateVersionRepo.find({ where: { id: In([...new Set(rows.map((c) => c.templateVersionId))]) } })).map((v) => [
        v.id,
        v,
      ]),
    );
    const entries = await this.checklistEntryRepo.find({ where: { checklistId: In(ids) } });
    const amendments = await this.checklistAmendmentRepo.find({ where: { checklistId: In(ids) }, order: { at: 'ASC' } });
    const names = await this.names([
      ...rows.flatMap((c) => [c.startedBy, c.signedBy]),
      ...(full ? entries.flatMap((e) => [e.filledBy, e.overrideBy]) : []),
      ...(full ? amendments.map((a) => a.byUser) : []),
    ]);
    const entriesBy = new Map<string, ChecklistEntry[]>();
    for (const e of entries) entriesBy.set(e.checklistId, [...(entriesBy.get(e.checklistId) ?? []), e]);
    const amendBy = new Map<string, ChecklistAmendment[]>();
    for (const a of amendments) amendBy.set(a.checklistId, [...(amendBy.get(a.checklistId) ?? []), a]);
    const summaries: ChecklistSummary[] = [];
    const entryDtos = new Map<string, ChecklistEntryDto[]>();
    for (const c of rows) {
      const v = versions.get(c.templateVersionId)!;
      const mine = entriesBy.get(c.id) ?? [];
      const byKey = new Map(mine.map((e) => [e.itemKey, e]));
      const states = new Map(mine.map((e) => [e.itemKey, toState(e)!]));
      const p = progressOf(v.content.sections, states);
      summaries.push({
        id: c.id,
        runId: c.runId,
        templateId: c.templateId,
        name: v.content.name,
        purpose: v.content.purpose,
        requiredWhen: v.content.requiredWhen,
        requiredDuty: v.content.requiredDuty,
        version: c.version,
        status: c.status,
        ...p,
        startedAt: c.startedAt.toISOString(),
        startedByName: names.get(c.startedBy) ?? 'unknown',
        signedAt: c.signedAt?.toISOString() ?? null,
        signedOnDeviceAt: c.signedOnDeviceAt?.toISOString() ?? null,
        signedByName: c.signedBy ? (c.signedByName ?? names.get(c.signedBy) ?? 'unknown') : null,
        amendmentCount: amendBy.get(c.id)?.length ?? 0,
      });
      if (full) {
        const am = amendBy.get(c.id) ?? [];
        entryDtos.set(
          c.id,
          itemsOf(v.content.sections).map((it) => {
            const e = byKey.get(it.key);
            const st = states.get(it.key);
            const amendmentDtos: ChecklistAmendmentDto[] = am
              .filter((a) => a.itemKey === it.key)
              .map((a) => ({
                id: a.id,
                itemKey: a.itemKey,
                oldValue: a.oldValue,
                newValue: a.newValue,
                reason: a.reason,
                overrideReason: a.overrideReason,
                byName: names.get(a.byUser) ?? 'unknown',
                at: a.at.toISOString(),
              }));
            return {
              itemKey: it.key,
              tick: e?.tick ?? null,
              value: e?.value ?? null,
              choice: e?.choice ?? null,
              text: e?.text ?? null,
              hasPhoto: !!e?.photoKey,
              done: isDone(it, st),
              outOfRange: isOutOfRange(it, st),
              override:
                e?.overrideReason && overrideHolds(it, st)
                  ? { reason: e.overrideReason, byName: names.get(e.overrideBy ?? '') ?? 'unknown', at: e.overrideAt!.toISOString() }
                  : null,
              filledByName: e?.filledBy ? (names.get(e.filledBy) ?? 'unknown') : null,
              filledAt: e?.filledAt?.toISOString() ?? null,
              original: e?.signedValue ?? null,
              amendments: amendmentDtos,
            };
          }),
        );
      }
    }
    return { summaries, entries: entryDtos, versions };
  }

  async detail(id: string): Promise<ChecklistDetail> {
    const { c, version } = await this.load(id);
    const run = await this.runs.get(c.runId);
    const { summaries, entries } = await this.build([c], true);
    return {
      ...summaries[0],
      description: version.content.description,
      sections: version.content.sections,
      entries: entries.get(c.id) ?? [],
      engineId: c.engineId,
      runState: run.state,
    };
  }

  private async summary(id: string): Promise<ChecklistSummary> {
    const c = await this.checklistRepo.findOneOrFail({ where: { id } });
    return (await this.build([c], false)).summaries[0];
  }

  private async runChecklists(runId: string): Promise<ChecklistSummary[]> {
    const rows = await this.checklistRepo.find({ where: { runId }, order: { startedAt: 'ASC' } });
    return (await this.build(rows, false)).summaries;
  }

  private fillableIn(run: Run, when: ChecklistRequiredWhen): boolean {
    return CHECKLIST_RUN_STATES[when].includes(run.state);
  }

  async overview(runId: string): Promise<RunChecklistsOverview> {
    const run = await this.runs.get(runId);
    const engine = await this.engines.get(run.engineId);
    const active = await this.templates.activeFor(run.engineId);
    const summaries = await this.templates.summariesOf(active);
    const checklists = await this.runChecklists(runId);
    const latest = latestByTemplate(checklists.map((c) => this.gateView(c)));
    const byId = new Map(checklists.map((c) => [c.id, c]));
    const templates: RunChecklistTemplateStatus[] = summaries.map((t) => {
      const l = latest.get(t.id);
      const signed = l?.signed ? byId.get(l.signed.id)! : null;
      const open = l?.open ? byId.get(l.open.id)! : null;
      return {
        template: t,
        progress: signed ? 'signed' : open ? 'in_progress' : 'not_started',
        signed,
        open,
        fillableNow: this.fillableIn(run, t.requiredWhen),
      };
    });
    const verdict = this.freshness(active, checklists, engine.preLubeFreshnessMinutes);
    return {
      runId,
      engineId: run.engineId,
      runState: run.state,
      preLubeFreshnessMinutes: engine.preLubeFreshnessMinutes,
      preLubeFreshUntil: verdict,
      templates,
      checklists,
    };
  }

  private freshness(active: ChecklistTemplate[], checklists: ChecklistSummary[], minutes: number): string | null {
    const latest = latestByTemplate(checklists.map((c) => this.gateView(c)));
    let until: Date | null = null;
    for (const t of active.filter((x) => x.purpose === 'pre_lube' && x.requiredWhen === 'before_start')) {
      const s = latest.get(t.id)?.signed;
      if (s?.signedAt) {
        const u = preLubeFreshUntil(s.signedAt, minutes);
        if (!until || u < until) until = u;
      }
    }
    return until?.toISOString() ?? null;
  }

  private gateView(c: ChecklistSummary): GateChecklist {
    return {
      id: c.id,
      templateId: c.templateId,
      status: c.status,
      // A sign-off made offline counts for freshness from the earlier of the tablet's and the server's time.
      signedAt: c.signedAt ? earliest(new Date(c.signedAt), c.signedOnDeviceAt ? new Date(c.signedOnDeviceAt) : null) : null,
      signedByName: c.signedByName,
      requiredItems: c.requiredItems,
      requiredDone: c.requiredDone,
      startedAt: new Date(c.startedAt),
    };
  }

  // ---- the gate rules ---------------------------------------------------------------------------------

  private gateTemplates(active: ChecklistTemplate[]): GateTemplate[] {
    return active.map((t) => ({ id: t.id, name: t.name, purpose: t.purpose, requiredWhen: t.requiredWhen }));
  }

  /** The checklist part of the start gate (registered with the start gate by this module). */
  async startRule(run: Run, now = new Date()): Promise<GateVerdictPart> {
    const active = await this.templates.activeFor(run.engineId);
    if (!active.some((t) => t.requiredWhen === 'before_start')) return { reasons: [] };
    const engine = await this.engines.get(run.engineId);
    const rows = await this.checklistRepo.find({ where: { runId: run.id } });
    const { summaries } = await this.build(rows, false);
    const gate = summaries.map((s) => this.gateView(s));
    // Is each signer of the checklists the gate relies on still qualified for its duty?
    const latest = latestByTemplate(gate);
    const signerProblems = new Map<string, string | null>();
    for (const t of active.filter((x) => x.requiredWhen === 'before_start')) {
      const s = latest.get(t.id)?.signed;
      if (!s) continue;
      const row = rows.find((r) => r.id === s.id)!;
      const duty = summaries.find((x) => x.id === s.id)!.requiredDuty;
      const problem = await this.quals.problemOf(row.signedBy!, run.engineId, duty, engine.name, s.signedByName ?? 'The signer', now);
      signerProblems.set(s.id, problem);
    }
    return evaluateStartChecklists({
      templates: this.gateTemplates(active),
      checklists: gate,
      now,
      engineName: engine.name,
      preLubeFreshnessMinutes: engine.preLubeFreshnessMinutes,
      signerProblems,
    });
  }

  /** The close gate: shutdown checklists signed (registered with the start gate's close rules). */
  async closeRule(run: Run): Promise<GateVerdictPart> {
    const active = await this.templates.activeFor(run.engineId);
    if (!active.some((t) => t.requiredWhen === 'after_stop')) return { reasons: [] };
    const summaries = await this.runChecklists(run.id);
    return evaluateCloseChecklists(
      this.gateTemplates(active),
      summaries.map((s) => this.gateView(s)),
    );
  }

  // ---- writing ------------------------------------------------------------------------------------------

  private assertFillable(run: Run, when: ChecklistRequiredWhen, name: string) {
    this.runs.assertOpen(run);
    if (!this.fillableIn(run, when)) {
      const states = CHECKLIST_RUN_STATES[when].map((s) => RUN_STATE_LABELS[s].toLowerCase()).join(' or ');
      throw new ConflictException(
        `The ${name} checklist is filled while the run is ${states}; this run is ${RUN_STATE_LABELS[run.state].toLowerCase()}.`,
      );
    }
  }

  private emit(runId: string, s: ChecklistSummary) {
    this.live.emitToRoom(`run:${runId}`, 'run:record', { runId, kind: 'checklist', id: s.id, data: s });
  }

  /** Starts a checklist of a template's current version for a run. */
  async start(runId: string, templateId: string, user: AuthUser): Promise<ChecklistDetail> {
    const run = await this.runs.get(runId);
    const t = await this.templates.get(templateId);
    if (t.engineId !== run.engineId) throw new BadRequestException('That template belongs to another engine.');
    if (t.retiredAt) throw new ConflictException(`The ${t.name} template is withdrawn.`);
    if (t.currentVersion === 0) throw new ConflictException(`The ${t.name} template has no issued version yet.`);
    this.assertFillable(run, t.requiredWhen, t.name);
    const version = await this.templates.versionRow(t.id, t.currentVersion);
    const id = await this.db.transaction(async (m) => {
      const open = await m.findOne(Checklist, { where: { runId, templateId, status: 'in_progress' } });
      if (open)
        throw new ConflictException({
          statusCode: 409,
          error: 'Conflict',
          message: `A ${t.name} checklist is already being filled for this run; carry on with it.`,
          details: { checklistId: open.id },
        });
      const now = new Date();
      const c = await m.save(
        Checklist,
        m.create(Checklist, {
          runId,
          engineId: run.engineId,
          templateId,
          templateVersionId: version.id,
          version: version.version,
          status: 'in_progress',
          startedBy: user.id,
          startedAt: now,
        }),
      );
      return c.id;
    });
    this.emit(runId, await this.summary(id));
    return this.detail(id);
  }

  /** Runs `write` on an unsigned checklist whose run is in a state where it may be filled, with the row locked. */
  private async whileFilling(id: string, write: (m: EntityManager, l: Loaded, run: Run) => Promise<void>): Promise<ChecklistDetail> {
    const first = await this.load(id);
    const run = await this.runs.get(first.c.runId);
    this.assertFillable(run, first.version.content.requiredWhen, first.version.content.name);
    await this.db.transaction(async (m) => {
      const l = await this.load(id, m, true);
      if (l.c.status === 'signed')
        throw new ConflictException('This checklist is signed and read-only. Correct a mistake with an amendment, giving the reason.');
      await write(m, l, run);
    });
    this.emit(first.c.runId, await this.summary(id));
    return this.detail(id);
  }

  private async entryOf(m: EntityManager, checklistId: string, itemKey: string): Promise<ChecklistEntry> {
    return (
      (await m.findOne(ChecklistEntry, { where: { checklistId, itemKey } })) ??
      m.create(ChecklistEntry, { checklistId, itemKey, tick: null, value: null, choice: null, text: null, photoKey: null, photoType: null })
    );
  }

  async fill(id: string, itemKey: string, dto: FillChecklistItemDto, user: AuthUser): Promise<ChecklistDetail> {
    return this.whileFilling(id, async (m, { version }) => {
      const it = this.item(version, itemKey);
      let next: ReturnType<typeof normaliseValue>;
      try {
        next = normaliseValue(it, dto);
      } catch (e) {
        throw new BadRequestException((e as Error).message);
      }
      const e = await this.entryOf(m, id, itemKey);
      Object.assign(e, next, { filledBy: user.id, filledAt: new Date() });
      // An override was given for one value; a new value needs a new one.
      if (e.overrideValue && !sameValue(e.overrideValue, valueOf(it, toState(e))))
        Object.assign(e, { overrideValue: null, overrideReason: null, overrideBy: null, overrideAt: null });
      await m.save(ChecklistEntry, e);
    });
  }

  async putPhoto(id: string, itemKey: string, body: Buffer, user: AuthUser): Promise<ChecklistDetail> {
    const type = await sniffImageType(body);
    if (!type)
      throw new HttpException(
        {
          statusCode: 415,
          error: 'Unsupported Media Type',
          message: 'The photo must be a PNG, JPEG or WebP image (judged by its content, not its name).',
        },
        415,
      );
    const { version, c } = await this.load(id);
    const it = this.item(version, itemKey);
    if (it.kind !== 'photo') throw new BadRequestException(`${it.label} is not a photo item.`);
    if (c.status === 'signed') throw new ConflictException('This checklist is signed and read-only.');
    this.assertFillable(await this.runs.get(c.runId), version.content.requiredWhen, version.content.name);
    const key = `checklists/${id}/${itemKey}/${randomUUID()}.${IMAGE_EXTENSIONS[type]}`;
    await this.storage.put(key, body, type);
    return this.whileFilling(id, async (m) => {
      const e = await this.entryOf(m, id, itemKey);
      Object.assign(e, { photoKey: key, photoType: type, filledBy: user.id, filledAt: new Date() });
      await m.save(ChecklistEntry, e);
    });
  }

  async photo(id: string, itemKey: string): Promise<{ body: Buffer; type: string }> {
    const { version } = await this.load(id);
    this.item(version, itemKey);
    const e = await this.checklistEntryRepo.findOne({ where: { checklistId: id, itemKey } });
    if (!e?.photoKey) throw new NotFoundException('No photo has been taken for this item.');
    const o = await this.storage.get(e.photoKey);
    return { body: o.body, type: e.photoType ?? o.contentType };
  }

  /** The chief engineer accepts an out-of-range value for this checklist, with a reason that stays in the record. */
  async override(id: string, itemKey: string, reason: string, user: AuthUser): Promise<ChecklistDetail> {
    if (user.role !== 'chief_engineer')
      throw new ForbiddenException('Only the chief engineer may accept a value outside its acceptance range.');
    return this.whileFilling(id, async (m, { version }) => {
      const it = this.item(version, itemKey);
      const e = await m.findOne(ChecklistEntry, { where: { checklistId: id, itemKey } });
      const st = toState(e ?? undefined);
      if (!e || !isDone(it, st)) throw new ConflictException(`${it.label} has no value yet; record it first.`);
      if (!isOutOfRange(it, st)) throw new ConflictException(`${it.label} is within its acceptance range; there is nothing to override.`);
      Object.assign(e, { overrideReason: reason.trim(), overrideBy: user.id, overrideAt: new Date(), overrideValue: valueOf(it, st) });
      await m.save(ChecklistEntry, e);
    });
  }

  /**
   * Signs a checklist: every required item done, nothing out of range without an override, the signer
   * holds the template's qualification for this engine, and confirms with their password or signing PIN.
   * When it completes the checklists required before a start, a preparing run is cleared.
   */
  async sign(id: string, signature: string, user: AuthUser, signedOnDeviceAt?: string): Promise<ChecklistDetail> {
    const { c: c0 } = await this.load(id);
    return this.perRun.run(c0.runId, async () => {
      const { c, version } = await this.load(id);
      const content = version.content;
      if (c.status === 'signed') throw new ConflictException('This checklist is already signed.');
      const onDevice = signedOnDeviceAt ? new Date(signedOnDeviceAt) : null;
      if (onDevice && onDevice.getTime() > Date.now() + DEVICE_CLOCK_SLACK_MS)
        throw new BadRequestException('signedOnDeviceAt is in the future: check the tablet’s clock, then sign again.');
      if (onDevice && onDevice.getTime() < c.startedAt.getTime() - DEVICE_CLOCK_SLACK_MS)
        throw new BadRequestException('signedOnDeviceAt is before the checklist was started: check the tablet’s clock, then sign again.');
      const run = await this.runs.get(c.runId);
      this.assertFillable(run, content.requiredWhen, content.name);
      const blockers = signBlockers(content.sections, await this.states(id));
      if (blockers.length) throw new HttpException({ statusCode: 409, error: 'Conflict', message: blockers, details: { blockers } }, 409);
      const qualificationId = await this.quals.assertQualified(
        user,
        c.engineId,
        content.requiredDuty,
        `sign the ${content.name} checklist`,
      );
      if (!(await this.auth.verifySigner(user.id, signature)))
        throw new BadRequestException('The password or signing PIN is not right; the checklist was not signed.');
      await this.db.transaction(async (m) => {
        const cur = await this.load(id, m, true);
        if (cur.c.status === 'signed') throw new ConflictException('This checklist was signed a moment ago by someone else.');
        const again = signBlockers(content.sections, await this.states(id, m));
        if (again.length)
          throw new HttpException({ statusCode: 409, error: 'Conflict', message: again, details: { blockers: again } }, 409);
        await m.update(
          Checklist,
          { id },
          {
            status: 'signed',
            signedBy: user.id,
            signedByName: (await this.names([user.id])).get(user.id) ?? null,
            signedAt: new Date(),
            signedOnDeviceAt: onDevice,
            signerQualificationId: qualificationId,
          },
        );
      });
      this.emit(c.runId, await this.summary(id));
      if (content.requiredWhen === 'before_start') await this.clearIfReady(c.runId, user);
      return this.detail(id);
    });
  }

  private async states(checklistId: string, m: EntityManager = this.db.manager): Promise<Map<string, EntryState>> {
    const rows = await m.find(ChecklistEntry, { where: { checklistId } });
    return new Map(rows.map((e) => [e.itemKey, toState(e)!]));
  }

  /** Preparing → cleared once every checklist required before a start is signed (see RunsService.clearAfterChecklists). */
  private async clearIfReady(runId: string, user: AuthUser) {
    const run = await this.runs.get(runId);
    if (run.state !== 'preparing') return;
    const active = await this.templates.activeFor(run.engineId);
    const summaries = await this.runChecklists(runId);
    if (
      !allStartChecklistsSigned(
        this.gateTemplates(active),
        summaries.map((s) => this.gateView(s)),
      )
    )
      return;
    const names = active.filter((t) => t.requiredWhen === 'before_start').map((t) => t.name);
    try {
      await this.runs.clearAfterChecklists(
        runId,
        user,
        `Cleared: every checklist required before a start is signed (${names.join(', ')}).`,
      );
    } catch (e) {
      if (e instanceof ConflictException) return; // someone moved the run meanwhile
      this.logger.warn(`clearing run ${runId} failed: ${(e as Error).message}`);
    }
  }

  /** A correction of a signed checklist: the value as signed stays visible, with who, when and why. */
  async amend(id: string, dto: AmendChecklistDto, user: AuthUser): Promise<ChecklistDetail> {
    const { c, version } = await this.load(id);
    if (c.status !== 'signed') throw new ConflictException('This checklist is not signed yet: change the item directly.');
    const run = await this.runs.get(c.runId);
    this.runs.assertOpen(run);
    const it = this.item(version, dto.itemKey);
    if (it.kind === 'photo')
      throw new ConflictException(
        'A photo cannot be amended. Record the correction in the reason of an amendment to another item, or in the run notes.',
      );
    let next: ReturnType<typeof normaliseValue>;
    try {
      next = normaliseValue(it, { tick: dto.tick, value: dto.value, choice: dto.choice, text: dto.text });
    } catch (e) {
      throw new BadRequestException((e as Error).message);
    }
    const nextState: EntryState = { ...next, hasPhoto: false, overrideValue: null };
    if (it.required && !isDone(it, nextState))
      throw new BadRequestException(`${it.label} is required: an amendment cannot leave it empty.`);
    const outOfRange = isOutOfRange(it, nextState);
    if (outOfRange) {
      if (user.role !== 'chief_engineer')
        throw new ConflictException(
          it.kind === 'reading'
            ? `${it.label}: ${next.value} ${unitText(it.unit)} is outside the acceptance range (${rangeText(it)}). ` +
                'Only the chief engineer can amend it to that, recording an override with a reason.'
            : `${it.label}: "${next.choice}" is not acceptable. ` +
                'Only the chief engineer can amend it to that, recording an override with a reason.',
        );
      if (!dto.overrideReason?.trim()) throw new BadRequestException('overrideReason must say why the out-of-range value is acceptable');
    }
    await this.quals.assertQualified(user, c.engineId, version.content.requiredDuty, `amend the ${version.content.name} checklist`);
    await this.db.transaction(async (m) => {
      await this.load(id, m, true);
      const e = await this.entryOf(m, id, it.key);
      const old = valueOf(it, toState(e));
      const neu = valueOf(it, nextState);
      if (sameValue(old, neu)) throw new BadRequestException('That is the value already recorded; nothing to amend.');
      const now = new Date();
      if (!e.signedValue) e.signedValue = old;
      Object.assign(e, next);
      if (outOfRange)
        Object.assign(e, { overrideReason: dto.overrideReason!.trim(), overrideBy: user.id, overrideAt: now, overrideValue: neu });
      await m.save(ChecklistEntry, e);
      await m.insert(ChecklistAmendment, {
        checklistId: id,
        itemKey: it.key,
        oldValue: old,
        newValue: neu,
        reason: dto.reason.trim(),
        overrideReason: outOfRange ? dto.overrideReason!.trim() : null,
        byUser: user.id,
        at: now,
      });
    });
    this.emit(c.runId, await this.summary(id));
    return this.detail(id);
  }
}
