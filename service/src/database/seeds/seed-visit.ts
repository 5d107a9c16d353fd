import type { INestApplicationContext } from '@nestjs/common';
import { DataSource } from 'typeorm';
import type { Engine } from '../../modules/engines/engine.entity.js';
import type { User } from '../../modules/users/user.entity.js';
import { Run } from '../../modules/runs/run.entity.js';
import { VisitorBoard } from '../../modules/visit/visitor-board.entity.js';
import { VisitService } from '../../modules/visit/visit.service.js';
import { readSample } from './samples.js';

interface VisitSample {
  run: string;
  story: string;
}

/**
 * The open day's visitor board, switched on with its story, through the visit service. Idempotent: one board per
 * run; a second seed leaves the board (its address, on or off) as the chief engineer left it.
 */
export async function seedVisit(app: INestApplicationContext, engine: Engine, users: Map<string, User>): Promise<string> {
  const sample = readSample<VisitSample>('visit.json');
  const db = app.get(DataSource);
  const run = await db.getRepository(Run).findOne({ where: { engineId: engine.id, title: sample.run } });
  if (!run) throw new Error(`samples/visit.json: no run "${sample.run}"`);
  let board = await db.getRepository(VisitorBoard).findOne({ where: { runId: run.id } });
  if (!board) {
    const chief = users.get('chief@alderforge.example')!;
    const visit = app.get(VisitService);
    const created = await visit.create(
      { runId: run.id },
      { id: chief.id, email: chief.email, displayName: chief.displayName, role: chief.role, sessionVersion: chief.sessionVersion },
    );
    await visit.update(created.id, { story: sample.story });
    board = await db.getRepository(VisitorBoard).findOneByOrFail({ id: created.id });
  }
  return `visitor board of "${sample.run}" ${board.enabled ? 'on' : 'off'} at /visit/${board.slug}`;
}
