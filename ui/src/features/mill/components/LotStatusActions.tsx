import { useState } from 'react';
import { Alert, Button, Group, Modal, NumberInput, Stack, Stepper, Text, TextInput } from '@mantine/core';
import { IconArrowRight } from '@tabler/icons-react';
import { LOT_STATUSES, LOT_STATUS_ACTIONS, LOT_STATUS_LABELS, MILL_WRITERS, type LotDetail } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { useMoveLot, useUpdateLot } from '../api/mill.api';

/** The steps of a lot, where it stands. */
export function LotSteps({ lot }: { lot: LotDetail }) {
  const active = LOT_STATUSES.indexOf(lot.status);
  return (
    <Stepper
      active={lot.status === 'dispatched' ? LOT_STATUSES.length : active + 1}
      size="sm"
      allowNextStepsSelect={false}
      aria-label="Lot status"
    >
      {LOT_STATUSES.map((s) => {
        const h = [...lot.history].reverse().find((x) => x.to === s);
        return <Stepper.Step key={s} label={LOT_STATUS_LABELS[s]} description={h ? new Date(h.at).toLocaleDateString() : undefined} />;
      })}
    </Stepper>
  );
}

/** The lot's one next step (mill lead and chief engineer); the server refuses anything else with its reason. */
export function LotStatusActions({ lot }: { lot: LotDetail }) {
  const canWrite = useHasRole(...MILL_WRITERS);
  const move = useMoveLot(lot.id);
  const update = useUpdateLot(lot.id);
  const [open, setOpen] = useState(false);
  const [note, setNote] = useState('');
  const isChief = useHasRole('chief_engineer');
  const [overrideReason, setOverrideReason] = useState('');
  const [produced, setProduced] = useState<number | ''>(lot.producedTonnes || lot.barTonnes.produced || '');
  const [scrapped, setScrapped] = useState<number | ''>(lot.scrappedTonnes || lot.barTonnes.scrapped || '');
  const next = lot.nextStatus;
  if (!canWrite || !next) return null;
  const confirm = async () => {
    if (next === 'rolled') {
      await update.mutateAsync({
        producedTonnes: produced === '' ? 0 : Number(produced),
        scrappedTonnes: scrapped === '' ? 0 : Number(scrapped),
      });
    }
    const reason = next === 'on_roll_plan' && isChief ? overrideReason.trim() : '';
    move.mutate(
      { to: next, note: note.trim() || undefined, ...(reason ? { overrideReason: reason } : {}) },
      { onSuccess: () => setOpen(false) },
    );
  };
  const error = move.error ?? update.error;
  return (
    <>
      <Button size="lg" rightSection={<IconArrowRight />} onClick={() => setOpen(true)}>
        {LOT_STATUS_ACTIONS[next]}
      </Button>
      <Modal opened={open} onClose={() => setOpen(false)} title={`Lot ${lot.reference}: ${LOT_STATUS_ACTIONS[next].toLowerCase()}`}>
        <Stack>
          <Text fz="sm">
            Records the step from {LOT_STATUS_LABELS[lot.status].toLowerCase()} to {LOT_STATUS_LABELS[next].toLowerCase()} with your name
            and the time. A lot moves one step at a time and never back.
          </Text>
          {next === 'rolled' && (
            <Group grow>
              <NumberInput
                label="Produced, tonnes"
                hideControls
                inputMode="decimal"
                value={produced}
                onChange={(v) => setProduced(v === '' ? '' : Number(v))}
              />
              <NumberInput
                label="Scrapped, tonnes"
                hideControls
                inputMode="decimal"
                value={scrapped}
                onChange={(v) => setScrapped(v === '' ? '' : Number(v))}
              />
            </Group>
          )}
          {next === 'on_roll_plan' && (
            <Text fz="sm">
              A lot goes on the roll plan once its deposit is paid; before that only the chief engineer may put it there, with a reason.
            </Text>
          )}
          {next === 'on_roll_plan' && isChief && (
            <TextInput
              label="Reason to put it on the roll plan before the deposit is paid"
              description="Only needed while the deposit is unpaid; kept in the lot's history with your name."
              value={overrideReason}
              onChange={(e) => setOverrideReason(e.currentTarget.value)}
            />
          )}
          <TextInput label="Note (optional)" value={note} onChange={(e) => setNote(e.currentTarget.value)} />
          {error && (
            <Alert color="signal" role="alert" title="Not moved">
              {errorText(error)}
            </Alert>
          )}
          <Group justify="flex-end">
            <Button variant="default" onClick={() => setOpen(false)}>
              Cancel
            </Button>
            <Button onClick={confirm} loading={move.isPending || update.isPending}>
              {LOT_STATUS_ACTIONS[next]}
            </Button>
          </Group>
        </Stack>
      </Modal>
    </>
  );
}
