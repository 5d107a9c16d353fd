import { useEffect, useState } from 'react';
import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { AlarmDto, BoardPoint, ReadingDto, ReadingsEvent, RunDetail } from '@crankjournal/shared-types';
import { getSocket, joinRoom } from '../../../api/socket';
import { runKeys, useApplyRun } from '../api/runs.api';

/** How many recent values the board keeps per point for its sparkline (the server sends the last 20). */
export const BOARD_TREND_LENGTH = 20;

const byTakenAt = (a: ReadingDto, b: ReadingDto) => a.takenAt.localeCompare(b.takenAt);

/** Merges new readings into a run's reading list (ascending takenAt), once each. */
export function mergeReadings(list: ReadingDto[] | undefined, incoming: ReadingDto[]): ReadingDto[] | undefined {
  if (!list) return list;
  const known = new Set(list.map((r) => r.id));
  const fresh = incoming.filter((r) => !known.has(r.id));
  if (fresh.length === 0) return list;
  const last = list.at(-1)?.takenAt ?? '';
  const inOrder = fresh.every((r) => r.takenAt >= last);
  return inOrder ? [...list, ...[...fresh].sort(byTakenAt)] : [...list, ...fresh].sort(byTakenAt);
}

/** Moves the board's latest value and trend on with new readings (alarm states come with 'alarm:changed'). */
export function advanceBoard(board: BoardPoint[] | undefined, incoming: ReadingDto[]): BoardPoint[] | undefined {
  if (!board) return board;
  const sorted = [...incoming].sort(byTakenAt);
  let changed = false;
  const next = board.map((b) => {
    const mine = sorted.filter((r) => r.pointId === b.pointId && (!b.takenAt || r.takenAt >= b.takenAt));
    if (mine.length === 0) return b;
    changed = true;
    const last = mine.at(-1)!;
    return { ...b, value: last.value, unit: last.unit, takenAt: last.takenAt, trend: [...b.trend, ...mine.map((r) => r.value)].slice(-BOARD_TREND_LENGTH) };
  });
  return changed ? next : board;
}

export function upsertAlarm(list: AlarmDto[] | undefined, alarm: AlarmDto): AlarmDto[] | undefined {
  if (!list) return list;
  const i = list.findIndex((a) => a.id === alarm.id);
  if (i === -1) return [alarm, ...list];
  if (list[i].updatedAt > alarm.updatedAt) return list; // an older event arriving late
  const next = [...list];
  next[i] = alarm;
  return next;
}

export function replaceReading(list: ReadingDto[] | undefined, reading: ReadingDto): ReadingDto[] | undefined {
  if (!list) return list;
  return list.map((r) => (r.id === reading.id ? reading : r));
}

/** Applies the live events of one run to the query cache. Exported for tests. */
export function applyReadings(qc: QueryClient, runId: string, e: ReadingsEvent) {
  if (e.runId !== runId || e.readings.length === 0) return;
  qc.setQueriesData<ReadingDto[]>({ queryKey: runKeys.readingsAll(runId) }, (old) => mergeReadings(old, e.readings));
  qc.setQueryData<BoardPoint[]>(runKeys.board(runId), (old) => advanceBoard(old, e.readings));
}

/**
 * Keeps a run's queries current from the live channel: joins `run:<id>`, applies readings, amendments,
 * alarm and run changes to the cache, and refetches everything after a reconnect to catch up.
 * Returns whether the live channel is connected.
 */
export function useLiveRun(runId: string): { connected: boolean } {
  const qc = useQueryClient();
  const applyRun = useApplyRun();
  const [connected, setConnected] = useState(() => getSocket()?.connected ?? false);

  useEffect(() => {
    const socket = getSocket();
    if (!socket || !runId) return;
    const leave = joinRoom(`run:${runId}`);
    // A connect we did not start connected for means events may have been missed: catch up.
    let missed = !socket.connected;

    const onReadings = (e: ReadingsEvent) => applyReadings(qc, runId, e);
    const onAmended = (r: ReadingDto) => {
      if (r.runId !== runId) return;
      qc.setQueriesData<ReadingDto[]>({ queryKey: runKeys.readingsAll(runId) }, (old) => replaceReading(old, r));
      qc.invalidateQueries({ queryKey: runKeys.board(runId) });
    };
    const onAlarm = (a: AlarmDto) => {
      if (a.runId !== runId) return;
      qc.setQueryData<AlarmDto[]>(runKeys.alarms(runId), (old) => upsertAlarm(old, a));
      qc.invalidateQueries({ queryKey: runKeys.board(runId) });
      qc.invalidateQueries({ queryKey: runKeys.detail(runId) });
    };
    const onRun = (r: RunDetail) => {
      if (r.id === runId) applyRun(r);
    };
    const onConnect = () => {
      setConnected(true);
      if (missed) qc.invalidateQueries({ queryKey: runKeys.run(runId) });
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
    };
    // applyRun is a new function each render; the handlers only need the latest query client.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [runId, qc]);

  return { connected };
}
