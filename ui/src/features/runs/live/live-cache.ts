import type { QueryClient } from '@tanstack/react-query';
import type { BoardPoint, ReadingDto, ReadingsEvent } from '@crankjournal/shared-types';
import { runKeys } from '../api/runs.api';

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
    return {
      ...b,
      value: last.value,
      unit: last.unit,
      takenAt: last.takenAt,
      trend: [...b.trend, ...mine.map((r) => r.value)].slice(-BOARD_TREND_LENGTH),
    };
  });
  return changed ? next : board;
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
