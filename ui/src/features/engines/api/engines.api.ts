import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { EngineDetail, EngineSummary, EngineWriteRequest, LimitChangeDto } from '@crankjournal/shared-types';
import { api } from '../../../api/http';

export const engineKeys = {
  all: ['engines'] as const,
  list: () => [...engineKeys.all, 'list'] as const,
  engine: (id: string) => [...engineKeys.all, id] as const,
  detail: (id: string) => [...engineKeys.engine(id), 'detail'] as const,
  limitChanges: (id: string) => [...engineKeys.engine(id), 'limit-changes'] as const,
};

export const enginesListQuery = () => queryOptions({ queryKey: engineKeys.list(), queryFn: () => api<EngineSummary[]>('/engines') });
export const engineDetailQuery = (id: string) =>
  queryOptions({ queryKey: engineKeys.detail(id), queryFn: () => api<EngineDetail>(`/engines/${id}`) });
export const engineLimitChangesQuery = (id: string) =>
  queryOptions({ queryKey: engineKeys.limitChanges(id), queryFn: () => api<LimitChangeDto[]>(`/engines/${id}/limit-changes`) });

export const createEngine = (req: EngineWriteRequest) => api<EngineDetail>('/engines', { body: req });
/** Replaces the engine and its parts: parts with an id are updated, without one created; omitted measurement points are retired. */
export const updateEngine = (id: string, req: EngineWriteRequest) => api<EngineDetail>(`/engines/${id}`, { method: 'PUT', body: req });

/** Creates (no id) or replaces (id) an engine and refreshes what depends on it. */
export function useSaveEngine(id: string | undefined) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (req: EngineWriteRequest) => (id ? updateEngine(id, req) : createEngine(req)),
    onSuccess: (engine) => {
      qc.setQueryData(engineKeys.detail(engine.id), engine);
      void qc.invalidateQueries({ queryKey: engineKeys.list() });
      void qc.invalidateQueries({ queryKey: engineKeys.limitChanges(engine.id) });
    },
  });
}
