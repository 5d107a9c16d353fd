import type { INestApplicationContext } from '@nestjs/common';
import { DataSource } from 'typeorm';
import { plainToInstance } from 'class-transformer';
import { validateSync } from 'class-validator';
import type { Engine } from '../../modules/engines/engine.entity.js';
import type { User } from '../../modules/users/user.entity.js';
import { EnginesService } from '../../modules/engines/engines.service.js';
import { Run } from '../../modules/runs/run.entity.js';
import { Oil } from '../../modules/lubrication/oil.entity.js';
import { OilConsumptionEntry } from '../../modules/lubrication/oil-consumption.entity.js';
import { LubricationService } from '../../modules/lubrication/lubrication.service.js';
import { ConsumptionEntryDto, OilWriteDto } from '../../modules/lubrication/dto/lubrication.dto.js';
import { flattenValidationErrors } from '../../common/pipes/validation.pipe.js';
import { readSample } from './samples.js';

interface LubricationSample {
  recordedBy: string;
  oils: Record<string, unknown>[];
  assign: { point: string; oil: string }[];
  consumption: { points: Record<string, { method: 'added'; litres: number[] } | { method: 'levels'; start: number[]; end: number[] }> };
}

/** The runs of the season that have run, in the order of samples/season-2026.json. */
function seasonTitles(): string[] {
  return readSample<{ runs: { title: string }[] }>('season-2026.json').runs.map((r) => r.title);
}

/**
 * Oils with their data-sheet-style figures, which point takes which, and the oil made up after each run of the
 * season, written through the lubrication service. Idempotent: oils by name, entries by run and point.
 */
export async function seedLubrication(app: INestApplicationContext, engine: Engine, users: Map<string, User>): Promise<string> {
  const sample = readSample<LubricationSample>('lubrication.json');
  const db = app.get(DataSource);
  const lube = app.get(LubricationService);
  const detail = await app.get(EnginesService).detail(engine.id);
  const recorder = users.get(sample.recordedBy);
  if (!recorder) throw new Error(`samples/lubrication.json: no user ${sample.recordedBy}`);
  const valid = <T extends object>(d: T, what: string) => {
    const errors = validateSync(d, { whitelist: true, forbidNonWhitelisted: true });
    if (errors.length) throw new Error(`samples/lubrication.json: ${what}: ${flattenValidationErrors(errors).join('; ')}`);
    return d;
  };

  let oils = 0;
  for (const o of sample.oils) {
    if (await db.getRepository(Oil).exists({ where: { name: String(o.name) } })) continue;
    await lube.createOil(valid(plainToInstance(OilWriteDto, o), `oil ${String(o.name)}`));
    oils++;
  }
  const oilByName = new Map((await lube.oils()).map((o) => [o.name, o.id]));
  const pointByLabel = new Map(detail.lubricationPoints.map((l) => [l.label, l.id]));
  for (const a of sample.assign) {
    const pointId = pointByLabel.get(a.point);
    const oilId = oilByName.get(a.oil);
    if (!pointId || !oilId) throw new Error(`samples/lubrication.json: no point "${a.point}" or oil "${a.oil}"`);
    await lube.assignOil(pointId, oilId, recorder.id);
  }

  let entries = 0;
  const titles = seasonTitles();
  for (const [label, c] of Object.entries(sample.consumption.points)) {
    const pointId = pointByLabel.get(label);
    if (!pointId) throw new Error(`samples/lubrication.json: no lubrication point "${label}"`);
    for (let i = 0; i < titles.length; i++) {
      const run = await db.getRepository(Run).findOne({ where: { engineId: engine.id, title: titles[i] } });
      if (!run || !run.startedAt) continue;
      if (await db.getRepository(OilConsumptionEntry).exists({ where: { runId: run.id, lubricationPointId: pointId } })) continue;
      const given = c.method === 'added' ? c.litres[i] !== undefined : c.start[i] !== undefined && c.end[i] !== undefined;
      if (!given) continue;
      const body =
        c.method === 'added'
          ? { runId: run.id, lubricationPointId: pointId, method: 'added', quantityLitres: c.litres[i] }
          : { runId: run.id, lubricationPointId: pointId, method: 'levels', levelStartLitres: c.start[i], levelEndLitres: c.end[i] };
      await lube.addConsumption(valid(plainToInstance(ConsumptionEntryDto, body), `consumption of ${label} in ${run.title}`), recorder.id);
      entries++;
    }
  }
  return `${oils} new oils, ${entries} new oil consumption entries`;
}
