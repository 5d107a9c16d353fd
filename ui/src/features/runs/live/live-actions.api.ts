import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AmendReadingRequest, ReadingDto } from '@crankjournal/shared-types';
import { api } from '../../../api/http';
import { runKeys } from '../api/runs.api';
import { replaceReading } from './live-cache';

export const amendReading = (id: string, req: AmendReadingRequest) => api<ReadingDto>(`/readings/${id}/amendments`, { body: req });

/** Records an amendment (new value and reason); the original stays on the reading. */
export function useAmendReading(runId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ reading, value, reason }: { reading: ReadingDto; value: number; reason: string }) =>
      amendReading(reading.id, { value, reason }),
    onSuccess: (r) => {
      qc.setQueriesData<ReadingDto[]>({ queryKey: runKeys.readingsAll(runId) }, (old) => replaceReading(old, r));
      void qc.invalidateQueries({ queryKey: runKeys.board(runId) });
      void qc.invalidateQueries({ queryKey: runKeys.alarms(runId) });
    },
  });
}
