import { useEffect, useState } from 'react';
import { Alert, Button, Group, Modal, Stack, Text, Textarea } from '@mantine/core';
import type { CardDto, CardSetDto, CardSetPreviewDto } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { previewCardSet, useAmendCard } from '../api/indicator-cards.api';
import { cardTitle, fmt } from '../model/format';
import { CardEditor } from './CardEditor';
import { cardToDraft, draftFigures, type CardDraft } from './card-draft';

/**
 * Corrects a card (new figures in full, or a trace reviewed and moved) with a reason. The earlier figures
 * stay in the record beside the new ones, with who, when and why.
 */
export function AmendCardModal({ set, card, onClose }: { set: CardSetDto; card: CardDto | null; onClose: () => void }) {
  const [draft, setDraft] = useState<CardDraft | null>(null);
  const [reason, setReason] = useState('');
  const [preview, setPreview] = useState<CardSetPreviewDto | null>(null);
  const [previewError, setPreviewError] = useState<string | null>(null);
  const amend = useAmendCard();

  useEffect(() => {
    setDraft(card ? cardToDraft(card) : null);
    setReason('');
    setPreview(null);
    amend.reset();
    // eslint-disable-next-line react-hooks/exhaustive-deps -- reset only for another card; a refetch must not wipe the draft
  }, [card?.id]);

  const figures = draft ? draftFigures(draft) : null;
  const key = JSON.stringify(figures);
  useEffect(() => {
    if (!card || !figures) return;
    const ctrl = new AbortController();
    const t = setTimeout(() => {
      previewCardSet(
        set.runId,
        {
          takenAt: set.takenAt,
          speedRpm: set.speedRpm,
          cutOffPercent: set.cutOffPercent,
          throttlePressurePsig: set.throttlePressurePsig,
          receiverPressurePsig: set.receiverPressurePsig,
          vacuumInHg: set.vacuumInHg,
          barometerInHg: set.barometerInHg,
          cards: [{ ...figures, cylinderId: card.cylinderId ?? '', end: card.end }],
        },
        ctrl.signal,
      )
        .then((p) => {
          setPreview(p);
          setPreviewError(null);
        })
        .catch((e) => {
          if ((e as Error).name !== 'AbortError') setPreviewError(errorText(e));
        });
    }, 400);
    return () => {
      clearTimeout(t);
      ctrl.abort();
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps -- key is the JSON of the figures: preview only when they change
  }, [key, card?.id]);

  if (!card || !draft) return null;
  const previewCard = preview?.cards[0];
  const previewEnd = preview?.results.cylinders.flatMap((c) => c.ends)[0];
  const save = () => figures && amend.mutate({ cardId: card.id, req: { ...figures, reason: reason.trim() } }, { onSuccess: onClose });

  return (
    <Modal
      opened
      onClose={onClose}
      title={`Amend the ${cardTitle(card)} card`}
      size="xl"
      fullScreen={typeof window !== 'undefined' && window.innerWidth < 900}
    >
      <Stack gap="md">
        <Text fz="sm" c="dimmed">
          Recorded now: MEP {fmt(card.meanEffectivePressurePsi, 1)} psi. The amendment keeps this figure in the record beside the new one,
          with your name, the time and your reason.
        </Text>
        <CardEditor
          runId={set.runId}
          title={cardTitle(card)}
          draft={draft}
          onChange={setDraft}
          allowNone={false}
          figures={previewCard ? { ...previewCard, indicatedHorsepower: previewEnd?.indicatedHorsepower ?? null } : null}
        />
        {previewError && <Alert color="amber">{previewError}</Alert>}
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
          <Button size="lg" onClick={save} disabled={!figures || reason.trim().length < 3} loading={amend.isPending}>
            Save amendment
          </Button>
        </Group>
      </Stack>
    </Modal>
  );
}
