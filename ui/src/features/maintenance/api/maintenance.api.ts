import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  AttachmentDto,
  BearingHistory,
  BearingListItem,
  CloseWorkRecordRequest,
  DueList,
  InspectionCreateRequest,
  InspectionDto,
  InspectionPlanDto,
  InspectionPlanUpdateRequest,
  InspectionPlanWriteRequest,
  InspectionSummary,
  WorkRecordCreateRequest,
  WorkRecordDto,
  WorkRecordSummary,
} from '@crankjournal/shared-types';
import { api, withQuery, download } from '../../../api/http';

/** Keys: everything of the maintenance area sits under ['maintenance'], so one invalidation refreshes it all. */
export const maintenanceKeys = {
  all: ['maintenance'] as const,
  bearings: () => [...maintenanceKeys.all, 'bearings'] as const,
  history: (bearingId: string) => [...maintenanceKeys.all, 'bearing', bearingId, 'history'] as const,
  due: (engineId?: string) => [...maintenanceKeys.all, 'due', engineId ?? null] as const,
  plans: (engineId?: string) => [...maintenanceKeys.all, 'plans', engineId ?? null] as const,
  plan: (id: string) => [...maintenanceKeys.all, 'plan', id] as const,
  inspections: (f: { engineId?: string; bearingId?: string } = {}) =>
    [...maintenanceKeys.all, 'inspections', f.engineId ?? null, f.bearingId ?? null] as const,
  inspection: (id: string) => [...maintenanceKeys.all, 'inspection', id] as const,
  work: (f: { engineId?: string; bearingId?: string; status?: string } = {}) =>
    [...maintenanceKeys.all, 'work', f.engineId ?? null, f.bearingId ?? null, f.status ?? null] as const,
  workRecord: (id: string) => [...maintenanceKeys.all, 'work-record', id] as const,
};

export const bearingsQuery = () =>
  queryOptions({ queryKey: maintenanceKeys.bearings(), queryFn: () => api<BearingListItem[]>('/maintenance/bearings') });
export const bearingHistoryQuery = (id: string) =>
  queryOptions({ queryKey: maintenanceKeys.history(id), queryFn: () => api<BearingHistory>(`/maintenance/bearings/${id}/history`) });
export const dueListQuery = (engineId?: string) =>
  queryOptions({ queryKey: maintenanceKeys.due(engineId), queryFn: () => api<DueList>(withQuery('/maintenance/due', { engineId })) });
export const plansQuery = (engineId?: string) =>
  queryOptions({
    queryKey: maintenanceKeys.plans(engineId),
    queryFn: () => api<InspectionPlanDto[]>(withQuery('/maintenance/plans', { engineId })),
  });
export const planQuery = (id: string) =>
  queryOptions({ queryKey: maintenanceKeys.plan(id), queryFn: () => api<InspectionPlanDto>(`/maintenance/plans/${id}`) });
export const inspectionsQuery = (f: { engineId?: string; bearingId?: string } = {}) =>
  queryOptions({
    queryKey: maintenanceKeys.inspections(f),
    queryFn: () => api<InspectionSummary[]>(withQuery('/maintenance/inspections', f)),
  });
export const inspectionQuery = (id: string) =>
  queryOptions({ queryKey: maintenanceKeys.inspection(id), queryFn: () => api<InspectionDto>(`/maintenance/inspections/${id}`) });
export const workRecordsQuery = (f: { engineId?: string; bearingId?: string; status?: 'open' | 'closed' } = {}) =>
  queryOptions({ queryKey: maintenanceKeys.work(f), queryFn: () => api<WorkRecordSummary[]>(withQuery('/maintenance/work-records', f)) });
export const workRecordQuery = (id: string) =>
  queryOptions({ queryKey: maintenanceKeys.workRecord(id), queryFn: () => api<WorkRecordDto>(`/maintenance/work-records/${id}`) });

export const downloadHistoryPdf = (bearingId: string) => download(`/maintenance/bearings/${bearingId}/history.pdf`, 'bearing-history.pdf');
export const downloadHistoryCsv = (bearingId: string) => download(`/maintenance/bearings/${bearingId}/history.csv`, 'bearing-history.csv');

/** An attachment's bytes with the person's token, as an object URL for an <img> or a link. */
export async function attachmentObjectUrl(id: string): Promise<string> {
  const res = await api<Response>(`/maintenance/attachments/${id}/content`, { asResponse: true });
  return URL.createObjectURL(await res.blob());
}
export const downloadAttachment = (a: AttachmentDto) => download(`/maintenance/attachments/${a.id}/content`, a.filename);

/** After any maintenance write, everything of the area may have changed (due list, histories, timelines). */
function useRefresh() {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ queryKey: maintenanceKeys.all });
}

export function useCreatePlan() {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (req: InspectionPlanWriteRequest) => api<InspectionPlanDto>('/maintenance/plans', { body: req }),
    onSuccess: refresh,
  });
}
export function useUpdatePlan(id: string) {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (req: InspectionPlanUpdateRequest) => api<InspectionPlanDto>(`/maintenance/plans/${id}`, { method: 'PATCH', body: req }),
    onSuccess: refresh,
  });
}
export function useCreateInspection() {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (req: InspectionCreateRequest) => api<InspectionDto>('/maintenance/inspections', { body: req }),
    onSuccess: refresh,
  });
}
export function useUploadAttachment(inspectionId: string) {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: ({ file, caption }: { file: File; caption: string }) => {
      const form = new FormData();
      form.set('file', file);
      if (caption.trim()) form.set('caption', caption.trim());
      return api<AttachmentDto>(`/maintenance/inspections/${inspectionId}/attachments`, { method: 'POST', raw: form });
    },
    onSuccess: refresh,
  });
}
export function useCreateWorkRecord() {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (req: WorkRecordCreateRequest) => api<WorkRecordDto>('/maintenance/work-records', { body: req }),
    onSuccess: refresh,
  });
}
export function useCloseWorkRecord(id: string) {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (req: CloseWorkRecordRequest) => api<WorkRecordDto>(`/maintenance/work-records/${id}/close`, { body: req }),
    onSuccess: refresh,
  });
}
