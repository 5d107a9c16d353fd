import { useEffect, useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import {
  Alert,
  Badge,
  Button,
  Card,
  Group,
  Loader,
  Modal,
  NumberInput,
  SegmentedControl,
  Select,
  SimpleGrid,
  Stack,
  Table,
  Text,
  TextInput,
  Title,
} from '@mantine/core';
import { LineChart } from '@mantine/charts';
import { IconMinus, IconPlus, IconTrendingDown, IconTrendingUp } from '@tabler/icons-react';
import type { ConsumptionMethod, ConsumptionTrend, EngineDetail, EngineLubrication, OilWriteRequest } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { UnitValue } from '../../../components/UnitValue/UnitValue';
import { useHasRole } from '../../auth/useSession';
import { engineDetailQuery, enginesListQuery } from '../../engines/api/engines.api';
import { LUBRICATION_KIND_LABELS } from '../../engines/labels';
import { runsListQuery } from '../../runs/api/runs.api';
import {
  bearingAnalysisQuery,
  engineLubricationQuery,
  oilsQuery,
  useAssignOil,
  useCreateOil,
  useLogConsumption,
} from '../api/lubrication.api';
import { LiftAndJacks } from '../components/LiftAndJacks';
import { fmtN, fmtSci } from '../components/ResultFigure';

const dayShort = (iso: string | null) =>
  iso ? new Date(iso).toLocaleDateString(undefined, { day: 'numeric', month: 'short', year: '2-digit' }) : '—';

export function TrendBadge({ trend }: { trend: ConsumptionTrend }) {
  if (!trend.direction)
    return (
      <Text fz="sm" c="dimmed">
        Too few runs for a trend
      </Text>
    );
  const pct = trend.changePercent === null ? '' : ` ${trend.changePercent > 0 ? '+' : ''}${fmtN(trend.changePercent, 0)} %`;
  if (trend.direction === 'steady')
    return (
      <Badge variant="outline" color="gray" leftSection={<IconMinus size={12} />}>
        Steady{pct}
      </Badge>
    );
  return (
    <Badge
      color="amber"
      variant="light"
      leftSection={trend.direction === 'rising' ? <IconTrendingUp size={12} /> : <IconTrendingDown size={12} />}
      data-testid="trend-attention"
    >
      {trend.direction === 'rising' ? 'Rising' : 'Falling'}
      {pct}
    </Badge>
  );
}

function OilsCard({ canWrite }: { canWrite: boolean }) {
  const oils = useQuery(oilsQuery());
  const [open, setOpen] = useState(false);
  const create = useCreateOil();
  const [form, setForm] = useState<OilWriteRequest>({
    name: '',
    grade: '',
    viscosity40cSt: 0,
    viscosity100cSt: 0,
    densityKgM3At15C: null,
    figuresSource: '',
  });
  return (
    <Card withBorder padding="lg" radius="md">
      <Group justify="space-between" mb="sm">
        <Title order={2} fz={22}>
          Oils
        </Title>
        {canWrite && (
          <Button variant="default" leftSection={<IconPlus size={16} />} onClick={() => setOpen(true)}>
            Add an oil
          </Button>
        )}
      </Group>
      <Table.ScrollContainer minWidth={640}>
        <Table aria-label="Oils" className="cj-num">
          <Table.Thead>
            <Table.Tr>
              <Table.Th>Oil</Table.Th>
              <Table.Th>Grade</Table.Th>
              <Table.Th>At 40 °C</Table.Th>
              <Table.Th>At 100 °C</Table.Th>
              <Table.Th>Density at 15 °C</Table.Th>
              <Table.Th>Figures from</Table.Th>
            </Table.Tr>
          </Table.Thead>
          <Table.Tbody>
            {(oils.data ?? []).map((o) => (
              <Table.Tr key={o.id}>
                <Table.Td fw={600}>{o.name}</Table.Td>
                <Table.Td>{o.grade}</Table.Td>
                <Table.Td>{fmtN(o.viscosity40cSt, 1)} cSt</Table.Td>
                <Table.Td>{fmtN(o.viscosity100cSt, 1)} cSt</Table.Td>
                <Table.Td>{o.densityKgM3At15C ? `${fmtN(o.densityKgM3At15C, 0)} kg/m³` : '—'}</Table.Td>
                <Table.Td fz="sm" c="dimmed">
                  {o.figuresSource}
                </Table.Td>
              </Table.Tr>
            ))}
          </Table.Tbody>
        </Table>
      </Table.ScrollContainer>
      <Modal opened={open} onClose={() => setOpen(false)} title="Add an oil" size="lg">
        <Stack gap="sm">
          <TextInput label="Name" value={form.name} onChange={(e) => setForm((f) => ({ ...f, name: e.currentTarget.value }))} />
          <TextInput
            label="Grade"
            value={form.grade}
            onChange={(e) => setForm((f) => ({ ...f, grade: e.currentTarget.value }))}
            placeholder="ISO VG 150"
          />
          <SimpleGrid cols={3}>
            <NumberInput
              label="cSt at 40 °C"
              value={form.viscosity40cSt || ''}
              onChange={(v) => setForm((f) => ({ ...f, viscosity40cSt: Number(v) || 0 }))}
              hideControls
            />
            <NumberInput
              label="cSt at 100 °C"
              value={form.viscosity100cSt || ''}
              onChange={(v) => setForm((f) => ({ ...f, viscosity100cSt: Number(v) || 0 }))}
              hideControls
            />
            <NumberInput
              label="kg/m³ at 15 °C"
              value={form.densityKgM3At15C ?? ''}
              onChange={(v) => setForm((f) => ({ ...f, densityKgM3At15C: v === '' ? null : Number(v) }))}
              hideControls
            />
          </SimpleGrid>
          <TextInput
            label="Where the figures come from"
            value={form.figuresSource}
            onChange={(e) => setForm((f) => ({ ...f, figuresSource: e.currentTarget.value }))}
            placeholder="The supplier’s data sheet, or typical of the grade"
          />
          {create.error && <Alert color="signal">{errorText(create.error)}</Alert>}
          <Button onClick={() => create.mutate(form, { onSuccess: () => setOpen(false) })} loading={create.isPending}>
            Add the oil
          </Button>
        </Stack>
      </Modal>
    </Card>
  );
}

function PointsCard({ data, canWrite }: { data: EngineLubrication; canWrite: boolean }) {
  const oils = useQuery(oilsQuery());
  const assign = useAssignOil();
  return (
    <Card withBorder padding="lg" radius="md">
      <Title order={2} fz={22} mb="sm">
        Lubrication points and their oil
      </Title>
      <Table.ScrollContainer minWidth={720}>
        <Table aria-label="Lubrication points" verticalSpacing="sm">
          <Table.Thead>
            <Table.Tr>
              <Table.Th>Point</Table.Th>
              <Table.Th>Kind</Table.Th>
              <Table.Th>Feeds</Table.Th>
              <Table.Th>Grade on the engine’s description</Table.Th>
              <Table.Th>Oil</Table.Th>
            </Table.Tr>
          </Table.Thead>
          <Table.Tbody>
            {data.points.map((p) => (
              <Table.Tr key={p.lubricationPointId}>
                <Table.Td fw={600}>{p.label}</Table.Td>
                <Table.Td>{LUBRICATION_KIND_LABELS[p.kind]}</Table.Td>
                <Table.Td fz="sm">{p.bearings.map((b) => b.label).join(', ') || '—'}</Table.Td>
                <Table.Td fz="sm" c="dimmed">
                  {p.oilGradeText || '—'}
                </Table.Td>
                <Table.Td>
                  {canWrite ? (
                    <Select
                      aria-label={`Oil for ${p.label}`}
                      data={(oils.data ?? []).map((o) => ({ value: o.id, label: o.name }))}
                      value={p.oilId}
                      placeholder="No oil known"
                      onChange={(v) => assign.mutate({ pointId: p.lubricationPointId, oilId: v })}
                      clearable
                      w={280}
                    />
                  ) : (
                    <Text>{p.oilName ?? '—'}</Text>
                  )}
                </Table.Td>
              </Table.Tr>
            ))}
          </Table.Tbody>
        </Table>
      </Table.ScrollContainer>
      {assign.error && <Alert color="signal">{errorText(assign.error)}</Alert>}
    </Card>
  );
}

function ConsumptionCard({ data, engineId, canLog }: { data: EngineLubrication; engineId: string; canLog: boolean }) {
  const runs = useQuery(runsListQuery({ engineId }));
  const log = useLogConsumption();
  const started = (runs.data ?? []).filter((r) => r.startedAt && r.state !== 'abandoned');
  const [runId, setRunId] = useState<string | null>(null);
  const [pointId, setPointId] = useState<string | null>(null);
  const [method, setMethod] = useState<ConsumptionMethod>('added');
  const [qty, setQty] = useState<number | ''>('');
  const [start, setStart] = useState<number | ''>('');
  const [end, setEnd] = useState<number | ''>('');
  const chart = useMemo(() => {
    const rows = new Map<string, Record<string, number | string>>();
    for (const p of data.consumption)
      for (const r of p.runs) {
        if (r.litresPerThousandRevolutions === null) continue;
        const row = rows.get(r.runId) ?? { run: dayShort(r.startedAt), t: r.startedAt ?? '' };
        row[p.label] = +r.litresPerThousandRevolutions.toFixed(4);
        rows.set(r.runId, row);
      }
    return [...rows.values()].sort((a, b) => String(a.t).localeCompare(String(b.t)));
  }, [data]);
  const colors = ['copper.5', 'brass.5', 'blue.4', 'grape.4', 'teal.4', 'orange.4', 'gray.5'];
  const withRuns = data.consumption.filter((p) => p.runs.length);
  return (
    <Card withBorder padding="lg" radius="md">
      <Title order={2} fz={22} mb="sm">
        Oil used
      </Title>
      <Table.ScrollContainer minWidth={760}>
        <Table aria-label="Oil used by point" className="cj-num" verticalSpacing="sm">
          <Table.Thead>
            <Table.Tr>
              <Table.Th>Point</Table.Th>
              <Table.Th>Runs</Table.Th>
              <Table.Th>Latest run</Table.Th>
              <Table.Th>Per run-hour</Table.Th>
              <Table.Th>Per 1000 revolutions</Table.Th>
              <Table.Th>Trend</Table.Th>
            </Table.Tr>
          </Table.Thead>
          <Table.Tbody>
            {data.consumption.map((p) => {
              const last = p.runs[p.runs.length - 1];
              return (
                <Table.Tr key={p.lubricationPointId} data-testid={`consumption-${p.label}`}>
                  <Table.Td fw={600}>
                    {p.label}
                    <Text fz="xs" c="dimmed" fw={400}>
                      {p.oilName ?? 'no oil known'}
                    </Text>
                  </Table.Td>
                  <Table.Td>
                    {p.runs.length} · {fmtN(p.totalLitres, 1)} L
                  </Table.Td>
                  <Table.Td>{last ? `${fmtN(last.usedLitres, 2)} L (${dayShort(last.startedAt)})` : '—'}</Table.Td>
                  <Table.Td>{last?.litresPerRunHour != null ? `${fmtN(last.litresPerRunHour, 3)} L/h` : '—'}</Table.Td>
                  <Table.Td>
                    {last?.litresPerThousandRevolutions != null ? `${fmtN(last.litresPerThousandRevolutions, 4)} L` : '—'}
                  </Table.Td>
                  <Table.Td>
                    <TrendBadge trend={p.trend} />
                  </Table.Td>
                </Table.Tr>
              );
            })}
          </Table.Tbody>
        </Table>
      </Table.ScrollContainer>
      {data.consumption[0] && (
        <Text fz="xs" c="dimmed" mt="xs">
          {data.consumption[0].trend.ruleText}
        </Text>
      )}
      {chart.length >= 2 && (
        <Stack gap={4} mt="md">
          <Text fw={600}>Litres per thousand revolutions, run by run</Text>
          <LineChart
            h={360}
            mb="md"
            data={chart}
            dataKey="run"
            series={withRuns.map((p, i) => ({ name: p.label, color: colors[i % colors.length] }))}
            withLegend
            legendProps={{ verticalAlign: 'bottom', height: 96 }}
            curveType="linear"
            connectNulls
            valueFormatter={(v) => fmtN(v, 3)}
            yAxisProps={{ width: 60 }}
          />
        </Stack>
      )}
      {canLog && (
        <Stack gap="sm" mt="lg">
          <Text fw={600}>Log oil used in a run</Text>
          <Group gap="sm" align="flex-end" wrap="wrap">
            <Select
              label="Run"
              data={started.map((r) => ({ value: r.id, label: `${r.title} (${dayShort(r.startedAt)})` }))}
              value={runId}
              onChange={setRunId}
              w={300}
            />
            <Select
              label="Point"
              data={data.points.map((p) => ({ value: p.lubricationPointId, label: p.label }))}
              value={pointId}
              onChange={setPointId}
              w={260}
            />
            <SegmentedControl
              value={method}
              onChange={(v) => setMethod(v as ConsumptionMethod)}
              data={[
                { value: 'added', label: 'Quantity added' },
                { value: 'levels', label: 'Levels before and after' },
              ]}
            />
            {method === 'added' ? (
              <NumberInput
                label="Litres added"
                value={qty}
                onChange={(v) => setQty(v === '' ? '' : Number(v))}
                hideControls
                w={130}
                min={0}
              />
            ) : (
              <>
                <NumberInput
                  label="Litres before"
                  value={start}
                  onChange={(v) => setStart(v === '' ? '' : Number(v))}
                  hideControls
                  w={130}
                  min={0}
                />
                <NumberInput
                  label="Litres after"
                  value={end}
                  onChange={(v) => setEnd(v === '' ? '' : Number(v))}
                  hideControls
                  w={130}
                  min={0}
                />
              </>
            )}
            <Button
              disabled={!runId || !pointId}
              loading={log.isPending}
              onClick={() =>
                runId &&
                pointId &&
                log.mutate(
                  method === 'added'
                    ? { runId, lubricationPointId: pointId, method, quantityLitres: qty === '' ? null : qty }
                    : {
                        runId,
                        lubricationPointId: pointId,
                        method,
                        levelStartLitres: start === '' ? null : start,
                        levelEndLitres: end === '' ? null : end,
                      },
                  {
                    onSuccess: () => {
                      setQty('');
                      setStart('');
                      setEnd('');
                    },
                  },
                )
              }
            >
              Log oil used
            </Button>
          </Group>
          {log.error && <Alert color="signal">{errorText(log.error)}</Alert>}
        </Stack>
      )}
    </Card>
  );
}

function BearingsCard({ engineId }: { engineId: string }) {
  const runs = useQuery(runsListQuery({ engineId }));
  const [runId, setRunId] = useState<string | undefined>(undefined);
  const analysis = useQuery(bearingAnalysisQuery(engineId, runId));
  const started = (runs.data ?? []).filter((r) => r.startedAt && r.state !== 'abandoned');
  const a = analysis.data;
  return (
    <Card withBorder padding="lg" radius="md">
      <Group justify="space-between" mb="sm" wrap="wrap">
        <Title order={2} fz={22}>
          Bearings at a run: viscosity, load and friction
        </Title>
        <Select
          aria-label="Run"
          data={started.map((r) => ({ value: r.id, label: `${r.title} (${dayShort(r.startedAt)})` }))}
          value={runId ?? a?.runId ?? null}
          onChange={(v) => setRunId(v ?? undefined)}
          w={340}
          allowDeselect={false}
        />
      </Group>
      {analysis.isLoading && <Loader size="sm" />}
      {analysis.error && <Alert color="signal">{errorText(analysis.error)}</Alert>}
      {a && (
        <>
          <Table.ScrollContainer minWidth={1000}>
            <Table aria-label="Bearing figures" className="cj-num" verticalSpacing="sm">
              <Table.Thead>
                <Table.Tr>
                  <Table.Th>Bearing</Table.Th>
                  <Table.Th>Mean temperature</Table.Th>
                  <Table.Th>Viscosity</Table.Th>
                  <Table.Th>Absolute</Table.Th>
                  <Table.Th>Load</Table.Th>
                  <Table.Th>Unit load</Table.Th>
                  <Table.Th>Friction torque</Table.Th>
                  <Table.Th>Coefficient</Table.Th>
                  <Table.Th>Power lost</Table.Th>
                  <Table.Th>Sommerfeld</Table.Th>
                </Table.Tr>
              </Table.Thead>
              <Table.Tbody>
                {a.rows.map((r) => (
                  <Table.Tr key={r.bearingId} data-testid={`lube-bearing-${r.label}`}>
                    <Table.Td fw={600}>
                      {r.label}
                      <Text fz="xs" c="dimmed" fw={400}>
                        {r.oilName ?? 'no oil known'}
                        {r.missing.length ? ` · ${r.missing.join('; ')}` : ''}
                      </Text>
                    </Table.Td>
                    <Table.Td>
                      {r.temperatureC === null ? '—' : <UnitValue value={r.temperatureC} unit="degC" size="sm" decimals={1} />}
                    </Table.Td>
                    <Table.Td>{r.kinematicCst === null ? '—' : `${fmtN(r.kinematicCst, 1)} cSt`}</Table.Td>
                    <Table.Td>{r.dynamicReyn === null ? '—' : `${fmtSci(r.dynamicReyn, 3)} reyn`}</Table.Td>
                    <Table.Td>{r.loadLbf === null ? '—' : `${fmtN(r.loadLbf, 0)} lbf`}</Table.Td>
                    <Table.Td>{r.unitLoadPsi === null ? '—' : `${fmtN(r.unitLoadPsi, 0)} psi`}</Table.Td>
                    <Table.Td>{r.frictionTorqueLbfIn === null ? '—' : `${fmtN(r.frictionTorqueLbfIn, 0)} lbf·in`}</Table.Td>
                    <Table.Td>{fmtN(r.frictionCoefficient, 4)}</Table.Td>
                    <Table.Td>{r.powerLossHp === null ? '—' : `${fmtN(r.powerLossHp, 2)} hp`}</Table.Td>
                    <Table.Td>{fmtSci(r.sommerfeldNumber, 3)}</Table.Td>
                  </Table.Tr>
                ))}
              </Table.Tbody>
            </Table>
          </Table.ScrollContainer>
          <Stack gap={2} mt="xs">
            {a.notes.map((n) => (
              <Text key={n} fz="xs" c="dimmed">
                {n}
              </Text>
            ))}
          </Stack>
        </>
      )}
    </Card>
  );
}

function mainJournalLoad(engine: EngineDetail | undefined): number | null {
  if (!engine?.rotatingWeightLb) return null;
  const shares = engine.bearings.filter((b) => b.kind === 'main' && b.loadSharePercent > 0).map((b) => b.loadSharePercent);
  return shares.length ? (engine.rotatingWeightLb * Math.max(...shares)) / 100 : null;
}

/**
 * /lubrication — oils and points, oil used with its rates and trends, each bearing's viscosity, load and
 * friction at a run, pre-lube and jacks.
 */
export default function LubricationPage() {
  const canWrite = useHasRole('maintenance_lead', 'chief_engineer');
  const canLog = useHasRole('operator', 'maintenance_lead', 'chief_engineer');
  const engines = useQuery(enginesListQuery());
  const [engineId, setEngineId] = useState<string>('');
  useEffect(() => {
    if (!engineId && engines.data?.length) setEngineId(engines.data[0].id);
  }, [engines.data, engineId]);
  const data = useQuery({ ...engineLubricationQuery(engineId), enabled: !!engineId });
  const engine = useQuery({ ...engineDetailQuery(engineId), enabled: !!engineId });
  return (
    <Stack gap="lg">
      <PageHeader
        title="Lubrication"
        subtitle="The oils, which point takes which, the oil each point uses per run, and what the oil does in the bearings."
        action={
          (engines.data?.length ?? 0) > 1 ? (
            <Select
              aria-label="Engine"
              data={(engines.data ?? []).map((e) => ({ value: e.id, label: e.name }))}
              value={engineId || null}
              onChange={(v) => setEngineId(v ?? '')}
              allowDeselect={false}
            />
          ) : undefined
        }
      />
      {data.isLoading && <Loader />}
      {data.error && <Alert color="signal">{errorText(data.error)}</Alert>}
      <OilsCard canWrite={canWrite} />
      {data.data && <PointsCard data={data.data} canWrite={canWrite} />}
      {data.data && <ConsumptionCard data={data.data} engineId={engineId} canLog={canLog} />}
      {engineId && <BearingsCard engineId={engineId} />}
      {engine.data && (
        <Card withBorder padding="lg" radius="md">
          <Title order={2} fz={22} mb="sm">
            Pre-lube and jacking
          </Title>
          <LiftAndJacks
            key={engine.data.id}
            journalLoadLbf={mainJournalLoad(engine.data)}
            rotatingWeightLb={engine.data.rotatingWeightLb}
          />
        </Card>
      )}
    </Stack>
  );
}
