/**
 * Bearing temperature drift: is this run's temperature rise out of line with the bearing's own history
 * at comparable load?
 *
 * History points are (load, temperature rise above ambient in °F). "load" is any consistent measure of how
 * hard the engine was working on those runs: indicated horsepower, speed in rpm, or the like; use the same
 * measure for the history and for the run being checked, and leave the run being checked out of the history.
 */

export const DEFAULT_BAND_K = 2;
export const DEFAULT_DRIFT_MARGIN_F = 5;
export const MIN_POINTS_FOR_REGRESSION = 3;

export const DRIFT_RULE_TEXT =
  'Each bearing is compared with its own history. A straight line, temperature rise = a + b \u00d7 load, is ' +
  'fitted by least squares to the earlier runs, with s the standard deviation of the runs about that line. ' +
  'The normal band is the line \u00b1 2s. With fewer than 3 earlier runs, or when they were all at the same ' +
  'load, the band is the mean rise \u00b1 2s instead. A run is flagged as drift when its rise above ambient ' +
  'is more than 5 \u00b0F above the top of the band at its load. Band width and margin are settings.';

export interface DriftPoint {
  /** consistent load measure, e.g. indicated hp or speed rpm */
  load: number;
  /** bearing temperature rise above ambient, °F */
  temperatureRiseF: number;
}

export interface DriftBand {
  kind: 'regression' | 'mean';
  interceptF: number;
  /** °F per unit of load; 0 for the mean band */
  slopeFPerLoad: number;
  /** standard deviation of the history about the line (n − 2) or about the mean (n − 1), °F */
  residualSdF: number;
  k: number;
  pointCount: number;
  loadMin: number;
  loadMax: number;
}

function assertFinite(name: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) throw new RangeError(`${name} must be a finite number`);
}

function mean(values: number[]): number {
  return values.reduce((s, v) => s + v, 0) / values.length;
}

/** Fit the normal band to a bearing's earlier runs. */
export function fitBand(points: DriftPoint[], options: { k?: number } = {}): DriftBand {
  if (points.length === 0) throw new RangeError('at least one earlier run is needed to fit a band');
  const k = options.k ?? DEFAULT_BAND_K;
  assertFinite('k', k);
  if (k <= 0) throw new RangeError('k must be greater than zero');
  for (const p of points) {
    assertFinite('load', p.load);
    assertFinite('temperatureRiseF', p.temperatureRiseF);
  }
  const n = points.length;
  const xs = points.map((p) => p.load);
  const ys = points.map((p) => p.temperatureRiseF);
  const xBar = mean(xs);
  const yBar = mean(ys);
  const sxx = xs.reduce((s, x) => s + (x - xBar) ** 2, 0);
  const loadMin = Math.min(...xs);
  const loadMax = Math.max(...xs);

  if (n >= MIN_POINTS_FOR_REGRESSION && sxx > 0) {
    const sxy = points.reduce((s, p) => s + (p.load - xBar) * (p.temperatureRiseF - yBar), 0);
    const slope = sxy / sxx;
    const intercept = yBar - slope * xBar;
    const sse = points.reduce((s, p) => s + (p.temperatureRiseF - (intercept + slope * p.load)) ** 2, 0);
    return {
      kind: 'regression',
      interceptF: intercept,
      slopeFPerLoad: slope,
      residualSdF: Math.sqrt(sse / (n - 2)),
      k,
      pointCount: n,
      loadMin,
      loadMax,
    };
  }
  const ssAboutMean = ys.reduce((s, y) => s + (y - yBar) ** 2, 0);
  return {
    kind: 'mean',
    interceptF: yBar,
    slopeFPerLoad: 0,
    residualSdF: n > 1 ? Math.sqrt(ssAboutMean / (n - 1)) : 0,
    k,
    pointCount: n,
    loadMin,
    loadMax,
  };
}

/** The band at a load: expected rise and the lower / upper limits (°F). */
export function bandAt(band: DriftBand, load: number): {
  expectedRiseF: number;
  lowerF: number;
  upperF: number;
  /** the load lies outside the loads the band was fitted over (extrapolation) */
  extrapolated: boolean;
} {
  assertFinite('load', load);
  const expectedRiseF = band.interceptF + band.slopeFPerLoad * load;
  const halfWidth = band.k * band.residualSdF;
  return {
    expectedRiseF,
    lowerF: expectedRiseF - halfWidth,
    upperF: expectedRiseF + halfWidth,
    extrapolated: load < band.loadMin || load > band.loadMax,
  };
}

export interface DriftCheck {
  drift: boolean;
  /** upper band + margin: a rise above this is drift, °F */
  limitF: number;
  /** rise minus limit; positive when drifting, °F */
  excessF: number;
  expectedRiseF: number;
  extrapolated: boolean;
}

export function driftCheck(point: DriftPoint, band: DriftBand, options: { marginF?: number } = {}): DriftCheck {
  const marginF = options.marginF ?? DEFAULT_DRIFT_MARGIN_F;
  assertFinite('marginF', marginF);
  assertFinite('temperatureRiseF', point.temperatureRiseF);
  const at = bandAt(band, point.load);
  const limitF = at.upperF + marginF;
  const excessF = point.temperatureRiseF - limitF;
  return { drift: excessF > 0, limitF, excessF, expectedRiseF: at.expectedRiseF, extrapolated: at.extrapolated };
}

/** True when the run's rise exceeds the upper band at its load by more than the margin. */
export function isDrift(point: DriftPoint, band: DriftBand, options: { marginF?: number } = {}): boolean {
  return driftCheck(point, band, options).drift;
}
