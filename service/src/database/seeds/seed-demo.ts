import type { INestApplicationContext } from '@nestjs/common';
import { DataSource } from 'typeorm';
import { seedUsers } from './seed-users.js';
import { seedEngine } from './seed-engine.js';
import { seedSeason } from './seed-season.js';

/**
 * Every part of the demo, in order. Each part is idempotent (matched by natural keys), so running the
 * seed twice gives the same data. Feature areas add their part at the end.
 */
export async function seedDemo(app: INestApplicationContext): Promise<string> {
  const db = app.get(DataSource);
  const users = await db.transaction((m) => seedUsers(m));
  const engine = await seedEngine(app, users.get('chief@alderforge.example')!.id);
  const runs = await seedSeason(app, engine, users);
  return `${users.size} users, engine "${engine.name}", ${runs} new runs`;
}
