import type { INestApplicationContext } from '@nestjs/common';
import { DataSource } from 'typeorm';
import { SiteService } from '../../modules/site/site.service.js';
import { seedUsers } from './seed-users.js';
import { seedEngine } from './seed-engine.js';
import { seedSeason } from './seed-season.js';
import { seedChecklists } from './seed-checklists.js';
import { seedMill } from './seed-mill.js';
import { seedIndicatorCards } from './seed-indicator-cards.js';
import { seedMaintenance } from './seed-maintenance.js';
import { seedLubrication } from './seed-lubrication.js';
import { seedVisit } from './seed-visit.js';

/**
 * Every part of the demo, in order. Each part is idempotent (matched by natural keys), so running the
 * seed twice gives the same data. Feature areas add their part at the end.
 */
export async function seedDemo(app: INestApplicationContext): Promise<string> {
  const db = app.get(DataSource);
  // The invented works and its clock: every printed record names it and prints its times in this zone.
  await app.get(SiteService).update({ worksName: 'Alder Forge', timeZone: 'Europe/London' });
  const users = await db.transaction((m) => seedUsers(m));
  const engine = await seedEngine(app, users.get('chief@alderforge.example')!.id);
  const runs = await seedSeason(app, engine, users);
  const checklists = await seedChecklists(app, engine, users);
  const cardSets = await seedIndicatorCards(app, engine, users);
  // After the card sets: logged passes take the run's indicated hp from them.
  const mill = await seedMill(app, engine, users);
  // After the season: the inspections refer to its runs and alarms.
  const maintenance = await seedMaintenance(app, engine, users);
  const lubrication = await seedLubrication(app, engine, users);
  // The open day's visitor board, on from the start (its address is in this summary; the QR page is under Visitor boards).
  const visit = await seedVisit(app, engine, users);
  return (
    `${users.size} users, engine "${engine.name}", ${runs} new runs, ${checklists}, ${mill}, ${cardSets} new ` +
    `card sets, ${maintenance}, ${lubrication}, ${visit}`
  );
}
