import { useEffect } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { RunRecordEvent } from '@crankjournal/shared-types';
import { getSocket, joinRoom, type LiveSocket } from '../../../api/socket';
import { millKeys } from './mill.api';

function alreadyJoined(socket: LiveSocket, room: string): boolean {
  return (socket as LiveSocket & { _rooms?: Set<string> })._rooms?.has(room) ?? false;
}

/** Keeps a run's rolling log and timeline current: passes and bars ('run:record'), readings and alarms. */
export function useMillRunLive(runId: string) {
  const qc = useQueryClient();
  useEffect(() => {
    const socket = getSocket();
    if (!socket || !runId) return;
    const room = `run:${runId}`;
    const leave = alreadyJoined(socket, room) ? () => {} : joinRoom(room);
    const refresh = () => void qc.invalidateQueries({ queryKey: millKeys.run(runId) });
    const onRecord = (e: RunRecordEvent) => {
      if (e.runId === runId && e.kind.startsWith('mill-')) refresh();
    };
    const onReadings = (e: { runId: string }) => {
      if (e.runId === runId) void qc.invalidateQueries({ queryKey: millKeys.timeline(runId) });
    };
    const onAlarm = (a: { runId: string | null }) => {
      if (a.runId === runId) void qc.invalidateQueries({ queryKey: millKeys.timeline(runId) });
    };
    const onRun = (r: { id: string }) => {
      if (r.id === runId) refresh();
    };
    socket.on('run:record', onRecord);
    socket.on('readings:new', onReadings);
    socket.on('alarm:changed', onAlarm);
    socket.on('run:changed', onRun);
    socket.on('connect', refresh);
    return () => {
      socket.off('run:record', onRecord);
      socket.off('readings:new', onReadings);
      socket.off('alarm:changed', onAlarm);
      socket.off('run:changed', onRun);
      socket.off('connect', refresh);
      leave();
    };
  }, [runId, qc]);
}
