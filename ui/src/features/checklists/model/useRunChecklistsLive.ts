import { useEffect } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { RunDetail, RunRecordEvent } from '@crankjournal/shared-types';
import { getSocket, joinRoom } from '../../../api/socket';
import { runKeys, useApplyRun } from '../../runs/api/runs.api';
import { checklistKeys } from '../api/checklists.api';

/** Keeps a run's checklists and state current from the live channel (other tablets filling and signing). */
export function useRunChecklistsLive(runId: string) {
  const qc = useQueryClient();
  const applyRun = useApplyRun();
  useEffect(() => {
    const socket = getSocket();
    if (!socket || !runId) return;
    const leave = joinRoom(`run:${runId}`);
    const onRecord = (e: RunRecordEvent) => {
      if (e.runId !== runId || e.kind !== 'checklist') return;
      void qc.invalidateQueries({ queryKey: checklistKeys.runOverview(runId) });
      void qc.invalidateQueries({ queryKey: checklistKeys.checklist(e.id) });
      void qc.invalidateQueries({ queryKey: runKeys.startGate(runId) });
    };
    const onRun = (r: RunDetail) => {
      if (r.id !== runId) return;
      applyRun(r);
      void qc.invalidateQueries({ queryKey: checklistKeys.runOverview(runId) });
    };
    socket.on('run:record', onRecord);
    socket.on('run:changed', onRun);
    return () => {
      socket.off('run:record', onRecord);
      socket.off('run:changed', onRun);
      leave();
    };
  }, [runId, qc, applyRun]);
}
