import { useEffect, useState } from 'react';
import { useNavigate, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import {
  Alert,
  Button,
  Card,
  Checkbox,
  Group,
  Loader,
  MultiSelect,
  NumberInput,
  Select,
  SimpleGrid,
  Stack,
  Text,
  TextInput,
  Textarea,
} from '@mantine/core';
import {
  COMPONENT_KINDS,
  COMPONENT_KIND_LABELS,
  INSPECTION_KINDS,
  INSPECTION_KIND_LABELS,
  WORK_HAZARDS,
  WORK_HAZARD_LABELS,
  type ComponentKind,
  type InspectionKind,
  type WorkHazard,
} from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { engineDetailQuery, enginesListQuery } from '../../engines/api/engines.api';
import { planQuery, useCreatePlan, useUpdatePlan } from '../api/maintenance.api';
import { HazardCautions } from '../components/HazardCautions';
import { DUE_RULE_HINT } from '../model/words';

type Num = number | '';
interface Form {
  engineId: string;
  componentKind: ComponentKind;
  bearingId: string;
  componentLabel: string;
  title: string;
  inspectionKind: InspectionKind;
  hours: Num;
  revolutions: Num;
  days: Num;
  lastDoneAt: string;
  hazards: WorkHazard[];
  notes: string;
  active: boolean;
}
const blank = (engineId = ''): Form => ({
  engineId,
  componentKind: 'bearing',
  bearingId: '',
  componentLabel: '',
  title: '',
  inspectionKind: 'bearing_clearance',
  hours: '',
  revolutions: '',
  days: 365,
  lastDoneAt: new Date().toISOString().slice(0, 10),
  hazards: ['lockout'],
  notes: '',
  active: true,
});
const num = (v: Num) => (v === '' ? null : Number(v));

/** /maintenance/plans/new and /maintenance/plans/:id/edit — an inspection plan by hours, revolutions and/or calendar. */
export default function PlanEditPage() {
  const { id } = useParams();
  const navigate = useNavigate();
  const engines = useQuery(enginesListQuery());
  const existing = useQuery({ ...planQuery(id ?? ''), enabled: !!id });
  const [form, setForm] = useState<Form>(blank());
  const engine = useQuery({ ...engineDetailQuery(form.engineId), enabled: !!form.engineId });
  const create = useCreatePlan();
  const update = useUpdatePlan(id ?? '');
  const [error, setError] = useState<string | null>(null);

  useEffect(() => {
    if (!id && !form.engineId && engines.data?.length) setForm((f) => ({ ...f, engineId: engines.data![0].id }));
  }, [engines.data, id, form.engineId]);
  useEffect(() => {
    const p = existing.data;
    if (!p) return;
    setForm({
      engineId: p.engineId,
      componentKind: p.componentKind,
      bearingId: p.bearingId ?? '',
      componentLabel: p.componentLabel,
      title: p.title,
      inspectionKind: p.inspectionKind,
      hours: p.intervalRunHours ?? '',
      revolutions: p.intervalRevolutions ?? '',
      days: p.intervalDays ?? '',
      lastDoneAt: p.lastDoneAt.slice(0, 10),
      hazards: p.hazards,
      notes: p.notes,
      active: p.active,
    });
  }, [existing.data]);

  if (id && existing.isLoading) return <Loader />;
  const set = (patch: Partial<Form>) => setForm((f) => ({ ...f, ...patch }));
  const save = async () => {
    setError(null);
    const body = {
      componentKind: form.componentKind,
      bearingId: form.bearingId || null,
      componentLabel: form.componentLabel,
      title: form.title,
      inspectionKind: form.inspectionKind,
      intervalRunHours: num(form.hours),
      intervalRevolutions: num(form.revolutions),
      intervalDays: num(form.days),
      hazards: form.hazards,
      notes: form.notes,
      active: form.active,
    };
    const lastDoneAt = new Date(`${form.lastDoneAt}T12:00:00`).toISOString();
    try {
      const saved = id
        ? await update.mutateAsync({
            ...body,
            ...(existing.data && form.lastDoneAt !== existing.data.lastDoneAt.slice(0, 10) ? { lastDoneAt } : {}),
          })
        : await create.mutateAsync({ ...body, engineId: form.engineId, lastDoneAt });
      void navigate(`/maintenance/plans/${saved.id}`);
    } catch (e) {
      setError(errorText(e));
    }
  };
  const numInput = (label: string, value: Num, onChange: (v: Num) => void, description?: string) => (
    <NumberInput
      label={label}
      description={description}
      value={value}
      onChange={(v) => onChange(v === '' ? '' : Number(v))}
      min={0}
      hideControls
      inputMode="decimal"
    />
  );
  return (
    <Stack gap="lg">
      <PageHeader title={id ? 'Edit inspection plan' : 'Plan an inspection'} subtitle={DUE_RULE_HINT} />
      <Card withBorder padding="lg" radius="md">
        <Stack gap="md">
          <SimpleGrid cols={{ base: 1, sm: 2 }} spacing="md">
            <Select
              label="Engine"
              data={(engines.data ?? []).map((e) => ({ value: e.id, label: e.name }))}
              value={form.engineId || null}
              onChange={(v) => set({ engineId: v ?? '', bearingId: '' })}
              disabled={!!id}
              allowDeselect={false}
            />
            <TextInput
              label="Title"
              value={form.title}
              onChange={(e) => set({ title: e.currentTarget.value })}
              placeholder="Main bearing clearance"
              required
            />
            <Select
              label="Component"
              data={COMPONENT_KINDS.map((k) => ({ value: k, label: COMPONENT_KIND_LABELS[k] }))}
              value={form.componentKind}
              onChange={(v) => set({ componentKind: (v ?? 'other') as ComponentKind })}
              allowDeselect={false}
            />
            {form.componentKind === 'bearing' ? (
              <Select
                label="Bearing"
                data={(engine.data?.bearings ?? []).map((b) => ({ value: b.id, label: b.label }))}
                value={form.bearingId || null}
                onChange={(v) => set({ bearingId: v ?? '' })}
                clearable
              />
            ) : (
              <TextInput
                label="Component name"
                value={form.componentLabel}
                onChange={(e) => set({ componentLabel: e.currentTarget.value })}
                placeholder="Crankshaft webs"
              />
            )}
            <Select
              label="Kind of inspection"
              data={INSPECTION_KINDS.map((k) => ({ value: k, label: INSPECTION_KIND_LABELS[k] }))}
              value={form.inspectionKind}
              onChange={(v) => set({ inspectionKind: (v ?? 'general') as InspectionKind })}
              allowDeselect={false}
            />
            <TextInput
              label="Last done"
              type="date"
              value={form.lastDoneAt}
              onChange={(e) => set({ lastDoneAt: e.currentTarget.value })}
              description="The engine’s counters at that date are taken from the run log."
            />
          </SimpleGrid>
          <Text fw={600}>Intervals (any one or more; whichever comes first)</Text>
          <SimpleGrid cols={{ base: 1, sm: 3 }} spacing="md">
            {numInput('Running hours', form.hours, (v) => set({ hours: v }))}
            {numInput('Revolutions', form.revolutions, (v) => set({ revolutions: v }))}
            {numInput('Calendar days', form.days, (v) => set({ days: v }), '365 for a year')}
          </SimpleGrid>
          <MultiSelect
            label="Hazards of the work"
            data={WORK_HAZARDS.map((h) => ({ value: h, label: WORK_HAZARD_LABELS[h] }))}
            value={form.hazards}
            onChange={(v) => set({ hazards: v as WorkHazard[] })}
          />
          <HazardCautions hazards={form.hazards} />
          <Textarea
            label="Notes (how it is done)"
            autosize
            minRows={2}
            value={form.notes}
            onChange={(e) => set({ notes: e.currentTarget.value })}
          />
          {id && (
            <Checkbox
              label="Active (shown in the due list)"
              checked={form.active}
              onChange={(e) => set({ active: e.currentTarget.checked })}
            />
          )}
          {error && <Alert color="signal">{error}</Alert>}
          <Group>
            <Button size="lg" onClick={() => void save()} loading={create.isPending || update.isPending}>
              {id ? 'Save plan' : 'Add plan'}
            </Button>
          </Group>
        </Stack>
      </Card>
    </Stack>
  );
}
