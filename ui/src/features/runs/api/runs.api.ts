import { useCallback } from 'react';
import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  AlarmDto,
  BoardPoint,
  CreateRunRequest,
  ReadingDto,
  RunDetail,
  RunDetailWithEngine,
  RunState,
  RunSummary,
  RunTransitionRequest,
  StartGateVerdict,
  UpdateRunRequest,
} from '@crankjournal/shared-types';
import { api, withQuery, download, HttpError } from '../../../api/http';
import { engineKeys } from '../../engines/api/engines.api';

export interface RunFilters {
  engineId?: string;
  state?: RunState;
}
export interface ReadingFilters {
  /** ISO time: only readings taken after it. */
  since?: string;
  pointId?: string;
}

/** Keys: everything about one run sits under ['runs', id], so invalidating that refreshes all of it. */
export const runKeys = {
  all: ['runs'] as const,
  lists: () => [...runKeys.all, 'list'] as const,
  list: (f: RunFilters = {}) => [...runKeys.lists(), { engineId: f.engineId ?? null, state: f.state ?? null }] as const,
  run: (id: string) => [...runKeys.all, id] as const,
  detail: (id: string) => [...runKeys.run(id), 'detail'] as const,
  board: (id: string) => [...runKeys.run(id), 'board'] as const,
  readingsAll: (id: string) => [...runKeys.run(id), 'readings'] as const,
  readings: (id: string, f: ReadingFilters = {}) =>
    [...runKeys.readingsAll(id), { since: f.since ?? null, pointId: f.pointId ?? null }] as const,
  alarms: (id: string) => [...runKeys.run(id), 'alarms'] as const,
  startGate: (id: string) => [...runKeys.run(id), 'start-gate'] as const,
};

export const runsListQuery = (f: RunFilters = {}) =>
  queryOptions({
    queryKey: runKeys.list(f),
    queryFn: () => api<RunSummary[]>(withQuery('/runs', { engineId: f.engineId, state: f.state })),
  });
/**
 * The run's answer carries its engine's detail: it goes into the engine's own cache entry (so a run's page asks for the
 * engine not at all), and the run's entry keeps the run alone, as the answers of a change give it.
 */
export const runDetailQuery = (id: string) =>
  queryOptions({
    queryKey: runKeys.detail(id),
    queryFn: async ({ client }): Promise<RunDetail> => {
      const { engine, ...run } = await api<RunDetailWithEngine>(`/runs/${id}`);
      client.setQueryData(engineKeys.detail(engine.id), engine);
      return run;
    },
  });
export const runBoardQuery = (id: string) =>
  queryOptions({ queryKey: runKeys.board(id), queryFn: () => api<BoardPoint[]>(`/runs/${id}/board`) });
export const runReadingsQuery = (id: string, f: ReadingFilters = {}) =>
  queryOptions({
    queryKey: runKeys.readings(id, f),
    queryFn: () => api<ReadingDto[]>(withQuery(`/runs/${id}/readings`, { since: f.since, pointId: f.pointId })),
  });
export const runAlarmsQuery = (id: string) =>
  queryOptions({ queryKey: runKeys.alarms(id), queryFn: () => api<AlarmDto[]>(`/runs/${id}/alarms`) });
export const startGateQuery = (id: string) =>
  queryOptions({ queryKey: runKeys.startGate(id), queryFn: () => api<StartGateVerdict>(`/runs/${id}/start-gate`), staleTime: 5_000 });

export const createRun = (req: CreateRunRequest) => api<RunDetail>('/runs', { body: req });
export const updateRun = (id: string, req: UpdateRunRequest) => api<RunDetail>(`/runs/${id}`, { method: 'PATCH', body: req });
export const transitionRun = (id: string, req: RunTransitionRequest) => api<RunDetail>(`/runs/${id}/transitions`, { body: req });
export const downloadReadingsCsv = (id: string) => download(`/runs/${id}/readings.csv`, `run-${id}-readings.csv`);
export const downloadLogSheet = (id: string) => download(`/runs/${id}/log-sheet.pdf`, `run-${id}-log-sheet.pdf`);

/** The start gate's verdict when a start was refused (409 with details), else null. */
export function startRefusal(e: unknown): StartGateVerdict | null {
  if (!(e instanceof HttpError) || e.status !== 409) return null;
  const d = e.body?.details as Partial<StartGateVerdict> | undefined;
  if (!d || !Array.isArray(d.reasons)) return null;
  return { allowed: false, reasons: d.reasons, preLubeFreshUntil: d.preLubeFreshUntil ?? null };
}

/** Puts a changed run into the cache (e.g. from the 'run:changed' live event) and refreshes the lists. */
export function useApplyRun() {
  const qc = useQueryClient();
  return useCallback(
    (run: RunDetail) => {
      qc.setQueryData(runKeys.detail(run.id), run);
      void qc.invalidateQueries({ queryKey: runKeys.lists() });
      void qc.invalidateQueries({ queryKey: runKeys.startGate(run.id) });
      void qc.invalidateQueries({ queryKey: engineKeys.list() });
    },
    [qc],
  );
}

export function useCreateRun() {
  const apply = useApplyRun();
  return useMutation({ mutationFn: createRun, onSuccess: apply });
}
export function useUpdateRun(id: string) {
  const apply = useApplyRun();
  return useMutation({ mutationFn: (req: UpdateRunRequest) => updateRun(id, req), onSuccess: apply });
}
export function useTransitionRun(id: string) {
  const apply = useApplyRun();
  return useMutation({ mutationFn: (req: RunTransitionRequest) => transitionRun(id, req), onSuccess: apply });
}
