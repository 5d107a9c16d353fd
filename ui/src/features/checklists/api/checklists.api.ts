import { useCallback } from 'react';
import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  AmendChecklistRequest,
  ChecklistDetail,
  ChecklistTemplateContent,
  ChecklistTemplateDetail,
  ChecklistTemplateSummary,
  ChecklistTemplateVersionDto,
  CreateChecklistTemplateRequest,
  FillChecklistItemRequest,
  RunChecklistsOverview,
} from '@crankjournal/shared-types';
import { api, withQuery, download } from '../../../api/http';
import { runKeys } from '../../runs/api/runs.api';

/** Keys: a run's checklists sit under the run's key, so a run refresh takes them too; templates under ['checklist-templates']. */
export const checklistKeys = {
  runOverview: (runId: string) => [...runKeys.run(runId), 'checklists'] as const,
  checklist: (id: string) => ['checklists', id] as const,
  templates: ['checklist-templates'] as const,
  templateList: (engineId?: string) => [...checklistKeys.templates, 'list', { engineId: engineId ?? null }] as const,
  template: (id: string) => [...checklistKeys.templates, id] as const,
  templateVersion: (id: string, version: number) => [...checklistKeys.template(id), 'version', version] as const,
};

export const runChecklistsQuery = (runId: string) =>
  queryOptions({ queryKey: checklistKeys.runOverview(runId), queryFn: () => api<RunChecklistsOverview>(`/runs/${runId}/checklists`) });
export const checklistQuery = (id: string) =>
  queryOptions({ queryKey: checklistKeys.checklist(id), queryFn: () => api<ChecklistDetail>(`/checklists/${id}`) });
export const templatesQuery = (engineId?: string) =>
  queryOptions({
    queryKey: checklistKeys.templateList(engineId),
    queryFn: () => api<ChecklistTemplateSummary[]>(withQuery('/checklist-templates', { engineId })),
  });
export const templateQuery = (id: string) =>
  queryOptions({ queryKey: checklistKeys.template(id), queryFn: () => api<ChecklistTemplateDetail>(`/checklist-templates/${id}`) });
export const templateVersionQuery = (id: string, version: number) =>
  queryOptions({
    queryKey: checklistKeys.templateVersion(id, version),
    queryFn: () => api<ChecklistTemplateVersionDto>(`/checklist-templates/${id}/versions/${version}`),
    staleTime: Infinity,
  });

export const downloadBlankChecklist = (templateId: string, version?: number) =>
  download(
    version ? `/checklist-templates/${templateId}/versions/${version}/blank.pdf` : `/checklist-templates/${templateId}/blank.pdf`,
    'checklist.pdf',
  );

/** The photo of an item, as an object URL for an <img> (the API needs the access token). */
export async function fetchPhotoUrl(checklistId: string, itemKey: string): Promise<string> {
  const res = await api<Response>(`/checklists/${checklistId}/items/${itemKey}/photo`, { asResponse: true });
  return URL.createObjectURL(await res.blob());
}

/** Puts a changed checklist into the cache and refreshes the run's overview and start gate. */
export function useApplyChecklist() {
  const qc = useQueryClient();
  return useCallback(
    (c: ChecklistDetail) => {
      qc.setQueryData(checklistKeys.checklist(c.id), c);
      void qc.invalidateQueries({ queryKey: checklistKeys.runOverview(c.runId) });
      void qc.invalidateQueries({ queryKey: runKeys.startGate(c.runId) });
      void qc.invalidateQueries({ queryKey: runKeys.detail(c.runId) });
    },
    [qc],
  );
}

export function useStartChecklist(runId: string) {
  const apply = useApplyChecklist();
  return useMutation({
    mutationFn: (templateId: string) => api<ChecklistDetail>(`/runs/${runId}/checklists`, { body: { templateId } }),
    onSuccess: apply,
  });
}

export type ChecklistAction =
  | { kind: 'fill'; itemKey: string; value: FillChecklistItemRequest }
  | { kind: 'photo'; itemKey: string; file: Blob }
  | { kind: 'override'; itemKey: string; reason: string }
  | { kind: 'sign'; signature: string }
  | { kind: 'amend'; request: AmendChecklistRequest };

export function checklistAction(id: string, a: ChecklistAction): Promise<ChecklistDetail> {
  switch (a.kind) {
    case 'fill':
      return api(`/checklists/${id}/items/${a.itemKey}`, { method: 'PUT', body: a.value });
    case 'photo':
      return api(`/checklists/${id}/items/${a.itemKey}/photo`, {
        method: 'PUT',
        raw: a.file,
        headers: { 'content-type': a.file.type || 'application/octet-stream' },
      });
    case 'override':
      return api(`/checklists/${id}/items/${a.itemKey}/override`, { body: { reason: a.reason } });
    case 'sign':
      return api(`/checklists/${id}/sign`, { body: { signature: a.signature } });
    case 'amend':
      return api(`/checklists/${id}/amendments`, { body: a.request });
  }
}

export function useChecklistAction(id: string) {
  const apply = useApplyChecklist();
  return useMutation({ mutationFn: (a: ChecklistAction) => checklistAction(id, a), onSuccess: apply });
}

export function useTemplateWrite() {
  const qc = useQueryClient();
  const done = (t: ChecklistTemplateDetail) => {
    qc.setQueryData(checklistKeys.template(t.id), t);
    void qc.invalidateQueries({ queryKey: [...checklistKeys.templates, 'list'] });
  };
  return {
    create: useMutation({
      mutationFn: (req: CreateChecklistTemplateRequest) => api<ChecklistTemplateDetail>('/checklist-templates', { body: req }),
      onSuccess: done,
    }),
    saveDraft: useMutation({
      mutationFn: ({ id, content }: { id: string; content: ChecklistTemplateContent }) =>
        api<ChecklistTemplateDetail>(`/checklist-templates/${id}/draft`, { method: 'PUT', body: content }),
      onSuccess: done,
    }),
    discardDraft: useMutation({
      mutationFn: (id: string) => api<ChecklistTemplateDetail>(`/checklist-templates/${id}/draft`, { method: 'DELETE' }),
      onSuccess: done,
    }),
    publish: useMutation({
      mutationFn: ({ id, changeNote }: { id: string; changeNote: string }) =>
        api<ChecklistTemplateDetail>(`/checklist-templates/${id}/publish`, { body: { changeNote } }),
      onSuccess: done,
    }),
    retire: useMutation({
      mutationFn: ({ id, retired }: { id: string; retired: boolean }) =>
        api<ChecklistTemplateDetail>(`/checklist-templates/${id}/${retired ? 'retire' : 'reinstate'}`, { method: 'POST' }),
      onSuccess: done,
    }),
  };
}
