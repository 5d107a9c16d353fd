import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  BearingLubricationAnalysis,
  ConsumptionEntryDto,
  ConsumptionEntryRequest,
  EngineLubrication,
  JackCapacityRequest,
  JackCapacityResponse,
  JournalFrictionRequest,
  JournalFrictionResponse,
  LiftPressureRequest,
  LiftPressureResponse,
  LubricationPointOilDto,
  OilDto,
  OilViscosityRequest,
  OilViscosityResponse,
  OilWriteRequest,
} from '@crankjournal/shared-types';
import { api, withQuery } from '../../../api/http';

export const lubricationKeys = {
  all: ['lubrication'] as const,
  oils: () => [...lubricationKeys.all, 'oils'] as const,
  engine: (id: string) => [...lubricationKeys.all, 'engine', id] as const,
  bearings: (id: string, runId?: string) => [...lubricationKeys.all, 'engine', id, 'bearings', runId ?? null] as const,
};

export const oilsQuery = () => queryOptions({ queryKey: lubricationKeys.oils(), queryFn: () => api<OilDto[]>('/lubrication/oils') });
export const engineLubricationQuery = (engineId: string) =>
  queryOptions({ queryKey: lubricationKeys.engine(engineId), queryFn: () => api<EngineLubrication>(`/lubrication/engines/${engineId}`) });
export const bearingAnalysisQuery = (engineId: string, runId?: string) =>
  queryOptions({
    queryKey: lubricationKeys.bearings(engineId, runId),
    queryFn: () => api<BearingLubricationAnalysis>(withQuery(`/lubrication/engines/${engineId}/bearings`, { runId })),
  });

export const calculateOilViscosity = (req: OilViscosityRequest) => api<OilViscosityResponse>('/calculations/oil-viscosity', { body: req });
export const calculateJournalFriction = (req: JournalFrictionRequest) =>
  api<JournalFrictionResponse>('/calculations/journal-friction', { body: req });
export const calculateLiftPressure = (req: LiftPressureRequest) => api<LiftPressureResponse>('/calculations/lift-pressure', { body: req });
export const calculateJackCapacity = (req: JackCapacityRequest) => api<JackCapacityResponse>('/calculations/jack-capacity', { body: req });

function useRefresh() {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ queryKey: lubricationKeys.all });
}
export function useCreateOil() {
  const refresh = useRefresh();
  return useMutation({ mutationFn: (req: OilWriteRequest) => api<OilDto>('/lubrication/oils', { body: req }), onSuccess: refresh });
}
export function useAssignOil() {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: ({ pointId, oilId }: { pointId: string; oilId: string | null }) =>
      api<LubricationPointOilDto>(`/lubrication/points/${pointId}/oil`, { method: 'PUT', body: { oilId } }),
    onSuccess: refresh,
  });
}
export function useLogConsumption() {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (req: ConsumptionEntryRequest) => api<ConsumptionEntryDto>('/lubrication/consumption', { body: req }),
    onSuccess: refresh,
  });
}
