import { useMemo } from 'react';
import { Paper, Text, Title } from '@mantine/core';
import { CartesianGrid, ComposedChart, Legend, Line, ReferenceLine, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from 'recharts';
import type { BearingHistory } from '@crankjournal/shared-types';
import { useUnits } from '../../units/useUnits';
import { fmt } from '../model/format';

const C = {
  peak: 'var(--mantine-color-copper-5)',
  mean: 'var(--mantine-color-gray-5)',
  rise: 'var(--mantine-color-brass-5)',
  flag: 'var(--mantine-color-amber-6)',
  limit: 'var(--mantine-color-amber-6)',
  band: 'var(--mantine-color-gray-5)',
  inspection: 'var(--mantine-color-blue-5)',
  work: 'var(--mantine-color-teal-5)',
  grid: 'var(--mantine-color-default-border)',
  text: 'var(--mantine-color-dimmed)',
};
const dateLabel = (ms: number) => new Date(ms).toLocaleDateString(undefined, { day: 'numeric', month: 'short', year: '2-digit' });

/** A run's peak: a dot, or for a run flagged by the drift rule a larger amber diamond (shape and colour). */
function PeakDot(props: { cx?: number; cy?: number; index?: number; payload?: { flagged: number | null } }) {
  const { cx, cy, payload, index } = props;
  if (cx === undefined || cy === undefined) return <g key={index} />;
  if (payload?.flagged != null)
    return (
      <path
        key={index}
        d={`M${cx},${cy - 8} L${cx + 7},${cy} L${cx},${cy + 8} L${cx - 7},${cy} Z`}
        fill={C.flag}
        stroke={C.flag}
        data-testid="season-drift-mark"
      />
    );
  return <circle key={index} cx={cx} cy={cy} r={4} fill={C.peak} />;
}

/**
 * Peak and mean temperature and the rise above ambient of every run across the seasons, with inspections and
 * work marked on the time axis.
 */
export function SeasonsChart({ history }: { history: BearingHistory }) {
  const { display } = useUnits();
  const unit = history.runs[0]?.unit ?? 'degF';
  const tempLabel = display(0, unit).unitLabel;
  const data = useMemo(
    () =>
      history.runs
        .filter((r) => r.startedAt)
        .map((r) => ({
          t: Date.parse(r.startedAt!),
          title: r.title,
          peak: display(r.peakTemperature, r.unit).value,
          mean: display(r.meanTemperature, r.unit).value,
          rise: r.riseAtPeakF === null ? null : display(r.riseAtPeakF, 'degF', { delta: true }).value,
          flagged: r.drift?.flagged ? display(r.peakTemperature, r.unit).value : null,
        })),
    [history, display],
  );
  const marks = [
    ...history.inspections.map((i) => ({ x: Date.parse(i.inspectedAt), color: C.inspection, label: 'I' })),
    ...history.workRecords.map((w) => ({ x: Date.parse(w.startedAt), color: C.work, label: 'W' })),
  ];
  if (data.length < 2)
    return (
      <Paper withBorder p="md" radius="md">
        <Text c="dimmed">Not enough runs yet to draw the seasons.</Text>
      </Paper>
    );
  const times = [...data.map((d) => d.t), ...marks.map((m) => m.x)];
  const pad = 7 * 86_400_000;
  return (
    <Paper withBorder p="md" radius="md" data-testid="seasons-chart">
      <Title order={3} fz="md" mb={4}>
        Over the seasons{' '}
        <Text span c="dimmed" fz="sm">
          ({tempLabel}; ◆ run flagged by the drift rule; I = inspection, W = work)
        </Text>
      </Title>
      <ResponsiveContainer width="100%" height={280}>
        <ComposedChart data={data} margin={{ top: 16, right: 16, bottom: 8, left: 0 }}>
          <CartesianGrid stroke={C.grid} strokeDasharray="3 3" />
          <XAxis
            dataKey="t"
            type="number"
            scale="time"
            domain={[Math.min(...times) - pad, Math.max(...times) + pad]}
            tickFormatter={dateLabel}
            stroke={C.text}
            minTickGap={40}
          />
          <YAxis stroke={C.text} width={48} domain={['auto', 'auto']} />
          <Tooltip labelFormatter={(v) => dateLabel(Number(v))} formatter={(v, n) => [`${fmt(Number(v), 1)} ${tempLabel}`, String(n)]} />
          <Legend verticalAlign="bottom" height={28} />
          {marks.map((m, i) => (
            <ReferenceLine
              key={i}
              x={m.x}
              stroke={m.color}
              strokeDasharray="4 4"
              label={{ value: m.label, position: 'top', fill: m.color, fontSize: 12 }}
            />
          ))}
          <Line type="linear" dataKey="peak" name="Peak" stroke={C.peak} strokeWidth={2} dot={PeakDot} isAnimationActive={false} />
          <Line type="linear" dataKey="mean" name="Mean" stroke={C.mean} strokeWidth={2} dot={{ r: 3 }} isAnimationActive={false} />
          <Line
            type="linear"
            dataKey="rise"
            name="Rise above ambient"
            stroke={C.rise}
            strokeWidth={2}
            strokeDasharray="6 3"
            dot={{ r: 3 }}
            isAnimationActive={false}
          />
        </ComposedChart>
      </ResponsiveContainer>
    </Paper>
  );
}

/** Rise above ambient against load for every run, with the bearing's own band (line ± k·s) and the drift limit. */
export function RiseVsLoadChart({ history }: { history: BearingHistory }) {
  const { display } = useUnits();
  const riseLabel = display(0, 'degF', { delta: true }).unitLabel;
  const loadLabel = history.loadMeasure === 'indicated_hp' ? 'Indicated power, hp' : 'Mean speed, rpm';
  const conv = (f: number) => display(f, 'degF', { delta: true }).value;
  const usual = history.runs
    .filter((r) => r.load !== null && r.riseAtPeakF !== null && !r.drift?.flagged)
    .map((r) => ({ x: r.load!, y: conv(r.riseAtPeakF!), title: r.title }));
  const flagged = history.runs
    .filter((r) => r.load !== null && r.riseAtPeakF !== null && r.drift?.flagged)
    .map((r) => ({ x: r.load!, y: conv(r.riseAtPeakF!), title: r.title }));
  const band = (history.band?.line ?? []).map((p) => ({
    x: p.load,
    upper: conv(p.upperF),
    lower: conv(p.lowerF),
    expected: conv(p.expectedF),
    limit: conv(p.limitF),
  }));
  const xs = [...usual, ...flagged].map((p) => p.x).concat(band.map((b) => b.x));
  if (!xs.length)
    return (
      <Paper withBorder p="md" radius="md">
        <Text c="dimmed">No run has both a load figure and a rise above ambient yet.</Text>
      </Paper>
    );
  const span = Math.max(...xs) - Math.min(...xs) || Math.max(1, Math.abs(xs[0]) * 0.05);
  return (
    <Paper withBorder p="md" radius="md" data-testid="rise-load-chart">
      <Title order={3} fz="md" mb={4}>
        Rise above ambient against load{' '}
        <Text span c="dimmed" fz="sm">
          ({riseLabel} against {loadLabel.toLowerCase()})
        </Text>
      </Title>
      <ResponsiveContainer width="100%" height={280}>
        <ComposedChart margin={{ top: 16, right: 16, bottom: 8, left: 0 }}>
          <CartesianGrid stroke={C.grid} strokeDasharray="3 3" />
          <XAxis
            dataKey="x"
            type="number"
            domain={[Math.min(...xs) - span * 0.1, Math.max(...xs) + span * 0.1]}
            stroke={C.text}
            tickFormatter={(v) => fmt(v, history.loadMeasure === 'indicated_hp' ? 0 : 1)}
            name={loadLabel}
          />
          <YAxis dataKey="y" type="number" stroke={C.text} width={48} domain={['auto', 'auto']} />
          <Tooltip formatter={(v, n) => [fmt(Number(v), 1), String(n)]} labelFormatter={(v) => `${loadLabel}: ${fmt(Number(v), 1)}`} />
          <Legend verticalAlign="bottom" height={28} />
          <Line
            data={band}
            dataKey="upper"
            name="Usual band"
            stroke={C.band}
            strokeDasharray="6 4"
            dot={false}
            activeDot={false}
            isAnimationActive={false}
            legendType="plainline"
          />
          <Line
            data={band}
            dataKey="lower"
            name="Usual band (lower)"
            stroke={C.band}
            strokeDasharray="6 4"
            dot={false}
            activeDot={false}
            isAnimationActive={false}
            legendType="none"
          />
          <Line
            data={band}
            dataKey="expected"
            name="Expected"
            stroke={C.band}
            dot={false}
            activeDot={false}
            strokeWidth={1}
            isAnimationActive={false}
            legendType="plainline"
          />
          <Line
            data={band}
            dataKey="limit"
            name="Drift limit (band + margin)"
            stroke={C.limit}
            strokeDasharray="2 3"
            dot={false}
            activeDot={false}
            isAnimationActive={false}
            legendType="plainline"
          />
          <Scatter data={usual} dataKey="y" name="Runs" fill={C.peak} isAnimationActive={false} />
          <Scatter data={flagged} dataKey="y" name="Flagged run" fill={C.flag} shape="diamond" isAnimationActive={false} />
        </ComposedChart>
      </ResponsiveContainer>
    </Paper>
  );
}
