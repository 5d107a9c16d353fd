import { useEffect, useMemo, useState } from 'react';
import { Alert, Button, Group, NumberInput, Paper, SimpleGrid, Stack, Text, TextInput, Textarea, Title } from '@mantine/core';
import { IconDeviceFloppy } from '@tabler/icons-react';
import type { CardSetDto, CardSetPreviewDto, CreateCardSetRequest, CylinderEnd } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { Caution } from '../../../components/Caution/Caution';
import { previewCardSet, useCreateCardSet } from '../api/indicator-cards.api';
import { fmt } from '../model/format';
import { CardEditor } from './CardEditor';
import { cardMissing, draftToInput, emptyCard, type CardDraft } from './card-draft';

export const CARD_CAUTION =
  'Cards are taken at the cylinder cocks under live steam. Crankjournal aids a qualified crew; fitting ' +
  'and removing indicators follows the site procedure, local codes and licensed practice.';

type Num = number | '';
export interface SetDraft {
  /** Local date-time, as a datetime-local field holds it. */
  takenAt: string;
  speedRpm: Num;
  cutOffPercent: Num;
  throttlePressurePsig: Num;
  receiverPressurePsig: Num;
  vacuumInHg: Num;
  barometerInHg: Num;
  notes: string;
  cards: Record<string, CardDraft>;
}
export interface FormCylinder {
  id: string;
  label: string;
}

const ENDS: CylinderEnd[] = ['head', 'crank'];
export const cardKey = (cylinderId: string, end: CylinderEnd) => `${cylinderId}:${end}`;

/** Now, as a datetime-local value (local time, to the minute). */
export function localNow(d = new Date()): string {
  const p = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())}T${p(d.getHours())}:${p(d.getMinutes())}`;
}

const num = (v: Num) => (v === '' ? null : Number(v));

/** The request for the API: only the cards that are complete. */
export function toRequest(d: SetDraft, cylinders: FormCylinder[]): CreateCardSetRequest {
  const cards = cylinders.flatMap((c) =>
    ENDS.map((end) => draftToInput(d.cards[cardKey(c.id, end)], c.id, end)).filter((x): x is NonNullable<typeof x> => !!x),
  );
  const takenAt = new Date(d.takenAt);
  return {
    takenAt: Number.isNaN(takenAt.getTime()) ? new Date().toISOString() : takenAt.toISOString(),
    speedRpm: num(d.speedRpm),
    cutOffPercent: num(d.cutOffPercent),
    throttlePressurePsig: num(d.throttlePressurePsig),
    receiverPressurePsig: num(d.receiverPressurePsig),
    vacuumInHg: num(d.vacuumInHg),
    barometerInHg: num(d.barometerInHg),
    notes: d.notes.trim() || null,
    cards,
  };
}

/** A fresh set: every end not taken yet, springs and lengths as on the run's last set. */
export function newSetDraft(cylinders: FormCylinder[], previous?: CardSetDto): SetDraft {
  const cards: Record<string, CardDraft> = {};
  for (const c of cylinders)
    for (const end of ENDS) {
      const last = previous?.cards.find((k) => k.cylinderLabel === c.label && k.end === end);
      cards[cardKey(c.id, end)] = emptyCard({ springPsiPerIn: last?.springPsiPerIn ?? '', lengthIn: last?.lengthIn ?? '' });
    }
  return {
    takenAt: localNow(),
    speedRpm: '',
    cutOffPercent: previous?.cutOffPercent ?? '',
    throttlePressurePsig: '',
    receiverPressurePsig: '',
    vacuumInHg: '',
    barometerInHg: previous?.barometerSource === 'entered' ? (previous.barometerInHg ?? '') : '',
    notes: '',
    cards,
  };
}

/**
 * Taking a card set: the moment, speed and pressures (or the nearest readings), and a card per cylinder end,
 * worked out as they are entered.
 */
export function CardSetForm({
  runId,
  cylinders,
  previous,
  onSaved,
  onCancel,
}: {
  runId: string;
  cylinders: FormCylinder[];
  previous?: CardSetDto;
  onSaved: (s: CardSetDto) => void;
  onCancel: () => void;
}) {
  const [draft, setDraft] = useState<SetDraft>(() => newSetDraft(cylinders, previous));
  const [preview, setPreview] = useState<CardSetPreviewDto | null>(null);
  const [previewError, setPreviewError] = useState<string | null>(null);
  const create = useCreateCardSet(runId);
  const request = useMemo(() => toRequest(draft, cylinders), [draft, cylinders]);
  const requestKey = JSON.stringify(request);

  useEffect(() => {
    const ctrl = new AbortController();
    const timer = setTimeout(() => {
      previewCardSet(runId, request, ctrl.signal)
        .then((p) => {
          setPreview(p);
          setPreviewError(null);
        })
        .catch((e) => {
          if ((e as Error).name === 'AbortError') return;
          setPreview(null);
          setPreviewError(errorText(e));
        });
    }, 400);
    return () => {
      clearTimeout(timer);
      ctrl.abort();
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps -- requestKey: preview again only when the content changes
  }, [runId, requestKey]);

  const setCard = (key: string, next: CardDraft) => setDraft((d) => ({ ...d, cards: { ...d.cards, [key]: next } }));
  const numberField = (
    field: 'speedRpm' | 'cutOffPercent' | 'throttlePressurePsig' | 'receiverPressurePsig' | 'vacuumInHg' | 'barometerInHg',
  ) => ({
    value: draft[field],
    onChange: (v: string | number) => setDraft((d) => ({ ...d, [field]: v === '' ? '' : Number(v) })),
    inputMode: 'decimal' as const,
    hideControls: true,
    size: 'lg' as const,
  });

  const incomplete = cylinders.flatMap((c) =>
    ENDS.map((end) => {
      const m = cardMissing(draft.cards[cardKey(c.id, end)]);
      return m ? `${c.label} ${end} end: ${m}` : null;
    }).filter((x): x is string => !!x),
  );
  const figuresFor = (cylinderId: string, end: CylinderEnd) => {
    const card = preview?.cards.find((k) => k.cylinderId === cylinderId && k.end === end);
    if (!card) return null;
    const endResult = preview?.results.cylinders.find((c) => c.cylinderId === cylinderId)?.ends.find((e) => e.end === end);
    return { ...card, indicatedHorsepower: endResult?.indicatedHorsepower ?? null };
  };
  const save = () => create.mutate(request, { onSuccess: onSaved });
  const r = preview?.results;

  return (
    <Stack gap="md" data-testid="card-set-form">
      <Caution title="Live steam at the cocks">{CARD_CAUTION}</Caution>
      <Paper withBorder p="md" radius="md">
        <Title order={3} fz="lg" mb="sm">
          The moment
        </Title>
        <SimpleGrid cols={{ base: 2, sm: 3 }} spacing="sm">
          <TextInput
            type="datetime-local"
            label="Taken at"
            size="lg"
            value={draft.takenAt}
            onChange={(e) => setDraft((d) => ({ ...d, takenAt: e.currentTarget.value }))}
          />
          <NumberInput
            label="Speed, rpm"
            placeholder="nearest reading"
            description={
              preview?.speedSource === 'reading'
                ? `From the reading of ${clockTime(preview.speedReadingAt!)}: ${fmt(preview.speedRpm, 1)} rpm`
                : 'Leave empty to use the nearest speed reading'
            }
            {...numberField('speedRpm')}
          />
          <NumberInput label="Cut-off, % of stroke" placeholder="if known" min={1} max={100} {...numberField('cutOffPercent')} />
          <NumberInput
            label="Throttle, psig"
            placeholder="nearest reading"
            description={preview?.throttleSource === 'reading' ? `Reading: ${fmt(preview.throttlePressurePsig, 1)} psig` : undefined}
            {...numberField('throttlePressurePsig')}
          />
          <NumberInput
            label="Receiver, psig"
            placeholder="nearest reading"
            description={preview?.receiverSource === 'reading' ? `Reading: ${fmt(preview.receiverPressurePsig, 1)} psig` : undefined}
            {...numberField('receiverPressurePsig')}
          />
          <NumberInput
            label="Vacuum, inHg"
            placeholder="nearest reading"
            description={preview?.vacuumSource === 'reading' ? `Reading: ${fmt(preview.vacuumInHg, 1)} inHg` : undefined}
            {...numberField('vacuumInHg')}
          />
          <NumberInput
            label="Barometer, inHg"
            placeholder="nearest reading"
            description={
              preview?.barometerSource === 'reading'
                ? `Reading: ${fmt(preview.barometerInHg, 2)} inHg`
                : preview && preview.barometerInHg === null
                  ? 'None: the standard atmosphere, 29.92 inHg'
                  : undefined
            }
            {...numberField('barometerInHg')}
          />
        </SimpleGrid>
        <Textarea
          mt="sm"
          label="Notes"
          autosize
          minRows={1}
          value={draft.notes}
          onChange={(e) => setDraft((d) => ({ ...d, notes: e.currentTarget.value }))}
        />
      </Paper>

      {cylinders.map((c) =>
        ENDS.map((end) => {
          const key = cardKey(c.id, end);
          return (
            <CardEditor
              key={key}
              runId={runId}
              title={`${c.label} ${end} end`}
              draft={draft.cards[key]}
              onChange={(next) => setCard(key, next)}
              figures={figuresFor(c.id, end)}
              testId={`card-editor-${c.label}-${end}`}
            />
          );
        }),
      )}

      <Paper withBorder p="md" radius="md" data-testid="card-set-preview">
        {previewError ? (
          <Alert color="amber" variant="outline" title="Not worked out yet">
            {previewError}
          </Alert>
        ) : r ? (
          <Stack gap={4}>
            <Group gap="xl" align="baseline">
              <Text fz={36} fw={700} className="cj-num" data-testid="preview-total-ihp">
                {fmt(r.totalIndicatedHorsepower, 0)} ihp
              </Text>
              <Text fz="xl" className="cj-num" c="dimmed">
                {fmt(r.totalIndicatedKilowatts, 0)} kW at {fmt(r.speedRpm, 1)} rpm
              </Text>
              {r.referredMeanEffectivePressurePsi !== null && (
                <Text className="cj-num">
                  referred MEP {fmt(r.referredMeanEffectivePressurePsi, 1)} psi on {r.referredToCylinderLabel}
                </Text>
              )}
            </Group>
            {r.notes.map((n) => (
              <Text key={n} fz="sm" c="dimmed">
                {n}
              </Text>
            ))}
          </Stack>
        ) : (
          <Text c="dimmed">Enter the cards to see the power.</Text>
        )}
      </Paper>

      {create.error && (
        <Alert color="signal" title="Not saved">
          {errorText(create.error)}
        </Alert>
      )}
      {incomplete.length > 0 && (
        <Text fz="sm" c="dimmed">
          Complete these cards or mark them “Not taken” to save: {incomplete.join('; ')}.
        </Text>
      )}
      <Group justify="flex-end">
        <Button variant="default" size="lg" h={56} onClick={onCancel}>
          Cancel
        </Button>
        <Button
          size="lg"
          h={56}
          leftSection={<IconDeviceFloppy />}
          onClick={save}
          loading={create.isPending}
          disabled={request.cards.length === 0 || incomplete.length > 0}
        >
          Save card set
        </Button>
      </Group>
    </Stack>
  );
}

function clockTime(iso: string): string {
  return new Date(iso).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' });
}
