import { useEffect, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { AlarmDto, ReadingDto, ReadingsEvent, RunDetail } from '@crankjournal/shared-types';
import { getSocket, joinRoom } from '../../../api/socket';
import { runKeys, useApplyRun } from '../api/runs.api';
import { openAlarmKeys, upsertAlarm } from '../../alarms/api/alarms.api';
import { applyReadings, replaceReading } from './live-cache';

/**
 * Keeps a run's queries current from the live channel: joins `run:<id>`, applies readings, amendments,
 * alarm and run changes to the cache, and refetches everything after a reconnect to catch up.
 * Returns whether the live channel is connected.
 */
export function useLiveRun(runId: string, engineId?: string): { connected: boolean } {
  const qc = useQueryClient();
  const applyRun = useApplyRun();
  const [connected, setConnected] = useState(() => getSocket()?.connected ?? false);

  useEffect(() => {
    const socket = getSocket();
    if (!socket || !runId) return;
    const leave = joinRoom(`run:${runId}`);
    // Alarms belong to the engine: one raised on an earlier run can come back during this one.
    const leaveEngine = engineId ? joinRoom(`engine:${engineId}`) : () => {};
    // A connect we did not start connected for means events may have been missed: catch up.
    let missed = !socket.connected;

    const onReadings = (e: ReadingsEvent) => applyReadings(qc, runId, e);
    const onAmended = (r: ReadingDto) => {
      if (r.runId !== runId) return;
      qc.setQueriesData<ReadingDto[]>({ queryKey: runKeys.readingsAll(runId) }, (old) => replaceReading(old, r));
      void qc.invalidateQueries({ queryKey: runKeys.board(runId) });
    };
    const onAlarm = (a: AlarmDto) => {
      if (engineId && a.engineId === engineId) qc.setQueryData<AlarmDto[]>(openAlarmKeys.engine(engineId), (old) => upsertAlarm(old, a));
      if (a.runId !== runId) return;
      qc.setQueryData<AlarmDto[]>(runKeys.alarms(runId), (old) => upsertAlarm(old, a));
      void qc.invalidateQueries({ queryKey: runKeys.board(runId) });
      void qc.invalidateQueries({ queryKey: runKeys.detail(runId) });
    };
    const onRun = (r: RunDetail) => {
      if (r.id === runId) applyRun(r);
    };
    // Asks again for what was read before the room was joined. A read still on its way (the page's first, on a cold
    // start) is not cut off and started over, which would hold the screen back: it is asked for again once it is in.
    const catchUp = (queryKey: readonly unknown[]) => {
      const onTheWay = qc.getQueryCache().findAll({ queryKey, fetchStatus: 'fetching' });
      void qc.invalidateQueries({ queryKey }, { cancelRefetch: false }).then(() => {
        for (const q of onTheWay) void qc.refetchQueries({ queryKey: q.queryKey, exact: true }, { cancelRefetch: false });
      });
    };
    const onConnect = () => {
      setConnected(true);
      if (missed) {
        catchUp(runKeys.run(runId));
        if (engineId) catchUp(openAlarmKeys.engine(engineId));
      }
      missed = false;
    };
    const onDisconnect = () => {
      setConnected(false);
      missed = true;
    };

    socket.on('readings:new', onReadings);
    socket.on('reading:amended', onAmended);
    socket.on('alarm:changed', onAlarm);
    socket.on('run:changed', onRun);
    socket.on('connect', onConnect);
    socket.on('disconnect', onDisconnect);
    setConnected(socket.connected);
    return () => {
      socket.off('readings:new', onReadings);
      socket.off('reading:amended', onAmended);
      socket.off('alarm:changed', onAlarm);
      socket.off('run:changed', onRun);
      socket.off('connect', onConnect);
      socket.off('disconnect', onDisconnect);
      leave();
      leaveEngine();
    };
  }, [runId, engineId, qc, applyRun]);

  return { connected };
}
