import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  BarDto,
  CreateBarRequest,
  LoggedPassDto,
  LogPassRequest,
  LotDetail,
  LotStatus,
  LotSummary,
  LotTransitionRequest,
  LotUpdateRequest,
  LotWriteRequest,
  MillDto,
  MillRunLog,
  MillRunSummary,
  MillTimelineItem,
  MillWriteRequest,
  QuoteDto,
  QuoteRequest,
  RollingPassRequest,
  RollingPassResponse,
  ScheduleCopyRequest,
  ScheduleDetail,
  ScheduleSummary,
  ScheduleWriteRequest,
  SendQuoteRequest,
  UpdateBarRequest,
} from '@crankjournal/shared-types';
import { api, withQuery, download } from '../../../api/http';

export interface ScheduleFilters {
  millId?: string;
  templates?: boolean;
}

/** Keys: everything of the mill sits under ['mill']. */
export const millKeys = {
  all: ['mill'] as const,
  mills: () => [...millKeys.all, 'mills'] as const,
  mill: (id: string) => [...millKeys.mills(), id] as const,
  schedules: () => [...millKeys.all, 'schedules'] as const,
  scheduleList: (f: ScheduleFilters = {}) =>
    [...millKeys.schedules(), 'list', { millId: f.millId ?? null, templates: f.templates ?? null }] as const,
  schedule: (id: string) => [...millKeys.schedules(), id] as const,
  runs: () => [...millKeys.all, 'runs'] as const,
  run: (runId: string) => [...millKeys.runs(), runId] as const,
  runLog: (runId: string) => [...millKeys.run(runId), 'log'] as const,
  timeline: (runId: string) => [...millKeys.run(runId), 'timeline'] as const,
  lots: () => [...millKeys.all, 'lots'] as const,
  lotList: (status?: LotStatus) => [...millKeys.lots(), 'list', { status: status ?? null }] as const,
  lot: (id: string) => [...millKeys.lots(), id] as const,
};

export const millsQuery = () => queryOptions({ queryKey: millKeys.mills(), queryFn: () => api<MillDto[]>('/mill/mills') });
export const millQuery = (id: string) => queryOptions({ queryKey: millKeys.mill(id), queryFn: () => api<MillDto>(`/mill/mills/${id}`) });
export const schedulesQuery = (f: ScheduleFilters = {}) =>
  queryOptions({
    queryKey: millKeys.scheduleList(f),
    queryFn: () => api<ScheduleSummary[]>(withQuery('/mill/schedules', { millId: f.millId, templates: f.templates })),
  });
export const scheduleQuery = (id: string) =>
  queryOptions({ queryKey: millKeys.schedule(id), queryFn: () => api<ScheduleDetail>(`/mill/schedules/${id}`) });
export const millRunsQuery = () => queryOptions({ queryKey: millKeys.runs(), queryFn: () => api<MillRunSummary[]>('/mill/runs') });
export const runLogQuery = (runId: string) =>
  queryOptions({ queryKey: millKeys.runLog(runId), queryFn: () => api<MillRunLog>(`/mill/runs/${runId}`) });
export const timelineQuery = (runId: string) =>
  queryOptions({ queryKey: millKeys.timeline(runId), queryFn: () => api<MillTimelineItem[]>(`/mill/runs/${runId}/timeline`) });
export const lotsQuery = (status?: LotStatus) =>
  queryOptions({ queryKey: millKeys.lotList(status), queryFn: () => api<LotSummary[]>(withQuery('/mill/lots', { status })) });
export const lotQuery = (id: string) => queryOptions({ queryKey: millKeys.lot(id), queryFn: () => api<LotDetail>(`/mill/lots/${id}`) });

export const calculateRollingPass = (req: RollingPassRequest) => api<RollingPassResponse>('/calculations/rolling-pass', { body: req });
export const downloadQuotePdf = (q: QuoteDto, reference: string) =>
  download(`/mill/quotes/${q.id}/quote.pdf`, `quote-${reference}-Q${q.number}.pdf`);

export function useSaveMill(id: string | undefined) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (req: MillWriteRequest) =>
      id ? api<MillDto>(`/mill/mills/${id}`, { method: 'PUT', body: req }) : api<MillDto>('/mill/mills', { body: req }),
    onSuccess: (m) => {
      qc.setQueryData(millKeys.mill(m.id), m);
      void qc.invalidateQueries({ queryKey: millKeys.mills() });
      void qc.invalidateQueries({ queryKey: millKeys.schedules() });
    },
  });
}

export function useSaveSchedule(id: string | undefined) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (req: ScheduleWriteRequest) =>
      id
        ? api<ScheduleDetail>(`/mill/schedules/${id}`, { method: 'PUT', body: req })
        : api<ScheduleDetail>('/mill/schedules', { body: req }),
    onSuccess: (s) => {
      qc.setQueryData(millKeys.schedule(s.id), s);
      void qc.invalidateQueries({ queryKey: [...millKeys.schedules(), 'list'] });
    },
  });
}

export function useCopySchedule() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, req }: { id: string; req: ScheduleCopyRequest }) =>
      api<ScheduleDetail>(`/mill/schedules/${id}/copies`, { body: req }),
    onSuccess: (s) => {
      qc.setQueryData(millKeys.schedule(s.id), s);
      void qc.invalidateQueries({ queryKey: [...millKeys.schedules(), 'list'] });
    },
  });
}

function useRefreshRun(runId: string) {
  const qc = useQueryClient();
  return () => {
    void qc.invalidateQueries({ queryKey: millKeys.run(runId) });
    void qc.invalidateQueries({ queryKey: millKeys.runs() });
    void qc.invalidateQueries({ queryKey: millKeys.lots() });
  };
}

export function useCreateBar(runId: string) {
  const refresh = useRefreshRun(runId);
  return useMutation({ mutationFn: (req: CreateBarRequest) => api<BarDto>(`/mill/runs/${runId}/bars`, { body: req }), onSuccess: refresh });
}
export function useUpdateBar(runId: string) {
  const refresh = useRefreshRun(runId);
  return useMutation({
    mutationFn: ({ id, req }: { id: string; req: UpdateBarRequest }) => api<BarDto>(`/mill/bars/${id}`, { method: 'PATCH', body: req }),
    onSuccess: refresh,
  });
}
export function useLogPass(runId: string) {
  const refresh = useRefreshRun(runId);
  return useMutation({
    mutationFn: ({ barId, req }: { barId: string; req: LogPassRequest }) => api<LoggedPassDto>(`/mill/bars/${barId}/passes`, { body: req }),
    onSuccess: refresh,
  });
}

function useLotMutation<T>(fn: (v: T) => Promise<unknown>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: (d) => {
      if (d && typeof d === 'object' && 'reference' in (d as object)) qc.setQueryData(millKeys.lot((d as LotDetail).id), d);
      void qc.invalidateQueries({ queryKey: millKeys.lots() });
      void qc.invalidateQueries({ queryKey: millKeys.runs() });
    },
  });
}
export const useCreateLot = () => useLotMutation((req: LotWriteRequest) => api<LotDetail>('/mill/lots', { body: req }));
export const useUpdateLot = (id: string) =>
  useLotMutation((req: LotUpdateRequest) => api<LotDetail>(`/mill/lots/${id}`, { method: 'PATCH', body: req }));
export const useMoveLot = (id: string) =>
  useLotMutation((req: LotTransitionRequest) => api<LotDetail>(`/mill/lots/${id}/transitions`, { body: req }));
export const useLinkRun = (id: string) => useLotMutation((runId: string) => api<LotDetail>(`/mill/lots/${id}/runs`, { body: { runId } }));
export const useUnlinkRun = (id: string) =>
  useLotMutation((runId: string) => api<LotDetail>(`/mill/lots/${id}/runs/${runId}`, { method: 'DELETE' }));
export const useMakeQuote = (id: string) => useLotMutation((req: QuoteRequest) => api<QuoteDto>(`/mill/lots/${id}/quotes`, { body: req }));
export const useSendQuote = () =>
  useLotMutation(({ quoteId, req }: { quoteId: string; req: SendQuoteRequest }) =>
    api<QuoteDto>(`/mill/quotes/${quoteId}/send`, { body: req }),
  );
