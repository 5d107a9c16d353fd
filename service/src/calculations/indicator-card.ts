/**
 * One indicator card: its mean height and mean effective pressure, found three ways.
 *
 *  (a) planimeter: the card's area (in²) ÷ its length (in) = mean height (in);
 *      mean height × spring scale (psi per inch of height) = mean effective pressure (psi).
 *  (b) mid-ordinates: n ordinates measured across the card at equal spacing, the two end ones
 *      half a spacing in from the ends (each ordinate stands at the middle of its own strip);
 *      their arithmetic mean is the mean height.
 *  (c) a traced outline (from a photo or scan): the enclosed area by the shoelace formula, after
 *      calibrating the image against the atmospheric line and the two ends of the diagram.
 *
 * Pure functions; lengths in inches, pressures in psi. Invalid input throws RangeError.
 */
import { CalculationInputError } from './errors.js';

/** A point in a plane. In image space x grows to the right and y grows DOWNWARD (pixels). */
export interface Point {
  x: number;
  y: number;
}

/** Caution shown beside card calculations: cards are taken at live steam cocks. */
export const INDICATOR_CARD_CAUTION =
  'Indicator cards are taken at cylinder cocks under live steam. This calculation aids a qualified ' +
  'crew; fitting and removing indicators follows the site procedure, local codes and licensed practice.';

function requireFinite(value: number, name: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new CalculationInputError(null, `${name} must be a finite number`);
  }
}

function requirePositive(value: number, name: string): void {
  requireFinite(value, name);
  if (value <= 0) throw new CalculationInputError(null, `${name} must be greater than zero`);
}

/** Mean effective pressure (psi) from a card's mean height (in) and the spring scale (psi per in). */
export function mepFromMeanHeight(meanHeightIn: number, springPsiPerIn: number): number {
  requireFinite(meanHeightIn, 'meanHeightIn');
  requirePositive(springPsiPerIn, 'springPsiPerIn');
  return meanHeightIn * springPsiPerIn;
}

/** Mean height (in) of a card from its enclosed area (in²) and its length (in). */
export function meanHeightFromAreaIn(areaSqIn: number, lengthIn: number): number {
  requireFinite(areaSqIn, 'areaSqIn');
  if (areaSqIn < 0) throw new CalculationInputError(null, 'areaSqIn must not be negative');
  requirePositive(lengthIn, 'lengthIn');
  return areaSqIn / lengthIn;
}

export interface CardMeanPressure {
  meanHeightIn: number;
  meanEffectivePressurePsi: number;
}

/** (a) Planimeter figure: area (in²), card length (in) and spring scale (psi per in). */
export function mepFromPlanimeter(input: { areaSqIn: number; lengthIn: number; springPsiPerIn: number }): CardMeanPressure {
  const meanHeightIn = meanHeightFromAreaIn(input.areaSqIn, input.lengthIn);
  return { meanHeightIn, meanEffectivePressurePsi: mepFromMeanHeight(meanHeightIn, input.springPsiPerIn) };
}

/**
 * Where to draw n mid-ordinates, as fractions of the card length: (i + ½)/n, so the end ordinates
 * stand half a spacing in from the ends of the diagram (ten is the usual count).
 */
export function midOrdinateStationsFraction(count: number): number[] {
  if (!Number.isInteger(count) || count < 2) throw new CalculationInputError(null, 'count must be an integer of at least 2');
  return Array.from({ length: count }, (_, i) => (i + 0.5) / count);
}

/**
 * (b) Mean height (in) by the mid-ordinate rule: the arithmetic mean of the ordinates, each measured
 * (in inches) at the stations of {@link midOrdinateStationsFraction}. At least two ordinates.
 * An ordinate may be negative where a loop of the card runs the other way.
 */
export function meanHeightFromOrdinatesIn(ordinatesIn: readonly number[]): number {
  if (!Array.isArray(ordinatesIn) || ordinatesIn.length < 2) {
    throw new CalculationInputError(null, 'ordinatesIn needs at least two ordinates');
  }
  ordinatesIn.forEach((o, i) => requireFinite(o, `ordinatesIn[${i}]`));
  return ordinatesIn.reduce((sum, o) => sum + o, 0) / ordinatesIn.length;
}

/** (b) Mid-ordinates (in) and spring scale (psi per in) → mean height and MEP. */
export function mepFromOrdinates(input: { ordinatesIn: readonly number[]; springPsiPerIn: number }): CardMeanPressure {
  const meanHeightIn = meanHeightFromOrdinatesIn(input.ordinatesIn);
  return { meanHeightIn, meanEffectivePressurePsi: mepFromMeanHeight(meanHeightIn, input.springPsiPerIn) };
}

/**
 * Signed area of a closed polygon by the shoelace (surveyor's) formula: positive when the vertices run
 * counter-clockwise in a y-up frame. The polygon is closed implicitly (last vertex joins the first);
 * repeating the first vertex at the end changes nothing.
 */
export function signedShoelaceArea(points: readonly Point[]): number {
  if (!Array.isArray(points) || points.length < 3) throw new CalculationInputError(null, 'a polygon needs at least three points');
  let twiceArea = 0;
  for (let i = 0; i < points.length; i++) {
    const a = points[i];
    const b = points[(i + 1) % points.length];
    requireFinite(a.x, `points[${i}].x`);
    requireFinite(a.y, `points[${i}].y`);
    twiceArea += a.x * b.y - b.x * a.y;
  }
  return twiceArea / 2;
}

/**
 * (c) Absolute area of a closed polygon given its vertices in order. For a trace that crosses itself
 * (a card with a loop) the loops traced the other way subtract, which is the net work of the card.
 */
export function shoelaceArea(points: readonly Point[]): number {
  return Math.abs(signedShoelaceArea(points));
}

/**
 * Calibration of a traced card image.
 *
 * Model: the user marks two points on the atmospheric line (it may be slightly tilted in the photo)
 * and the two ends of the diagram. The image is turned so the atmospheric line is horizontal, with
 * its left-hand marked point as origin; "up" (away from the paper's bottom) is positive pressure.
 * The distance between the two ends, measured along the atmospheric line, is the card length:
 *  - horizontal scale = `pixelsPerInch` if given, else that distance ÷ `cardLengthIn`;
 *  - vertical scale = `verticalPixelsPerInch` if given, else the horizontal scale (square pixels).
 * Heights above the atmospheric line × spring scale are pressures in psi gauge (below it, vacuum).
 * Note: the mean effective pressure depends only on the vertical scale, since the horizontal scale
 * cancels between the area and the length.
 */
export interface TraceCalibrationInput {
  /** Two points on the atmospheric line, image pixels; order does not matter. */
  atmosphericLine: readonly [Point, Point];
  /** One end of the diagram: a clicked point, or just its x pixel (taken on the atmospheric line). */
  diagramStartPx: Point | number;
  /** The other end of the diagram, as above. Stroke fraction runs from start (0) to end (1). */
  diagramEndPx: Point | number;
  /** The traced outline, image pixels, in drawing order (closed implicitly). */
  tracePx: readonly Point[];
  /** Spring scale, psi per inch of pen height. */
  springPsiPerIn: number;
  /** Length of the diagram on the card, inches; sets the scale when pixelsPerInch is not given. */
  cardLengthIn?: number;
  /** Known image scale (e.g. from the scanner's dpi), pixels per inch. */
  pixelsPerInch?: number;
  /** A separate vertical scale, pixels per inch, where the image is not square. */
  verticalPixelsPerInch?: number;
}

export interface CalibratedTracePoint {
  /** Position along the stroke, 0 at diagramStart and 1 at diagramEnd. */
  strokeFraction: number;
  /** Pressure above the atmospheric line, psi gauge (negative below it). */
  pressurePsig: number;
  /** Position along the card from diagramStart, inches. */
  xIn: number;
  /** Height above the atmospheric line, inches. */
  heightIn: number;
}

export interface TraceCalibrationResult {
  points: CalibratedTracePoint[];
  /** Tilt of the atmospheric line in the image, radians (positive = clockwise on screen). */
  atmosphericLineTiltRad: number;
  horizontalPixelsPerInch: number;
  verticalPixelsPerInch: number;
  lengthIn: number;
  areaSqIn: number;
  meanHeightIn: number;
  meanEffectivePressurePsi: number;
}

function requirePoint(p: Point, name: string): void {
  if (p == null || typeof p !== 'object') throw new CalculationInputError(null, `${name} must be a point {x, y}`);
  requireFinite(p.x, `${name}.x`);
  requireFinite(p.y, `${name}.y`);
}

/** Converts a traced card image into card coordinates and works out its area and MEP. */
export function calibrateTrace(input: TraceCalibrationInput): TraceCalibrationResult {
  const { atmosphericLine, tracePx } = input;
  if (!Array.isArray(atmosphericLine) || atmosphericLine.length !== 2) {
    throw new CalculationInputError(null, 'atmosphericLine needs exactly two points');
  }
  requirePoint(atmosphericLine[0], 'atmosphericLine[0]');
  requirePoint(atmosphericLine[1], 'atmosphericLine[1]');
  requirePositive(input.springPsiPerIn, 'springPsiPerIn');
  if (!Array.isArray(tracePx) || tracePx.length < 3) throw new CalculationInputError(null, 'tracePx needs at least three points');
  tracePx.forEach((p, i) => requirePoint(p, `tracePx[${i}]`));

  // Orient the atmospheric line left to right on screen, so "up" is unambiguous.
  const [a0, a1] = atmosphericLine[0].x <= atmosphericLine[1].x ? atmosphericLine : [atmosphericLine[1], atmosphericLine[0]];
  const dx = a1.x - a0.x;
  const dy = a1.y - a0.y;
  const lineLengthPx = Math.hypot(dx, dy);
  if (lineLengthPx === 0) throw new CalculationInputError(null, 'atmosphericLine points must differ');
  if (Math.abs(dy) >= Math.abs(dx)) throw new CalculationInputError(null, 'atmosphericLine must be closer to horizontal than vertical');
  const ex = dx / lineLengthPx; // unit vector along the line
  const ey = dy / lineLengthPx;
  // Upward normal in a y-down image: (ey, -ex).
  const along = (p: Point) => (p.x - a0.x) * ex + (p.y - a0.y) * ey;
  const up = (p: Point) => (p.x - a0.x) * ey - (p.y - a0.y) * ex;

  const endAlong = (end: Point | number, name: string): number => {
    if (typeof end === 'number') {
      requireFinite(end, name);
      // The point of the atmospheric line at that x.
      return (end - a0.x) / ex;
    }
    requirePoint(end, name);
    return along(end);
  };
  const startAlongPx = endAlong(input.diagramStartPx, 'diagramStartPx');
  const endAlongPx = endAlong(input.diagramEndPx, 'diagramEndPx');
  const extentPx = endAlongPx - startAlongPx;
  if (extentPx === 0) throw new CalculationInputError(null, 'diagramStartPx and diagramEndPx must differ');

  let horizontalPixelsPerInch: number;
  if (input.pixelsPerInch != null) {
    requirePositive(input.pixelsPerInch, 'pixelsPerInch');
    horizontalPixelsPerInch = input.pixelsPerInch;
  } else if (input.cardLengthIn != null) {
    requirePositive(input.cardLengthIn, 'cardLengthIn');
    horizontalPixelsPerInch = Math.abs(extentPx) / input.cardLengthIn;
  } else {
    throw new CalculationInputError(null, 'give cardLengthIn or pixelsPerInch to set the scale');
  }
  let verticalPixelsPerInch = horizontalPixelsPerInch;
  if (input.verticalPixelsPerInch != null) {
    requirePositive(input.verticalPixelsPerInch, 'verticalPixelsPerInch');
    verticalPixelsPerInch = input.verticalPixelsPerInch;
  }

  const lengthIn = Math.abs(extentPx) / horizontalPixelsPerInch;
  const direction = Math.sign(extentPx);
  const points: CalibratedTracePoint[] = tracePx.map((p) => {
    const xIn = ((along(p) - startAlongPx) * direction) / horizontalPixelsPerInch;
    const heightIn = up(p) / verticalPixelsPerInch;
    return {
      strokeFraction: xIn / lengthIn,
      pressurePsig: heightIn * input.springPsiPerIn,
      xIn,
      heightIn,
    };
  });
  const areaSqIn = shoelaceArea(points.map((p) => ({ x: p.xIn, y: p.heightIn })));
  const { meanHeightIn, meanEffectivePressurePsi } = mepFromPlanimeter({
    areaSqIn,
    lengthIn,
    springPsiPerIn: input.springPsiPerIn,
  });
  return {
    points,
    atmosphericLineTiltRad: Math.atan2(dy, dx),
    horizontalPixelsPerInch,
    verticalPixelsPerInch,
    lengthIn,
    areaSqIn,
    meanHeightIn,
    meanEffectivePressurePsi,
  };
}
