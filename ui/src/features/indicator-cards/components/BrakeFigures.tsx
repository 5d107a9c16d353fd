import { useState } from 'react';
import { Alert, Button, Group, NumberInput, Paper, SegmentedControl, SimpleGrid, Stack, Text, TextInput, Title } from '@mantine/core';
import { IconPlus } from '@tabler/icons-react';
import {
  BRAKE_METHOD_LABELS,
  BRAKE_METHODS,
  type BrakeFigureDto,
  type BrakeFigureInput,
  type BrakeMethod,
} from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { Caution } from '../../../components/Caution/Caution';
import { useAddBrakeFigure } from '../api/indicator-cards.api';
import { fmt, whenShort } from '../model/format';
import { AmendmentList } from './AmendmentList';
import { localNow } from './CardSetForm';

const BRAKE_CAUTION =
  'Brake and load tests put the engine under deliberate load. Crankjournal aids a qualified crew; such ' +
  'tests follow the site procedure, local codes and licensed practice.';

/** Brake or measured output figures of the run, against which the sets near them get a mechanical efficiency. */
export function BrakeFigures({ runId, figures, canWrite }: { runId: string; figures: BrakeFigureDto[]; canWrite: boolean }) {
  const [open, setOpen] = useState(false);
  const [method, setMethod] = useState<BrakeMethod>('direct');
  const [measuredAt, setMeasuredAt] = useState(localNow());
  const [v, setV] = useState<Record<string, number | ''>>({});
  const [note, setNote] = useState('');
  const add = useAddBrakeFigure(runId);
  const field = (k: string, label: string) => (
    <NumberInput
      label={label}
      size="lg"
      hideControls
      inputMode="decimal"
      value={v[k] ?? ''}
      onChange={(x) => setV((o) => ({ ...o, [k]: x === '' ? '' : Number(x) }))}
    />
  );
  const n = (k: string) => (v[k] === '' || v[k] === undefined ? null : Number(v[k]));
  const submit = () => {
    const req: BrakeFigureInput = {
      measuredAt: new Date(measuredAt).toISOString(),
      method,
      brakeHorsepower: n('brakeHorsepower'),
      netBrakeLoadLbf: n('netBrakeLoadLbf'),
      drumDiameterFt: n('drumDiameterFt'),
      ropeDiameterFt: n('ropeDiameterFt'),
      torqueLbfFt: n('torqueLbfFt'),
      speedRpm: n('speedRpm'),
      note: note.trim() || null,
    };
    add.mutate(req, {
      onSuccess: () => {
        setOpen(false);
        setV({});
        setNote('');
      },
    });
  };
  return (
    <Paper withBorder p="md" radius="md" data-testid="brake-figures">
      <Group justify="space-between" mb="xs">
        <Title order={3} fz="md">
          Brake and measured output
        </Title>
        {canWrite && !open && (
          <Button variant="default" leftSection={<IconPlus size={16} />} onClick={() => setOpen(true)}>
            Enter a brake figure
          </Button>
        )}
      </Group>
      {figures.length === 0 && !open && (
        <Text fz="sm" c="dimmed">
          None entered. With one, the card sets within an hour of it show the mechanical efficiency.
        </Text>
      )}
      <Stack gap="xs">
        {figures.map((f) => (
          <Stack key={f.id} gap={2}>
            <Text className="cj-num">
              {whenShort(f.measuredAt)}: <strong>{fmt(f.brakeHorsepower, 0)} bhp</strong> ({fmt(f.brakeKilowatts, 0)} kW) —{' '}
              {BRAKE_METHOD_LABELS[f.method].toLowerCase()}
              {f.torqueLbfFt !== null ? `, ${fmt(f.torqueLbfFt, 0)} lbf·ft` : ''}
              {f.speedRpm !== null ? ` at ${fmt(f.speedRpm, 1)} rpm` : ''}
            </Text>
            {f.note && (
              <Text fz="sm" c="dimmed">
                {f.note}
              </Text>
            )}
            <AmendmentList amendments={f.amendments} />
          </Stack>
        ))}
      </Stack>
      {open && (
        <Stack mt="sm">
          <Caution title="Load tests">{BRAKE_CAUTION}</Caution>
          <SegmentedControl
            data={BRAKE_METHODS.map((m) => ({ value: m, label: BRAKE_METHOD_LABELS[m] }))}
            value={method}
            onChange={(m) => setMethod(m as BrakeMethod)}
          />
          <SimpleGrid cols={{ base: 2, sm: 3 }}>
            <TextInput
              type="datetime-local"
              label="Measured at"
              size="lg"
              value={measuredAt}
              onChange={(e) => setMeasuredAt(e.currentTarget.value)}
            />
            {method === 'direct' && field('brakeHorsepower', 'Output, hp')}
            {method === 'rope_brake' && field('netBrakeLoadLbf', 'Net brake load, lbf')}
            {method === 'rope_brake' && field('drumDiameterFt', 'Drum diameter, ft')}
            {method === 'rope_brake' && field('ropeDiameterFt', 'Rope diameter, ft')}
            {method === 'torque' && field('torqueLbfFt', 'Torque, lbf·ft')}
            {method !== 'direct' && field('speedRpm', 'Speed, rpm')}
          </SimpleGrid>
          <TextInput label="Note" size="lg" value={note} onChange={(e) => setNote(e.currentTarget.value)} />
          {add.error && <Alert color="signal">{errorText(add.error)}</Alert>}
          <Group justify="flex-end">
            <Button variant="default" onClick={() => setOpen(false)}>
              Cancel
            </Button>
            <Button onClick={submit} loading={add.isPending}>
              Save brake figure
            </Button>
          </Group>
        </Stack>
      )}
    </Paper>
  );
}
