/** Figures derived from a run's readings: revolutions from the speed record, running time. */

export interface SpeedSample {
  takenAtMs: number;
  speedRpm: number;
}

/**
 * Revolutions turned between `fromMs` and `toMs`, integrating the speed record with the trapezoidal rule.
 * Before the first sample and after the last, the nearest sample's speed is held.
 */
export function revolutionsFromSpeedRecord(samples: readonly SpeedSample[], fromMs: number, toMs: number): number {
  if (!(toMs > fromMs) || samples.length === 0) return 0;
  const s = samples.filter((p) => Number.isFinite(p.speedRpm) && p.speedRpm >= 0).sort((a, b) => a.takenAtMs - b.takenAtMs);
  if (s.length === 0) return 0;
  const pts: SpeedSample[] = [];
  const speedAt = (t: number): number => {
    if (t <= s[0].takenAtMs) return s[0].speedRpm;
    if (t >= s[s.length - 1].takenAtMs) return s[s.length - 1].speedRpm;
    let i = 1;
    while (s[i].takenAtMs < t) i++;
    const a = s[i - 1];
    const b = s[i];
    return a.speedRpm + ((b.speedRpm - a.speedRpm) * (t - a.takenAtMs)) / (b.takenAtMs - a.takenAtMs);
  };
  pts.push({ takenAtMs: fromMs, speedRpm: speedAt(fromMs) });
  for (const p of s) if (p.takenAtMs > fromMs && p.takenAtMs < toMs) pts.push(p);
  pts.push({ takenAtMs: toMs, speedRpm: speedAt(toMs) });
  let revs = 0;
  for (let i = 1; i < pts.length; i++) {
    const minutes = (pts[i].takenAtMs - pts[i - 1].takenAtMs) / 60_000;
    revs += ((pts[i].speedRpm + pts[i - 1].speedRpm) / 2) * minutes;
  }
  return revs;
}

/** Seconds between start and stop (or now, while running). */
export function runningSeconds(startedAt: Date | null, stoppedAt: Date | null, now: Date = new Date()): number {
  if (!startedAt) return 0;
  const end = stoppedAt ?? now;
  return Math.max(0, (end.getTime() - startedAt.getTime()) / 1000);
}
