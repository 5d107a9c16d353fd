import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { AlarmDto, ShelveAlarmRequest } from '@crankjournal/shared-types';
import { api, withQuery } from '../../../api/http';
import { outbox } from '../../../api/outbox';
import { runKeys } from '../../runs/api/runs.api';

/** Open alarms of an engine, whichever run raised them (an alarm stays open across runs until it is cleared and acknowledged). */
export const openAlarmKeys = {
  engine: (engineId: string) => ['alarms', 'open', { engineId }] as const,
};
/** A run's own alarms together with the engine's open ones (latest copy of each). */
export function mergeAlarms(...lists: (AlarmDto[] | undefined)[]): AlarmDto[] {
  const m = new Map<string, AlarmDto>();
  for (const list of lists)
    for (const a of list ?? []) {
      const cur = m.get(a.id);
      if (!cur || cur.updatedAt <= a.updatedAt) m.set(a.id, a);
    }
  return [...m.values()];
}

/** Puts a changed alarm into a list (newest first), unless the list already holds a later copy. */
export function upsertAlarm(list: AlarmDto[] | undefined, alarm: AlarmDto): AlarmDto[] | undefined {
  if (!list) return list;
  const i = list.findIndex((a) => a.id === alarm.id);
  if (i === -1) return [alarm, ...list];
  if (list[i].updatedAt > alarm.updatedAt) return list; // an older event arriving late
  const next = [...list];
  next[i] = alarm;
  return next;
}

export const openEngineAlarmsQuery = (engineId: string) =>
  queryOptions({
    queryKey: openAlarmKeys.engine(engineId),
    queryFn: () => api<AlarmDto[]>(withQuery('/alarms', { engineId, open: true })),
  });

export const acknowledgeAlarm = (id: string) => api<AlarmDto>(`/alarms/${id}/acknowledge`, { method: 'POST' });
export const shelveAlarm = (id: string, req: ShelveAlarmRequest) => api<AlarmDto>(`/alarms/${id}/shelve`, { body: req });
export const unshelveAlarm = (id: string) => api<AlarmDto>(`/alarms/${id}/unshelve`, { method: 'POST' });

type AlarmAction = { alarm: AlarmDto } & (
  { kind: 'acknowledge' } | { kind: 'unshelve' } | { kind: 'shelve'; reason: string; minutes: number }
);

/**
 * An acknowledgement: sent now, or kept on the tablet when the server cannot be reached (then null) and sent when it
 * answers. Acknowledging an alarm twice leaves it acknowledged once.
 */
export async function acknowledgeOrQueue(alarm: AlarmDto): Promise<AlarmDto | null> {
  const o = await outbox().submitRequest<AlarmDto>({
    kind: 'alarm-ack',
    label: `Acknowledge alarm: ${alarm.pointLabel}`,
    runId: alarm.runId,
    path: `/alarms/${alarm.id}/acknowledge`,
    method: 'POST',
    ref: { alarmId: alarm.id },
  });
  return o.kind === 'sent' ? o.result : null;
}

/** Acknowledge, shelve and unshelve a run's alarms; the answer goes straight into the cache (null: kept on the tablet). */
export function useAlarmAction(runId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (a: AlarmAction): Promise<AlarmDto | null> =>
      a.kind === 'acknowledge'
        ? acknowledgeOrQueue(a.alarm)
        : a.kind === 'unshelve'
          ? unshelveAlarm(a.alarm.id)
          : shelveAlarm(a.alarm.id, { reason: a.reason, minutes: a.minutes }),
    onSuccess: (alarm) => {
      if (!alarm) return;
      if (alarm.runId === runId) qc.setQueryData<AlarmDto[]>(runKeys.alarms(runId), (old) => upsertAlarm(old, alarm));
      qc.setQueryData<AlarmDto[]>(openAlarmKeys.engine(alarm.engineId), (old) => upsertAlarm(old, alarm));
      void qc.invalidateQueries({ queryKey: runKeys.board(runId) });
      void qc.invalidateQueries({ queryKey: runKeys.detail(runId) });
    },
  });
}
