/**
 * The demo's card sets as described in samples/indicator-cards.json, turned into card drawings and
 * card figures. Shared by the seed (seed-indicator-cards.ts) and the script that writes the card
 * images into samples/cards/ (draw-cards.ts), so both make the very same pictures.
 */
import type { CylinderEnd } from '@crankjournal/shared-types';
import { psigToPsia } from '../../calculations/units.js';
import { vacuumInHgToPsia } from '../../calculations/vacuum.js';
import { midOrdinateStationsFraction, shoelaceArea } from '../../calculations/indicator-card.js';
import { highestPressurePsig, lowerLinePressurePsig, upperLinePressurePsig } from '../../calculations/card-diagram.js';
import { realisticOutline, type CardDrawingSpec } from './card-image.js';
import { readSample } from './samples.js';

export type CardSampleMethod = 'trace' | 'planimeter' | 'ordinates';

interface CylinderSettings {
  springPsiPerIn: number;
  cutOffPercent: number;
  compressionPercent: number;
  wireDrawing: number;
  compressionHook: number;
}
export interface CardSamples {
  engine: string;
  cardLengthIn: number;
  pixelsPerInch: number;
  cylinders: Record<'HP' | 'LP', CylinderSettings>;
  pressures: {
    throttlePsig: number;
    receiverPsig: number;
    vacuumInHg: number;
    throttleToChestDropPsi: number;
    receiverToChestDropPsi: number;
    exhaustBackPressureRisePsi: Record<'HP' | 'LP', number>;
  };
  sets: { run: string; minutes: number; method: CardSampleMethod; hpCutOffPercent: number; notes?: string }[];
  amendments: { run: string; minutes: number; cylinder: 'HP' | 'LP'; end: CylinderEnd; firstFigureOffBySqIn: number; reason: string }[];
  brakeFigures: { run: string; minutes: number; method: 'torque'; torqueLbfFt: number; speedRpm: number; note: string }[];
}

export interface SampleCard {
  /** File name in samples/cards/ for a traced card. */
  name: string;
  cylinder: 'HP' | 'LP';
  end: CylinderEnd;
  method: CardSampleMethod;
  springPsiPerIn: number;
  lengthIn: number;
  cutOffPercent: number;
  compressionPercent: number;
  drawing: CardDrawingSpec;
}

export function readCardSamples(): CardSamples {
  return readSample<CardSamples>('indicator-cards.json');
}

const slug = (s: string) =>
  s
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '');

/** The four cards of one set (HP and LP, head and crank ends), with the drawing each is made from. */
export function sampleCards(samples: CardSamples, set: CardSamples['sets'][number]): SampleCard[] {
  const p = samples.pressures;
  const receiverPsia = psigToPsia(p.receiverPsig);
  const condenserPsia = vacuumInHgToPsia(p.vacuumInHg);
  const out: SampleCard[] = [];
  for (const cylinder of ['HP', 'LP'] as const) {
    const c = samples.cylinders[cylinder];
    const cutOffPercent = cylinder === 'HP' ? set.hpCutOffPercent : c.cutOffPercent;
    for (const end of ['head', 'crank'] as const) {
      const name = `${slug(set.run)}-${String(set.minutes).padStart(3, '0')}-${cylinder.toLowerCase()}-${end}`;
      out.push({
        name,
        cylinder,
        end,
        method: set.method,
        springPsiPerIn: c.springPsiPerIn,
        lengthIn: samples.cardLengthIn,
        cutOffPercent,
        compressionPercent: c.compressionPercent,
        drawing: {
          seed: name,
          end,
          admissionPressurePsia:
            cylinder === 'HP' ? psigToPsia(p.throttlePsig - p.throttleToChestDropPsi) : receiverPsia - p.receiverToChestDropPsi,
          backPressurePsia: (cylinder === 'HP' ? receiverPsia : condenserPsia) + p.exhaustBackPressureRisePsi[cylinder],
          cutOffFraction: cutOffPercent / 100,
          // The crank end has the rod's displacement, so a touch more clearance as a fraction of its swept volume.
          clearanceFraction: (cylinder === 'HP' ? 0.08 : 0.06) * (end === 'crank' ? 1.05 : 1),
          springPsiPerIn: c.springPsiPerIn,
          lengthIn: samples.cardLengthIn,
          wireDrawing: c.wireDrawing * (end === 'crank' ? 1.15 : 1),
          compressionFraction: c.compressionPercent / 100,
          compressionHook: c.compressionHook,
          pixelsPerInch: samples.pixelsPerInch,
        },
      });
    }
  }
  return out;
}

/** The planimeter figure a careful person reads off the drawn card: its area to 0.01 in². */
export function planimeterAreaSqIn(card: SampleCard): number {
  const outline = realisticOutline(card.drawing);
  const area = shoelaceArea(outline.map((q) => ({ x: q.strokeFraction * card.lengthIn, y: q.pressurePsig / card.springPsiPerIn })));
  return Math.round(area * 100) / 100;
}

/** Ten mid-ordinates measured on the drawn card with a scale, to 0.01 in. */
export function midOrdinatesIn(card: SampleCard): number[] {
  const outline = realisticOutline(card.drawing);
  return midOrdinateStationsFraction(10).map((f) => {
    const top = upperLinePressurePsig(outline, f) ?? 0;
    const bottom = lowerLinePressurePsig(outline, f) ?? 0;
    return Math.round(((top - bottom) / card.springPsiPerIn) * 100) / 100;
  });
}

/** The admission pressure read off the drawn card with a scale, to half a psi. */
export function admissionReadOffPsig(card: SampleCard): number {
  return Math.round(highestPressurePsig(realisticOutline(card.drawing)) * 2) / 2;
}
