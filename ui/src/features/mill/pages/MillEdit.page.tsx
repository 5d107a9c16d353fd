import { useEffect, useState } from 'react';
import { useNavigate, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import {
  ActionIcon,
  Alert,
  Button,
  Card,
  Group,
  Loader,
  NumberInput,
  Select,
  SimpleGrid,
  Stack,
  TextInput,
  Textarea,
  Title,
} from '@mantine/core';
import { IconPlus, IconTrash } from '@tabler/icons-react';
import type { MillDto, MillWriteRequest } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { errorText } from '../../../api/http';
import { enginesListQuery } from '../../engines/api/engines.api';
import { millQuery, useSaveMill } from '../api/mill.api';

type Num = number | '';
interface StandForm {
  id?: string;
  name: string;
  rollDiameterMm: Num;
  barrelLengthMm: Num;
  rollSpeedRatio: Num;
  maxSeparatingForceKn: Num;
  notes: string;
}
interface MillForm {
  name: string;
  engineId: string | null;
  notes: string;
  stands: StandForm[];
  settings: Record<'minSpeedFraction' | 'mechanicalEfficiency' | 'baseLoadHp' | 'defaultIndicatedHp' | 'frictionFactor', Num>;
  rates: Record<
    'stockRatePerTonne' | 'yieldLossPct' | 'engineRatePerHour' | 'crewRatePerPersonHour' | 'crewSize' | 'contingencyPct' | 'marginPct',
    Num
  > & { currency: string };
  fixedCosts: { label: string; amount: Num }[];
}

const blankStand = (): StandForm => ({
  name: '',
  rollDiameterMm: 406.4,
  barrelLengthMm: 762,
  rollSpeedRatio: 1,
  maxSeparatingForceKn: '',
  notes: '',
});
const BLANK: MillForm = {
  name: '',
  engineId: null,
  notes: '',
  stands: [blankStand()],
  settings: { minSpeedFraction: 0.9, mechanicalEfficiency: 0.88, baseLoadHp: 50, defaultIndicatedHp: 600, frictionFactor: 1.2 },
  rates: {
    currency: 'GBP',
    stockRatePerTonne: '',
    yieldLossPct: 8,
    engineRatePerHour: '',
    crewRatePerPersonHour: '',
    crewSize: 6,
    contingencyPct: 5,
    marginPct: 10,
  },
  fixedCosts: [],
};

function fromMill(m: MillDto): MillForm {
  const { fixedCosts, ...rates } = m.quoteRates;
  return {
    name: m.name,
    engineId: m.engineId,
    notes: m.notes,
    stands: m.stands.map((s) => ({
      id: s.id,
      name: s.name,
      rollDiameterMm: s.rollDiameterMm,
      barrelLengthMm: s.barrelLengthMm,
      rollSpeedRatio: s.rollSpeedRatio,
      maxSeparatingForceKn: s.maxSeparatingForceKn,
      notes: s.notes ?? '',
    })),
    settings: { ...m.settings },
    rates,
    fixedCosts: fixedCosts.map((f) => ({ ...f })),
  };
}

const n = (v: Num) => (v === '' ? (undefined as unknown as number) : Number(v));

/** The body as typed: missing figures go as missing, so the server names each one. */
export function toMillRequest(f: MillForm): MillWriteRequest {
  return {
    name: f.name,
    engineId: f.engineId ?? '',
    notes: f.notes,
    stands: f.stands.map((s, i) => ({
      ...(s.id ? { id: s.id } : {}),
      position: i + 1,
      name: s.name,
      rollDiameterMm: n(s.rollDiameterMm),
      barrelLengthMm: n(s.barrelLengthMm),
      rollSpeedRatio: n(s.rollSpeedRatio),
      maxSeparatingForceKn: n(s.maxSeparatingForceKn),
      notes: s.notes,
    })),
    settings: {
      minSpeedFraction: n(f.settings.minSpeedFraction),
      mechanicalEfficiency: n(f.settings.mechanicalEfficiency),
      baseLoadHp: n(f.settings.baseLoadHp),
      defaultIndicatedHp: n(f.settings.defaultIndicatedHp),
      frictionFactor: n(f.settings.frictionFactor),
    },
    quoteRates: {
      currency: f.rates.currency.trim().toUpperCase(),
      stockRatePerTonne: n(f.rates.stockRatePerTonne),
      yieldLossPct: n(f.rates.yieldLossPct),
      engineRatePerHour: n(f.rates.engineRatePerHour),
      crewRatePerPersonHour: n(f.rates.crewRatePerPersonHour),
      crewSize: n(f.rates.crewSize),
      contingencyPct: n(f.rates.contingencyPct),
      marginPct: n(f.rates.marginPct),
      fixedCosts: f.fixedCosts.map((c) => ({ label: c.label, amount: n(c.amount) })),
    },
  };
}

const numIn = (label: string, value: Num, onChange: (v: Num) => void, extra: Record<string, unknown> = {}) => (
  <NumberInput
    label={label}
    value={value}
    onChange={(v) => onChange(v === '' ? '' : Number(v))}
    hideControls
    inputMode="decimal"
    {...extra}
  />
);

/** /mill/mills/new and /mill/mills/:id/edit: describe the mill (chief engineer and mill lead). */
export default function MillEditPage() {
  const { id } = useParams();
  const navigate = useNavigate();
  const existing = useQuery({ ...millQuery(id ?? ''), enabled: !!id });
  const engines = useQuery(enginesListQuery());
  const save = useSaveMill(id);
  const [form, setForm] = useState<MillForm>(BLANK);
  useEffect(() => {
    if (existing.data) setForm(fromMill(existing.data));
  }, [existing.data]);
  if (id && existing.isLoading) return <Loader />;
  const setStand = (i: number, patch: Partial<StandForm>) =>
    setForm((f) => ({ ...f, stands: f.stands.map((s, j) => (j === i ? { ...s, ...patch } : s)) }));
  const submit = () => save.mutate(toMillRequest(form), { onSuccess: () => void navigate('/mill') });

  return (
    <Stack gap="lg">
      <PageHeader
        title={id ? `Edit ${existing.data?.name ?? 'the mill'}` : 'Describe a mill'}
        subtitle={
          'Stands from the entry side, the engine that drives them, the figures the pass checks use and the ' +
          'rates quotes are made from.'
        }
      />
      <Card withBorder padding="lg">
        <SimpleGrid cols={{ base: 1, sm: 2 }} spacing="md">
          <TextInput label="Name" value={form.name} onChange={(e) => setForm({ ...form, name: e.currentTarget.value })} />
          <Select
            label="Driving engine"
            data={(engines.data ?? []).map((e) => ({ value: e.id, label: e.name }))}
            value={form.engineId}
            onChange={(v) => setForm({ ...form, engineId: v })}
          />
        </SimpleGrid>
        <Textarea
          mt="md"
          label="Notes"
          autosize
          minRows={2}
          value={form.notes}
          onChange={(e) => setForm({ ...form, notes: e.currentTarget.value })}
        />
      </Card>
      <Card withBorder padding="lg">
        <Title order={2} fz="xl" mb="sm">
          Stands
        </Title>
        <Stack gap="md">
          {form.stands.map((s, i) => (
            <Group key={i} align="flex-end" gap="sm" wrap="wrap" role="group" aria-label={`Stand ${i + 1}`}>
              <TextInput
                label={`Stand ${i + 1}: name`}
                w={220}
                value={s.name}
                onChange={(e) => setStand(i, { name: e.currentTarget.value })}
              />
              {numIn('Roll diameter, mm', s.rollDiameterMm, (v) => setStand(i, { rollDiameterMm: v }), { w: 150 })}
              {numIn('Barrel length, mm', s.barrelLengthMm, (v) => setStand(i, { barrelLengthMm: v }), { w: 150 })}
              {numIn('Roll ÷ engine speed', s.rollSpeedRatio, (v) => setStand(i, { rollSpeedRatio: v }), { w: 150 })}
              {numIn('Max. separating force, kN', s.maxSeparatingForceKn, (v) => setStand(i, { maxSeparatingForceKn: v }), { w: 190 })}
              <TextInput label="Notes" w={220} value={s.notes} onChange={(e) => setStand(i, { notes: e.currentTarget.value })} />
              {form.stands.length > 1 && (
                <ActionIcon
                  variant="default"
                  aria-label={`Remove stand ${i + 1}`}
                  onClick={() => setForm((f) => ({ ...f, stands: f.stands.filter((_, j) => j !== i) }))}
                >
                  <IconTrash />
                </ActionIcon>
              )}
            </Group>
          ))}
          <Button
            variant="default"
            leftSection={<IconPlus />}
            onClick={() => setForm((f) => ({ ...f, stands: [...f.stands, blankStand()] }))}
            w="fit-content"
          >
            Add a stand
          </Button>
        </Stack>
      </Card>
      <Card withBorder padding="lg">
        <Title order={2} fz="xl" mb="sm">
          Pass checks
        </Title>
        <SimpleGrid cols={{ base: 2, sm: 3, lg: 5 }} spacing="md">
          {numIn('Warn below (fraction of rated speed)', form.settings.minSpeedFraction, (v) =>
            setForm({ ...form, settings: { ...form.settings, minSpeedFraction: v } }),
          )}
          {numIn('Mechanical efficiency (fraction)', form.settings.mechanicalEfficiency, (v) =>
            setForm({ ...form, settings: { ...form.settings, mechanicalEfficiency: v } }),
          )}
          {numIn('Base load, hp', form.settings.baseLoadHp, (v) => setForm({ ...form, settings: { ...form.settings, baseLoadHp: v } }))}
          {numIn('Indicated power without cards, hp', form.settings.defaultIndicatedHp, (v) =>
            setForm({ ...form, settings: { ...form.settings, defaultIndicatedHp: v } }),
          )}
          {numIn('Friction allowance (×)', form.settings.frictionFactor, (v) =>
            setForm({ ...form, settings: { ...form.settings, frictionFactor: v } }),
          )}
        </SimpleGrid>
      </Card>
      <Card withBorder padding="lg">
        <Title order={2} fz="xl" mb="sm">
          Quote rates
        </Title>
        <SimpleGrid cols={{ base: 2, sm: 4 }} spacing="md">
          <TextInput
            label="Currency (three letters)"
            value={form.rates.currency}
            onChange={(e) => setForm({ ...form, rates: { ...form.rates, currency: e.currentTarget.value } })}
          />
          {numIn('Stock, per tonne', form.rates.stockRatePerTonne, (v) =>
            setForm({ ...form, rates: { ...form.rates, stockRatePerTonne: v } }),
          )}
          {numIn('Yield loss, % of stock', form.rates.yieldLossPct, (v) => setForm({ ...form, rates: { ...form.rates, yieldLossPct: v } }))}
          {numIn('Engine time, per hour', form.rates.engineRatePerHour, (v) =>
            setForm({ ...form, rates: { ...form.rates, engineRatePerHour: v } }),
          )}
          {numIn('Crew, per person-hour', form.rates.crewRatePerPersonHour, (v) =>
            setForm({ ...form, rates: { ...form.rates, crewRatePerPersonHour: v } }),
          )}
          {numIn('Crew size', form.rates.crewSize, (v) => setForm({ ...form, rates: { ...form.rates, crewSize: v } }))}
          {numIn('Contingency, %', form.rates.contingencyPct, (v) => setForm({ ...form, rates: { ...form.rates, contingencyPct: v } }))}
          {numIn('Margin, %', form.rates.marginPct, (v) => setForm({ ...form, rates: { ...form.rates, marginPct: v } }))}
        </SimpleGrid>
        <Stack gap="sm" mt="md">
          {form.fixedCosts.map((c, i) => (
            <Group key={i} align="flex-end" gap="sm">
              <TextInput
                label={`Fixed cost ${i + 1}`}
                w={300}
                value={c.label}
                onChange={(e) =>
                  setForm((f) => ({ ...f, fixedCosts: f.fixedCosts.map((x, j) => (j === i ? { ...x, label: e.currentTarget.value } : x)) }))
                }
              />
              {numIn(
                'Amount',
                c.amount,
                (v) => setForm((f) => ({ ...f, fixedCosts: f.fixedCosts.map((x, j) => (j === i ? { ...x, amount: v } : x)) })),
                { w: 160 },
              )}
              <ActionIcon
                variant="default"
                aria-label={`Remove fixed cost ${i + 1}`}
                onClick={() => setForm((f) => ({ ...f, fixedCosts: f.fixedCosts.filter((_, j) => j !== i) }))}
              >
                <IconTrash />
              </ActionIcon>
            </Group>
          ))}
          <Button
            variant="default"
            leftSection={<IconPlus />}
            onClick={() => setForm((f) => ({ ...f, fixedCosts: [...f.fixedCosts, { label: '', amount: '' }] }))}
            w="fit-content"
          >
            Add a fixed cost
          </Button>
        </Stack>
      </Card>
      {save.error && (
        <Alert color="signal" title="Not saved" role="alert">
          {errorText(save.error)}
        </Alert>
      )}
      <Group>
        <Button size="lg" onClick={submit} loading={save.isPending}>
          Save the mill
        </Button>
        <Button size="lg" variant="default" onClick={() => navigate('/mill')}>
          Cancel
        </Button>
      </Group>
    </Stack>
  );
}
