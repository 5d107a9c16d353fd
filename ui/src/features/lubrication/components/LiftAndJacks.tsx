import { useState } from 'react';
import { Alert, Badge, Group, NumberInput, Paper, SimpleGrid, Stack, Text, Title } from '@mantine/core';
import { IconAlertOctagon, IconCheck } from '@tabler/icons-react';
import type { JackCapacityRequest, LiftPressureRequest } from '@crankjournal/shared-types';
import { Caution } from '../../../components/Caution/Caution';
import { calculateJackCapacity, calculateLiftPressure } from '../api/lubrication.api';
import { useCalculation } from './useCalculation';
import { ResultFigure, fmtN } from './ResultFigure';

type Num = number | '';
const n = (v: Num) => (v === '' ? null : Number(v));
const numIn = (label: string, value: Num, set: (v: Num) => void, description?: string) => (
  <NumberInput
    label={label}
    description={description}
    value={value}
    onChange={(v) => set(v === '' ? '' : Number(v))}
    hideControls
    inputMode="decimal"
    min={0}
  />
);

/**
 * Pre-lube lift pressure for one journal and the jack capacity check for lifting the rotating mass, through the
 * stateless calculator routes, with the jacking caution beside them.
 */
export function LiftAndJacks({ journalLoadLbf, rotatingWeightLb }: { journalLoadLbf?: number | null; rotatingWeightLb?: number | null }) {
  const [load, setLoad] = useState<Num>(journalLoadLbf ?? 112_500);
  const [pocket, setPocket] = useState<Num>(75);
  const [factor, setFactor] = useState<Num>(2);
  const [jacks, setJacks] = useState<Num>(4);
  const [capacity, setCapacity] = useState<Num>(50);
  const [lifted, setLifted] = useState<Num>(rotatingWeightLb ?? 225_000);
  const [margin, setMargin] = useState<Num>(1.5);
  const liftReq: LiftPressureRequest | null =
    n(load) && n(pocket) ? { loadLbf: n(load)!, pocketAreaIn2: n(pocket)!, ...(n(factor) ? { breakawayFactor: n(factor)! } : {}) } : null;
  const jackReq: JackCapacityRequest | null =
    n(jacks) && n(capacity) && n(lifted)
      ? {
          jackCount: n(jacks)!,
          jackCapacityShortTons: n(capacity)!,
          loadLbf: n(lifted)!,
          ...(n(margin) ? { requiredMargin: n(margin)! } : {}),
        }
      : null;
  const lift = useCalculation(calculateLiftPressure, liftReq);
  const jack = useCalculation(calculateJackCapacity, jackReq);
  return (
    <Stack gap="md">
      <SimpleGrid cols={{ base: 1, md: 2 }} spacing="md">
        <Paper withBorder p="md" radius="md" data-testid="lift-pressure">
          <Title order={3} fz="lg" mb="sm">
            Pre-lube: oil pressure to lift a journal
          </Title>
          <SimpleGrid cols={{ base: 1, sm: 3 }} spacing="sm">
            {numIn('Load on the journal, lbf', load, setLoad)}
            {numIn('Oil pocket area, in²', pocket, setPocket, 'or the projected area D × L')}
            {numIn('Breakaway factor', factor, setFactor, '1.5 to 3')}
          </SimpleGrid>
          {lift.error && (
            <Alert color="amber" mt="sm">
              {lift.error}
            </Alert>
          )}
          {lift.result && (
            <Stack gap="xs" mt="md">
              <Group gap="xl">
                <ResultFigure label="Lift pressure" value={fmtN(lift.result.liftPressurePsi, 0)} unit="psi" testId="lift-psi" />
                <ResultFigure label="Pump rated for" value={fmtN(lift.result.pumpPressurePsi, 0)} unit="psi" testId="pump-psi" />
              </Group>
              <Text fz="sm" c="dimmed" className="cj-num">
                Breakaway range {fmtN(lift.result.pumpPressureRangePsi.min, 0)}–{fmtN(lift.result.pumpPressureRangePsi.max, 0)} psi.
              </Text>
              <Text fz="sm">{lift.result.rule}</Text>
            </Stack>
          )}
        </Paper>
        <Paper withBorder p="md" radius="md" data-testid="jack-check">
          <Title order={3} fz="lg" mb="sm">
            Jacks: rated with margin for the load?
          </Title>
          <SimpleGrid cols={{ base: 2, sm: 4 }} spacing="sm">
            {numIn('Jacks', jacks, setJacks)}
            {numIn('Each rated, short tons', capacity, setCapacity)}
            {numIn('Load lifted, lb', lifted, setLifted)}
            {numIn('Least margin', margin, setMargin)}
          </SimpleGrid>
          {jack.error && (
            <Alert color="amber" mt="sm">
              {jack.error}
            </Alert>
          )}
          {jack.result && (
            <Stack gap="xs" mt="md">
              <Group gap="xl" align="flex-end">
                <ResultFigure label="Capacity" value={fmtN(jack.result.capacityShortTons, 0)} unit="short tons" />
                <ResultFigure label="Load" value={fmtN(jack.result.loadShortTons, 1)} unit="short tons" />
                <ResultFigure label="Margin" value={fmtN(jack.result.margin, 2)} testId="jack-margin" />
                {jack.result.belowRequiredMargin ? (
                  <Badge color="signal" size="lg" leftSection={<IconAlertOctagon size={16} />} data-testid="jack-verdict">
                    Below the least margin of {fmtN(jack.result.requiredMargin, 2)}
                  </Badge>
                ) : (
                  <Badge color="gray" variant="outline" size="lg" leftSection={<IconCheck size={16} />} data-testid="jack-verdict">
                    At or above {fmtN(jack.result.requiredMargin, 2)}
                  </Badge>
                )}
              </Group>
              <Text fz="sm">{jack.result.rule}</Text>
            </Stack>
          )}
        </Paper>
      </SimpleGrid>
      <Caution title="Jacking and lifting">
        {lift.result?.caution ??
          jack.result?.caution ??
          'Jacking and hydraulic lift of a loaded journal can kill or maim. These figures aid a qualified ' +
            'crew; they do not replace the jack and pump makers’ ratings, local codes, the insurer’s ' +
            'requirements or licensed practice.'}
      </Caution>
    </Stack>
  );
}
