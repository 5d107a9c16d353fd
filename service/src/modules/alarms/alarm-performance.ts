/**
 * The alarm system's own figures and chattering detection. Pure functions.
 *
 * Targets are the alarm-management standards' suggestions, from memory (check against the documents before
 * relying on them): ANSI/ISA-18.2-2016 §16.5 (Table 5, alarm performance metrics, after EEMUA 191): about one
 * alarm per 10 minutes average is "very likely to be acceptable", two "maximum manageable"; a flood is more than
 * 10 alarms in 10 minutes; under about 1 % of time in flood; the ten most frequent alarms under 1 %–5 % of all;
 * no chattering alarms; fewer than 5 stale alarms. EEMUA 191, 3rd ed. (2013), §6 and Annex on performance
 * levels, gives the same order of figures. Chattering: ISA-18.2 TR5 (from memory) names an alarm chattering when
 * it comes in three or more times in one minute; here the count and the window are settings with those defaults.
 */

export interface Annunciation {
  at: Date;
  /** What is counted in the top ten, e.g. "Main bearing 2 temperature · High". */
  key: string;
}

export interface AlarmSpan {
  key: string;
  raisedAt: Date;
  /** When it returned to normal (or the period's end when still active). */
  endedAt: Date | null;
}

export interface FigureOptions {
  /** Length of a counting period in minutes; default 10. */
  periodMinutes?: number;
  /** More than this many alarms in one period is a flood; default 10. */
  floodThreshold?: number;
  /** An alarm active longer than this is stale (minutes); default 60 (a product setting for runs of hours). */
  staleMinutes?: number;
}

export const ALARM_FIGURE_DEFAULTS = { periodMinutes: 10, floodThreshold: 10, staleMinutes: 60 } as const;

/** The targets the figures are shown against (see the file comment for their sources). */
export const ALARM_FIGURE_TARGETS = {
  averagePerTenMinutes: 1,
  peakPerTenMinutes: 10,
  floodSharePercent: 1,
  topTenSharePercent: 5,
  chattering: 0,
  stale: 5,
  standingAtStart: 0,
} as const;

export const ALARM_FIGURE_BASIS =
  'Targets as the alarm-management standards suggest them (ANSI/ISA-18.2-2016 §16.5 and EEMUA 191, from memory): ' +
  'about 1 alarm per 10 min on average, no more than 10 in any 10 min (a flood), under 1 % of time in flood, ' +
  'no chattering, few stale alarms and none standing at the start. Counted in fixed 10-minute periods from the ' +
  "run's opening; suppressed alarms and advisory pre-alarms (limit forecasts) are not counted.";

export interface AlarmFigures {
  from: string;
  to: string;
  minutes: number;
  total: number;
  averagePerTenMinutes: number;
  peakPerTenMinutes: number;
  /** Counting periods with more than the flood threshold. */
  floods: number;
  /** Share of the time inside flood periods, percent. */
  floodSharePercent: number;
  topTen: { key: string; count: number; sharePercent: number }[];
  chattering: { key: string; count: number }[];
  stale: { key: string; minutes: number }[];
  standingAtStart: number;
}

const MS_PER_MIN = 60_000;

/**
 * Figures over [from, to] (or several such spans, e.g. the runs of a season), counted in fixed periods from each
 * span's `from` (the last period may be shorter; its time counts as it is). `standingAtStart` is the number of
 * alarms already active when the engine started.
 */
export function alarmFigures(
  spansOfTime: { from: Date; to: Date } | readonly { from: Date; to: Date }[],
  annunciations: readonly Annunciation[],
  spans: readonly AlarmSpan[],
  chattering: readonly { key: string; count: number }[],
  standingAtStart: number,
  options: FigureOptions = {},
): AlarmFigures {
  const o = { ...ALARM_FIGURE_DEFAULTS, ...options };
  const list = (Array.isArray(spansOfTime) ? spansOfTime : [spansOfTime]) as readonly { from: Date; to: Date }[];
  let minutes = 0;
  let floods = 0;
  let floodMinutes = 0;
  let peak = 0;
  const inside: Annunciation[] = [];
  for (const span of list) {
    const fromMs = span.from.getTime();
    const toMs = Math.max(fromMs, span.to.getTime());
    const spanMinutes = (toMs - fromMs) / MS_PER_MIN;
    minutes += spanMinutes;
    const mine = annunciations.filter((a) => a.at.getTime() >= fromMs && a.at.getTime() <= toMs);
    inside.push(...mine);
    const periods = Math.max(1, Math.ceil(spanMinutes / o.periodMinutes));
    const counts = new Array<number>(periods).fill(0);
    for (const a of mine) counts[Math.min(periods - 1, Math.floor((a.at.getTime() - fromMs) / MS_PER_MIN / o.periodMinutes))]++;
    counts.forEach((c, i) => {
      peak = Math.max(peak, c);
      if (c <= o.floodThreshold) return;
      floods++;
      floodMinutes += Math.min(o.periodMinutes, spanMinutes - i * o.periodMinutes);
    });
  }
  const fromMs = Math.min(...list.map((s) => s.from.getTime()));
  const toMs = Math.max(fromMs, ...list.map((s) => s.to.getTime()));
  const byKey = new Map<string, number>();
  for (const a of inside) byKey.set(a.key, (byKey.get(a.key) ?? 0) + 1);
  const total = inside.length;
  const topTen = [...byKey.entries()]
    .sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]))
    .slice(0, 10)
    .map(([key, count]) => ({ key, count, sharePercent: total ? (100 * count) / total : 0 }));
  const stale = spans
    .map((s) => ({ key: s.key, minutes: ((s.endedAt?.getTime() ?? toMs) - s.raisedAt.getTime()) / MS_PER_MIN }))
    .filter((s) => s.minutes > o.staleMinutes);
  return {
    from: new Date(fromMs).toISOString(),
    to: new Date(toMs).toISOString(),
    minutes,
    total,
    averagePerTenMinutes: minutes > 0 ? (total * 10) / minutes : total,
    peakPerTenMinutes: peak,
    floods,
    floodSharePercent: minutes > 0 ? (100 * floodMinutes) / minutes : 0,
    topTen,
    chattering: [...chattering],
    stale,
    standingAtStart,
  };
}

export interface ChatterOptions {
  /** More than this many activations ... */
  maxActivations?: number;
  /** ... within this many minutes is chattering. */
  windowMinutes?: number;
}
/** ISA-18.2 TR5 (from memory): three or more in one minute, i.e. more than 2 in 1 min. */
export const CHATTER_DEFAULTS = { maxActivations: 2, windowMinutes: 1 } as const;

/** The most activations of one alarm inside any window of the given length, and whether that is chattering. */
export function detectChattering(raisedAt: readonly Date[], options: ChatterOptions = {}): { chattering: boolean; worst: number } {
  const o = { ...CHATTER_DEFAULTS, ...options };
  const ts = raisedAt.map((d) => d.getTime()).sort((a, b) => a - b);
  let worst = 0;
  let lo = 0;
  for (let hi = 0; hi < ts.length; hi++) {
    while (ts[hi] - ts[lo] > o.windowMinutes * MS_PER_MIN) lo++;
    worst = Math.max(worst, hi - lo + 1);
  }
  return { chattering: worst > o.maxActivations, worst };
}

/**
 * The deadband that would have kept a chattering high-side alarm in: every clear came from a reading below
 * limit − deadband; a deadband just past the deepest of those readings would have held instead. Rounded up to
 * `step` (default 0.5 of the point's unit), strictly larger than the deepest dip. Null without such a reading.
 * For a low-side alarm pass the readings and limit mirrored (side 'low').
 */
export function suggestDeadband(clearingValues: readonly number[], limit: number, side: 'high' | 'low', step = 0.5): number | null {
  const dips = clearingValues.filter(Number.isFinite).map((v) => (side === 'high' ? limit - v : v - limit));
  if (!dips.length) return null;
  const deepest = Math.max(...dips);
  if (deepest < 0) return null;
  return (Math.floor(deepest / step) + 1) * step;
}

/** The log sheet's section: one row per figure with its target, plain text for any layout. */
export function alarmFigureRows(f: AlarmFigures): { label: string; value: string; target: string; met: boolean }[] {
  const t = ALARM_FIGURE_TARGETS;
  const n = (x: number, d = 1) => (Math.round(x * 10 ** d) / 10 ** d).toString();
  const top = f.topTen[0];
  return [
    { label: 'Alarms (annunciated)', value: String(f.total), target: '—', met: true },
    {
      label: 'Alarms per 10 min, average',
      value: n(f.averagePerTenMinutes, 2),
      target: `≤ ${t.averagePerTenMinutes}`,
      met: f.averagePerTenMinutes <= t.averagePerTenMinutes,
    },
    {
      label: 'Alarms per 10 min, peak',
      value: String(f.peakPerTenMinutes),
      target: `≤ ${t.peakPerTenMinutes}`,
      met: f.peakPerTenMinutes <= t.peakPerTenMinutes,
    },
    { label: 'Floods (more than 10 in 10 min)', value: String(f.floods), target: '0', met: f.floods === 0 },
    {
      label: 'Time in flood',
      value: `${n(f.floodSharePercent)} %`,
      target: `< ${t.floodSharePercent} %`,
      met: f.floodSharePercent < t.floodSharePercent,
    },
    {
      label: 'Most frequent alarm',
      value: top ? `${top.key}: ${top.count} (${n(top.sharePercent)} %)` : 'none',
      target: `≤ ${t.topTenSharePercent} % each`,
      met: !top || top.sharePercent <= t.topTenSharePercent,
    },
    { label: 'Chattering alarms', value: String(f.chattering.length), target: '0', met: f.chattering.length === 0 },
    { label: 'Stale alarms', value: String(f.stale.length), target: `< ${t.stale}`, met: f.stale.length < t.stale },
    { label: 'Standing alarms at start', value: String(f.standingAtStart), target: '0', met: f.standingAtStart === 0 },
  ];
}
