import { createHash } from 'node:crypto';
import type { INestApplicationContext } from '@nestjs/common';
import { DataSource } from 'typeorm';
import type { LotStatus, LotWriteRequest, MillWriteRequest, ScheduleWriteRequest, SectionDto } from '@crankjournal/shared-types';
import { Mill } from '../../modules/mill/mill.entity.js';
import { PassSchedule } from '../../modules/mill/pass-schedule.entity.js';
import { CustomerLot } from '../../modules/mill/customer-lot.entity.js';
import { MillBar } from '../../modules/mill/mill-bar.entity.js';
import { LotQuote } from '../../modules/mill/lot-quote.entity.js';
import { MillService } from '../../modules/mill/mill.service.js';
import { SchedulesService } from '../../modules/mill/schedules.service.js';
import { RollingLogService } from '../../modules/mill/rolling-log.service.js';
import { LotsService } from '../../modules/mill/lots.service.js';
import { Run } from '../../modules/runs/run.entity.js';
import type { Engine } from '../../modules/engines/engine.entity.js';
import type { User } from '../../modules/users/user.entity.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { sectionAreaMm2 } from '../../calculations/rolling.js';
import { readSample } from './samples.js';

type TemplateSample = Omit<ScheduleWriteRequest, 'millId' | 'isTemplate'>;
interface LotSample extends LotWriteRequest {
  reference: string;
  enquiryOn: string;
  quotes: { on: string; engineHours: number; crewHours: number; sentOn?: string; notes?: string }[];
  steps: { to: LotStatus; on: string; note?: string }[];
  run?: string;
  schedule?: { name: string; from: string };
  bars?: { prefix: string; count: number; scrapped?: Record<string, string>; cold?: string };
}
interface MillSample {
  mill: Omit<MillWriteRequest, 'engineId'> & { engine: string };
  templates: TemplateSample[];
  lots: LotSample[];
  plans: { name: string; from: string; notes?: string }[];
}

/** Carbon steel, kg per mm³ (7850 kg/m³; common practice, no source). Only for the invented bar weights. */
const STEEL_KG_PER_MM3 = 7.85e-6;

/** A repeatable number in [0, 1) for a key, so the demo is the same on every machine. */
function rnd(...key: string[]): number {
  return createHash('sha256').update(key.join('|')).digest().readUInt32LE(0) / 2 ** 32;
}
const jitter = (span: number, ...key: string[]) => (rnd(...key) - 0.5) * 2 * span;
const round1 = (x: number) => Math.round(x * 10) / 10;
const noon = (day: string) => new Date(`${day}T12:00:00Z`);

function asAuth(u: User): AuthUser {
  return { id: u.id, email: u.email, displayName: u.displayName, role: u.role, sessionVersion: u.sessionVersion };
}

/** The mill, its templates, working schedules, the season's bars and passes, and the customer lots. */
export async function seedMill(app: INestApplicationContext, engine: Engine, users: Map<string, User>): Promise<string> {
  const sample = readSample<MillSample>('mill.json');
  const db = app.get(DataSource);
  const mills = app.get(MillService);
  const schedules = app.get(SchedulesService);
  const rolling = app.get(RollingLogService);
  const lots = app.get(LotsService);
  const lead = asAuth(users.get('mill@alderforge.example')!);
  const chief = asAuth(users.get('chief@alderforge.example')!);
  // The season's lots paid their deposits by cheque, before payments went online: the chief engineer put them on the roll plan.
  const offline = { overrideReason: 'Deposit paid by cheque, before payments were taken online.' };
  const done: string[] = [];

  // The mill.
  let mill = await db.getRepository(Mill).findOne({ where: { name: sample.mill.name } });
  if (!mill) {
    const { engine: _engineName, ...m } = sample.mill;
    await mills.create({ ...m, engineId: engine.id });
    mill = await db.getRepository(Mill).findOneByOrFail({ name: sample.mill.name });
    done.push('mill');
  }
  const millId = mill.id;

  // Templates.
  const templateId = new Map<string, string>();
  for (const t of sample.templates) {
    let row = await db.getRepository(PassSchedule).findOne({ where: { name: t.name, isTemplate: true } });
    if (!row) {
      const created = await schedules.create({ ...t, millId, isTemplate: true }, lead);
      row = await db.getRepository(PassSchedule).findOneByOrFail({ id: created.id });
      done.push(`template "${t.name}"`);
    }
    templateId.set(t.name, row.id);
  }
  const planFrom = async (name: string, from: string, lotId: string | null, notes?: string) => {
    const existing = await db.getRepository(PassSchedule).findOne({ where: { name, isTemplate: false } });
    if (existing) return existing.id;
    const copy = await schedules.copy(templateId.get(from)!, { name, lotId }, lead);
    if (notes) await db.getRepository(PassSchedule).update({ id: copy.id }, { notes });
    return copy.id;
  };

  // Customer lots, step by step on their own dates, with the bars of the runs that rolled them.
  for (const l of sample.lots) {
    if (await db.getRepository(CustomerLot).exists({ where: { reference: l.reference } })) continue;
    const { reference, enquiryOn, quotes, steps, run: runTitle, schedule, bars, ...write } = l;
    const lot = await lots.create({ ...write, millId }, lead, { reference, createdAt: new Date(`${enquiryOn}T09:00:00Z`) });
    const events = [
      ...quotes.map((q) => ({
        on: q.on,
        order: 0,
        act: async () => {
          const made = await lots.createQuote(
            lot.id,
            { engineHours: q.engineHours, crewHours: q.crewHours, notes: q.notes },
            lead,
            new Date(`${q.on}T10:00:00Z`),
          );
          // Sent on the day (recorded as sent; the demo seed sends no e-mail).
          if (q.sentOn)
            await db
              .getRepository(LotQuote)
              .update({ id: made.id }, { sentAt: new Date(`${q.sentOn}T11:00:00Z`), sentTo: l.customerEmail });
        },
      })),
      ...steps.map((s) => ({
        on: s.on,
        order: 1,
        act: async () => {
          if (s.to === 'on_roll_plan' && runTitle) {
            const run = await db.getRepository(Run).findOneByOrFail({ engineId: engine.id, title: runTitle });
            await lots.linkRun(lot.id, run.id, lead);
          }
          if (s.to === 'rolled' && runTitle && bars && schedule) {
            const run = await db.getRepository(Run).findOneByOrFail({ engineId: engine.id, title: runTitle });
            const scheduleId = await planFrom(schedule.name, schedule.from, lot.id);
            const t = await rollSeasonBars(run, scheduleId, lot.id, bars);
            await lots.update(lot.id, { producedTonnes: t.produced, scrappedTonnes: t.scrapped });
          }
          if (s.to === 'on_roll_plan') await lots.transition(lot.id, { to: s.to, note: s.note, ...offline }, chief, noon(s.on));
          else await lots.transition(lot.id, { to: s.to, note: s.note }, lead, noon(s.on));
        },
      })),
    ].sort((a, b) => a.on.localeCompare(b.on) || a.order - b.order);
    for (const e of events) await e.act();
    if (schedule) await planFrom(schedule.name, schedule.from, lot.id);
    done.push(`lot ${reference}`);
  }

  for (const p of sample.plans) await planFrom(p.name, p.from, null, p.notes);

  /** Bars of a closed season run, each pass logged through the rolling log (so the calculation is the real one). */
  async function rollSeasonBars(run: Run, scheduleId: string, lotId: string, spec: NonNullable<LotSample['bars']>) {
    if (await db.getRepository(MillBar).exists({ where: { runId: run.id } })) return { produced: 0, scrapped: 0 };
    const plan = await schedules.detail(scheduleId);
    const start = run.startedAt!.getTime() + 30 * 60_000;
    const runMinutes = ((run.stoppedAt ?? new Date(start)).getTime() - start) / 60_000 - 20;
    const everyMin = Math.min(12, runMinutes / spec.count);
    const billetKg = sectionAreaMm2(plan.stock) * plan.stockLengthMm * STEEL_KG_PER_MM3;
    let produced = 0;
    let scrapped = 0;
    for (let k = 1; k <= spec.count; k++) {
      const code = `${spec.prefix}-${String(k).padStart(2, '0')}`;
      const bar = await rolling.createBar(run.id, { barCode: code, scheduleId, lotId }, lead, { allowClosedRun: true });
      const cold = spec.cold === code;
      const barStart = start + (k - 1) * everyMin * 60_000;
      let lastPass = plan.passes.length;
      for (const p of plan.passes) {
        const drift = (s: SectionDto, what: string): SectionDto => ({
          shape: s.shape,
          heightMm: round1(s.heightMm + jitter(0.4, code, String(p.seq), what, 'h')),
          widthMm:
            s.shape === 'round'
              ? round1(s.heightMm + jitter(0.4, code, String(p.seq), what, 'h'))
              : round1(s.widthMm + jitter(0.6, code, String(p.seq), what, 'w')),
        });
        const logged = await rolling.logPass(
          bar.id,
          {
            passNumber: p.seq,
            standPosition: p.standPosition,
            at: new Date(barStart + (p.seq - 1) * 35_000).toISOString(),
            measuredTemperatureC: Math.round(
              p.expectedTemperatureC - 8 - 12 * rnd(code, String(p.seq), 't') - (cold ? 215 + 16 * (p.seq - 1) : 0),
            ),
            entry: p.entry,
            exit: drift(p.exit, 'exit'),
            notes:
              cold && p.standPosition === 3 ? 'Bar ran cold after the furnace door jammed; stand 3 laboured and the bar was pulled.' : '',
          },
          { id: lead.id },
          { allowClosedRun: true },
        );
        if (cold && logged.calc.exceedsStandForce) {
          lastPass = p.seq;
          break;
        }
      }
      const reason = spec.scrapped?.[code];
      const kg = Math.round(billetKg * (reason ? 1 : 0.93 + jitter(0.01, code, 'kg')) * (lastPass < plan.passes.length ? 0.97 : 1));
      await db.getRepository(MillBar).update({ id: bar.id }, { weightKg: kg, scrapped: !!reason, scrapReason: reason ?? null });
      if (reason) scrapped += kg;
      else produced += kg;
    }
    done.push(`${spec.count} bars on "${run.title}"`);
    return { produced: Math.round(produced / 10) / 100, scrapped: Math.round(scrapped / 10) / 100 };
  }

  return done.length ? `mill: ${done.join(', ')}` : 'mill: already seeded';
}
