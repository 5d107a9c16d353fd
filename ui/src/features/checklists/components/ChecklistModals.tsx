import { useEffect, useState } from 'react';
import { Alert, Button, Group, Modal, NumberInput, PasswordInput, SegmentedControl, Stack, Text, Textarea } from '@mantine/core';
import {
  acceptanceRangeText,
  checklistUnitText,
  DUTY_LABELS,
  readingOutOfRange,
  type AmendChecklistRequest,
  type ChecklistDetail,
  type ChecklistEntryDto,
  type ChecklistItemDef,
} from '@crankjournal/shared-types';
import { valueWords } from './ItemCard';

/** Signing: the password or signing PIN asked for again, and what the signature records. */
export function SignModal({
  checklist,
  opened,
  onClose,
  onSign,
  busy,
  error,
}: {
  checklist: ChecklistDetail;
  opened: boolean;
  onClose: () => void;
  onSign: (signature: string) => void;
  busy: boolean;
  error: string | null;
}) {
  const [secret, setSecret] = useState('');
  useEffect(() => setSecret(''), [opened]);
  return (
    <Modal
      opened={opened}
      onClose={onClose}
      title={
        <Text fw={700} fz="lg">
          Sign the {checklist.name} checklist?
        </Text>
      }
      centered
      size="lg"
    >
      <form
        onSubmit={(e) => {
          e.preventDefault();
          if (secret) onSign(secret);
        }}
      >
        <Stack>
          <Text fz="sm">
            Your signature records your name, the time and that this is version {checklist.version} of the template. The checklist then
            becomes read-only; a mistake is corrected by an amendment with a reason. You need a current{' '}
            {DUTY_LABELS[checklist.requiredDuty].toLowerCase()} qualification for this engine.
          </Text>
          {error && (
            <Alert color="signal" role="alert" title="Not signed">
              {error}
            </Alert>
          )}
          <PasswordInput
            label="Your password or signing PIN"
            description="Asked again so that nobody signs in your name on a tablet left signed in."
            autoComplete="current-password"
            size="lg"
            value={secret}
            onChange={(e) => setSecret(e.currentTarget.value)}
            data-autofocus
          />
          <Group justify="flex-end">
            <Button variant="default" size="lg" onClick={onClose}>
              Cancel
            </Button>
            <Button type="submit" size="lg" disabled={!secret} loading={busy}>
              Sign checklist
            </Button>
          </Group>
        </Stack>
      </form>
    </Modal>
  );
}

/** The chief engineer accepts an out-of-range value, with the reason that goes into the record. */
export function OverrideModal({
  item,
  entry,
  onClose,
  onOverride,
  busy,
  error,
}: {
  item: ChecklistItemDef | null;
  entry: ChecklistEntryDto | undefined;
  onClose: () => void;
  onOverride: (reason: string) => void;
  busy: boolean;
  error: string | null;
}) {
  const [reason, setReason] = useState('');
  useEffect(() => setReason(''), [item]);
  return (
    <Modal
      opened={!!item}
      onClose={onClose}
      title={
        <Text fw={700} fz="lg">
          Accept a value outside its range?
        </Text>
      }
      centered
      size="lg"
    >
      {item && (
        <Stack>
          <Text>
            <b>{item.label}</b>: {valueWords(item, entry)}
            {item.kind === 'reading'
              ? ` (acceptance range ${acceptanceRangeText(item)})`
              : ` (acceptable: ${(item.acceptable ?? []).join(', ')})`}
          </Text>
          <Text fz="sm">
            Your override, with your name, the time and the reason, becomes part of the checklist's record and lets it be signed with this
            value.
          </Text>
          {error && (
            <Alert color="signal" role="alert">
              {error}
            </Alert>
          )}
          <Textarea
            label="Why is this value acceptable today?"
            required
            autosize
            minRows={3}
            size="md"
            value={reason}
            onChange={(e) => setReason(e.currentTarget.value)}
            data-autofocus
          />
          <Group justify="flex-end">
            <Button variant="default" size="lg" onClick={onClose}>
              Cancel
            </Button>
            <Button size="lg" color="amber" disabled={reason.trim().length < 5} loading={busy} onClick={() => onOverride(reason.trim())}>
              Record override
            </Button>
          </Group>
        </Stack>
      )}
    </Modal>
  );
}

/** A correction of a signed checklist: the new value and why; the value as signed stays visible. */
export function AmendModal({
  item,
  entry,
  isChief,
  onClose,
  onAmend,
  busy,
  error,
}: {
  item: ChecklistItemDef | null;
  entry: ChecklistEntryDto | undefined;
  isChief: boolean;
  onClose: () => void;
  onAmend: (req: AmendChecklistRequest) => void;
  busy: boolean;
  error: string | null;
}) {
  const [value, setValue] = useState<string | number>('');
  const [choice, setChoice] = useState<string>('');
  const [text, setText] = useState('');
  const [tick, setTick] = useState('done');
  const [reason, setReason] = useState('');
  const [overrideReason, setOverrideReason] = useState('');
  useEffect(() => {
    setValue(entry?.value ?? '');
    setChoice(entry?.choice ?? '');
    setText(entry?.text ?? '');
    setTick(entry?.tick ? 'done' : 'not');
    setReason('');
    setOverrideReason('');
  }, [item, entry]);
  if (!item) return <Modal opened={false} onClose={onClose} title="" />;
  const num = typeof value === 'number' ? value : value === '' ? null : Number(value);
  const out =
    (item.kind === 'reading' && num !== null && Number.isFinite(num) && readingOutOfRange(item, num)) ||
    (item.kind === 'choice' && !!choice && (item.acceptable?.length ?? 0) > 0 && !item.acceptable!.includes(choice));
  const req = (): AmendChecklistRequest => {
    const base = {
      itemKey: item.key,
      reason: reason.trim(),
      ...(out && overrideReason.trim() ? { overrideReason: overrideReason.trim() } : {}),
    };
    switch (item.kind) {
      case 'tick':
        return { ...base, tick: tick === 'done' };
      case 'reading':
        return { ...base, value: num };
      case 'choice':
        return { ...base, choice: choice || null };
      default:
        return { ...base, text: text.trim() || null };
    }
  };
  const ready = reason.trim().length >= 3 && (!out || (isChief && overrideReason.trim().length >= 5));
  return (
    <Modal
      opened
      onClose={onClose}
      title={
        <Text fw={700} fz="lg">
          Amend “{item.label}”
        </Text>
      }
      centered
      size="lg"
    >
      <form
        onSubmit={(e) => {
          e.preventDefault();
          if (ready) onAmend(req());
        }}
      >
        <Stack>
          <Text fz="sm">
            Recorded now: <b>{valueWords(item, entry)}</b>. The value as signed stays in the record, struck through, with your name, the
            time and your reason.
          </Text>
          {error && (
            <Alert color="signal" role="alert">
              {error}
            </Alert>
          )}
          {item.kind === 'tick' && (
            <SegmentedControl
              size="lg"
              value={tick}
              onChange={setTick}
              data={[
                { value: 'done', label: 'Done' },
                { value: 'not', label: 'Not done' },
              ]}
            />
          )}
          {item.kind === 'reading' && (
            <NumberInput
              label={`New reading (${checklistUnitText(item.unit)})`}
              description={`Acceptance range: ${acceptanceRangeText(item)}`}
              size="lg"
              value={value}
              onChange={setValue}
              inputMode="decimal"
              hideControls
              error={out ? 'Outside the acceptance range' : undefined}
              data-autofocus
            />
          )}
          {item.kind === 'choice' && (
            <SegmentedControl size="lg" value={choice} onChange={setChoice} data={item.choices ?? []} orientation="vertical" fullWidth />
          )}
          {item.kind === 'note' && (
            <Textarea label="New note" autosize minRows={2} value={text} onChange={(e) => setText(e.currentTarget.value)} />
          )}
          <Textarea
            label="Reason for the amendment"
            required
            autosize
            minRows={2}
            value={reason}
            onChange={(e) => setReason(e.currentTarget.value)}
          />
          {out &&
            (isChief ? (
              <Textarea
                label="Why the out-of-range value is acceptable (your override)"
                required
                autosize
                minRows={2}
                value={overrideReason}
                onChange={(e) => setOverrideReason(e.currentTarget.value)}
              />
            ) : (
              <Alert color="amber" variant="outline">
                Only the chief engineer can amend this to a value outside its acceptance range.
              </Alert>
            ))}
          <Group justify="flex-end">
            <Button variant="default" size="lg" onClick={onClose}>
              Cancel
            </Button>
            <Button type="submit" size="lg" disabled={!ready} loading={busy}>
              Record amendment
            </Button>
          </Group>
        </Stack>
      </form>
    </Modal>
  );
}
