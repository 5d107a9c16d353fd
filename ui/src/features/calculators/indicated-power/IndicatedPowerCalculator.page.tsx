import { useEffect, useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import {
  ActionIcon,
  Alert,
  Button,
  Group,
  NumberInput,
  Paper,
  SegmentedControl,
  SimpleGrid,
  Stack,
  Table,
  Text,
  TextInput,
  Title,
} from '@mantine/core';
import { IconPlus, IconTrash } from '@tabler/icons-react';
import {
  CYLINDER_END_LABELS,
  type CylinderEnd,
  type IndicatedPowerCardInput,
  type IndicatedPowerRequest,
  type IndicatedPowerResponse,
} from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { Caution } from '../../../components/Caution/Caution';
import { PageHeader } from '../../../components/PageHeader';
import { calculateIndicatedPower } from '../../indicator-cards/api/indicator-cards.api';
import { parseOrdinates } from '../../indicator-cards/components/card-draft';
import { fmt } from '../../indicator-cards/model/format';

type Num = number | '';
type Way = 'none' | 'mep' | 'planimeter' | 'ordinates';
interface EndForm {
  way: Way;
  mep: Num;
  area: Num;
  length: Num;
  spring: Num;
  ordinates: string;
}
interface CylinderForm {
  label: string;
  bore: Num;
  pistonRod: Num;
  tailRod: Num;
  ends: Record<CylinderEnd, EndForm>;
}
export interface CalculatorForm {
  rpm: Num;
  stroke: Num;
  cylinders: CylinderForm[];
}

const end = (over: Partial<EndForm> = {}): EndForm => ({ way: 'none', mep: '', area: '', length: '', spring: '', ordinates: '', ...over });

/**
 * Example figures: the high-pressure head-end card is the worked example of Machinery's Reference Series
 * No. 70 (2.6 in², 3.6 in, 60-lb spring); the rest are invented.
 */
export const EXAMPLE: CalculatorForm = {
  rpm: 40,
  stroke: 66,
  cylinders: [
    {
      label: 'HP',
      bore: 22.57,
      pistonRod: 4,
      tailRod: 0,
      ends: {
        head: end({ way: 'planimeter', area: 2.6, length: 3.6, spring: 60 }),
        crank: end({ way: 'ordinates', spring: 60, ordinates: '0.9 0.85 0.8 0.74 0.69 0.63 0.55 0.46 0.35 0.2' }),
      },
    },
    { label: 'LP', bore: 44, pistonRod: 4, tailRod: 4, ends: { head: end({ way: 'mep', mep: 12.4 }), crank: end() } },
  ],
};

const n = (v: Num) => (v === '' ? undefined : Number(v));

/** The API body; an end with no way given is left out, and figures are sent as typed so the server names what is wrong. */
export function toCalculatorRequest(f: CalculatorForm): IndicatedPowerRequest {
  return {
    rpm: n(f.rpm) as number,
    strokeIn: n(f.stroke) as number,
    cylinders: f.cylinders.map((c) => ({
      label: c.label,
      boreIn: n(c.bore) as number,
      pistonRodIn: n(c.pistonRod) ?? 0,
      tailRodIn: n(c.tailRod) ?? 0,
      cards: (['head', 'crank'] as const)
        .filter((e) => c.ends[e].way !== 'none')
        .map((e): IndicatedPowerCardInput => {
          const x = c.ends[e];
          if (x.way === 'mep') return { end: e, meanEffectivePressurePsi: n(x.mep) };
          if (x.way === 'planimeter') return { end: e, areaSqIn: n(x.area), lengthIn: n(x.length), springPsiPerIn: n(x.spring) };
          return { end: e, ordinatesIn: parseOrdinates(x.ordinates) ?? [], springPsiPerIn: n(x.spring) };
        }),
    })),
  };
}

const CAUTION =
  'Power figures aid a qualified crew in judging the engine; they do not clear it to run harder. Cards ' +
  'are taken at live steam cocks; follow the site procedure, local codes and licensed practice.';

/** /calculators/indicated-power: the stateless calculator over POST /api/calculations/indicated-power. */
export default function IndicatedPowerCalculatorPage() {
  const [form, setForm] = useState<CalculatorForm>(EXAMPLE);
  const [result, setResult] = useState<IndicatedPowerResponse | null>(null);
  const [error, setError] = useState<string | null>(null);
  const request = useMemo(() => toCalculatorRequest(form), [form]);
  const key = JSON.stringify(request);

  useEffect(() => {
    let live = true;
    const t = setTimeout(() => {
      calculateIndicatedPower(request)
        .then((r) => {
          if (!live) return;
          setResult(r);
          setError(null);
        })
        .catch((e) => {
          if (!live) return;
          setResult(null);
          setError(errorText(e));
        });
    }, 350);
    return () => {
      live = false;
      clearTimeout(t);
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps -- key is the JSON of request: ask only when the figures change
  }, [key]);

  const setCyl = (i: number, patch: Partial<CylinderForm>) =>
    setForm((f) => ({ ...f, cylinders: f.cylinders.map((c, j) => (j === i ? { ...c, ...patch } : c)) }));
  const setEnd = (i: number, e: CylinderEnd, patch: Partial<EndForm>) =>
    setForm((f) => ({
      ...f,
      cylinders: f.cylinders.map((c, j) => (j === i ? { ...c, ends: { ...c.ends, [e]: { ...c.ends[e], ...patch } } } : c)),
    }));
  const numProps = (value: Num, onChange: (v: Num) => void, label: string) => ({
    label,
    value,
    onChange: (v: string | number) => onChange(v === '' ? '' : Number(v)),
    hideControls: true,
    inputMode: 'decimal' as const,
    size: 'md' as const,
  });

  return (
    <>
      <PageHeader
        title="Indicated power"
        subtitle={
          'From each card’s planimeter area, mid-ordinates or mean effective pressure: IHP = P·L·A·N / 33,000 ' +
          'per end (head end less any tail rod, crank end less the piston rod).'
        }
        action={
          <Button component={Link} to="/calculators" variant="default">
            All calculators
          </Button>
        }
      />
      <Stack gap="md">
        <Caution title="Power figures">{CAUTION}</Caution>
        <Paper withBorder p="md" radius="md">
          <Group gap="md" align="flex-end" wrap="wrap">
            <NumberInput w={160} {...numProps(form.rpm, (v) => setForm((f) => ({ ...f, rpm: v })), 'Speed, rpm')} />
            <NumberInput w={160} {...numProps(form.stroke, (v) => setForm((f) => ({ ...f, stroke: v })), 'Stroke, in')} />
            <Button variant="default" onClick={() => setForm(EXAMPLE)}>
              Example figures
            </Button>
          </Group>
        </Paper>
        {form.cylinders.map((c, i) => (
          <Paper key={i} withBorder p="md" radius="md" data-testid={`calc-cylinder-${i}`}>
            <Group justify="space-between" mb="sm">
              <Title order={3} fz="lg">
                Cylinder {i + 1}
              </Title>
              {form.cylinders.length > 1 && (
                <ActionIcon
                  variant="default"
                  aria-label={`Remove cylinder ${i + 1}`}
                  onClick={() => setForm((f) => ({ ...f, cylinders: f.cylinders.filter((_, j) => j !== i) }))}
                >
                  <IconTrash />
                </ActionIcon>
              )}
            </Group>
            <SimpleGrid cols={{ base: 2, sm: 4 }} spacing="sm">
              <TextInput label="Label" value={c.label} onChange={(e) => setCyl(i, { label: e.currentTarget.value })} />
              <NumberInput {...numProps(c.bore, (v) => setCyl(i, { bore: v }), 'Bore, in')} />
              <NumberInput {...numProps(c.pistonRod, (v) => setCyl(i, { pistonRod: v }), 'Piston rod, in')} />
              <NumberInput {...numProps(c.tailRod, (v) => setCyl(i, { tailRod: v }), 'Tail rod, in')} />
            </SimpleGrid>
            {(['head', 'crank'] as const).map((e) => {
              const x = c.ends[e];
              return (
                <Stack key={e} gap="xs" mt="md">
                  <Group gap="sm" wrap="wrap">
                    <Text fw={600} w={90}>
                      {CYLINDER_END_LABELS[e]}
                    </Text>
                    <SegmentedControl
                      aria-label={`${c.label} ${e} end card`}
                      value={x.way}
                      onChange={(v) => setEnd(i, e, { way: v as Way })}
                      data={[
                        { value: 'none', label: 'No card' },
                        { value: 'planimeter', label: 'Planimeter' },
                        { value: 'ordinates', label: 'Mid-ordinates' },
                        { value: 'mep', label: 'MEP' },
                      ]}
                    />
                  </Group>
                  {x.way !== 'none' && (
                    <SimpleGrid cols={{ base: 2, sm: 4 }} spacing="sm">
                      {x.way === 'mep' && <NumberInput {...numProps(x.mep, (v) => setEnd(i, e, { mep: v }), 'MEP, psi')} />}
                      {x.way === 'planimeter' && <NumberInput {...numProps(x.area, (v) => setEnd(i, e, { area: v }), 'Area, in²')} />}
                      {x.way === 'planimeter' && <NumberInput {...numProps(x.length, (v) => setEnd(i, e, { length: v }), 'Length, in')} />}
                      {x.way === 'ordinates' && (
                        <TextInput
                          label="Mid-ordinates, in"
                          value={x.ordinates}
                          onChange={(ev) => setEnd(i, e, { ordinates: ev.currentTarget.value })}
                          inputMode="decimal"
                          style={{ gridColumn: 'span 2' }}
                        />
                      )}
                      {x.way !== 'mep' && <NumberInput {...numProps(x.spring, (v) => setEnd(i, e, { spring: v }), 'Spring, psi/in')} />}
                    </SimpleGrid>
                  )}
                </Stack>
              );
            })}
          </Paper>
        ))}
        <Group>
          <Button
            variant="default"
            leftSection={<IconPlus size={16} />}
            onClick={() =>
              setForm((f) => ({
                ...f,
                cylinders: [
                  ...f.cylinders,
                  {
                    label: `C${f.cylinders.length + 1}`,
                    bore: '',
                    pistonRod: 0,
                    tailRod: 0,
                    ends: { head: end({ way: 'mep' }), crank: end({ way: 'mep' }) },
                  },
                ],
              }))
            }
          >
            Add a cylinder
          </Button>
        </Group>

        <Paper withBorder p="md" radius="md" data-testid="calc-result">
          {error ? (
            <Alert color="amber" variant="outline" title="Check the figures">
              <span data-testid="calc-error">{error}</span>
            </Alert>
          ) : result ? (
            <Stack gap="sm">
              {!result.complete && (
                <Alert color="amber" variant="outline" title="Incomplete set" data-testid="calc-incomplete">
                  No card for: {result.missingEnds.map((m) => `${m.cylinderLabel} ${CYLINDER_END_LABELS[m.end].toLowerCase()}`).join(', ')}.
                  The total below is the sum of the cards present, not the engine&apos;s indicated power.
                </Alert>
              )}
              <Group gap="xl" align="baseline">
                <Stack gap={0}>
                  {!result.complete && (
                    <Text fz="xs" fw={700} c="amber.8" data-testid="calc-total-basis">
                      Sum of the cards present
                    </Text>
                  )}
                  <Text fz={36} fw={700} className="cj-num" data-testid="calc-total">
                    {fmt(result.totalIndicatedHorsepower, 1)} ihp
                  </Text>
                </Stack>
                <Text fz="xl" c="dimmed" className="cj-num">
                  {fmt(result.totalIndicatedKilowatts, 1)} kW
                </Text>
                {result.referredMeanEffectivePressurePsi !== null ? (
                  <Text className="cj-num">
                    referred MEP {fmt(result.referredMeanEffectivePressurePsi, 2)} psi (on the largest cylinder)
                  </Text>
                ) : (
                  <Text c="dimmed" data-testid="calc-referred-missing">
                    No referred MEP: {result.referredMeanEffectivePressureMissing}
                  </Text>
                )}
              </Group>
              <Table className="cj-num" aria-label="Indicated power by end">
                <Table.Thead>
                  <Table.Tr>
                    <Table.Th>Cylinder end</Table.Th>
                    <Table.Th ta="right">MEP, psi</Table.Th>
                    <Table.Th ta="right">Effective area, in²</Table.Th>
                    <Table.Th ta="right">ihp</Table.Th>
                  </Table.Tr>
                </Table.Thead>
                <Table.Tbody>
                  {result.cylinders.flatMap((c) => [
                    ...c.ends.map((e) => (
                      <Table.Tr key={`${c.label}-${e.end}`}>
                        <Table.Td>
                          {c.label} {CYLINDER_END_LABELS[e.end].toLowerCase()}
                        </Table.Td>
                        <Table.Td ta="right">{fmt(e.meanEffectivePressurePsi, 2)}</Table.Td>
                        <Table.Td ta="right">{fmt(e.effectiveAreaSqIn, 2)}</Table.Td>
                        <Table.Td ta="right">{fmt(e.indicatedHorsepower, 1)}</Table.Td>
                      </Table.Tr>
                    )),
                    <Table.Tr key={`${c.label}-total`} fw={600}>
                      <Table.Td colSpan={3}>{c.label} cylinder</Table.Td>
                      <Table.Td ta="right">{fmt(c.indicatedHorsepower, 1)}</Table.Td>
                    </Table.Tr>,
                  ])}
                </Table.Tbody>
              </Table>
            </Stack>
          ) : (
            <Text c="dimmed">Working it out…</Text>
          )}
        </Paper>
      </Stack>
    </>
  );
}
