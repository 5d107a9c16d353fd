import { useEffect, useState } from 'react';
import { Badge, Button, FileButton, Grid, Group, Image, Loader, NumberInput, Paper, Stack, Text, Textarea } from '@mantine/core';
import { IconAlertTriangle, IconCamera, IconCheck, IconCircleCheck, IconGavel, IconPencil, IconSquare } from '@tabler/icons-react';
import {
  acceptanceRangeText,
  checklistUnitText,
  HAZARD_LABELS,
  readingOutOfRange,
  type ChecklistEntryDto,
  type ChecklistEntryValue,
  type ChecklistItemDef,
  type FillChecklistItemRequest,
} from '@crankjournal/shared-types';
import { Caution } from '../../../components/Caution/Caution';
import { fetchPhotoUrl } from '../api/checklists.api';

export type ItemMode = 'fill' | 'signed' | 'readonly';

/** A value of an item in words: "22 psig", "Done", "All open". */
export function valueWords(item: ChecklistItemDef, v: ChecklistEntryValue | null | undefined): string {
  if (!v) return '—';
  switch (item.kind) {
    case 'tick':
      return v.tick ? 'Done' : 'Not done';
    case 'reading':
      return v.value == null ? '—' : `${v.value} ${checklistUnitText(item.unit)}`.trim();
    case 'choice':
      return v.choice ?? '—';
    case 'note':
      return v.text ?? '—';
    case 'photo':
      return 'Photo';
  }
}

function Photo({ checklistId, itemKey, stamp }: { checklistId: string; itemKey: string; stamp: string | null }) {
  const [url, setUrl] = useState<string | null>(null);
  useEffect(() => {
    let gone = false;
    let made: string | null = null;
    fetchPhotoUrl(checklistId, itemKey)
      .then((u) => {
        made = u;
        if (!gone) setUrl(u);
      })
      .catch(() => setUrl(null));
    return () => {
      gone = true;
      if (made) URL.revokeObjectURL(made);
    };
  }, [checklistId, itemKey, stamp]);
  if (!url) return <Loader size="sm" />;
  return <Image src={url} alt="Photo taken for this item" mah={180} w="auto" fit="contain" radius="sm" />;
}

export interface ItemCardProps {
  checklistId: string;
  item: ChecklistItemDef;
  entry: ChecklistEntryDto | undefined;
  mode: ItemMode;
  busy: boolean;
  canOverride: boolean;
  canAmend: boolean;
  onFill: (v: FillChecklistItemRequest) => void;
  onPhoto: (f: File) => void;
  onOverride: () => void;
  onAmend: () => void;
  /** What waits on the tablet for this item ("an entry", "a photo"), sent when the server answers. */
  waiting?: string[];
}

/** One item: what to do, the control to record it with big targets, its acceptance range, and its caution beside it. */
export function ItemCard({
  checklistId,
  item,
  entry,
  mode,
  busy,
  canOverride,
  canAmend,
  onFill,
  onPhoto,
  onOverride,
  onAmend,
  waiting,
}: ItemCardProps) {
  const [draft, setDraft] = useState<string | number>(entry?.value ?? '');
  const [note, setNote] = useState(entry?.text ?? '');
  useEffect(() => setDraft(entry?.value ?? ''), [entry?.value]);
  useEffect(() => setNote(entry?.text ?? ''), [entry?.text]);

  const filling = mode === 'fill';
  const range = item.kind === 'reading' ? acceptanceRangeText(item) : '';
  const draftNumber = typeof draft === 'number' ? draft : draft === '' ? null : Number(draft);
  const draftOut = item.kind === 'reading' && draftNumber !== null && Number.isFinite(draftNumber) && readingOutOfRange(item, draftNumber);
  const out = entry?.outOfRange ?? false;
  const blocked = out && !entry?.override;
  const saveReading = () => {
    if (draftNumber === (entry?.value ?? null)) return;
    if (draftNumber !== null && !Number.isFinite(draftNumber)) return;
    onFill({ value: draftNumber });
  };

  const control = () => {
    if (!filling) {
      if (item.kind === 'photo')
        return entry?.hasPhoto ? (
          <Photo checklistId={checklistId} itemKey={item.key} stamp={entry.filledAt} />
        ) : (
          <Text c="dimmed">No photo.</Text>
        );
      return (
        <Group gap={8} align="baseline" wrap="wrap">
          {entry?.original && (
            <Text span className="cj-struck cj-num" fz="lg" aria-label={`as signed: ${valueWords(item, entry.original)}`}>
              {valueWords(item, entry.original)}
            </Text>
          )}
          <Text span className="cj-num" fz="xl" fw={600} c={blocked ? 'signal' : undefined}>
            {valueWords(item, entry)}
          </Text>
        </Group>
      );
    }
    switch (item.kind) {
      case 'tick': {
        const on = entry?.tick === true;
        return (
          <Button
            size="xl"
            h={60}
            miw={240}
            style={{ alignSelf: 'flex-start' }}
            variant={on ? 'filled' : 'default'}
            leftSection={on ? <IconCheck size={26} /> : <IconSquare size={26} />}
            onClick={() => onFill({ tick: !on })}
            loading={busy}
            aria-pressed={on}
          >
            {on ? 'Done' : 'Mark done'}
          </Button>
        );
      }
      case 'reading':
        return (
          <Group gap="sm" align="flex-end" wrap="nowrap">
            <NumberInput
              aria-label={`${item.label}, reading in ${checklistUnitText(item.unit) || 'units'}`}
              size="xl"
              w={200}
              value={draft}
              onChange={setDraft}
              onBlur={saveReading}
              onKeyDown={(e) => e.key === 'Enter' && saveReading()}
              inputMode="decimal"
              allowDecimal
              hideControls
              error={draftOut || blocked}
              classNames={{ input: 'cj-num' }}
              aria-describedby={`${item.key}-range`}
              data-testid={`reading-${item.key}`}
            />
            <Text fz="xl" pb={12}>
              {checklistUnitText(item.unit)}
            </Text>
            {busy && <Loader size="sm" mb={16} />}
          </Group>
        );
      case 'choice':
        return (
          <Group gap="sm" wrap="wrap" role="radiogroup" aria-label={item.label}>
            {(item.choices ?? []).map((ch) => {
              const chosen = entry?.choice === ch;
              const bad = chosen && (item.acceptable?.length ?? 0) > 0 && !item.acceptable!.includes(ch);
              return (
                <Button
                  key={ch}
                  size="lg"
                  h={56}
                  role="radio"
                  aria-checked={chosen}
                  variant={chosen ? 'filled' : 'default'}
                  color={bad ? 'signal' : undefined}
                  leftSection={chosen ? <IconCheck size={20} /> : undefined}
                  onClick={() => onFill({ choice: chosen ? null : ch })}
                  disabled={busy}
                >
                  {ch}
                </Button>
              );
            })}
          </Group>
        );
      case 'note':
        return (
          <Textarea
            label="Note"
            size="lg"
            autosize
            minRows={2}
            value={note}
            onChange={(e) => setNote(e.currentTarget.value)}
            onBlur={() => note.trim() !== (entry?.text ?? '') && onFill({ text: note.trim() ? note : null })}
          />
        );
      case 'photo':
        return (
          <Stack gap="xs">
            {entry?.hasPhoto && <Photo checklistId={checklistId} itemKey={item.key} stamp={entry.filledAt} />}
            <FileButton onChange={(f) => f && onPhoto(f)} accept="image/png,image/jpeg,image/webp" capture="environment">
              {(props) => (
                <Button {...props} size="lg" h={56} variant="default" leftSection={<IconCamera />} loading={busy} w="fit-content">
                  {entry?.hasPhoto ? 'Take another photo' : 'Take a photo'}
                </Button>
              )}
            </FileButton>
          </Stack>
        );
    }
  };

  return (
    <Paper
      withBorder
      p="md"
      radius="md"
      data-testid={`item-${item.key}`}
      data-done={entry?.done ? 'true' : 'false'}
      style={blocked ? { borderColor: 'var(--mantine-color-signal-6)', borderWidth: 2 } : undefined}
    >
      <Grid gap="md" align="flex-start">
        <Grid.Col span={{ base: 12, sm: item.caution ? 7 : 12 }}>
          <Stack gap="sm">
            <Group gap="xs" wrap="nowrap" align="flex-start">
              {entry?.done ? (
                <IconCircleCheck size={24} color="var(--mantine-color-copper-5)" aria-label="done" style={{ flex: 'none' }} />
              ) : (
                <IconSquare size={24} opacity={0.4} aria-label="not done" style={{ flex: 'none' }} />
              )}
              <Stack gap={2}>
                <Text fw={600} fz="lg">
                  {item.label}
                  {!item.required && (
                    <Text span c="dimmed" fz="sm" fw={400}>
                      {' '}
                      (optional)
                    </Text>
                  )}
                </Text>
                {item.help && (
                  <Text fz="sm" c="dimmed">
                    {item.help}
                  </Text>
                )}
              </Stack>
            </Group>
            {range && (
              <Text id={`${item.key}-range`} fz="md" fw={600} c={out || draftOut ? 'signal' : undefined}>
                Acceptance range: <span className="cj-num">{range}</span>
              </Text>
            )}
            {item.kind === 'choice' && (item.acceptable?.length ?? 0) > 0 && (
              <Text fz="sm" c={out ? 'signal' : 'dimmed'}>
                Acceptable: {item.acceptable!.join(', ')}
              </Text>
            )}
            {control()}
            {waiting && waiting.length > 0 && (
              <Text fz="sm" fw={600} data-testid={`waiting-${item.key}`}>
                Kept on this tablet, not yet on the server: {waiting.join(', then ')}. It counts once the server has it.
              </Text>
            )}
            {out && (
              <Group gap="xs" wrap="nowrap" align="flex-start">
                <IconAlertTriangle
                  size={20}
                  color={entry?.override ? 'var(--mantine-color-amber-6)' : 'var(--mantine-color-signal-6)'}
                  style={{ flex: 'none' }}
                  aria-hidden
                />
                {entry?.override ? (
                  <Text fz="sm" data-testid={`override-${item.key}`}>
                    {item.kind === 'choice' ? 'Not an acceptable option' : 'Outside the acceptance range'};{' '}
                    <b>accepted by {entry.override.byName}</b> (
                    {new Date(entry.override.at).toLocaleString(undefined, {
                      hour: '2-digit',
                      minute: '2-digit',
                      day: 'numeric',
                      month: 'short',
                    })}
                    ): “{entry.override.reason}”
                  </Text>
                ) : (
                  <Text fz="sm" c="signal" fw={600}>
                    {item.kind === 'choice' ? 'Not an acceptable option' : 'Outside the acceptance range'}: signing is blocked until it is
                    put right, or the chief engineer records an override with a reason.
                  </Text>
                )}
              </Group>
            )}
            {entry?.amendments.map((a) => (
              <Text key={a.id} fz="xs" c="dimmed">
                Amended {valueWords(item, a.oldValue)} → {valueWords(item, a.newValue)} by {a.byName},{' '}
                {new Date(a.at).toLocaleString(undefined, { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' })}: “
                {a.reason}”{a.overrideReason ? ` — accepted out of range: “${a.overrideReason}”` : ''}
              </Text>
            ))}
            {entry?.filledByName && filling && (
              <Text fz="xs" c="dimmed">
                {entry.filledByName}, {new Date(entry.filledAt!).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' })}
              </Text>
            )}
            <Group gap="sm">
              {filling && blocked && canOverride && (
                <Button variant="outline" color="amber" size="md" h={48} leftSection={<IconGavel size={18} />} onClick={onOverride}>
                  Record override
                </Button>
              )}
              {mode === 'signed' && canAmend && item.kind !== 'photo' && (
                <Button variant="subtle" size="md" h={48} leftSection={<IconPencil size={18} />} onClick={onAmend}>
                  Amend
                </Button>
              )}
            </Group>
          </Stack>
        </Grid.Col>
        {item.caution && (
          <Grid.Col span={{ base: 12, sm: 5 }}>
            <Caution title={`Caution — ${HAZARD_LABELS[item.caution.hazard]}`}>
              <Text fz="sm">{item.caution.text}</Text>
            </Caution>
          </Grid.Col>
        )}
      </Grid>
      {entry && !entry.done && mode !== 'fill' && item.required && (
        <Badge color="gray" variant="outline" mt="xs">
          Not done
        </Badge>
      )}
    </Paper>
  );
}
