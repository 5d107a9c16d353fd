import { useEffect, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Loader, Modal, Text } from '@mantine/core';
import type { CardDto } from '@crankjournal/shared-types';
import { cardImageQuery } from '../api/indicator-cards.api';
import { cardTitle } from '../model/format';
import { CardTracer } from './CardTracer';
import { fromCardTrace } from './trace-model';

/** The stored image with the trace made on it, for review (read-only). */
export function TraceReviewModal({ card, onClose }: { card: CardDto | null; onClose: () => void }) {
  const image = useQuery({ ...cardImageQuery(card?.imageId ?? ''), enabled: !!card?.imageId });
  const [size, setSize] = useState<{ w: number; h: number } | null>(null);
  useEffect(() => {
    setSize(null);
    if (!image.data) return;
    const img = new Image();
    img.onload = () => setSize({ w: img.naturalWidth, h: img.naturalHeight });
    img.src = image.data;
  }, [image.data]);
  if (!card) return null;
  return (
    <Modal opened onClose={onClose} title={`Trace of the ${cardTitle(card)} card`} size="xl">
      {image.data && size ? (
        <CardTracer
          imageUrl={image.data}
          widthPx={size.w}
          heightPx={size.h}
          value={fromCardTrace(card.trace)}
          onChange={() => {}}
          readOnly
        />
      ) : image.error ? (
        <Text c="signal">The image could not be loaded.</Text>
      ) : (
        <Loader />
      )}
    </Modal>
  );
}
