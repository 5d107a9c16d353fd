import { useMemo, useState, type ReactNode } from 'react';
import { useNavigate, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import {
  Alert,
  Badge,
  Button,
  Card,
  Checkbox,
  Grid,
  Group,
  List,
  Loader,
  MultiSelect,
  NumberInput,
  Paper,
  Select,
  SimpleGrid,
  Stack,
  Text,
  TextInput,
  Textarea,
  Title,
} from '@mantine/core';
import { useForm, type UseFormReturnType } from '@mantine/form';
import { notifications } from '@mantine/notifications';
import { IconPlus, IconTrash, IconArrowBackUp } from '@tabler/icons-react';
import { MEASUREMENT_KIND_LABELS, MEASUREMENT_UNITS, RUN_STATES, RUN_STATE_LABELS, UNIT_LABELS } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { Caution } from '../../../components/Caution/Caution';
import { HttpError, errorText } from '../../../api/http';
import { engineDetailQuery, useSaveEngine } from '../api/engines.api';
import {
  BEARING_KIND_LABELS,
  CYLINDER_ROLE_LABELS,
  ENGINE_TYPE_LABELS,
  LUBRICATION_KIND_LABELS,
  LIMITS_CAUTION,
  PRESSURE_LIMITS_CAUTION,
  options,
} from '../labels';
import {
  emptyBearing,
  emptyCylinder,
  emptyEngine,
  emptyLubrication,
  emptyPoint,
  fromEngine,
  toWriteRequest,
  validateEngine,
  type EngineFormValues,
} from '../model/engine-form';

type Form = UseFormReturnType<EngineFormValues>;

const unitOptions = MEASUREMENT_UNITS.map((u) => ({ value: u, label: UNIT_LABELS[u] ?? u }));
const kindOptions = options(MEASUREMENT_KIND_LABELS);

/** Number input with the keypad on tablets, no spinner arrows. */
function Num({ form, path, label, required, step }: { form: Form; path: string; label: string; required?: boolean; step?: number }) {
  return (
    <NumberInput
      label={label}
      required={required}
      hideControls
      inputMode="decimal"
      step={step}
      decimalSeparator="."
      {...form.getInputProps(path)}
    />
  );
}

export default function EngineEditPage() {
  const { id } = useParams();
  const isNew = !id;
  const detail = useQuery({ ...engineDetailQuery(id ?? ''), enabled: !isNew });
  if (!isNew && detail.isLoading) return <Loader />;
  if (!isNew && (detail.error || !detail.data)) return <Alert color="signal">{errorText(detail.error)}</Alert>;
  return <EngineForm key={detail.data?.id ?? 'new'} engineId={id} initial={detail.data ? fromEngine(detail.data) : emptyEngine()} />;
}

function EngineForm({ engineId, initial }: { engineId?: string; initial: EngineFormValues }) {
  const navigate = useNavigate();
  const save = useSaveEngine(engineId);
  const [serverErrors, setServerErrors] = useState<string[]>([]);
  const form = useForm<EngineFormValues>({ initialValues: initial, validate: validateEngine });

  const submit = form.onSubmit(
    (values) => {
      setServerErrors([]);
      save.mutate(toWriteRequest(values), {
        onSuccess: (engine) => {
          notifications.show({ title: 'Engine saved', message: `${engine.name}: every change to a limit is kept in its history.` });
          void navigate(`/engines/${engine.id}`);
        },
        onError: (e) => setServerErrors(e instanceof HttpError ? e.messages : [errorText(e)]),
      });
    },
    () => setServerErrors(['Some fields need attention: they are marked in red below.']),
  );

  return (
    <form onSubmit={submit} noValidate>
      <Stack gap="lg" pb={120}>
        <PageHeader
          title={engineId ? `Edit ${initial.name}` : 'Describe a new engine'}
          subtitle={
            'The engine, its parts and the limits the server checks every reading against. Saving replaces the ' +
            'whole description; every limit change is kept with your name.'
          }
        />
        <EngineSection form={form} />
        <CylindersSection form={form} />
        <LubricationSection form={form} />
        <BearingsSection form={form} />
        <PointsSection form={form} />
      </Stack>
      <Paper withBorder shadow="md" p="md" style={{ position: 'sticky', bottom: 0, zIndex: 5 }} bg="var(--mantine-color-body)">
        <Stack gap="sm">
          {serverErrors.length > 0 && (
            <Alert color="signal" title="Not saved" role="alert">
              <List spacing={2}>
                {serverErrors.map((m, i) => (
                  <List.Item key={i}>{m}</List.Item>
                ))}
              </List>
            </Alert>
          )}
          <Group justify="flex-end">
            <Button variant="default" size="lg" onClick={() => navigate(engineId ? `/engines/${engineId}` : '/engines')}>
              Cancel
            </Button>
            <Button type="submit" size="lg" loading={save.isPending}>
              Save engine
            </Button>
          </Group>
        </Stack>
      </Paper>
    </form>
  );
}

function Section({ title, subtitle, action, children }: { title: string; subtitle?: string; action?: ReactNode; children: ReactNode }) {
  return (
    <Card withBorder padding="lg" radius="md">
      <Stack gap="md">
        <Group justify="space-between" align="flex-start">
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
          {action}
        </Group>
        {children}
      </Stack>
    </Card>
  );
}

function RemoveButton({ label, onClick }: { label: string; onClick: () => void }) {
  return (
    <Button variant="subtle" color="gray" size="md" h={48} leftSection={<IconTrash size={18} />} onClick={onClick} aria-label={label}>
      Remove
    </Button>
  );
}

/** One part in a list: its name on top with the remove button, its fields below. */
function Row({
  title,
  onRemove,
  removeLabel,
  children,
}: {
  title: string;
  onRemove: () => void;
  removeLabel: string;
  children: ReactNode;
}) {
  return (
    <Paper withBorder p="sm" radius="sm">
      <Group justify="space-between" mb={4} wrap="nowrap">
        <Text fw={700} truncate>
          {title}
        </Text>
        <RemoveButton label={removeLabel} onClick={onRemove} />
      </Group>
      {children}
    </Paper>
  );
}

function AddButton({ children, onClick }: { children: ReactNode; onClick: () => void }) {
  return (
    <Button variant="default" size="md" h={48} leftSection={<IconPlus size={18} />} onClick={onClick}>
      {children}
    </Button>
  );
}

function EngineSection({ form }: { form: Form }) {
  return (
    <Section title="Engine">
      <Grid gap="lg">
        <Grid.Col span={{ base: 12, md: 8 }}>
          <Stack>
            <SimpleGrid cols={{ base: 1, sm: 2, lg: 3 }}>
              <TextInput label="Name" required {...form.getInputProps('name')} />
              <TextInput label="Builder" {...form.getInputProps('builder')} />
              <TextInput label="Year built" {...form.getInputProps('yearBuilt')} />
              <Select label="Type" data={options(ENGINE_TYPE_LABELS)} allowDeselect={false} {...form.getInputProps('type')} />
              <Num form={form} path="ratedSpeedRpm" label="Rated speed (rpm)" required />
              <Num form={form} path="overspeedRpm" label="Overspeed alarm (rpm)" required />
              <Num form={form} path="mawpPsig" label="Maximum allowable working pressure (psig)" required />
              <Num form={form} path="preLubeFreshnessMinutes" label="Pre-lube stays fresh for (min)" required />
              <Num form={form} path="flywheelMassLb" label="Flywheel mass (lb)" />
              <Num form={form} path="flywheelRadiusOfGyrationFt" label="Flywheel radius of gyration (ft)" />
              <Num form={form} path="rotatingWeightLb" label="Rotating weight on the main bearings (lb)" />
            </SimpleGrid>
            <Textarea label="Notes" rows={3} {...form.getInputProps('notes')} />
          </Stack>
        </Grid.Col>
        <Grid.Col span={{ base: 12, md: 4 }}>
          <Caution title="Pressure limits">{PRESSURE_LIMITS_CAUTION}</Caution>
        </Grid.Col>
      </Grid>
    </Section>
  );
}

function CylindersSection({ form }: { form: Form }) {
  const rows = form.values.cylinders;
  return (
    <Section
      title="Cylinders"
      subtitle="Dimensions in inches. Clearance is the clearance volume as a percentage of the swept volume."
      action={<AddButton onClick={() => form.insertListItem('cylinders', emptyCylinder())}>Add cylinder</AddButton>}
    >
      {rows.length === 0 && <Text c="dimmed">No cylinders yet.</Text>}
      {rows.map((c, i) => (
        <Row
          key={c.key}
          title={c.label || 'New cylinder'}
          removeLabel={`Remove cylinder ${c.label || i + 1}`}
          onRemove={() => form.removeListItem('cylinders', i)}
        >
          <Grid gap="sm" columns={15}>
            <Grid.Col span={{ base: 6, sm: 5, lg: 2 }}>
              <TextInput label="Cylinder" required {...form.getInputProps(`cylinders.${i}.label`)} />
            </Grid.Col>
            <Grid.Col span={{ base: 9, sm: 5, lg: 3 }}>
              <Select
                label="Role"
                data={options(CYLINDER_ROLE_LABELS)}
                allowDeselect={false}
                {...form.getInputProps(`cylinders.${i}.role`)}
              />
            </Grid.Col>
            {(
              [
                ['boreIn', 'Bore (in)', true],
                ['strokeIn', 'Stroke (in)', true],
                ['pistonRodIn', 'Piston rod (in)', true],
                ['tailRodIn', 'Tail rod (in)', false],
                ['clearancePercent', 'Clearance (%)', true],
              ] as const
            ).map(([f, label, required]) => (
              <Grid.Col key={f} span={{ base: 5, sm: 5, lg: 2 }}>
                <Num form={form} path={`cylinders.${i}.${f}`} label={label} required={required} />
              </Grid.Col>
            ))}
          </Grid>
        </Row>
      ))}
    </Section>
  );
}

function LubricationSection({ form }: { form: Form }) {
  const rows = form.values.lubricationPoints;
  return (
    <Section
      title="Lubrication points"
      subtitle="Lubricators, pressure lines and grease points. Bearings name the point that feeds them."
      action={<AddButton onClick={() => form.insertListItem('lubricationPoints', emptyLubrication())}>Add lubrication point</AddButton>}
    >
      {rows.length === 0 && <Text c="dimmed">No lubrication points yet.</Text>}
      {rows.map((l, i) => (
        <Row
          key={l.key}
          title={l.label || 'New lubrication point'}
          removeLabel={`Remove lubrication point ${l.label || i + 1}`}
          onRemove={() => form.removeListItem('lubricationPoints', i)}
        >
          <SimpleGrid cols={{ base: 1, sm: 3 }}>
            <TextInput label="Lubrication point" required {...form.getInputProps(`lubricationPoints.${i}.label`)} />
            <Select
              label="Kind"
              data={options(LUBRICATION_KIND_LABELS)}
              allowDeselect={false}
              {...form.getInputProps(`lubricationPoints.${i}.kind`)}
            />
            <TextInput label="Oil grade" {...form.getInputProps(`lubricationPoints.${i}.oilGrade`)} />
          </SimpleGrid>
        </Row>
      ))}
    </Section>
  );
}

function BearingsSection({ form }: { form: Form }) {
  const rows = form.values.bearings;
  const lubOptions = useMemo(
    () => [...new Set(form.values.lubricationPoints.map((l) => l.label.trim()).filter(Boolean))],
    [form.values.lubricationPoints],
  );
  return (
    <Section
      title="Bearings"
      subtitle="Journal sizes in inches; the share of the rotating load each bearing carries, in percent."
      action={<AddButton onClick={() => form.insertListItem('bearings', emptyBearing())}>Add bearing</AddButton>}
    >
      {rows.length === 0 && <Text c="dimmed">No bearings yet.</Text>}
      {rows.map((b, i) => (
        <Row
          key={b.key}
          title={b.label || 'New bearing'}
          removeLabel={`Remove bearing ${b.label || i + 1}`}
          onRemove={() => form.removeListItem('bearings', i)}
        >
          <Stack gap="sm">
            <SimpleGrid cols={{ base: 1, sm: 3 }}>
              <TextInput label="Bearing" required {...form.getInputProps(`bearings.${i}.label`)} />
              <Select
                label="Kind"
                data={options(BEARING_KIND_LABELS)}
                allowDeselect={false}
                {...form.getInputProps(`bearings.${i}.kind`)}
              />
              <Select
                label="Fed by"
                data={lubOptions}
                clearable
                placeholder="None"
                {...form.getInputProps(`bearings.${i}.lubricationPointLabel`)}
              />
            </SimpleGrid>
            <SimpleGrid cols={{ base: 2, sm: 4 }}>
              <Num form={form} path={`bearings.${i}.journalDiameterIn`} label="Journal diameter (in)" required />
              <Num form={form} path={`bearings.${i}.journalLengthIn`} label="Journal length (in)" required />
              <Num form={form} path={`bearings.${i}.loadSharePercent`} label="Share of load (%)" required />
              <Num form={form} path={`bearings.${i}.radialClearanceIn`} label="Radial clearance (in)" />
            </SimpleGrid>
          </Stack>
        </Row>
      ))}
    </Section>
  );
}

function PointsSection({ form }: { form: Form }) {
  const rows = form.values.measurementPoints;
  const attachOptions = useMemo(
    () => [
      {
        group: 'Bearings',
        items: [...new Set(form.values.bearings.map((b) => b.label.trim()).filter(Boolean))].map((l) => ({ value: `b:${l}`, label: l })),
      },
      {
        group: 'Cylinders',
        items: [...new Set(form.values.cylinders.map((c) => c.label.trim()).filter(Boolean))].map((l) => ({ value: `c:${l}`, label: l })),
      },
    ],
    [form.values.bearings, form.values.cylinders],
  );
  const nextSequence = rows.reduce((m, p) => Math.max(m, p.sequence === '' ? 0 : p.sequence), 0) + 1;
  return (
    <Section
      title="Measurement points and limits"
      subtitle={
        "Each point is read in a round or sent by a logger under its code. Limits are in the point's own " +
        'unit; rates and rises are differences in that unit.'
      }
      action={
        <AddButton onClick={() => form.insertListItem('measurementPoints', emptyPoint(nextSequence))}>Add measurement point</AddButton>
      }
    >
      <Caution title="Limits">{LIMITS_CAUTION}</Caution>
      {rows.length === 0 && <Text c="dimmed">No measurement points yet.</Text>}
      {rows.map((p, i) => {
        const u = UNIT_LABELS[p.unit] ?? p.unit;
        const base = `measurementPoints.${i}`;
        if (p.retire)
          return (
            <Paper key={p.key} withBorder p="sm" radius="sm" className="cj-shelved">
              <Group justify="space-between">
                <Text>
                  <span className="cj-struck">
                    {p.code} — {p.label}
                  </span>{' '}
                  <Badge color="gray" variant="outline" ml="xs">
                    Retired when you save
                  </Badge>
                </Text>
                <Button
                  variant="default"
                  h={48}
                  leftSection={<IconArrowBackUp size={18} />}
                  onClick={() => form.setFieldValue(`${base}.retire`, false)}
                >
                  Keep this point
                </Button>
              </Group>
              <Text fz="sm" c="dimmed" mt={4}>
                Its past readings stay in the record; it is no longer read in rounds or accepted from loggers.
              </Text>
            </Paper>
          );
        return (
          <Row
            key={p.key}
            title={[p.code, p.label].filter(Boolean).join(' — ') || 'New measurement point'}
            removeLabel={`Remove measurement point ${p.code || i + 1}`}
            onRemove={() => (p.id ? form.setFieldValue(`${base}.retire`, true) : form.removeListItem('measurementPoints', i))}
          >
            <Stack gap="sm">
              <Grid gap="sm">
                <Grid.Col span={{ base: 4, sm: 2, lg: 1 }}>
                  <NumberInput
                    label="Order"
                    hideControls
                    inputMode="numeric"
                    allowDecimal={false}
                    required
                    {...form.getInputProps(`${base}.sequence`)}
                  />
                </Grid.Col>
                <Grid.Col span={{ base: 8, sm: 4, lg: 2 }}>
                  <TextInput
                    label="Code"
                    required
                    styles={{ input: { fontFamily: 'monospace' } }}
                    {...form.getInputProps(`${base}.code`)}
                  />
                </Grid.Col>
                <Grid.Col span={{ base: 12, sm: 6, lg: 3 }}>
                  <TextInput label="Point" required {...form.getInputProps(`${base}.label`)} />
                </Grid.Col>
                <Grid.Col span={{ base: 12, sm: 5, lg: 2 }}>
                  <Select label="Kind" data={kindOptions} allowDeselect={false} {...form.getInputProps(`${base}.kind`)} />
                </Grid.Col>
                <Grid.Col span={{ base: 4, sm: 2, lg: 2 }}>
                  <Select label="Unit" data={unitOptions} allowDeselect={false} {...form.getInputProps(`${base}.unit`)} />
                </Grid.Col>
                <Grid.Col span={{ base: 8, sm: 5, lg: 2 }}>
                  <Select
                    label="On"
                    data={attachOptions}
                    clearable
                    placeholder="Whole engine"
                    {...form.getInputProps(`${base}.attachedTo`)}
                  />
                </Grid.Col>
              </Grid>
              <SimpleGrid cols={{ base: 2, sm: 4 }}>
                <Num form={form} path={`${base}.normalLow`} label={`Normal low (${u})`} />
                <Num form={form} path={`${base}.normalHigh`} label={`Normal high (${u})`} />
                <Num form={form} path={`${base}.lowLimit`} label={`Low limit (${u})`} />
                <Num form={form} path={`${base}.highLimit`} label={`High limit (${u})`} />
                <Num form={form} path={`${base}.highHighLimit`} label={`High-high limit (${u})`} />
                <Num form={form} path={`${base}.maxRiseRatePerMin`} label={`Rise per minute (${u}/min)`} />
                <Num form={form} path={`${base}.maxRiseAboveAmbient`} label={`Rise above ambient (${u})`} />
                <Num form={form} path={`${base}.deadband`} label={`Deadband (${u})`} />
              </SimpleGrid>
              <SimpleGrid cols={{ base: 1, sm: 2 }}>
                <Checkbox
                  label="Related conditions suppressed: high-high and high suppress this point's rise-above-ambient and rate-of-rise alarms"
                  {...form.getInputProps(`${base}.relatedSuppression`, { type: 'checkbox' })}
                />
                <MultiSelect
                  label="Alarms suppressed while the run is"
                  description="e.g. oil pressure low while preparing, before pre-lube"
                  data={RUN_STATES.map((s) => ({ value: s, label: RUN_STATE_LABELS[s] }))}
                  clearable
                  {...form.getInputProps(`${base}.suppressedInStates`)}
                />
              </SimpleGrid>
            </Stack>
          </Row>
        );
      })}
    </Section>
  );
}
