import { useMemo, type ReactNode } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Badge, Button, Card, Grid, Group, List, Loader, SimpleGrid, Stack, Text, Title } from '@mantine/core';
import { IconArrowRight, IconPencil } from '@tabler/icons-react';
import {
  DESIGN_SUPPRESSION_RULE_WORDS,
  MEASUREMENT_KIND_LABELS,
  RUN_STATE_LABELS,
  type BearingDto,
  type CylinderDto,
  type EngineDetail,
  type LimitChangeDto,
  type LubricationPointDto,
  type MeasurementPointDto,
} from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { Caution } from '../../../components/Caution/Caution';
import { DataTable, columnHelper } from '../../../components/DataTable/DataTable';
import { UnitValue } from '../../../components/UnitValue/UnitValue';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { formatNumber } from '../../units/units';
import { useUnits } from '../../units/useUnits';
import { engineDetailQuery, engineLimitChangesQuery } from '../api/engines.api';
import {
  BEARING_KIND_LABELS,
  CYLINDER_ROLE_LABELS,
  ENGINE_TYPE_LABELS,
  LUBRICATION_KIND_LABELS,
  LIMITS_CAUTION,
  PRESSURE_LIMITS_CAUTION,
  fieldLabel,
} from '../labels';

type Cyl = CylinderDto & { id: string };
type Brg = BearingDto & { id: string };
type Lub = LubricationPointDto & { id: string };
type Pt = MeasurementPointDto & { id: string };

function Section({ title, subtitle, children }: { title: string; subtitle?: string; children: ReactNode }) {
  return (
    <Card withBorder padding="lg" radius="md">
      <Stack gap="sm">
        <div>
          <Title order={2} fz={22}>
            {title}
          </Title>
          {subtitle && (
            <Text fz="sm" c="dimmed">
              {subtitle}
            </Text>
          )}
        </div>
        {children}
      </Stack>
    </Card>
  );
}

function Setting({ label, children }: { label: string; children: ReactNode }) {
  return (
    <Stack gap={2}>
      <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
        {label}
      </Text>
      <div>{children}</div>
    </Stack>
  );
}

export default function EngineDetailPage() {
  const { id = '' } = useParams();
  const isChief = useHasRole('chief_engineer');
  const isMaintenanceLead = useHasRole('maintenance_lead');
  const { data: engine, isLoading, error } = useQuery(engineDetailQuery(id));
  if (isLoading) return <Loader />;
  if (error || !engine) return <Alert color="signal">{errorText(error)}</Alert>;
  return (
    <Stack gap="lg">
      <PageHeader
        title={engine.name}
        subtitle={[ENGINE_TYPE_LABELS[engine.type], engine.yearBuilt && `built ${engine.yearBuilt}`, engine.builder]
          .filter(Boolean)
          .join(' · ')}
        state={
          engine.activeRunId ? (
            <Button component={Link} to={`/runs/${engine.activeRunId}`} variant="light" rightSection={<IconArrowRight size={18} />}>
              Open current run
            </Button>
          ) : undefined
        }
        action={
          (isChief || isMaintenanceLead) && (
            <Group>
              <Button
                component={Link}
                to={`/alarm-figures?engineId=${engine.id}&year=${new Date().getFullYear()}`}
                size="lg"
                variant="default"
              >
                Alarm figures
              </Button>
              {isChief && (
                <Button component={Link} to={`/engines/${engine.id}/edit`} size="lg" leftSection={<IconPencil />}>
                  Edit engine
                </Button>
              )}
            </Group>
          )
        }
      />
      <Settings engine={engine} />
      <Cylinders rows={engine.cylinders} />
      <Bearings rows={engine.bearings} lubrication={engine.lubricationPoints} />
      <Lubrication rows={engine.lubricationPoints} />
      <MeasurementPoints engine={engine} />
      <LimitHistory engineId={engine.id} />
    </Stack>
  );
}

function Settings({ engine }: { engine: EngineDetail }) {
  return (
    <Section title="Settings">
      <Grid gap="lg">
        <Grid.Col span={{ base: 12, xl: 8 }}>
          <SimpleGrid cols={{ base: 2, sm: 3 }} spacing="lg" verticalSpacing="lg">
            <Setting label="Running hours">
              <UnitValue value={engine.runningHours} unit="h" raw decimals={1} size="lg" />
            </Setting>
            <Setting label="Revolutions">
              <UnitValue value={engine.revolutions} unit="rev" raw decimals={0} size="lg" />
            </Setting>
            <Setting label="Rated speed">
              <UnitValue value={engine.ratedSpeedRpm} unit="rpm" decimals={0} size="lg" />
            </Setting>
            <Setting label="Overspeed">
              <UnitValue value={engine.overspeedRpm} unit="rpm" decimals={0} size="lg" />
            </Setting>
            <Setting label="Maximum allowable working pressure">
              <UnitValue value={engine.mawpPsig} unit="psig" size="lg" />
            </Setting>
            <Setting label="Pre-lube stays fresh for">
              <UnitValue value={engine.preLubeFreshnessMinutes} unit="min" raw size="lg" />
            </Setting>
            <Setting label="Flywheel mass">
              <UnitValue value={engine.flywheelMassLb} unit="lb" raw size="md" />
            </Setting>
            <Setting label="Flywheel radius of gyration">
              <UnitValue value={engine.flywheelRadiusOfGyrationFt} unit="ft" raw decimals={2} size="md" />
            </Setting>
            <Setting label="Rotating weight on the main bearings">
              <UnitValue value={engine.rotatingWeightLb} unit="lb" raw size="md" />
            </Setting>
          </SimpleGrid>
        </Grid.Col>
        <Grid.Col span={{ base: 12, xl: 4 }}>
          <Caution title="Pressure limits">{PRESSURE_LIMITS_CAUTION}</Caution>
        </Grid.Col>
      </Grid>
      {engine.notes && (
        <Text maw={900} style={{ whiteSpace: 'pre-wrap' }}>
          {engine.notes}
        </Text>
      )}
    </Section>
  );
}

const cylCol = columnHelper<Cyl>();
function Cylinders({ rows }: { rows: Cyl[] }) {
  const columns = useMemo(
    () => [
      cylCol.accessor('label', { header: 'Cylinder', cell: (c) => <Text fw={600}>{c.getValue()}</Text> }),
      cylCol.accessor('role', { header: 'Role', cell: (c) => CYLINDER_ROLE_LABELS[c.getValue()] }),
      cylCol.accessor('boreIn', { header: 'Bore', cell: (c) => <UnitValue value={c.getValue()} unit="in" decimals={2} size="sm" /> }),
      cylCol.accessor('strokeIn', { header: 'Stroke', cell: (c) => <UnitValue value={c.getValue()} unit="in" decimals={2} size="sm" /> }),
      cylCol.accessor('pistonRodIn', {
        header: 'Piston rod',
        cell: (c) => <UnitValue value={c.getValue()} unit="in" decimals={2} size="sm" />,
      }),
      cylCol.accessor('tailRodIn', {
        header: 'Tail rod',
        cell: (c) => <UnitValue value={c.getValue()} unit="in" decimals={2} size="sm" />,
      }),
      cylCol.accessor('clearancePercent', {
        header: 'Clearance',
        cell: (c) => <UnitValue value={c.getValue()} unit="%" raw decimals={1} size="sm" />,
      }),
    ],
    [],
  );
  return (
    <Section title="Cylinders">
      <DataTable data={rows} columns={columns} caption="Cylinders" getRowId={(r) => r.id} empty="No cylinders described." />
    </Section>
  );
}

const brgCol = columnHelper<Brg>();
function Bearings({ rows, lubrication }: { rows: Brg[]; lubrication: Lub[] }) {
  const columns = useMemo(
    () => [
      brgCol.accessor('label', { header: 'Bearing', cell: (c) => <Text fw={600}>{c.getValue()}</Text> }),
      brgCol.accessor('kind', { header: 'Kind', cell: (c) => BEARING_KIND_LABELS[c.getValue()] }),
      brgCol.accessor('journalDiameterIn', {
        header: 'Journal diameter',
        cell: (c) => <UnitValue value={c.getValue()} unit="in" decimals={2} size="sm" />,
      }),
      brgCol.accessor('journalLengthIn', {
        header: 'Journal length',
        cell: (c) => <UnitValue value={c.getValue()} unit="in" decimals={2} size="sm" />,
      }),
      brgCol.accessor('loadSharePercent', {
        header: 'Share of load',
        cell: (c) => <UnitValue value={c.getValue()} unit="%" raw decimals={0} size="sm" />,
      }),
      brgCol.accessor((r) => r.radialClearanceIn ?? null, {
        id: 'clearance',
        header: 'Radial clearance',
        cell: (c) => (c.getValue() === null ? '—' : <UnitValue value={c.getValue() as number} unit="in" decimals={4} size="sm" />),
      }),
      brgCol.accessor((r) => r.lubricationPointLabel ?? lubrication.find((l) => l.id === r.lubricationPointId)?.label ?? '—', {
        id: 'fedBy',
        header: 'Fed by',
      }),
    ],
    [lubrication],
  );
  return (
    <Section title="Bearings">
      <DataTable data={rows} columns={columns} caption="Bearings" getRowId={(r) => r.id} empty="No bearings described." />
    </Section>
  );
}

const lubCol = columnHelper<Lub>();
function Lubrication({ rows }: { rows: Lub[] }) {
  const columns = useMemo(
    () => [
      lubCol.accessor('label', { header: 'Lubrication point', cell: (c) => <Text fw={600}>{c.getValue()}</Text> }),
      lubCol.accessor('kind', { header: 'Kind', cell: (c) => LUBRICATION_KIND_LABELS[c.getValue()] }),
      lubCol.accessor('oilGrade', { header: 'Oil grade' }),
    ],
    [],
  );
  return (
    <Section title="Lubrication points">
      <DataTable
        data={rows}
        columns={columns}
        caption="Lubrication points"
        getRowId={(r) => r.id}
        empty="No lubrication points described."
      />
    </Section>
  );
}

const ptCol = columnHelper<Pt>();
function MeasurementPoints({ engine }: { engine: EngineDetail }) {
  const { display } = useUnits();
  const columns = useMemo(() => {
    const limit = (v: number | null | undefined, unit: string, delta = false) =>
      v === null || v === undefined ? (
        <Text c="dimmed">—</Text>
      ) : (
        <Text className="cj-num" fw={500} style={{ whiteSpace: 'nowrap' }}>
          {display(v, unit, { delta }).label}
        </Text>
      );
    const attachedTo = (p: Pt) =>
      p.bearingLabel ??
      engine.bearings.find((b) => b.id === p.bearingId)?.label ??
      p.cylinderLabel ??
      engine.cylinders.find((c) => c.id === p.cylinderId)?.label ??
      null;
    return [
      ptCol.accessor('sequence', { header: '#', cell: (c) => <Text className="cj-num">{c.getValue()}</Text> }),
      ptCol.accessor('code', { header: 'Code', cell: (c) => <Text ff="monospace">{c.getValue()}</Text> }),
      ptCol.accessor('label', {
        header: 'Point',
        cell: (c) => (
          <Stack gap={0} miw={200}>
            <Text fw={600}>{c.getValue()}</Text>
            <Text fz="xs" c="dimmed">
              {MEASUREMENT_KIND_LABELS[c.row.original.kind]}
              {attachedTo(c.row.original) ? ` · on ${attachedTo(c.row.original)}` : ''}
            </Text>
          </Stack>
        ),
      }),
      ptCol.accessor((p) => p.normalLow ?? p.normalHigh ?? null, {
        id: 'normal',
        header: 'Normal range',
        cell: (c) => {
          const p = c.row.original;
          if (p.normalLow == null && p.normalHigh == null) return <Text c="dimmed">—</Text>;
          const lo = p.normalLow == null ? '' : display(p.normalLow, p.unit).text;
          const hi = p.normalHigh == null ? '' : display(p.normalHigh, p.unit).label;
          return <Text className="cj-num" style={{ whiteSpace: 'nowrap' }}>{`${lo} – ${hi || display(null, p.unit).unitLabel}`}</Text>;
        },
      }),
      ptCol.accessor((p) => p.lowLimit ?? null, {
        id: 'low',
        header: 'Low',
        cell: (c) => limit(c.row.original.lowLimit, c.row.original.unit),
      }),
      ptCol.accessor((p) => p.highLimit ?? null, {
        id: 'high',
        header: 'High',
        cell: (c) => limit(c.row.original.highLimit, c.row.original.unit),
      }),
      ptCol.accessor((p) => p.highHighLimit ?? null, {
        id: 'highHigh',
        header: 'High-high',
        cell: (c) => limit(c.row.original.highHighLimit, c.row.original.unit),
      }),
      ptCol.accessor((p) => p.maxRiseRatePerMin ?? null, {
        id: 'rise',
        header: 'Rise per min',
        cell: (c) => limit(c.row.original.maxRiseRatePerMin, c.row.original.unit, true),
      }),
      ptCol.accessor((p) => p.maxRiseAboveAmbient ?? null, {
        id: 'ambient',
        header: 'Above ambient',
        cell: (c) => limit(c.row.original.maxRiseAboveAmbient, c.row.original.unit, true),
      }),
      ptCol.accessor((p) => p.deadband ?? null, {
        id: 'deadband',
        header: 'Deadband',
        cell: (c) => limit(c.row.original.deadband, c.row.original.unit, true),
      }),
      ptCol.accessor((p) => (p.suppressedInStates ?? []).join(','), {
        id: 'suppression',
        header: 'Suppression',
        enableSorting: false,
        cell: (c) => {
          const p = c.row.original;
          const states = (p.suppressedInStates ?? []).map((s) => RUN_STATE_LABELS[s]).join(', ');
          return (
            <Text fz="sm">
              {p.relatedSuppression === false ? 'Related: no' : 'Related: yes'}
              {states ? ` · while ${states}` : ''}
            </Text>
          );
        },
      }),
    ];
  }, [display, engine]);
  const points = useMemo(() => [...engine.measurementPoints].sort((a, b) => a.sequence - b.sequence), [engine.measurementPoints]);
  return (
    <Section
      title="Measurement points and limits"
      subtitle={
        'In the order of a round of readings. The server raises an alarm when a reading passes a limit, ' +
        'rises faster than the rate, or rises too far above ambient.'
      }
    >
      <Caution title="Limits">{LIMITS_CAUTION}</Caution>
      <Stack gap={4} data-testid="suppression-rules">
        <Text fw={700}>Suppression by design</Text>
        <List size="sm">
          {DESIGN_SUPPRESSION_RULE_WORDS.map((w) => (
            <List.Item key={w}>{w}</List.Item>
          ))}
          <List.Item>
            A suppressed alarm is recorded and listed as &quot;suppressed by&quot; the other, is not annunciated nor waiting, and is
            released when the other clears. A point can also be suppressed in chosen run states (column Suppression).
          </List.Item>
        </List>
      </Stack>
      <DataTable
        data={points}
        columns={columns}
        caption="Measurement points and limits"
        getRowId={(r) => r.id}
        empty="No measurement points yet."
      />
    </Section>
  );
}

const lcCol = columnHelper<LimitChangeDto>();
function ChangeValue({ v }: { v: number | string | null }) {
  if (v === null || v === '')
    return (
      <Text span c="dimmed">
        none
      </Text>
    );
  return (
    <Text span className="cj-num">
      {typeof v === 'number' ? formatNumber(v, Number.isInteger(v) ? 0 : 2) : v}
    </Text>
  );
}
function LimitHistory({ engineId }: { engineId: string }) {
  const { data, isLoading, error } = useQuery(engineLimitChangesQuery(engineId));
  const columns = useMemo(
    () => [
      lcCol.accessor('changedAt', {
        header: 'When',
        cell: (c) => (
          <Text className="cj-num" fz="sm">
            {new Date(c.getValue()).toLocaleString(undefined, {
              day: 'numeric',
              month: 'short',
              year: 'numeric',
              hour: '2-digit',
              minute: '2-digit',
            })}
          </Text>
        ),
      }),
      lcCol.accessor('changedByName', { header: 'Who' }),
      lcCol.accessor('subject', {
        header: 'What',
        cell: (c) => (
          <Stack gap={0}>
            <Text fw={600}>{c.getValue()}</Text>
            <Text fz="sm" c="dimmed">
              {fieldLabel(c.row.original.field)}
            </Text>
          </Stack>
        ),
      }),
      lcCol.display({
        id: 'change',
        header: 'Old → new',
        cell: (c) => (
          <Group gap={6} wrap="nowrap">
            <span className="cj-struck" aria-label="old value">
              <ChangeValue v={c.row.original.oldValue} />
            </span>
            <Text span c="dimmed">
              →
            </Text>
            <Text span fw={600}>
              <ChangeValue v={c.row.original.newValue} />
            </Text>
          </Group>
        ),
      }),
    ],
    [],
  );
  const rows = useMemo(() => [...(data ?? [])].sort((a, b) => b.changedAt.localeCompare(a.changedAt)), [data]);
  return (
    <Section
      title="Changes to limits and settings"
      subtitle="Every change is kept: who made it, when, and the value before and after. Newest first."
    >
      {isLoading && <Loader size="sm" />}
      {error && <Alert color="signal">{errorText(error)}</Alert>}
      {data && (
        <DataTable
          data={rows}
          columns={columns}
          caption="Changes to limits and settings"
          getRowId={(r) => r.id}
          empty="No changes since the engine was described."
        />
      )}
      {data && data.length > 0 && (
        <Badge variant="outline" color="gray">
          {data.length === 1 ? '1 change' : `${data.length} changes`}
        </Badge>
      )}
    </Section>
  );
}
