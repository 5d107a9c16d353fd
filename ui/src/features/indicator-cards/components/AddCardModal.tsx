import { useEffect, useState } from 'react';
import { Alert, Button, Group, Modal, Stack } from '@mantine/core';
import type { CardSetDto, CylinderEnd } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { useAddCard } from '../api/indicator-cards.api';
import { endLabel } from '../model/format';
import { CardEditor } from './CardEditor';
import { draftFigures, emptyCard, type CardDraft } from './card-draft';

export interface MissingEnd {
  cylinderId: string;
  cylinderLabel: string;
  end: CylinderEnd;
}

/** Adds the card of an end the set does not have yet. */
export function AddCardModal({ set, missing, onClose }: { set: CardSetDto; missing: MissingEnd | null; onClose: () => void }) {
  const add = useAddCard(set.id);
  const [draft, setDraft] = useState<CardDraft>(emptyCard({ method: 'planimeter' }));
  useEffect(() => {
    if (!missing) return;
    const sibling = set.cards.find((c) => c.cylinderLabel === missing.cylinderLabel);
    setDraft(emptyCard({ method: 'planimeter', springPsiPerIn: sibling?.springPsiPerIn ?? '', lengthIn: sibling?.lengthIn ?? '' }));
    add.reset();
    // eslint-disable-next-line react-hooks/exhaustive-deps -- reset only for another missing end; a refetch must not wipe the draft
  }, [missing?.cylinderId, missing?.end]);
  if (!missing) return null;
  const title = `${missing.cylinderLabel} ${endLabel(missing.end).toLowerCase()}`;
  const figures = draftFigures(draft);
  return (
    <Modal opened onClose={onClose} title={`Add the ${title} card`} size="xl">
      <Stack>
        <CardEditor runId={set.runId} title={title} draft={draft} onChange={setDraft} allowNone={false} />
        {add.error && <Alert color="signal">{errorText(add.error)}</Alert>}
        <Group justify="flex-end">
          <Button variant="default" size="lg" onClick={onClose}>
            Cancel
          </Button>
          <Button
            size="lg"
            disabled={!figures}
            loading={add.isPending}
            onClick={() => figures && add.mutate({ ...figures, cylinderId: missing.cylinderId, end: missing.end }, { onSuccess: onClose })}
          >
            Add card
          </Button>
        </Group>
      </Stack>
    </Modal>
  );
}
