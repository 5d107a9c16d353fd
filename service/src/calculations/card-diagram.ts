/**
 * Reading pressures off a calibrated card outline (see calibrateTrace in indicator-card.ts): the
 * upper line (admission and expansion) and the lower line (exhaust and compression) at a given
 * position of the stroke, and the highest pressure on the card (the admission line).
 *
 * The outline is a closed polygon in card coordinates: stroke fraction across, pressure (psig) up.
 * Pure functions; fractions of the stroke and psi gauge as named.
 */
import { CalculationInputError } from './errors.js';

export interface CardOutlinePoint {
  /** Position along the stroke, 0 at the admission end of the diagram and 1 at the release end. */
  strokeFraction: number;
  /** Pressure above the atmospheric line, psi gauge (negative below it). */
  pressurePsig: number;
}

function requireOutline(points: readonly CardOutlinePoint[]): void {
  if (!Array.isArray(points) || points.length < 3) throw new CalculationInputError(null, 'an outline needs at least three points');
  points.forEach((p, i) => {
    if (!Number.isFinite(p?.strokeFraction) || !Number.isFinite(p?.pressurePsig)) {
      throw new CalculationInputError(null, `points[${i}] must have finite strokeFraction and pressurePsig`);
    }
  });
}

/**
 * Pressures (psig) at which the closed outline crosses the vertical line at `strokeFraction`, in no
 * particular order; empty when the line misses the card. Vertices lying on the line count once each.
 */
export function outlineCrossingsPsig(points: readonly CardOutlinePoint[], strokeFraction: number): number[] {
  requireOutline(points);
  if (!Number.isFinite(strokeFraction)) throw new CalculationInputError(null, 'strokeFraction must be a finite number');
  const out: number[] = [];
  const n = points.length;
  for (let i = 0; i < n; i++) {
    const a = points[i];
    const b = points[(i + 1) % n];
    if (a.strokeFraction === strokeFraction) out.push(a.pressurePsig);
    const lo = Math.min(a.strokeFraction, b.strokeFraction);
    const hi = Math.max(a.strokeFraction, b.strokeFraction);
    // Strictly inside the edge's span: vertices on the line were counted above.
    if (lo < strokeFraction && strokeFraction < hi) {
      const t = (strokeFraction - a.strokeFraction) / (b.strokeFraction - a.strokeFraction);
      out.push(a.pressurePsig + t * (b.pressurePsig - a.pressurePsig));
    }
  }
  return out;
}

/** The upper line of the card (steam line) at `strokeFraction`, psig; null where the line misses the card. */
export function upperLinePressurePsig(points: readonly CardOutlinePoint[], strokeFraction: number): number | null {
  const crossings = outlineCrossingsPsig(points, strokeFraction);
  return crossings.length ? Math.max(...crossings) : null;
}

/** The lower line of the card (exhaust and compression) at `strokeFraction`, psig; null where the line misses the card. */
export function lowerLinePressurePsig(points: readonly CardOutlinePoint[], strokeFraction: number): number | null {
  const crossings = outlineCrossingsPsig(points, strokeFraction);
  return crossings.length ? Math.min(...crossings) : null;
}

/** The highest pressure on the card, psig: the top of the admission line. */
export function highestPressurePsig(points: readonly CardOutlinePoint[]): number {
  requireOutline(points);
  return Math.max(...points.map((p) => p.pressurePsig));
}
