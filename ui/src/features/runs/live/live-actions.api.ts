import { useMutation, useQueryClient } from '@tanstack/react-query';
import dayjs from 'dayjs';
import type { AmendReadingRequest, ReadingDto } from '@crankjournal/shared-types';
import { newClientId, outbox, type OutboxRequest } from '../../../api/outbox';
import { runKeys } from '../api/runs.api';
import { replaceReading } from './live-cache';

/** The outbox request of an amendment; its clientId makes a resend store it once. */
export function amendmentRequest(reading: ReadingDto, pointLabel: string, req: AmendReadingRequest): OutboxRequest {
  return {
    kind: 'reading-amendment',
    label: `Amendment: ${pointLabel} at ${dayjs(reading.takenAt).format('HH:mm:ss')} to ${req.value}`,
    runId: reading.runId,
    path: `/readings/${reading.id}/amendments`,
    method: 'POST',
    body: req,
    ref: { readingId: reading.id },
  };
}

/**
 * An amendment: sent now, or kept on the tablet when the server cannot be reached (then null) and sent when it
 * answers, in order with the rest of the outbox.
 */
export async function amendOrQueue(reading: ReadingDto, pointLabel: string, value: number, reason: string): Promise<ReadingDto | null> {
  const o = await outbox().submitRequest<ReadingDto>(amendmentRequest(reading, pointLabel, { value, reason, clientId: newClientId() }));
  return o.kind === 'sent' ? o.result : null;
}

/** Records an amendment (new value and reason; kept on the tablet while offline); the original stays on the reading. */
export function useAmendReading(runId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ reading, pointLabel, value, reason }: { reading: ReadingDto; pointLabel: string; value: number; reason: string }) =>
      amendOrQueue(reading, pointLabel, value, reason),
    onSuccess: (r) => {
      if (!r) return; // kept on the tablet: the readings table marks it waiting
      qc.setQueriesData<ReadingDto[]>({ queryKey: runKeys.readingsAll(runId) }, (old) => replaceReading(old, r));
      void qc.invalidateQueries({ queryKey: runKeys.board(runId) });
      void qc.invalidateQueries({ queryKey: runKeys.alarms(runId) });
    },
  });
}
