import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { AlarmDto, AmendReadingRequest, ReadingDto, ShelveAlarmRequest } from '@crankjournal/shared-types';
import { api, withQuery } from '../../../api/http';
import { runKeys } from '../api/runs.api';
import { openAlarmKeys, replaceReading, upsertAlarm } from './live-cache';

export { mergeAlarms, openAlarmKeys } from './live-cache';

export const openEngineAlarmsQuery = (engineId: string) =>
  queryOptions({
    queryKey: openAlarmKeys.engine(engineId),
    queryFn: () => api<AlarmDto[]>(withQuery('/alarms', { engineId, open: true })),
  });

export const acknowledgeAlarm = (id: string) => api<AlarmDto>(`/alarms/${id}/acknowledge`, { method: 'POST' });
export const shelveAlarm = (id: string, req: ShelveAlarmRequest) => api<AlarmDto>(`/alarms/${id}/shelve`, { body: req });
export const unshelveAlarm = (id: string) => api<AlarmDto>(`/alarms/${id}/unshelve`, { method: 'POST' });
export const amendReading = (id: string, req: AmendReadingRequest) => api<ReadingDto>(`/readings/${id}/amendments`, { body: req });

type AlarmAction = { alarm: AlarmDto } & (
  { kind: 'acknowledge' } | { kind: 'unshelve' } | { kind: 'shelve'; reason: string; minutes: number }
);

/** Acknowledge, shelve and unshelve a run's alarms; the answer goes straight into the cache. */
export function useAlarmAction(runId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (a: AlarmAction) =>
      a.kind === 'acknowledge'
        ? acknowledgeAlarm(a.alarm.id)
        : a.kind === 'unshelve'
          ? unshelveAlarm(a.alarm.id)
          : shelveAlarm(a.alarm.id, { reason: a.reason, minutes: a.minutes }),
    onSuccess: (alarm) => {
      if (alarm.runId === runId) qc.setQueryData<AlarmDto[]>(runKeys.alarms(runId), (old) => upsertAlarm(old, alarm));
      qc.setQueryData<AlarmDto[]>(openAlarmKeys.engine(alarm.engineId), (old) => upsertAlarm(old, alarm));
      void qc.invalidateQueries({ queryKey: runKeys.board(runId) });
      void qc.invalidateQueries({ queryKey: runKeys.detail(runId) });
    },
  });
}

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
