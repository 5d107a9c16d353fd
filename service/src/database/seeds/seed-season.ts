import { createHash } from 'node:crypto';
import type { INestApplicationContext } from '@nestjs/common';
import { DataSource } from 'typeorm';
import type { RunPurpose } from '@crankjournal/shared-types';
import { Run } from '../../modules/runs/run.entity.js';
import { RunStateChange } from '../../modules/runs/run-state-change.entity.js';
import { IngestService } from '../../modules/runs/ingest.service.js';
import { EnginesService } from '../../modules/engines/engines.service.js';
import { AlarmsService } from '../../modules/alarms/alarms.service.js';
import { Engine } from '../../modules/engines/engine.entity.js';
import type { User } from '../../modules/users/user.entity.js';
import { revolutionsFromSpeedRecord } from '../../calculations/run-derived.js';
import { readSample } from './samples.js';

interface SeasonRun {
  title: string;
  purpose: RunPurpose;
  date: string;
  start: string;
  hours: number;
  ambientF: number;
  warmBearing?: string;
  crew: string[];
  notes: string;
}
interface Season {
  runs: SeasonRun[];
  today: { title: string; purpose: RunPurpose; crew: string[]; notes: string };
}

/** A small deterministic generator, so the season is the same on every machine. */
function prng(seed: string) {
  let h = createHash('sha256').update(seed).digest().readUInt32LE(0);
  return () => {
    h ^= h << 13;
    h ^= h >>> 17;
    h ^= h << 5;
    return ((h >>> 0) % 1_000_000) / 1_000_000;
  };
}
export function stableUuid(...parts: string[]): string {
  const h = createHash('sha1').update(parts.join('|')).digest('hex');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-5${h.slice(13, 16)}-a${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

/** What a point reads `t` minutes into a run (warm-up, steady running, the warm bearing of August). */
function valueAt(code: string, t: number, hours: number, ambientF: number, rnd: () => number, warm: boolean): number {
  const noise = (a: number) => (rnd() - 0.5) * 2 * a;
  const warmUp = 1 - Math.exp(-t / 45);
  switch (code) {
    case 'THR-P':
      return 132 + noise(3);
    case 'REC-P':
      return 27 + noise(2);
    case 'VAC':
      return 24.5 + noise(0.6);
    case 'SPD':
      return t < 10 ? 20 + t * 5.2 : 74.5 + noise(0.8);
    case 'MB1-T':
      return ambientF + 8 + 32 * warmUp + noise(1.5);
    case 'MB2-T': {
      const base = ambientF + 8 + 34 * warmUp + noise(1.5);
      if (!warm) return base;
      // From the second hour the bearing runs away slowly, peaks, and eases after the feed is opened up.
      const extra = t < 110 ? 0 : t < 150 ? (t - 110) * 0.95 : Math.max(0, 38 - (t - 150) * 0.35);
      return base + extra;
    }
    case 'CP-T':
      return ambientF + 10 + 30 * warmUp + noise(2);
    case 'XH-T':
      return ambientF + 6 + 22 * warmUp + noise(1.5);
    case 'OB-T':
      return ambientF + 5 + 20 * warmUp + noise(1.5);
    case 'OIL-P':
      return 22 + noise(2);
    case 'FEED-CP':
      return 8 + noise(1);
    case 'AMB-T':
      return ambientF + 4 * (t / (hours * 60)) + noise(0.8);
    default:
      return 0;
  }
}

/** The 2026 season: closed runs with readings (through the real ingest path, so alarms are raised by the real rules) and today's run. */
export async function seedSeason(app: INestApplicationContext, engine: Engine, users: Map<string, User>): Promise<number> {
  const season = readSample<Season>('season-2026.json');
  const db = app.get(DataSource);
  const ingest = app.get(IngestService);
  const engines = app.get(EnginesService);
  const chief = users.get('chief@alderforge.example')!;
  const { points } = await engines.withPoints(engine.id);
  let created = 0;
  for (const s of season.runs) {
    if (await db.getRepository(Run).exists({ where: { engineId: engine.id, title: s.title } })) continue;
    const start = new Date(`${s.date}T${s.start}:00Z`);
    const stop = new Date(start.getTime() + s.hours * 3600_000);
    const crew = s.crew.map((e) => users.get(e)!);
    const operator = crew[0];
    const run = await db.getRepository(Run).save(
      db.getRepository(Run).create({
        engineId: engine.id,
        title: s.title,
        purpose: s.purpose,
        state: 'running',
        plannedFor: s.date,
        crewIds: crew.map((c) => c.id),
        notes: s.notes,
        startedAt: start,
        createdBy: chief.id,
        createdAt: new Date(start.getTime() - 14 * 86400_000),
      }),
    );
    const rnd = prng(s.title);
    const rows = [];
    const warm = !!s.warmBearing;
    const minutes = Math.round(s.hours * 60);
    for (let t = 0; t <= minutes; t += 15) {
      // The warm run was read every 5 minutes once the bearing began to climb.
      const times = warm && t >= 105 && t < 180 ? [t, t + 5, t + 10] : [t];
      for (const tt of times) {
        for (const p of points) {
          if (tt !== t && !['MB2-T', 'MB1-T', 'AMB-T', 'SPD'].includes(p.code)) continue;
          rows.push({
            clientId: stableUuid(run.id, p.code, String(tt)),
            point: p,
            value: +valueAt(p.code, tt, s.hours, s.ambientF, rnd, warm).toFixed(1),
            takenAt: new Date(start.getTime() + tt * 60_000),
          });
        }
      }
    }
    await ingest.store({ run, source: 'round', enteredBy: operator.id }, rows);
    const speedId = points.find((p) => p.code === 'SPD')!.id;
    const revs = revolutionsFromSpeedRecord(
      rows.filter((r) => r.point.id === speedId).map((r) => ({ takenAtMs: r.takenAt.getTime(), speedRpm: r.value })),
      start.getTime(),
      stop.getTime(),
    );
    const closedAt = new Date(stop.getTime() + 50 * 60_000);
    await db.transaction(async (m) => {
      await m.update(Run, { id: run.id }, { state: 'closed', stoppedAt: stop, closedAt, countersignedBy: chief.id, revolutions: revs });
      const at = (mins: number) => new Date(start.getTime() + mins * 60_000);
      await m.insert(RunStateChange, [
        { runId: run.id, fromState: null, toState: 'planned', byUser: chief.id, at: run.createdAt, note: null },
        { runId: run.id, fromState: 'planned', toState: 'preparing', byUser: operator.id, at: at(-90), note: null },
        { runId: run.id, fromState: 'preparing', toState: 'cleared', byUser: chief.id, at: at(-10), note: null },
        { runId: run.id, fromState: 'cleared', toState: 'running', byUser: operator.id, at: start, note: null },
        { runId: run.id, fromState: 'running', toState: 'stopped', byUser: operator.id, at: stop, note: null },
        { runId: run.id, fromState: 'stopped', toState: 'closed', byUser: chief.id, at: closedAt, note: 'Countersigned.' },
      ]);
      // Alarms of a closed season were answered on the day.
      await m.query(
        `UPDATE alarms SET acknowledged_at = raised_at + interval '2 minutes', acknowledged_by = $2,
                state = CASE WHEN condition_active THEN 'active_acknowledged' ELSE 'normal' END
          WHERE run_id = $1 AND state <> 'normal'`,
        [run.id, operator.id],
      );
      await m.query(
        `UPDATE alarms SET state = 'normal', condition_active = false, returned_at = COALESCE(returned_at, $2) WHERE ` +
          `run_id = $1 AND state <> 'normal'`,
        [run.id, stop],
      );
    });
    await engines.addRunTotals(engine.id, s.hours, revs);
    // The alarms above were closed out in SQL: let the evaluator reload them from the database.
    app.get(AlarmsService).forget(engine.id);
    created++;
  }
  if (!(await db.getRepository(Run).exists({ where: { engineId: engine.id, title: season.today.title } }))) {
    const today = new Date().toISOString().slice(0, 10);
    const crew = season.today.crew.map((e) => users.get(e)!);
    const run = await db.getRepository(Run).save(
      db.getRepository(Run).create({
        engineId: engine.id,
        title: season.today.title,
        purpose: season.today.purpose,
        state: 'preparing',
        plannedFor: today,
        crewIds: crew.map((c) => c.id),
        notes: season.today.notes,
        createdBy: chief.id,
      }),
    );
    await db.getRepository(RunStateChange).insert([
      { runId: run.id, fromState: null, toState: 'planned', byUser: chief.id, at: new Date(Date.now() - 7 * 86400_000), note: null },
      {
        runId: run.id,
        fromState: 'planned',
        toState: 'preparing',
        byUser: crew[0].id,
        at: new Date(),
        note: 'Boiler lit; warming through.',
      },
    ]);
    await engines.setActiveRun(engine.id, run.id);
    created++;
  }
  return created;
}
