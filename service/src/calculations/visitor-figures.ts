/** Figures for the visitor board: everyday equivalents of the engine's power and the smoothing of its readings. */
import { hpToKw } from './units.js';

/**
 * One horsepower is, by its definition, the work of one horse (33,000 ft·lbf/min, the rate a mill horse was taken to
 * keep up); so the engine's indicated horsepower is the number of horses it stands for (common practice, no source).
 */
export function horsesFromHorsepower(horsepower: number): number {
  return horsepower;
}

/** A small family car's engine, kW (common practice, no source: small petrol engines are rated around 55–90 kW). */
export const SMALL_CAR_ENGINE_KW = 75;

/** How many small car engines give the same power. */
export function smallCarEnginesFromHorsepower(horsepower: number): number {
  return hpToKw(horsepower) / SMALL_CAR_ENGINE_KW;
}

export interface TimedValue {
  takenAtMs: number;
  value: number;
}

/**
 * The latest value, smoothed: the mean of the samples taken within `windowMs` before the newest one (the newest
 * included). Null when there are none. A moving average over a fixed time window (common practice, no source).
 */
export function smoothedLatestValue(samples: readonly TimedValue[], windowMs: number): number | null {
  const ok = samples.filter((s) => Number.isFinite(s.value));
  if (ok.length === 0) return null;
  const newest = Math.max(...ok.map((s) => s.takenAtMs));
  const inWindow = ok.filter((s) => s.takenAtMs >= newest - windowMs);
  return inWindow.reduce((sum, s) => sum + s.value, 0) / inWindow.length;
}
