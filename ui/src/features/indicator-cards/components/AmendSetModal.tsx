import { useEffect, useState } from 'react';
import { Alert, Button, Group, Modal, NumberInput, SimpleGrid, Stack, Text, TextInput, Textarea } from '@mantine/core';
import type { AmendCardSetRequest, CardSetDto } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { useAmendCardSet } from '../api/indicator-cards.api';
import { localNow } from './CardSetForm';

type Num = number | '';
const toNum = (v: number | null): Num => (v === null ? '' : v);

/** Corrects a set's own figures (moment, speed, cut-off, pressures, notes) with a reason. */
export function AmendSetModal({ set, opened, onClose }: { set: CardSetDto; opened: boolean; onClose: () => void }) {
  const amend = useAmendCardSet(set.id);
  const initial = () => ({
    takenAt: localNow(new Date(set.takenAt)),
    speedRpm: toNum(set.speedRpm),
    cutOffPercent: toNum(set.cutOffPercent),
    throttlePressurePsig: toNum(set.throttlePressurePsig),
    receiverPressurePsig: toNum(set.receiverPressurePsig),
    vacuumInHg: toNum(set.vacuumInHg),
    notes: set.notes ?? '',
  });
  const [f, setF] = useState(initial);
  const [reason, setReason] = useState('');
  useEffect(() => {
    if (opened) {
      setF(initial());
      setReason('');
      amend.reset();
    }
    // eslint-disable-next-line react-hooks/exhaustive-deps -- reset on opening or another set; a refetch must not wipe the edits
  }, [opened, set.id]);

  const i = initial();
  const req: AmendCardSetRequest = { reason: reason.trim() };
  if (f.takenAt !== i.takenAt) req.takenAt = new Date(f.takenAt).toISOString();
  for (const k of ['speedRpm', 'cutOffPercent', 'throttlePressurePsig', 'receiverPressurePsig', 'vacuumInHg'] as const)
    if (f[k] !== i[k]) req[k] = f[k] === '' ? null : Number(f[k]);
  if (f.notes !== i.notes) req.notes = f.notes;
  const changed = Object.keys(req).length > 1;
  const field = (k: 'speedRpm' | 'cutOffPercent' | 'throttlePressurePsig' | 'receiverPressurePsig' | 'vacuumInHg') => ({
    value: f[k],
    onChange: (v: string | number) => setF((x) => ({ ...x, [k]: v === '' ? '' : Number(v) })),
    hideControls: true,
    inputMode: 'decimal' as const,
    size: 'lg' as const,
  });

  return (
    <Modal opened={opened} onClose={onClose} title="Amend the set’s figures" size="lg">
      <Stack>
        <Text fz="sm" c="dimmed">
          Only what you change is amended; the earlier figures stay in the record with your name, the time and your reason. An emptied speed
          or pressure is taken from the nearest reading again.
        </Text>
        <SimpleGrid cols={2}>
          <TextInput
            type="datetime-local"
            label="Taken at"
            size="lg"
            value={f.takenAt}
            onChange={(e) => setF((x) => ({ ...x, takenAt: e.currentTarget.value }))}
          />
          <NumberInput label="Speed, rpm" {...field('speedRpm')} />
          <NumberInput label="Cut-off, %" {...field('cutOffPercent')} />
          <NumberInput label="Throttle, psig" {...field('throttlePressurePsig')} />
          <NumberInput label="Receiver, psig" {...field('receiverPressurePsig')} />
          <NumberInput label="Vacuum, inHg" {...field('vacuumInHg')} />
        </SimpleGrid>
        <Textarea label="Notes" value={f.notes} onChange={(e) => setF((x) => ({ ...x, notes: e.currentTarget.value }))} autosize />
        <Textarea
          label="Why is it amended?"
          required
          size="lg"
          value={reason}
          onChange={(e) => setReason(e.currentTarget.value)}
          autosize
          minRows={2}
        />
        {amend.error && <Alert color="signal">{errorText(amend.error)}</Alert>}
        <Group justify="flex-end">
          <Button variant="default" size="lg" onClick={onClose}>
            Cancel
          </Button>
          <Button
            size="lg"
            disabled={!changed || reason.trim().length < 3}
            loading={amend.isPending}
            onClick={() => amend.mutate(req, { onSuccess: onClose })}
          >
            Save amendment
          </Button>
        </Group>
      </Stack>
    </Modal>
  );
}
