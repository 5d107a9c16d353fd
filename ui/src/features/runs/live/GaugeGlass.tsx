import type { MeasurementPointDto } from '@crankjournal/shared-types';

type Limits = Pick<MeasurementPointDto, 'normalLow' | 'normalHigh' | 'lowLimit' | 'highLimit' | 'highHighLimit'>;

export type LimitMark = 'high_high' | 'high' | 'low' | null;

/** Where a value stands against the point's limits (in the point's own unit): the mark every board shows. */
export function limitMark(value: number | null | undefined, p: Limits): LimitMark {
  if (value === null || value === undefined || !Number.isFinite(value)) return null;
  if (p.highHighLimit != null && value >= p.highHighLimit) return 'high_high';
  if (p.highLimit != null && value >= p.highLimit) return 'high';
  if (p.lowLimit != null && value <= p.lowLimit) return 'low';
  return null;
}

export const LIMIT_MARK_WORDS: Record<Exclude<LimitMark, null>, string> = {
  high_high: 'Above high-high',
  high: 'Above high limit',
  low: 'Below low limit',
};

/** The scale the strip shows: every limit, the normal band and the value, with a margin. */
export function glassScale(value: number | null, p: Limits): { min: number; max: number } | null {
  const marks = [p.lowLimit, p.normalLow, p.normalHigh, p.highLimit, p.highHighLimit, value].filter(
    (v): v is number => v != null && Number.isFinite(v),
  );
  if (marks.length < 2) return null;
  const lo = Math.min(...marks);
  const hi = Math.max(...marks);
  if (hi === lo) return null;
  const pad = (hi - lo) * 0.08;
  return { min: lo - pad, max: hi + pad };
}

/**
 * Our gauge glass: a thin strip under the figure, the normal band in grey, the limits as brass ticks and a pointer
 * for the value (red or amber beyond a limit). Purely a picture: the figure and words above it carry the meaning.
 */
export function GaugeGlass({ value, point, mark }: { value: number | null; point: Limits; mark: LimitMark }) {
  const scale = glassScale(value, point);
  if (!scale) return null;
  const W = 200;
  const x = (v: number) => ((v - scale.min) / (scale.max - scale.min)) * W;
  const band =
    point.normalLow != null || point.normalHigh != null
      ? { from: x(point.normalLow ?? scale.min), to: x(point.normalHigh ?? scale.max) }
      : null;
  const ticks = [point.lowLimit, point.highLimit, point.highHighLimit].filter((v): v is number => v != null);
  const pointer = mark === 'high_high' ? 'var(--cj-signal)' : mark ? 'var(--cj-amber)' : 'var(--cj-text)';
  return (
    <svg viewBox={`0 0 ${W} 18`} width="100%" height={18} preserveAspectRatio="none" aria-hidden data-testid="gauge-glass">
      <rect x={0} y={6} width={W} height={6} rx={3} fill="var(--cj-rule)" />
      {band && <rect x={band.from} y={6} width={Math.max(1, band.to - band.from)} height={6} fill="var(--mantine-color-gray-5)" />}
      {ticks.map((t) => (
        <rect key={t} x={x(t) - 1} y={2} width={2.5} height={14} fill="var(--cj-brass)" data-testid="gauge-limit" />
      ))}
      {value != null && Number.isFinite(value) && (
        <path d={`M ${x(value)} 12 l -5 6 h 10 z M ${x(value) - 1} 3 h 2 v 10 h -2 z`} fill={pointer} data-testid="gauge-pointer" />
      )}
    </svg>
  );
}
