import tQuantile from '@stdlib/stats-base-dists-t-quantile';
import { assertFinite } from './input-checks.js';
import { CalculationInputError } from './errors.js';
/**
 * Bearing temperature drift: is this run's temperature rise out of line with the bearing's own history
 * at comparable load?
 *
 * History points are (load, temperature rise above ambient in °F). "load" is any consistent measure of how
 * hard the engine was working on those runs: indicated horsepower, speed in rpm, or the like; use the same
 * measure for the history and for the run being checked, and leave the run being checked out of the history.
 *
 * The band is a prediction interval for one more run (D. C. Montgomery, G. C. Runger, "Applied Statistics and
 * Probability for Engineers", Wiley, 3rd ed. or later: ch. 11, prediction of new observations in simple linear
 * regression, and ch. 8, the prediction interval for a future observation of a normal sample; section numbers from
 * memory): half-width t(1 − α/2, ν) · s · √(1 + 1/n + (x − x̄)²/Sxx) about the line (ν = n − 2), or
 * t(1 − α/2, ν) · s · √(1 + 1/n) about the mean (ν = n − 1). It widens away from the mean load and with few runs.
 * The t quantile comes from @stdlib/stats-base-dists-t-quantile.
 */

/** Two-sided coverage of the band for one more run in the bearing's usual running. */
export const DEFAULT_BAND_CONFIDENCE = 0.95;
export const DEFAULT_DRIFT_MARGIN_F = 5;
export const MIN_POINTS_FOR_REGRESSION = 3;
/**
 * Fewest earlier runs a run is judged against (a product rule, common practice, no source): with fewer the band
 * has under 2 degrees of freedom about the mean and says nothing; the run is "too few runs to judge".
 */
export const MIN_RUNS_TO_JUDGE = 3;
/** By default any spread of load at all allows the straight-line fit. */
export const DEFAULT_MIN_LOAD_SPREAD = 0;

const pct = (c: number) => `${String(Number((c * 100).toFixed(1)))} %`;

/** The rule in words with the default settings. */
export const DRIFT_RULE_TEXT = driftRuleText();

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
  /** two-sided coverage of the prediction interval, e.g. 0.95 */
  confidence: number;
  /** degrees of freedom of s: n − 2 about the line, n − 1 about the mean */
  degreesOfFreedom: number;
  /** Student t quantile t(1 − α/2, ν) */
  tQuantile: number;
  /** mean load of the history and the sum of squares of load about it (0 for the mean band) */
  loadMean: number;
  sxx: number;
  pointCount: number;
  loadMin: number;
  loadMax: number;
}

function mean(values: number[]): number {
  return values.reduce((s, v) => s + v, 0) / values.length;
}

/**
 * The rule in words for the settings actually used (coverage, margin, and the least spread of load for which a
 * sloping line is fitted), so the screen states exactly what the code does.
 */
export function driftRuleText(
  settings: { confidence?: number; marginF?: number; minLoadSpread?: number; loadName?: string; loadUnit?: string } = {},
): string {
  const confidence = settings.confidence ?? DEFAULT_BAND_CONFIDENCE;
  const marginF = settings.marginF ?? DEFAULT_DRIFT_MARGIN_F;
  const spread = settings.minLoadSpread ?? DEFAULT_MIN_LOAD_SPREAD;
  const load = settings.loadName ?? 'load';
  const unit = settings.loadUnit ? ` ${settings.loadUnit}` : '';
  const fmt = (v: number) => String(Number(v.toFixed(2)));
  const flat =
    spread > 0
      ? `When their ${load} spans less than ${fmt(spread)}${unit} (comparable ${load}), the band is about the mean rise ` +
        `instead: \u00b1 t \u00d7 s \u00d7 sqrt(1 + 1/n), n \u2212 1 degrees of freedom.`
      : `When they were all at the same ${load}, the band is about the mean rise instead: \u00b1 t \u00d7 s \u00d7 ` +
        `sqrt(1 + 1/n), n \u2212 1 degrees of freedom.`;
  return (
    `Each bearing is compared with its own history. A straight line, temperature rise = a + b \u00d7 ${load}, is ` +
    `fitted by least squares to the earlier runs, with s the standard deviation of the runs about that line ` +
    `(n \u2212 2 degrees of freedom). The normal band is the ${pct(confidence)} prediction interval for one more run: ` +
    `the line \u00b1 t \u00d7 s \u00d7 sqrt(1 + 1/n + (${load} \u2212 mean ${load})\u00b2 / Sxx), t the Student t ` +
    `quantile for the degrees of freedom the history has, so the band widens away from the mean ${load} and when the ` +
    `runs are few. With fewer than ${MIN_RUNS_TO_JUDGE} earlier runs there are too few runs to judge. ${flat} ` +
    `A run is flagged as drift when its rise above ambient is more than ${fmt(marginF)} \u00b0F above the top of the ` +
    `band at its ${load}.`
  );
}

const T_QUANTILES = new Map<string, number>();

/** The Student t quantile t(1 − α/2, ν) for a two-sided coverage (e.g. 0.95) and ν degrees of freedom. */
export function studentTTwoSided(confidence: number, degreesOfFreedom: number): number {
  assertFinite('confidence', confidence);
  if (!(confidence > 0 && confidence < 1)) throw new CalculationInputError(null, 'confidence must be between 0 and 1');
  if (!(degreesOfFreedom >= 1)) throw new CalculationInputError(null, 'at least one degree of freedom is needed');
  // Kept once worked out: the quantile is an iterative inverse (tens of microseconds), and a bearing history asks for
  // the same few (one coverage, one per count of earlier runs) once per run of every bearing.
  const key = `${confidence}|${degreesOfFreedom}`;
  let t = T_QUANTILES.get(key);
  if (t === undefined) {
    t = tQuantile(1 - (1 - confidence) / 2, degreesOfFreedom);
    if (T_QUANTILES.size >= 10_000) T_QUANTILES.clear();
    T_QUANTILES.set(key, t);
  }
  return t;
}

/** Fit the normal band to a bearing's earlier runs (at least MIN_RUNS_TO_JUDGE of them). */
export function fitBand(points: DriftPoint[], options: { confidence?: number; minLoadSpread?: number } = {}): DriftBand {
  if (points.length < MIN_RUNS_TO_JUDGE)
    throw new CalculationInputError(null, `too few runs to judge: at least ${MIN_RUNS_TO_JUDGE} earlier runs are needed to fit a band`);
  const confidence = options.confidence ?? DEFAULT_BAND_CONFIDENCE;
  assertFinite('confidence', confidence);
  if (!(confidence > 0 && confidence < 1)) throw new CalculationInputError(null, 'confidence must be between 0 and 1');
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
      confidence,
      degreesOfFreedom: n - 2,
      tQuantile: studentTTwoSided(confidence, n - 2),
      loadMean: xBar,
      sxx,
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
    residualSdF: Math.sqrt(ssAboutMean / (n - 1)),
    confidence,
    degreesOfFreedom: n - 1,
    tQuantile: studentTTwoSided(confidence, n - 1),
    loadMean: xBar,
    sxx: 0,
    pointCount: n,
    loadMin,
    loadMax,
  };
}

/** The band at a load: expected rise and the lower / upper limits of the prediction interval (°F). */
export function bandAt(
  band: DriftBand,
  load: number,
): {
  expectedRiseF: number;
  lowerF: number;
  upperF: number;
  /** half the width of the band at this load, °F */
  halfWidthF: number;
  /** the load lies outside the loads the band was fitted over (extrapolation) */
  extrapolated: boolean;
} {
  assertFinite('load', load);
  const expectedRiseF = band.interceptF + band.slopeFPerLoad * load;
  const n = band.pointCount;
  const leverage = band.kind === 'regression' && band.sxx > 0 ? (load - band.loadMean) ** 2 / band.sxx : 0;
  const halfWidthF = band.tQuantile * band.residualSdF * Math.sqrt(1 + 1 / n + leverage);
  return {
    expectedRiseF,
    lowerF: expectedRiseF - halfWidthF,
    upperF: expectedRiseF + halfWidthF,
    halfWidthF,
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
  /** null for a run with too few earlier runs to judge (fewer than MIN_RUNS_TO_JUDGE) */
  check: DriftCheck | null;
  band: DriftBand | null;
  historyRuns: number;
}

/**
 * Judges each run of a bearing, in the order given (oldest first), against the band fitted to the runs
 * before it (none while there are fewer than MIN_RUNS_TO_JUDGE). A run already flagged is left out of the bands of
 * the runs after it, so one hot run does not widen the band and hide the next one; the band stays the bearing's
 * usual running.
 */
export function driftHistory(
  runs: DriftHistoryRun[],
  options: { confidence?: number; marginF?: number; minLoadSpread?: number } = {},
): DriftHistoryVerdict[] {
  const usual: DriftPoint[] = [];
  return runs.map((r) => {
    if (usual.length < MIN_RUNS_TO_JUDGE) {
      const historyRuns = usual.length;
      usual.push({ load: r.load, temperatureRiseF: r.temperatureRiseF });
      return { id: r.id, check: null, band: null, historyRuns };
    }
    const band = fitBand(usual, options);
    const check = driftCheck(r, band, options);
    const historyRuns = usual.length;
    if (!check.drift) usual.push({ load: r.load, temperatureRiseF: r.temperatureRiseF });
    return { id: r.id, check, band, historyRuns };
  });
}
