/**
 * Time to the next limit at the present trend, from a robust fit of the last minutes of readings. Pure.
 *
 * Method (stated on screen as FORECAST_METHOD_WORDS):
 * - Theil–Sen slopes (the median of the slopes between every pair of readings; H. Theil, "A rank-invariant method
 *   of linear and polynomial regression analysis", Proc. KNAW 53, 1950; P. K. Sen, "Estimates of the regression
 *   coefficient based on Kendall's tau", JASA 63, 1968, pp. 1379–1389) over the earlier and the later half of the
 *   window. A single wild reading moves neither.
 * - The trend must be steady: enough readings over enough of the window, Kendall's tau of the whole window at least
 *   `minTau` in the direction of the limit (a product setting; tau is near 0 on noise), both halves moving that way.
 * - The slope is carried forward as changing exponentially in time at the rate the two halves show (a straight
 *   line when they agree). That is exact for a straight rise, for an exponential approach to a level and for an
 *   exponential run-away; the time is where the carried-forward curve meets the limit, or none when it levels off
 *   below it.
 */

export interface TimedValue {
  /** Minutes on any common time axis. */
  tMin: number;
  value: number;
}

export interface ForecastOptions {
  /** Length of the window of readings used, in minutes; default 10. */
  windowMinutes?: number;
  /** Fewest readings in the window; default 6. */
  minReadings?: number;
  /** Least |Kendall's tau| in the direction of the limit; default 0.6. */
  minTau?: number;
  /** Forecasts further ahead than this are not given (minutes); default 120. */
  horizonMinutes?: number;
  /**
   * At most this many readings of the window are fitted, taken evenly through it (the first and the last always);
   * default 120. The pairwise fits grow with the square of the readings: a logger at one reading a second fills a
   * ten-minute window with 600, a fast live feed with thousands, and two minutes of evenly spaced readings say the
   * same about a steady trend.
   */
  maxReadings?: number;
}

export interface LimitForecast {
  /** Minutes from `nowMin` until the limit is reached at the present trend. */
  minutesToLimit: number;
  /** The fitted rate now, unit per minute. */
  ratePerMin: number;
  /** Kendall's tau of the window. */
  tau: number;
  windowMinutes: number;
  readingsUsed: number;
}

export const FORECAST_DEFAULTS = { windowMinutes: 10, minReadings: 6, minTau: 0.6, horizonMinutes: 120, maxReadings: 120 } as const;

export const FORECAST_METHOD_WORDS =
  'Theil–Sen slopes over the two halves of the last 10 minutes of readings, carried forward; shown only while the ' +
  "trend is steady (Kendall's tau at least 0.6 toward the limit).";

function median(xs: number[]): number {
  // A typed array sorts numbers in ascending order natively (no comparator call per comparison): several times faster.
  const s = Float64Array.from(xs).sort();
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** At most `max` of the readings (in time order), evenly through them, the first and the last always kept. */
export function thinEvenly<T>(sorted: readonly T[], max: number): T[] {
  if (sorted.length <= max || max < 2) return [...sorted];
  const out: T[] = [];
  for (let i = 0; i < max; i++) out.push(sorted[Math.round((i * (sorted.length - 1)) / (max - 1))]);
  return out;
}

/** Theil–Sen line: slope = median of pairwise slopes, intercept = median of value − slope·t. Null under 2 distinct times. */
export function theilSen(points: readonly TimedValue[]): { slopePerMin: number; intercept: number } | null {
  const slopes: number[] = [];
  for (let i = 0; i < points.length; i++)
    for (let j = i + 1; j < points.length; j++) {
      const dt = points[j].tMin - points[i].tMin;
      if (dt !== 0) slopes.push((points[j].value - points[i].value) / dt);
    }
  if (!slopes.length) return null;
  const slopePerMin = median(slopes);
  return { slopePerMin, intercept: median(points.map((p) => p.value - slopePerMin * p.tMin)) };
}

/** Kendall's tau-a of value against time: +1 strictly rising, −1 strictly falling, near 0 on noise. */
export function kendallTau(points: readonly TimedValue[]): number {
  let s = 0;
  let n = 0;
  for (let i = 0; i < points.length; i++)
    for (let j = i + 1; j < points.length; j++) {
      n++;
      s += Math.sign(points[j].tMin - points[i].tMin) * Math.sign(points[j].value - points[i].value);
    }
  return n ? s / n : 0;
}

/**
 * Minutes until `limit` is reached (a high limit from below when `side` is 'high', a low limit from above when
 * 'low'), or null when the trend is not steady enough, moves away from the limit, levels off short of it, or the
 * crossing is beyond the horizon. A value already past the limit is not forecast (the alarm itself says so).
 */
export function forecastTimeToLimit(
  readings: readonly TimedValue[],
  nowMin: number,
  limit: number,
  side: 'high' | 'low',
  options: ForecastOptions = {},
): LimitForecast | null {
  const o = { ...FORECAST_DEFAULTS, ...options };
  const start = nowMin - o.windowMinutes;
  const pts = thinEvenly(
    readings.filter((r) => Number.isFinite(r.value) && r.tMin >= start && r.tMin <= nowMin).sort((a, b) => a.tMin - b.tMin),
    o.maxReadings,
  );
  if (pts.length < o.minReadings) return null;
  const span = pts[pts.length - 1].tMin - pts[0].tMin;
  if (span < o.windowMinutes / 2) return null;
  const dir = side === 'high' ? 1 : -1;
  const tau = kendallTau(pts);
  if (tau * dir < o.minTau) return null;
  const mid = pts[0].tMin + span / 2;
  const early = pts.filter((p) => p.tMin <= mid);
  const late = pts.filter((p) => p.tMin >= mid);
  const f1 = theilSen(early);
  const f2 = theilSen(late);
  if (!f1 || !f2 || f1.slopePerMin * dir <= 0 || f2.slopePerMin * dir <= 0) return null;
  const c1 = median(early.map((p) => p.tMin));
  const c2 = median(late.map((p) => p.tMin));
  const k = c2 > c1 ? Math.log(f2.slopePerMin / f1.slopePerMin) / (c2 - c1) : 0;
  const valueNow = f2.intercept + f2.slopePerMin * nowMin;
  const gap = limit - valueNow;
  if (gap * dir <= 0) return null;
  const rateNow = f2.slopePerMin * Math.exp(k * (nowMin - c2));
  let minutes: number;
  if (Math.abs(k) < 1e-9) {
    minutes = gap / rateNow;
  } else {
    const arg = 1 + (k * gap) / rateNow;
    if (arg <= 0) return null; // levels off before the limit
    minutes = Math.log(arg) / k;
  }
  if (!Number.isFinite(minutes) || minutes <= 0 || minutes > o.horizonMinutes) return null;
  return { minutesToLimit: minutes, ratePerMin: rateNow, tau, windowMinutes: o.windowMinutes, readingsUsed: pts.length };
}
