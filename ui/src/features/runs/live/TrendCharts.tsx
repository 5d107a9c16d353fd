import { useMemo, useState } from 'react';
import { Group, Paper, Select, SimpleGrid, Text, Title } from '@mantine/core';
import { LineChart, type ChartReferenceLineProps } from '@mantine/charts';
import type { AlarmDto, EngineDetail, MeasurementKind, ReadingDto } from '@crankjournal/shared-types';
import { useUnits } from '../../units/useUnits';
import { endLabel, lastIndexOf, pen } from '../../../components/charts/pens';
import type { EnginePoint } from './Board';

const localTime = (ms: number) => new Date(ms).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' });
const localTimeSeconds = (ms: number) =>
  new Date(ms).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit', second: '2-digit' });

interface ChartSpec {
  key: string;
  title: string;
  kinds: MeasurementKind[];
  /** Only points stored in this unit go on the chart (one y-axis per chart). */
  unit: string;
}
const CHARTS: ChartSpec[] = [
  { key: 'pressures', title: 'Steam pressures', kinds: ['throttle_pressure', 'receiver_pressure'], unit: 'psig' },
  { key: 'speed', title: 'Speed', kinds: ['speed'], unit: 'rpm' },
  { key: 'bearings', title: 'Bearing temperatures', kinds: ['bearing_temperature'], unit: '' },
];

/** Rows for a time chart: one row per moment, a column per point code, values in the person's units. */
export function chartRows(readings: ReadingDto[], points: EnginePoint[], convert: (v: number, unit: string) => number | null) {
  const codeById = new Map(points.map((p) => [p.id, p.code]));
  const rows = new Map<number, Record<string, number | null>>();
  for (const r of readings) {
    const code = codeById.get(r.pointId);
    if (!code) continue;
    const t = Date.parse(r.takenAt);
    const row = rows.get(t) ?? { t };
    row[code] = convert(r.value, r.unit);
    rows.set(t, row);
  }
  return [...rows.values()].sort((a, b) => (a.t as number) - (b.t as number));
}

function TrendChart({
  spec,
  points,
  readings,
  alarms,
  engine,
}: {
  spec: ChartSpec;
  points: EnginePoint[];
  readings: ReadingDto[];
  alarms: AlarmDto[];
  engine: EngineDetail;
}) {
  const { display } = useUnits();
  const unit = spec.unit || points[0]?.unit || '';
  const mine = points.filter((p) => p.unit === unit);
  const ids = new Set(mine.map((p) => p.id));
  const data = useMemo(
    () =>
      chartRows(
        readings.filter((r) => ids.has(r.pointId)),
        mine,
        (v, u) => display(v, u).value,
      ),
    // eslint-disable-next-line react-hooks/exhaustive-deps -- mine is filtered anew each render; its ids say when it changed
    [readings, mine.map((p) => p.id).join(), display],
  );
  const unitLabel = display(0, unit).unitLabel;

  // Limits of one point at a time (several bearings' limits at once are unreadable): by default the point nearest its high limit.
  const withLimits = mine.filter((p) => p.highLimit != null || p.highHighLimit != null);
  const nearest = useMemo(() => {
    let best: EnginePoint | null = null;
    let bestRatio = -Infinity;
    for (const p of withLimits) {
      const limit = p.highLimit ?? p.highHighLimit!;
      const last = [...readings].reverse().find((r) => r.pointId === p.id);
      const ratio = last && limit ? last.value / limit : 0;
      if (ratio > bestRatio) {
        best = p;
        bestRatio = ratio;
      }
    }
    return best;
    // eslint-disable-next-line react-hooks/exhaustive-deps -- withLimits is new each render; its ids say when it changed
  }, [readings, withLimits.map((p) => p.id).join()]);
  const [chosen, setChosen] = useState<string | null>(null);
  const focus = withLimits.find((p) => p.id === chosen) ?? nearest;

  const lines = new Map<number, { labels: string[]; color: string }>();
  const addLine = (y: number | null | undefined, label: string, color: string) => {
    if (y === null || y === undefined) return;
    const dy = display(y, unit).value!;
    const l = lines.get(dy);
    if (l) {
      l.labels.push(label);
      if (color.startsWith('signal')) l.color = color;
    } else lines.set(dy, { labels: [label], color });
  };
  if (focus) {
    addLine(focus.highHighLimit, 'High-high', 'signal.6');
    addLine(focus.highLimit, 'High', 'amber.6');
  }
  if (spec.key === 'pressures' && unit === 'psig') addLine(engine.mawpPsig, 'MAWP', 'signal.6');
  if (spec.key === 'speed' && unit === 'rpm') {
    addLine(engine.overspeedRpm, 'Overspeed', 'signal.6');
    addLine(engine.ratedSpeedRpm, 'Rated', 'gray.5');
  }
  const refLines: ChartReferenceLineProps[] = [...lines.entries()]
    .sort((a, b) => b[0] - a[0])
    .map(
      ([y, l], i) =>
        ({
          y,
          label: `${l.labels.join(' · ')} ${Number(y.toFixed(2))}`,
          color: l.color,
          strokeDasharray: '6 4',
          // Alternate sides so labels of close lines do not sit on each other.
          labelPosition: i % 2 === 0 ? 'insideTopRight' : 'insideBottomLeft',
          ifOverflow: 'extendDomain',
        }) as ChartReferenceLineProps,
    );

  // Alarms as marks on the time axis.
  const alarmLines: ChartReferenceLineProps[] = alarms
    .filter((a) => a.pointId && ids.has(a.pointId))
    .map(
      (a) =>
        ({
          x: Date.parse(a.raisedAt),
          color: a.priority === 'high_high' ? 'signal.6' : a.priority === 'advisory' ? 'gray.6' : 'amber.6',
          strokeDasharray: '2 3',
          label: '▲',
          labelPosition: 'insideBottom',
        }) as ChartReferenceLineProps,
    );

  const times = data.map((d) => d.t as number);
  return (
    <Paper withBorder p="md" radius="md">
      <Group justify="space-between" mb="xs" wrap="wrap" gap="xs">
        <Title order={3} fz="md">
          {spec.title}{' '}
          <Text span c="dimmed" fz="sm">
            ({unitLabel})
          </Text>
        </Title>
        {withLimits.length > 1 && focus && (
          <Select
            aria-label={`Limits drawn on ${spec.title}`}
            w={210}
            styles={{ input: { minHeight: 48 } }}
            allowDeselect={false}
            data={withLimits.map((p) => ({ value: p.id, label: `Limits of ${p.code}` }))}
            value={focus.id}
            onChange={setChosen}
          />
        )}
      </Group>
      {data.length < 2 ? (
        <Text c="dimmed" fz="sm" h={220}>
          Not enough readings yet to draw a trend.
        </Text>
      ) : (
        <LineChart
          h={240}
          data={data}
          dataKey="t"
          series={mine.map((p, i) => ({ name: p.code, label: p.label, color: pen(i).color, strokeDasharray: pen(i).dash }))}
          lineProps={(sr) => {
            const i = mine.findIndex((p) => p.code === sr.name);
            return { label: endLabel(sr.name, lastIndexOf(data, sr.name), pen(i).color) };
          }}
          lineChartProps={{ margin: { right: 64 } }}
          withDots={data.length < 40}
          curveType="linear"
          connectNulls
          strokeWidth={2}
          referenceLines={[...refLines, ...alarmLines]}
          xAxisProps={{
            type: 'number',
            scale: 'time',
            domain: [Math.min(...times), Math.max(...times)],
            tickFormatter: (v: number) => localTime(v),
            minTickGap: 40,
          }}
          yAxisProps={{ domain: ['auto', 'auto'], width: 56 }}
          tooltipProps={{ labelFormatter: (v: unknown) => localTimeSeconds(Number(v)) }}
          valueFormatter={(v) => String(Number(v.toFixed(2)))}
          gridAxis="xy"
        />
      )}
    </Paper>
  );
}

/** Trends of pressures, speed and bearing temperatures over the run, with limits as dashed lines. */
export function TrendCharts({
  points,
  readings,
  alarms,
  engine,
}: {
  points: EnginePoint[];
  readings: ReadingDto[];
  alarms: AlarmDto[];
  engine: EngineDetail;
}) {
  const specs = CHARTS.map((s) => ({
    spec: s,
    points: points.filter((p) => s.kinds.includes(p.kind)).sort((a, b) => a.sequence - b.sequence),
  })).filter((x) => x.points.length > 0);
  return (
    <SimpleGrid cols={{ base: 1, lg: 2 }} spacing="md">
      {specs.map(({ spec, points: pts }) => (
        <TrendChart key={spec.key} spec={spec} points={pts} readings={readings} alarms={alarms} engine={engine} />
      ))}
    </SimpleGrid>
  );
}
