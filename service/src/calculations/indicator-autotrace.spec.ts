/**
 * The automatic tracer against cards of known outline. The mean effective pressure of a card is its
 * net enclosed area over its length, times the spring scale: common practice, no source (the
 * planimeter rule that indicator-card.ts already uses). The cards are drawn by the test itself
 * (database/seeds/autotrace-cards.ts) and by the demo's drawing (database/seeds/card-image.ts).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { PNG } from 'pngjs';
import { drawTestCard, outlineMepPsi, testCardSpecs, testOutlines, type TestCardSpec } from '../database/seeds/autotrace-cards.js';
import { readCardSamples, sampleCards } from '../database/seeds/indicator-card-samples.js';
import { SAMPLES_DIR } from '../database/seeds/samples.js';
import { realisticOutline } from '../database/seeds/card-image.js';
import { autotraceCard } from './indicator-autotrace.js';
import { idealCardPoints } from './ideal-card.js';
import { calibrateTrace } from './indicator-card.js';
import { psiaToPsig } from './units.js';

const CARDS_DIR = join(SAMPLES_DIR, 'cards');
const baseCondition = { tiltDeg: 2, unevenLight: 0.2, shadow: false, noise: 3, blurPx: 0, jpegQuality: 0 };

/**
 * Each card is drawn and traced in about half a second of CPU; on a shared, busy machine that has stretched to 5 s.
 * (The cards stay at 120 px per inch: at 96 the mean error rose to 0.56 % and one card to 1.56 %, past the limits.)
 */
const SLOW_MS = 120_000;

describe('automatic card tracing', () => {
  const errors: number[] = [];

  it.each(testCardSpecs().map((s) => [s.name, s] as [string, TestCardSpec]))(
    '%s: MEP within 1.5 %% of the drawn outline',
    (_name, spec) => {
      const card = drawTestCard(spec);
      const result = autotraceCard(card, { lengthIn: spec.lengthIn, springPsiPerIn: spec.springPsiPerIn });
      expect(result.proposal.reasons.filter((r) => r.code !== 'several-loops')).toEqual([]);
      expect(result.proposal.found).toBe(true);
      const error = result.meanEffectivePressurePsi! / card.meanEffectivePressurePsi - 1;
      errors.push(Math.abs(error));
      expect(Math.abs(error)).toBeLessThan(0.015);
    },
    SLOW_MS,
  );

  it(
    'is within 0.5 % on average over the test set',
    () => {
      expect(errors.length).toBe(testCardSpecs().length);
      expect(errors.reduce((a, b) => a + b, 0) / errors.length).toBeLessThan(0.005);
    },
    SLOW_MS,
  );

  // Cards with what the test set lacks: a printed frame and grid on the card, and an exhaust line lying on the
  // atmospheric line (a non-condensing engine exhausting at atmospheric pressure, so the two lines are one).
  const exhaustOnLine = idealCardPoints({
    admissionPressurePsia: 114.7,
    cutoffFraction: 0.3,
    backPressurePsia: 14.7,
    clearanceFraction: 0.06,
    expansionSegments: 48,
  })
    .slice(0, -1)
    .map((p) => ({ strokeFraction: p.strokeFraction, pressurePsig: psiaToPsig(p.pressurePsia) }));
  const [ideal, , wire] = testOutlines();
  const printedAndOnLine: [string, Partial<TestCardSpec>][] = [
    ['printed frame', { outlines: [wire.outline], printedBorder: true, tiltDeg: -6 }],
    ['printed quarter-inch grid', { outlines: [wire.outline], grid: true, tiltDeg: -6 }],
    ['printed frame and grid', { outlines: [ideal.outline], grid: true, printedBorder: true, tiltDeg: 5, jpegQuality: 70 }],
    ['exhaust on the atmospheric line', { outlines: [exhaustOnLine] }],
    ['exhaust on the atmospheric line, turned and compressed', { outlines: [exhaustOnLine], tiltDeg: -7, jpegQuality: 70 }],
  ];
  it.each(printedAndOnLine)(
    '%s: MEP within 1.5 %% of the drawn outline',
    (name, over) => {
      const card = drawTestCard({ ...baseCondition, name, springPsiPerIn: 60, lengthIn: 3.5, outlines: [], ...over });
      const result = autotraceCard(card, { lengthIn: 3.5, springPsiPerIn: 60 });
      expect(result.proposal.reasons).toEqual([]);
      expect(Math.abs(result.meanEffectivePressurePsi! / card.meanEffectivePressurePsi - 1)).toBeLessThan(0.015);
    },
    SLOW_MS,
  );

  it(
    'refuses a card with two diagrams, naming the reason',
    () => {
      const [a, b] = testOutlines();
      const card = drawTestCard({ ...baseCondition, name: 'two', outlines: [a.outline, b.outline], springPsiPerIn: 60, lengthIn: 5 });
      const result = autotraceCard(card, { lengthIn: 2.3, springPsiPerIn: 60 });
      expect(result.proposal.found).toBe(false);
      expect(result.proposal.reasons.map((r) => r.code)).toContain('two-diagrams');
      expect(result.meanEffectivePressurePsi).toBeNull();
    },
    SLOW_MS,
  );

  it(
    'refuses a card with no diagram, naming the reason',
    () => {
      const card = drawTestCard({ ...baseCondition, name: 'none', outlines: [], springPsiPerIn: 60, lengthIn: 3.5 });
      const result = autotraceCard(card, { lengthIn: 3.5, springPsiPerIn: 60 });
      expect(result.proposal.found).toBe(false);
      expect(result.proposal.reasons.map((r) => r.code)).toContain('no-diagram');
    },
    SLOW_MS,
  );

  it(
    'refuses a blank photograph as too little contrast',
    () => {
      const width = 300;
      const height = 200;
      const data = new Uint8Array(width * height * 4).fill(200);
      const result = autotraceCard({ data, width, height }, { lengthIn: 3.5, springPsiPerIn: 60 });
      expect(result.proposal.found).toBe(false);
      expect(result.proposal.reasons.map((r) => r.code)).toEqual(['low-contrast']);
    },
    SLOW_MS,
  );

  const samples = readCardSamples();
  const demoCards = samples.sets.filter((s) => s.method === 'trace').flatMap((set) => sampleCards(samples, set));
  // The demo's pen rounding (card-image.ts smooths the outline) draws each diagram 2 to 3 px shorter than
  // its 490 px: from the card length alone the scale is then off by that much (about 1 % in MEP), so the
  // demo cards are held to 1 % with their scan's known pixels per inch, and to 1.5 % from the length alone.
  // The images are the committed ones (samples/cards, what the demo ships), each traced once and calibrated
  // both ways; the truth is the outline each was drawn from.
  it.each(demoCards.map((c) => [c.name, c] as const))(
    'demo card %s: within 1 %% of the values it was drawn from',
    (_name, card) => {
      const png = PNG.sync.read(readFileSync(join(CARDS_DIR, `${card.name}.png`)));
      const truth = outlineMepPsi(realisticOutline(card.drawing));
      const known = autotraceCard(
        { data: png.data, width: png.width, height: png.height },
        { lengthIn: card.lengthIn, springPsiPerIn: card.springPsiPerIn, pixelsPerInch: samples.pixelsPerInch },
      );
      expect(known.proposal.found).toBe(true);
      expect(Math.abs(known.meanEffectivePressurePsi! / truth - 1)).toBeLessThan(0.01);
      const t = known.trace!;
      const fromLength = calibrateTrace({
        atmosphericLine: t.atmosphericLine,
        diagramStartPx: t.admissionEndPx,
        diagramEndPx: t.releaseEndPx,
        tracePx: t.pointsPx,
        springPsiPerIn: card.springPsiPerIn,
        cardLengthIn: card.lengthIn,
      });
      expect(Math.abs(fromLength.meanEffectivePressurePsi / truth - 1)).toBeLessThan(0.015);
    },
    SLOW_MS,
  );
});
