import type { INestApplicationContext } from '@nestjs/common';
import { DataSource } from 'typeorm';
import type { CardInput } from '@crankjournal/shared-types';
import { Run } from '../../modules/runs/run.entity.js';
import type { Engine } from '../../modules/engines/engine.entity.js';
import { EnginesService } from '../../modules/engines/engines.service.js';
import type { User } from '../../modules/users/user.entity.js';
import { CardSet } from '../../modules/indicator-cards/card-set.entity.js';
import { BrakeFigure } from '../../modules/indicator-cards/brake-figure.entity.js';
import { CardSetsService } from '../../modules/indicator-cards/card-sets.service.js';
import { CardImagesService } from '../../modules/indicator-cards/card-images.service.js';
import { drawIndicatorCard } from './card-image.js';
import { admissionReadOffPsig, midOrdinatesIn, planimeterAreaSqIn, readCardSamples, sampleCards } from './indicator-card-samples.js';

/**
 * Card sets of the 2026 season (samples/indicator-cards.json): traced card images stored in the object
 * store with the trace made on each, planimeter and mid-ordinate cards, one amended card and one brake
 * figure. Written through the same service as the API (its run-state checks aside, as the season's runs
 * are closed). Idempotent: a set is matched by its run and moment, a brake figure likewise.
 */
export async function seedIndicatorCards(app: INestApplicationContext, engine: Engine, users: Map<string, User>): Promise<number> {
  const samples = readCardSamples();
  const db = app.get(DataSource);
  const sets = app.get(CardSetsService);
  const images = app.get(CardImagesService);
  const detail = await app.get(EnginesService).detail(engine.id);
  const cylinderId = new Map(detail.cylinders.map((c) => [c.label, c.id]));
  const chief = users.get('chief@alderforge.example')!;
  let created = 0;

  const runOf = async (title: string) => db.getRepository(Run).findOne({ where: { engineId: engine.id, title } });
  const at = (run: Run, minutes: number) => new Date(run.startedAt!.getTime() + minutes * 60_000);

  for (const s of samples.sets) {
    const run = await runOf(s.run);
    if (!run?.startedAt) continue;
    const takenAt = at(run, s.minutes);
    if (await db.getRepository(CardSet).exists({ where: { runId: run.id, takenAt } })) continue;
    const takenBy = run.crewIds[0] ?? chief.id;
    const amendment = samples.amendments.find((a) => a.run === s.run && a.minutes === s.minutes);
    const cards: CardInput[] = [];
    for (const card of sampleCards(samples, s)) {
      const common = {
        cylinderId: cylinderId.get(card.cylinder)!,
        end: card.end,
        springPsiPerIn: card.springPsiPerIn,
        cutOffPercent: card.cylinder === 'HP' ? null : card.cutOffPercent,
        compressionPercent: card.compressionPercent,
      };
      if (card.method === 'trace') {
        const drawn = drawIndicatorCard(card.drawing);
        const image = await images.store(run.id, drawn.png, takenBy);
        cards.push({ ...common, lengthIn: card.lengthIn, imageId: image.id, trace: drawn.trace });
      } else if (card.method === 'planimeter') {
        const off = amendment && amendment.cylinder === card.cylinder && amendment.end === card.end ? amendment.firstFigureOffBySqIn : 0;
        cards.push({ ...common, lengthIn: card.lengthIn, areaSqIn: Math.round((planimeterAreaSqIn(card) + off) * 100) / 100 });
      } else {
        cards.push({ ...common, ordinatesIn: midOrdinatesIn(card) });
      }
      // The low-pressure admission read off the card with a scale, for the receiver drop (a trace gives its own).
      if (card.method !== 'trace' && card.cylinder === 'LP') cards[cards.length - 1].admissionPressurePsig = admissionReadOffPsig(card);
    }
    const hp = sampleCards(samples, s)[0];
    const set = await sets.create(
      run.id,
      { takenAt: takenAt.toISOString(), cutOffPercent: hp.cutOffPercent, notes: s.notes ?? null, cards },
      { id: takenBy },
      { seed: true },
    );
    created++;

    // The amended card of this set: the first planimeter figure was wrong and was corrected the same day.
    if (amendment) {
      const wrong = set.cards.find((c) => c.cylinderLabel === amendment.cylinder && c.end === amendment.end)!;
      const right = Math.round((wrong.areaSqIn! - amendment.firstFigureOffBySqIn) * 100) / 100;
      await sets.amendCard(
        wrong.id,
        {
          springPsiPerIn: wrong.springPsiPerIn,
          lengthIn: wrong.lengthIn,
          areaSqIn: right,
          cutOffPercent: wrong.cutOffPercent,
          compressionPercent: wrong.compressionPercent,
          admissionPressurePsig: wrong.admissionPressurePsig,
          note: wrong.note,
          reason: amendment.reason,
        },
        { id: chief.id },
        { seed: true, at: new Date(takenAt.getTime() + 40 * 60_000) },
      );
    }
  }

  for (const b of samples.brakeFigures) {
    const run = await runOf(b.run);
    if (!run?.startedAt) continue;
    const measuredAt = at(run, b.minutes);
    if (await db.getRepository(BrakeFigure).exists({ where: { runId: run.id, measuredAt } })) continue;
    await sets.addBrakeFigure(
      run.id,
      { measuredAt: measuredAt.toISOString(), method: b.method, torqueLbfFt: b.torqueLbfFt, speedRpm: b.speedRpm, note: b.note },
      { id: chief.id },
      { seed: true },
    );
  }

  // Keep the record's order plausible: a seeded card's creation time is the moment its set was taken.
  await db.query(
    `UPDATE card_sets SET created_at = taken_at + interval '10 minutes' WHERE created_at > taken_at + interval '1 ` +
      `day' AND run_id IN (SELECT id FROM runs WHERE engine_id = $1)`,
    [engine.id],
  );
  await db.query(
    `UPDATE indicator_cards c SET created_at = s.taken_at + interval '10 minutes' FROM card_sets s WHERE ` +
      `c.card_set_id = s.id AND c.created_at > s.taken_at + interval '1 day' AND s.engine_id = $1`,
    [engine.id],
  );
  await db.query(
    `UPDATE brake_figures SET created_at = measured_at + interval '5 minutes' WHERE created_at > measured_at + ` +
      `interval '1 day' AND run_id IN (SELECT id FROM runs WHERE engine_id = $1)`,
    [engine.id],
  );
  return created;
}
