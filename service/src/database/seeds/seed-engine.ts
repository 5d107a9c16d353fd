import type { INestApplicationContext } from '@nestjs/common';
import { DataSource } from 'typeorm';
import { plainToInstance } from 'class-transformer';
import { validateSync } from 'class-validator';
import { EnginesService } from '../../modules/engines/engines.service.js';
import { Engine } from '../../modules/engines/engine.entity.js';
import { EngineWriteDto } from '../../modules/engines/dto/engine-write.dto.js';
import { readSample } from './samples.js';

/** The invented No. 2 engine, written through the same service and validation as the API. */
export async function seedEngine(app: INestApplicationContext, chiefId: string): Promise<Engine> {
  const raw = readSample<Record<string, unknown>>('engine-no2.json');
  const dto = plainToInstance(EngineWriteDto, raw);
  const errors = validateSync(dto, { whitelist: true });
  if (errors.length)
    throw new Error(`samples/engine-no2.json is not valid: ${JSON.stringify(errors.map((e) => e.constraints ?? e.children))}`);
  const db = app.get(DataSource);
  const engines = app.get(EnginesService);
  const existing = await db.getRepository(Engine).findOne({ where: { name: dto.name } });
  if (!existing) {
    const d = await engines.create(dto, chiefId);
    await db
      .getRepository(Engine)
      .update({ id: d.id }, { baselineHours: Number(raw.baselineHours ?? 0), baselineRevolutions: Number(raw.baselineRevolutions ?? 0) });
  }
  return (await db.getRepository(Engine).findOne({ where: { name: dto.name } }))!;
}
