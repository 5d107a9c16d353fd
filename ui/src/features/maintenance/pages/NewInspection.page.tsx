import { useEffect, useState } from 'react';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import {
  ActionIcon,
  Alert,
  Button,
  Card,
  Checkbox,
  Group,
  NumberInput,
  Select,
  SimpleGrid,
  Stack,
  Text,
  TextInput,
  Textarea,
  Title,
} from '@mantine/core';
import { IconPlus, IconTrash } from '@tabler/icons-react';
import {
  INSPECTION_KINDS,
  INSPECTION_KIND_LABELS,
  MAINTENANCE_UNITS,
  MEASUREMENT_ITEM_KINDS,
  MEASUREMENT_ITEM_KIND_LABELS,
  STANDARD_CRANK_ANGLES,
  type InspectionCreateRequest,
  type InspectionKind,
  type MaintenanceUnit,
  type MeasurementItemKind,
} from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { engineDetailQuery, enginesListQuery } from '../../engines/api/engines.api';
import { plansQuery, useCreateInspection } from '../api/maintenance.api';
import { HazardCautions } from '../components/HazardCautions';

type Num = number | '';
export interface ItemRow {
  kind: MeasurementItemKind;
  label: string;
  crankAngleDeg: Num;
  value: Num;
  unit: MaintenanceUnit;
  nominal: Num;
  toleranceMin: Num;
  toleranceMax: Num;
}
const row = (over: Partial<ItemRow>): ItemRow => ({
  kind: 'other',
  label: '',
  crankAngleDeg: '',
  value: '',
  unit: 'in',
  nominal: '',
  toleranceMin: '',
  toleranceMax: '',
  ...over,
});

/** Rows to start from for the usual sets of measurements (tolerances are left for the crew's own figures). */
export const PRESETS: { key: string; label: string; rows: () => ItemRow[] }[] = [
  {
    key: 'lead',
    label: 'Lead-wire clearances',
    rows: () => ['Top, crank end', 'Top, centre', 'Top, flywheel end'].map((label) => row({ kind: 'clearance_lead_wire', label })),
  },
  {
    key: 'feeler',
    label: 'Feeler side clearances',
    rows: () => ['Side, cylinder side', 'Side, far side'].map((label) => row({ kind: 'clearance_feeler', label })),
  },
  {
    key: 'web',
    label: 'Web deflection at the standard angles',
    rows: () => STANDARD_CRANK_ANGLES.map((a) => row({ kind: 'web_deflection', label: a.label, crankAngleDeg: a.deg, nominal: 0 })),
  },
  {
    key: 'alignment',
    label: 'Level, squareness and offsets',
    rows: () => [
      row({ kind: 'shaft_level', label: 'Main bearing 1 journal', unit: 'in/ft', nominal: 0 }),
      row({ kind: 'shaft_level', label: 'Main bearing 2 journal', unit: 'in/ft', nominal: 0 }),
      row({ kind: 'squareness', label: 'Shaft to cylinder line', unit: 'in/ft', nominal: 0 }),
      row({ kind: 'bedplate_level', label: 'Bed-plate pad', unit: 'in/ft', nominal: 0 }),
      row({ kind: 'alignment_offset', label: 'Cylinder bore centre from the line', unit: 'in', nominal: 0 }),
    ],
  },
];
const num = (v: Num) => (v === '' ? null : Number(v));

/** The API body from the form (figures sent as typed: the server names what is wrong). */
export function toInspectionRequest(f: {
  engineId: string;
  bearingId: string;
  planId: string;
  completesPlan: boolean;
  kind: InspectionKind;
  title: string;
  inspectedAt: string;
  inspectorName: string;
  findings: string;
  followUps: string[];
  rows: ItemRow[];
}): InspectionCreateRequest {
  return {
    engineId: f.engineId,
    bearingId: f.bearingId || null,
    planId: f.planId || null,
    completesPlan: f.planId ? f.completesPlan : false,
    kind: f.kind,
    title: f.title,
    inspectedAt: new Date(f.inspectedAt).toISOString(),
    inspectorName: f.inspectorName,
    findings: f.findings,
    followUpActions: f.followUps.filter((t) => t.trim()).map((text) => ({ text })),
    measurements: f.rows.map((r) => ({
      kind: r.kind,
      label: r.label,
      crankAngleDeg: num(r.crankAngleDeg),
      value: num(r.value) as number,
      unit: r.unit,
      nominal: num(r.nominal),
      toleranceMin: num(r.toleranceMin),
      toleranceMax: num(r.toleranceMax),
    })),
  };
}

const localNow = () => {
  const d = new Date();
  d.setMinutes(d.getMinutes() - d.getTimezoneOffset());
  return d.toISOString().slice(0, 16);
};

/** /maintenance/inspections/new — record an inspection with its measurements against tolerances. */
export default function NewInspectionPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const engines = useQuery(enginesListQuery());
  const [engineId, setEngineId] = useState(params.get('engineId') ?? '');
  const [bearingId, setBearingId] = useState(params.get('bearingId') ?? '');
  const [planId, setPlanId] = useState(params.get('planId') ?? '');
  const [completesPlan, setCompletesPlan] = useState(false);
  const [kind, setKind] = useState<InspectionKind>('bearing_clearance');
  const [title, setTitle] = useState('');
  const [inspectedAt, setInspectedAt] = useState(localNow());
  const [inspectorName, setInspectorName] = useState('');
  const [findings, setFindings] = useState('');
  const [followUps, setFollowUps] = useState<string[]>(['']);
  const [rows, setRows] = useState<ItemRow[]>([]);
  const [error, setError] = useState<string | null>(null);
  const engine = useQuery({ ...engineDetailQuery(engineId), enabled: !!engineId });
  const plans = useQuery({ ...plansQuery(engineId), enabled: !!engineId });
  const create = useCreateInspection();

  useEffect(() => {
    if (!engineId && engines.data?.length) setEngineId(engines.data[0].id);
  }, [engines.data, engineId]);
  useEffect(() => {
    const p = plans.data?.find((x) => x.id === planId);
    if (!p) return;
    setKind(p.inspectionKind);
    if (!title) setTitle(p.title);
    if (p.bearingId) setBearingId(p.bearingId);
    // eslint-disable-next-line react-hooks/exhaustive-deps -- prefill on choosing a plan, not as the title is typed
  }, [planId, plans.data]);

  const setRow = (i: number, patch: Partial<ItemRow>) => setRows((rs) => rs.map((r, j) => (j === i ? { ...r, ...patch } : r)));
  const numIn = (label: string, value: Num, onChange: (v: Num) => void, w = 110) => (
    <NumberInput
      label={label}
      value={value}
      onChange={(v) => onChange(v === '' ? '' : Number(v))}
      hideControls
      inputMode="decimal"
      decimalScale={5}
      w={w}
    />
  );
  const save = async () => {
    setError(null);
    try {
      const made = await create.mutateAsync(
        toInspectionRequest({
          engineId,
          bearingId,
          planId,
          completesPlan,
          kind,
          title,
          inspectedAt,
          inspectorName,
          findings,
          followUps,
          rows,
        }),
      );
      void navigate(`/maintenance/inspections/${made.id}`);
    } catch (e) {
      setError(errorText(e));
    }
  };
  return (
    <Stack gap="lg">
      <PageHeader
        title="Record an inspection"
        subtitle="Each measurement is judged against its tolerance when the record is saved; the record is then kept as it was."
      />
      <HazardCautions hazards={['lockout', 'lifting', 'raised_load']} />
      <Card withBorder padding="lg" radius="md">
        <SimpleGrid cols={{ base: 1, sm: 2, lg: 3 }} spacing="md">
          <Select
            label="Engine"
            data={(engines.data ?? []).map((e) => ({ value: e.id, label: e.name }))}
            value={engineId || null}
            onChange={(v) => {
              setEngineId(v ?? '');
              setBearingId('');
              setPlanId('');
            }}
            allowDeselect={false}
          />
          <Select
            label="Bearing (if the inspection is of one)"
            data={(engine.data?.bearings ?? []).map((b) => ({ value: b.id, label: b.label }))}
            value={bearingId || null}
            onChange={(v) => setBearingId(v ?? '')}
            clearable
          />
          <Select
            label="Under the plan"
            data={(plans.data ?? []).map((p) => ({ value: p.id, label: p.title }))}
            value={planId || null}
            onChange={(v) => setPlanId(v ?? '')}
            clearable
          />
          <Select
            label="Kind"
            data={INSPECTION_KINDS.map((k) => ({ value: k, label: INSPECTION_KIND_LABELS[k] }))}
            value={kind}
            onChange={(v) => setKind((v ?? 'general') as InspectionKind)}
            allowDeselect={false}
          />
          <TextInput label="Title" value={title} onChange={(e) => setTitle(e.currentTarget.value)} required />
          <TextInput
            label="Inspected at"
            type="datetime-local"
            value={inspectedAt}
            onChange={(e) => setInspectedAt(e.currentTarget.value)}
          />
          <TextInput label="Inspected by" value={inspectorName} onChange={(e) => setInspectorName(e.currentTarget.value)} />
        </SimpleGrid>
        {planId && (
          <Checkbox
            mt="md"
            label="This inspection completes the plan (its intervals start again from this date)"
            checked={completesPlan}
            onChange={(e) => setCompletesPlan(e.currentTarget.checked)}
          />
        )}
      </Card>
      <Card withBorder padding="lg" radius="md">
        <Group justify="space-between" mb="sm">
          <Title order={2} fz={22}>
            Measurements
          </Title>
          <Group gap="xs">
            {PRESETS.map((p) => (
              <Button key={p.key} variant="default" size="sm" onClick={() => setRows((rs) => [...rs, ...p.rows()])}>
                {p.label}
              </Button>
            ))}
            <Button variant="default" size="sm" leftSection={<IconPlus size={14} />} onClick={() => setRows((rs) => [...rs, row({})])}>
              One more
            </Button>
          </Group>
        </Group>
        {rows.length === 0 && <Text c="dimmed">No measurements yet: start from one of the sets above or add them one by one.</Text>}
        <Stack gap="sm">
          {rows.map((r, i) => (
            <Group key={i} gap="xs" align="flex-end" wrap="wrap" data-testid={`measurement-row-${i}`}>
              <Select
                label="Kind"
                data={MEASUREMENT_ITEM_KINDS.map((k) => ({ value: k, label: MEASUREMENT_ITEM_KIND_LABELS[k] }))}
                value={r.kind}
                onChange={(v) => setRow(i, { kind: (v ?? 'other') as MeasurementItemKind })}
                w={230}
                allowDeselect={false}
              />
              <TextInput label="Where" value={r.label} onChange={(e) => setRow(i, { label: e.currentTarget.value })} w={230} />
              {r.kind === 'web_deflection' && numIn('Crank angle °', r.crankAngleDeg, (v) => setRow(i, { crankAngleDeg: v }), 100)}
              {numIn('Value', r.value, (v) => setRow(i, { value: v }))}
              <Select
                label="Unit"
                data={[...MAINTENANCE_UNITS]}
                value={r.unit}
                onChange={(v) => setRow(i, { unit: (v ?? 'in') as MaintenanceUnit })}
                w={90}
                allowDeselect={false}
              />
              {numIn('Nominal', r.nominal, (v) => setRow(i, { nominal: v }))}
              {numIn('Least', r.toleranceMin, (v) => setRow(i, { toleranceMin: v }))}
              {numIn('Most', r.toleranceMax, (v) => setRow(i, { toleranceMax: v }))}
              <ActionIcon
                variant="default"
                aria-label={`Remove measurement ${i + 1}`}
                onClick={() => setRows((rs) => rs.filter((_, j) => j !== i))}
              >
                <IconTrash />
              </ActionIcon>
            </Group>
          ))}
        </Stack>
      </Card>
      <Card withBorder padding="lg" radius="md">
        <Stack gap="md">
          <Textarea label="Findings" autosize minRows={3} value={findings} onChange={(e) => setFindings(e.currentTarget.value)} />
          <Text fw={600}>Follow-up actions</Text>
          {followUps.map((t, i) => (
            <Group key={i} gap="xs">
              <TextInput
                value={t}
                onChange={(e) => setFollowUps((fs) => fs.map((x, j) => (j === i ? e.currentTarget.value : x)))}
                placeholder="What should be done"
                style={{ flex: 1 }}
                aria-label={`Follow-up action ${i + 1}`}
              />
              <ActionIcon
                variant="default"
                aria-label={`Remove action ${i + 1}`}
                onClick={() => setFollowUps((fs) => fs.filter((_, j) => j !== i))}
              >
                <IconTrash />
              </ActionIcon>
            </Group>
          ))}
          <Button variant="default" w="fit-content" leftSection={<IconPlus size={14} />} onClick={() => setFollowUps((fs) => [...fs, ''])}>
            Another action
          </Button>
          {error && (
            <Alert color="signal" title="Not saved">
              {error}
            </Alert>
          )}
          <Group>
            <Button size="lg" onClick={() => void save()} loading={create.isPending} disabled={!engineId}>
              Save inspection
            </Button>
            <Text fz="sm" c="dimmed">
              Photos and documents are attached on the saved record.
            </Text>
          </Group>
        </Stack>
      </Card>
    </Stack>
  );
}
