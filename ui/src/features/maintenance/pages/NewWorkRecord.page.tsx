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
  MultiSelect,
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
import { WORK_HAZARDS, WORK_HAZARD_LABELS, type PartUsed, type WorkHazard } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { engineDetailQuery, enginesListQuery } from '../../engines/api/engines.api';
import { inspectionQuery, plansQuery, useCreateWorkRecord } from '../api/maintenance.api';
import { HazardCautions } from '../components/HazardCautions';

const localNow = () => {
  const d = new Date();
  d.setMinutes(d.getMinutes() - d.getTimezoneOffset());
  return d.toISOString().slice(0, 16);
};

/** /maintenance/work/new — record work; from an inspection it carries the inspection's engine, bearing and follow-up actions. */
export default function NewWorkRecordPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const inspectionId = params.get('inspectionId') ?? '';
  const inspection = useQuery({ ...inspectionQuery(inspectionId), enabled: !!inspectionId });
  const engines = useQuery(enginesListQuery());
  const [engineId, setEngineId] = useState(params.get('engineId') ?? '');
  const [bearingId, setBearingId] = useState(params.get('bearingId') ?? '');
  const [title, setTitle] = useState('');
  const [description, setDescription] = useState('');
  const [performedBy, setPerformedBy] = useState('');
  const [labourHours, setLabourHours] = useState<number | ''>('');
  const [parts, setParts] = useState<PartUsed[]>([]);
  const [hazards, setHazards] = useState<WorkHazard[]>(['lockout']);
  const [startedAt, setStartedAt] = useState(localNow());
  const [planIds, setPlanIds] = useState<string[]>([]);
  const [actions, setActions] = useState<number[]>([]);
  const [error, setError] = useState<string | null>(null);
  const engine = useQuery({ ...engineDetailQuery(engineId), enabled: !!engineId });
  const plans = useQuery({ ...plansQuery(engineId), enabled: !!engineId });
  const create = useCreateWorkRecord();

  useEffect(() => {
    const i = inspection.data;
    if (!i) return;
    setEngineId(i.engineId);
    setBearingId(i.bearingId ?? '');
    if (i.planId) setPlanIds([i.planId]);
    setActions(i.followUpActions.map((a, n) => (a.workRecordId ? -1 : n)).filter((n) => n >= 0));
  }, [inspection.data]);
  useEffect(() => {
    if (!engineId && !inspectionId && engines.data?.length) setEngineId(engines.data[0].id);
  }, [engines.data, engineId, inspectionId]);

  const save = async () => {
    setError(null);
    try {
      const made = await create.mutateAsync({
        engineId,
        bearingId: bearingId || null,
        title,
        description,
        performedBy,
        parts: parts.filter((p) => p.description.trim()),
        labourHours: labourHours === '' ? 0 : labourHours,
        promptedByInspectionId: inspectionId || null,
        followUpActionIndexes: inspectionId ? actions : undefined,
        promptedByAlarmId: inspection.data?.promptedByAlarmId ?? null,
        hazards,
        startedAt: new Date(startedAt).toISOString(),
        satisfiesPlanIds: planIds,
      });
      void navigate(`/maintenance/work/${made.id}`);
    } catch (e) {
      setError(errorText(e));
    }
  };
  return (
    <Stack gap="lg">
      <PageHeader
        title="Record work"
        subtitle={
          inspection.data
            ? `Following up “${inspection.data.title}”`
            : 'What was done, by whom, with what parts and hours, and what prompted it.'
        }
      />
      <HazardCautions hazards={hazards} />
      <Card withBorder padding="lg" radius="md">
        <Stack gap="md">
          <SimpleGrid cols={{ base: 1, sm: 2, lg: 3 }} spacing="md">
            <Select
              label="Engine"
              data={(engines.data ?? []).map((e) => ({ value: e.id, label: e.name }))}
              value={engineId || null}
              onChange={(v) => {
                setEngineId(v ?? '');
                setBearingId('');
                setPlanIds([]);
              }}
              allowDeselect={false}
              disabled={!!inspectionId}
            />
            <Select
              label="Bearing"
              data={(engine.data?.bearings ?? []).map((b) => ({ value: b.id, label: b.label }))}
              value={bearingId || null}
              onChange={(v) => setBearingId(v ?? '')}
              clearable
            />
            <TextInput label="Started" type="datetime-local" value={startedAt} onChange={(e) => setStartedAt(e.currentTarget.value)} />
            <TextInput label="What was done (title)" value={title} onChange={(e) => setTitle(e.currentTarget.value)} required />
            <TextInput label="Done by" value={performedBy} onChange={(e) => setPerformedBy(e.currentTarget.value)} required />
            <NumberInput
              label="Labour hours"
              value={labourHours}
              onChange={(v) => setLabourHours(v === '' ? '' : Number(v))}
              min={0}
              hideControls
              inputMode="decimal"
            />
          </SimpleGrid>
          <Textarea label="Description" autosize minRows={3} value={description} onChange={(e) => setDescription(e.currentTarget.value)} />
          <MultiSelect
            label="Hazards of the work"
            data={WORK_HAZARDS.map((h) => ({ value: h, label: WORK_HAZARD_LABELS[h] }))}
            value={hazards}
            onChange={(v) => setHazards(v as WorkHazard[])}
          />
          <MultiSelect
            label="Plans this work satisfies (reset when the record is closed)"
            data={(plans.data ?? []).map((p) => ({ value: p.id, label: p.title }))}
            value={planIds}
            onChange={setPlanIds}
          />
          {inspection.data && inspection.data.followUpActions.length > 0 && (
            <Stack gap={4}>
              <Text fw={600}>Follow-up actions this work carries out</Text>
              {inspection.data.followUpActions.map((a, n) => (
                <Checkbox
                  key={n}
                  label={a.text}
                  checked={actions.includes(n)}
                  disabled={!!a.workRecordId}
                  onChange={(e) => setActions((xs) => (e.currentTarget.checked ? [...xs, n] : xs.filter((x) => x !== n)))}
                />
              ))}
            </Stack>
          )}
        </Stack>
      </Card>
      <Card withBorder padding="lg" radius="md">
        <Group justify="space-between" mb="sm">
          <Title order={2} fz={20}>
            Parts and materials
          </Title>
          <Button
            variant="default"
            size="sm"
            leftSection={<IconPlus size={14} />}
            onClick={() => setParts((p) => [...p, { description: '', quantity: 1, unit: '' }])}
          >
            Add a part
          </Button>
        </Group>
        {parts.length === 0 && <Text c="dimmed">None yet.</Text>}
        <Stack gap="xs">
          {parts.map((p, i) => (
            <Group key={i} gap="xs" align="flex-end">
              <TextInput
                label="Part or material"
                value={p.description}
                onChange={(e) => setParts((ps) => ps.map((x, j) => (j === i ? { ...x, description: e.currentTarget.value } : x)))}
                w={320}
              />
              <NumberInput
                label="Quantity"
                value={p.quantity}
                onChange={(v) => setParts((ps) => ps.map((x, j) => (j === i ? { ...x, quantity: Number(v) || 0 } : x)))}
                hideControls
                w={110}
              />
              <TextInput
                label="Unit"
                value={p.unit}
                onChange={(e) => setParts((ps) => ps.map((x, j) => (j === i ? { ...x, unit: e.currentTarget.value } : x)))}
                w={100}
              />
              <ActionIcon
                variant="default"
                aria-label={`Remove part ${i + 1}`}
                onClick={() => setParts((ps) => ps.filter((_, j) => j !== i))}
              >
                <IconTrash />
              </ActionIcon>
            </Group>
          ))}
        </Stack>
      </Card>
      {error && (
        <Alert color="signal" title="Not saved">
          {error}
        </Alert>
      )}
      <Group>
        <Button size="lg" onClick={() => void save()} loading={create.isPending} disabled={!engineId}>
          Save work record
        </Button>
      </Group>
    </Stack>
  );
}
