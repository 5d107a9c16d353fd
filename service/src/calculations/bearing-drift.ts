import { assertFinite } from './input-checks.js';
import { CalculationInputError } from './errors.js';
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
/** By default any spread of load at all allows the straight-line fit. */
export const DEFAULT_MIN_LOAD_SPREAD = 0;

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

function mean(values: number[]): number {
  return values.reduce((s, v) => s + v, 0) / values.length;
}

/**
 * The rule in words for the settings actually used (band width k, margin, and the least spread of load
 * for which a sloping line is fitted), so the screen states exactly what the code does.
 */
export function driftRuleText(
  settings: { k?: number; marginF?: number; minLoadSpread?: number; loadName?: string; loadUnit?: string } = {},
): string {
  const k = settings.k ?? DEFAULT_BAND_K;
  const marginF = settings.marginF ?? DEFAULT_DRIFT_MARGIN_F;
  const spread = settings.minLoadSpread ?? DEFAULT_MIN_LOAD_SPREAD;
  const load = settings.loadName ?? 'load';
  const unit = settings.loadUnit ? ` ${settings.loadUnit}` : '';
  const fmt = (v: number) => String(Number(v.toFixed(2)));
  const flat =
    spread > 0
      ? `With fewer than ${MIN_POINTS_FOR_REGRESSION} earlier runs, or when their ${load} spans less than ` +
        `${fmt(spread)}${unit} (comparable ${load}), the band is the mean rise \u00b1 ${fmt(k)}s instead.`
      : `With fewer than ${MIN_POINTS_FOR_REGRESSION} earlier runs, or when they were all at the same ${load}, the ` +
        `band is the mean rise \u00b1 ${fmt(k)}s instead.`;
  return (
    `Each bearing is compared with its own history. A straight line, temperature rise = a + b \u00d7 ${load}, is ` +
    `fitted by least squares to the earlier runs, with s the standard deviation of the runs about that line. ` +
    `The normal band is the line \u00b1 ${fmt(k)}s. ${flat} A run is flagged as drift when its rise above ambient ` +
    `is more than ${fmt(marginF)} \u00b0F above the top of the band at its ${load}.`
  );
}

/** Fit the normal band to a bearing's earlier runs. */
export function fitBand(points: DriftPoint[], options: { k?: number; minLoadSpread?: number } = {}): DriftBand {
  if (points.length === 0) throw new CalculationInputError(null, 'at least one earlier run is needed to fit a band');
  const k = options.k ?? DEFAULT_BAND_K;
  assertFinite('k', k);
  if (k <= 0) throw new CalculationInputError(null, 'k must be greater than zero');
  const minLoadSpread = options.minLoadSpread ?? DEFAULT_MIN_LOAD_SPREAD;
  assertFinite('minLoadSpread', minLoadSpread);
  if (minLoadSpread < 0) throw new CalculationInputError(null, 'minLoadSpread must be zero or greater');
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

  // Loads that span less than minLoadSpread are "comparable": a slope fitted across them would be noise.
  if (n >= MIN_POINTS_FOR_REGRESSION && sxx > 0 && loadMax - loadMin >= minLoadSpread) {
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
export function bandAt(
  band: DriftBand,
  load: number,
): {
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

export interface DriftHistoryRun extends DriftPoint {
  id: string;
}
export interface DriftHistoryVerdict {
  id: string;
  /** null for a run with no earlier run to compare with */
  check: DriftCheck | null;
  band: DriftBand | null;
  historyRuns: number;
}

/**
 * Judges each run of a bearing, in the order given (oldest first), against the band fitted to the runs
 * before it. A run already flagged is left out of the bands of the runs after it, so one hot run does not
 * widen the band and hide the next one; the band stays the bearing's usual running.
 */
export function driftHistory(
  runs: DriftHistoryRun[],
  options: { k?: number; marginF?: number; minLoadSpread?: number } = {},
): DriftHistoryVerdict[] {
  const usual: DriftPoint[] = [];
  return runs.map((r) => {
    if (usual.length === 0) {
      usual.push({ load: r.load, temperatureRiseF: r.temperatureRiseF });
      return { id: r.id, check: null, band: null, historyRuns: 0 };
    }
    const band = fitBand(usual, options);
    const check = driftCheck(r, band, options);
    const historyRuns = usual.length;
    if (!check.drift) usual.push({ load: r.load, temperatureRiseF: r.temperatureRiseF });
    return { id: r.id, check, band, historyRuns };
  });
}
