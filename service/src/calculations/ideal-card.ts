/**
 * The ideal (hypothetical) card for a recorded cut-off: admission at constant pressure p1 up to
 * cut-off, hyperbolic expansion (p·V = constant) to the end of the stroke, release straight down to
 * the back pressure pb, exhaust at pb over the whole return stroke; compression and the rounding
 * of the corners are ignored. All pressures ABSOLUTE (psia).
 *
 * Derivation, per unit swept volume (stroke fraction x from 0 to 1), cut-off k, clearance c
 * (clearance volume as a fraction of the swept volume, so the volume is x + c):
 *   admission work       p1 · k
 *   expansion work       ∫ from k to 1 of p1·(k + c)/(x + c) dx = p1 · (k + c) · ln((1 + c)/(k + c))
 *   back-pressure work   pb · 1
 *   p_m = p1 · [k + (k + c)·ln((1 + c)/(k + c))] − pb
 *       = p1 · [(k + c)·(1 + ln((1 + c)/(k + c))) − c] − pb
 * Without clearance (c = 0, expansion ratio r = 1/k) this is the familiar p_m = p1·(1 + ln r)/r − pb.
 *
 * Diagram factor = actual MEP (from the card) ÷ ideal MEP.
 */
import { CalculationInputError } from './errors.js';

export interface IdealCardInput {
  /** Admission (steam-chest side of the card) pressure, psia. */
  admissionPressurePsia: number;
  /** Cut-off as a fraction of the stroke, 0 < k ≤ 1. */
  cutoffFraction: number;
  /** Back (exhaust) pressure, psia. */
  backPressurePsia: number;
  /** Clearance volume as a fraction of the swept volume (default 0). */
  clearanceFraction?: number;
}

/** Caution shown beside the ideal card. */
export const IDEAL_CARD_CAUTION =
  'The ideal card is a yardstick for judging the valve setting, not a pressure rating. This aid ' +
  'serves a qualified crew; working pressures follow the boiler certificate, local codes and licensed practice.';

function validate(input: IdealCardInput): Required<IdealCardInput> {
  const { admissionPressurePsia: p1, cutoffFraction: k, backPressurePsia: pb } = input;
  const c = input.clearanceFraction ?? 0;
  if (!(Number.isFinite(p1) && p1 > 0)) throw new CalculationInputError(null, 'admissionPressurePsia must be greater than zero');
  if (!(Number.isFinite(k) && k > 0 && k <= 1)) throw new CalculationInputError(null, 'cutoffFraction must be above 0 and at most 1');
  if (!(Number.isFinite(pb) && pb >= 0)) throw new CalculationInputError(null, 'backPressurePsia must not be negative (absolute)');
  if (!(Number.isFinite(c) && c >= 0)) throw new CalculationInputError(null, 'clearanceFraction must not be negative');
  return { admissionPressurePsia: p1, cutoffFraction: k, backPressurePsia: pb, clearanceFraction: c };
}

/** Pressure on the ideal expansion line at stroke fraction x (x ≥ cut-off), psia. */
function expansionPressurePsia(p1: number, k: number, c: number, x: number): number {
  return (p1 * (k + c)) / (x + c);
}

/** Mean effective pressure of the ideal hyperbolic card, psi (see the module notes for the formula). */
export function idealMeanEffectivePressurePsi(input: IdealCardInput): number {
  const { admissionPressurePsia: p1, cutoffFraction: k, backPressurePsia: pb, clearanceFraction: c } = validate(input);
  return p1 * ((k + c) * (1 + Math.log((1 + c) / (k + c))) - c) - pb;
}

/** Diagram factor: actual MEP ÷ ideal MEP (a fraction, typically 0.6–0.9). */
export function diagramFactor(input: { actualMeanEffectivePressurePsi: number; idealMeanEffectivePressurePsi: number }): number {
  if (!(input.idealMeanEffectivePressurePsi > 0)) {
    throw new CalculationInputError(null, 'idealMeanEffectivePressurePsi must be greater than zero');
  }
  return input.actualMeanEffectivePressurePsi / input.idealMeanEffectivePressurePsi;
}

export interface IdealCardPoint {
  /** Piston position, fraction of the stroke (0 to 1): the card's horizontal axis. */
  strokeFraction: number;
  /** Cylinder volume including clearance, as a fraction of the swept volume (strokeFraction + clearance). */
  volumeFraction: number;
  pressurePsia: number;
}

/**
 * The ideal card as a closed polyline for plotting under the real card: admission line, hyperbolic
 * expansion (`expansionSegments` chords), release, exhaust line back to the start, and the
 * admission edge; the last point repeats the first.
 */
export function idealCardPoints(input: IdealCardInput & { expansionSegments?: number }): IdealCardPoint[] {
  const { admissionPressurePsia: p1, cutoffFraction: k, backPressurePsia: pb, clearanceFraction: c } = validate(input);
  const segments = input.expansionSegments ?? 32;
  if (!Number.isInteger(segments) || segments < 1) throw new CalculationInputError(null, 'expansionSegments must be a positive integer');
  const at = (x: number, p: number): IdealCardPoint => ({ strokeFraction: x, volumeFraction: x + c, pressurePsia: p });
  const points: IdealCardPoint[] = [at(0, p1)];
  const chords = k < 1 ? segments : 0; // cut-off at the end of the stroke: no expansion line
  for (let i = 0; i <= chords; i++) {
    const x = chords === 0 ? 1 : k + ((1 - k) * i) / chords;
    points.push(at(x, expansionPressurePsia(p1, k, c, x)));
  }
  points.push(at(1, pb), at(0, pb), at(0, p1));
  return points;
}
