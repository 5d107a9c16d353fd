import { useSearchParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Badge, Group, Loader, NumberInput, Paper, Select, Stack, Table, Text, Title } from '@mantine/core';
import type { AlarmFiguresDto } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { api, errorText, withQuery } from '../../../api/http';
import { enginesListQuery } from '../../engines/api/engines.api';

/** One figure per row, its target, and whether the target is met (word and colour). */
export function FigureRows({ figures }: { figures: AlarmFiguresDto }) {
  return (
    <Table striped withTableBorder aria-label="Alarm system figures">
      <Table.Thead>
        <Table.Tr>
          <Table.Th>Figure</Table.Th>
          <Table.Th>Value</Table.Th>
          <Table.Th>Target</Table.Th>
          <Table.Th>Met</Table.Th>
        </Table.Tr>
      </Table.Thead>
      <Table.Tbody>
        {figures.rows.map((r) => (
          <Table.Tr key={r.label} data-met={r.met}>
            <Table.Td>{r.label}</Table.Td>
            <Table.Td className="cj-num">{r.value}</Table.Td>
            <Table.Td>{r.target}</Table.Td>
            <Table.Td>
              <Badge color={r.met ? 'green' : 'signal'} variant="light">
                {r.met ? 'Met' : 'Not met'}
              </Badge>
            </Table.Td>
          </Table.Tr>
        ))}
      </Table.Tbody>
    </Table>
  );
}

/** The alarm system's own figures for a run (?runId=) or an engine's season (?engineId=&year=), for the chief engineer. */
export default function AlarmFiguresPage() {
  const [params, setParams] = useSearchParams();
  const runId = params.get('runId');
  const engineId = params.get('engineId') ?? '';
  const year = Number(params.get('year') ?? new Date().getFullYear());
  const engines = useQuery({ ...enginesListQuery(), enabled: !runId });
  const figures = useQuery({
    queryKey: ['alarm-figures', { runId, engineId, year }],
    queryFn: () =>
      runId
        ? api<AlarmFiguresDto>(`/runs/${runId}/alarm-figures`)
        : api<AlarmFiguresDto>(withQuery('/runs/alarm-figures', { engineId, year })),
    enabled: !!runId || !!engineId,
  });
  const f = figures.data;
  return (
    <Stack>
      <PageHeader title={runId ? 'Alarm figures of the run' : 'Alarm figures of the season'} />
      {!runId && (
        <Group>
          <Select
            label="Engine"
            data={(engines.data ?? []).map((e) => ({ value: e.id, label: e.name }))}
            value={engineId || null}
            onChange={(v) => setParams({ engineId: v ?? '', year: String(year) })}
          />
          <NumberInput
            label="Season (year)"
            value={year}
            min={1900}
            max={2200}
            allowDecimal={false}
            onChange={(v) => setParams({ engineId, year: String(v) })}
          />
        </Group>
      )}
      {figures.isLoading && <Loader />}
      {figures.error && (
        <Alert color="signal" role="alert">
          {errorText(figures.error)}
        </Alert>
      )}
      {f && (
        <>
          <Text>
            {f.runs} run{f.runs === 1 ? '' : 's'}, {Math.round(f.minutes)} minutes, {f.total} annunciated alarm{f.total === 1 ? '' : 's'}.
          </Text>
          <FigureRows figures={f} />
          <Paper withBorder p="sm">
            <Title order={4}>Most frequent alarms (top ten)</Title>
            {f.topTen.length === 0 ? (
              <Text c="dimmed">None.</Text>
            ) : (
              f.topTen.map((x) => (
                <Text key={x.key}>
                  {x.key}: {x.count} ({Math.round(x.sharePercent)} %)
                </Text>
              ))
            )}
          </Paper>
          <Paper withBorder p="sm">
            <Title order={4}>Chattering alarms</Title>
            {f.chattering.length === 0 ? (
              <Text c="dimmed">None.</Text>
            ) : (
              f.chattering.map((x) => (
                <Text key={x.key} data-testid="chattering">
                  {x.key}: {x.count} times in the chattering window
                  {x.suggestedDeadband !== null ? ` — a deadband of ${x.suggestedDeadband} ${x.unit} would have held it in` : ''}
                </Text>
              ))
            )}
          </Paper>
          <Paper withBorder p="sm">
            <Title order={4}>Stale alarms</Title>
            {f.stale.length === 0 ? (
              <Text c="dimmed">None.</Text>
            ) : (
              f.stale.map((x, i) => (
                <Text key={`${x.key}-${i}`}>
                  {x.key}: active {Math.round(x.minutes)} min
                </Text>
              ))
            )}
          </Paper>
          <Text fz="sm" c="dimmed">
            {f.basis}
          </Text>
        </>
      )}
    </Stack>
  );
}
