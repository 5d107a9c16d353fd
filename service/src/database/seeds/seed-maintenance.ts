import type { INestApplicationContext } from '@nestjs/common';
import { DataSource } from 'typeorm';
import { plainToInstance, type ClassConstructor } from 'class-transformer';
import { validateSync } from 'class-validator';
import type { AlarmKind } from '@crankjournal/shared-types';
import type { Engine } from '../../modules/engines/engine.entity.js';
import type { User } from '../../modules/users/user.entity.js';
import { EnginesService } from '../../modules/engines/engines.service.js';
import { AlarmsService } from '../../modules/alarms/alarms.service.js';
import { Run } from '../../modules/runs/run.entity.js';
import { InspectionPlan } from '../../modules/maintenance/inspection-plan.entity.js';
import { Inspection, InspectionAttachment } from '../../modules/maintenance/inspection.entity.js';
import { WorkRecord } from '../../modules/maintenance/work-record.entity.js';
import { PlansService } from '../../modules/maintenance/plans.service.js';
import { InspectionsService } from '../../modules/maintenance/inspections.service.js';
import { WorkRecordsService } from '../../modules/maintenance/work-records.service.js';
import { PlanWriteDto } from '../../modules/maintenance/dto/plan.dto.js';
import { InspectionCreateDto } from '../../modules/maintenance/dto/inspection.dto.js';
import { CloseWorkRecordDto, WorkRecordCreateDto } from '../../modules/maintenance/dto/work-record.dto.js';
import { flattenValidationErrors } from '../../common/pipes/validation.pipe.js';
import { encodePng } from './card-image.js';
import { readSample } from './samples.js';

interface AlarmRef {
  point: string;
  kind: AlarmKind;
}
interface MaintenanceSample {
  engine: string;
  recordedBy: string;
  plans: (Record<string, unknown> & { title: string; bearing?: string })[];
  inspections: (Record<string, unknown> & {
    key: string;
    title: string;
    bearing?: string;
    plan?: string;
    promptedByRun?: string;
    promptedByAlarm?: AlarmRef;
    photo?: { file: string; caption: string };
  })[];
  workRecords: (Record<string, unknown> & {
    title: string;
    bearing?: string;
    promptedByInspection?: string;
    promptedByAlarm?: AlarmRef;
    satisfiesPlans?: string[];
    completedAt?: string;
    closeNote?: string;
  })[];
}

/** A DTO from sample data, checked by the same rules as the API. */
function dto<T extends object>(cls: ClassConstructor<T>, raw: Record<string, unknown>, what: string): T {
  const d = plainToInstance(cls, raw);
  const errors = validateSync(d, { whitelist: true, forbidNonWhitelisted: true });
  if (errors.length) throw new Error(`samples/maintenance.json: ${what} is not valid: ${flattenValidationErrors(errors).join('; ')}`);
  return d;
}

/**
 * A drawing of a lifted top-half bearing shell (640 × 400): the bronze shell, the white-metal lining, two oil grooves,
 * and a scored band on the flywheel side. Drawn here for the demo record; not a photograph of anything.
 */
export function drawScoredShell(): Buffer {
  const w = 640;
  const h = 400;
  const rgb = new Uint8Array(w * h * 3);
  let seed = 20260820;
  const rnd = () => (seed = (seed * 1103515245 + 12345) & 0x7fffffff) / 0x7fffffff;
  const set = (x: number, y: number, c: [number, number, number]) => {
    if (x < 0 || y < 0 || x >= w || y >= h) return;
    const i = (y * w + x) * 3;
    rgb[i] = c[0];
    rgb[i + 1] = c[1];
    rgb[i + 2] = c[2];
  };
  const shade = (c: [number, number, number], d: number): [number, number, number] => [
    Math.max(0, Math.min(255, c[0] + d)),
    Math.max(0, Math.min(255, c[1] + d)),
    Math.max(0, Math.min(255, c[2] + d)),
  ];
  // Bench (dark, oily wood) with grain.
  for (let y = 0; y < h; y++)
    for (let x = 0; x < w; x++) set(x, y, shade([74, 58, 44], Math.round(12 * Math.sin(y / 7 + x / 90) + (rnd() - 0.5) * 10)));
  // Shell outline (bronze), seen from above as a rounded rectangle; lining inside it.
  const shell = { x0: 60, y0: 50, x1: 580, y1: 350 };
  const lining = { x0: 84, y0: 74, x1: 556, y1: 326 };
  for (let y = shell.y0; y < shell.y1; y++)
    for (let x = shell.x0; x < shell.x1; x++) {
      const inLining = x >= lining.x0 && x < lining.x1 && y >= lining.y0 && y < lining.y1;
      if (inLining) {
        // White metal: light grey, shaded across the curve (darker at the edges of the bore).
        const t = (y - lining.y0) / (lining.y1 - lining.y0);
        const curve = Math.round(-38 * (2 * t - 1) ** 2);
        set(x, y, shade([196, 198, 200], curve + Math.round((rnd() - 0.5) * 8)));
      } else {
        const t = (y - shell.y0) / (shell.y1 - shell.y0);
        set(x, y, shade([164, 112, 58], Math.round(-30 * (2 * t - 1) ** 2 + (rnd() - 0.5) * 10)));
      }
    }
  // Oil grooves: a cross from corner to corner of the lining, half closed by smeared metal on the right.
  const groove = (x0: number, y0: number, x1: number, y1: number) => {
    const n = Math.max(Math.abs(x1 - x0), Math.abs(y1 - y0));
    for (let i = 0; i <= n; i++) {
      const x = Math.round(x0 + ((x1 - x0) * i) / n);
      const y = Math.round(y0 + ((y1 - y0) * i) / n);
      const closed = x > 400 && rnd() < 0.55;
      for (let d = -3; d <= 3; d++) set(x, y + d, closed ? [150, 152, 156] : [70, 62, 50]);
    }
  };
  groove(110, 100, 530, 300);
  groove(110, 300, 530, 100);
  // Scoring: streaks round the bore (left to right here) across the right third, with dull blue smears.
  for (let k = 0; k < 70; k++) {
    const y = lining.y0 + 10 + Math.floor(rnd() * (lining.y1 - lining.y0 - 20));
    const x0 = 390 + Math.floor(rnd() * 60);
    const len = 60 + Math.floor(rnd() * 100);
    const dark = 60 + Math.floor(rnd() * 50);
    for (let x = x0; x < Math.min(lining.x1 - 4, x0 + len); x++) {
      set(x, y, shade([196, 198, 200], -dark));
      if (rnd() < 0.4) set(x, y + 1, shade([196, 198, 200], -dark / 2));
    }
  }
  for (let k = 0; k < 6; k++) {
    const cx = 430 + Math.floor(rnd() * 100);
    const cy = 100 + Math.floor(rnd() * 200);
    const r = 14 + Math.floor(rnd() * 18);
    for (let y = cy - r; y <= cy + r; y++)
      for (let x = cx - r; x <= cx + r; x++)
        if ((x - cx) ** 2 + (y - cy) ** 2 <= r * r && x < lining.x1 && y < lining.y1 && y >= lining.y0)
          set(x, y, [120 + Math.floor(rnd() * 10), 130, 168]);
  }
  // A steel rule along the bottom for scale: a light strip with a tick every 20 px.
  for (let y = 362; y < 382; y++) for (let x = 60; x < 580; x++) set(x, y, [208, 206, 198]);
  for (let x = 60; x < 580; x += 20) for (let y = 362; y < (x % 100 === 60 ? 376 : 370); y++) set(x, y, [30, 30, 30]);
  return encodePng(w, h, rgb);
}

/**
 * The maintenance record of the demo engine: plans, the inspections of the season (the warm main bearing 2
 * among them, with its photo), and the work that followed. Written through the services; idempotent by title.
 */
export async function seedMaintenance(app: INestApplicationContext, engine: Engine, users: Map<string, User>): Promise<string> {
  const sample = readSample<MaintenanceSample>('maintenance.json');
  const db = app.get(DataSource);
  const plans = app.get(PlansService);
  const inspections = app.get(InspectionsService);
  const work = app.get(WorkRecordsService);
  const alarms = app.get(AlarmsService);
  const detail = await app.get(EnginesService).detail(engine.id);
  const recorder = users.get(sample.recordedBy);
  if (!recorder) throw new Error(`samples/maintenance.json: no user ${sample.recordedBy}`);
  const bearingId = (label?: string) => {
    if (!label) return undefined;
    const b = detail.bearings.find((x) => x.label === label);
    if (!b) throw new Error(`samples/maintenance.json: no bearing "${label}" on ${engine.name}`);
    return b.id;
  };
  const runId = async (title?: string) => {
    if (!title) return undefined;
    const r = await db.getRepository(Run).findOne({ where: { engineId: engine.id, title } });
    if (!r) throw new Error(`samples/maintenance.json: no run "${title}" (seed the season first)`);
    return r.id;
  };
  const alarmId = async (ref: AlarmRef | undefined, run: string | undefined) => {
    if (!ref) return undefined;
    const point = detail.measurementPoints.find((p) => p.code === ref.point);
    if (!point) throw new Error(`samples/maintenance.json: no point ${ref.point}`);
    const list = await alarms.listByPoints([point.id]);
    const a = list.find((x) => x.kind === ref.kind && (!run || x.runId === run));
    if (!a) throw new Error(`samples/maintenance.json: no ${ref.kind} alarm on ${ref.point} in that run; the season must raise it`);
    return a.id;
  };

  let newPlans = 0;
  const planIds = new Map<string, string>();
  for (const p of sample.plans) {
    const existing = await db.getRepository(InspectionPlan).findOne({ where: { engineId: engine.id, title: p.title } });
    if (existing) {
      planIds.set(p.title, existing.id);
      continue;
    }
    const { bearing, ...rest } = p;
    const made = await plans.create(
      dto(PlanWriteDto, { ...rest, engineId: engine.id, bearingId: bearingId(bearing) }, `plan "${p.title}"`),
      recorder.id,
    );
    planIds.set(p.title, made.id);
    newPlans++;
  }

  let newInspections = 0;
  const inspectionIds = new Map<string, string>();
  for (const i of sample.inspections) {
    const existing = await db.getRepository(Inspection).findOne({ where: { engineId: engine.id, title: i.title } });
    if (existing) {
      inspectionIds.set(i.key, existing.id);
      continue;
    }
    const { key, bearing, plan, promptedByRun, promptedByAlarm, photo, ...rest } = i;
    const run = await runId(promptedByRun);
    const made = await inspections.create(
      dto(
        InspectionCreateDto,
        {
          ...rest,
          engineId: engine.id,
          bearingId: bearingId(bearing),
          planId: plan ? planIds.get(plan) : undefined,
          promptedByRunId: run,
          promptedByAlarmId: await alarmId(promptedByAlarm, run),
        },
        `inspection "${i.title}"`,
      ),
      recorder.id,
    );
    inspectionIds.set(key, made.id);
    newInspections++;
  }
  // Photos, once each (the object store may have been emptied; the record then says so on download).
  for (const i of sample.inspections) {
    if (!i.photo) continue;
    const id = inspectionIds.get(i.key)!;
    if (await db.getRepository(InspectionAttachment).exists({ where: { inspectionId: id, filename: i.photo.file } })) continue;
    await inspections.attach(id, { buffer: drawScoredShell(), originalname: i.photo.file, size: 0 }, i.photo.caption, recorder.id);
  }

  let newWork = 0;
  for (const w of sample.workRecords) {
    if (await db.getRepository(WorkRecord).exists({ where: { engineId: engine.id, title: w.title } })) continue;
    const { bearing, promptedByInspection, promptedByAlarm, satisfiesPlans, completedAt, closeNote, ...rest } = w;
    const inspectionId = promptedByInspection ? inspectionIds.get(promptedByInspection) : undefined;
    const inspectionRun = inspectionId
      ? ((await db.getRepository(Inspection).findOne({ where: { id: inspectionId } }))?.promptedByRunId ?? undefined)
      : undefined;
    const made = await work.create(
      dto(
        WorkRecordCreateDto,
        {
          ...rest,
          engineId: engine.id,
          bearingId: bearingId(bearing),
          promptedByInspectionId: inspectionId,
          promptedByAlarmId: await alarmId(promptedByAlarm, inspectionRun),
          satisfiesPlanIds: (satisfiesPlans ?? []).map((t) => planIds.get(t)!),
        },
        `work record "${w.title}"`,
      ),
      recorder.id,
    );
    if (completedAt)
      await work.close(
        made.id,
        dto(CloseWorkRecordDto, { completedAt, ...(closeNote ? { note: closeNote } : {}) }, `closing "${w.title}"`),
        recorder.id,
      );
    newWork++;
  }
  return `${newPlans} new inspection plans, ${newInspections} new inspections, ${newWork} new work records`;
}
