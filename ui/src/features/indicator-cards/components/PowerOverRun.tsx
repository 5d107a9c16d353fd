import { Paper, Text, Title } from '@mantine/core';
import { LineChart } from '@mantine/charts';
import type { CardSetDto } from '@crankjournal/shared-types';
import { endLabel, lastIndexOf, pen } from '../../../components/charts/pens';

const localTime = (ms: number) => new Date(ms).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' });

/** Rows for the chart: one per set, in time order, with the engine's and each cylinder's indicated power. */
export function powerRows(sets: CardSetDto[]): Record<string, number | null>[] {
  return [...sets]
    .sort((a, b) => a.takenAt.localeCompare(b.takenAt))
    .map((s) => {
      const row: Record<string, number | null> = {
        t: Date.parse(s.takenAt),
        Engine: Math.round(s.results.totalIndicatedHorsepower * 10) / 10,
      };
      for (const c of s.results.cylinders) row[c.label] = c.indicatedHorsepower > 0 ? Math.round(c.indicatedHorsepower * 10) / 10 : null;
      row.Brake = s.results.brake ? Math.round(s.results.brake.brakeHorsepower * 10) / 10 : null;
      return row;
    });
}

/** Indicated power over the course of the run: the engine and each cylinder, with brake figures where entered. */
export function PowerOverRun({ sets }: { sets: CardSetDto[] }) {
  const data = powerRows(sets);
  const labels = [...new Set(sets.flatMap((s) => s.results.cylinders.map((c) => c.label)))];
  const withBrake = data.some((d) => d.Brake !== null);
  const times = data.map((d) => d.t as number);
  // Pens from our palette with dash patterns; each line named at its end, so no legend is needed.
  const series = [
    { name: 'Engine', color: pen(0).color },
    ...labels.map((l, i) => ({ name: l, color: pen(i + 1).color, strokeDasharray: pen(i + 1).dash })),
    ...(withBrake
      ? [{ name: 'Brake', label: 'Brake hp', color: pen(labels.length + 1).color, strokeDasharray: pen(labels.length + 1).dash }]
      : []),
  ];
  return (
    <Paper withBorder p="md" radius="md" data-testid="power-over-run">
      <Title order={3} fz="md" mb="xs">
        Indicated power over the run{' '}
        <Text span c="dimmed" fz="sm">
          (ihp)
        </Text>
      </Title>
      {data.length === 0 ? (
        <Text c="dimmed" fz="sm">
          No card sets yet.
        </Text>
      ) : (
        <LineChart
          h={240}
          data={data}
          dataKey="t"
          series={series}
          lineProps={(sr) => ({
            label: endLabel(sr.label ?? sr.name, lastIndexOf(data, sr.name), series.find((x) => x.name === sr.name)?.color ?? 'gray.6'),
          })}
          lineChartProps={{ margin: { right: 72 } }}
          withDots
          connectNulls
          curveType="linear"
          strokeWidth={2}
          xAxisProps={{
            type: 'number',
            scale: 'time',
            domain: times.length > 1 ? [Math.min(...times), Math.max(...times)] : [times[0] - 1_800_000, times[0] + 1_800_000],
            tickFormatter: (v: number) => localTime(v),
            minTickGap: 40,
          }}
          yAxisProps={{ domain: [0, 'auto'], width: 56 }}
          tooltipProps={{ labelFormatter: (v: unknown) => localTime(Number(v)) }}
          valueFormatter={(v) => String(Math.round(v))}
          gridAxis="xy"
        />
      )}
    </Paper>
  );
}
