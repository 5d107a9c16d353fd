import type { INestApplicationContext } from '@nestjs/common';
import { DataSource, IsNull } from 'typeorm';
import { plainToInstance } from 'class-transformer';
import { validateSync } from 'class-validator';
import type { ChecklistItemDef, ChecklistTemplateContent, Duty } from '@crankjournal/shared-types';
import { ChecklistTemplatesService } from '../../modules/checklists/checklist-templates.service.js';
import { ChecklistTemplate, ChecklistTemplateVersion } from '../../modules/checklists/checklist-template.entity.js';
import { Checklist, ChecklistEntry } from '../../modules/checklists/checklist.entity.js';
import { itemsOf } from '../../modules/checklists/checklist-rules.js';
import { Qualification } from '../../modules/qualifications/qualification.entity.js';
import { Engine } from '../../modules/engines/engine.entity.js';
import { Run } from '../../modules/runs/run.entity.js';
import type { User } from '../../modules/users/user.entity.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { utcDateOf } from '../../modules/qualifications/qualification-rules.js';
import { CreateChecklistTemplateDto } from '../../modules/checklists/dto/template.dto.js';
import { flattenValidationErrors } from '../../common/pipes/validation.pipe.js';
import { readSample } from './samples.js';

interface ChecklistsSample {
  engine: string;
  templates: ChecklistTemplateContent[];
  pastRuns: { typicalValues: Record<string, number> };
  qualifications: { email: string; duties: Duty[]; grantedDaysAgo: number; expiresInDays: number; notes: string }[];
}

const DAY_MS = 86_400_000;
const MIN_MS = 60_000;

/** A typical, in-range value for an item of a past run's checklist. */
function typicalEntry(it: ChecklistItemDef, typical: Record<string, number>): Partial<ChecklistEntry> | null {
  switch (it.kind) {
    case 'tick':
      return { tick: true };
    case 'reading': {
      const v = typical[it.key] ?? (it.min != null && it.max != null ? (it.min + it.max) / 2 : (it.min ?? it.max ?? 0));
      return { value: v };
    }
    case 'choice':
      return { choice: it.acceptable?.[0] ?? it.choices![0] };
    default:
      return null; // notes and photos were left empty on those days
  }
}

/**
 * The demo's checklist templates for No. 2 engine (published as version 1), the crew's qualifications
 * (dates relative to today: one lapsed, one about to lapse), and completed, signed checklists for the
 * closed runs of the season. Today's preparing run gets none: its checklists are done live.
 * Idempotent: templates by engine and name, qualifications by person, engine and duty, checklists by run and template.
 */
export async function seedChecklists(app: INestApplicationContext, engine: Engine, users: Map<string, User>): Promise<string> {
  const sample = readSample<ChecklistsSample>('checklists.json');
  const db = app.get(DataSource);
  const templates = app.get(ChecklistTemplatesService);
  const chiefUser = users.get('chief@alderforge.example')!;
  const chief: AuthUser = {
    id: chiefUser.id,
    email: chiefUser.email,
    displayName: chiefUser.displayName,
    role: chiefUser.role,
    sessionVersion: chiefUser.sessionVersion,
  };

  let newTemplates = 0;
  for (const t of sample.templates) {
    const exists = await db.getRepository(ChecklistTemplate).findOne({ where: { engineId: engine.id, name: t.name } });
    if (exists) continue;
    const dto = plainToInstance(CreateChecklistTemplateDto, { ...t, engineId: engine.id, issue: true });
    const errors = validateSync(dto, { whitelist: true, forbidNonWhitelisted: true });
    if (errors.length) throw new Error(`samples/checklists.json, template "${t.name}": ${flattenValidationErrors(errors).join('; ')}`);
    await templates.create(dto, chief);
    newTemplates++;
  }

  let newQuals = 0;
  const today = Date.now();
  for (const q of sample.qualifications) {
    const person = users.get(q.email);
    if (!person) throw new Error(`samples/checklists.json: no demo user ${q.email}`);
    for (const duty of q.duties) {
      const standing = await db
        .getRepository(Qualification)
        .findOne({ where: { userId: person.id, engineId: engine.id, duty, withdrawnAt: IsNull() } });
      if (standing) continue;
      await db.getRepository(Qualification).insert({
        userId: person.id,
        engineId: engine.id,
        duty,
        grantedOn: utcDateOf(new Date(today - q.grantedDaysAgo * DAY_MS)),
        expiresOn: utcDateOf(new Date(today + q.expiresInDays * DAY_MS)),
        notes: q.notes,
        grantedBy: chief.id,
      });
      newQuals++;
    }
  }

  // Completed checklists for the closed runs of the season (signed by the first of the crew).
  let newChecklists = 0;
  const active = await templates.activeFor(engine.id);
  const closed = await db.getRepository(Run).find({ where: { engineId: engine.id, state: 'closed' } });
  for (const run of closed) {
    if (!run.startedAt || !run.stoppedAt) continue;
    const signer = run.crewIds[0] ?? chief.id;
    for (const t of active) {
      if (await db.getRepository(Checklist).exists({ where: { runId: run.id, templateId: t.id } })) continue;
      const version = (await db
        .getRepository(ChecklistTemplateVersion)
        .findOne({ where: { templateId: t.id, version: t.currentVersion } }))!;
      const offsetMin = { pre_start_inspection: -40, pre_lube: -15, warm_up: -5, shutdown: 30, other: 0 }[t.purpose];
      const base = t.requiredWhen === 'after_stop' ? run.stoppedAt : run.startedAt;
      const signedAt = new Date(base.getTime() + offsetMin * MIN_MS);
      const startedAt = new Date(signedAt.getTime() - 12 * MIN_MS);
      const qual = await db
        .getRepository(Qualification)
        .findOne({ where: { userId: signer, engineId: engine.id, duty: version.content.requiredDuty } });
      await db.transaction(async (m) => {
        const c = await m.save(
          Checklist,
          m.create(Checklist, {
            runId: run.id,
            engineId: engine.id,
            templateId: t.id,
            templateVersionId: version.id,
            version: version.version,
            status: 'signed',
            startedBy: signer,
            startedAt,
            signedBy: signer,
            signedAt,
            signerQualificationId: qual?.id ?? null,
          }),
        );
        const items = itemsOf(version.content.sections);
        const rows = items
          .map((it, i) => {
            const v = typicalEntry(it, sample.pastRuns.typicalValues);
            return v
              ? {
                  checklistId: c.id,
                  itemKey: it.key,
                  tick: null,
                  value: null,
                  choice: null,
                  text: null,
                  ...v,
                  filledBy: signer,
                  filledAt: new Date(startedAt.getTime() + ((i + 1) * 10 * MIN_MS) / items.length),
                }
              : null;
          })
          .filter((x): x is NonNullable<typeof x> => x !== null);
        if (rows.length) await m.insert(ChecklistEntry, rows);
      });
      newChecklists++;
    }
  }
  return `${newTemplates} checklist templates, ${newQuals} qualifications, ${newChecklists} past checklists`;
}
